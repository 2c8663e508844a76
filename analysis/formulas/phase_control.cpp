#include "analysis/formulas/phase_control.hpp"

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

// V_rms = V_s sqrt(1 − α/π + sin 2α / 2π): the mean of sin² over (α, π) (Rashid, Power Electronics:
// Circuits, Devices and Applications, 3rd ed., ch. 11 "AC voltage controllers", single-phase full-wave
// controller with resistive load, from memory; Mohan, Undeland & Robbins, Power Electronics, 3rd ed.,
// ch. 6 thyristor converters, from memory; safety-data.md section 6.2 [C: S28]).
double phase_rms_factor(double alpha_rad) {
  const double a = std::clamp(alpha_rad, 0.0, kPi);
  return std::sqrt(std::max(0.0, 1.0 - a / kPi + std::sin(2.0 * a) / (2.0 * kPi)));
}

double firing_angle_rad(double delay_s, double f_Hz) {
  return 2.0 * kPi * f_Hz * delay_s;
}

std::optional<PhaseControlEstimate> estimate_phase_control(const PhaseControlInput& in) {
  if (!positive(in.v_rms_V) || !positive(in.r_load_ohm) || !std::isfinite(in.alpha_rad) ||
      in.alpha_rad < 0.0 || in.alpha_rad > kPi) {
    return std::nullopt;
  }
  const double a = in.alpha_rad;
  const double v_pk = std::sqrt(2.0) * in.v_rms_V;
  const double r = in.r_load_ohm;
  const bool both_halves = in.device != PhaseDevice::thyristor;
  PhaseControlEstimate e;

  // One thyristor conducts in one half cycle only: the mean square halves, so the r.m.s. factor is
  // divided by sqrt 2 (half-wave controlled rectifier, Rashid ch. 10, from memory; [D]).
  const double factor = phase_rms_factor(a);
  e.v_out_rms_V = in.v_rms_V * (both_halves ? factor : factor / std::sqrt(2.0));
  // Mean over a half cycle of V_pk sin θ from α to π: V_pk (1 + cos α)/π; a single thyristor averages
  // over the whole period, half of that (safety-data.md section 6.2 [D]; [C-part: S-incb]).
  const double half_cycle_mean = v_pk * (1.0 + std::cos(a)) / kPi;
  e.v_out_avg_V = both_halves ? half_cycle_mean : 0.5 * half_cycle_mean;
  e.i_load_rms_A = e.v_out_rms_V / r;
  // The current follows the voltage: its crest is V_pk when firing at or before 90°, else V_pk sin α [D].
  e.i_load_peak_A = (a <= 0.5 * kPi ? v_pk : v_pk * std::sin(a)) / r;
  e.p_load_W = e.v_out_rms_V * e.v_out_rms_V / r;
  // Supply sees I_rms at V_s: PF = P/(V_s I_rms) = V_out,rms / V_s for a resistive load [D].
  e.power_factor = e.v_out_rms_V / in.v_rms_V;

  switch (in.device) {
    case PhaseDevice::triac:
      e.i_device_avg_A = half_cycle_mean / r;
      e.i_device_rms_A = e.i_load_rms_A;
      break;
    case PhaseDevice::thyristor:
      e.i_device_avg_A = e.v_out_avg_V / r;
      e.i_device_rms_A = e.i_load_rms_A;
      break;
    case PhaseDevice::thyristor_pair:
      // Each device carries one polarity: half the mean of |i| and half the mean square.
      e.i_device_avg_A = 0.5 * half_cycle_mean / r;
      e.i_device_rms_A = e.i_load_rms_A / std::sqrt(2.0);
      break;
  }
  // Two-parameter on-state model P = V_T0 · I_T(AV) + r_T · I_T(RMS)² (safety-data.md section 6.2
  // [C: S29, S31]; the form thyristor datasheets use for their power-dissipation curves).
  if (in.on_state) {
    const OnStateModel& m = *in.on_state;
    e.p_conduction_W = m.v_t0_V * e.i_device_avg_A + m.r_t_ohm * e.i_device_rms_A * e.i_device_rms_A;
  }
  return e;
}

}  // namespace mainscheck::analysis::formulas
