#pragma once
// Switch-on surge of an empty capacitor through a series resistance: the closed-form step response
// and the exact response to a sine switched on at its crest. Sources: docs/formulas.md.
#include <optional>

namespace mainscheck::analysis::formulas {

/// Step of `v_V` applied to an empty capacitor through R (the supply held at its crest).
struct RcInrushEstimate {
  double i_peak_A = 0.0;       // V/R at t = 0
  double i2t_A2s = 0.0;        // ∫ i² dt from 0 to ∞ = V² C / (2R)
  double tau_s = 0.0;          // RC
  double energy_in_r_J = 0.0;  // C V² / 2, equal to the energy stored
};

/// Closed-form step response; empty for non-positive inputs.
std::optional<RcInrushEstimate> estimate_rc_inrush(double v_V, double r_ohm, double c_F);

/// True when the step model holds for a sine switched at its crest: RC <= kStepModelFraction of the
/// quarter period, so the supply has barely fallen before the capacitor is charged.
bool step_model_holds(double r_ohm, double c_F, double f_Hz);

/// Fraction of the quarter period up to which the step model is documented as valid.
inline constexpr double kStepModelFraction = 0.2;

/// How the capacitor is fed: directly (series RC), or through a half-wave or full-wave rectifier whose
/// diodes stop the current when it would reverse (the reservoir then holds its charge).
enum class InrushPath { direct, half_wave, full_wave };

/// Surge of a sine v_pk cos(2π f t) switched on at its crest into an empty capacitor through R.
struct SineInrushEstimate {
  double i_peak_A = 0.0;
  double i2t_A2s = 0.0;      // ∫ i² dt over the first half cycle after switch-on
  double v_cap_end_V = 0.0;  // capacitor voltage at the end of that half cycle
};

/// I²t of the first half cycle: exact closed form for `direct`, numerical integration of the diode-fed
/// charge for the rectified paths. Empty for non-positive inputs.
std::optional<SineInrushEstimate> sine_inrush(double v_peak_V, double r_ohm, double c_F, double f_Hz,
                                              InrushPath path);

}  // namespace mainscheck::analysis::formulas
