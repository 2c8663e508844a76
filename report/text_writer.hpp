#pragma once
// The terminal report: supply, blocks with their stress tables and findings, a summary, the caution.
#include <string>

#include "report/check_report.hpp"

namespace mainscheck::report {

/// Options of the text writer.
struct TextOptions {
  bool color = false;  // ANSI colours (the CLI enables them on a terminal without NO_COLOR)
};

/// Renders one check as text, newline-terminated.
std::string check_to_text(const CheckReport& r, const TextOptions& opts = {});

}  // namespace mainscheck::report
