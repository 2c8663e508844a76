// discharge.x-capacitor (rules/safety/discharge_x_capacitor.cpp): X capacitance against its bleeder.
// Check values: V(t) = V0 exp(-t/RC), V0 = sqrt(2) × 264 V = 373.4 V; IEC 62368-1 5.5.2.2 (60 V after 2 s) gives
// tau <= 1.09 s, so R <= 1.09 MΩ for 1 uF (safety-data.md 2.2, [D] from the exponential decay).
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

std::string deck(const std::string& cap, const std::string& bleeder) {
  return "x capacitor discharge test\n"
         "*@supply mains=85-264V/47-63Hz line=L neutral=N\n"
         "V1 L N SIN(0 325 50)\n"
         "*@part CX1 class=X2\n"
         "CX1 L N " + cap + "\n" + bleeder + ".end\n";
}

std::vector<Finding> of_severity(const std::vector<Finding>& fs, Severity s) {
  std::vector<Finding> out;
  std::copy_if(fs.begin(), fs.end(), std::back_inserter(out), [s](const Finding& f) { return f.severity == s; });
  return out;
}

TEST(DischargeXCapacitor, JustInsideAndJustOutsideTheTwoSecondLimit) {
  const double v0 = 264.0 * std::sqrt(2.0);
  RuleBench inside(deck("1u", "R1 L M 550k\nR2 M N 540k\n"));  // 1.09 MΩ → tau 1.09 s
  const auto fs = inside.run("discharge.x-capacitor");
  const Finding note = only(of_severity(fs, Severity::note));
  EXPECT_NEAR(note.measurement->value, 1.09 * std::log(v0 / 60.0), 1e-6);  // 1.993 s
  EXPECT_NEAR(note.measurement->limit, 2.0, 1e-12);
  EXPECT_TRUE(of_severity(fs, Severity::error).empty()) << inside.rendered();
  RuleBench outside(deck("1u", "R1 L M 560k\nR2 M N 540k\n"));  // 1.10 MΩ → 2.011 s
  const Finding err = only(of_severity(outside.run("discharge.x-capacitor"), Severity::error));
  EXPECT_NEAR(err.measurement->value, 1.10 * std::log(v0 / 60.0), 1e-6);
  EXPECT_NE(err.message.find("1 µF across the mains input discharges through 1.1 MΩ"), std::string::npos)
      << err.message;
}

TEST(DischargeXCapacitor, NoBleederIsAnError) {
  RuleBench b(deck("470n", ""));
  const Finding f = only(b.run("discharge.x-capacitor"));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_NE(f.message.find("has no discharge resistor"), std::string::npos) << f.message;
}

TEST(DischargeXCapacitor, SingleResistorAndItsDissipation) {
  // 1 MΩ across 264 V: P = 264² / 1e6 = 69.7 mW > 50 % of 125 mW (common practice derating, safety-data.md 10.3).
  RuleBench b(deck("1u", "*@part R1 p_rated=0.125\nR1 L N 1meg\n"));
  const auto warnings = of_severity(b.run("discharge.x-capacitor"), Severity::warning);
  ASSERT_EQ(warnings.size(), 2u) << b.rendered();
  EXPECT_TRUE(std::any_of(warnings.begin(), warnings.end(), [](const Finding& f) {
    return f.message.find("single discharge resistor") != std::string::npos;
  }));
  const auto p = std::find_if(warnings.begin(), warnings.end(), [](const Finding& f) { return f.measurement; });
  ASSERT_NE(p, warnings.end());
  EXPECT_NEAR(p->measurement->value, 264.0 * 264.0 / 1e6, 1e-9);
}

TEST(DischargeXCapacitor, VoltageShareAgainstTheChipRating) {
  // Two 0805 chips share 373 V: 187 V each > 150 V limiting element voltage (safety-data.md 10.1, [C: S36]).
  RuleBench b(deck("1u", "R1 L M 500k package=0805\nR2 M N 500k package=0805\n"));
  const auto warnings = of_severity(b.run("discharge.x-capacitor"), Severity::warning);
  ASSERT_EQ(warnings.size(), 2u) << b.rendered();
  EXPECT_NEAR(warnings[0].measurement->value, 264.0 * std::sqrt(2.0) / 2, 1e-6);
  EXPECT_NEAR(warnings[0].measurement->limit, 150.0, 1e-9);
}

TEST(DischargeXCapacitor, LegacyTimeConstant) {
  // IEC 60950-1 2.1.1.7: R·C <= 1 s for pluggable type A (safety-data.md 2.1, [C: S5]).
  RuleBench inside(deck("1u", "R1 L M 500k\nR2 M N 500k\n"));
  inside.option("discharge.x-capacitor.criterion", "time-constant");
  EXPECT_TRUE(of_severity(inside.run("discharge.x-capacitor"), Severity::error).empty());
  RuleBench outside(deck("1u", "R1 L M 510k\nR2 M N 500k\n"));
  outside.option("discharge.x-capacitor.criterion", "time-constant");
  const Finding f = only(of_severity(outside.run("discharge.x-capacitor"), Severity::error));
  EXPECT_NEAR(f.measurement->value, 1.01, 1e-9);
}

TEST(DischargeXCapacitor, NotApplicableAtOrBelowPointOneMicrofarad) {
  RuleBench b(deck("100n", ""));
  EXPECT_TRUE(b.run("discharge.x-capacitor").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
