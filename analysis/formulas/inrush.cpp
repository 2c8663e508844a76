#include "analysis/formulas/inrush.hpp"

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

// i(t) = (V/R) e^{−t/RC}; I²t = ∫₀^∞ (V/R)² e^{−2t/RC} dt = (V/R)² · RC/2 = V² C / (2R); the energy in R is
// R · I²t = C V²/2, the same as the energy left in the capacitor (safety-data.md section 7, switch-on
// surge [D]; any circuit-theory text, e.g. Horowitz & Hill, The Art of Electronics, 2nd ed., §1.13 RC
// circuits, from memory).
std::optional<RcInrushEstimate> estimate_rc_inrush(double v_V, double r_ohm, double c_F) {
  if (!positive(v_V) || !positive(r_ohm) || !positive(c_F)) return std::nullopt;
  RcInrushEstimate e;
  e.i_peak_A = v_V / r_ohm;
  e.tau_s = r_ohm * c_F;
  e.i2t_A2s = v_V * v_V * c_F / (2.0 * r_ohm);
  e.energy_in_r_J = 0.5 * c_F * v_V * v_V;
  return e;
}

bool step_model_holds(double r_ohm, double c_F, double f_Hz) {
  return r_ohm * c_F <= kStepModelFraction * 0.25 / f_Hz;
}

namespace {

// Composite Simpson's rule over [0, span] with an even number of steps.
template <class F>
double simpson(F&& f, double span, int steps) {
  const double dt = span / steps;
  double sum = f(0.0) + f(span);
  for (int k = 1; k < steps; ++k) sum += (k % 2 == 1 ? 4.0 : 2.0) * f(k * dt);
  return sum * dt / 3.0;
}

constexpr int kSteps = 20000;  // per half cycle: far below both τ and the period for mains parts

// Series RC driven by v = V cos ωt from v_C(0) = 0 [D]: steady state i_ss = |I| cos(ωt + φ) with
// I = V jωC / (1 + jωRC), plus the decaying term that makes i(0) = V/R:
// i(t) = i_ss(t) + (V − R i_ss(0))/R · e^{−t/RC}.
SineInrushEstimate direct_inrush(double v_pk, double r, double c, double f) {
  const double w = 2.0 * kPi * f;
  const double wrc = w * r * c;
  const double i_mag = v_pk * w * c / std::sqrt(1.0 + wrc * wrc);
  const double phi = 0.5 * kPi - std::atan(wrc);
  const double tau = r * c;
  const double i_ss0 = i_mag * std::cos(phi);
  auto current = [&](double t) {
    return i_mag * std::cos(w * t + phi) + (v_pk - r * i_ss0) / r * std::exp(-t / tau);
  };
  const double t_end = 0.5 / f;
  SineInrushEstimate e;
  e.i2t_A2s = simpson([&](double t) { return current(t) * current(t); }, t_end, kSteps);
  for (int k = 0; k <= kSteps; ++k) {
    e.i_peak_A = std::max(e.i_peak_A, std::abs(current(k * t_end / kSteps)));
  }
  // v_C = v − R i at the end of the half cycle.
  e.v_cap_end_V = v_pk * std::cos(w * t_end) - r * current(t_end);
  return e;
}

// Diode-fed reservoir [D]: the capacitor charges through R while the rectified source |v| (full wave)
// or max(v, 0) (half wave) exceeds it, dv_C/dt = (v_s − v_C)/(RC), and holds otherwise. Integrated with
// classical Runge–Kutta steps; i = (v_s − v_C)/R where positive. The diode drops are folded into
// v_peak by the caller.
SineInrushEstimate rectified_inrush(double v_pk, double r, double c, double f, bool full_wave) {
  const double w = 2.0 * kPi * f;
  const double tau = r * c;
  auto source = [&](double t) {
    const double v = v_pk * std::cos(w * t);
    return full_wave ? std::abs(v) : std::max(v, 0.0);
  };
  auto slope = [&](double t, double v_c) { return std::max(source(t) - v_c, 0.0) / tau; };
  auto i_sq = [&](double t, double v_c) {
    const double i = std::max(source(t) - v_c, 0.0) / r;
    return i * i;
  };
  const double t_end = 0.5 / f;
  const double dt = t_end / kSteps;
  SineInrushEstimate e;
  double v_c = 0.0;
  // RK4 steps on the grid, Simpson weights 1, 4, 2, ..., 4, 1 on i² at the grid points.
  double sum = i_sq(0.0, v_c);
  e.i_peak_A = v_pk / r;
  for (int k = 0; k < kSteps; ++k) {
    const double t = k * dt;
    const double k1 = slope(t, v_c);
    const double k2 = slope(t + 0.5 * dt, v_c + 0.5 * dt * k1);
    const double k3 = slope(t + 0.5 * dt, v_c + 0.5 * dt * k2);
    const double k4 = slope(t + dt, v_c + dt * k3);
    v_c += dt / 6.0 * (k1 + 2.0 * k2 + 2.0 * k3 + k4);
    const int idx = k + 1;
    sum += (idx == kSteps ? 1.0 : (idx % 2 == 1 ? 4.0 : 2.0)) * i_sq(t + dt, v_c);
    e.i_peak_A = std::max(e.i_peak_A, std::max(source(t + dt) - v_c, 0.0) / r);
  }
  e.i2t_A2s = sum * dt / 3.0;
  e.v_cap_end_V = v_c;
  return e;
}

}  // namespace

std::optional<SineInrushEstimate> sine_inrush(double v_peak_V, double r_ohm, double c_F, double f_Hz,
                                              InrushPath path) {
  if (!positive(v_peak_V) || !positive(r_ohm) || !positive(c_F) || !positive(f_Hz)) return std::nullopt;
  if (path == InrushPath::direct) return direct_inrush(v_peak_V, r_ohm, c_F, f_Hz);
  return rectified_inrush(v_peak_V, r_ohm, c_F, f_Hz, path == InrushPath::full_wave);
}

}  // namespace mainscheck::analysis::formulas
