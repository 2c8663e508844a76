#pragma once
// Voltage sharing in a series string of resistive elements (lamps, heaters, resistors, bleeder
// chains) and the loaded resistive divider. Sources and validity ranges: docs/formulas.md.
#include <cstddef>
#include <optional>
#include <vector>

namespace mainscheck::analysis::formulas {

/// Stress of one element of a series string across a voltage V (r.m.s. or peak: the result follows).
struct SeriesElementStress {
  double v_V = 0.0;                        // V · R_k / ΣR
  double p_W = 0.0;                        // v² / R_k (meaningful when V is r.m.s.)
  double v_tolerance_worst_V = 0.0;        // this element at +tol, all others at −tol
  std::optional<double> v_single_short_V;  // worst over one other element shorted
  std::optional<double> p_single_short_W;
  std::optional<std::size_t> worst_short;  // index of the element whose short gives it
  double v_open_V = 0.0;                   // this element open: it holds the whole string voltage
};

/// Per-element stresses in string order.
struct SeriesStringEstimate {
  std::vector<SeriesElementStress> elements;
  double i_A = 0.0;
  double p_total_W = 0.0;
};

/// Shares `v_V` over the resistances `r_ohm` with an optional common tolerance fraction; empty when the
/// list is empty, a resistance is not positive or the tolerance is outside 0..1.
std::optional<SeriesStringEstimate> estimate_series_string(double v_V, const std::vector<double>& r_ohm,
                                                           double tolerance_fraction = 0.0);

/// Output and dissipations of a divider R_top over R_bottom, optionally loaded by R_load.
struct DividerEstimate {
  double v_out_V = 0.0;
  double ratio = 0.0;  // v_out / v_in
  double i_top_A = 0.0;
  double p_top_W = 0.0;
  double p_bottom_W = 0.0;
  double p_load_W = 0.0;
  double r_source_ohm = 0.0;  // Thevenin resistance seen by the load: R_top ∥ R_bottom
};

/// Resistive divider; `r_load_ohm` empty means unloaded. Empty for non-positive resistances.
std::optional<DividerEstimate> estimate_divider(double v_in_V, double r_top_ohm, double r_bottom_ohm,
                                                std::optional<double> r_load_ohm = std::nullopt);

}  // namespace mainscheck::analysis::formulas
