// discharge.stored-energy (rules/safety/discharge_stored_energy.cpp): capacitors left charged after switch-off.
// Check values: E = C V² / 2 and V(t) = V0 exp(-t/RC) (textbook RC decay; safety-data.md 2.2); safe limit 60 V
// (IEC 62368-1 table 4, ES1 d.c., [C: S3]).
#include <gtest/gtest.h>

#include <cmath>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

std::string deck(const std::string& resistors) {
  return "stored energy test\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325 50)\n"
         ".model DX D(IS=1n)\n"
         "D1 L P DX\n"
         "CB P N 100u\n" + resistors + ".end\n";
}

TEST(DischargeStoredEnergy, BulkCapacitorWithSlowBleeder) {
  // 100 uF at 358 V: E = 6.41 J; 220 kΩ: tau = 22 s, 358 exp(-2/22) = 326.9 V after 2 s.
  RuleBench b(deck("RB P N 220k\n"));
  b.set("CB", Quantity::v_peak, 358);
  const Finding f = only(b.run("discharge.stored-energy"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NEAR(f.measurement->value, 358 * std::exp(-2.0 / 22.0), 1e-6);
  EXPECT_NE(f.message.find("CB holds 6.41 J at 358 V"), std::string::npos) << f.message;
  EXPECT_NE(f.message.find("60 V after 39.3 s"), std::string::npos) << f.message;  // 22 ln(358/60)
}

TEST(DischargeStoredEnergy, JustInsideAndJustOutside) {
  // 60 V after 2 s needs tau <= 2 / ln(358/60) = 1.1197 s → R <= 11.197 kΩ with 100 uF.
  RuleBench inside(deck("RB P N 11k\n"));
  inside.set("CB", Quantity::v_peak, 358);
  const Finding a = only(inside.run("discharge.stored-energy"));
  EXPECT_EQ(a.severity, Severity::note);
  EXPECT_NEAR(a.measurement->value, 358 * std::exp(-2.0 / 1.1), 1e-6);  // 58.1 V
  RuleBench outside(deck("RB P N 11.4k\n"));
  outside.set("CB", Quantity::v_peak, 358);
  const Finding c = only(outside.run("discharge.stored-energy"));
  EXPECT_EQ(c.severity, Severity::warning);
  EXPECT_NEAR(c.measurement->value, 358 * std::exp(-2.0 / 1.14), 1e-6);  // 61.9 V
}

TEST(DischargeStoredEnergy, NetworkResistanceAcrossTheCapacitor) {
  // (100k + 100k) || 200k = 100 kΩ: tau = 10 s.
  RuleBench b(deck("RB1 P M 100k\nRB2 M N 100k\nRL P N 200k\n"));
  b.set("CB", Quantity::v_peak, 358);
  EXPECT_NEAR(only(b.run("discharge.stored-energy")).measurement->value, 358 * std::exp(-0.2), 1e-6);
}

TEST(DischargeStoredEnergy, NoDischargePath) {
  RuleBench b(deck(""));
  b.set("CB", Quantity::v_peak, 358);
  const Finding f = only(b.run("discharge.stored-energy"));
  EXPECT_NE(f.message.find("no discharge path"), std::string::npos) << f.message;
}

TEST(DischargeStoredEnergy, NotApplicableAtSafeVoltageOrWithoutStress) {
  RuleBench low(deck(""));
  low.set("CB", Quantity::v_peak, 60);
  EXPECT_TRUE(low.run("discharge.stored-energy").empty());
  RuleBench none(deck(""));
  EXPECT_TRUE(none.run("discharge.stored-energy").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
