#include "analysis/formulas/series_string.hpp"

#include <cmath>
#include <numeric>

namespace mainscheck::analysis::formulas {
namespace {

bool positive(double v) {
  return std::isfinite(v) && v > 0.0;
}

}  // namespace

// Series elements carry one current, so each takes V · R_k / ΣR (Kirchhoff's voltage law; any circuit
// text, e.g. Horowitz & Hill, The Art of Electronics, 2nd ed., §1.03 voltage dividers, from memory).
// Single faults [D]: with element j shorted the rest share V over ΣR − R_j; with element k open no
// current flows and k holds the whole V. The tolerance worst case puts k at its top and the others at
// their bottom (safety-data.md section 9: bleeder strings, a single shorted part [M, common practice]).
std::optional<SeriesStringEstimate> estimate_series_string(double v_V, const std::vector<double>& r_ohm,
                                                           double tol) {
  if (r_ohm.empty() || !std::isfinite(v_V) || !(tol >= 0.0 && tol < 1.0)) return std::nullopt;
  for (double r : r_ohm) {
    if (!positive(r)) return std::nullopt;
  }
  const double total = std::accumulate(r_ohm.begin(), r_ohm.end(), 0.0);
  SeriesStringEstimate e;
  e.i_A = v_V / total;
  e.p_total_W = v_V * e.i_A;
  for (std::size_t k = 0; k < r_ohm.size(); ++k) {
    SeriesElementStress s;
    const double rk = r_ohm[k];
    s.v_V = v_V * rk / total;
    s.p_W = s.v_V * s.v_V / rk;
    const double rk_hi = rk * (1.0 + tol);
    s.v_tolerance_worst_V = v_V * rk_hi / (rk_hi + (total - rk) * (1.0 - tol));
    s.v_open_V = v_V;
    for (std::size_t j = 0; j < r_ohm.size(); ++j) {
      if (j == k) continue;
      const double v = v_V * rk / (total - r_ohm[j]);
      if (!s.v_single_short_V || std::abs(v) > std::abs(*s.v_single_short_V)) {
        s.v_single_short_V = v;
        s.worst_short = j;
      }
    }
    if (s.v_single_short_V) s.p_single_short_W = *s.v_single_short_V * *s.v_single_short_V / rk;
    e.elements.push_back(s);
  }
  return e;
}

// Loaded divider: the load parallels R_bottom (Horowitz & Hill, The Art of Electronics, 2nd ed., §1.03
// and §1.05 Thevenin equivalent, from memory).
std::optional<DividerEstimate> estimate_divider(double v_in_V, double r_top_ohm, double r_bottom_ohm,
                                                std::optional<double> r_load_ohm) {
  if (!std::isfinite(v_in_V) || !positive(r_top_ohm) || !positive(r_bottom_ohm) ||
      (r_load_ohm && !positive(*r_load_ohm))) {
    return std::nullopt;
  }
  const double r_low = r_load_ohm ? r_bottom_ohm * *r_load_ohm / (r_bottom_ohm + *r_load_ohm) : r_bottom_ohm;
  DividerEstimate e;
  e.ratio = r_low / (r_top_ohm + r_low);
  e.v_out_V = v_in_V * e.ratio;
  e.i_top_A = v_in_V / (r_top_ohm + r_low);
  e.p_top_W = e.i_top_A * e.i_top_A * r_top_ohm;
  e.p_bottom_W = e.v_out_V * e.v_out_V / r_bottom_ohm;
  e.p_load_W = r_load_ohm ? e.v_out_V * e.v_out_V / *r_load_ohm : 0.0;
  e.r_source_ohm = r_top_ohm * r_bottom_ohm / (r_top_ohm + r_bottom_ohm);
  return e;
}

}  // namespace mainscheck::analysis::formulas
