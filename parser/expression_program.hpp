#pragma once
// Private to the expression evaluator: a SPICE parameter expression compiled to a flat program
// (postfix order, with jumps for `?:`, `&&`, `||` and `ternary_fcn`). Neither compiling nor running
// it recurses on the C++ stack, so the nesting limit bounds heap use only, whatever it is set to.
#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

namespace mainscheck::parser::expr_program {

/// Binary operators.
enum class BinOp { logical_or, logical_and, lt, le, gt, ge, eq, ne, add, sub, mul, div, mod, pow };

/// What one instruction does to the value stack.
enum class OpCode : std::uint8_t {
  number,        // push `value`
  name,          // push the parameter `text`, resolved when reached
  negate,        // x -> -x
  logical_not,   // x -> (x == 0)
  binary,        // a b -> a `bin` b
  or_jump,       // x != 0: replace by 1 and jump to `target`; else pop
  and_jump,      // x == 0: replace by 0 and jump to `target`; else pop
  to_bool,       // x -> (x != 0)
  jump_if_zero,  // pop x; x == 0: jump to `target`
  jump,          // jump to `target`
  check_call,    // the function `text` exists and takes `count` arguments (before they are evaluated)
  call,          // `count` arguments -> text(args...)
};

/// One instruction; `offset` is where its errors point in the expression text.
struct Op {
  OpCode code = OpCode::number;
  BinOp bin = BinOp::add;
  double value = 0.0;
  std::string text;  // name (lower case) or function name
  std::size_t count = 0;
  std::size_t target = 0;
  std::size_t offset = 0;
};

/// A syntax error or evaluation error with the byte offset it points at.
struct ExprError {
  std::size_t offset = 0;
  std::string message;
};

/// Compiles `text`. Nesting (parentheses plus `?` waiting for `:`) deeper than `max_depth` is an
/// error at the first level beyond it. Parse-time warnings (chained `**`, odd number tokens) are
/// appended to `warnings`. Throws ExprError.
std::vector<Op> compile(std::string_view text, std::size_t max_depth, std::vector<std::string>& warnings);

/// Operator spelling for messages.
const char* op_text(BinOp op);

}  // namespace mainscheck::parser::expr_program
