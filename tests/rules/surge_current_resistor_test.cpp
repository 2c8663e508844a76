// surge-current.resistor (rules/surge_current/resistor.cpp): switch-on energy in a dropper's surge resistor.
#include <gtest/gtest.h>

#include <cmath>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

std::string deck(const std::string& e_pulse) {
  return "dropper test\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RS1 p_rated=1 v_rated=500 e_pulse=" + e_pulse + "\n"
         "RS1 L LS 100\n"
         "*@part C1 class=X2 v_rated_ac=310\n"
         "C1 LS A 470n\n"
         "RB1 LS A 1Meg p_rated=0.25 v_rated=500\n"
         "D2 N A DR v_rated=1000 i_rated=1\n"
         "D1 A VZ DR v_rated=1000 i_rated=1\n"
         "*@part DZ1 type=zener v_zener=12 p_rated=1.3\n"
         "DZ1 N VZ DZ12\n"
         "C2 VZ N 470u v_rated=25 i_rated=0.5\n"
         "RL VZ N 1k p_rated=0.5 v_rated=200\n"
         ".model DR D(IS=5n RS=0.03 N=1.8)\n"
         ".model DZ12 D(IS=1e-14 RS=5 BV=12 IBV=5m)\n"
         ".end\n";
}

TEST(SurgeCurrentResistor, BoundaryFromTheSolverI2t) {
  // E = R x I2t: 100 ohm x 0.5 mA2s = 50 mJ; derating 0.5 on 0.1 J gives a 50 mJ limit.
  RuleBench inside(deck("0.1001"));
  inside.set_inrush("RS1", 3.0, 0.5e-3);
  EXPECT_TRUE(inside.run("surge-current.resistor").empty()) << inside.rendered();

  RuleBench outside(deck("0.0999"));
  outside.set_inrush("RS1", 3.0, 0.5e-3);
  const Finding& f = only(outside.run("surge-current.resistor"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NEAR(f.measurement->value, 0.05, 1e-12);
  EXPECT_NEAR(f.measurement->limit, 0.04995, 1e-12);
  EXPECT_EQ(f.measurement->unit, "J");
}

TEST(SurgeCurrentResistor, FormulaWhenNoSolverInrush) {
  // C V_pk^2 / 2 = 470 nF x 357.8^2 / 2 = 30.1 mJ (safety-data.md 9, [D]: 470 nF at 373 V gives 33 mJ).
  RuleBench b(deck("0.02"));
  b.set("RS1", Quantity::p_avg, 0.1);
  const Finding& f = only(b.run("surge-current.resistor"));
  EXPECT_NEAR(f.measurement->value, 470e-9 * std::pow(std::sqrt(2.0) * 253.0, 2) / 2, 1e-6);
  EXPECT_EQ(f.severity, Severity::error);  // 30 mJ > 20 mJ
}

TEST(SurgeCurrentResistor, NotApplicableOutsideADropperSurgeRole) {
  RuleBench b(deck("0.0001"));
  b.set_inrush("RL", 3.0, 10.0);
  b.set_inrush("RB1", 3.0, 10.0);
  // RS1 has no inrush entry and the formula needs no stress: it is still checked; the others never are.
  for (const auto& f : b.run("surge-current.resistor")) EXPECT_EQ(f.parts[0], "RS1");
}

TEST(SurgeCurrentResistor, EndToEnd) {
  RuleBench b(deck("0.04"));
  b.solve();
  ASSERT_TRUE(b.stress.inrush.has_value());
  const Finding& f = only(b.run("surge-current.resistor"));
  // Solver energy R x I2t should be close to C V_pk^2 / 2 = 30.1 mJ (the zener clamps the far end at
  // 12 V, a small change); limit 0.5 x 40 mJ = 20 mJ.
  EXPECT_NEAR(f.measurement->value, 0.0301, 0.005);
  EXPECT_DOUBLE_EQ(f.measurement->limit, 0.02);
}

}  // namespace
}  // namespace mainscheck::rules::testing
