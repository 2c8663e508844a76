#pragma once
// Textbook relations for phase-angle control of a resistive load by a triac or thyristors.
// Sources and validity ranges: docs/formulas.md.
#include <optional>

namespace mainscheck::analysis::formulas {

/// The switching device: a triac (both half cycles), one thyristor (positive half cycles only), or two
/// thyristors in anti-parallel (both half cycles, one device each).
enum class PhaseDevice { triac, thyristor, thyristor_pair };

/// On-state model of a thyristor or triac from its datasheet: threshold voltage and slope resistance.
struct OnStateModel {
  double v_t0_V = 0.0;
  double r_t_ohm = 0.0;
};

/// Inputs: supply r.m.s. voltage, firing angle α in radians (0..π) after each zero crossing, load.
struct PhaseControlInput {
  double v_rms_V = 0.0;
  double alpha_rad = 0.0;
  double r_load_ohm = 0.0;
  PhaseDevice device = PhaseDevice::triac;
  std::optional<OnStateModel> on_state;
};

/// Load and per-device figures for one firing angle.
struct PhaseControlEstimate {
  double v_out_rms_V = 0.0;  // load r.m.s. voltage
  double v_out_avg_V = 0.0;  // mean of |v_load| (triac, pair) or of v_load (one thyristor)
  double i_load_rms_A = 0.0;
  double i_load_peak_A = 0.0;
  double p_load_W = 0.0;
  double power_factor = 0.0;    // P / (V_s · I_rms) seen by the supply
  double i_device_avg_A = 0.0;  // per device: mean of |i| for a triac, mean forward current for a thyristor
  double i_device_rms_A = 0.0;  // per device
  std::optional<double> p_conduction_W;  // per device: V_T0 · I_avg + r_T · I_rms²
};

/// Fraction sqrt(1 − α/π + sin 2α / 2π) of the supply r.m.s. voltage reaching the load (both half cycles).
double phase_rms_factor(double alpha_rad);

/// Firing angle of a delay after the zero crossing: α = 2π f t.
double firing_angle_rad(double delay_s, double f_Hz);

/// Estimates a phase-controlled resistive load; empty for α outside 0..π or non-positive inputs.
std::optional<PhaseControlEstimate> estimate_phase_control(const PhaseControlInput& in);

}  // namespace mainscheck::analysis::formulas
