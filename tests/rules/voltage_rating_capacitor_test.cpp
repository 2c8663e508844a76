// voltage-rating.capacitor (rules/voltage_rating/capacitor.cpp): DC and AC ratings, electrolytic reversal.
#include <gtest/gtest.h>

#include <cmath>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

const char* kDeck = R"(capacitor test
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
*@part CX1 class=X2 v_rated_ac=275
CX1 L N 100n
RD1 L N 1Meg p_rated=0.25 v_rated=500
*@part D1 v_rated=1000 i_rated=1
D1 L OUT DR
*@part C1 v_rated=400 i_rated=0.5
C1 OUT N 10u
R1 OUT N 47k p_rated=2 v_rated=500
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)";

TEST(VoltageRatingCapacitor, DcRatingBoundary) {
  RuleBench inside(kDeck);
  inside.set("C1", Quantity::v_peak, 319.9);  // 0.8 x 400 V = 320 V (common practice)
  EXPECT_TRUE(inside.run("voltage-rating.capacitor").empty());

  RuleBench outside(kDeck);
  outside.set("C1", Quantity::v_peak, 320.5);
  const Finding& f = only(outside.run("voltage-rating.capacitor"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_EQ(f.measurement->quantity, "v_peak");
  EXPECT_DOUBLE_EQ(f.measurement->value, 320.5);
  EXPECT_NEAR(f.measurement->limit, 320.0, 1e-9);
  EXPECT_EQ(outside.sm.line_col(f.loc).line, 10u);
}

TEST(VoltageRatingCapacitor, AcRatingAgainstRmsOfTheMainsSine) {
  // 275 V a.c. X2 on 230 V +10 %: 253 V r.m.s. is inside (safety-data.md 3.3 example); a peak of
  // 275.1 x sqrt 2 is just outside the 275 V a.c. rating (ac-derating 1.0).
  RuleBench inside(kDeck);
  inside.set("CX1", Quantity::v_peak, std::sqrt(2.0) * 253.0);
  EXPECT_TRUE(inside.run("voltage-rating.capacitor").empty());

  RuleBench outside(kDeck);
  outside.set("CX1", Quantity::v_peak, std::sqrt(2.0) * 275.1);
  const Finding& f = only(outside.run("voltage-rating.capacitor"));
  EXPECT_EQ(f.severity, Severity::error);  // above the rating itself (derating 1.0)
  EXPECT_EQ(f.measurement->quantity, "v_rms");
  EXPECT_NEAR(f.measurement->value, 275.1, 1e-9);
  EXPECT_NEAR(f.measurement->limit, 275.0, 1e-9);
}

/// Gives the rectifier block's output a hand-made mean voltage.
void add_output(RuleBench& b, double v_dc) {
  bool found = false;
  for (std::size_t i = 0; i < b.rec.blocks.size(); ++i) {
    if (b.rec.blocks[i].kind != "half-wave-rectifier" || b.rec.blocks[i].outputs.empty()) continue;
    analysis::OutputStress os;
    os.net = b.rec.blocks[i].outputs[0].net;
    os.ret = b.rec.blocks[i].outputs[0].ret;
    os.v_dc = analysis::StressValue{v_dc, "high-line", "solver", {}};
    b.stress.blocks[i].outputs.push_back(os);
    found = true;
  }
  ASSERT_TRUE(found) << b.rendered();
}

TEST(VoltageRatingCapacitor, ElectrolyticPolarityReversal) {
  const char* reversed = R"(reversed electrolytic
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
*@part D1 v_rated=1000 i_rated=1
D1 L OUT DR
*@part C1 v_rated=450 i_rated=0.5
C1 N OUT 10u
R1 OUT N 47k p_rated=2 v_rated=500
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)";
  RuleBench b(reversed);
  b.set("C1", Quantity::v_peak, 300);
  add_output(b, 340.0);
  auto fs = b.run("voltage-rating.capacitor");
  const Finding& f = only(fs);
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_EQ(f.measurement->quantity, "v_reverse_dc");
  EXPECT_DOUBLE_EQ(f.measurement->value, 340.0);
  EXPECT_DOUBLE_EQ(f.measurement->limit, 1.0);  // about 1 V reverse (from memory)

  // The same capacitor the right way round is silent.
  RuleBench ok(kDeck);
  ok.set("C1", Quantity::v_peak, 300);
  add_output(ok, 340.0);
  EXPECT_TRUE(ok.run("voltage-rating.capacitor").empty());
}

TEST(VoltageRatingCapacitor, NotApplicableToOtherParts) {
  RuleBench b(kDeck);
  b.set("R1", Quantity::v_peak, 1000);
  b.set("D1", Quantity::v_peak, 1000);
  EXPECT_TRUE(b.run("voltage-rating.capacitor").empty());
}

TEST(VoltageRatingCapacitor, EndToEndXCapacitorAtHighLine) {
  RuleBench b(R"(X capacitor rated 250 V a.c.
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
*@part CX1 class=X2 v_rated_ac=250
CX1 L N 100n
RD1 L N 1Meg p_rated=0.25 v_rated=500
.end
)");
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  const Finding& f = only(b.run("voltage-rating.capacitor"));
  // IEC 60038: 230 V +10 % = 253 V r.m.s. at the supply terminals (safety-data.md 11, [C: S40]).
  EXPECT_NEAR(f.measurement->value, 253.0, 0.5);
  EXPECT_EQ(f.severity, Severity::error);
}

}  // namespace
}  // namespace mainscheck::rules::testing
