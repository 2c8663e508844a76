// libFuzzer entry for parse_spice_number and the strict attribute reader parse_spice_attribute:
// any byte string, checked against the readers' contracts.
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "parser/spice_number.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  const std::string_view token(reinterpret_cast<const char*>(data), size);
  const mainscheck::parser::SpiceNumber n = mainscheck::parser::parse_spice_number(token);
  // Exactly one of value and error; values are always finite; never reads past the token.
  if (n.value.has_value() == !n.error.empty()) __builtin_trap();
  if (n.value && !std::isfinite(*n.value)) __builtin_trap();
  if (n.length > token.size()) __builtin_trap();
  if (n.value && !mainscheck::parser::looks_numeric(token)) __builtin_trap();
  if (n.value && n.length == 0) __builtin_trap();
  // The attribute reader (ratings, docs/attributes.md): a finite value or an error inside the token;
  // it never accepts more than the number reader does, except a leading fraction N/D.
  for (const auto unit : {mainscheck::parser::AttrUnit::watt, mainscheck::parser::AttrUnit::ohm}) {
    const mainscheck::parser::AttributeReading a = mainscheck::parser::parse_spice_attribute(token, unit);
    if (a.value.has_value() == !a.error.empty()) __builtin_trap();
    if (a.value && !std::isfinite(*a.value)) __builtin_trap();
    if (a.error_offset > token.size()) __builtin_trap();
    if (a.value && !n.value && token.find('/') == std::string_view::npos) __builtin_trap();
  }
  return 0;
}
