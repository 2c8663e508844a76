#pragma once
// Turns the stress result's waveforms into the plots of the HTML report: per block one plot for
// each quantity (currents, voltages), and one for the switch-on inrush.
#include <string>
#include <vector>

#include "analysis/stress.hpp"
#include "report/svg_plot.hpp"

namespace mainscheck::report {

/// The plots of one block's steady-state waveforms (block id as in Waveform::block), currents first.
std::vector<Plot> block_plots(const analysis::StressResult& stress, const std::string& block_id,
                              const std::string& block_title);

/// The plot of the switch-on waveforms (Waveform::interval "inrush"); empty when there are none.
std::vector<Plot> inrush_plots(const analysis::StressResult& stress);

}  // namespace mainscheck::report
