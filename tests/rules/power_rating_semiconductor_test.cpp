// power-rating.semiconductor (rules/power_rating/semiconductor.cpp): triac conduction loss and heatsink note.
#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

/// P = V_T0 I_avg + r_T I_rms^2 with I_avg = (2 sqrt 2 / pi) I_rms (safety-data.md 6.2, [C: S29, S31]).
double loss_W(double i_rms) { return 0.85 * (2 * std::numbers::sqrt2 / std::numbers::pi) * i_rms + 0.035 * i_rms * i_rms; }

TEST(PowerRatingSemiconductor, HeatsinkNoteAboveOneWatt) {
  RuleBench b(triac_deck("v_rated=600 i_rated=8"));
  b.set("XT1", Quantity::i_rms, 4.0);  // 0.85 x 3.60 + 0.035 x 16 = 3.62 W
  const Finding& f = only(b.run("power-rating.semiconductor"));
  EXPECT_EQ(f.severity, Severity::note);
  EXPECT_NEAR(f.measurement->value, loss_W(4.0), 1e-9);
  EXPECT_NEAR(f.measurement->value, 3.62, 0.01);
  EXPECT_DOUBLE_EQ(f.measurement->limit, 1.0);
  EXPECT_TRUE(f.message.starts_with("XT1 conduction loss 3.62 W exceeds 1 W: it needs a heatsink")) << f.message;
}

TEST(PowerRatingSemiconductor, HeatsinkThresholdBoundary) {
  // Find the current at which the loss is exactly 1 W: 0.035 x^2 + 0.7653 x - 1 = 0.
  const double a = 0.035, k = 0.85 * 2 * std::numbers::sqrt2 / std::numbers::pi;
  const double i1 = (-k + std::sqrt(k * k + 4 * a)) / (2 * a);
  RuleBench inside(triac_deck("v_rated=600 i_rated=8"));
  inside.set("XT1", Quantity::i_rms, i1 * 0.999);
  EXPECT_TRUE(inside.run("power-rating.semiconductor").empty());
  RuleBench outside(triac_deck("v_rated=600 i_rated=8"));
  outside.set("XT1", Quantity::i_rms, i1 * 1.001);
  EXPECT_EQ(outside.run("power-rating.semiconductor").size(), 1u);
}

TEST(PowerRatingSemiconductor, RatedDissipationBoundary) {
  // p_rated 2 W, derating 0.8: limit 1.6 W; the heatsink note also fires above 1 W.
  RuleBench b(triac_deck("v_rated=600 i_rated=8 p_rated=2"));
  b.option("power-rating.semiconductor.heatsink-threshold", "100");
  b.set("XT1", Quantity::i_rms, 2.0);  // loss 1.67 W
  const Finding& f = only(b.run("power-rating.semiconductor"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NEAR(f.measurement->limit, 1.6, 1e-12);
  EXPECT_NEAR(f.measurement->value, loss_W(2.0), 1e-9);

  RuleBench in(triac_deck("v_rated=600 i_rated=8 p_rated=2"));
  in.option("power-rating.semiconductor.heatsink-threshold", "100");
  in.set("XT1", Quantity::i_rms, 1.9);  // loss 1.58 W
  EXPECT_TRUE(in.run("power-rating.semiconductor").empty());
}

TEST(PowerRatingSemiconductor, NotApplicableToTheDiacOrLoad) {
  RuleBench b(triac_deck("v_rated=600 i_rated=8"));
  b.set("XD1", Quantity::i_rms, 10);
  b.set("RLOAD", Quantity::i_rms, 10);
  EXPECT_TRUE(b.run("power-rating.semiconductor").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
