// capacitor-class (rules/safety/capacitor_class.cpp): IEC 60384-14 subclass by position.
// Check values: safety-data.md section 3 (IEC 60384-14 subclasses, [C: S13, S14, S15, S16]) and 3.3.
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

/// EMI filter: X capacitor CX1 across the fused line and neutral, Y capacitor CY1 from the line to PE.
std::string filter_deck(const std::string& supply, const std::string& cx_attrs, const std::string& cy_attrs) {
  return "capacitor class test\n"
         "*@supply mains=" + supply + " line=L neutral=N earth=PE\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RF1 type=fuse i_rated=10\n"
         "RF1 L LF 0.05\n"
         "*@part CX1 " + cx_attrs + "\n"
         "CX1 LF N 100n\n"
         "*@part CY1 " + cy_attrs + "\n"
         "CY1 LF PE 2.2n\n"
         "*@part RH type=heater p_rated=2000\n"
         "RH LF N 26.5\n"
         ".end\n";
}

/// Capacitive dropper after examples/timer-capacitive-dropper.cir with series capacitor C1.
std::string dropper_deck(const std::string& c1_attrs) {
  return "dropper class test\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RS1 type=fusible-resistor p_rated=1\n"
         "RS1 L LS 100\n"
         "*@part C1 " + c1_attrs + "\n"
         "C1 LS A 470n\n"
         "D2 N A DR\n"
         "D1 A VZ DR\n"
         "*@part DZ1 type=zener v_zener=12\n"
         "DZ1 N VZ DZ12\n"
         "C2 VZ N 470u\n"
         "RL VZ N 1k\n"
         ".model DR D(IS=5n RS=0.03 N=1.8 BV=1000)\n"
         ".model DZ12 D(IS=1e-14 RS=5 BV=12)\n"
         ".end\n";
}

std::vector<Finding> findings_for(const RuleBench& b, const std::string& ref) {
  std::vector<Finding> out;
  for (auto& f : b.run("capacitor-class"))
    if (!f.parts.empty() && f.parts.front() == ref) out.push_back(f);
  return out;
}

TEST(CapacitorClass, XAcrossTheLineAndYToEarthPass) {
  // X2 for overvoltage category II, Y2 (basic insulation) from line to PE: safety-data.md 3.3.
  RuleBench b(filter_deck("230V+-10%/50Hz", "class=X2", "class=Y2"));
  EXPECT_TRUE(b.run("capacitor-class").empty()) << b.rendered();
}

TEST(CapacitorClass, YMayReplaceXButNotTheReverse) {
  // "a Y capacitor may replace an X capacitor, never the reverse" (safety-data.md 3.3, [C: S-everycircuit]).
  RuleBench y_for_x(filter_deck("230V+-10%/50Hz", "class=Y1", "class=Y1"));
  EXPECT_TRUE(y_for_x.run("capacitor-class").empty());
  RuleBench x_for_y(filter_deck("230V+-10%/50Hz", "class=X2", "class=X2"));
  const Finding f = only(x_for_y.run("capacitor-class"));
  EXPECT_EQ(f.parts.front(), "CY1");
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_NE(f.message.find("not a Y class"), std::string::npos) << f.message;
}

TEST(CapacitorClass, X3IsBelowCategoryTwoImpulse) {
  // X3: impulses <= 1.2 kV; X2: <= 2.5 kV = OVC II (safety-data.md 3.1, [C: S15]).
  RuleBench b(filter_deck("230V+-10%/50Hz", "class=X3", "class=Y2"));
  const Finding f = only(b.run("capacitor-class"));
  EXPECT_EQ(f.parts.front(), "CX1");
  EXPECT_EQ(f.severity, Severity::error);
}

TEST(CapacitorClass, CategoryThreeNeedsX1) {
  // X1: 2.5-4.0 kV impulse, OVC III (safety-data.md 3.1, [C: S13, S14, S15]).
  RuleBench x2(filter_deck("230V+-10%/50Hz", "class=X2", "class=Y2"));
  x2.option("capacitor-class.overvoltage-category", "III");
  EXPECT_EQ(only(x2.run("capacitor-class")).parts.front(), "CX1");
  RuleBench x1(filter_deck("230V+-10%/50Hz", "class=X1", "class=Y2"));
  x1.option("capacitor-class.overvoltage-category", "III");
  EXPECT_TRUE(x1.run("capacitor-class").empty());
}

TEST(CapacitorClass, Y3RatedUpTo250V) {
  // Y3: rated 150-250 V (safety-data.md 3.2, [C-part: S16]). 240 V +4 % = 249.6 V is just inside,
  // 230 V +9 % = 250.7 V just outside.
  RuleBench inside(filter_deck("240V+4%-10%/50Hz", "class=X2", "class=Y3"));
  EXPECT_TRUE(findings_for(inside, "CY1").empty());
  RuleBench outside(filter_deck("230V+9%-10%/50Hz", "class=X2", "class=Y3"));
  const auto f = findings_for(outside, "CY1");
  ASSERT_EQ(f.size(), 1u);
  EXPECT_NE(f[0].message.find("251 V"), std::string::npos) << f[0].message;
}

TEST(CapacitorClass, Y4OnlyBelow150V) {
  // Y4: rated below 150 V (safety-data.md 3.2, [C: S16]): fine on 120 V +5 % (126 V), not on 230 V mains.
  RuleBench low(filter_deck("120V+-5%/60Hz", "class=X2", "class=Y4"));
  EXPECT_TRUE(findings_for(low, "CY1").empty());
  RuleBench high(filter_deck("230V+-10%/50Hz", "class=X2", "class=Y4"));
  EXPECT_EQ(findings_for(high, "CY1").size(), 1u);
}

TEST(CapacitorClass, UnknownClassIsAWarningNotAPass) {
  RuleBench b(filter_deck("230V+-10%/50Hz", "v_rated_ac=275", "class=Y2"));
  const Finding f = only(b.run("capacitor-class"));
  EXPECT_EQ(f.parts.front(), "CX1");
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NE(f.message.find("unknown"), std::string::npos);
}

TEST(CapacitorClass, DropperSeriesCapacitorNeedsX2OrBetter) {
  // Series dropper capacitor: safety-rated X2 or X1 (safety-data.md 3.3, [C-part: S33]).
  RuleBench x2(dropper_deck("class=X2"));
  EXPECT_TRUE(findings_for(x2, "C1").empty()) << x2.rendered();
  RuleBench x3(dropper_deck("class=X3"));
  const auto f = findings_for(x3, "C1");
  ASSERT_EQ(f.size(), 1u) << x3.rendered();
  EXPECT_NE(f[0].message.find("dropper"), std::string::npos);
  RuleBench none(dropper_deck(""));
  ASSERT_EQ(findings_for(none, "C1").size(), 1u);
  EXPECT_EQ(findings_for(none, "C1")[0].severity, Severity::warning);
}

/// Transformer after examples/bench-supply-transformer.cir with capacitor CB1 straight across the barrier.
std::string barrier_deck(const std::string& cb_attrs) {
  return transformer_supply_deck("barrier class test", "*@part CB1 " + cb_attrs + "\nCB1 LF SB 1n\n");
}

TEST(CapacitorClass, BarrierBridgeNeedsY1ForReinforcedInsulation) {
  // Y1 bridges double or reinforced insulation, Y2 basic only (safety-data.md 3.2 and 3.3,
  // [C: S13, S15, S16], [C-part: S-fhjkv]).
  RuleBench y1(barrier_deck("class=Y1"));
  EXPECT_TRUE(findings_for(y1, "CB1").empty()) << y1.rendered();
  RuleBench y2(barrier_deck("class=Y2"));
  const auto f = findings_for(y2, "CB1");
  ASSERT_EQ(f.size(), 1u) << y2.rendered();
  EXPECT_NE(f[0].message.find("reinforced"), std::string::npos) << f[0].message;
  y2.option("capacitor-class.barrier-insulation", "basic");
  EXPECT_TRUE(findings_for(y2, "CB1").empty());
}

TEST(CapacitorClass, NotApplicableToOtherCapacitors) {
  // A reservoir electrolytic behind the rectifier is in no safety position.
  RuleBench b(dropper_deck("class=X2"));
  EXPECT_TRUE(findings_for(b, "C2").empty());
}

/// A mains-driven optocoupler LED whose detector sits on a separate 5 V circuit, with CB1 from neutral to the
/// detector circuit's return G2 (bridging the optocoupler's barrier).
std::string opto_deck(const std::string& opto_attrs, const std::string& cb_attrs) {
  return "optocoupler barrier class test\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RF1 type=fuse i_rated=0.5\n"
         "RF1 L LF 0.2\n"
         "R1 LF LA 100k\n"
         "*@part XU3 type=optocoupler " + opto_attrs + "\n"
         "XU3 LA N OUT G2 OPTO4\n"
         "V2 VCC G2 5\n"
         "R2 VCC OUT 10k\n"
         "*@part CB1 " + cb_attrs + "\n"
         "CB1 N G2 1n\n"
         ".subckt OPTO4 A K C E\nD1 A K DL\nR1 C E 10meg\n.ends\n"
         ".model DL D(IS=1e-20 N=1.8)\n"
         ".end\n";
}

TEST(CapacitorClass, OptocouplerBarrierBridgeNeedsY1ForReinforcedInsulation) {
  // Y1 for double or reinforced insulation, Y2 basic only (safety-data.md 3.2, 3.3, [C: S13, S15, S16]).
  RuleBench y1(opto_deck("", "class=Y1"));
  EXPECT_TRUE(findings_for(y1, "CB1").empty()) << y1.rendered();
  RuleBench y2(opto_deck("", "class=Y2"));
  const auto f = findings_for(y2, "CB1");
  ASSERT_EQ(f.size(), 1u) << y2.rendered();
  EXPECT_NE(f[0].message.find("across the isolation barrier"), std::string::npos) << f[0].message;
  EXPECT_NE(f[0].message.find("reinforced insulation needs Y1"), std::string::npos) << f[0].message;
  // The optocoupler's own insulation=basic overrides the reinforced default for this barrier.
  RuleBench basic(opto_deck("insulation=basic", "class=Y2"));
  EXPECT_TRUE(findings_for(basic, "CB1").empty());
  // An X class is never right across a barrier.
  RuleBench x2(opto_deck("", "class=X2"));
  ASSERT_EQ(findings_for(x2, "CB1").size(), 1u);
  EXPECT_NE(findings_for(x2, "CB1")[0].message.find("is not a Y class"), std::string::npos);
  // No class stated: a warning, never a pass.
  RuleBench none(opto_deck("", "v_rated_ac=250"));
  ASSERT_EQ(findings_for(none, "CB1").size(), 1u);
  EXPECT_EQ(findings_for(none, "CB1")[0].severity, Severity::warning);
}

TEST(CapacitorClass, CapacitorOnOneSideOfAnOptocouplerIsNotABarrierBridge) {
  // CB1 moved to the detector circuit (VCC to G2): a plain decoupling capacitor, no safety position.
  std::string deck = opto_deck("", "");
  deck.replace(deck.find("CB1 N G2 1n"), std::string("CB1 N G2 1n").size(), "CB1 VCC G2 1n");
  RuleBench b(deck);
  EXPECT_TRUE(findings_for(b, "CB1").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
