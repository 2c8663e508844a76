// isolation (rules/safety/isolation.cpp): non-isolated blocks noted; accessible/SELV nets with a
// galvanic path to the mains are errors. Basis: safety-data.md 9 (dropper output at mains potential,
// [C: S33]).
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

/// Capacitive dropper after examples/timer-capacitive-dropper.cir; output VZ.
std::string dropper_deck(const std::string& net_annotation) {
  return "dropper isolation test\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RS1 type=fusible-resistor p_rated=1\n"
         "RS1 L LS 100\n"
         "*@part C1 class=X2\n"
         "C1 LS A 470n\n"
         "D2 N A DR\n"
         "D1 A VZ DR\n"
         "*@part DZ1 type=zener v_zener=12\n"
         "DZ1 N VZ DZ12\n"
         "C2 VZ N 470u\n"
         "RL VZ N 1k\n" + net_annotation + "\n"
         ".model DR D(IS=5n RS=0.03 N=1.8 BV=1000)\n"
         ".model DZ12 D(IS=1e-14 RS=5 BV=12)\n"
         ".end\n";
}

/// Transformer supply after examples/bench-supply-transformer.cir: secondary SA-SB feeds a load; the
/// 1 GΩ resistor to ground is the simulator's reference, not a connection.
std::string transformer_deck(const std::string& extra) {
  return transformer_supply_deck("transformer isolation test", "*@net SA selv=yes\n" + extra);
}

std::vector<Finding> errors(const std::vector<Finding>& all) { return of_severity(all, Severity::error); }

TEST(Isolation, DropperIsMarkedNotIsolated) {
  RuleBench b(dropper_deck(""));
  const auto all = b.run("isolation");
  ASSERT_FALSE(all.empty()) << b.rendered();
  bool dropper = false;
  for (const auto& f : all) {
    EXPECT_EQ(f.severity, Severity::note);
    if (f.message.find("capacitive-dropper") != std::string::npos) dropper = true;
  }
  EXPECT_TRUE(dropper);
}

TEST(Isolation, AccessibleDropperOutputIsAnError) {
  RuleBench b(dropper_deck("*@net VZ access=user"));
  const Finding f = only(errors(b.run("isolation")));
  EXPECT_NE(f.message.find("net VZ"), std::string::npos) << f.message;
}

TEST(Isolation, TransformerSecondaryIsIsolated) {
  RuleBench b(transformer_deck(""));
  EXPECT_TRUE(errors(b.run("isolation")).empty()) << b.rendered();
}

TEST(Isolation, Y2AcrossTheBarrierBreaksIsolationButY1DoesNot) {
  // Y1 bridges reinforced insulation; Y2 basic only (safety-data.md 3.2, [C: S13, S15, S16]).
  RuleBench y2(transformer_deck("*@part CB1 class=Y2\nCB1 LF SA 1n\n"));
  EXPECT_EQ(errors(y2.run("isolation")).size(), 1u);
  RuleBench y1(transformer_deck("*@part CB1 class=Y1\nCB1 LF SA 1n\n"));
  EXPECT_TRUE(errors(y1.run("isolation")).empty());
}

TEST(Isolation, NotApplicableWithoutAccessibleNetsOrBlocks) {
  RuleBench b(heater_only_deck());
  EXPECT_TRUE(b.run("isolation").empty());
}

/// transformer_deck with an optocoupler feeding back from the secondary to the primary: LED from SA through R5
/// to SB, detector from the fused line through R6 to neutral (the usual feedback arrangement of a mains supply).
std::string opto_feedback(const std::string& type) {
  return transformer_deck("R5 SA OA 1k\n"
                          "*@part XU3 type=" + type + "\n"
                          "XU3 OA SB PC N OPTO4\n"
                          "R6 LF PC 220k\n"
                          ".subckt OPTO4 A K C E\nD1 A K DL\nR1 C E 10meg\n.ends\n"
                          ".model DL D(IS=1e-20 N=1.8)\n");
}

TEST(Isolation, OutputBehindTransformerAndOptocouplerIsIsolated) {
  RuleBench b(opto_feedback("optocoupler"));
  EXPECT_TRUE(errors(b.run("isolation")).empty()) << b.rendered();
}

TEST(Isolation, FourPinPartNotKnownAsOptocouplerJoinsItsPins) {
  // The same instance collapsed as a generic part: its pins count as joined, so SA reaches the mains.
  RuleBench b(opto_feedback("other"));
  const Finding f = only(errors(b.run("isolation")));
  EXPECT_NE(f.message.find("net SA"), std::string::npos) << f.message;
}

TEST(Isolation, OptocouplerWithATiedReturnIsNoBarrier) {
  // The detector's emitter wired to SB, a net of the LED side: the part then joins both sides, so the SELV net
  // SA reaches the mains through R6, the detector and R5.
  RuleBench b(transformer_deck("R5 SA OA 1k\n"
                               "*@part XU3 type=optocoupler\n"
                               "XU3 OA SB PC SB OPTO4\n"
                               "R6 LF PC 220k\n"
                               ".subckt OPTO4 A K C E\nD1 A K DL\nR1 C E 10meg\n.ends\n"
                               ".model DL D(IS=1e-20 N=1.8)\n"));
  const Finding f = only(errors(b.run("isolation")));
  EXPECT_NE(f.message.find("net SA"), std::string::npos) << f.message;
}

}  // namespace
}  // namespace mainscheck::rules::testing
