#include "parser/xml_values.hpp"

#include <array>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <system_error>

#include "parser/attribute_value.hpp"

namespace mainscheck::parser {
namespace {

bool is_digit(char c) { return c >= '0' && c <= '9'; }
bool is_xml_space(char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\n'; }

struct Prefix {
  std::string_view spelling;
  int exponent;
};

// SI prefixes from tera to femto (SI Brochure, 9th edition, table 7); both micro signs are
// accepted (U+00B5 MICRO SIGN and U+03BC GREEK SMALL LETTER MU), `u` for keyboards without them.
constexpr std::array<Prefix, 11> kPrefixes{{
    {"T", 12},
    {"G", 9},
    {"M", 6},
    {"k", 3},
    {"m", -3},
    {"u", -6},
    {"\xC2\xB5", -6},
    {"\xCE\xBC", -6},
    {"n", -9},
    {"p", -12},
    {"f", -15},
}};

struct UnitSpelling {
  std::string_view spelling;
  XmlUnit unit;
};

// Ω as U+03A9 GREEK CAPITAL LETTER OMEGA and as U+2126 OHM SIGN; ² is U+00B2.
constexpr std::array<UnitSpelling, 16> kUnits{{
    {"Ohm", XmlUnit::ohm},
    {"ohm", XmlUnit::ohm},
    {"\xCE\xA9", XmlUnit::ohm},
    {"\xE2\x84\xA6", XmlUnit::ohm},
    {"F", XmlUnit::farad},
    {"H", XmlUnit::henry},
    {"V", XmlUnit::volt},
    {"A", XmlUnit::ampere},
    {"W", XmlUnit::watt},
    {"J", XmlUnit::joule},
    {"Hz", XmlUnit::hertz},
    {"s", XmlUnit::second},
    {"m", XmlUnit::metre},
    {"A2s", XmlUnit::a2s},
    {"A\xC2\xB2s", XmlUnit::a2s},
    {"%", XmlUnit::percent},
}};

std::optional<XmlUnit> unit_of(std::string_view spelling) {
  for (const auto& u : kUnits) {
    if (u.spelling == spelling) return u.unit;
  }
  return std::nullopt;
}

// Does a written unit symbol fit the expected unit? Free attributes take any symbol.
bool unit_fits(XmlUnit written, XmlUnit expected) { return expected == XmlUnit::any || written == expected; }

XmlValue fail(std::string msg, std::size_t offset) {
  XmlValue r;
  r.error = std::move(msg);
  r.error_offset = offset;
  return r;
}

std::string expected_phrase(XmlUnit unit) {
  if (unit == XmlUnit::none) return "a plain number without a unit";
  return "a value in " + std::string(xml_unit_symbol(unit));
}

// Hints for spellings that SPICE users carry over; SPICE reads them differently or not at all.
std::string suffix_hint(std::string_view suffix) {
  std::string lower;
  for (char c : suffix) lower += (c >= 'A' && c <= 'Z') ? static_cast<char>(c - 'A' + 'a') : c;
  if (lower.rfind("meg", 0) == 0) return "; MEG is SPICE notation, write M for mega";
  if (!suffix.empty() && suffix[0] == 'K') return "; write k for kilo";
  if (!suffix.empty() && suffix[0] == 'U') return "; write u or \xC2\xB5 for micro";
  if (lower.rfind("mil", 0) == 0) return "; mil is not an SI prefix";
  return "";
}

}  // namespace

std::string_view xml_unit_symbol(XmlUnit unit) {
  switch (unit) {
    case XmlUnit::none: return "";
    case XmlUnit::ohm: return "Ohm";
    case XmlUnit::farad: return "F";
    case XmlUnit::henry: return "H";
    case XmlUnit::volt: return "V";
    case XmlUnit::ampere: return "A";
    case XmlUnit::watt: return "W";
    case XmlUnit::joule: return "J";
    case XmlUnit::hertz: return "Hz";
    case XmlUnit::second: return "s";
    case XmlUnit::metre: return "m";
    case XmlUnit::a2s: return "A2s";
    case XmlUnit::percent: return "%";
    case XmlUnit::any: return "";
  }
  return "";
}

XmlValue parse_xml_value(std::string_view text, XmlUnit unit) {
  std::size_t begin = 0;
  std::size_t end = text.size();
  while (begin < end && is_xml_space(text[begin])) ++begin;
  while (end > begin && is_xml_space(text[end - 1])) --end;
  if (begin == end) return fail("the value is empty", begin);

  std::size_t i = begin;
  std::string number;  // sign, mantissa and exponent as written, for one correctly rounded conversion
  if (text[i] == '+' || text[i] == '-') {
    if (text[i] == '-') number += '-';
    ++i;
  }
  const std::size_t mantissa_start = i;
  std::size_t digits = 0;
  while (i < end && is_digit(text[i])) number += text[i++], ++digits;
  if (i < end && text[i] == '.') {
    number += text[i++];
    while (i < end && is_digit(text[i])) number += text[i++], ++digits;
  }
  if (digits == 0) return fail("'" + std::string(text.substr(begin, end - begin)) + "' is not a number", mantissa_start);
  if (i + 1 < end && text[i] == ',' && is_digit(text[i + 1]))
    return fail("',' is not a decimal separator; write '.'", i);

  long long exponent = 0;
  bool has_exponent = false;
  if (i < end && (text[i] == 'e' || text[i] == 'E')) {
    const std::size_t e_pos = i++;
    bool negative = false;
    if (i < end && (text[i] == '+' || text[i] == '-')) negative = text[i++] == '-';
    const std::size_t exp_digits = i;
    while (i < end && is_digit(text[i])) {
      if (exponent < 100000) exponent = exponent * 10 + (text[i] - '0');
      ++i;
    }
    if (i == exp_digits) return fail("the exponent after 'e' has no digits", e_pos);
    if (negative) exponent = -exponent;
    has_exponent = true;
  }

  // SI style puts a space between number and unit (SI Brochure 5.4.3); accept it, not require it.
  const std::size_t number_end = i;
  while (i < end && text[i] == ' ') ++i;
  const std::string_view suffix = text.substr(i, end - i);
  const std::size_t suffix_pos = i;

  int prefix_exp = 0;
  std::string_view unit_text;
  if (const std::string hint = suffix_hint(suffix); !hint.empty() && !unit_of(suffix))
    return fail("unknown prefix or unit '" + std::string(suffix) + "'" + hint, suffix_pos);
  if (!suffix.empty()) {
    // A bare symbol that is the expected unit wins over a prefix: for lengths `3m` is 3 metres.
    const auto whole = unit_of(suffix);
    const bool whole_fits = whole && (unit_fits(*whole, unit) && !(unit == XmlUnit::any && *whole == XmlUnit::metre));
    if (whole_fits) {
      unit_text = suffix;
    } else {
      const Prefix* prefix = nullptr;
      for (const auto& p : kPrefixes) {
        if (suffix.substr(0, p.spelling.size()) == p.spelling) {
          prefix = &p;
          break;
        }
      }
      if (prefix != nullptr) {
        prefix_exp = prefix->exponent;
        unit_text = suffix.substr(prefix->spelling.size());
        const std::size_t after = suffix_pos + prefix->spelling.size();
        if (!unit_text.empty() && is_digit(unit_text[0])) {
          // RKM style (2k2, 4u7) as printed on parts; SI writes the decimal point.
          std::size_t n = 0;
          while (n < unit_text.size() && is_digit(unit_text[n])) ++n;
          return fail("digits after the prefix '" + std::string(prefix->spelling) + "'; write " +
                          std::string(text.substr(begin, number_end - begin)) + "." +
                          std::string(unit_text.substr(0, n)) + std::string(prefix->spelling) +
                          std::string(unit_text.substr(n)),
                      after);
        }
        if (has_exponent) return fail("an exponent and a prefix together; write one of them", suffix_pos);
        if (unit == XmlUnit::percent) return fail("a prefix on a percentage", suffix_pos);
        if (!unit_text.empty()) {
          const auto u = unit_of(unit_text);
          if (!u) {
            return fail("unknown unit '" + std::string(unit_text) + "' after the prefix '" +
                            std::string(prefix->spelling) + "'" + suffix_hint(suffix),
                        after);
          }
          if (!unit_fits(*u, unit) || *u == XmlUnit::percent)
            return fail("unit '" + std::string(unit_text) + "' does not fit; expected " + expected_phrase(unit), after);
        }
      } else if (whole) {
        return fail("unit '" + std::string(suffix) + "' does not fit; expected " + expected_phrase(unit), suffix_pos);
      } else {
        return fail("unknown prefix or unit '" + std::string(suffix) + "'" + suffix_hint(suffix), suffix_pos);
      }
    }
  }

  number += 'e';
  number += std::to_string(exponent + prefix_exp);
  double v = 0;
  const auto [ptr, ec] = std::from_chars(number.data(), number.data() + number.size(), v);
  if (ec == std::errc::result_out_of_range || (ec == std::errc() && !std::isfinite(v)))
    return fail("the number is out of range", mantissa_start);
  if (ec != std::errc() || ptr != number.data() + number.size())
    return fail("'" + std::string(text.substr(begin, end - begin)) + "' is not a number", mantissa_start);

  // Percentages follow docs/attributes.md: the number is in percent with or without the sign.
  if (unit == XmlUnit::percent || unit_of(unit_text) == XmlUnit::percent) v /= 100.0;
  XmlValue r;
  r.value = v;
  return r;
}

XmlValue parse_xml_attribute(std::string_view text, XmlUnit unit) {
  std::size_t begin = 0;
  while (begin < text.size() && is_xml_space(text[begin])) ++begin;
  const auto f = read_leading_fraction(text.substr(begin));
  if (!f) return parse_xml_value(text, unit);
  if (!f->value) return fail(f->error, begin);
  // The unit after the fraction is checked by reading it after a 1: any prefix would change that 1.
  const std::size_t unit_at = begin + f->length;
  const XmlValue one = parse_xml_value("1" + std::string(text.substr(unit_at)), unit);
  if (!one.value) return fail(one.error, unit_at + (one.error_offset > 0 ? one.error_offset - 1 : 0));
  if (*one.value != 1.0 && unit != XmlUnit::percent)
    return fail("a prefix after the fraction '" + std::string(text.substr(begin, f->length)) + "'", unit_at);
  XmlValue r;
  r.value = *f->value * *one.value;
  return r;
}

std::string format_xml_number(double v) {
  std::array<char, 64> buf{};
  const auto res = std::to_chars(buf.data(), buf.data() + buf.size(), v);
  return std::string(buf.data(), res.ptr);
}

}  // namespace mainscheck::parser
