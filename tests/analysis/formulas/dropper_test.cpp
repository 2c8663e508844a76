#include "analysis/formulas/dropper.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "analysis/formulas/expect_within.hpp"

namespace mainscheck::analysis::formulas {
namespace {

using test::expect_within;

// safety-data.md section 9 current examples at 230 V 50 Hz ([D] from I = V/sqrt(Xc² + R²), [C: S33]):
// 220 nF ≈ 16 mA, 470 nF ≈ 34 mA, 1 uF ≈ 72 mA; 60 Hz gives 20 % more than 50 Hz.
TEST(CapacitiveDropperFormula, PublishedCurrentExamples) {
  auto at = [](double c_F, double f_Hz) {
    return estimate_capacitive_dropper({230.0, f_Hz, c_F, 0.0, 0.0, 0.0, 0.0, DropperRectifier::bridge})
        ->i_rms_A;
  };
  expect_within(at(220e-9, 50.0), 16e-3, 0.02, "220 nF");
  expect_within(at(470e-9, 50.0), 34e-3, 0.01, "470 nF");
  expect_within(at(1e-6, 50.0), 72e-3, 0.01, "1 uF");
  EXPECT_NEAR(at(470e-9, 60.0) / at(470e-9, 50.0), 1.2, 1e-12);
}

// The zener example of safety-data.md section 9 ([D]): 12 V × 31 mA = 0.37 W for 470 nF / 230 V with a
// bridge; with V_F = 0 our I_dc = (2/π)(V_pk − 12)/Xc = 29.4 mA, so P_Z = 0.353 W, 4.5 % below the
// example, which takes I_dc = 0.9 I_rms = 31 mA and so ignores the 12 V of the output.
TEST(CapacitiveDropperFormula, ZenerAtNoLoadExample) {
  auto e = estimate_capacitive_dropper({230.0, 50.0, 470e-9, 0.0, 0.0, 12.0, 0.0, DropperRectifier::bridge});
  ASSERT_TRUE(e);
  expect_within(e->p_zener_no_load_W, 0.37, 0.05, "zener power");
  // With no output voltage the mean of a rectified sine is 0.9 of its r.m.s. value (section 9 [D]).
  auto shorted =
      estimate_capacitive_dropper({230.0, 50.0, 470e-9, 0.0, 0.0, 0.0, 0.0, DropperRectifier::bridge});
  EXPECT_NEAR(shorted->i_dc_A / shorted->i_rms_A, 2.0 * std::sqrt(2.0) / std::numbers::pi, 1e-12);
  auto half =
      estimate_capacitive_dropper({230.0, 50.0, 470e-9, 0.0, 0.0, 0.0, 0.0, DropperRectifier::half_wave});
  EXPECT_NEAR(half->i_dc_A / half->i_rms_A, std::sqrt(2.0) / std::numbers::pi, 1e-12);  // 0.45 I_rms
}

// Surge and energy (safety-data.md section 9 [D]): 470 nF at 373 V pk → C V²/2 = 33 mJ; switch-on
// through 100 ohm at the crest → V_pk/R.
TEST(CapacitiveDropperFormula, SurgeAndBleeder) {
  const double v_rms = 373.0 / std::sqrt(2.0);
  auto e =
      estimate_capacitive_dropper({v_rms, 50.0, 470e-9, 100.0, 470e3, 12.0, 0.7, DropperRectifier::bridge});
  ASSERT_TRUE(e);
  expect_within(e->e_surge_J, 33e-3, 0.01, "surge energy");
  EXPECT_NEAR(*e->i_surge_A, 3.73, 1e-9);
  EXPECT_NEAR(*e->i_surge_recharged_A, 7.46, 1e-9);
  EXPECT_NEAR(*e->bleeder_tau_s, 0.2209, 1e-12);
  EXPECT_TRUE(e->reactance_dominated);
  auto no_r =
      estimate_capacitive_dropper({230.0, 50.0, 470e-9, 0.0, 0.0, 12.0, 0.7, DropperRectifier::bridge});
  EXPECT_FALSE(no_r->i_surge_A.has_value());
  EXPECT_FALSE(no_r->p_bleeder_W.has_value());
  auto big_r =
      estimate_capacitive_dropper({230.0, 50.0, 470e-9, 3e3, 0.0, 12.0, 0.7, DropperRectifier::bridge});
  EXPECT_FALSE(big_r->reactance_dominated);
  EXPECT_FALSE(
      estimate_capacitive_dropper({230.0, 50.0, 0.0, 100.0, 0.0, 12.0, 0.7, DropperRectifier::bridge}));
}

// reference: ngspice-39, deck tests/data/formulas/dropper_bridge_noload.cir (230 V 50 Hz, 100 ohm,
// 470 nF, 470 kohm bleeder, bridge D(IS=5n N=1.8 RS=0.03), 12 V zener, 470 uF, no load), 1.46-1.5 s:
//   is_rms 33.678 mA, is_max 47.985 mA, iz_avg 29.311 mA, vz_avg 12.053 V, pz_avg 0.35368 W,
//   pr_avg 0.11341 W, pb_avg 0.10957 W, vc_max 311.98 V, vc_rms 226.92 V.
// V_F = 0.75 V is the model's drop at ~48 mA. The V/Z forms ignore the output voltage and are ≤ 3 % high.
TEST(CapacitiveDropperFormula, BridgeAgainstNgspice) {
  auto e = estimate_capacitive_dropper(
      {230.0, 50.0, 470e-9, 100.0, 470e3, 12.053, 0.75, DropperRectifier::bridge});
  ASSERT_TRUE(e);
  expect_within(e->i_rms_A, 33.678e-3, 0.012, "line current rms");
  expect_within(e->i_peak_A, 47.985e-3, 0.005, "line current peak");
  expect_within(e->i_dc_A, 29.311e-3, 0.005, "zener current");
  expect_within(e->p_zener_no_load_W, 0.35368, 0.005, "zener dissipation");
  expect_within(e->p_series_resistor_W, 0.11341, 0.025, "series resistor dissipation");
  expect_within(*e->p_bleeder_W, 0.10957, 0.035, "bleeder dissipation");
  expect_within(e->v_cap_swing_peak_V, 311.98, 0.002, "capacitor crest, clamped output");
  EXPECT_GT(e->v_cap_peak_V, 311.98);  // the shorted-output crest is the upper bound
  expect_within(e->v_cap_rms_V, 226.92, 0.015, "capacitor rms");
}

// reference: ngspice-39, deck tests/data/formulas/dropper_halfwave_noload.cir (the same dropper, one
// diode to the reservoir, 12 V zener from the diode's anode to neutral, no load), 1.46-1.5 s:
//   is_rms 33.873 mA, vout_avg 11.645 V, izrev_avg 14.971 mA (zener reverse), pz_avg 0.19251 W,
//   vc_min -324.60 V.
TEST(CapacitiveDropperFormula, HalfWaveAgainstNgspice) {
  auto e = estimate_capacitive_dropper(
      {230.0, 50.0, 470e-9, 100.0, 0.0, 11.645, 0.6, DropperRectifier::half_wave});
  ASSERT_TRUE(e);
  expect_within(e->i_rms_A, 33.873e-3, 0.005, "line current rms");
  expect_within(e->i_dc_A, 14.971e-3, 0.005, "rectified current");
  expect_within(e->p_zener_no_load_W, 0.19251, 0.03, "zener dissipation");
  expect_within(e->v_cap_swing_peak_V, 324.60, 0.002, "capacitor crest");
}

// Ohm's law (safety-data.md section 9 [D]): 230 V, 1 kohm dropper, 100 ohm load.
TEST(ResistiveDropperFormula, OhmsLaw) {
  auto e = estimate_resistive_dropper(230.0, 1000.0, 100.0);
  ASSERT_TRUE(e);
  EXPECT_NEAR(e->i_rms_A, 230.0 / 1100.0, 1e-12);
  EXPECT_NEAR(e->p_dropper_W, 1000.0 * std::pow(230.0 / 1100.0, 2), 1e-9);
  EXPECT_NEAR(e->v_load_rms_V, 230.0 / 11.0, 1e-9);
  EXPECT_NEAR(e->efficiency, 1.0 / 11.0, 1e-12);
  EXPECT_FALSE(estimate_resistive_dropper(230.0, 0.0, 100.0));
}

}  // namespace
}  // namespace mainscheck::analysis::formulas
