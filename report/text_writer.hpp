#pragma once
// The terminal report: supply, blocks with their stress tables and findings, a summary, the caution.
#include <string>

#include "report/check_report.hpp"

namespace mainscheck::report {

/// Options of the text writer.
struct TextOptions {
  bool color = false;        // ANSI colours (the CLI enables them on a terminal without NO_COLOR)
  bool parts_table = false;  // add the per-part rating table (check --parts-table)
};

/// Renders one check as text, newline-terminated.
std::string check_to_text(const CheckReport& r, const TextOptions& opts = {});

/// The batch summary that ends a text report of several netlists: one line per netlist with its
/// error, warning and note counts, verdict and time.
std::string batch_summary_text(const std::vector<const CheckReport*>& reports);

}  // namespace mainscheck::report
