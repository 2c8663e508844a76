#include "report/units.hpp"

#include "analysis/si_format.hpp"

#include <fmt/format.h>

#include <cmath>

namespace mainscheck::report {

std::string format_si(double value, std::string_view unit) { return analysis::format_si(value, unit); }

std::string format_percent(double fraction) { return fmt::format("{:.1f} %", fraction * 100.0); }

}  // namespace mainscheck::report
