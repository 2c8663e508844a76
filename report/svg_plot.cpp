#include "report/svg_plot.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>

#include "analysis/waveforms.hpp"
#include "report/markup.hpp"
#include "report/units.hpp"

namespace mainscheck::report {

namespace {

// Distinguishable on white and for the common colour-vision deficiencies (Okabe–Ito palette).
constexpr const char* kColours[] = {"#0072b2", "#d55e00", "#009e73", "#cc79a7",
                                    "#e69f00", "#56b4e9", "#000000", "#f0e442"};

// Dash patterns cycle with the colours so coinciding traces (a bridge's diode pairs) stay visible.
constexpr const char* kDashes[] = {"", "7 4", "3 3", "10 3 2 3"};

constexpr double kLeft = 72, kRight = 16, kTop = 28, kBottom = 44, kLegendRow = 18;

struct Range {
  double lo = std::numeric_limits<double>::infinity();
  double hi = -std::numeric_limits<double>::infinity();
  void add(double v) {
    if (!std::isfinite(v)) return;
    lo = std::min(lo, v);
    hi = std::max(hi, v);
  }
  bool empty() const { return lo > hi; }
};

double tick_step(double lo, double hi, int target) {
  const double raw = (hi - lo) / std::max(target, 1);
  const double mag = std::pow(10.0, std::floor(std::log10(raw)));
  const double norm = raw / mag;
  return (norm < 1.5 ? 1 : norm < 3 ? 2 : norm < 7 ? 5 : 10) * mag;
}

/// Widens a degenerate range so it still has ticks.
void widen(double& lo, double& hi) {
  if (hi > lo) return;
  const double d = lo == 0 ? 1.0 : std::fabs(lo) * 0.1;
  lo -= d;
  hi += d;
}

}  // namespace

std::vector<double> nice_ticks(double lo, double hi, int target) {
  if (!std::isfinite(lo) || !std::isfinite(hi)) return {};
  if (lo > hi) std::swap(lo, hi);
  widen(lo, hi);
  const double step = tick_step(lo, hi, target);
  // Integer multiples of the step, so 0 is exactly 0 and the labels do not drift.
  // A range end within 0.1 % of a step past a tick (solver leakage of a few nA) does not add a tick.
  const long k0 = static_cast<long>(std::floor(lo / step + 1e-3));
  const long k1 = static_cast<long>(std::ceil(hi / step - 1e-3));
  std::vector<double> out;
  for (long k = k0; k <= k1 && out.size() < 64; ++k) out.push_back(static_cast<double>(k) * step);
  return out;
}

std::string tick_label(double value, std::string_view unit) {
  if (value == 0) return fmt::format("0 {}", unit);
  return format_si(value, unit);
}

std::string svg_number(double v) {
  if (!std::isfinite(v) || std::fabs(v) < 0.05) return "0.0";
  return fmt::format("{:.1f}", v);
}

std::string svg_plot(const Plot& plot) {
  std::vector<PlotSeries> series = plot.series;
  Range xr, yr;
  yr.add(0);  // currents and voltages read best against their zero line
  for (auto& s : series) {
    const std::size_t n = std::min(s.x.size(), s.y.size());
    s.x.resize(n);
    s.y.resize(n);
    analysis::decimate_min_max(s.x, s.y, plot.max_points);
    for (std::size_t k = 0; k < s.x.size(); ++k) {
      if (!std::isfinite(s.x[k]) || !std::isfinite(s.y[k])) continue;
      xr.add(s.x[k]);
      yr.add(s.y[k]);
    }
  }
  if (xr.empty()) xr = Range{0, 1};
  const std::vector<double> xt = nice_ticks(xr.lo, xr.hi, 8);
  const std::vector<double> yt = nice_ticks(yr.lo, yr.hi, 5);
  // The x axis spans the data (a period is not stretched to the next tick); y spans the ticks.
  double x0 = xr.lo, x1 = xr.hi;
  widen(x0, x1);
  const double y0 = yt.front(), y1 = yt.back();

  const double w = plot.width_px, h = plot.height_px;
  const double pw = w - kLeft - kRight, ph = h - kTop - kBottom;
  auto px = [&](double x) { return kLeft + (x - x0) / (x1 - x0) * pw; };
  auto py = [&](double y) { return kTop + (y1 - y) / (y1 - y0) * ph; };
  const double total_h = h + kLegendRow * static_cast<double>(series.size());

  std::string out = fmt::format(
      "<svg class=\"plot\" width=\"{}\" height=\"{}\" viewBox=\"0 0 {} {}\" role=\"img\" font-family=\"sans-serif\" "
      "font-size=\"11\">\n<title>{}</title>\n",
      plot.width_px, svg_number(total_h), plot.width_px, svg_number(total_h), escape_markup(plot.title));
  out += fmt::format("<text x=\"{}\" y=\"16\" font-size=\"13\" font-weight=\"bold\">{}</text>\n", svg_number(kLeft),
                     escape_markup(plot.title));
  out += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"#fff\" stroke=\"#888\"/>\n",
                     svg_number(kLeft), svg_number(kTop), svg_number(pw), svg_number(ph));
  for (double t : xt) {
    if (t < x0 - 1e-12 * (x1 - x0) || t > x1 + 1e-12 * (x1 - x0)) continue;
    const std::string x = svg_number(px(t));
    out += fmt::format("<line class=\"grid\" x1=\"{0}\" y1=\"{1}\" x2=\"{0}\" y2=\"{2}\" stroke=\"#e4e4e4\"/>\n", x,
                       svg_number(kTop), svg_number(kTop + ph));
    out += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"middle\">{}</text>\n", x, svg_number(kTop + ph + 14),
                       escape_markup(tick_label(t, plot.x_unit)));
  }
  for (double t : yt) {
    const std::string y = svg_number(py(t));
    out += fmt::format("<line class=\"grid\" x1=\"{0}\" y1=\"{1}\" x2=\"{2}\" y2=\"{1}\" stroke=\"{3}\"/>\n",
                       svg_number(kLeft), y, svg_number(kLeft + pw), t == 0 ? "#999" : "#e4e4e4");
    out += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"end\">{}</text>\n", svg_number(kLeft - 6),
                       svg_number(py(t) + 4), escape_markup(tick_label(t, plot.y_unit)));
  }
  out += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"middle\">{} ({})</text>\n", svg_number(kLeft + pw / 2),
                     svg_number(kTop + ph + 32), escape_markup(plot.x_label), escape_markup(plot.x_unit));
  out += fmt::format("<text x=\"14\" y=\"{0}\" text-anchor=\"middle\" transform=\"rotate(-90 14 {0})\">{1} ({2})</text>\n",
                     svg_number(kTop + ph / 2), escape_markup(plot.y_label), escape_markup(plot.y_unit));
  for (std::size_t i = 0; i < series.size(); ++i) {
    const PlotSeries& s = series[i];
    const char* colour = kColours[i % std::size(kColours)];
    const char* dash = kDashes[i % std::size(kDashes)];
    const std::string dash_attr = *dash != '\0' ? fmt::format(" stroke-dasharray=\"{}\"", dash) : "";
    std::string points;
    for (std::size_t k = 0; k < s.x.size(); ++k) {
      if (!std::isfinite(s.x[k]) || !std::isfinite(s.y[k])) continue;
      if (!points.empty()) points += ' ';
      points += svg_number(px(s.x[k])) + "," + svg_number(py(s.y[k]));
    }
    out += fmt::format("<polyline class=\"trace\" fill=\"none\" stroke=\"{}\" stroke-width=\"1.5\"{} points=\"{}\">"
                       "<title>{}</title></polyline>\n",
                       colour, dash_attr, points, escape_markup(s.label));
    const double ly = h + kLegendRow * static_cast<double>(i) + 4;
    out += fmt::format("<line x1=\"{0}\" y1=\"{1}\" x2=\"{2}\" y2=\"{1}\" stroke=\"{3}\" stroke-width=\"3\"{4}/>\n",
                       svg_number(kLeft), svg_number(ly), svg_number(kLeft + 24), colour, dash_attr);
    out += fmt::format("<text class=\"legend\" x=\"{}\" y=\"{}\">{}</text>\n", svg_number(kLeft + 30),
                       svg_number(ly + 4), escape_markup(s.label));
  }
  out += "</svg>\n";
  return out;
}

}  // namespace mainscheck::report
