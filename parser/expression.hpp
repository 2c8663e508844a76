#pragma once
// Evaluator for SPICE parameter expressions (`{rload/2}`, `'2*rz+1'`), compiled to a flat program
// and run on a value stack (expression_program.hpp), so no nesting depth can exhaust the C++ stack.
// Names are resolved through a callback so the caller controls scoping and cycles.
#include <cstddef>
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace mainscheck::parser {

/// Result of resolving one name: a value, or an error text that becomes the expression's error.
struct NameValue {
  std::optional<double> value;
  std::string error;  // empty + no value = "undefined parameter 'x'"
};

/// Resolves a lower-case parameter name in the caller's scope.
using NameResolver = std::function<NameValue(std::string_view name)>;

/// Outcome of an evaluation: value or error, with the byte offset (in `text`) the error points at.
struct ExprResult {
  std::optional<double> value;
  std::string error;
  std::size_t error_offset = 0;
  std::vector<std::string> warnings;  // e.g. "2**3**2 is evaluated left to right as (2**3)**2, like ngspice"
};

/// Evaluates an expression body without its delimiters (the text between `{}` or `''`).
/// Supports the operators and functions of checklist items 70–71; numbers take SPICE suffixes.
ExprResult evaluate_expression(std::string_view text, const NameResolver& resolve, std::size_t max_depth = 256);

/// Lower-case names an expression refers to (not function names), in order of first use.
std::vector<std::string> expression_names(std::string_view text);

}  // namespace mainscheck::parser
