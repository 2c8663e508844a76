#include "report/units.hpp"

#include "analysis/si_format.hpp"

namespace mainscheck::report {

std::string format_si(double value, std::string_view unit) { return analysis::format_si(value, unit); }

std::string format_margin(double margin) { return analysis::format_margin(margin); }

std::string margin_phrase(double margin) { return analysis::margin_phrase(margin); }

}  // namespace mainscheck::report
