#include "analysis/formulas/inrush.hpp"

#include <gtest/gtest.h>

#include <cmath>

#include "analysis/formulas/expect_within.hpp"

namespace mainscheck::analysis::formulas {
namespace {

using test::expect_within;

// Worked example of safety-data.md section 7 ([D]): 373 V, 470 uF, 2 ohm → I²t = V²C/(2R) = 16 A²s,
// peak V/R = 186.5 A, energy in R = C V²/2 = 32.7 J.
TEST(RcInrushFormula, PublishedExample) {
  auto e = estimate_rc_inrush(373.0, 2.0, 470e-6);
  ASSERT_TRUE(e);
  EXPECT_DOUBLE_EQ(e->i_peak_A, 186.5);
  expect_within(e->i2t_A2s, 16.0, 0.03, "I2t");
  EXPECT_NEAR(e->i2t_A2s, 373.0 * 373.0 * 470e-6 / 4.0, 1e-9);
  EXPECT_NEAR(e->energy_in_r_J, 2.0 * e->i2t_A2s, 1e-9);  // R · I²t
  EXPECT_NEAR(e->tau_s, 0.94e-3, 1e-15);
  EXPECT_FALSE(estimate_rc_inrush(373.0, 0.0, 470e-6));
}

// The step model is the limit of the sine switched at its crest when RC << T/4 [D]: 10 uF through
// 10 ohm at 50 Hz (τ = 0.1 ms vs 5 ms) agrees within 5 % on a rectified path (no steady current).
TEST(RcInrushFormula, StepModelIsTheShortTauLimit) {
  EXPECT_TRUE(step_model_holds(10.0, 10e-6, 50.0));
  EXPECT_FALSE(step_model_holds(5.0, 470e-6, 50.0));
  auto step = estimate_rc_inrush(325.0, 10.0, 10e-6);
  auto sine = sine_inrush(325.0, 10.0, 10e-6, 50.0, InrushPath::full_wave);
  ASSERT_TRUE(sine);
  expect_within(sine->i2t_A2s, step->i2t_A2s, 0.05, "short-tau I2t");
  EXPECT_LE(sine->i2t_A2s, step->i2t_A2s * 1.001);
  EXPECT_NEAR(sine->i_peak_A, 32.5, 1e-9);
}

// reference: ngspice-39, deck tests/data/formulas/inrush_rc.cir, switch-on at the positive crest of
// 230 V 50 Hz (325.269 V pk), first half cycle 0-10 ms:
//   series RC 10 ohm / 100 uF: rc_ipk 32.5266 A, rc_i2t 0.913419 A²s;
//   bridge D(IS=5n N=1.8 RS=0.03) into an empty 470 uF through 5 ohm: br_ipk 63.8539 A, br_i2t 4.06307 A²s.
// For the bridge the caller folds in the diodes: 2 × 1.08 V junction drop at ~64 A and 2 × 0.03 ohm.
// The closed-form step V²C/(2R) is 19 % high there (τ = 2.4 ms is not short against 5 ms), which the
// validity flag reports.
TEST(SineInrushFormula, AgainstNgspice) {
  auto rc = sine_inrush(325.269, 10.0, 100e-6, 50.0, InrushPath::direct);
  ASSERT_TRUE(rc);
  expect_within(rc->i_peak_A, 32.5266, 0.0005, "series RC peak");
  expect_within(rc->i2t_A2s, 0.913419, 0.001, "series RC I2t");

  const double v = 325.269 - 2 * 1.08;
  const double r = 5.0 + 2 * 0.03;
  auto br = sine_inrush(v, r, 470e-6, 50.0, InrushPath::full_wave);
  ASSERT_TRUE(br);
  expect_within(br->i_peak_A, 63.8539, 0.002, "bridge peak");
  expect_within(br->i2t_A2s, 4.06307, 0.005, "bridge I2t");
  EXPECT_FALSE(step_model_holds(r, 470e-6, 50.0));
  expect_within(estimate_rc_inrush(v, r, 470e-6)->i2t_A2s, 4.06307 * 1.193, 0.01,
                "step model, outside validity");
}

// Half wave: one charging pulse per period; the first half cycle holds only the pulse from the crest,
// so it carries less I²t than the full-wave path that tops up in the second half [D].
TEST(SineInrushFormula, HalfWaveVersusFullWave) {
  auto half = sine_inrush(323.0, 5.06, 470e-6, 50.0, InrushPath::half_wave);
  auto full = sine_inrush(323.0, 5.06, 470e-6, 50.0, InrushPath::full_wave);
  ASSERT_TRUE(half && full);
  EXPECT_LT(half->i2t_A2s, full->i2t_A2s);
  EXPECT_GT(full->v_cap_end_V, half->v_cap_end_V);
  EXPECT_LT(full->v_cap_end_V, 323.0);
  EXPECT_FALSE(sine_inrush(323.0, 5.06, 470e-6, 0.0, InrushPath::direct));
}

}  // namespace
}  // namespace mainscheck::analysis::formulas
