#include "analysis/formulas/phase_control.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "analysis/formulas/expect_within.hpp"

namespace mainscheck::analysis::formulas {
namespace {

using test::expect_within;

constexpr double kDeg = std::numbers::pi / 180.0;

// Tabulated factor sqrt(1 − α/π + sin 2α / 2π) in safety-data.md section 6.2 ([D] from the [C: S28] formula).
TEST(PhaseControlFormula, RmsFactorTable) {
  const std::pair<double, double> table[] = {{0, 1.000},   {30, 0.986},  {45, 0.954},
                                             {60, 0.897},  {90, 0.707},  {120, 0.442},
                                             {135, 0.301}, {150, 0.170}, {180, 0.0}};
  for (auto [deg, factor] : table) EXPECT_NEAR(phase_rms_factor(deg * kDeg), factor, 0.0006) << deg;
  EXPECT_NEAR(phase_rms_factor(90 * kDeg), 1.0 / std::sqrt(2.0), 1e-15);
}

TEST(PhaseControlFormula, FiringAngleFromDelay) {
  EXPECT_NEAR(firing_angle_rad(5e-3, 50.0), std::numbers::pi / 2, 1e-15);  // a quarter period is 90°
  EXPECT_NEAR(firing_angle_rad(1.0 / 360.0, 60.0), std::numbers::pi / 3, 1e-15);
}

// Full conduction: I_avg = (2 sqrt 2 / π) I_rms = 0.90 I_rms (safety-data.md section 6.2 [C: S29]).
// Conduction loss with V_T0 = 0.85 V, r_T = 35 mohm (the section's 8 A triac example [C: S29, S31]) at
// 5 A r.m.s.: 0.85 · 4.502 + 0.035 · 25 = 4.70 W (independent arithmetic).
TEST(PhaseControlFormula, FullConductionAndConductionLoss) {
  PhaseControlInput in{230.0, 0.0, 46.0, PhaseDevice::triac, OnStateModel{0.85, 0.035}};
  auto e = estimate_phase_control(in);
  ASSERT_TRUE(e);
  EXPECT_NEAR(e->i_load_rms_A, 5.0, 1e-12);
  EXPECT_NEAR(e->i_device_avg_A / e->i_device_rms_A, 2.0 * std::sqrt(2.0) / std::numbers::pi, 1e-12);
  EXPECT_NEAR(*e->p_conduction_W, 0.85 * 4.50158 + 0.035 * 25.0, 1e-4);
  EXPECT_NEAR(e->power_factor, 1.0, 1e-12);
  EXPECT_NEAR(e->p_load_W, 1150.0, 1e-9);
}

// reference: ngspice-39, deck tests/data/formulas/phase_60deg.cir (230 V 50 Hz, ideal switch fired at
// 60° in both half cycles, 100 ohm): vout_rms 206.295 V, mean |i| 1.55304 A, i_rms 2.06295 A,
// peak 3.25266 A. The formulas are exact for an ideal switch: agreement within 0.05 %.
TEST(PhaseControlFormula, SixtyDegreesAgainstNgspice) {
  auto e = estimate_phase_control({230.0, 60 * kDeg, 100.0, PhaseDevice::triac, std::nullopt});
  ASSERT_TRUE(e);
  expect_within(e->v_out_rms_V, 206.295, 0.0005, "load rms voltage");
  expect_within(e->i_device_avg_A, 1.55304, 0.0005, "triac mean |i|");
  expect_within(e->i_device_rms_A, 2.06295, 0.0005, "triac rms");
  expect_within(e->i_load_peak_A, 3.25266, 0.0005, "peak");
  EXPECT_FALSE(e->p_conduction_W.has_value());
}

// Thyristor variants [D]: one thyristor passes half the mean square and half the mean of the
// triac's |i|; an anti-parallel pair shares the triac's current between two devices.
TEST(PhaseControlFormula, ThyristorVariants) {
  const double a = 120 * kDeg;
  auto triac = *estimate_phase_control({230.0, a, 50.0, PhaseDevice::triac, std::nullopt});
  auto one = *estimate_phase_control({230.0, a, 50.0, PhaseDevice::thyristor, std::nullopt});
  auto pair = *estimate_phase_control({230.0, a, 50.0, PhaseDevice::thyristor_pair, std::nullopt});
  EXPECT_NEAR(one.p_load_W, 0.5 * triac.p_load_W, 1e-9);
  EXPECT_NEAR(one.i_device_avg_A, 0.5 * triac.i_device_avg_A, 1e-12);
  EXPECT_NEAR(one.v_out_avg_V, 230.0 * std::sqrt(2.0) * 0.5 / (2 * std::numbers::pi),
              1e-9);  // (1 + cos 120°) = 0.5
  EXPECT_NEAR(pair.i_device_rms_A, triac.i_device_rms_A / std::sqrt(2.0), 1e-12);
  EXPECT_NEAR(pair.p_load_W, triac.p_load_W, 1e-12);
  EXPECT_NEAR(triac.i_load_peak_A, 230.0 * std::sqrt(2.0) * std::sin(a) / 50.0, 1e-12);  // fired after 90°
  EXPECT_FALSE(estimate_phase_control({230.0, 4.0, 50.0, PhaseDevice::triac, std::nullopt}));
  EXPECT_FALSE(estimate_phase_control({230.0, -0.1, 50.0, PhaseDevice::triac, std::nullopt}));
}

}  // namespace
}  // namespace mainscheck::analysis::formulas
