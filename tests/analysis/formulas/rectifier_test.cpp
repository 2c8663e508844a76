#include "analysis/formulas/rectifier.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "analysis/formulas/expect_within.hpp"

namespace mainscheck::analysis::formulas {
namespace {

using test::expect_within;

// Independent arithmetic on the textbook relations: bridge, 230 V 50 Hz (v_pk 325.27 V), 470 uF,
// 0.5 A: ΔV = I/(2fC) = 0.5/(100 · 470e-6) = 10.64 V (Horowitz & Hill, The Art of Electronics, 2nd ed.,
// §1.28, from memory; safety-data.md section 7 [M]).
TEST(RectifierFormula, TextbookRippleAndDrops) {
  RectifierInput in{RectifierKind::bridge, 325.27, 50.0, 470e-6, 0.5, 1.0};
  auto e = estimate_rectifier(in);
  ASSERT_TRUE(e);
  EXPECT_DOUBLE_EQ(e->v_out_peak_V, 323.27);
  EXPECT_DOUBLE_EQ(e->f_ripple_Hz, 100.0);
  EXPECT_NEAR(e->v_ripple_pp_V, 10.638, 0.001);
  EXPECT_LT(e->v_ripple_pp_refined_V, e->v_ripple_pp_V);
  EXPECT_TRUE(e->small_ripple);
  EXPECT_DOUBLE_EQ(e->i_diode_avg_A, 0.25);

  in.kind = RectifierKind::half_wave;
  e = estimate_rectifier(in);
  ASSERT_TRUE(e);
  EXPECT_DOUBLE_EQ(e->v_out_peak_V, 324.27);  // one diode in the path
  EXPECT_DOUBLE_EQ(e->f_ripple_Hz, 50.0);
  EXPECT_NEAR(e->v_ripple_pp_V, 21.277, 0.001);  // I/(fC)
  EXPECT_DOUBLE_EQ(e->i_diode_avg_A, 0.5);
}

// PIV per diode, no load (safety-data.md section 7 [M]: half-wave ≈ 2 v_pk, bridge ≈ v_pk, centre-tap ≈
// 2 v_pk of the half winding; the exact no-load values follow from the crest condition [D]).
TEST(RectifierFormula, ReversePeakPerKind) {
  EXPECT_DOUBLE_EQ(diode_reverse_peak_V(RectifierKind::half_wave, 325.0, 1.0), 649.0);
  EXPECT_DOUBLE_EQ(diode_reverse_peak_V(RectifierKind::bridge, 325.0, 1.0), 324.0);
  EXPECT_DOUBLE_EQ(diode_reverse_peak_V(RectifierKind::centre_tap, 17.0, 0.7), 33.3);
  EXPECT_DOUBLE_EQ(diode_reverse_peak_V(RectifierKind::dual_rail, 17.0, 0.7), 33.3);
  EXPECT_EQ(diodes_in_path(RectifierKind::bridge), 2);
  EXPECT_EQ(diodes_in_path(RectifierKind::dual_rail), 1);
}

// Conduction angle θ_c = arccos(1 − ΔV/v_pk) (safety-data.md section 7 [D]): with ΔV/v_pk = 1 − cos 20°
// the refined ripple must satisfy ΔV = I(T_r − t_c)/C exactly.
TEST(RectifierFormula, RefinedRippleIsSelfConsistent) {
  RectifierInput in{RectifierKind::centre_tap, 17.0, 60.0, 2200e-6, 1.0, 0.8};
  auto e = estimate_rectifier(in);
  ASSERT_TRUE(e);
  const double t_r = 1.0 / 120.0;
  EXPECT_NEAR(e->v_ripple_pp_refined_V, in.i_dc_A * (t_r - e->conduction_time_s) / in.c_F, 1e-9);
  EXPECT_NEAR(std::cos(e->conduction_angle_rad), 1.0 - e->v_ripple_pp_refined_V / e->v_out_peak_V, 1e-12);
  EXPECT_NEAR(e->conduction_time_s, e->conduction_angle_rad / (2.0 * std::numbers::pi * 60.0), 1e-15);
}

// Source-resistance pulse model [D]: the pulse (V/R)(cos θ − cos θ_s) must carry the charge I·T_r of one
// ripple period, and a stiff source (R = 0) keeps the reservoir-limited model.
TEST(RectifierFormula, SourceResistancePulseCarriesTheLoadCharge) {
  RectifierInput in{RectifierKind::bridge, 24.0, 50.0, 4700e-6, 2.0, 0.8, 0.2};
  auto e = estimate_rectifier(in);
  ASSERT_TRUE(e);
  ASSERT_EQ(e->pulse_limit, PulseLimit::source_resistance);
  const double v = e->v_out_peak_V;
  const double th = std::acos(1.0 - e->i_diode_peak_A * in.r_source_ohm / v);
  const double w = 2.0 * std::numbers::pi * in.f_Hz;
  const double charge = 2.0 * v / (w * in.r_source_ohm) * (std::sin(th) - th * std::cos(th));
  EXPECT_NEAR(charge, in.i_dc_A / 100.0, 1e-9);
  in.r_source_ohm = 0.0;
  EXPECT_EQ(estimate_rectifier(in)->pulse_limit, PulseLimit::reservoir);
}

TEST(RectifierFormula, RejectsBadInputAndEmptyingReservoir) {
  EXPECT_FALSE(estimate_rectifier({RectifierKind::bridge, 0.0, 50.0, 1e-6, 0.1, 0.7}));
  EXPECT_FALSE(estimate_rectifier({RectifierKind::bridge, 10.0, 50.0, 1e-6, -0.1, 0.7}));
  EXPECT_FALSE(estimate_rectifier({RectifierKind::bridge, 1.0, 50.0, 1e-6, 0.1, 0.7}));      // drops > crest
  EXPECT_FALSE(estimate_rectifier({RectifierKind::half_wave, 10.0, 50.0, 1e-6, 1.0, 0.7}));  // empties
  auto big = estimate_rectifier({RectifierKind::half_wave, 10.0, 50.0, 100e-6, 0.03, 0.7});
  ASSERT_TRUE(big);
  EXPECT_FALSE(big->small_ripple);  // ripple beyond kMaxRippleFraction of the crest
}

TEST(RectifierFormula, NoLoadHasNoRippleNoCurrent) {
  auto e = estimate_rectifier({RectifierKind::bridge, 325.0, 50.0, 47e-6, 0.0, 0.9});
  ASSERT_TRUE(e);
  EXPECT_DOUBLE_EQ(e->v_ripple_pp_refined_V, 0.0);
  EXPECT_DOUBLE_EQ(e->v_dc_V, 323.2);
  EXPECT_DOUBLE_EQ(e->i_diode_rms_A, 0.0);
  EXPECT_DOUBLE_EQ(e->i_reservoir_rms_A, 0.0);
}

// reference: ngspice-39, deck tests/data/formulas/bridge_230v_stiff.cir (230 V 50 Hz, 0.1 ohm source,
// bridge of D(IS=5n N=1.8 RS=0.03), 47 uF, 3.3 kohm), steady state at 1.96-2 s:
//   vout_avg 314.991 V, vout_max 323.665 V, vout_pp 17.927 V, vd2_rev 324.455 V, id1_max 1.5887 A,
//   id1_avg 47.730 mA, id1_rms 0.22784 A, ic_rms 0.30776 A, is_rms 0.32222 A.
// V_F = 0.95 V is the model's drop at the 1.6 A peak. Expected deviations: the stiff-source peak and
// the triangular-pulse r.m.s. values are upper estimates, within +8 %; voltages within 0.5 %.
TEST(RectifierFormula, BridgeAgainstNgspiceStiffSource) {
  RectifierInput in{RectifierKind::bridge, 325.269, 50.0, 47e-6, 0.0, 0.95};
  const auto i_dc = rectifier_load_current_A(in, 3300.0);
  ASSERT_TRUE(i_dc);
  expect_within(*i_dc, 314.991 / 3300.0, 0.005, "load current");
  in.i_dc_A = *i_dc;
  auto e = estimate_rectifier(in);
  ASSERT_TRUE(e);
  expect_within(e->v_out_peak_V, 323.665, 0.005, "v_out_peak");
  expect_within(e->v_dc_V, 314.991, 0.005, "v_dc");
  expect_within(e->v_ripple_pp_refined_V, 17.927, 0.03, "refined ripple");
  expect_within(e->v_ripple_pp_V, 17.927 * 1.13, 0.03,
                "textbook ripple is ~13 % high (whole-period discharge)");
  expect_within(e->v_reverse_peak_V, 324.455, 0.005, "PIV");
  expect_within(e->i_diode_avg_A, 0.047730, 0.005, "diode average");
  expect_within(e->i_diode_peak_A, 1.5887 * 1.04, 0.04, "diode repetitive peak");
  expect_within(e->i_diode_rms_A, 0.22784 * 1.04, 0.04, "diode rms");
  expect_within(e->i_reservoir_rms_A, 0.30776 * 1.04, 0.04, "reservoir ripple current rms");
  expect_within(e->i_winding_rms_A, 0.32222 * 1.04, 0.04, "supply rms");
}

// reference: ngspice-39, deck tests/data/formulas/bridge_230v.cir: the same bridge with 4.7 ohm source
// resistance: vout_avg 313.764 V, vout_max 322.358 V, vout_pp 17.464 V, id1_max 1.0981 A,
// id1_rms 0.20118 A, ic_rms 0.26816 A. Without the source resistance the stiff-source peak is 52 % high;
// with it (4.7 ohm + 2 × 0.03 ohm diode bulk) the source-resistance pulse model takes over: peak +8.7 %,
// diode r.m.s. +5.9 %, reservoir r.m.s. +6.6 %, all on the safe side.
TEST(RectifierFormula, BridgeAgainstNgspiceWithSourceResistance) {
  RectifierInput in{RectifierKind::bridge, 325.269, 50.0, 47e-6, 313.764 / 3300.0, 0.95};
  auto stiff = estimate_rectifier(in);
  ASSERT_TRUE(stiff);
  EXPECT_EQ(stiff->pulse_limit, PulseLimit::reservoir);
  expect_within(stiff->i_diode_peak_A, 1.0981 * 1.52, 0.02, "stiff-source peak, outside its assumptions");
  in.r_source_ohm = 4.76;
  auto e = estimate_rectifier(in);
  ASSERT_TRUE(e);
  EXPECT_EQ(e->pulse_limit, PulseLimit::source_resistance);
  expect_within(e->v_dc_V, 313.764, 0.005, "v_dc");
  expect_within(e->v_ripple_pp_refined_V, 17.464, 0.04, "refined ripple");
  expect_within(e->i_diode_peak_A, 1.0981 * 1.087, 0.02, "diode peak");
  expect_within(e->i_diode_rms_A, 0.20118 * 1.059, 0.02, "diode rms");
  expect_within(e->i_reservoir_rms_A, 0.26816 * 1.066, 0.02, "reservoir rms");
  EXPECT_GT(e->i_diode_peak_A, 1.0981);
  EXPECT_GT(e->i_diode_rms_A, 0.20118);
  EXPECT_GT(e->i_reservoir_rms_A, 0.26816);
}

// reference: ngspice-39, deck tests/data/formulas/halfwave_230v.cir (230 V 50 Hz, 4.7 ohm, one diode,
// 100 uF, 10 kohm): vout_avg 319.344 V, vout_pp 6.041 V, vd1_rev 644.541 V, id1_avg 31.936 mA.
// PIV 2 v_pk − V_F is the no-load value and stays within 1 % above the loaded simulation.
TEST(RectifierFormula, HalfWaveAgainstNgspice) {
  RectifierInput in{RectifierKind::half_wave, 325.269, 50.0, 100e-6, 0.0, 0.9};
  in.i_dc_A = rectifier_load_current_A(in, 10e3).value_or(0.0);
  auto e = estimate_rectifier(in);
  ASSERT_TRUE(e);
  expect_within(e->v_dc_V, 319.344, 0.01, "v_dc");
  expect_within(e->v_ripple_pp_refined_V, 6.041, 0.04, "refined ripple");
  expect_within(e->v_reverse_peak_V, 644.541 * 1.008, 0.005, "PIV");
  EXPECT_GT(e->v_reverse_peak_V, 644.541);
  expect_within(e->i_diode_avg_A, 0.031936, 0.01, "diode average");
  in.r_source_ohm = 4.73;
  e = estimate_rectifier(in);
  ASSERT_TRUE(e);
  EXPECT_EQ(e->pulse_limit, PulseLimit::source_resistance);
  expect_within(e->i_diode_peak_A, 0.90093, 0.03, "diode peak");
  expect_within(e->i_diode_rms_A, 0.15111, 0.03, "diode rms");
  expect_within(e->i_reservoir_rms_A, 0.14770, 0.03, "reservoir rms");
  EXPECT_GT(e->i_diode_rms_A, 0.15111);
}

// reference: ngspice-39, deck tests/data/formulas/dual_rail_17v.cir (17 V pk per half winding, 50 Hz,
// 0.05 ohm per half winding, bridge D(IS=5n N=1.8 RS=0.03), 2200 uF and 33 ohm per rail), 2.96-3 s:
//   vp_avg 15.2183 V, vp_max 16.0419 V, vp_pp 1.6958 V, vd2_rev 32.972 V, id1_max 4.0896 A,
//   id1_avg 0.23061 A, id1_rms 0.84154 A, ic_rms 1.09702 A, iw_rms 1.19011 A.
// Voltages within 5 %. At this low voltage the path resistance (0.05 ohm winding + 0.03 ohm diode bulk)
// limits the pulses: with it the currents are upper estimates, peak +20 %, diode and winding r.m.s.
// +13 %, reservoir r.m.s. +15 % (the diode's dynamic resistance, about 0.01 ohm at 4 A, is left out).
TEST(RectifierFormula, DualRailAgainstNgspice) {
  auto e = estimate_rectifier({RectifierKind::dual_rail, 17.0, 50.0, 2200e-6, 15.2183 / 33.0, 0.9, 0.08});
  ASSERT_TRUE(e);
  expect_within(e->v_out_peak_V, 16.0419, 0.005, "v_out_peak");
  expect_within(e->v_dc_V, 15.2183, 0.005, "v_dc");
  expect_within(e->v_ripple_pp_refined_V, 1.6958, 0.05, "refined ripple");
  expect_within(e->v_reverse_peak_V, 32.972, 0.005, "PIV, 2 v_pk of the half winding");
  expect_within(e->i_diode_avg_A, 0.23061, 0.001, "diode average");
  EXPECT_EQ(e->pulse_limit, PulseLimit::source_resistance);
  expect_within(e->i_diode_peak_A, 4.0896 * 1.20, 0.02, "diode peak (upper estimate)");
  expect_within(e->i_diode_rms_A, 0.84154 * 1.13, 0.02, "diode rms (upper estimate)");
  expect_within(e->i_reservoir_rms_A, 1.09702 * 1.15, 0.02, "reservoir rms (upper estimate)");
  expect_within(e->i_winding_rms_A, 1.19011 * 1.13, 0.02, "half-winding rms (upper estimate)");
}

// reference: ngspice-39, deck tests/data/formulas/centre_tap_xfmr.cir (K-coupled transformer, 230 V
// primary, 2 × 12 V r.m.s. half windings = 16.97 V pk, 0.1 ohm each, k = 0.9999, D(IS=5n N=1.8 RS=0.03),
// 2200 uF, 20 ohm), 1.96-2 s: vout_avg 14.6728 V, vout_max 15.9203 V, vout_pp 2.5570 V,
// vd2_rev 32.860 V, id1_max 5.2777 A, id1_avg 0.36685 A, id1_rms 1.2013 A, ic_rms 1.5318 A.
// With the 0.13 ohm path resistance: load current and v_dc within 0.1 %, PIV (2 v_pk of the half
// winding) +0.4 %, ripple +6 %, currents +7 to +9 % (upper estimates).
TEST(RectifierFormula, CentreTapTransformerAgainstNgspice) {
  RectifierInput in{RectifierKind::centre_tap, 16.97, 50.0, 2200e-6, 0.0, 0.95, 0.13};
  const auto i_dc = rectifier_load_current_A(in, 20.0);
  ASSERT_TRUE(i_dc);
  expect_within(*i_dc, 14.6728 / 20.0, 0.002, "load current");
  in.i_dc_A = *i_dc;
  auto e = estimate_rectifier(in);
  ASSERT_TRUE(e);
  expect_within(e->v_dc_V, 14.6728, 0.002, "v_dc");
  expect_within(e->v_out_peak_V, 15.9203, 0.01, "v_out_peak");
  expect_within(e->v_ripple_pp_refined_V, 2.5570, 0.07, "refined ripple");
  expect_within(e->v_reverse_peak_V, 32.860, 0.006, "PIV");
  expect_within(e->i_diode_avg_A, 0.36685, 0.002, "diode average");
  expect_within(e->i_diode_peak_A, 5.2777 * 1.076, 0.02, "diode peak (upper estimate)");
  expect_within(e->i_diode_rms_A, 1.2013 * 1.074, 0.02, "diode rms (upper estimate)");
  expect_within(e->i_reservoir_rms_A, 1.5318 * 1.091, 0.02, "reservoir rms (upper estimate)");
  EXPECT_DOUBLE_EQ(e->i_winding_rms_A, e->i_diode_rms_A);  // each half winding carries one diode
}

}  // namespace
}  // namespace mainscheck::analysis::formulas
