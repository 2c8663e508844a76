// voltage-rating.resistor (rules/voltage_rating/resistor.cpp): limiting voltage, package defaults, √(P·R).
#include <gtest/gtest.h>

#include <cmath>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

const char* kDeck = R"(bleeder test
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
*@part CX1 class=X2 v_rated_ac=310
CX1 L N 100n
RB1 L N 1Meg package=0805
RB2 L N 2.2Meg v_rated=350 p_rated=0.25
RB3 L N 10k p_rated=0.25 v_rated=500
.end
)";

TEST(VoltageRatingResistor, PackageOnlyUsesTheTypicalChipVoltage) {
  // 0805 thick-film chip: 150 V maximum working voltage (safety-data.md 10.1, [C: S36]); x 0.8 = 120 V.
  RuleBench inside(kDeck);
  inside.set("RB1", Quantity::v_peak, 119.9);
  EXPECT_TRUE(inside.run("voltage-rating.resistor").empty());

  RuleBench outside(kDeck);
  outside.set("RB1", Quantity::v_peak, 120.1);
  const Finding& f = only(outside.run("voltage-rating.resistor"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NEAR(f.measurement->limit, 120.0, 1e-9);
  EXPECT_DOUBLE_EQ(f.measurement->value, 120.1);
  ASSERT_FALSE(f.notes.empty());
  EXPECT_NE(f.notes[0].message.find("0805"), std::string::npos) << f.notes[0].message;
}

TEST(VoltageRatingResistor, MainsPeakOnAn0805IsAnError) {
  // 253 V high line: sqrt 2 x 253 = 357.8 V peak (safety-data.md 11, [D]) against 150 V.
  RuleBench b(kDeck);
  b.set("RB1", Quantity::v_peak, std::sqrt(2.0) * 253.0);
  const Finding& f = only(b.run("voltage-rating.resistor"));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_TRUE(f.message.starts_with("RB1 peak voltage 358 V exceeds its 150 V rating")) << f.message;
}

TEST(VoltageRatingResistor, StatedRatingWins) {
  RuleBench b(kDeck);
  b.set("RB2", Quantity::v_peak, 280.1);  // 0.8 x 350 V = 280 V; sqrt(0.25 x 2.2M) = 742 V is higher
  const Finding& f = only(b.run("voltage-rating.resistor"));
  EXPECT_NEAR(f.measurement->limit, 280.0, 1e-9);
}

TEST(VoltageRatingResistor, BelowTheCriticalResistanceTheElementLimitStillApplies) {
  // 10 k, 0.25 W, 500 V: R_crit = 500^2 / 0.25 = 1 M (safety-data.md 10.3, [D]); below it the power
  // rule governs, this rule keeps to the element voltage: 0.8 x 500 V = 400 V.
  RuleBench b(kDeck);
  b.set("RB3", Quantity::v_peak, 400.1);
  EXPECT_NEAR(only(b.run("voltage-rating.resistor")).measurement->limit, 400.0, 1e-9);
  RuleBench in(kDeck);
  in.set("RB3", Quantity::v_peak, 399.9);
  EXPECT_TRUE(in.run("voltage-rating.resistor").empty());
}

TEST(VoltageRatingResistor, NotApplicableToCapacitors) {
  RuleBench b(kDeck);
  b.set("CX1", Quantity::v_peak, 1000);
  EXPECT_TRUE(b.run("voltage-rating.resistor").empty());
}

TEST(VoltageRatingResistor, EndToEndBleederAcrossTheMains) {
  RuleBench b(kDeck);
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  auto fs = b.run("voltage-rating.resistor");
  // RB1 (0805, 150 V) and RB2 (350 V, limit 280 V) see the 357.8 V crest; RB3 (limit 400 V) passes.
  ASSERT_EQ(fs.size(), 2u);
  for (const auto& f : fs) EXPECT_NEAR(f.measurement->value, std::sqrt(2.0) * 253.0, 1.0) << f.message;
}

}  // namespace
}  // namespace mainscheck::rules::testing
