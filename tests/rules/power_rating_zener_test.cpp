// power-rating.zener (rules/power_rating/zener.cpp): zener dissipation including the no-load case.
#include <gtest/gtest.h>

#include <algorithm>

#include <cmath>
#include <numbers>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

std::string deck(const std::string& p_rated) {
  return "dropper test\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "RS1 L LS 100 p_rated=1 v_rated=500 e_pulse=10\n"
         "*@part C1 class=X2 v_rated_ac=310\n"
         "C1 LS A 470n\n"
         "RB1 LS A 1Meg p_rated=0.25 v_rated=500\n"
         "D2 N A DR v_rated=1000 i_rated=1\n"
         "D1 A VZ DR v_rated=1000 i_rated=1\n"
         "*@part DZ1 type=zener v_zener=12 p_rated=" + p_rated + "\n"
         "DZ1 N VZ DZ12\n"
         "C2 VZ N 470u v_rated=25 i_rated=0.5\n"
         "RL VZ N 1k p_rated=0.5 v_rated=200\n"
         ".model DR D(IS=5n RS=0.03 N=1.8)\n"
         ".model DZ12 D(IS=1e-14 RS=5 BV=12 IBV=5m)\n"
         ".end\n";
}

/// The no-load estimate the rule uses: V_Z x I_dc of the half-wave dropper at 253 V 50 Hz, 470 nF.
double no_load_W(RuleBench& b) {
  b.set("DZ1", Quantity::p_avg, 1e-6);
  b.option("power-rating.zener.derating", "1e-9");
  auto fs = b.run("power-rating.zener");
  EXPECT_EQ(fs.size(), 1u);
  b.policy.options.clear();
  return fs.empty() ? 0 : fs[0].measurement->value;
}

TEST(PowerRatingZener, NoLoadEstimateMatchesTheTextbook) {
  RuleBench b(deck("1.3"));
  const double p = no_load_W(b);
  // Half-wave dropper with shunt zener: I_dc ~ 0.45 I_rms, I_rms = V / Xc (safety-data.md 9, [D]):
  // Xc = 1/(2 pi 50 470n) = 6773 ohm, I_rms = 253/6773 = 37.4 mA, I_dc ~ 16.8 mA, P ~ 12 V x 16.8 mA = 0.2 W.
  EXPECT_NEAR(p, 12.0 * 0.45 * 253.0 * 2 * std::numbers::pi * 50 * 470e-9, 0.05);
}

TEST(PowerRatingZener, BoundaryOnTheNoLoadDissipation) {
  RuleBench probe(deck("1.3"));
  const double p = no_load_W(probe);
  ASSERT_GT(p, 0.1);
  // derating 0.5 (common practice): rated just above / below 2 P.
  RuleBench inside(deck(std::to_string(2 * p * 1.001)));
  inside.set("DZ1", Quantity::p_avg, 1e-6);
  EXPECT_TRUE(inside.run("power-rating.zener").empty());

  RuleBench outside(deck(std::to_string(2 * p * 0.999)));
  outside.set("DZ1", Quantity::p_avg, 1e-6);
  const Finding& f = only(outside.run("power-rating.zener"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NEAR(f.measurement->value, p, 1e-9);
  EXPECT_TRUE(f.message.starts_with("DZ1 no-load dissipation")) << f.message;
}

TEST(PowerRatingZener, MeasuredLoadCurrentMovesIntoTheZener) {
  RuleBench b(deck("10"));
  b.set("DZ1", Quantity::p_avg, 0.05);
  b.set("RL", Quantity::i_avg, 0.5);  // an implausibly large load: P = 0.05 + 12 x 0.5 = 6.05 W
  const Finding& f = only(b.run("power-rating.zener"));
  EXPECT_NEAR(f.measurement->value, 6.05, 1e-9);
  EXPECT_EQ(f.severity, Severity::warning);  // 6.05 W > 5 W, < 10 W
}

TEST(PowerRatingZener, NotApplicableToRectifierDiodes) {
  RuleBench b(deck("1.3"));
  b.set("D1", Quantity::p_avg, 10);
  EXPECT_TRUE(b.run("power-rating.zener").empty());
}

TEST(PowerRatingZener, EndToEnd) {
  RuleBench b(deck("0.25"));
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  const Finding& f = only(b.run("power-rating.zener"));
  EXPECT_EQ(f.severity, Severity::warning);  // about 0.2 W > 0.125 W, below 0.25 W
  EXPECT_GT(f.measurement->value, 0.125);
}

// Issue 15 item 4: an untyped diode with a low model BV is a zener only when the solver holds it in
// breakdown as a regulator, and the report says so.
std::string bv_dropper(const std::string& r_dropper, const std::string& r_load) {
  return "resistive dropper, untyped 12 V breakdown diode\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "RD1 L A " + r_dropper + " p_rated=5 v_rated=750\n"
         "D1 A VCC DR v_rated=1000 i_rated=1\n"
         "D2 N VCC DB12 p_rated=1.3\n"
         "C1 VCC N 220u v_rated=25\n"
         "RL VCC N " + r_load + " p_rated=1 v_rated=200\n"
         ".model DR D(IS=5n RS=0.03 N=1.8)\n"
         ".model DB12 D(IS=1e-14 RS=5 BV=12 IBV=5m)\n"
         ".end\n";
}

TEST(PowerRatingZener, UntypedDiodeSolvedInBreakdownIsTakenAsZener) {
  RuleBench b(bv_dropper("22k", "4.7k"));
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  const std::size_t d2 = b.part("D2");
  EXPECT_EQ(b.rec.info.type(d2), analysis::FrontEndType::diode);
  ASSERT_TRUE(b.stress.taken_as_zener.count(d2)) << b.rendered();
  EXPECT_TRUE(b.stress.taken_as_zener.at(d2).starts_with("D2 taken as zener: solved in breakdown"))
      << b.stress.taken_as_zener.at(d2);
  EXPECT_NE(std::find(b.stress.assumptions.begin(), b.stress.assumptions.end(), b.stress.taken_as_zener.at(d2)),
            b.stress.assumptions.end());
  // Checked as a zener: no rectifier ratings asked for, no rectifier checks.
  for (const char* rule : {"rating-unknown", "current-rating.diode", "voltage-rating.diode", "surge-current.diode"})
    for (const auto& f : b.run(rule)) EXPECT_NE(f.parts.front(), "D2") << rule << ": " << f.message;
}

TEST(PowerRatingZener, UntypedDiodeNeverInBreakdownStaysARectifier) {
  // Boundary: 68 kΩ cannot lift the output to 12 V into 1 kΩ, so D2 never breaks down.
  RuleBench b(bv_dropper("68k", "1k"));
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  EXPECT_FALSE(b.stress.taken_as_zener.count(b.part("D2")));
  bool stated = false;
  for (const auto& a : b.stress.assumptions) stated = stated || a.find("D2 (model BV=12 V)") == 0;
  EXPECT_TRUE(stated);
  EXPECT_TRUE(b.run("power-rating.zener").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
