// current-rating.triac (rules/current_rating/triac.cpp): on-state r.m.s. current against derated IT(RMS).
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

TEST(CurrentRatingTriac, BoundaryAtOneOverOnePointTwo) {
  // IT(RMS) >= 1.2 x load current (safety-data.md 6.1, [C: S30]): 6 A part, limit 5 A.
  RuleBench inside(triac_deck("v_rated=600 i_rated=6"));
  inside.set("XT1", Quantity::i_rms, 4.999);
  EXPECT_TRUE(inside.run("current-rating.triac").empty());

  RuleBench outside(triac_deck("v_rated=600 i_rated=6"));
  outside.set("XT1", Quantity::i_rms, 5.001, "high-line/50Hz");
  const Finding& f = only(outside.run("current-rating.triac"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NEAR(f.measurement->limit, 5.0, 1e-9);
  EXPECT_DOUBLE_EQ(f.measurement->value, 5.001);
  EXPECT_EQ(f.measurement->quantity, "i_rms");
}

TEST(CurrentRatingTriac, AboveTheRatingIsAnError) {
  RuleBench b(triac_deck("v_rated=600 i_rated=4"));
  b.set("XT1", Quantity::i_rms, 4.4);
  EXPECT_EQ(only(b.run("current-rating.triac")).severity, Severity::error);
}

TEST(CurrentRatingTriac, NotApplicableToTheLoadOrAnUnratedTriac) {
  RuleBench b(triac_deck("v_rated=600"));
  b.set("XT1", Quantity::i_rms, 40);
  b.set("RLOAD", Quantity::i_rms, 40);
  EXPECT_TRUE(b.run("current-rating.triac").empty());
}

TEST(CurrentRatingTriac, RecordsEveryComparisonForThePartsTable) {
  // 6 A part, limit 6/1.2 = 5 A, 4 A flowing: margin (5 − 4)/5 = 20 %, a pass the table shows.
  RuleBench b(triac_deck("v_rated=600 i_rated=6"));
  b.set("XT1", Quantity::i_rms, 4.0, "high-line");
  const auto rs = b.ratings("current-rating.triac");
  ASSERT_EQ(rs.size(), 1u);
  EXPECT_EQ(rs[0].quantity, "i_rms");
  EXPECT_EQ(rs[0].verdict, RatingVerdict::pass);
  EXPECT_EQ(rs[0].source, "annotation");
  EXPECT_DOUBLE_EQ(*rs[0].rated, 6.0);
  EXPECT_NEAR(*rs[0].limit(), 5.0, 1e-12);
  EXPECT_NEAR(*rs[0].margin(), 0.2, 1e-12);
  EXPECT_EQ(rs[0].corner, "high-line");

  // Unrated but stressed: unknown, never a pass.
  RuleBench unrated(triac_deck("v_rated=600"));
  unrated.set("XT1", Quantity::i_rms, 4.0);
  const auto us = unrated.ratings("current-rating.triac");
  ASSERT_EQ(us.size(), 1u);
  EXPECT_EQ(us[0].verdict, RatingVerdict::unknown);
  EXPECT_FALSE(us[0].rated.has_value());
  EXPECT_FALSE(us[0].margin().has_value());
}

TEST(CurrentRatingTriac, EndToEndLampCurrent) {
  // 100 W lamp at 230 V is 529 ohm; at 253 V full conduction I_rms = 253/529 = 0.478 A (safety-data.md
  // 6.2, I_rms = V_rms/R); a 0.4 A rating (limit 0.333 A) is exceeded whatever the firing angle's share.
  RuleBench b(triac_deck("v_rated=600 i_rated=0.4"));
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  auto fs = b.run("current-rating.triac");
  ASSERT_EQ(fs.size(), 1u) << b.rendered();
  EXPECT_LE(fs[0].measurement->value, 253.0 / 529.0 + 0.01);
  EXPECT_NEAR(fs[0].measurement->limit, 0.4 / 1.2, 1e-9);
}

}  // namespace
}  // namespace mainscheck::rules::testing
