// voltage-rating.varistor (rules/voltage_rating/varistor.cpp): MCOV against the high-line r.m.s. voltage.
#include <gtest/gtest.h>

#include <cmath>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

std::string deck(const std::string& mcov) {
  return "varistor test\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RF1 type=fuse i_rated=2 v_rated_ac=250\n"
         "RF1 L LF 0.1\n"
         "*@part RV1 type=varistor v_rated_ac=" + mcov + " v_varistor=430\n"
         "RV1 LF N 100Meg\n"
         "RL LF N 1k p_rated=100 v_rated=500\n"
         ".end\n";
}

TEST(VoltageRatingVaristor, TwoSeventyFiveVoltPartOn230VPlusTenPercent) {
  // 230 V +10 % = 253 V needs 275 V a.c. parts (safety-data.md 5, [C-part: S44]).
  RuleBench b(deck("275"));
  b.set("RV1", Quantity::v_peak, std::sqrt(2.0) * 253.0);
  EXPECT_TRUE(b.run("voltage-rating.varistor").empty());
}

TEST(VoltageRatingVaristor, BoundaryAtTheRating) {
  RuleBench inside(deck("253"));
  inside.set("RV1", Quantity::v_peak, std::sqrt(2.0) * 252.9);
  EXPECT_TRUE(inside.run("voltage-rating.varistor").empty());

  RuleBench outside(deck("253"));
  outside.set("RV1", Quantity::v_peak, std::sqrt(2.0) * 253.1, "high-line/50Hz");
  const Finding& f = only(outside.run("voltage-rating.varistor"));
  EXPECT_EQ(f.severity, Severity::error);  // derating 1.0: the limit is the rating
  EXPECT_NEAR(f.measurement->value, 253.1, 1e-9);
  EXPECT_NEAR(f.measurement->limit, 253.0, 1e-9);
  EXPECT_EQ(f.measurement->corner, "high-line/50Hz");
  EXPECT_EQ(outside.sm.line_col(f.loc).line, 7u);
}

TEST(VoltageRatingVaristor, DeratingBelowOneWarnsFirst) {
  RuleBench b(deck("275"));
  b.option("voltage-rating.varistor.derating", "0.9");
  b.set("RV1", Quantity::v_peak, std::sqrt(2.0) * 253.0);
  const Finding& f = only(b.run("voltage-rating.varistor"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NEAR(f.measurement->limit, 247.5, 1e-9);
}

TEST(VoltageRatingVaristor, NotApplicableToTheFuse) {
  RuleBench b(deck("275"));
  b.set("RF1", Quantity::v_peak, 400);
  EXPECT_TRUE(b.run("voltage-rating.varistor").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
