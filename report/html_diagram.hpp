#pragma once
// The block diagram of the HTML report: the mains as a box, each recognised block as a box with its
// parts by role and its nets, arrows from whatever feeds a block and out to its outputs.
#include <string>

#include "report/check_report.hpp"

namespace mainscheck::report {

/// An inline `<svg>` block diagram of the recognised front-end; empty when nothing was recognised.
std::string block_diagram_svg(const CheckReport& r);

}  // namespace mainscheck::report
