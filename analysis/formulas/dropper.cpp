#include "analysis/formulas/dropper.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace mainscheck::analysis::formulas {
namespace {

constexpr double kPi = std::numbers::pi;

bool positive(double v) {
  return std::isfinite(v) && v > 0.0;
}

}  // namespace

std::optional<CapacitiveDropperEstimate> estimate_capacitive_dropper(const CapacitiveDropperInput& in) {
  if (!positive(in.v_rms_V) || !positive(in.f_Hz) || !positive(in.c_F) || !(in.r_series_ohm >= 0.0) ||
      !(in.r_bleeder_ohm >= 0.0) || !(in.v_out_V >= 0.0) || !(in.v_f_V >= 0.0)) {
    return std::nullopt;
  }
  CapacitiveDropperEstimate e;
  const double v_pk = std::sqrt(2.0) * in.v_rms_V;
  const double r = in.r_series_ohm;

  // Series impedance and line current I = V/sqrt(Xc² + R²) (Microchip AN954 "Transformerless power
  // supplies", safety-data.md section 9 [C: S33]); it ignores the few volts of the output, which is why
  // it is the short-circuit (and no-output) value.
  e.x_c_ohm = 1.0 / (2.0 * kPi * in.f_Hz * in.c_F);
  e.z_ohm = std::hypot(e.x_c_ohm, r);
  e.i_rms_A = in.v_rms_V / e.z_ohm;
  e.i_peak_A = std::sqrt(2.0) * e.i_rms_A;
  e.reactance_dominated = r <= kMaxSeriesRatio * e.x_c_ohm;

  // Rectified mean current into a clamped output, by charge per half cycle [D]: with R = 0 and the
  // output held at V_o, the capacitor swings between ±(V_pk − V_o − drops), moving 2C(V_pk − V_o − drops)
  // each half cycle through a bridge: I_dc = 4fC(V_pk − V_o − 2V_F) = (2/π)(V_pk − V_o − 2V_F)/Xc. This is
  // AN954's peak form (V_pk − V_Z)/Z times the 2/π of a rectified sine ([C: S33]); Z replaces Xc for
  // R > 0 (an approximation valid while R << Xc). Half-wave with the zener forward on the other half
  // cycle: the swing is from +(V_pk − V_o − V_F) to −(V_pk − V_F) once per period,
  // I_dc = fC(2V_pk − V_o − 2V_F) = (2V_pk − V_o − 2V_F)/(2π Xc).
  if (in.rectifier == DropperRectifier::bridge) {
    e.i_dc_A = std::max(0.0, 2.0 / kPi * (v_pk - in.v_out_V - 2.0 * in.v_f_V) / e.z_ohm);
    e.v_cap_swing_peak_V = std::max(0.0, v_pk - in.v_out_V - 2.0 * in.v_f_V);
  } else {
    e.i_dc_A = std::max(0.0, (2.0 * v_pk - in.v_out_V - 2.0 * in.v_f_V) / (2.0 * kPi * e.z_ohm));
    e.v_cap_swing_peak_V = std::max(0.0, v_pk - in.v_f_V);
  }
  // Load unplugged: the shunt zener takes the whole rectified current, P_Z = V_Z · I_dc (safety-data.md
  // section 9 [D]). Half-wave: the zener also carries I_dc forward in the other half cycle, and its
  // reverse clamp sits one diode drop above the output: P_Z = (V_o + 2V_F) · I_dc [D].
  e.p_zener_no_load_W = in.rectifier == DropperRectifier::bridge ? in.v_out_V * e.i_dc_A
                                                                 : (in.v_out_V + 2.0 * in.v_f_V) * e.i_dc_A;
  e.p_series_resistor_W = e.i_rms_A * e.i_rms_A * r;

  // Switch-on at the crest with the capacitor empty: only R limits, I = V_pk/R; the energy left in R
  // equals the energy stored, C V_pk²/2 (safety-data.md section 9 [D]). Unplugging at one crest
  // without a bleeder and re-plugging at the opposite crest doubles the step (2 V_pk / R) [D].
  if (r > 0.0) {
    e.i_surge_A = v_pk / r;
    e.i_surge_recharged_A = 2.0 * v_pk / r;
  }
  e.e_surge_J = 0.5 * in.c_F * v_pk * v_pk;

  e.v_cap_rms_V = e.i_rms_A * e.x_c_ohm;
  e.v_cap_peak_V = std::sqrt(2.0) * e.v_cap_rms_V;
  if (in.r_bleeder_ohm > 0.0) {
    e.p_bleeder_W = e.v_cap_rms_V * e.v_cap_rms_V / in.r_bleeder_ohm;
    e.bleeder_tau_s = in.r_bleeder_ohm * in.c_F;
  }
  return e;
}

// Ohm's law on the series pair; the dropper burns P_R = I²R (safety-data.md section 9 [D]).
std::optional<ResistiveDropperEstimate> estimate_resistive_dropper(double v_rms_V, double r_dropper_ohm,
                                                                   double r_load_ohm) {
  if (!positive(v_rms_V) || !positive(r_dropper_ohm) || !positive(r_load_ohm)) return std::nullopt;
  ResistiveDropperEstimate e;
  e.i_rms_A = v_rms_V / (r_dropper_ohm + r_load_ohm);
  e.i_peak_A = std::sqrt(2.0) * e.i_rms_A;
  e.v_load_rms_V = e.i_rms_A * r_load_ohm;
  e.p_dropper_W = e.i_rms_A * e.i_rms_A * r_dropper_ohm;
  e.p_load_W = e.i_rms_A * e.i_rms_A * r_load_ohm;
  e.efficiency = r_load_ohm / (r_dropper_ohm + r_load_ohm);
  return e;
}

}  // namespace mainscheck::analysis::formulas
