// current-rating.capacitor-ripple (rules/current_rating/capacitor_ripple.cpp): electrolytic ripple current.
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

const char* kDeck = R"(reservoir test
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
*@part D1 v_rated=1000 i_rated=3
D1 L OUT DR
*@part C1 v_rated=450 i_rated=0.5
C1 OUT N 100u
*@part CF1 v_rated=630
CF1 OUT N 470n
RL OUT N 2.2k p_rated=100 v_rated=1000
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)";

TEST(CurrentRatingCapacitorRipple, Boundary) {
  // 0.8 x 0.5 A = 0.4 A (common practice).
  RuleBench inside(kDeck);
  inside.set("C1", Quantity::i_rms, 0.3999);
  EXPECT_TRUE(inside.run("current-rating.capacitor-ripple").empty());

  RuleBench outside(kDeck);
  outside.set("C1", Quantity::i_rms, 0.4001);
  const Finding& f = only(outside.run("current-rating.capacitor-ripple"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NEAR(f.measurement->limit, 0.4, 1e-12);
  EXPECT_DOUBLE_EQ(f.measurement->value, 0.4001);
}

TEST(CurrentRatingCapacitorRipple, FilmCapacitorBelowOneMicrofaradIsNotElectrolytic) {
  RuleBench b(kDeck);
  b.set("CF1", Quantity::i_rms, 5.0);
  EXPECT_TRUE(b.run("current-rating.capacitor-ripple").empty());
}

TEST(CurrentRatingCapacitorRipple, EndToEndHalfWaveReservoir) {
  RuleBench b(kDeck);
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  const Finding& f = only(b.run("current-rating.capacitor-ripple"));
  // I_dc about 358 V / 2.2 k = 0.16 A; a half-wave reservoir's ripple current is several times I_dc
  // (safety-data.md 7: I sqrt(4 T_r / (3 t_c) - 1), short conduction angle), above the 0.4 A limit.
  EXPECT_GT(f.measurement->value, 0.4);
  EXPECT_LT(f.measurement->value, 2.0);
}

}  // namespace
}  // namespace mainscheck::rules::testing
