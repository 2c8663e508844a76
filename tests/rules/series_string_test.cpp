// series-string (rules/safety/series_string.cpp): element voltages of a series string and the single fault.
// Check values: resistive divider V_i = V·R_i/ΣR (textbook); high line 253 V = 230 V + 10 % (IEC 60038, S40).
#include <gtest/gtest.h>

#include <algorithm>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

std::string deck(const std::string& lamp_attrs) {
  std::string s = "series string test\n*@supply mains=230V+-10%/50Hz line=L neutral=N\nV1 L N SIN(0 325 50)\n";
  const char* nets[] = {"L", "A", "B", "C", "N"};
  for (int i = 0; i < 4; ++i) {
    const std::string ref = "RLA" + std::to_string(i + 1);
    s += "*@part " + ref + " type=lamp " + lamp_attrs + "\n" + ref + " " + nets[i] + " " + nets[i + 1] + " 240\n";
  }
  return s + ".end\n";
}

std::vector<Finding> of_severity(const std::vector<Finding>& fs, Severity s) {
  std::vector<Finding> out;
  std::copy_if(fs.begin(), fs.end(), std::back_inserter(out), [s](const Finding& f) { return f.severity == s; });
  return out;
}

TEST(SeriesString, NoteWithNormalAndSingleFaultVoltages) {
  // Four equal 240 Ω lamps: 253 / 4 = 63.25 V each (printed to three digits); one shorted: 253 / 3 = 84.3 V on the other three.
  RuleBench b(deck(""));
  const Finding f = only(b.run("series-string"));
  EXPECT_EQ(f.severity, Severity::note);
  EXPECT_NE(f.message.find("63.3 V each; one element shorted: 84.3 V on each of the other 3"), std::string::npos)
      << f.message << b.rendered();
}

TEST(SeriesString, SingleFaultJustInsideAndJustOutside) {
  RuleBench inside(deck("v_rated=84.34"));
  EXPECT_TRUE(of_severity(inside.run("series-string"), Severity::warning).empty());
  RuleBench outside(deck("v_rated=84.33"));
  const auto w = of_severity(outside.run("series-string"), Severity::warning);
  ASSERT_EQ(w.size(), 4u);
  EXPECT_NEAR(w[0].measurement->value, 253.0 / 3.0, 1e-9);
  EXPECT_NEAR(w[0].measurement->limit, 84.33, 1e-9);
}

TEST(SeriesString, NormalOperationAboveTheRatingIsAnError) {
  RuleBench b(deck("v_rated=60"));
  const auto e = of_severity(b.run("series-string"), Severity::error);
  ASSERT_EQ(e.size(), 4u);
  EXPECT_NEAR(e[0].measurement->value, 253.0 / 4.0, 1e-9);
}

TEST(SeriesString, PowerWithOneElementShorted) {
  // One shorted: (253/3)² / 240 = 29.6 W against a 25 W rating.
  RuleBench b(deck("p_rated=25"));
  const auto w = of_severity(b.run("series-string"), Severity::warning);
  ASSERT_EQ(w.size(), 4u);
  EXPECT_NEAR(w[0].measurement->value, (253.0 / 3.0) * (253.0 / 3.0) / 240.0, 1e-9);
}

TEST(SeriesString, NotApplicableWithoutAString) {
  RuleBench b("single heater\n*@supply mains=230V+-10%/50Hz line=L neutral=N\nV1 L N SIN(0 325 50)\n"
              "*@part RH type=heater p_rated=2000\nRH L N 26.5\n.end\n");
  EXPECT_TRUE(b.run("series-string").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
