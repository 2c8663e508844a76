#include "parser/attribute_value.hpp"

#include <array>
#include <cmath>

namespace mainscheck::parser {

namespace {

bool is_digit(char c) {
  return c >= '0' && c <= '9';
}

// Integers of up to 15 digits are exact in a double (2^53 > 10^15), so N/D is one correctly rounded
// division (IEEE 754-2019, 4.3). Bills of materials write 1/4, 1/8, 1/10; more digits are a slip.
constexpr std::size_t kMaxFractionDigits = 15;

}  // namespace

std::optional<LeadingFraction> read_leading_fraction(std::string_view text) {
  std::size_t i = 0;
  while (i < text.size() && is_digit(text[i])) ++i;
  if (i == 0 || i >= text.size() || text[i] != '/') return std::nullopt;
  const std::string_view numerator = text.substr(0, i);
  const std::size_t d_begin = ++i;
  while (i < text.size() && is_digit(text[i])) ++i;
  const std::string_view denominator = text.substr(d_begin, i - d_begin);
  LeadingFraction out;
  out.length = i;
  const std::string written(text.substr(0, i));
  if (denominator.empty()) {
    out.error = "fraction '" + written + "' has no denominator";
  } else if (numerator.size() > kMaxFractionDigits || denominator.size() > kMaxFractionDigits) {
    out.error = "fraction '" + written + "' has more than 15 digits above or below the line";
  } else if (denominator.find_first_not_of('0') == std::string_view::npos) {
    out.error = "fraction '" + written + "' divides by zero";
  } else {
    out.value = std::stod(std::string(numerator)) / std::stod(std::string(denominator));
  }
  return out;
}

std::vector<std::string_view> attr_unit_symbols(AttrUnit unit) {
  switch (unit) {
    case AttrUnit::volt:
      return {"V"};
    case AttrUnit::ampere:
      return {"A"};
    case AttrUnit::watt:
      return {"W"};
    case AttrUnit::joule:
      return {"J"};
    case AttrUnit::a2s:
      return {"A2s", "A\xC2\xB2s"};
    case AttrUnit::metre:
      return {"m"};
    // U+03A9 GREEK CAPITAL LETTER OMEGA and U+2126 OHM SIGN.
    case AttrUnit::ohm:
      return {"Ohm", "\xCE\xA9", "\xE2\x84\xA6"};
    case AttrUnit::degree:
      return {"deg", "\xC2\xB0"};
    case AttrUnit::text:
    case AttrUnit::percent:
      return {};
  }
  return {};
}

std::string_view attr_unit_symbol(AttrUnit unit) {
  const auto symbols = attr_unit_symbols(unit);
  return symbols.empty() ? std::string_view() : symbols.front();
}

std::string attribute_range_problem(const PartAttributeSpec& spec, double v) {
  const bool positive = spec.range == AttrRange::positive;
  if (std::isfinite(v) && (positive ? v > 0 : v >= 0)) return {};
  return positive ? "must be a finite number greater than zero" : "must be a finite number, zero or greater";
}

}  // namespace mainscheck::parser
