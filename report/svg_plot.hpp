#pragma once
// A small, dependency-free SVG line plot for the HTML report: axes with SI-prefixed tick labels,
// one polyline per series, a legend; every number is formatted with fixed precision so the same
// data gives the same bytes.
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace mainscheck::report {

/// One line of a plot: x and y samples of equal length (non-finite samples are skipped).
struct PlotSeries {
  std::string label;
  std::vector<double> x, y;
};

/// A plot to draw; the series share both axes.
struct Plot {
  std::string title;
  std::string x_label = "time";
  std::string x_unit = "s";
  std::string y_label;
  std::string y_unit;
  std::vector<PlotSeries> series;
  int width_px = 560;
  int height_px = 240;  // of the plot frame and axes; the legend adds a row per series below
  std::size_t max_points = 400;  // per series; longer series are decimated keeping minima and maxima
};

/// Tick positions k·step covering [lo, hi] with about `target` intervals, step 1, 2 or 5 × 10^n.
std::vector<double> nice_ticks(double lo, double hi, int target);

/// A tick label: the value with an SI prefix and unit ("5 ms", "-1.5 A"), exactly "0 <unit>" at zero.
std::string tick_label(double value, std::string_view unit);

/// The plot as an inline `<svg>` element (for embedding in HTML5; no external references).
std::string svg_plot(const Plot& plot);

/// Fixed-precision coordinate text: one decimal, no negative zero ("12.5", "0.0").
std::string svg_number(double v);

}  // namespace mainscheck::report
