// stress-unverified (rules/stress_unverified.cpp): unconverged blocks and formula/solver disagreements.
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

const char* kDeck = R"(half-wave
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
*@part D1 v_rated=1000 i_rated=1
D1 L OUT DR
C1 OUT N 10u v_rated=450 i_rated=1
R1 OUT N 47k p_rated=2 v_rated=500
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)";

std::size_t rectifier(const RuleBench& b) {
  for (std::size_t i = 0; i < b.rec.blocks.size(); ++i)
    if (b.rec.blocks[i].kind == "half-wave-rectifier") return i;
  ADD_FAILURE() << "no half-wave rectifier\n" << b.rendered();
  return 0;
}

TEST(StressUnverified, UnconvergedBlockIsAnError) {
  RuleBench b(kDeck);
  b.set("D1", Quantity::v_peak, 1);
  const std::size_t k = rectifier(b);
  b.stress.blocks[k].converged = false;
  b.stress.blocks[k].failure = "the solver did not converge at corner high-line/50Hz: step too small";
  const Finding& f = only(b.run("stress-unverified"));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_EQ(f.block, b.rec.blocks[k].id);
  EXPECT_EQ(f.message, "stresses of " + b.rec.blocks[k].id +
                           " half-wave-rectifier are unverified: the solver did not converge at corner "
                           "high-line/50Hz: step too small; none of its parts' ratings could be checked");
  EXPECT_EQ(f.parts, (std::vector<std::string>{"D1", "C1", "R1"}));
}

TEST(StressUnverified, DisagreementBeyondMarginIsAWarning) {
  RuleBench b(kDeck);
  b.set("D1", Quantity::v_peak, 1);
  const std::size_t k = rectifier(b);
  b.stress.blocks[k].disagreements.push_back({b.part("D1"), "i_rms", 0.100, 0.120, 0.15});
  const Finding& f = only(b.run("stress-unverified"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NEAR(f.measurement->value, 0.02 / 0.12, 1e-12);  // |0.10 - 0.12| / 0.12
  EXPECT_DOUBLE_EQ(f.measurement->limit, 0.15);
  EXPECT_TRUE(f.message.starts_with("D1 i_rms from the solver (100 mA) and the textbook estimate (120 mA) differ by "
                                    "16.7 % (margin 15 %)"))
      << f.message;
}

TEST(StressUnverified, MinDifferenceOption) {
  RuleBench b(kDeck);
  b.option("stress-unverified.min-difference", "0.2");
  b.set("D1", Quantity::v_peak, 1);
  b.stress.blocks[rectifier(b)].disagreements.push_back({b.part("D1"), "i_rms", 0.100, 0.120, 0.15});
  EXPECT_TRUE(b.run("stress-unverified").empty());
}

TEST(StressUnverified, ConvergedAgreeingBlocksAreSilent) {
  RuleBench b(kDeck);
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  for (const auto& f : b.run("stress-unverified")) EXPECT_EQ(f.severity, Severity::warning) << f.message;
}

TEST(StressUnverified, EndToEndUnmodellablePart) {
  // A transmission line cannot be modelled by the solver: every block is unverified.
  RuleBench b(R"(tline
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
*@part D1 v_rated=1000 i_rated=1
D1 L OUT DR
C1 OUT N 10u v_rated=450 i_rated=1
R1 OUT N 47k p_rated=2 v_rated=500
T1 OUT N X 0 Z0=50 TD=1n
RX X 0 50
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)");
  b.solve();
  auto fs = b.run("stress-unverified");
  ASSERT_FALSE(fs.empty()) << b.stress.failure << "\n" << b.rendered();
  for (const auto& f : fs) EXPECT_EQ(f.severity, Severity::error);
  EXPECT_TRUE(b.run("voltage-rating.diode").empty());  // no numbers, so no rating finding either
}

}  // namespace
}  // namespace mainscheck::rules::testing
