#pragma once
// Engineering notation shared by rule messages and every report format, so a value reads the same
// in a finding's text and in the stress tables beside it.
#include <string>
#include <string_view>

namespace mainscheck::analysis {

/// Value with an SI prefix and unit, three significant digits: "339 V", "2.35 mA", "47 µF", "1500 V".
std::string format_si(double value, std::string_view unit);

}  // namespace mainscheck::analysis
