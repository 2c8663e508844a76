#include "parser/expression.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <span>

#include "parser/expression_grammar.hpp"
#include "parser/limits.hpp"

namespace mainscheck::parser {
namespace {

using expr_ast::BinOp;
using expr_ast::ExprError;

/// A built-in function: its argument count and how it is evaluated.
struct Function {
  std::string_view name;
  std::size_t min_args;
  std::size_t max_args;
  enum class Kind { math, nominal, conditional } kind = Kind::math;
};

constexpr Function kFunctions[] = {
    {"abs", 1, 1},   {"acos", 1, 1},  {"agauss", 2, 3, Function::Kind::nominal},
    {"asin", 1, 1},  {"atan", 1, 1},  {"aunif", 2, 2, Function::Kind::nominal},
    {"ceil", 1, 1},  {"cos", 1, 1},   {"cosh", 1, 1},
    {"exp", 1, 1},   {"floor", 1, 1}, {"gauss", 2, 3, Function::Kind::nominal},
    {"int", 1, 1},   {"limit", 2, 2, Function::Kind::nominal},
    {"log", 1, 1},   {"log10", 1, 1}, {"max", 2, 2},
    {"min", 2, 2},   {"nint", 1, 1},  {"pow", 2, 2},
    {"pwr", 2, 2},   {"sgn", 1, 1},   {"sin", 1, 1},
    {"sinh", 1, 1},  {"sqrt", 1, 1},  {"tan", 1, 1},
    {"tanh", 1, 1},  {"ternary_fcn", 3, 3, Function::Kind::conditional},
    {"unif", 2, 2, Function::Kind::nominal},
};

const Function* find_function(std::string_view name) {
  for (const Function& f : kFunctions) {
    if (f.name == name) return &f;
  }
  return nullptr;
}

/// Round half to even, as ngspice-39's nint does (checked: nint(2.5) = 2, nint(3.5) = 4,
/// nint(-2.5) = -2); written out so it does not depend on the floating-point rounding mode.
double round_half_even(double x) {
  const double r = std::round(x);  // half away from zero
  if (std::abs(x - std::trunc(x)) == 0.5) return 2.0 * std::round(x / 2.0);
  return r;
}

std::string fmt_args(std::span<const double> args) {
  std::string s;
  for (std::size_t i = 0; i < args.size(); ++i) s += fmt::format("{}{}", i ? ", " : "", args[i]);
  return s;
}

double apply_math(std::string_view fn, std::span<const double> a, std::size_t offset) {
  const double x = a[0];
  auto domain = [&](const char* what) {
    return ExprError{offset, fmt::format("{} in {}({})", what, fn, fmt_args(a))};
  };
  if (fn == "sqrt") {
    if (x < 0) throw domain("square root of a negative value");
    return std::sqrt(x);
  }
  if (fn == "log" || fn == "log10") {
    if (x <= 0) throw domain("logarithm of a non-positive value");
    return fn == "log" ? std::log(x) : std::log10(x);
  }
  if (fn == "asin" || fn == "acos") {
    if (x < -1 || x > 1) throw domain("argument outside [-1, 1]");
    return fn == "asin" ? std::asin(x) : std::acos(x);
  }
  if (fn == "exp") return std::exp(x);
  if (fn == "abs") return std::abs(x);
  if (fn == "floor") return std::floor(x);
  if (fn == "ceil") return std::ceil(x);
  if (fn == "int") return std::trunc(x);  // ngspice-39: int(-2.7) = -2
  if (fn == "nint") return round_half_even(x);
  if (fn == "sgn") return x > 0 ? 1.0 : (x < 0 ? -1.0 : 0.0);
  if (fn == "sin") return std::sin(x);
  if (fn == "cos") return std::cos(x);
  if (fn == "tan") return std::tan(x);
  if (fn == "atan") return std::atan(x);
  if (fn == "sinh") return std::sinh(x);
  if (fn == "cosh") return std::cosh(x);
  if (fn == "tanh") return std::tanh(x);
  if (fn == "min") return std::min(x, a[1]);
  if (fn == "max") return std::max(x, a[1]);
  if (fn == "pow") {
    if (x == 0 && a[1] < 0) throw domain("zero raised to a negative power");
    return std::pow(x, a[1]);  // ngspice-39: pow(-2,3) = -8, pow(-8,1/3) is an error
  }
  if (fn == "pwr") {
    if (x == 0 && a[1] < 0) throw domain("zero raised to a negative power");
    return std::pow(std::abs(x), a[1]);  // ngspice-39: pwr(-2,3) = 8, pwr(-3,1) = 3, i.e. |x|^y
  }
  throw ExprError{offset, fmt::format("unknown function '{}'", fn)};
}

const char* op_text(BinOp op) {
  switch (op) {
    case BinOp::logical_or: return "||";
    case BinOp::logical_and: return "&&";
    case BinOp::lt: return "<";
    case BinOp::le: return "<=";
    case BinOp::gt: return ">";
    case BinOp::ge: return ">=";
    case BinOp::eq: return "==";
    case BinOp::ne: return "!=";
    case BinOp::add: return "+";
    case BinOp::sub: return "-";
    case BinOp::mul: return "*";
    case BinOp::div: return "/";
    case BinOp::mod: return "%";
    case BinOp::pow: return "**";
  }
  return "?";
}

/// Walks the tree; recursion depth is bounded by the nesting the parser already checked.
class Evaluator {
 public:
  Evaluator(const NameResolver& resolve, std::vector<std::string>& warnings)
      : resolve_(resolve), warnings_(warnings) {}

  double eval(const expr_ast::Node& node) {
    return boost::apply_visitor([this](const auto& n) { return this->eval_node(n); }, node);
  }

  double eval_node(const expr_ast::Ternary& t) {
    // c0 ? t1 : c1 ? t2 : e — only the chosen branch is evaluated, as in ngspice (0?1/0:3 = 3).
    const expr_ast::Node* cond = &t.first;
    for (const auto& step : t.rest) {
      if (eval(*cond) != 0.0) return eval(step.then_branch);
      cond = &step.else_branch;
    }
    return eval(*cond);
  }

 private:
  double eval_node(const expr_ast::Number& n) { return n.value; }

  double eval_node(const expr_ast::Name& n) {
    NameValue v = resolve_ ? resolve_(n.name) : NameValue{};
    if (!v.value) {
      throw ExprError{n.begin, v.error.empty() ? fmt::format("undefined parameter '{}'", n.name) : v.error};
    }
    if (!std::isfinite(*v.value)) throw ExprError{n.begin, fmt::format("parameter '{}' is not finite", n.name)};
    return *v.value;
  }

  double eval_node(const expr_ast::Unary& u) {
    double x = eval(u.operand);
    for (auto it = u.ops.rbegin(); it != u.ops.rend(); ++it) {
      if (*it == '-') x = -x;
      else if (*it == '!') x = (x == 0.0) ? 1.0 : 0.0;
    }
    return x;
  }

  double eval_node(const expr_ast::Chain& c) {
    double acc = eval(c.first);
    for (const auto& step : c.rest) {
      if (step.op == BinOp::logical_or || step.op == BinOp::logical_and) {
        // Short-circuit like ngspice-39 (1||1/0 = 1); the result is 0 or 1.
        const bool lhs = acc != 0.0;
        if (step.op == BinOp::logical_or ? lhs : !lhs) {
          acc = lhs ? 1.0 : 0.0;
        } else {
          acc = eval(step.rhs) != 0.0 ? 1.0 : 0.0;
        }
        continue;
      }
      acc = binary(step, acc, eval(step.rhs));
    }
    return acc;
  }

  double binary(const expr_ast::Step& step, double a, double b) {
    double r = 0.0;
    switch (step.op) {
      case BinOp::lt: r = a < b; break;
      case BinOp::le: r = a <= b; break;
      case BinOp::gt: r = a > b; break;
      case BinOp::ge: r = a >= b; break;
      case BinOp::eq: r = a == b; break;
      case BinOp::ne: r = a != b; break;
      case BinOp::add: r = a + b; break;
      case BinOp::sub: r = a - b; break;
      case BinOp::mul: r = a * b; break;
      case BinOp::div:
        if (b == 0.0) throw ExprError{step.begin, fmt::format("division by zero in {} / {}", a, b)};
        r = a / b;
        break;
      case BinOp::mod:
        if (b == 0.0) throw ExprError{step.begin, fmt::format("division by zero in {} % {}", a, b)};
        r = std::fmod(a, b);  // ngspice-39: -7%3 = -1
        break;
      case BinOp::pow:
        // ngspice-39 raises the magnitude of the base: (-2)**3 = 8, (-8)**(1/3) = 2.
        if (a == 0.0 && b < 0.0) {
          throw ExprError{step.begin, fmt::format("zero raised to a negative power in {} ** {}", a, b)};
        }
        if (a < 0.0) {
          warn(fmt::format("({}) ** {} is evaluated as {} ** {} = {}, like ngspice; use pow() for a signed power", a,
                           b, -a, b, std::pow(-a, b)));
        }
        r = std::pow(std::abs(a), b);
        break;
      case BinOp::logical_or:
      case BinOp::logical_and: break;
    }
    if (!std::isfinite(r)) {
      throw ExprError{step.begin, fmt::format("result of {} {} {} is not finite", a, op_text(step.op), b)};
    }
    return r;
  }

  double eval_node(const expr_ast::Call& c) {
    const Function* f = find_function(c.function.name);
    if (!f) throw ExprError{c.begin, fmt::format("unknown function '{}'", c.function.name)};
    // ngspice-39 silently misreads wrong counts (sqrt(4,9) = 3, min(3,1,2) = 2, pow(2) = 1); we refuse.
    if (c.args.size() < f->min_args || c.args.size() > f->max_args) {
      const std::string count = f->min_args == f->max_args ? std::to_string(f->min_args)
                                                            : fmt::format("{} to {}", f->min_args, f->max_args);
      throw ExprError{c.begin, fmt::format("function '{}' takes {} argument{}, {} given", f->name, count,
                                           f->max_args == 1 ? "" : "s", c.args.size())};
    }
    if (f->kind == Function::Kind::conditional) {
      return eval_node(c.args[0]) != 0.0 ? eval_node(c.args[1]) : eval_node(c.args[2]);
    }
    std::vector<double> args;
    args.reserve(c.args.size());
    for (const auto& a : c.args) args.push_back(eval_node(a));
    if (f->kind == Function::Kind::nominal) {
      warn(fmt::format("{}({}) is evaluated at its nominal value {}; random variation is not modelled", f->name,
                       fmt_args(args), args[0]));
      return args[0];
    }
    const double r = apply_math(f->name, args, c.begin);
    if (!std::isfinite(r)) {
      throw ExprError{c.begin, fmt::format("result of {}({}) is not finite", f->name, fmt_args(args))};
    }
    return r;
  }

  void warn(std::string w) {
    if (std::find(warnings_.begin(), warnings_.end(), w) == warnings_.end()) warnings_.push_back(std::move(w));
  }

  const NameResolver& resolve_;
  std::vector<std::string>& warnings_;
};

/// Collects names in order of first use; the tree depth is bounded by the parse.
class NameCollector {
 public:
  explicit NameCollector(std::vector<std::string>& out) : out_(out) {}
  void visit(const expr_ast::Node& node) {
    boost::apply_visitor([this](const auto& n) { this->visit_node(n); }, node);
  }
  void visit_node(const expr_ast::Ternary& t) {
    visit(t.first);
    for (const auto& s : t.rest) {
      visit(s.then_branch);
      visit(s.else_branch);
    }
  }

 private:
  void visit_node(const expr_ast::Number&) {}
  void visit_node(const expr_ast::Name& n) {
    if (std::find(out_.begin(), out_.end(), n.name) == out_.end()) out_.push_back(n.name);
  }
  void visit_node(const expr_ast::Unary& u) { visit(u.operand); }
  void visit_node(const expr_ast::Chain& c) {
    visit(c.first);
    for (const auto& s : c.rest) visit(s.rhs);
  }
  void visit_node(const expr_ast::Call& c) {
    for (const auto& a : c.args) visit_node(a);
  }
  std::vector<std::string>& out_;
};

}  // namespace

ExprResult evaluate_expression(std::string_view text, const NameResolver& resolve, std::size_t max_depth) {
  ExprResult result;
  try {
    const expr_ast::Ternary tree = expr_ast::parse(text, max_depth, result.warnings);
    Evaluator ev(resolve, result.warnings);
    result.value = ev.eval_node(tree);
  } catch (const ExprError& e) {
    result.value.reset();
    result.error = e.message;
    result.error_offset = std::min(e.offset, text.size());
  }
  return result;
}

std::vector<std::string> expression_names(std::string_view text) {
  std::vector<std::string> names;
  std::vector<std::string> ignored_warnings;
  try {
    const expr_ast::Ternary tree = expr_ast::parse(text, ReadLimits{}.max_expression_depth, ignored_warnings);
    NameCollector(names).visit_node(tree);
  } catch (const ExprError&) {
    names.clear();  // a malformed expression is reported when it is evaluated
  }
  return names;
}

}  // namespace mainscheck::parser
