#include "analysis/formulas/multiplier.hpp"

#include <cmath>

namespace mainscheck::analysis::formulas {
namespace {

bool positive(double v) {
  return std::isfinite(v) && v > 0.0;
}

bool valid(const MultiplierInput& in) {
  return positive(in.v_peak_V) && positive(in.f_Hz) && positive(in.c_F) && in.i_load_A >= 0.0 &&
         in.v_f_V >= 0.0;
}

}  // namespace

// Classical load analysis of the half-wave cascade with equal capacitors: each stage passes the
// load charge q = I/f per period, the charge lost in the DC column stacks up stage by stage, giving
// ΔV = (q/C)(2n³/3 + n²/2 − n/6) and δV = (q/C) n(n+1)/2 (Kuffel, Zaengl & Kuffel, High Voltage
// Engineering: Fundamentals, 2nd ed., §2.2.2 cascade circuits, from memory; safety-data.md
// section 8.2 [C: S25, S26]).
double cw_drop_coefficient(int n) {
  const double x = n;
  return 2.0 * x * x * x / 3.0 + x * x / 2.0 - x / 6.0;
}

double cw_ripple_coefficient(int n) {
  const double x = n;
  return x * (x + 1.0) / 2.0;
}

std::optional<CockcroftWaltonEstimate> estimate_cockcroft_walton(int n, const MultiplierInput& in) {
  if (n < 1 || !valid(in)) return std::nullopt;
  CockcroftWaltonEstimate e;
  e.stages = n;
  const double q_over_c = in.i_load_A / (in.f_Hz * in.c_F);
  // No-load output 2 n v_pk (safety-data.md section 8.1 [C-part: S25]); each of the 2n diodes in the
  // charge path takes its forward drop (section 8.2 "minus 2n diode drops", [C: S26]).
  e.v_no_load_V = 2.0 * n * (in.v_peak_V - in.v_f_V);
  e.v_drop_V = q_over_c * cw_drop_coefficient(n);
  e.v_ripple_pp_V = q_over_c * cw_ripple_coefficient(n);
  e.v_out_V = e.v_no_load_V - e.v_drop_V;
  // Stresses at no load (the highest): the first AC-column capacitor clamps to v_pk, every other
  // capacitor and every diode spans two adjacent column nodes, 2 v_pk apart (safety-data.md section 8.1
  // [M]; derived from the node voltages [D]).
  e.v_cap_first_V = in.v_peak_V;
  e.v_cap_other_V = 2.0 * in.v_peak_V;
  e.v_diode_reverse_V = 2.0 * in.v_peak_V;
  // Charge conservation: in steady state every diode carries the load's charge I/f once per period,
  // so its mean current equals the load current [D].
  e.i_diode_avg_A = in.i_load_A;
  for (int k = 1; k <= n; ++k) e.v_node_dc_V.push_back(2.0 * k * in.v_peak_V);
  // d v_out/dn = 2 v_pk − (I/fC)(2n² + n − 1/6) = 0 → n ≈ sqrt(v_pk f C / I) for large n
  // (safety-data.md section 8.2 [C: S26]); the integer maximum is found directly so small n is exact.
  if (in.i_load_A > 0.0) {
    double best = -INFINITY;
    for (int k = 1; k <= 1000; ++k) {
      const double v = 2.0 * k * (in.v_peak_V - in.v_f_V) - q_over_c * cw_drop_coefficient(k);
      if (v <= best) break;
      best = v;
      e.optimum_stages = k;
    }
  }
  return e;
}

// Delon doubler: two half-wave rectifiers on opposite half cycles, their reservoirs in series. Each
// capacitor is recharged once per period and discharges by I/(fC); the two sawtooth ripples are half
// a period apart, so the sum ripples by I/(fC) at 2f and its mean sits I/(fC) below 2 v_pk
// (safety-data.md section 8.2 [D]; Millman & Halkias, Integrated Electronics, 1972, voltage doubler,
// from memory).
std::optional<SymmetricDoublerEstimate> estimate_symmetric_doubler(const MultiplierInput& in) {
  if (!valid(in)) return std::nullopt;
  SymmetricDoublerEstimate e;
  const double q_over_c = in.i_load_A / (in.f_Hz * in.c_F);
  e.v_no_load_V = 2.0 * (in.v_peak_V - in.v_f_V);
  e.v_ripple_pp_V = q_over_c;
  e.v_out_V = e.v_no_load_V - q_over_c;
  e.f_ripple_Hz = 2.0 * in.f_Hz;
  // Each reservoir holds v_pk; an off diode spans its own capacitor plus the source crest of the other
  // polarity, 2 v_pk (safety-data.md section 8.1 [M]).
  e.v_cap_V = in.v_peak_V;
  e.v_diode_reverse_V = 2.0 * in.v_peak_V;
  e.i_diode_avg_A = in.i_load_A;
  return e;
}

}  // namespace mainscheck::analysis::formulas
