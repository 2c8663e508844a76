// voltage-rating.semiconductor (rules/voltage_rating/semiconductor.cpp): triac off-state voltage vs VDRM.
#include <gtest/gtest.h>

#include <cmath>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

// The crest of 230 V +10 % is sqrt 2 x 253 = 357.8 V (IEC 60038 tolerance, safety-data.md 11 [C: S40];
// peak [D]); derating 0.6 (common practice: 600 V parts on 230 V mains, safety-data.md 6.1 [M]).
const double kCrest = std::sqrt(2.0) * 253.0;

TEST(VoltageRatingSemiconductor, SixHundredVoltTriacOn230VPasses) {
  RuleBench b(triac_deck("v_rated=600 i_rated=8"));
  b.set("XT1", Quantity::v_peak, 10.0);  // solver at full conduction: tiny; the crest still applies
  EXPECT_TRUE(b.run("voltage-rating.semiconductor").empty()) << b.rendered();
}

TEST(VoltageRatingSemiconductor, BoundaryOnTheDeratedLimit) {
  // Limit 0.6 x VDRM; VDRM chosen so the crest sits just inside / just outside it.
  RuleBench inside(triac_deck("v_rated=" + std::to_string(kCrest / 0.6 + 0.5)));
  inside.set("XT1", Quantity::v_peak, 10.0);
  EXPECT_TRUE(inside.run("voltage-rating.semiconductor").empty());

  RuleBench outside(triac_deck("v_rated=" + std::to_string(kCrest / 0.6 - 0.5)));
  outside.set("XT1", Quantity::v_peak, 10.0);
  const Finding& f = only(outside.run("voltage-rating.semiconductor"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NEAR(f.measurement->value, kCrest, 1e-6);
  EXPECT_NEAR(f.measurement->limit, 0.6 * (kCrest / 0.6 - 0.5), 1e-3);
  EXPECT_EQ(f.measurement->corner.substr(0, 9), "high-line");
}

TEST(VoltageRatingSemiconductor, FourHundredVoltTriacOn230VIsAWarning) {
  RuleBench b(triac_deck("v_rated=400"));
  b.set("XT1", Quantity::v_peak, 357.0);
  const Finding& f = only(b.run("voltage-rating.semiconductor"));
  EXPECT_EQ(f.severity, Severity::warning);  // 358 V > 240 V but < 400 V
  EXPECT_NEAR(f.measurement->limit, 240.0, 1e-9);
  EXPECT_TRUE(f.message.starts_with("XT1 off-state voltage 358 V exceeds 60 % of its 400 V rating")) << f.message;
}

TEST(VoltageRatingSemiconductor, ComputedPeakAboveTheCrestWins) {
  RuleBench b(triac_deck("v_rated=600"));
  b.set("XT1", Quantity::v_peak, 650.0);  // an inductive kick above the rating
  const Finding& f = only(b.run("voltage-rating.semiconductor"));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_DOUBLE_EQ(f.measurement->value, 650.0);
}

TEST(VoltageRatingSemiconductor, NotApplicableToTheDiac) {
  RuleBench b(triac_deck("v_rated=600"));
  b.set("XD1", Quantity::v_peak, 1000.0);
  EXPECT_TRUE(b.run("voltage-rating.semiconductor").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
