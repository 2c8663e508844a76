#pragma once
// Engineering notation for reports: "339 V", "2.35 mA", "47 µF".
#include <string>
#include <string_view>

namespace mainscheck::report {

/// Value with an SI prefix and unit, three significant digits ("1.2 kΩ" style, µ for micro).
std::string format_si(double value, std::string_view unit);

/// A fraction as a signed percentage with one decimal ("-12.5 %").
std::string format_percent(double fraction);

}  // namespace mainscheck::report
