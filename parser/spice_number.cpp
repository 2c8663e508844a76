#include "parser/spice_number.hpp"

#include <fmt/format.h>

#include <array>
#include <charconv>
#include <cmath>
#include <system_error>

#include "parser/attribute_value.hpp"

namespace mainscheck::parser {
namespace {

bool is_digit(char c) { return c >= '0' && c <= '9'; }
bool is_alpha(char c) { return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z'); }
char lower(char c) { return (c >= 'A' && c <= 'Z') ? static_cast<char>(c - 'A' + 'a') : c; }

bool starts_with_ci(std::string_view text, std::size_t pos, std::string_view word) {
  if (text.size() - pos < word.size()) return false;
  for (std::size_t i = 0; i < word.size(); ++i) {
    if (lower(text[pos + i]) != word[i]) return false;
  }
  return true;
}

// The micro sign U+00B5 in UTF-8; ngspice maps it to `u` (checklist item 16).
constexpr std::string_view kMicroSign = "\xC2\xB5";

struct Scale {
  std::string_view spelling;  // lower case as matched in the text
  std::string_view name;      // reported in SpiceNumber::suffix
  int exponent;               // power of ten; MIL is handled separately
  bool mil;
};

// SPICE3 scale suffixes (checklist item 18), longest spelling first so MEG and MIL win over M.
constexpr std::array<Scale, 11> kScales{{
    {"meg", "meg", 6, false},
    {"mil", "mil", 0, true},
    {"t", "t", 12, false},
    {"g", "g", 9, false},
    {"k", "k", 3, false},
    {"m", "m", -3, false},
    {"u", "u", -6, false},
    {kMicroSign, "u", -6, false},
    {"n", "n", -9, false},
    {"p", "p", -12, false},
    {"f", "f", -15, false},
}};

// 1 mil = 0.001 inch = 25.4e-6 (inch = 25.4 mm exactly, ISO 31-1 / NIST SP 811).
constexpr double kMil = 25.4e-6;

constexpr long long kExponentClamp = 100000;  // far beyond double range, small enough not to overflow

bool is_tail_char(char c) { return is_alpha(c) || is_digit(c) || c == '_'; }

// Decimal order of magnitude of the mantissa digits (position of the first non-zero digit
// relative to the decimal point), used to tell overflow from underflow.
long long mantissa_order(std::string_view int_digits, std::string_view frac_digits) {
  for (std::size_t i = 0; i < int_digits.size(); ++i) {
    if (int_digits[i] != '0') return static_cast<long long>(int_digits.size() - i);
  }
  for (std::size_t i = 0; i < frac_digits.size(); ++i) {
    if (frac_digits[i] != '0') return -static_cast<long long>(i);
  }
  return 0;
}

// The number-like word at the start of `token`, for messages: inside an expression the token
// runs on into operators (`1e+ + 2`), which should not be quoted as part of the number.
std::string_view word_of(std::string_view token) {
  std::size_t i = 0;
  while (i < token.size()) {
    const char c = token[i];
    const bool exp_sign = (c == '+' || c == '-') && i > 0 && (token[i - 1] == 'e' || token[i - 1] == 'E');
    if (!(is_tail_char(c) || c == '.' || exp_sign || (i == 0 && (c == '+' || c == '-')))) break;
    ++i;
  }
  return token.substr(0, i == 0 ? std::min<std::size_t>(token.size(), 1) : i);
}

bool all_zero(std::string_view digits) { return digits.find_first_not_of('0') == std::string_view::npos; }

}  // namespace

bool looks_numeric(std::string_view token) {
  std::size_t i = 0;
  if (i < token.size() && (token[i] == '+' || token[i] == '-')) ++i;
  if (i < token.size() && token[i] == '.') ++i;
  return i < token.size() && is_digit(token[i]);
}

SpiceNumber parse_spice_number(std::string_view token) {
  SpiceNumber out;
  if (!looks_numeric(token)) {
    out.error = fmt::format("'{}' is not a number", word_of(token));
    return out;
  }
  std::size_t pos = 0;
  bool negative = false;
  if (token[pos] == '+' || token[pos] == '-') negative = token[pos++] == '-';

  const std::size_t int_begin = pos;
  while (pos < token.size() && is_digit(token[pos])) ++pos;
  const std::string_view int_digits = token.substr(int_begin, pos - int_begin);
  std::string_view frac_digits;
  bool has_point = false;
  if (pos < token.size() && token[pos] == '.') {
    has_point = true;
    const std::size_t frac_begin = ++pos;
    while (pos < token.size() && is_digit(token[pos])) ++pos;
    frac_digits = token.substr(frac_begin, pos - frac_begin);
  }
  // ngspice silently stops at a second '.', reading `1..5` as 1; we refuse (checklist item 25).
  if (pos < token.size() && token[pos] == '.') {
    out.length = pos + 1;
    out.error = fmt::format("malformed number '{}': unexpected second '.'", word_of(token));
    return out;
  }

  long long exponent = 0;
  bool has_exponent = false;
  if (pos < token.size() && (token[pos] == 'e' || token[pos] == 'E')) {
    has_exponent = true;
    std::size_t p = pos + 1;
    bool exp_negative = false;
    if (p < token.size() && (token[p] == '+' || token[p] == '-')) exp_negative = token[p++] == '-';
    const std::size_t exp_begin = p;
    while (p < token.size() && is_digit(token[p])) {
      exponent = std::min(exponent * 10 + (token[p] - '0'), kExponentClamp);
      ++p;
    }
    if (p == exp_begin) {
      out.length = p;
      out.error = fmt::format("malformed number '{}': exponent has no digits", word_of(token));
      return out;
    }
    if (exp_negative) exponent = -exponent;
    pos = p;
  }
  const std::size_t number_end = pos;

  const Scale* scale = nullptr;
  for (const Scale& s : kScales) {
    if (starts_with_ci(token, pos, s.spelling)) {
      scale = &s;
      pos += s.spelling.size();
      break;
    }
  }
  const std::size_t suffix_end = pos;
  while (pos < token.size() && is_tail_char(token[pos])) ++pos;
  const std::string_view tail = token.substr(suffix_end, pos - suffix_end);
  if (pos < token.size() && token[pos] == '.') {
    out.length = pos + 1;
    out.error = fmt::format("malformed number '{}': unexpected '.' after the value", word_of(token));
    return out;
  }
  out.length = pos;
  if (scale) out.suffix = std::string(scale->name);
  out.ignored = std::string(tail);

  const long long total_exp = exponent + (scale && !scale->mil ? scale->exponent : 0);
  double magnitude = 0.0;
  if (!all_zero(int_digits) || !all_zero(frac_digits)) {
    // Folding the suffix into the decimal exponent gives the correctly rounded value
    // (`2.2meg` is exactly the double nearest 2.2e6, not 2.2 * 1e6).
    std::string text;
    text.reserve(int_digits.size() + frac_digits.size() + 24);
    text.append(int_digits.empty() ? "0" : int_digits);
    text.push_back('.');
    text.append(frac_digits);
    text.push_back('e');
    text.append(std::to_string(total_exp));
    const auto [ptr, ec] = std::from_chars(text.data(), text.data() + text.size(), magnitude);
    if (ec == std::errc::result_out_of_range) {
      if (mantissa_order(int_digits, frac_digits) + total_exp > 0) {
        out.error = fmt::format("number '{}' is too large for a double", token.substr(0, out.length));
        return out;
      }
      magnitude = 0.0;
      out.warning = fmt::format("number '{}' is too small for a double and reads as 0", token.substr(0, out.length));
    } else if (ec != std::errc() || ptr != text.data() + text.size()) {
      out.error = fmt::format("malformed number '{}'", word_of(token));
      return out;
    }
    if (scale && scale->mil) magnitude *= kMil;
  }
  if (!std::isfinite(magnitude)) {
    out.error = fmt::format("number '{}' is too large for a double", token.substr(0, out.length));
    return out;
  }
  out.value = negative ? -magnitude : magnitude;

  const std::string_view read_as = token.substr(0, suffix_end);
  const bool tail_has_digit = tail.find_first_of("0123456789") != std::string_view::npos;
  if (tail_has_digit) {
    // RKM notation (`2k2`, `4u7`, `2R5`): SPICE reads number + suffix and ignores the rest.
    std::string hint;
    const bool plain_integer = !has_point && !has_exponent;
    const bool digits_only = tail.find_first_not_of("0123456789") == std::string_view::npos;
    if (plain_integer && scale && digits_only) {
      hint = fmt::format("; write {}{}.{}{} if that was meant", negative ? "-" : "", int_digits, tail,
                         token.substr(number_end, suffix_end - number_end));
    } else if (plain_integer && !scale && tail.size() > 1 && (tail[0] == 'r' || tail[0] == 'R') &&
               tail.substr(1).find_first_not_of("0123456789") == std::string_view::npos) {
      hint = fmt::format("; write {}{}.{} if that was meant", negative ? "-" : "", int_digits, tail.substr(1));
    }
    out.warning = fmt::format("'{}' read as {} = {} (SPICE ignores what follows the scale suffix){}",
                              token.substr(0, out.length), read_as, *out.value, hint);
  } else if (!scale && tail.size() == 1 && (lower(tail[0]) == 'a' || lower(tail[0]) == 'x')) {
    out.warning = fmt::format("'{}' read as {}: '{}' is not a SPICE scale suffix and is ignored",
                              token.substr(0, out.length), *out.value, tail);
  }
  return out;
}

AttributeReading parse_spice_attribute(std::string_view text, AttrUnit unit) {
  AttributeReading out;
  std::size_t number_end = 0;  // where the unit symbol may start
  if (const auto f = read_leading_fraction(text)) {
    if (!f->value) {
      out.error = f->error;
      return out;
    }
    out.value = f->value;
    number_end = f->length;
  } else {
    const SpiceNumber n = parse_spice_number(text);
    if (!n.value) {
      out.error = n.error;
      return out;
    }
    out.value = n.value;
    number_end = n.length - n.ignored.size();
  }
  const std::string_view rest = text.substr(number_end);
  if (rest.empty()) return out;
  // SPICE is case-insensitive, so `250v` and `2ma` are accepted as they would be in a value.
  for (const std::string_view symbol : attr_unit_symbols(unit)) {
    if (rest.size() != symbol.size()) continue;
    bool same = true;
    for (std::size_t i = 0; i < rest.size(); ++i) same = same && lower(rest[i]) == lower(symbol[i]);
    if (same) return out;
  }
  const std::string_view symbol = attr_unit_symbol(unit);
  out.value.reset();
  out.error =
      fmt::format("unexpected '{}' after the number {}{}", rest, text.substr(0, number_end),
                  symbol.empty() ? std::string() : fmt::format("; only the unit {} may follow it", symbol));
  out.error_offset = number_end;
  return out;
}

}  // namespace mainscheck::parser
