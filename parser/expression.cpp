#include "parser/expression.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <span>

#include "parser/expression_program.hpp"
#include "parser/limits.hpp"

namespace mainscheck::parser {
namespace {

using expr_program::BinOp;
using expr_program::ExprError;
using expr_program::Op;
using expr_program::op_text;
using expr_program::OpCode;

/// A built-in function: its argument count and how it is evaluated.
struct Function {
  std::string_view name;
  std::size_t min_args;
  std::size_t max_args;
  enum class Kind { math, nominal, conditional } kind = Kind::math;
};

constexpr Function kFunctions[] = {
    {"abs", 1, 1},
    {"acos", 1, 1},
    {"agauss", 2, 3, Function::Kind::nominal},
    {"asin", 1, 1},
    {"atan", 1, 1},
    {"aunif", 2, 2, Function::Kind::nominal},
    {"ceil", 1, 1},
    {"cos", 1, 1},
    {"cosh", 1, 1},
    {"exp", 1, 1},
    {"floor", 1, 1},
    {"gauss", 2, 3, Function::Kind::nominal},
    {"int", 1, 1},
    {"limit", 2, 2, Function::Kind::nominal},
    {"log", 1, 1},
    {"log10", 1, 1},
    {"max", 2, 2},
    {"min", 2, 2},
    {"nint", 1, 1},
    {"pow", 2, 2},
    {"pwr", 2, 2},
    {"sgn", 1, 1},
    {"sin", 1, 1},
    {"sinh", 1, 1},
    {"sqrt", 1, 1},
    {"tan", 1, 1},
    {"tanh", 1, 1},
    {"ternary_fcn", 3, 3, Function::Kind::conditional},
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

/// Runs a compiled expression on a value stack of its own: no recursion, whatever the nesting.
class Evaluator {
 public:
  Evaluator(const NameResolver& resolve, std::vector<std::string>& warnings)
      : resolve_(resolve), warnings_(warnings) {}

  double run(const std::vector<Op>& code) {
    std::vector<double> st;
    const auto pop = [&st] {
      const double x = st.back();
      st.pop_back();
      return x;
    };
    for (std::size_t pc = 0; pc < code.size();) {
      const Op& op = code[pc++];
      switch (op.code) {
        case OpCode::number:
          st.push_back(op.value);
          break;
        case OpCode::name:
          st.push_back(name(op));
          break;
        case OpCode::negate:
          st.back() = -st.back();
          break;
        case OpCode::logical_not:
          st.back() = st.back() == 0.0 ? 1.0 : 0.0;
          break;
        case OpCode::binary: {
          const double b = pop();
          st.back() = binary(op, st.back(), b);
          break;
        }
        // Short-circuit like ngspice-39 (1||1/0 = 1, 0&&1/0 = 0); the result is 0 or 1.
        case OpCode::or_jump:
          if (st.back() != 0.0) {
            st.back() = 1.0;
            pc = op.target;
          } else {
            st.pop_back();
          }
          break;
        case OpCode::and_jump:
          if (st.back() == 0.0) {
            st.back() = 0.0;
            pc = op.target;
          } else {
            st.pop_back();
          }
          break;
        case OpCode::to_bool:
          st.back() = st.back() != 0.0 ? 1.0 : 0.0;
          break;
        // Only the chosen branch of `?:` is evaluated, as in ngspice (0?1/0:3 = 3).
        case OpCode::jump_if_zero:
          if (pop() == 0.0) pc = op.target;
          break;
        case OpCode::jump:
          pc = op.target;
          break;
        case OpCode::check_call:
          check_call(op);
          break;
        case OpCode::call: {
          const std::vector<double> args(st.end() - static_cast<std::ptrdiff_t>(op.count), st.end());
          st.resize(st.size() - op.count);
          st.push_back(call(op, args));
          break;
        }
      }
    }
    return st.back();
  }

 private:
  double name(const Op& n) {
    NameValue v = resolve_ ? resolve_(n.text) : NameValue{};
    if (!v.value) {
      throw ExprError{n.offset, v.error.empty() ? fmt::format("undefined parameter '{}'", n.text) : v.error};
    }
    if (!std::isfinite(*v.value))
      throw ExprError{n.offset, fmt::format("parameter '{}' is not finite", n.text)};
    return *v.value;
  }

  double binary(const Op& step, double a, double b) {
    double r = 0.0;
    switch (step.bin) {
      case BinOp::lt:
        r = a < b;
        break;
      case BinOp::le:
        r = a <= b;
        break;
      case BinOp::gt:
        r = a > b;
        break;
      case BinOp::ge:
        r = a >= b;
        break;
      case BinOp::eq:
        r = a == b;
        break;
      case BinOp::ne:
        r = a != b;
        break;
      case BinOp::add:
        r = a + b;
        break;
      case BinOp::sub:
        r = a - b;
        break;
      case BinOp::mul:
        r = a * b;
        break;
      case BinOp::div:
        if (b == 0.0) throw ExprError{step.offset, fmt::format("division by zero in {} / {}", a, b)};
        r = a / b;
        break;
      case BinOp::mod:
        if (b == 0.0) throw ExprError{step.offset, fmt::format("division by zero in {} % {}", a, b)};
        r = std::fmod(a, b);  // ngspice-39: -7%3 = -1
        break;
      case BinOp::pow:
        // ngspice-39 raises the magnitude of the base: (-2)**3 = 8, (-8)**(1/3) = 2.
        if (a == 0.0 && b < 0.0) {
          throw ExprError{step.offset, fmt::format("zero raised to a negative power in {} ** {}", a, b)};
        }
        if (a < 0.0) {
          warn(fmt::format(
              "({}) ** {} is evaluated as {} ** {} = {}, like ngspice; use pow() for a signed power", a, b,
              -a, b, std::pow(-a, b)));
        }
        r = std::pow(std::abs(a), b);
        break;
      case BinOp::logical_or:
      case BinOp::logical_and:
        break;
    }
    if (!std::isfinite(r)) {
      throw ExprError{step.offset, fmt::format("result of {} {} {} is not finite", a, op_text(step.bin), b)};
    }
    return r;
  }

  static void check_call(const Op& c) {
    const Function* f = find_function(c.text);
    if (!f) throw ExprError{c.offset, fmt::format("unknown function '{}'", c.text)};
    // ngspice-39 silently misreads wrong counts (sqrt(4,9) = 3, min(3,1,2) = 2, pow(2) = 1); we refuse.
    if (c.count < f->min_args || c.count > f->max_args) {
      const std::string count = f->min_args == f->max_args
                                    ? std::to_string(f->min_args)
                                    : fmt::format("{} to {}", f->min_args, f->max_args);
      throw ExprError{c.offset, fmt::format("function '{}' takes {} argument{}, {} given", f->name, count,
                                            f->max_args == 1 ? "" : "s", c.count)};
    }
  }

  double call(const Op& c, std::span<const double> args) {
    const Function* f = find_function(c.text);  // checked by check_call
    if (f->kind == Function::Kind::nominal) {
      warn(fmt::format("{}({}) is evaluated at its nominal value {}; random variation is not modelled",
                       f->name, fmt_args(args), args[0]));
      return args[0];
    }
    const double r = apply_math(f->name, args, c.offset);
    if (!std::isfinite(r)) {
      throw ExprError{c.offset, fmt::format("result of {}({}) is not finite", f->name, fmt_args(args))};
    }
    return r;
  }

  void warn(std::string w) {
    if (std::find(warnings_.begin(), warnings_.end(), w) == warnings_.end())
      warnings_.push_back(std::move(w));
  }

  const NameResolver& resolve_;
  std::vector<std::string>& warnings_;
};

}  // namespace

ExprResult evaluate_expression(std::string_view text, const NameResolver& resolve, std::size_t max_depth) {
  ExprResult result;
  try {
    const std::vector<Op> code = expr_program::compile(text, max_depth, result.warnings);
    result.value = Evaluator(resolve, result.warnings).run(code);
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
    for (const Op& op : expr_program::compile(text, ReadLimits{}.max_expression_depth, ignored_warnings)) {
      if (op.code == OpCode::name && std::find(names.begin(), names.end(), op.text) == names.end())
        names.push_back(op.text);
    }
  } catch (const ExprError&) {
    names.clear();  // a malformed expression is reported when it is evaluated
  }
  return names;
}

}  // namespace mainscheck::parser
