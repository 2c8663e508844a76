// current-rating.diode (rules/current_rating/diode.cpp): average forward current against derated IF(AV).
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

const char* kDeck = R"(charger test
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
*@part D1 v_rated=1000 i_rated=1
D1 L OUT DR
C1 OUT N 1000u v_rated=450 i_rated=5
RL OUT N 220 p_rated=1000 v_rated=1000
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)";

TEST(CurrentRatingDiode, Boundary) {
  // 0.7 x 1 A = 0.7 A (common practice).
  RuleBench inside(kDeck);
  inside.set("D1", Quantity::i_avg, 0.699);
  EXPECT_TRUE(inside.run("current-rating.diode").empty());

  RuleBench outside(kDeck);
  outside.set("D1", Quantity::i_avg, 0.701);
  const Finding& f = only(outside.run("current-rating.diode"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_DOUBLE_EQ(f.measurement->value, 0.701);
  EXPECT_NEAR(f.measurement->limit, 0.7, 1e-12);
  EXPECT_EQ(f.measurement->unit, "A");
  EXPECT_TRUE(f.message.starts_with("D1 average current 701 mA exceeds 70 % of its 1 A rating (limit 700 mA"))
      << f.message;
}

TEST(CurrentRatingDiode, AboveTheRatingIsAnError) {
  RuleBench b(kDeck);
  b.set("D1", Quantity::i_avg, -1.4);  // sign follows the first pin; the magnitude counts
  const Finding& f = only(b.run("current-rating.diode"));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_DOUBLE_EQ(f.measurement->value, 1.4);
}

TEST(CurrentRatingDiode, NotApplicableToResistors) {
  RuleBench b(kDeck);
  b.set("RL", Quantity::i_avg, 5);
  EXPECT_TRUE(b.run("current-rating.diode").empty());
}

TEST(CurrentRatingDiode, EndToEndHalfWaveLoad) {
  RuleBench b(kDeck);
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  const Finding& f = only(b.run("current-rating.diode"));
  // The diode's mean current equals the load's DC current, about V_pk/R = 357.8 V / 220 = 1.6 A less
  // ripple sag (safety-data.md 7: mean d.c. ~ V_pk - drops - dV/2).
  EXPECT_GT(f.measurement->value, 1.3);
  EXPECT_LT(f.measurement->value, 1.65);
  EXPECT_EQ(f.severity, Severity::error);
}

TEST(CurrentRatingDiode, LowBvRectifierKeepsItsCurrentCheck) {
  // Issue 15 item 4: a 40 V rectifier (model BV=40) is a diode, not a zener; its current check stays.
  std::string deck = kDeck;
  deck.replace(deck.find(".model DR D(IS=5n RS=0.03 N=1.8)"), 33, ".model DR D(IS=5n RS=0.03 N=1.8 BV=40)");
  RuleBench b(deck);
  b.set("D1", Quantity::i_avg, 0.701);
  EXPECT_EQ(only(b.run("current-rating.diode")).parts.front(), "D1") << b.rendered();
}

}  // namespace
}  // namespace mainscheck::rules::testing
