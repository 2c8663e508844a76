// voltage-rating.diode (rules/voltage_rating/diode.cpp): reverse voltage against derated VRRM.
#include <gtest/gtest.h>

#include <cmath>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

// Half-wave rectifier with a reservoir on 230 V +-10 %: the diode's PIV is about 2 V_pk
// (safety-data.md 7, [M, textbook]).
const char* kHalfWave = R"(half-wave test
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
*@part D1 v_rated=400 i_rated=1
D1 L OUT DR
C1 OUT N 10u v_rated=450
R1 OUT N 47k p_rated=2 v_rated=500
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)";

TEST(VoltageRatingDiode, JustInsideTheDeratedLimitIsSilent) {
  RuleBench b(kHalfWave);
  b.set("D1", Quantity::v_reverse_peak, 319.9);  // limit 0.8 x 400 V = 320 V (common practice)
  EXPECT_TRUE(b.run("voltage-rating.diode").empty());
}

TEST(VoltageRatingDiode, JustOutsideTheDeratedLimitWarns) {
  RuleBench b(kHalfWave);
  b.set("D1", Quantity::v_reverse_peak, 320.1, "high-line/50Hz");
  const Finding& f = only(b.run("voltage-rating.diode"));
  EXPECT_EQ(f.severity, Severity::warning);
  ASSERT_TRUE(f.measurement);
  EXPECT_DOUBLE_EQ(f.measurement->value, 320.1);
  EXPECT_NEAR(f.measurement->limit, 320.0, 1e-9);
  EXPECT_EQ(f.measurement->unit, "V");
  EXPECT_EQ(f.measurement->corner, "high-line/50Hz");
  EXPECT_NEAR(f.measurement->margin(), -0.1 / 320.0, 1e-12);
  EXPECT_EQ(f.message,
            "D1 reverse voltage 320 V exceeds 80 % of its 400 V rating (limit 320 V, margin -0.0313 %, "
            "at high-line/50Hz)");
  EXPECT_EQ(f.parts, std::vector<std::string>{"D1"});
  EXPECT_EQ(b.sm.line_col(f.loc).line, 5u);
  EXPECT_FALSE(f.block.empty()) << "the half-wave rectifier block holds D1";
  EXPECT_FALSE(f.basis.empty());
}

TEST(VoltageRatingDiode, AboveTheRatingItselfIsAnError) {
  RuleBench b(kHalfWave);
  b.set("D1", Quantity::v_reverse_peak, 715.6);  // 2 x sqrt(2) x 253 V, textbook PIV at high line
  const Finding& f = only(b.run("voltage-rating.diode"));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_TRUE(f.message.starts_with("D1 reverse voltage 716 V exceeds its 400 V rating")) << f.message;
}

TEST(VoltageRatingDiode, PolicyDeratingMovesTheLimit) {
  RuleBench b(kHalfWave);
  b.option("voltage-rating.diode.derating", "70%");
  b.set("D1", Quantity::v_reverse_peak, 281);
  const Finding& f = only(b.run("voltage-rating.diode"));
  EXPECT_NEAR(f.measurement->limit, 280.0, 1e-9);
}

TEST(VoltageRatingDiode, NotApplicableToResistorsOrUnratedDiodes) {
  RuleBench b(R"(n/a
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
D1 L OUT DR
C1 OUT N 10u v_rated=450
R1 OUT N 47k p_rated=2 v_rated=500
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)");
  b.set("D1", Quantity::v_reverse_peak, 700);  // no rating: rating-unknown's job, not this rule's
  b.set("R1", Quantity::v_peak, 700);
  EXPECT_TRUE(b.run("voltage-rating.diode").empty());
  EXPECT_EQ(b.run("rating-unknown").size(), 1u);
}

TEST(VoltageRatingDiode, EndToEndHalfWavePivFromTheSolver) {
  RuleBench b(kHalfWave);
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  const Finding& f = only(b.run("voltage-rating.diode"));
  // Textbook PIV of a half-wave rectifier with a reservoir: about 2 V_pk = 2 sqrt(2) 253 V = 716 V at
  // high line (safety-data.md 7); the 47 k load lets the reservoir sag a little, so allow 5 %.
  EXPECT_NEAR(f.measurement->value, 2 * std::sqrt(2.0) * 253.0, 0.05 * 716.0);
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_EQ(f.measurement->corner.substr(0, 4), "high");
}

}  // namespace
}  // namespace mainscheck::rules::testing
