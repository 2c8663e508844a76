#pragma once
// Textbook estimates for capacitor-input rectifiers: half-wave, full-wave bridge, full-wave
// centre-tap and dual symmetric rails. Sources and validity ranges: docs/formulas.md.
#include <optional>

namespace mainscheck::analysis::formulas {

/// Rectifier topology as far as the formulas care.
enum class RectifierKind { half_wave, bridge, centre_tap, dual_rail };

/// Inputs: `v_peak_V` is the crest of the AC driving the diodes (the whole source for half-wave and
/// bridge, each half winding for centre-tap and dual-rail); `i_dc_A` is the load current of one rail.
struct RectifierInput {
  RectifierKind kind = RectifierKind::bridge;
  double v_peak_V = 0.0;
  double f_Hz = 0.0;
  double c_F = 0.0;     // reservoir of one rail
  double i_dc_A = 0.0;  // mean load current of one rail
  double v_f_V = 0.0;   // forward drop of one diode at its peak current
  /// Resistance of the charging path: source or winding, series limiter, the diodes' bulk resistance
  /// and the reservoir's ESR; 0 means a stiff source.
  double r_source_ohm = 0.0;
};

/// Which mechanism limits the charging pulses in the current estimates.
enum class PulseLimit { reservoir, source_resistance };

/// Estimated output and stresses of one rail (dual-rail: each rail, the loads being symmetric).
struct RectifierEstimate {
  double v_out_peak_V = 0.0;           // crest of the reservoir voltage (no-load output)
  double f_ripple_Hz = 0.0;            // f (half-wave) or 2f (full-wave)
  double v_ripple_pp_V = 0.0;          // I/(f_ripple C): discharge over the whole ripple period
  double v_ripple_pp_refined_V = 0.0;  // discharge over the ripple period less the conduction time
  double v_dc_V = 0.0;                 // v_out_peak − refined ripple / 2
  double v_out_min_V = 0.0;            // v_out_peak − refined ripple
  double v_reverse_peak_V = 0.0;       // peak inverse voltage of each diode, no load (the worst)
  double conduction_angle_rad = 0.0;   // from conduction start to the crest
  double conduction_time_s = 0.0;
  double i_diode_peak_A = 0.0;  // repetitive peak
  double i_diode_avg_A = 0.0;
  double i_diode_rms_A = 0.0;
  double i_reservoir_rms_A = 0.0;                  // ripple current of the reservoir
  double i_winding_rms_A = 0.0;                    // source (half-wave, bridge) or each half winding
  PulseLimit pulse_limit = PulseLimit::reservoir;  // the model the four currents above come from
  bool small_ripple = false;                       // refined ripple <= kMaxRippleFraction of v_out_peak
};

/// Ripple fraction of the crest up to which the estimates are documented as valid.
inline constexpr double kMaxRippleFraction = 0.25;

/// Number of diodes conducting in series in the charging path (2 for a bridge, 1 otherwise).
int diodes_in_path(RectifierKind kind);

/// Ripple frequency: f for half-wave, 2f for the full-wave kinds.
double ripple_frequency_Hz(RectifierKind kind, double f_Hz);

/// Peak inverse voltage of each diode, no load, for a given crest of the driving AC.
double diode_reverse_peak_V(RectifierKind kind, double v_peak_V, double v_f_V);

/// All estimates for one rail; empty when the inputs are not positive or the reservoir is so small
/// that it discharges completely between charging pulses.
std::optional<RectifierEstimate> estimate_rectifier(const RectifierInput& in);

/// Load current of one rail when its load is a resistor: solves I = v_dc(I) / R.
std::optional<double> rectifier_load_current_A(RectifierInput in, double r_load_ohm);

}  // namespace mainscheck::analysis::formulas
