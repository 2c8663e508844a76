// rules/safety/insulation_tables.cpp: every lookup against the published rows named in
// ../shared/reference/safety-data.md section 1 (S1 = a transcription of IEC 60664-1; marks as there).
#include "rules/safety/insulation_tables.hpp"

#include <gtest/gtest.h>

namespace mainscheck::rules::safety {
namespace {

constexpr double kMm = 1e-3;
constexpr double kTol = 1e-9;

TEST(InsulationTables, RatedImpulseVoltageTableF1) {
  // IEC 60664-1 table F.1 [C: S1]; examples of safety-data.md 1.3.
  EXPECT_EQ(rated_impulse_voltage_V(230, 2), 2500);  // 300 V row, OVC II
  EXPECT_EQ(rated_impulse_voltage_V(120, 2), 1500);  // 150 V row
  EXPECT_EQ(rated_impulse_voltage_V(277, 2), 2500);
  EXPECT_EQ(rated_impulse_voltage_V(230, 3), 4000);
  EXPECT_EQ(rated_impulse_voltage_V(230, 1), 1500);
  EXPECT_EQ(rated_impulse_voltage_V(230, 4), 6000);
  // "Up to and including": a step function, no interpolation.
  EXPECT_EQ(rated_impulse_voltage_V(300, 2), 2500);
  EXPECT_EQ(rated_impulse_voltage_V(300.1, 2), 4000);
  EXPECT_EQ(rated_impulse_voltage_V(50, 1), 330);
  EXPECT_EQ(rated_impulse_voltage_V(1000, 4), 12000);
  EXPECT_FALSE(rated_impulse_voltage_V(1600, 2));
  EXPECT_FALSE(rated_impulse_voltage_V(230, 5));
}

TEST(InsulationTables, ReinforcedImpulseOneStepHigher) {
  // Preferred series 330 ... 12000 V (safety-data.md 1.3/1.8; the rule itself from memory).
  EXPECT_EQ(reinforced_impulse_voltage_V(2500), 4000);
  EXPECT_EQ(reinforced_impulse_voltage_V(1500), 2500);
  EXPECT_EQ(reinforced_impulse_voltage_V(4000), 6000);
  EXPECT_EQ(reinforced_impulse_voltage_V(330), 500);
  // Not in the series (or its last member): 160 % (from memory).
  EXPECT_NEAR(reinforced_impulse_voltage_V(2000), 3200, kTol);
  EXPECT_NEAR(reinforced_impulse_voltage_V(12000), 19200, kTol);
}

TEST(InsulationTables, ClearanceTableF2CaseA) {
  // IEC 60664-1 table F.2 case A [C: S1].
  EXPECT_NEAR(clearance_transient_m(2500, 2).value, 1.5 * kMm, kTol);
  EXPECT_NEAR(clearance_transient_m(4000, 2).value, 3.0 * kMm, kTol);
  EXPECT_NEAR(clearance_transient_m(1500, 2).value, 0.5 * kMm, kTol);
  EXPECT_NEAR(clearance_transient_m(6000, 2).value, 5.5 * kMm, kTol);
  EXPECT_NEAR(clearance_transient_m(330, 1).value, 0.01 * kMm, kTol);
  EXPECT_NEAR(clearance_transient_m(330, 2).value, 0.2 * kMm, kTol);  // PD2 floor
  EXPECT_NEAR(clearance_transient_m(330, 3).value, 0.8 * kMm, kTol);  // PD3 floor
  EXPECT_NEAR(clearance_transient_m(1200, 1).value, 0.25 * kMm, kTol);
  EXPECT_NEAR(clearance_transient_m(100000, 2).value, 170 * kMm, kTol);
  // Linear interpolation between rows (safety-data.md 1.10, [M]): 3500 V between 3000 (2.0) and 4000 (3.0).
  EXPECT_NEAR(clearance_transient_m(3500, 2).value, 2.5 * kMm, kTol);
  // 3200 V (160 % of 2000 V): 2.0 + 0.2 × (3.0 − 2.0) = 2.2 mm.
  EXPECT_NEAR(clearance_transient_m(3200, 2).value, 2.2 * kMm, kTol);
  EXPECT_FALSE(clearance_transient_m(100000, 2).beyond_table);
  EXPECT_TRUE(clearance_transient_m(120000, 2).beyond_table);
}

TEST(InsulationTables, ClearanceTableF8SteadyState) {
  // IEC 60664-1 table F.8 (F.7 in Ed. 2) case A [C: S1]; PD floors from memory.
  EXPECT_NEAR(clearance_steady_m(1000, 1).value, 0.26 * kMm, kTol);
  EXPECT_NEAR(clearance_steady_m(3000, 2).value, 2.4 * kMm, kTol);
  EXPECT_NEAR(clearance_steady_m(50000, 2).value, 100 * kMm, kTol);
  // 358 V between 330 (0.01) and 400 (0.02): 0.014 mm at PD1, the 0.2 mm floor at PD2.
  EXPECT_NEAR(clearance_steady_m(358, 1).value, (0.01 + 0.01 * 28.0 / 70.0) * kMm, kTol);
  EXPECT_NEAR(clearance_steady_m(358, 2).value, 0.2 * kMm, kTol);
  EXPECT_NEAR(clearance_steady_m(358, 3).value, 0.8 * kMm, kTol);
  EXPECT_TRUE(clearance_steady_m(60000, 2).beyond_table);  // not in S1 case A
}

TEST(InsulationTables, AltitudeTableA2) {
  // IEC 60664-1 table A.2 [C: S1]; linear between rows [M].
  EXPECT_NEAR(altitude_factor(1000).value, 1.0, kTol);
  EXPECT_NEAR(altitude_factor(2000).value, 1.0, kTol);
  EXPECT_NEAR(altitude_factor(3000).value, 1.14, kTol);
  EXPECT_NEAR(altitude_factor(4000).value, 1.29, kTol);
  EXPECT_NEAR(altitude_factor(5000).value, 1.48, kTol);
  EXPECT_NEAR(altitude_factor(2500).value, 1.07, kTol);
  EXPECT_NEAR(altitude_factor(20000).value, 14.5, kTol);
}

TEST(InsulationTables, CreepageTableF5) {
  // IEC 60664-1 table F.5 (F.4 in Ed. 2) [C: S1]; safety-data.md 1.7 and 1.11.
  const auto IIIa = MaterialGroup::IIIa;
  EXPECT_NEAR(creepage_m(250, 2, IIIa, false).value, 2.5 * kMm, kTol);
  EXPECT_NEAR(creepage_m(125, 2, IIIa, false).value, 1.5 * kMm, kTol);
  EXPECT_NEAR(creepage_m(320, 2, IIIa, false).value, 3.2 * kMm, kTol);
  EXPECT_NEAR(creepage_m(250, 2, MaterialGroup::I, false).value, 1.25 * kMm, kTol);
  EXPECT_NEAR(creepage_m(250, 2, MaterialGroup::II, false).value, 1.8 * kMm, kTol);
  EXPECT_NEAR(creepage_m(250, 3, IIIa, false).value, 4.0 * kMm, kTol);
  EXPECT_NEAR(creepage_m(250, 1, IIIa, false).value, 0.56 * kMm, kTol);
  EXPECT_NEAR(creepage_m(3200, 2, IIIa, false).value, 32 * kMm, kTol);  // the 3 kV multiplier example
  // Printed wiring columns.
  EXPECT_NEAR(creepage_m(250, 2, IIIa, true).value, 1.0 * kMm, kTol);
  EXPECT_NEAR(creepage_m(125, 2, IIIa, true).value, 0.25 * kMm, kTol);
  EXPECT_NEAR(creepage_m(250, 1, IIIa, true).value, 0.56 * kMm, kTol);
  // PWB PD2 does not cover IIIb, nor anything above 1000 V: the other-materials column applies.
  EXPECT_NEAR(creepage_m(250, 2, MaterialGroup::IIIb, true).value, 2.5 * kMm, kTol);
  EXPECT_NEAR(creepage_m(1250, 2, IIIa, true).value, 12.5 * kMm, kTol);
  // Linear interpolation (safety-data.md 1.10, [M]): 253 V between 250 (2.5) and 320 (3.2).
  EXPECT_NEAR(creepage_m(253, 2, IIIa, false).value, (2.5 + 0.7 * 3.0 / 70.0) * kMm, kTol);
  // Below the first row the first row; beyond the last row a flagged lower bound.
  EXPECT_NEAR(creepage_m(5, 2, IIIa, false).value, 0.40 * kMm, kTol);
  EXPECT_TRUE(creepage_m(12500, 3, IIIa, false).beyond_table);  // no PD3 values above 10 kV in S1
  EXPECT_NEAR(creepage_m(12500, 3, IIIa, false).value, 160 * kMm, kTol);  // the 10 kV row
  EXPECT_FALSE(creepage_m(63000, 2, IIIa, false).beyond_table);
  EXPECT_NEAR(creepage_m(63000, 2, IIIa, false).value, 600 * kMm, kTol);
}

TEST(InsulationTables, MaterialGroupNames) {
  EXPECT_EQ(parse_material_group("IIIa/b"), MaterialGroup::IIIb);
  EXPECT_EQ(parse_material_group("II"), MaterialGroup::II);
  EXPECT_FALSE(parse_material_group("IV"));
}

InsulationCase mains(double v_rms, std::optional<double> impulse, InsulationGrade g, bool pwb = false) {
  return {v_rms, v_rms * 1.4142135623730951, impulse, g, 2, MaterialGroup::IIIa, pwb, 2000};
}

TEST(InsulationTables, ScreeningValuesOfSection111) {
  // safety-data.md 1.11 [D from F.1, F.2, F.5 and the reinforced rule]: OVC II, PD2, <= 2000 m, case A.
  auto r = required_insulation(mains(250, 2500, InsulationGrade::basic));
  EXPECT_NEAR(r.clearance_m, 1.5 * kMm, kTol);
  EXPECT_NEAR(r.creepage_m, 2.5 * kMm, kTol);
  EXPECT_EQ(r.tables, "IEC 60664-1 tables F.1, F.2, F.5");
  r = required_insulation(mains(250, 2500, InsulationGrade::reinforced));
  EXPECT_NEAR(r.impulse_V, 4000, kTol);
  EXPECT_NEAR(r.clearance_m, 3.0 * kMm, kTol);
  EXPECT_NEAR(r.creepage_m, 5.0 * kMm, kTol);
  r = required_insulation(mains(250, 2500, InsulationGrade::reinforced, true));
  EXPECT_NEAR(r.creepage_m, 3.0 * kMm, kTol);  // PWB 2 × 1.0 = 2.0 mm, raised to the 3.0 mm clearance
  r = required_insulation(mains(125, 1500, InsulationGrade::basic));
  EXPECT_NEAR(r.clearance_m, 0.5 * kMm, kTol);
  EXPECT_NEAR(r.creepage_m, 1.5 * kMm, kTol);
  r = required_insulation(mains(125, 1500, InsulationGrade::reinforced));
  EXPECT_NEAR(r.clearance_m, 1.5 * kMm, kTol);  // 2500 V
  EXPECT_NEAR(r.creepage_m, 3.0 * kMm, kTol);
  r = required_insulation(mains(125, 1500, InsulationGrade::basic, true));
  EXPECT_NEAR(r.creepage_m, 0.5 * kMm, kTol);  // PWB 0.25 mm raised to the clearance
  r = required_insulation(mains(320, 2500, InsulationGrade::reinforced));
  EXPECT_NEAR(r.creepage_m, 6.4 * kMm, kTol);  // 277 V row 320 V
  r = required_insulation(mains(250, 4000, InsulationGrade::basic));  // OVC III
  EXPECT_NEAR(r.clearance_m, 3.0 * kMm, kTol);
  r = required_insulation(mains(250, 4000, InsulationGrade::reinforced));
  EXPECT_NEAR(r.clearance_m, 5.5 * kMm, kTol);
}

TEST(InsulationTables, AltitudeAndSteadyStatePeaks) {
  auto c = mains(250, 2500, InsulationGrade::basic);
  c.altitude_m = 3000;
  const auto r = required_insulation(c);
  EXPECT_NEAR(r.clearance_m, 1.5 * 1.14 * kMm, kTol);  // table A.2
  EXPECT_NEAR(r.creepage_m, 2.5 * kMm, kTol);          // creepage is not altitude-corrected
  EXPECT_EQ(r.tables, "IEC 60664-1 tables F.1, F.2, F.5, A.2");
  // A 3 kV d.c. node with no mains impulse: F.8 gives 2.4 mm; reinforced takes 160 % (4800 V):
  // 3.8 + 0.8 × (5.7 − 3.8) = 5.32 mm.
  const InsulationCase dc{3000, 3000, std::nullopt, InsulationGrade::basic, 2, MaterialGroup::IIIa, false, 2000};
  EXPECT_NEAR(required_insulation(dc).clearance_m, 2.4 * kMm, kTol);
  EXPECT_EQ(required_insulation(dc).tables, "IEC 60664-1 tables F.8, F.5");
  auto dc_r = dc;
  dc_r.grade = InsulationGrade::reinforced;
  EXPECT_NEAR(required_insulation(dc_r).clearance_m, 5.32 * kMm, 1e-12);
}

}  // namespace
}  // namespace mainscheck::rules::safety
