// libFuzzer entry for evaluate_expression and expression_names, checked against their contract.
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "parser/expression.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  using namespace mainscheck::parser;
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  // A few names are defined so that name lookups, not only errors, are exercised.
  const NameResolver resolve = [](std::string_view name) -> NameValue {
    if (name == "a") return {2.5, ""};
    if (name == "b") return {-1.0, ""};
    if (name == "z") return {0.0, ""};
    return {};
  };
  const ExprResult r = evaluate_expression(text, resolve, 64);
  if (r.value.has_value() == !r.error.empty()) __builtin_trap();
  if (r.value && !std::isfinite(*r.value)) __builtin_trap();
  if (r.error_offset > text.size()) __builtin_trap();
  const auto names = expression_names(text);
  // Every name a valid expression uses is one the evaluator could ask for.
  for (const auto& n : names) {
    if (n.empty()) __builtin_trap();
  }
  return 0;
}
