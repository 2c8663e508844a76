#include "report/html_plots.hpp"

#include <functional>

namespace mainscheck::report {

namespace {

/// One plot per quantity of the waveforms selected by `take`, in the order the quantities first appear.
std::vector<Plot> plots_of(const analysis::StressResult& stress, const std::string& title,
                           const std::function<bool(const analysis::Waveform&)>& take) {
  std::vector<Plot> out;
  for (const char* quantity : {"current", "voltage"}) {
    Plot p;
    for (const auto& w : stress.waveforms) {
      if (!take(w) || w.quantity != quantity) continue;
      if (p.series.empty()) {
        p.y_label = quantity;
        p.y_unit = w.unit;
        p.x_label = w.interval == "inrush" ? "time after switch-on" : "time over one period";
      }
      p.series.push_back(PlotSeries{w.name + ", " + w.corner, w.t_s, w.values});
    }
    if (p.series.empty()) continue;
    p.title = title + ": " + quantity + (p.series.size() > 1 ? "s" : "");
    out.push_back(std::move(p));
  }
  return out;
}

}  // namespace

std::vector<Plot> block_plots(const analysis::StressResult& stress, const std::string& block_id,
                              const std::string& block_title) {
  return plots_of(stress, block_title, [&](const analysis::Waveform& w) {
    return w.block == block_id && w.interval == "period";
  });
}

std::vector<Plot> inrush_plots(const analysis::StressResult& stress) {
  return plots_of(stress, "switch-on at the instant of the largest supply peak",
                  [](const analysis::Waveform& w) { return w.interval == "inrush"; });
}

}  // namespace mainscheck::report
