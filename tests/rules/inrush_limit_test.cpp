// inrush-limit (rules/safety/inrush_limit.cpp): capacitor-input rectifiers without a series limiter.
// Boundaries are set with hand-made switch-on stresses, so the check sits exactly on the rating.
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

std::string deck(const std::string& limiter) {
  const std::string ac = limiter.empty() ? "LF" : "LA";
  return "inrush test\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325 50)\n"
         ".model DX D(IS=1n BV=1000)\n"
         "*@part RF1 type=fuse i_rated=2 i2t_melt=10\n"
         "RF1 L LF 0.05\n" + limiter +
         "*@part D1 i_surge=30\n*@part D2 i_surge=30\n*@part D3 i_surge=30\n*@part D4 i_surge=30\n"
         "D1 " + ac + " P DX\nD2 N P DX\nD3 M " + ac + " DX\nD4 M N DX\n"
         "CB P M 100u\nRL P M 10k\n.end\n";
}

TEST(InrushLimit, SurgeAboveTheDiodeRating) {
  RuleBench b(deck(""));
  b.set_inrush("D1", 80, 1.0);
  const Finding f = only(b.run("inrush-limit"));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_EQ(f.measurement->quantity, "i_surge");
  EXPECT_NEAR(f.measurement->value, 80, 1e-12);
  EXPECT_NEAR(f.measurement->limit, 30, 1e-12);
  EXPECT_NE(f.message.find("no series limiter"), std::string::npos) << f.message;
}

TEST(InrushLimit, JustInsideAndJustOutsideTheSurgeRating) {
  RuleBench inside(deck(""));
  inside.set_inrush("D1", 30, 1.0);
  EXPECT_TRUE(inside.run("inrush-limit").empty());
  RuleBench outside(deck(""));
  outside.set_inrush("D1", 30.01, 1.0);
  EXPECT_NEAR(only(outside.run("inrush-limit")).measurement->value, 30.01, 1e-12);
}

TEST(InrushLimit, FuseMeltingI2tFraction) {
  // 22 % of 10 A²s = 2.2 A²s (pulse withstand for 100 000 pulses, safety-data.md 12.2; maker data S19).
  RuleBench inside(deck(""));
  inside.set_inrush("RF1", 20, 2.19);
  EXPECT_TRUE(inside.run("inrush-limit").empty());
  RuleBench outside(deck(""));
  outside.set_inrush("RF1", 20, 2.21);
  const Finding f = only(outside.run("inrush-limit"));
  EXPECT_EQ(f.measurement->quantity, "i2t");
  EXPECT_NEAR(f.measurement->limit, 2.2, 1e-12);
}

TEST(InrushLimit, NotApplicableWithASeriesLimiter) {
  RuleBench b(deck("*@part NTC1 type=ntc\nNTC1 LF LA 10\n"));
  b.set_inrush("D1", 80, 1.0);
  EXPECT_TRUE(b.run("inrush-limit").empty()) << b.rendered();
}

}  // namespace
}  // namespace mainscheck::rules::testing
