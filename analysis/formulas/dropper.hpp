#pragma once
// Textbook estimates for capacitive droppers (series capacitor, surge resistor, bleeder, rectifier,
// shunt zener) and resistive droppers. Sources and validity ranges: docs/formulas.md.
#include <optional>

namespace mainscheck::analysis::formulas {

/// Rectifier behind a capacitive dropper: a bridge, or one diode with the shunt zener passing the
/// other half cycle forward (half-wave).
enum class DropperRectifier { bridge, half_wave };

/// Inputs of a capacitive dropper. `r_bleeder_ohm` = 0 means no bleeder; `v_out_V` is the d.c. output
/// held by the zener (bridge: the zener voltage; half-wave: the zener clamps the diode's anode one V_F
/// above the output); `v_f_V` is one rectifier diode's (and the zener's forward) drop.
struct CapacitiveDropperInput {
  double v_rms_V = 0.0;
  double f_Hz = 0.0;
  double c_F = 0.0;
  double r_series_ohm = 0.0;
  double r_bleeder_ohm = 0.0;
  double v_out_V = 0.0;
  double v_f_V = 0.0;
  DropperRectifier rectifier = DropperRectifier::bridge;
};

/// Estimated currents, dissipations and stresses of a capacitive dropper.
struct CapacitiveDropperEstimate {
  double x_c_ohm = 0.0;                       // 1/(2π f C)
  double z_ohm = 0.0;                         // sqrt(Xc² + R²)
  double i_rms_A = 0.0;                       // V/Z: line current with the output near zero volts
  double i_peak_A = 0.0;                      // sqrt 2 · V/Z
  double i_dc_A = 0.0;                        // rectified mean current into the clamped output
  double p_zener_no_load_W = 0.0;             // V_out · I_dc: the whole current in the zener
  double p_series_resistor_W = 0.0;           // I_rms² R
  std::optional<double> i_surge_A;            // switch-on at the crest, capacitor empty: V_pk/R
  std::optional<double> i_surge_recharged_A;  // re-plug at the opposite crest, capacitor at −V_pk: 2V_pk/R
  double e_surge_J = 0.0;                     // energy dissipated in R by one switch-on: C V_pk²/2
  double v_cap_rms_V = 0.0;                   // I_rms · Xc
  double v_cap_peak_V = 0.0;                  // sqrt 2 · I_rms · Xc (output shorted: the highest)
  double v_cap_swing_peak_V = 0.0;            // steady-state crest with the output clamped at V_out
  std::optional<double> p_bleeder_W;          // V_C,rms² / R_bleeder
  std::optional<double> bleeder_tau_s;        // R_bleeder · C: discharge time constant after unplugging
  bool reactance_dominated = false;           // R <= kMaxSeriesRatio · Xc: the V/Z forms hold
};

/// Ratio R/Xc up to which the dropper estimates are documented as valid.
inline constexpr double kMaxSeriesRatio = 0.3;

/// Estimates a capacitive dropper; empty for non-positive voltage, frequency or capacitance.
std::optional<CapacitiveDropperEstimate> estimate_capacitive_dropper(const CapacitiveDropperInput& in);

/// Estimated current and dissipations of a resistive dropper feeding a resistive load from AC.
struct ResistiveDropperEstimate {
  double i_rms_A = 0.0;
  double i_peak_A = 0.0;
  double v_load_rms_V = 0.0;
  double p_dropper_W = 0.0;
  double p_load_W = 0.0;
  double efficiency = 0.0;  // P_load / (P_load + P_dropper)
};

/// Resistive dropper R in series with load R_L across V; empty for non-positive inputs.
std::optional<ResistiveDropperEstimate> estimate_resistive_dropper(double v_rms_V, double r_dropper_ohm,
                                                                   double r_load_ohm);

}  // namespace mainscheck::analysis::formulas
