// power-rating.resistor (rules/power_rating/resistor.cpp): dissipation against derated power rating.
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

const char* kDeck = R"(dropper test
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
R1 L A 10k p_rated=0.5 v_rated=500
R2 A N 10k p_rated=5 v_rated=500
R3 L N 1Meg package=1206
.end
)";

TEST(PowerRatingResistor, Boundary) {
  // 60 % of rated power (safety-data.md 10.3, [C: S38]): 0.3 W on a 0.5 W part.
  RuleBench inside(kDeck);
  inside.set("R1", Quantity::p_avg, 0.2999);
  EXPECT_TRUE(inside.run("power-rating.resistor").empty());

  RuleBench outside(kDeck);
  outside.set("R1", Quantity::p_avg, 0.3001);
  const Finding& f = only(outside.run("power-rating.resistor"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NEAR(f.measurement->limit, 0.3, 1e-12);
  EXPECT_EQ(f.measurement->unit, "W");
}

TEST(PowerRatingResistor, PackagePowerWhenNoRating) {
  // 1206 chip: 1/8 W at 70 C, lower end (safety-data.md 10.1, [C: S36]); x 0.6 = 75 mW.
  RuleBench b(kDeck);
  b.set("R3", Quantity::p_avg, 0.0751);
  const Finding& f = only(b.run("power-rating.resistor"));
  EXPECT_NEAR(f.measurement->limit, 0.075, 1e-12);
}

TEST(PowerRatingResistor, NotApplicableToOtherParts) {
  RuleBench b(R"(n/a
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
*@part CX1 class=X2 v_rated_ac=310 p_rated=0.001
CX1 L N 100n
.end
)");
  b.set("CX1", Quantity::p_avg, 1.0);
  EXPECT_TRUE(b.run("power-rating.resistor").empty());
}

TEST(PowerRatingResistor, EndToEndResistiveDivider) {
  RuleBench b(kDeck);
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  auto fs = b.run("power-rating.resistor");
  ASSERT_EQ(fs.size(), 1u);
  // Two equal 10 k in series across 253 V: each dissipates (126.5 V)^2 / 10 k = 1.6 W (Ohm's law),
  // above R1's 0.5 W rating: error.
  EXPECT_EQ(fs[0].parts[0], "R1");
  EXPECT_NEAR(fs[0].measurement->value, 126.5 * 126.5 / 10e3, 0.02);
  EXPECT_EQ(fs[0].severity, Severity::error);
}

}  // namespace
}  // namespace mainscheck::rules::testing
