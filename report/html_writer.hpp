#pragma once
// The HTML report: one self-contained page (inline CSS and SVG, no scripts, nothing fetched) with
// the caution, a summary, a block diagram, per-block stress tables, waveform plots and findings.
// Layout and guarantees: docs/report-html.md.
#include <string>
#include <vector>

#include "report/check_report.hpp"

namespace mainscheck::report {

/// Renders one check as a complete HTML document.
std::string check_to_html(const CheckReport& r);

/// Renders several checks (batch mode) as one HTML document, one section per netlist in the given order.
std::string checks_to_html(const std::vector<const CheckReport*>& reports);

}  // namespace mainscheck::report
