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

TEST(DischargeXCapacitor, PlusToleranceJustInsideAndJustOutside) {
  // 1 µF + 10 % = 1.1 µF (safety-data.md 2.1: use the + tolerance, [M]); with 1.0 MΩ tau = 1.1 s → 2.011 s to
  // 60 V from 373.4 V, over the 2 s of IEC 62368-1 5.5.2.2; at nominal 1 µF it would be 1.829 s.
  const double v0 = 264.0 * std::sqrt(2.0);
  RuleBench outside(deck("1u tol=10%", "R1 L M 500k\nR2 M N 500k\n"));
  const Finding err = only(of_severity(outside.run("discharge.x-capacitor"), Severity::error));
  EXPECT_NEAR(err.measurement->value, 1.1 * std::log(v0 / 60.0), 1e-6);
  EXPECT_NE(err.message.find("1.1 µF across the mains input"), std::string::npos) << err.message;
  // 1 µF + 9 % with 1.0 MΩ: tau 1.09 s → 1.993 s, inside.
  RuleBench inside(deck("1u tol=9%", "R1 L M 500k\nR2 M N 500k\n"));
  const Finding note = only(of_severity(inside.run("discharge.x-capacitor"), Severity::note));
  EXPECT_NEAR(note.measurement->value, 1.09 * std::log(v0 / 60.0), 1e-6);
}

TEST(DischargeXCapacitor, AsymmetricToleranceUsesThePlusSide) {
  // tol=+80/-20 (an electrolytic-style tolerance, docs/attributes.md): 220 nF × 1.8 = 396 nF.
  // 4 MΩ: tau = 1.584 s → 2.90 s to 60 V, an error (at nominal 220 nF it would be 1.61 s, a pass).
  RuleBench b(deck("220n", "*@part CX1 tol=+80/-20\nR1 L M 2meg\nR2 M N 2meg\n"));
  const Finding f = only(of_severity(b.run("discharge.x-capacitor"), Severity::error));
  EXPECT_NEAR(f.measurement->value, 4e6 * 396e-9 * std::log(264.0 * std::sqrt(2.0) / 60.0), 1e-6);
}

TEST(DischargeXCapacitor, MissingToleranceIsNamed) {
  RuleBench b(deck("1u", "R1 L M 500k\nR2 M N 500k\n"));
  const Finding f = only(of_severity(b.run("discharge.x-capacitor"), Severity::note));
  bool named = false;
  for (const auto& n : f.notes) named = named || n.message.find("no tolerance stated for CX1") != std::string::npos;
  EXPECT_TRUE(named);
}

/// A 230 V bridge rectifier with a 100 µF bulk capacitor behind it and CX1 across its input.
std::string bridge_deck(const std::string& cx) {
  return "bridge discharge test\n"
         "*@supply mains=85-264V/47-63Hz line=L neutral=N\n"
         "V1 L N SIN(0 325 50)\n"
         "*@part RF1 type=fuse i_rated=2\n"
         "RF1 L LF 0.1\n" + cx +
         "D1 LF P DR\nD2 N P DR\nD3 M LF DR\nD4 M N DR\n"
         "CB P M 100u\nRL P M 10k\n"
         ".model DR D(IS=5n RS=0.03 N=1.8 BV=1000)\n.end\n";
}

TEST(DischargeXCapacitor, BulkCapacitorBehindTheBridgeIsNotCounted) {
  // Only CX1 (1 µF) counts: the bulk capacitor's discharge current would have to flow from the cathodes of D1/D2
  // back to their anodes. 1 µF through 1.0 MΩ → 1.829 s (the exponential decay of safety-data.md 2.2).
  RuleBench b(bridge_deck("*@part CX1 class=X2 tol=0\nCX1 LF N 1u\nR1 LF Q 500k\nR2 Q N 500k\n"));
  const auto fs = b.run("discharge.x-capacitor");
  const Finding f = only(of_severity(fs, Severity::note));
  EXPECT_NEAR(f.measurement->value, 1.0 * std::log(264.0 * std::sqrt(2.0) / 60.0), 1e-6) << b.rendered();
  bool explained = false;
  for (const auto& n : f.notes) explained = explained || n.message.find("CB behind the mains rectifier not counted") != std::string::npos;
  EXPECT_TRUE(explained);
  // Without an X capacitor the pins hold nothing: not applicable, even with 100 µF behind the bridge.
  RuleBench bare(bridge_deck(""));
  EXPECT_TRUE(bare.run("discharge.x-capacitor").empty()) << bare.rendered();
}

/// A capacitive dropper (after examples/timer-capacitive-dropper.cir): C1 with bleeder RB1 across it, half-wave
/// tail with a 12 V zener; 230 V +-10 % gives V0 = 253 × √2 = 357.8 V.
std::string dropper_deck(const std::string& bleeder) {
  return "dropper discharge test\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RS1 type=fusible-resistor p_rated=1\n"
         "RS1 L LS 100\n"
         "*@part C1 class=X2 tol=20%\n"
         "C1 LS A 470n\n" + bleeder +
         "D2 N A DR\nD1 A VZ DR\n"
         "*@part DZ1 type=zener v_zener=12\n"
         "DZ1 N VZ DZ12\nC2 VZ N 470u\nRL VZ N 1k\n"
         ".model DR D(IS=5n RS=0.03 N=1.8 BV=1000)\n.model DZ12 D(IS=1e-14 RS=5 BV=12)\n.end\n";
}

TEST(DischargeXCapacitor, DropperCapacitorJustInsideAndJustOutside) {
  // 470 nF + 20 % = 564 nF; the pins see C1's voltage plus the 12 V zener, so C1 must reach 60 − 12 = 48 V:
  // t = R·C·ln(357.8 / 48). 2 s needs R <= 1.765 MΩ.
  const double v0 = 253.0 * std::sqrt(2.0);
  const double c = 564e-9;
  RuleBench inside(dropper_deck("RB1 LS A 1.75meg\n"));  // 1.983 s
  const auto fs = inside.run("discharge.x-capacitor");
  EXPECT_TRUE(of_severity(fs, Severity::error).empty()) << inside.rendered();
  const Finding note = only(of_severity(fs, Severity::note));
  EXPECT_NE(note.subject.find(" dropper discharge"), std::string::npos) << note.subject;
  EXPECT_NEAR(note.measurement->value, 1.75e6 * c * std::log(v0 / 48.0), 1e-6);
  RuleBench outside(dropper_deck("RB1 LS A 1.78meg\n"));  // 2.017 s, and a single bleeder
  const auto all = outside.run("discharge.x-capacitor");
  const Finding err = only(of_severity(all, Severity::error));
  EXPECT_NEAR(err.measurement->value, 1.78e6 * c * std::log(v0 / 48.0), 1e-6);
  const Finding single = only(of_severity(all, Severity::warning));
  EXPECT_NE(single.message.find("single bleeder across the dropper capacitor"), std::string::npos) << single.message;
}

TEST(DischargeXCapacitor, DropperCapacitorWithoutBleeder) {
  RuleBench b(dropper_deck(""));
  const Finding f = only(b.run("discharge.x-capacitor"));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_NE(f.message.find("in series as the dropper capacitor"), std::string::npos) << f.message;
}

}  // namespace
}  // namespace mainscheck::rules::testing
