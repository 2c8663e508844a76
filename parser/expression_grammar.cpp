#include "parser/expression_grammar.hpp"

#include <boost/fusion/include/adapt_struct.hpp>
#include <boost/spirit/home/x3.hpp>
#include <fmt/format.h>

#include <algorithm>
#include <type_traits>

#include "parser/spice_number.hpp"

BOOST_FUSION_ADAPT_STRUCT(mainscheck::parser::expr_ast::Step, op, rhs)
BOOST_FUSION_ADAPT_STRUCT(mainscheck::parser::expr_ast::Chain, first, rest)
BOOST_FUSION_ADAPT_STRUCT(mainscheck::parser::expr_ast::Unary, ops, operand)
BOOST_FUSION_ADAPT_STRUCT(mainscheck::parser::expr_ast::TernaryStep, then_branch, else_branch)
BOOST_FUSION_ADAPT_STRUCT(mainscheck::parser::expr_ast::Ternary, first, rest)
BOOST_FUSION_ADAPT_STRUCT(mainscheck::parser::expr_ast::Call, function, args)

namespace mainscheck::parser::expr_ast {
namespace {

using It = const char*;

/// What the grammar's custom parsers and annotations need besides the input.
struct ParseState {
  It begin = nullptr;
  std::vector<std::string>* warnings = nullptr;
};
struct StateTag;

template <typename Context>
ParseState& state_of(const Context& ctx) {
  return *x3::get<StateTag>(ctx);
}

void add_warning(std::vector<std::string>& warnings, std::string w) {
  // Backtracking may revisit a token; report each warning once, in order of appearance.
  if (std::find(warnings.begin(), warnings.end(), w) == warnings.end()) warnings.push_back(std::move(w));
}

/// Records each matched node's byte range (after the skipper), for error offsets and warnings.
struct annotate_span {
  template <typename Iterator, typename Attribute, typename Context>
  void on_success(const Iterator& first, const Iterator& last, Attribute& attr, const Context& ctx) const {
    if constexpr (std::is_base_of_v<Span, Attribute>) {
      const ParseState& st = state_of(ctx);
      attr.begin = static_cast<std::size_t>(first - st.begin);
      attr.end = static_cast<std::size_t>(last - st.begin);
    }
  }
};

bool is_ident_start(char c) { return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c == '_'; }
bool is_ident_char(char c) { return is_ident_start(c) || (c >= '0' && c <= '9'); }

/// An unsigned SPICE number with suffix (`470k`, `1e3`, `.5`); signs are unary operators here.
struct NumberParser : x3::parser<NumberParser> {
  using attribute_type = Number;
  static bool const has_attribute = true;

  template <typename Context, typename RContext, typename Attribute>
  bool parse(It& first, const It& last, const Context& ctx, RContext&, Attribute& attr) const {
    x3::skip_over(first, last, ctx);
    if (first == last || *first == '+' || *first == '-') return false;
    const std::string_view rest(first, static_cast<std::size_t>(last - first));
    if (!looks_numeric(rest)) return false;
    ParseState& st = state_of(ctx);
    const std::size_t offset = static_cast<std::size_t>(first - st.begin);
    const SpiceNumber n = parse_spice_number(rest);
    const std::string_view token = rest.substr(0, std::max<std::size_t>(n.length, 1));
    if (!n.value) throw ExprError{offset, n.error};
    if (n.ignored.find_first_of("0123456789") != std::string::npos) {
      // ngspice-39 rejects `{2k2}` inside an expression ("Misplaced operator"), so do we.
      const std::size_t hint = n.warning.find("; write ");
      throw ExprError{offset, fmt::format("'{}' is not a valid number in an expression (ngspice-39 rejects it too){}",
                                          token, hint == std::string::npos ? "" : n.warning.substr(hint))};
    }
    if (!n.warning.empty()) add_warning(*st.warnings, n.warning);
    Number result;
    result.value = *n.value;
    result.begin = offset;
    result.end = offset + n.length;
    first += n.length;
    x3::traits::move_to(result, attr);
    return true;
  }
};

/// A parameter or function name, lower-cased (SPICE names are case-insensitive).
struct NameParser : x3::parser<NameParser> {
  using attribute_type = Name;
  static bool const has_attribute = true;

  template <typename Context, typename RContext, typename Attribute>
  bool parse(It& first, const It& last, const Context& ctx, RContext&, Attribute& attr) const {
    x3::skip_over(first, last, ctx);
    if (first == last || !is_ident_start(*first)) return false;
    const ParseState& st = state_of(ctx);
    Name result;
    result.begin = static_cast<std::size_t>(first - st.begin);
    It p = first;
    while (p != last && is_ident_char(*p)) {
      const char c = *p++;
      result.name.push_back((c >= 'A' && c <= 'Z') ? static_cast<char>(c - 'A' + 'a') : c);
    }
    result.end = static_cast<std::size_t>(p - st.begin);
    first = p;
    x3::traits::move_to(result, attr);
    return true;
  }
};

struct OrOps : x3::symbols<BinOp> {
  OrOps() { add("||", BinOp::logical_or); }
} const or_op;
struct AndOps : x3::symbols<BinOp> {
  AndOps() { add("&&", BinOp::logical_and); }
} const and_op;
struct CmpOps : x3::symbols<BinOp> {
  CmpOps() {
    add("<", BinOp::lt)("<=", BinOp::le)(">", BinOp::gt)(">=", BinOp::ge)("==", BinOp::eq)("!=", BinOp::ne);
  }
} const cmp_op;
struct AddOps : x3::symbols<BinOp> {
  AddOps() { add("+", BinOp::add)("-", BinOp::sub); }
} const add_op;
struct MulOps : x3::symbols<BinOp> {
  MulOps() { add("*", BinOp::mul)("/", BinOp::div)("%", BinOp::mod); }
} const mul_op;
struct PowOps : x3::symbols<BinOp> {
  PowOps() { add("**", BinOp::pow)("^", BinOp::pow); }
} const pow_op;

struct ternary_class : annotate_span {};
struct ternary_step_class : annotate_span {};
struct or_class : annotate_span {};
struct and_class : annotate_span {};
struct cmp_class : annotate_span {};
struct add_class : annotate_span {};
struct mul_class : annotate_span {};
struct or_step_class : annotate_span {};
struct and_step_class : annotate_span {};
struct cmp_step_class : annotate_span {};
struct add_step_class : annotate_span {};
struct mul_step_class : annotate_span {};
struct pow_step_class : annotate_span {};
struct unary_class : annotate_span {};
struct pow_operand_class : annotate_span {};
struct primary_class : annotate_span {};
struct call_class : annotate_span {};

/// Warns about `a**b**c`: ngspice-39 evaluates it as (a**b)**c (checked: 2**3**2 = 64).
struct power_class : annotate_span {
  template <typename Iterator, typename Context>
  void on_success(const Iterator& first, const Iterator& last, Chain& chain, const Context& ctx) const {
    annotate_span::on_success(first, last, chain, ctx);
    if (chain.rest.size() < 2) return;
    const ParseState& st = state_of(ctx);
    auto source = [&](std::size_t b, std::size_t e) {
      std::string_view s(st.begin + b, e - b);
      while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
      return s;
    };
    std::string grouped(chain.rest.size() - 1, '(');
    grouped += source(chain.begin, chain.rest.front().begin);
    for (std::size_t i = 0; i < chain.rest.size(); ++i) {
      grouped += source(chain.rest[i].begin, chain.rest[i].end);
      if (i + 1 < chain.rest.size()) grouped += ')';
    }
    add_warning(*st.warnings, fmt::format("'{}' is evaluated left to right as {}, like ngspice; add parentheses",
                                          source(chain.begin, chain.end), grouped));
  }
};

const NumberParser number_p{};
const NameParser name_p{};

const x3::rule<ternary_class, Ternary> ternary = "expression";
const x3::rule<ternary_step_class, TernaryStep> ternary_step = "conditional";
const x3::rule<or_class, Chain> logical_or = "operand";
const x3::rule<and_class, Chain> logical_and = "operand";
const x3::rule<cmp_class, Chain> comparison = "operand";
const x3::rule<add_class, Chain> additive = "operand";
const x3::rule<mul_class, Chain> multiplicative = "operand";
const x3::rule<power_class, Chain> power = "operand";
const x3::rule<or_step_class, Step> or_step = "operand";
const x3::rule<and_step_class, Step> and_step = "operand";
const x3::rule<cmp_step_class, Step> cmp_step = "operand";
const x3::rule<add_step_class, Step> add_step = "operand";
const x3::rule<mul_step_class, Step> mul_step = "operand";
const x3::rule<pow_step_class, Step> pow_step = "operand";
const x3::rule<unary_class, Unary> unary = "operand";
const x3::rule<pow_operand_class, Unary> pow_operand = "operand";
const x3::rule<primary_class, Node> primary = "operand";
const x3::rule<call_class, Call> call = "function call";

const auto unary_op = x3::char_("-+!");

// Precedence, high to low (checklist item 70, adjusted to what ngspice-39 does): primary;
// `**`/`^` (left-associative, the exponent may carry its own sign: 2**-1); unary - + ! (binding
// looser than power: ngspice-39 gives -2**2 = -4); * / %; + -; comparisons; &&; ||; ?:.
const auto ternary_def = logical_or >> *ternary_step;
const auto ternary_step_def = '?' > ternary > ':' > logical_or;
const auto logical_or_def = logical_and >> *or_step;
const auto or_step_def = or_op > logical_and;
const auto logical_and_def = comparison >> *and_step;
const auto and_step_def = and_op > comparison;
const auto comparison_def = additive >> *cmp_step;
const auto cmp_step_def = cmp_op > additive;
const auto additive_def = multiplicative >> *add_step;
const auto add_step_def = add_op > multiplicative;
const auto multiplicative_def = unary >> *mul_step;
const auto mul_step_def = mul_op > unary;
const auto unary_def = *unary_op >> power;
const auto power_def = primary >> *pow_step;
const auto pow_step_def = pow_op > pow_operand;
const auto pow_operand_def = *unary_op >> primary;
const auto primary_def = number_p | call | name_p | ('(' > ternary > ')');
const auto call_def = (name_p >> '(') > -(ternary % ',') > ')';

BOOST_SPIRIT_DEFINE(ternary, ternary_step, logical_or, or_step, logical_and, and_step, comparison, cmp_step,
                    additive, add_step, multiplicative, mul_step, unary, power, pow_step, pow_operand, primary,
                    call)

// Nesting the recursive descent would see: open parentheses plus `?` still waiting for `:`.
// Unary chains and `:` else-chains are parsed iteratively and do not count. Also catches
// unbalanced parentheses with a precise offset before the grammar gives a vaguer message.
void check_nesting(std::string_view text, std::size_t max_depth) {
  std::vector<std::size_t> open;  // offsets of unclosed '(' — bounded by max_depth
  std::size_t open_conditionals = 0;
  for (std::size_t i = 0; i < text.size(); ++i) {
    const char c = text[i];
    if (c == '(' || c == '?') {
      if (c == '(') open.push_back(i);
      else ++open_conditionals;
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

std::string describe_expected(const std::string& which) {
  if (which.size() == 3 && which.front() == '\'' && which.back() == '\'') return which;
  return (which == "operand" || which == "expression") ? "an " + which : "a " + which;
}

}  // namespace

Ternary parse(std::string_view text, std::size_t max_depth, std::vector<std::string>& warnings) {
  check_nesting(text, max_depth);
  ParseState st{text.data(), &warnings};
  It first = text.data();
  const It last = text.data() + text.size();
  Ternary result;
  try {
    const auto grammar = x3::with<StateTag>(&st)[ternary];
    const bool ok = x3::phrase_parse(first, last, grammar, x3::space, result);
    if (!ok) {
      while (first != last && (*first == ' ' || *first == '\t' || *first == '\r' || *first == '\n')) ++first;
      if (first == last) throw ExprError{0, "empty expression"};
      throw ExprError{static_cast<std::size_t>(first - text.data()),
                      fmt::format("expected an expression at '{}'", std::string_view(first, last - first))};
    }
  } catch (const x3::expectation_failure<It>& e) {
    It where = e.where();
    while (where != last && (*where == ' ' || *where == '\t')) ++where;
    const std::string found = where == last ? "end of expression" : "'" + std::string(where, last) + "'";
    throw ExprError{static_cast<std::size_t>(where - text.data()),
                    fmt::format("expected {} but found {}", describe_expected(e.which()), found)};
  }
  if (first != last) {
    throw ExprError{static_cast<std::size_t>(first - text.data()),
                    fmt::format("unexpected '{}' after the expression", std::string_view(first, last - first))};
  }
  return result;
}

}  // namespace mainscheck::parser::expr_ast
