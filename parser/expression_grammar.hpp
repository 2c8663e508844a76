#pragma once
// Private to the expression evaluator: the syntax tree of a SPICE parameter expression and the
// Spirit X3 parse that builds it. Not part of the parser library's public interface.
#include <boost/spirit/home/x3/support/ast/variant.hpp>

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace mainscheck::parser::expr_ast {

namespace x3 = boost::spirit::x3;

/// Byte range of a node in the expression text, filled in when the rule matches.
struct Span {
  std::size_t begin = 0;
  std::size_t end = 0;
};

/// Binary operators, grouped by precedence level in the grammar.
enum class BinOp { logical_or, logical_and, lt, le, gt, ge, eq, ne, add, sub, mul, div, mod, pow };

/// A numeric literal, already scaled by its SPICE suffix.
struct Number : Span {
  double value = 0.0;
};

/// A parameter reference, lower-cased.
struct Name : Span {
  std::string name;
};

struct Call;
struct Ternary;
struct Chain;
struct Unary;

/// Any expression node.
struct Node : x3::variant<Number, Name, x3::forward_ast<Call>, x3::forward_ast<Ternary>, x3::forward_ast<Chain>,
                          x3::forward_ast<Unary>> {
  using base_type::base_type;
  using base_type::operator=;
};

/// One `op rhs` step of a left-associative chain; `begin` is the operator's offset.
struct Step : Span {
  BinOp op = BinOp::add;
  Node rhs;
};

/// `first op rhs op rhs ...` evaluated left to right (one precedence level).
struct Chain : Span {
  Node first;
  std::vector<Step> rest;
};

/// Prefix operators (`-`, `+`, `!`, applied right to left) on an operand.
struct Unary : Span {
  std::string ops;
  Node operand;
};

/// `? then : else` part of a conditional.
struct TernaryStep : Span {
  Node then_branch;
  Node else_branch;
};

/// `c0 ? t1 : c1 ? t2 : e` — right-associative conditional, kept flat so that a long chain
/// does not nest.
struct Ternary : Span {
  Node first;
  std::vector<TernaryStep> rest;
};

/// `name(args...)`.
struct Call : Span {
  Name function;
  std::vector<Ternary> args;
};

/// A syntax error or evaluation error with the byte offset it points at.
struct ExprError {
  std::size_t offset = 0;
  std::string message;
};

/// Parses `text` into a tree. Checks nesting depth (parentheses plus open `?`) against `max_depth`
/// before the recursive descent starts, so hostile input cannot exhaust the stack. Parse-time
/// warnings (chained `**`, odd number tokens) are appended to `warnings`. Throws ExprError.
Ternary parse(std::string_view text, std::size_t max_depth, std::vector<std::string>& warnings);

}  // namespace mainscheck::parser::expr_ast
