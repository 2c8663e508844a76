#include "analysis/formulas/rectifier.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace mainscheck::analysis::formulas {
namespace {

constexpr double kPi = std::numbers::pi;

bool positive(double v) {
  return std::isfinite(v) && v > 0.0;
}

// Conduction angle from the ripple: conduction starts when the falling source crosses the reservoir
// at its minimum, v_pk·sin(φ) = v_pk − ΔV, and ends near the crest, so θ_c = π/2 − φ =
// arccos(1 − ΔV/v_pk) (safety-data.md section 7, [D]).
double conduction_angle(double ripple_V, double v_out_peak_V) {
  return std::acos(std::clamp(1.0 - ripple_V / v_out_peak_V, -1.0, 1.0));
}

}  // namespace

int diodes_in_path(RectifierKind kind) {
  return kind == RectifierKind::bridge ? 2 : 1;
}

double ripple_frequency_Hz(RectifierKind kind, double f_Hz) {
  return kind == RectifierKind::half_wave ? f_Hz : 2.0 * f_Hz;
}

// Off-diode voltage at the crest with the reservoir at v_pk − V_F (no load):
//  half-wave: cathode at the reservoir, anode at −v_pk → 2 v_pk − V_F;
//  bridge: the off diode of each leg spans the output plus one on-diode → v_pk − V_F;
//  centre-tap and dual rail: cathode at the reservoir, anode at the other winding end at −v_pk of the
//  half winding → 2 v_pk − V_F.
// Textbook: Horowitz & Hill, The Art of Electronics, 2nd ed., §1.27 "rectification" (PIV of the basic
// rectifier circuits; section number from memory); safety-data.md section 7 ([M]); derivation [D].
double diode_reverse_peak_V(RectifierKind kind, double v_peak_V, double v_f_V) {
  const double v = kind == RectifierKind::bridge ? v_peak_V - v_f_V : 2.0 * v_peak_V - v_f_V;
  return std::max(v, 0.0);
}

std::optional<RectifierEstimate> estimate_rectifier(const RectifierInput& in) {
  if (!positive(in.v_peak_V) || !positive(in.f_Hz) || !positive(in.c_F) || !(in.i_dc_A >= 0.0) ||
      !(in.v_f_V >= 0.0)) {
    return std::nullopt;
  }
  RectifierEstimate e;
  e.v_out_peak_V = in.v_peak_V - diodes_in_path(in.kind) * in.v_f_V;
  if (!positive(e.v_out_peak_V)) return std::nullopt;

  // Ripple with a constant-current load: the reservoir supplies I for a whole ripple period,
  // ΔV = I/(f_r C), f_r = f half-wave, 2f full-wave (Horowitz & Hill, The Art of Electronics, 2nd ed.,
  // §1.28 "power-supply filtering", from memory; Millman & Halkias, Integrated Electronics, 1972,
  // ch. 18 capacitor filter, from memory; safety-data.md section 7 [M]).
  const double omega = 2.0 * kPi * in.f_Hz;
  e.f_ripple_Hz = ripple_frequency_Hz(in.kind, in.f_Hz);
  const double t_ripple_s = 1.0 / e.f_ripple_Hz;
  e.v_ripple_pp_V = in.i_dc_A * t_ripple_s / in.c_F;

  // Refinement [D]: the reservoir is recharged during the conduction time, so it discharges only for
  // T_r − t_c with t_c = θ_c(ΔV)/ω. h(ΔV) = ΔV − I(T_r − t_c(ΔV))/C is increasing with h(0) < 0 and
  // h(ΔV_textbook) ≥ 0, so bisection finds the self-consistent ripple.
  auto h = [&](double dv) {
    return dv - in.i_dc_A * (t_ripple_s - conduction_angle(dv, e.v_out_peak_V) / omega) / in.c_F;
  };
  double lo = 0.0;
  double hi = std::min(e.v_ripple_pp_V, 2.0 * e.v_out_peak_V);
  for (int i = 0; i < 100 && hi - lo > 1e-12 * e.v_out_peak_V; ++i) {
    const double mid = 0.5 * (lo + hi);
    (h(mid) < 0.0 ? lo : hi) = mid;
  }
  e.v_ripple_pp_refined_V = hi;
  if (e.v_ripple_pp_refined_V >= e.v_out_peak_V) return std::nullopt;  // reservoir empties each period
  e.small_ripple = e.v_ripple_pp_refined_V <= kMaxRippleFraction * e.v_out_peak_V;

  e.v_dc_V = e.v_out_peak_V - 0.5 * e.v_ripple_pp_refined_V;
  e.v_out_min_V = e.v_out_peak_V - e.v_ripple_pp_refined_V;
  e.v_reverse_peak_V = diode_reverse_peak_V(in.kind, in.v_peak_V, in.v_f_V);
  e.conduction_angle_rad = conduction_angle(e.v_ripple_pp_refined_V, e.v_out_peak_V);
  e.conduction_time_s = e.conduction_angle_rad / omega;

  // Two limits on the charging pulses; the one giving the smaller peak (the wider pulse) is used, as
  // both are upper estimates in their own limit.
  //
  // (a) Stiff source: while a diode conducts the reservoir follows the source, so i = C dv/dt + I =
  // ωC v_pk cos(ωt) + I, largest at conduction start where cos = sin θ_c (Millman & Halkias, Integrated
  // Electronics, 1972, capacitor-filter analysis, from memory). Pulse shape approximated by a triangle
  // of width t_c with the same charge, I·T_r = i_tri·t_c/2 (safety-data.md section 7, [D]); its mean
  // square over a ripple period is i_tri² t_c/(3 T_r).
  const double t_c = e.conduction_time_s;
  e.i_diode_peak_A = omega * in.c_F * e.v_out_peak_V * std::sin(e.conduction_angle_rad) + in.i_dc_A;
  const double i_tri_A = t_c > 0.0 ? 2.0 * in.i_dc_A * t_ripple_s / t_c : 0.0;
  double train_mean_square = i_tri_A * i_tri_A * t_c / (3.0 * t_ripple_s);

  // (b) Source resistance R with the reservoir held near its crest V_c = V cos θ_s (large C): the
  // pulse is i(θ) = (V/R)(cos θ − cos θ_s) for |θ| < θ_s around the crest. Its charge
  // (2V/(ωR))(sin θ_s − θ_s cos θ_s) must equal I·T_r, which fixes θ_s (the left side rises with θ_s on
  // (0, π)); peak (V/R)(1 − cos θ_s); ∫i² dt = (V/R)² [θ_s(1 + 2cos²θ_s) − 3 sin θ_s cos θ_s]/ω. This is
  // the large-ωCR_L limit of Schade's analysis (O. H. Schade, Proc. IRE 31, 1943, from memory) [D].
  if (in.r_source_ohm > 0.0 && in.i_dc_A > 0.0) {
    const double v = e.v_out_peak_V;
    const double target = in.i_dc_A * t_ripple_s * omega * in.r_source_ohm / (2.0 * v);
    if (target < kPi) {
      double lo = 0.0;
      double hi = kPi;
      for (int i = 0; i < 100; ++i) {
        const double mid = 0.5 * (lo + hi);
        (std::sin(mid) - mid * std::cos(mid) < target ? lo : hi) = mid;
      }
      const double th = 0.5 * (lo + hi);
      const double i_peak_r = v / in.r_source_ohm * (1.0 - std::cos(th));
      if (i_peak_r < e.i_diode_peak_A) {
        e.pulse_limit = PulseLimit::source_resistance;
        e.i_diode_peak_A = i_peak_r;
        const double c = std::cos(th);
        const double pulse_i2t =
            std::pow(v / in.r_source_ohm, 2) * (th * (1.0 + 2.0 * c * c) - 3.0 * std::sin(th) * c) / omega;
        train_mean_square = pulse_i2t / t_ripple_s;
      }
    }
  }

  // Each diode carries one pulse per mains period T; the reservoir carries the pulse train less the
  // load current, whose mean is zero: I_C,rms² = I_train,rms² − I² (safety-data.md section 7, [D]).
  // Bridge and dual rail: a winding carries two pulses per period (both polarities); half-wave and
  // centre-tap: one.
  const double t_mains_s = 1.0 / in.f_Hz;
  const double diode_mean_square = train_mean_square * t_ripple_s / t_mains_s;
  e.i_diode_avg_A = in.kind == RectifierKind::half_wave ? in.i_dc_A : 0.5 * in.i_dc_A;
  e.i_diode_rms_A = std::sqrt(diode_mean_square);
  e.i_reservoir_rms_A = std::sqrt(std::max(train_mean_square - in.i_dc_A * in.i_dc_A, 0.0));
  const bool both_polarities = in.kind == RectifierKind::bridge || in.kind == RectifierKind::dual_rail;
  e.i_winding_rms_A = std::sqrt((both_polarities ? 2.0 : 1.0) * diode_mean_square);
  return e;
}

std::optional<double> rectifier_load_current_A(RectifierInput in, double r_load_ohm) {
  if (!positive(r_load_ohm)) return std::nullopt;
  in.i_dc_A = 0.0;
  const auto open = estimate_rectifier(in);
  if (!open) return std::nullopt;
  // f(I) = I − v_dc(I)/R rises with I: v_dc falls as the load grows. A load that empties the reservoir
  // counts as v_dc = 0.
  auto f = [&](double i) {
    in.i_dc_A = i;
    const auto e = estimate_rectifier(in);
    return i - (e ? e->v_dc_V : 0.0) / r_load_ohm;
  };
  double lo = 0.0;
  double hi = open->v_out_peak_V / r_load_ohm;
  for (int i = 0; i < 100 && hi - lo > 1e-12 * hi; ++i) {
    const double mid = 0.5 * (lo + hi);
    (f(mid) < 0.0 ? lo : hi) = mid;
  }
  return 0.5 * (lo + hi);
}

}  // namespace mainscheck::analysis::formulas
