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

TEST(VoltageRatingFuse, TwoFiftyVoltFuseServesA230VMains) {
  // The rated voltage is compared with the nominal system voltage (IEC 60127-1 rated voltage, from
  // memory; IEC 60038: 230 V), not with the +10 % high line of 253 V: 250 V fuses are the standard
  // part for 230 V mains (common practice).
  RuleBench b(deck("230V+-10%/50Hz", "v_rated_ac=250"));
  b.set("RF1", Quantity::i_rms, 9.5);
  EXPECT_TRUE(b.run("voltage-rating.fuse").empty());
}

TEST(VoltageRatingFuse, OneTwentyFiveVoltFuseOn230V) {
  RuleBench b(deck("230V+-10%/50Hz", "v_rated_ac=125"));
  b.set("RF1", Quantity::i_rms, 9.5);
  const Finding& f = only(b.run("voltage-rating.fuse"));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_NEAR(f.measurement->value, 230.0, 1e-9);
  EXPECT_NEAR(f.measurement->limit, 125.0, 1e-9);
  EXPECT_EQ(f.measurement->corner, "nominal");
}

TEST(VoltageRatingFuse, BoundaryJustInsideAndOutside) {
  // Nominal 230 V (IEC 60038), whatever the tolerance.
  RuleBench inside(deck("230V+-10%/50Hz", "v_rated_ac=230.1"));
  EXPECT_TRUE(inside.run("voltage-rating.fuse").empty());
  RuleBench outside(deck("230V+-10%/50Hz", "v_rated_ac=229.9"));
  const Finding& f = only(outside.run("voltage-rating.fuse"));
  EXPECT_NEAR(f.measurement->limit, 229.9, 1e-9);
}

TEST(VoltageRatingFuse, RatedRangeUsesItsTop) {
  // A universal-input product rated 100-240 V: its fuse must be rated for 240 V.
  RuleBench b(deck("100-240V/50Hz", "v_rated_ac=125"));
  const Finding& f = only(b.run("voltage-rating.fuse"));
  EXPECT_NEAR(f.measurement->value, 240.0, 1e-9);
}

TEST(VoltageRatingFuse, DcRatingUsedWhenNoAcRating) {
  RuleBench b(deck("120V+-5%/60Hz", "v_rated=110"));
  const Finding& f = only(b.run("voltage-rating.fuse"));  // nominal 120 V > 110 V
  EXPECT_NEAR(f.measurement->value, 120.0, 1e-9);
}

TEST(VoltageRatingFuse, NotApplicableWithoutAFuseOrItsRating) {
  RuleBench b(deck("230V+-10%/50Hz", ""));
  EXPECT_TRUE(b.run("voltage-rating.fuse").empty());
  RuleBench ok(deck("230V+-10%/50Hz", "v_rated_ac=300"));
  EXPECT_TRUE(ok.run("voltage-rating.fuse").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
