#pragma once
// Engineering notation for reports: "339 V", "2.35 mA", "47 µF"; margins as "-8.55 %" or "151× limit".
#include <string>
#include <string_view>

namespace mainscheck::report {

/// Value with an SI prefix and unit, three significant digits ("1.2 kΩ" style, µ for micro, A²s).
std::string format_si(double value, std::string_view unit);

/// A margin for a table cell: "-8.55 %", or beyond ±1000 % the ratio "151× limit".
std::string format_margin(double margin);
/// A margin in running text: "margin -8.55 %" or "151× the limit".
std::string margin_phrase(double margin);

}  // namespace mainscheck::report
