#pragma once
// The safety-review checklist in Markdown: every rule applied with its verdict per block, the
// measured values and basis, and blank sign-off fields, for pasting into a review ticket.
#include <string>

#include "report/check_report.hpp"

namespace mainscheck::report {

/// The checklist of one checked netlist, newline-terminated.
std::string check_to_markdown(const CheckReport& r);

}  // namespace mainscheck::report
