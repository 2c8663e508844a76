// fuse (rules/safety/fuse.cpp): fuse first in the line, rated current with derating, melting I²t
// against the inrush. Check values: safety-data.md 4.3 (75 % loading [C: S20], pulse factor 0.22 for
// 100 000 pulses [C: S19]).
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

std::string deck(const std::string& fuse_attrs, const std::string& before_fuse = "") {
  return "fuse rule test\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n" + before_fuse +
         "*@part RF1 type=fuse " + fuse_attrs + "\n"
         "RF1 L LF 0.05\n"
         "*@part RH type=heater p_rated=2000\n"
         "RH LF N 26.5\n"
         ".end\n";
}

std::vector<Finding> gating(const std::vector<Finding>& all) { return without_notes(all); }

TEST(Fuse, RatedCurrentWithSeventyFivePercentDerating) {
  // 10 A fuse: 75 % = 7.5 A (safety-data.md 4.3, [C: S20]).
  RuleBench inside(deck("i_rated=10"));
  inside.set("RF1", Quantity::i_rms, 7.49);
  EXPECT_TRUE(gating(inside.run("fuse")).empty()) << inside.rendered();
  RuleBench outside(deck("i_rated=10"));
  outside.set("RF1", Quantity::i_rms, 7.51);
  const Finding f = only(gating(outside.run("fuse")));
  EXPECT_EQ(f.severity, Severity::error);  // rule default above the derated limit
  EXPECT_NEAR(f.measurement->limit, 7.5, 1e-12);
  EXPECT_EQ(f.measurement->quantity, "i_rms");
}

TEST(Fuse, MeltingIntegralAgainstInrush) {
  // i2t_melt 10 A²s × 0.22 = 2.2 A²s allowed per pulse (safety-data.md 4.3, [C: S19]).
  RuleBench inside(deck("i_rated=10 i2t_melt=10"));
  inside.set_inrush("RF1", 50, 2.19);
  EXPECT_TRUE(gating(inside.run("fuse")).empty());
  RuleBench outside(deck("i_rated=10 i2t_melt=10"));
  outside.set_inrush("RF1", 50, 2.21);
  const Finding f = only(gating(outside.run("fuse")));
  EXPECT_NEAR(f.measurement->limit, 2.2, 1e-12);
  EXPECT_EQ(f.measurement->unit, "A²s");  // one spelling in every output (issue 18)
  // The 35 % factor of another maker (safety-data.md 4.3, [C: S22]) as a policy choice.
  outside.option("fuse.pulse-factor", "35%");
  EXPECT_TRUE(gating(outside.run("fuse")).empty());
}

TEST(Fuse, VaristorAheadOfTheFuseIsAnError) {
  // Placement: fuse first after the inlet, upstream of the MOV (safety-data.md 4.3 and 5).
  RuleBench b(deck("i_rated=10", "*@part RV1 type=varistor v_rated_ac=275\nRV1 L N 1meg\n"));
  const Finding f = only(gating(b.run("fuse")));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_EQ(f.parts.front(), "RV1");
  EXPECT_NE(f.message.find("ahead of fuse RF1"), std::string::npos) << f.message;
}

TEST(Fuse, NoFuseIsAnError) {
  RuleBench b("no fuse\n"
              "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
              "V1 L N SIN(0 325.27 50)\n"
              "*@part RH type=heater p_rated=2000\n"
              "RH L N 26.5\n"
              ".end\n");
  const Finding f = only(b.run("fuse"));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_EQ(f.message, "no fuse or fusible resistor in the line conductor");
}

TEST(Fuse, FuseInTheNeutralOnlyIsAWarning) {
  RuleBench b("neutral fuse\n"
              "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
              "V1 L N SIN(0 325.27 50)\n"
              "*@part RH type=heater p_rated=2000\n"
              "RH L NF 26.5\n"
              "*@part RF1 type=fuse i_rated=10\n"
              "RF1 NF N 0.05\n"
              ".end\n");
  const auto all = gating(b.run("fuse"));
  ASSERT_FALSE(all.empty()) << b.rendered();
  EXPECT_EQ(all.front().severity, Severity::warning);
  EXPECT_NE(all.front().message.find("neutral"), std::string::npos);
}

TEST(Fuse, BreakingCapacityNoteAndSwitchAheadAllowed) {
  // A mains switch ahead of the fuse is allowed; the breaking-capacity note is always given (4.1, 4.3).
  RuleBench b("switched\n"
              "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
              "V1 L N SIN(0 325.27 50)\n"
              "*@part RS1 type=switch\n"
              "RS1 L LS 0.01\n"
              "*@part RF1 type=fuse i_rated=10\n"
              "RF1 LS LF 0.05\n"
              "*@part RH type=heater p_rated=2000\n"
              "RH LF N 26.5\n"
              ".end\n");
  const Finding f = only(b.run("fuse"));
  EXPECT_EQ(f.severity, Severity::note);
  EXPECT_NE(f.message.find("breaking capacity"), std::string::npos);
}


// Issue 15 item 9: the mains inlet is the entry point, not a part ahead of the fuse.
std::string inlet_deck(const std::string& inlet_annotation) {
  return "inlet ahead of the fuse\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N earth=PE\n"
         "V1 L N SIN(0 325.27 50)\n"
         ".subckt IEC_INLET 1 2 3\n"
         "RI 1 3 1G\n"
         "RJ 2 3 1G\n"
         ".ends IEC_INLET\n" +
         inlet_annotation +
         "XJ0 L N PE IEC_INLET\n"
         "*@part RF1 type=fuse i_rated=10\n"
         "RF1 L LF 0.05\n"
         "*@part RH type=heater p_rated=2000\n"
         "RH LF N 26.5\n"
         ".end\n";
}

TEST(Fuse, InletTypedSoIsNotAheadOfTheFuse) {
  RuleBench b(inlet_deck("*@part XJ0 type=inlet\n"));
  EXPECT_EQ(b.rec.info.type(b.part("XJ0")), analysis::FrontEndType::inlet) << b.rendered();
  EXPECT_TRUE(gating(b.run("fuse")).empty());
}

TEST(Fuse, ConnectorOnTheSupplyNetsIsTheInlet) {
  // A connector whose pins are exactly line, neutral and earth is where the mains comes in (position).
  RuleBench b(inlet_deck("*@part XJ0 type=connector\n"));
  EXPECT_EQ(b.rec.info.type(b.part("XJ0")), analysis::FrontEndType::inlet) << b.rendered();
  EXPECT_TRUE(gating(b.run("fuse")).empty());
  EXPECT_TRUE(b.rec.unrecognised.empty());
}

TEST(Fuse, ConnectorBehindTheLineIsStillAheadOfTheFuse) {
  // Boundary: a connector with a pin off the supply nets (here a tap of the unfused line) is no inlet.
  const std::string d =
      "connector on the unfused line\n"
      "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
      "V1 L N SIN(0 325.27 50)\n"
      ".subckt AUX_SOCKET 1 2\n"
      "RI 1 2 1G\n"
      ".ends AUX_SOCKET\n"
      "*@part XJ2 type=connector\n"
      "XJ2 L AUX AUX_SOCKET\n"
      "*@part RF1 type=fuse i_rated=10\n"
      "RF1 L LF 0.05\n"
      "*@part RH type=heater p_rated=2000\n"
      "RH LF N 26.5\n"
      ".end\n";
  RuleBench b(d);
  EXPECT_EQ(b.rec.info.type(b.part("XJ2")), analysis::FrontEndType::connector) << b.rendered();
  const Finding f = only(gating(b.run("fuse")));
  EXPECT_EQ(f.parts.front(), "XJ2");
}

}  // namespace
}  // namespace mainscheck::rules::testing
