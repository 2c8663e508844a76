#include "parser/expression_program.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <optional>
#include <utility>

#include "parser/spice_number.hpp"

namespace mainscheck::parser::expr_program {
namespace {

bool is_space(char c) {
  return c == ' ' || c == '\t' || c == '\r' || c == '\n' || c == '\v' || c == '\f';
}
bool is_ident_start(char c) {
  return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c == '_';
}
bool is_ident_char(char c) {
  return is_ident_start(c) || (c >= '0' && c <= '9');
}

// Binding strength, loose to tight (checklist item 70, adjusted to what ngspice-39 does): `?:`
// (right-associative, below all of these); ||; &&; comparisons; + -; * / %; unary - + ! (looser
// than power: ngspice-39 gives -2**2 = -4); `**`/`^` (left-associative); a sign on an exponent
// (2**-1), which applies to the exponent's primary only.
enum Level : int { kAny = 0, kOr, kAnd, kCmp, kAdd, kMul, kUnary, kPow, kPowUnary };

int level_of(BinOp op) {
  switch (op) {
    case BinOp::logical_or:
      return kOr;
    case BinOp::logical_and:
      return kAnd;
    case BinOp::lt:
    case BinOp::le:
    case BinOp::gt:
    case BinOp::ge:
    case BinOp::eq:
    case BinOp::ne:
      return kCmp;
    case BinOp::add:
    case BinOp::sub:
      return kAdd;
    case BinOp::mul:
    case BinOp::div:
    case BinOp::mod:
      return kMul;
    case BinOp::pow:
      return kPow;
  }
  return kAny;
}

/// The binary operator at the start of `s`, longest spelling first, with its length.
std::optional<std::pair<BinOp, std::size_t>> binary_at(std::string_view s) {
  static constexpr std::pair<std::string_view, BinOp> kOps[] = {
      {"**", BinOp::pow}, {"||", BinOp::logical_or}, {"&&", BinOp::logical_and}, {"<=", BinOp::le},
      {">=", BinOp::ge},  {"==", BinOp::eq},         {"!=", BinOp::ne},          {"<", BinOp::lt},
      {">", BinOp::gt},   {"+", BinOp::add},         {"-", BinOp::sub},          {"*", BinOp::mul},
      {"/", BinOp::div},  {"%", BinOp::mod},         {"^", BinOp::pow}};
  for (const auto& [text, op] : kOps) {
    if (s.substr(0, text.size()) == text) return std::pair{op, text.size()};
  }
  return std::nullopt;
}

/// A `**` chain being read: where its first operand begins and each `** operand` step's span, for
/// the warning about chained powers.
struct PowerChain {
  std::size_t begin = 0;
  std::vector<std::pair<std::size_t, std::size_t>> steps;
};

/// An operator waiting for its right operand, or a barrier: `(`, a call's `(`, `?` waiting for
/// its `:`, or `:` waiting for the end of its else branch.
struct Pending {
  enum class Kind { binary, unary, group, call, question, colon } kind = Kind::binary;
  BinOp op = BinOp::add;
  char sign = 0;  // unary: '-', '+' or '!'
  int level = kAny;
  std::size_t offset = 0;  // the operator, the '(' or the function name
  std::size_t jump = 0;    // instruction to patch when this closes (short circuit, `?:`, ternary_fcn)
  std::size_t jump2 = 0;   // ternary_fcn: the jump over its else argument
  std::size_t check = 0;   // call: its check_call instruction
  std::size_t args = 0;    // call: arguments read so far
  PowerChain chain;        // `**` only
};

/// What the missing operand was wanted for, which decides the error's words and place.
struct OperandWanted {
  enum class Kind { start, expression, operand, call_open, call_comma } kind = Kind::start;
  std::size_t comma = 0;  // call_comma: where the comma is
  bool after_pow = false;
};

Op make_op(OpCode code, std::size_t offset = 0, std::string text = {}) {
  Op op;
  op.code = code;
  op.offset = offset;
  op.text = std::move(text);
  return op;
}

Pending make_pending(Pending::Kind kind, std::size_t offset) {
  Pending p;
  p.kind = kind;
  p.offset = offset;
  return p;
}

class Compiler {
 public:
  Compiler(std::string_view text, std::vector<std::string>& warnings) : t_(text), warnings_(warnings) {}

  std::vector<Op> run() {
    skip();
    if (i_ == t_.size()) throw ExprError{0, "empty expression"};
    OperandWanted wanted;
    bool operand_next = true;
    for (;;) {
      skip();
      if (operand_next) {
        const std::optional<OperandWanted> next = operand(wanted);
        operand_next = next.has_value();
        if (next) wanted = *next;
        continue;
      }
      if (i_ == t_.size()) break;
      if (const auto bin = binary_at(t_.substr(i_))) {
        push_binary(bin->first);
        i_ += bin->second;
        wanted = {OperandWanted::Kind::operand, 0, bin->first == BinOp::pow};
        operand_next = true;
      } else if (t_[i_] == '?') {
        reduce(kAny);
        Pending q = make_pending(Pending::Kind::question, i_++);
        q.jump = emit(make_op(OpCode::jump_if_zero));
        stack_.push_back(std::move(q));
        wanted = {OperandWanted::Kind::expression, 0, false};
        operand_next = true;
      } else if (t_[i_] == ':') {
        close_else_branches();
        if (stack_.empty() || stack_.back().kind != Pending::Kind::question) chain_end_error();
        Pending& q = stack_.back();
        const std::size_t over_else = emit(make_op(OpCode::jump));
        code_[q.jump].target = code_.size();
        q.kind = Pending::Kind::colon;
        q.jump = over_else;
        ++i_;
        wanted = {OperandWanted::Kind::operand, 0, false};
        operand_next = true;
      } else if (t_[i_] == ')') {
        close_else_branches();
        if (stack_.empty() ||
            (stack_.back().kind != Pending::Kind::group && stack_.back().kind != Pending::Kind::call))
          chain_end_error();
        ++stack_.back().args;
        close_parenthesis();
      } else if (t_[i_] == ',') {
        close_else_branches();
        if (stack_.empty() || stack_.back().kind != Pending::Kind::call) chain_end_error();
        next_argument();
        wanted = {OperandWanted::Kind::call_comma, i_++, false};
        operand_next = true;
      } else {
        chain_end_error();
      }
    }
    close_else_branches();
    if (!stack_.empty()) chain_end_error();  // a `?` without its `:`
    return std::move(code_);
  }

 private:
  void skip() {
    while (i_ < t_.size() && is_space(t_[i_])) ++i_;
  }

  std::size_t emit(Op op) {
    code_.push_back(std::move(op));
    return code_.size() - 1;
  }

  std::string found_at(std::size_t at) const {
    return at >= t_.size() ? "end of expression" : fmt::format("'{}'", t_.substr(at));
  }

  void add_warning(std::string w) {
    // Report each warning once, in order of appearance.
    if (std::find(warnings_.begin(), warnings_.end(), w) == warnings_.end())
      warnings_.push_back(std::move(w));
  }

  /// Reads signs and one primary; after `(` or `name(` returns what the operand inside is wanted as.
  std::optional<OperandWanted> operand(const OperandWanted& wanted) {
    const std::size_t start = i_;
    if (wanted.kind == OperandWanted::Kind::call_open && i_ < t_.size() && t_[i_] == ')') {
      close_parenthesis();  // a call without arguments
      return std::nullopt;
    }
    while (i_ < t_.size() && (t_[i_] == '-' || t_[i_] == '+' || t_[i_] == '!')) {
      Pending u = make_pending(Pending::Kind::unary, i_);
      u.sign = t_[i_++];
      u.level = wanted.after_pow ? kPowUnary : kUnary;
      stack_.push_back(std::move(u));
      skip();
    }
    const std::string_view rest = t_.substr(i_);
    if (!rest.empty() && rest.front() == '(') {
      stack_.push_back(make_pending(Pending::Kind::group, i_++));
      return OperandWanted{OperandWanted::Kind::expression, 0, false};
    }
    if (!rest.empty() && looks_numeric(rest)) {
      number(rest);
      return std::nullopt;
    }
    if (rest.empty() || !is_ident_start(rest.front())) missing_operand(wanted, start);
    const std::size_t begin = i_;
    std::string name;
    while (i_ < t_.size() && is_ident_char(t_[i_])) name.push_back(to_lower_ascii(t_[i_++]));
    const std::size_t end = i_;
    skip();
    if (i_ < t_.size() && t_[i_] == '(') {
      Pending c = make_pending(Pending::Kind::call, begin);
      c.check = emit(make_op(OpCode::check_call, begin, name));
      stack_.push_back(std::move(c));
      ++i_;
      return OperandWanted{OperandWanted::Kind::call_open, 0, false};
    }
    i_ = end;
    emit(make_op(OpCode::name, begin, std::move(name)));
    primary_done(begin, end);
    return std::nullopt;
  }

  static char to_lower_ascii(char c) { return (c >= 'A' && c <= 'Z') ? static_cast<char>(c - 'A' + 'a') : c; }

  /// An unsigned SPICE number with suffix (`470k`, `1e3`, `.5`); signs are unary operators here.
  void number(std::string_view rest) {
    const std::size_t offset = i_;
    const SpiceNumber n = parse_spice_number(rest);
    const std::string_view token = rest.substr(0, std::max<std::size_t>(n.length, 1));
    if (!n.value) throw ExprError{offset, n.error};
    if (n.ignored.find_first_of("0123456789") != std::string::npos) {
      // ngspice-39 rejects `{2k2}` inside an expression ("Misplaced operator"), so do we.
      const std::size_t hint = n.warning.find("; write ");
      throw ExprError{offset,
                      fmt::format("'{}' is not a valid number in an expression (ngspice-39 rejects it too){}",
                                  token, hint == std::string::npos ? "" : n.warning.substr(hint))};
    }
    if (!n.warning.empty()) add_warning(n.warning);
    Op op = make_op(OpCode::number, offset);
    op.value = *n.value;
    emit(std::move(op));
    i_ += n.length;
    primary_done(offset, i_);
  }

  void primary_done(std::size_t begin, std::size_t end) {
    primary_begin_ = begin;
    operand_end_ = end;
  }

  [[noreturn]] void missing_operand(const OperandWanted& wanted, std::size_t start) const {
    switch (wanted.kind) {
      case OperandWanted::Kind::start:
        throw ExprError{start, fmt::format("expected an expression at '{}'", t_.substr(start))};
      case OperandWanted::Kind::expression:
        throw ExprError{start, fmt::format("expected an expression but found {}", found_at(start))};
      case OperandWanted::Kind::operand:
        throw ExprError{start, fmt::format("expected an operand but found {}", found_at(start))};
      case OperandWanted::Kind::call_open:
        throw ExprError{start, fmt::format("expected ')' but found {}", found_at(start))};
      case OperandWanted::Kind::call_comma:
        // An argument list stops before a comma that no argument follows.
        throw ExprError{wanted.comma, fmt::format("expected ')' but found {}", found_at(wanted.comma))};
    }
    throw ExprError{start, "expected an operand"};
  }

  /// The expression (or the innermost parenthesis, argument or `?` branch) ended at `i_` with
  /// something that cannot follow it.
  [[noreturn]] void chain_end_error() const {
    for (auto it = stack_.rbegin(); it != stack_.rend(); ++it) {
      if (it->kind == Pending::Kind::question)
        throw ExprError{i_, fmt::format("expected ':' but found {}", found_at(i_))};
      if (it->kind == Pending::Kind::group || it->kind == Pending::Kind::call)
        throw ExprError{i_, fmt::format("expected ')' but found {}", found_at(i_))};
    }
    throw ExprError{i_, fmt::format("unexpected '{}' after the expression", t_.substr(i_))};
  }

  void push_binary(BinOp op) {
    const int level = level_of(op);
    std::optional<PowerChain> left = reduce(level, op == BinOp::pow);
    Pending b = make_pending(Pending::Kind::binary, i_);
    b.op = op;
    b.level = level;
    if (op == BinOp::logical_or || op == BinOp::logical_and)
      b.jump = emit(make_op(op == BinOp::logical_or ? OpCode::or_jump : OpCode::and_jump));
    if (op == BinOp::pow) b.chain = left ? std::move(*left) : PowerChain{primary_begin_, {}};
    stack_.push_back(std::move(b));
  }

  /// Emits the pending operators that bind at least as tightly as `level`. With `continuing_pow`
  /// a `**` reduced on the way is the left operand of the next one, and its chain is handed back.
  std::optional<PowerChain> reduce(int level, bool continuing_pow = false) {
    std::optional<PowerChain> carried;
    while (!stack_.empty()) {
      Pending& p = stack_.back();
      if ((p.kind != Pending::Kind::binary && p.kind != Pending::Kind::unary) || p.level < level) break;
      if (p.kind == Pending::Kind::unary) {
        if (p.sign != '+') emit(make_op(p.sign == '-' ? OpCode::negate : OpCode::logical_not, p.offset));
      } else if (p.op == BinOp::logical_or || p.op == BinOp::logical_and) {
        emit(make_op(OpCode::to_bool));
        code_[p.jump].target = code_.size();
      } else {
        Op bin = make_op(OpCode::binary, p.offset);
        bin.bin = p.op;
        emit(std::move(bin));
        if (p.op == BinOp::pow) {
          p.chain.steps.emplace_back(p.offset, operand_end_);
          if (continuing_pow)
            carried = std::move(p.chain);
          else
            warn_chained_power(p.chain);
        }
      }
      stack_.pop_back();
    }
    return carried;
  }

  /// Closes every operator and finished `?:` else branch above the innermost open barrier.
  void close_else_branches() {
    reduce(kAny);
    while (!stack_.empty() && stack_.back().kind == Pending::Kind::colon) {
      code_[stack_.back().jump].target = code_.size();
      stack_.pop_back();
      reduce(kAny);
    }
  }

  /// `)` at `i_` closes the group or call on top of the stack.
  void close_parenthesis() {
    Pending p = std::move(stack_.back());
    stack_.pop_back();
    if (p.kind == Pending::Kind::call) {
      code_[p.check].count = p.args;
      if (code_[p.check].text == "ternary_fcn" && p.args == 3) {
        code_[p.jump2].target = code_.size();  // the chosen branch's value is the result
      } else {
        Op call = make_op(OpCode::call, p.offset, code_[p.check].text);
        call.count = p.args;
        emit(std::move(call));
      }
    }
    ++i_;
    primary_done(p.offset, i_);
  }

  /// `,` between a call's arguments; ternary_fcn(c, t, e) evaluates only the branch it takes.
  void next_argument() {
    Pending& c = stack_.back();
    ++c.args;
    if (code_[c.check].text != "ternary_fcn") return;
    if (c.args == 1) {
      c.jump = emit(make_op(OpCode::jump_if_zero));
    } else if (c.args == 2) {
      c.jump2 = emit(make_op(OpCode::jump));
      code_[c.jump].target = code_.size();
    }
  }

  /// Warns about `a**b**c`: ngspice-39 evaluates it as (a**b)**c (checked: 2**3**2 = 64).
  void warn_chained_power(const PowerChain& chain) {
    if (chain.steps.size() < 2) return;
    auto source = [&](std::size_t b, std::size_t e) {
      std::string_view s = t_.substr(b, e - b);
      while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
      return s;
    };
    std::string grouped(chain.steps.size() - 1, '(');
    grouped += source(chain.begin, chain.steps.front().first);
    for (std::size_t i = 0; i < chain.steps.size(); ++i) {
      grouped += source(chain.steps[i].first, chain.steps[i].second);
      if (i + 1 < chain.steps.size()) grouped += ')';
    }
    add_warning(fmt::format("'{}' is evaluated left to right as {}, like ngspice; add parentheses",
                            source(chain.begin, chain.steps.back().second), grouped));
  }

  std::string_view t_;
  std::vector<std::string>& warnings_;
  std::size_t i_ = 0;
  std::vector<Op> code_;
  std::vector<Pending> stack_;
  std::size_t primary_begin_ = 0;  // where the last primary read began
  std::size_t operand_end_ = 0;    // and where it ended
};

// Nesting the parse would see: open parentheses plus `?` still waiting for `:`. Also catches
// unbalanced parentheses with a precise offset before the compiler gives a vaguer message.
void check_nesting(std::string_view text, std::size_t max_depth) {
  std::vector<std::size_t> open;  // offsets of unclosed '('
  std::size_t open_conditionals = 0;
  for (std::size_t i = 0; i < text.size(); ++i) {
    const char c = text[i];
    if (c == '(' || c == '?') {
      if (c == '(')
        open.push_back(i);
      else
        ++open_conditionals;
      if (open.size() + open_conditionals > max_depth) {
        throw ExprError{i, fmt::format("expression nests deeper than the limit of {} levels", max_depth)};
      }
    } else if (c == ')') {
      if (open.empty()) throw ExprError{i, "unbalanced parentheses: ')' has no matching '('"};
      open.pop_back();
    } else if (c == ':' && open_conditionals > 0) {
      --open_conditionals;
    }
  }
  if (!open.empty()) throw ExprError{open.back(), "unbalanced parentheses: '(' is never closed"};
}

}  // namespace

const char* op_text(BinOp op) {
  switch (op) {
    case BinOp::logical_or:
      return "||";
    case BinOp::logical_and:
      return "&&";
    case BinOp::lt:
      return "<";
    case BinOp::le:
      return "<=";
    case BinOp::gt:
      return ">";
    case BinOp::ge:
      return ">=";
    case BinOp::eq:
      return "==";
    case BinOp::ne:
      return "!=";
    case BinOp::add:
      return "+";
    case BinOp::sub:
      return "-";
    case BinOp::mul:
      return "*";
    case BinOp::div:
      return "/";
    case BinOp::mod:
      return "%";
    case BinOp::pow:
      return "**";
  }
  return "?";
}

std::vector<Op> compile(std::string_view text, std::size_t max_depth, std::vector<std::string>& warnings) {
  check_nesting(text, max_depth);
  return Compiler(text, warnings).run();
}

}  // namespace mainscheck::parser::expr_program
