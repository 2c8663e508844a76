#pragma once
// Device equations of the solver: source waveforms and the SPICE diode with junction limiting.
#include <limits>
#include <optional>
#include <string>
#include <vector>

namespace mainscheck::analysis::solver::detail {

/// Thermal voltage kT/q at SPICE's nominal 27 °C (300.15 K).
inline constexpr double kThermalVoltage27C_V = 1.380649e-23 * 300.15 / 1.602176634e-19;

/// Transient waveform of an independent source (DC, SIN or PULSE, ngspice argument conventions).
struct SourceWave {
  enum class Kind { dc, sin, pulse } kind = Kind::dc;
  double dc = 0;
  double vo = 0, va = 0, freq_Hz = 0, td_s = 0, theta_per_s = 0, phase_rad = 0;       // SIN
  double v1 = 0, v2 = 0, delay_s = 0, rise_s = 0, fall_s = 0, width_s = 0, per_s = 0;  // PULSE
  /// Value at time t.
  double value(double t_s) const;
  /// Corner instants of a PULSE in [t0, t1), appended to out.
  void breakpoints(double t0_s, double t1_s, std::vector<double>& out) const;
  /// Empty when the waveform repeats with period_s, else the reason it does not.
  std::optional<std::string> periodic_with(double period_s) const;
};

/// SPICE diode parameters after the breakdown-voltage adjustment.
struct DiodeParams {
  double is_A = 1e-14;
  double n = 1.0;
  double rs_Ohm = 0;
  bool has_bv = false;
  double bv_V = std::numeric_limits<double>::infinity();
  double ibv_A = 1e-3;
  double nbv = 1.0;
  double gmin_S = 1e-12;
  double vte_V = 0;     // n·Vt
  double vtebrk_V = 0;  // nbv·Vt
  double vcrit_V = 0;   // pnjlim critical voltage
  double xbv_V = 0;     // breakdown voltage matched to ibv
  /// Fills the derived fields (call after setting the model parameters).
  void finish();
};

/// Junction current and its derivative.
struct DiodeOp {
  double i_A = 0;
  double g_S = 0;
};

/// Evaluates the DC diode equation at junction voltage v (forward, reverse, breakdown regions).
DiodeOp diode_eval(const DiodeParams& p, double v_V);

/// Limits a new junction-voltage iterate against the previous one (SPICE3 pnjlim), also mirrored for
/// the breakdown knee; sets limited when the value was changed.
double diode_limit(const DiodeParams& p, double v_new_V, double v_old_V, bool& limited);

/// True when the junction carries forward or breakdown current (used to schedule backward-Euler steps).
bool diode_conducting(const DiodeParams& p, double v_V);

}  // namespace mainscheck::analysis::solver::detail
