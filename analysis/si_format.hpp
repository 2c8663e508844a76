#pragma once
// Engineering notation shared by rule messages and every report format, so a value reads the same
// in a finding's text and in the stress tables beside it.
#include <string>
#include <string_view>

namespace mainscheck::analysis {

/// Value with an SI prefix and unit, three significant digits: "339 V", "2.35 mA", "47 µF", "1500 V".
/// "A2s" is written "A²s": every output is UTF-8, so there is one spelling.
std::string format_si(double value, std::string_view unit);

/// A margin (headroom as a fraction of the limit, negative when exceeded) for a table cell: a signed
/// percentage ("-8.55 %"), or beyond ±1000 % the ratio of the value to the limit ("151× limit"),
/// which reads better than a five-digit percentage.
std::string format_margin(double margin);
/// The same in running text: "margin -8.55 %" or "151× the limit".
std::string margin_phrase(double margin);

}  // namespace mainscheck::analysis
