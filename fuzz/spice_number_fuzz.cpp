// libFuzzer entry for parse_spice_number: any byte string, checked against the reader's contract.
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
  return 0;
}
