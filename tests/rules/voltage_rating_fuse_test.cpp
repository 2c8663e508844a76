// voltage-rating.fuse (rules/voltage_rating/fuse.cpp): fuse rated voltage against the circuit voltage.
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

std::string deck(const std::string& supply, const std::string& fuse_attrs) {
  return "fuse test\n"
         "*@supply mains=" + supply + " line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RF1 type=fuse i_rated=10 " + fuse_attrs + "\n"
         "RF1 L LF 0.05\n"
         "*@part RH type=heater p_rated=2000\n"
         "RH LF N 26.5\n"
         ".end\n";
}

TEST(VoltageRatingFuse, TwoFiftyVoltFuseOn230V) {
  // 250 V types for 230 V mains (safety-data.md 4.3); high line 253 V exceeds 250 V.
  RuleBench b(deck("230V+-10%/50Hz", "v_rated_ac=250"));
  b.set("RF1", Quantity::i_rms, 9.5);
  const Finding& f = only(b.run("voltage-rating.fuse"));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_NEAR(f.measurement->value, 253.0, 1e-9);
  EXPECT_NEAR(f.measurement->limit, 250.0, 1e-9);
  EXPECT_EQ(f.measurement->corner.substr(0, 9), "high-line");
}

TEST(VoltageRatingFuse, BoundaryJustInsideAndOutside) {
  // Nominal 230 V, tolerance +10 %: high line exactly 253 V (docs/corners.md, IEC 60038).
  RuleBench inside(deck("230V+-10%/50Hz", "v_rated_ac=253.1"));
  EXPECT_TRUE(inside.run("voltage-rating.fuse").empty());
  RuleBench outside(deck("230V+-10%/50Hz", "v_rated_ac=252.9"));
  const Finding& f = only(outside.run("voltage-rating.fuse"));
  EXPECT_NEAR(f.measurement->limit, 252.9, 1e-9);
}

TEST(VoltageRatingFuse, DcRatingUsedWhenNoAcRating) {
  RuleBench b(deck("120V+-5%/60Hz", "v_rated=125"));
  const Finding& f = only(b.run("voltage-rating.fuse"));  // 126 V > 125 V
  EXPECT_NEAR(f.measurement->value, 126.0, 1e-9);
}

TEST(VoltageRatingFuse, NotApplicableWithoutAFuseOrItsRating) {
  RuleBench b(deck("230V+-10%/50Hz", ""));
  EXPECT_TRUE(b.run("voltage-rating.fuse").empty());
  RuleBench ok(deck("230V+-10%/50Hz", "v_rated_ac=300"));
  EXPECT_TRUE(ok.run("voltage-rating.fuse").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
