#include "parser/spice_scope.hpp"

#include <algorithm>

#include "parser/spice_number.hpp"

namespace mainscheck::parser {

namespace {

// Error text handed back through a NameValue when the cause was already reported at its own
// line; expressions failing with it stay silent so one mistake gives one error.
constexpr std::string_view kReported =
    "\x01"
    "reported";

constexpr std::size_t kMostParameterChain = 256;

bool already_reported(const std::string& error) {
  return error.find(kReported) != std::string::npos;
}

SourceLoc shifted(SourceLoc loc, std::size_t by) {
  return {loc.file, static_cast<std::uint32_t>(loc.offset + by)};
}

}  // namespace

void ParamScope::define(const ParamDecl& decl, ParamScope* eval_scope) {
  Entry e;
  e.decl = decl;
  e.eval_scope = eval_scope ? eval_scope : this;
  entries.insert_or_assign(decl.key, std::move(e));
}

void ParamEvaluator::report(Severity sev, SourceLoc loc, std::string message) {
  if (!seen_.insert({{loc.file, loc.offset}, message}).second) return;
  diags_.report({sev, loc, std::move(message), {}});
}

std::optional<double> ParamEvaluator::evaluate(const ValueText& v, ParamScope& scope, ValueContext what,
                                               bool* not_numeric) {
  if (not_numeric) *not_numeric = false;
  if (!v.is_expr) {
    if (!looks_numeric(v.body)) {
      if (not_numeric) {
        *not_numeric = true;
        return std::nullopt;
      }
      report(Severity::error, v.loc,
             "value '" + std::string(v.text) + "' of " + std::string(what) +
                 " is not a number or an expression");
      return std::nullopt;
    }
    const SpiceNumber n = parse_spice_number(v.body);
    if (!n.error.empty()) {
      report(Severity::error, v.loc, n.error + " for " + std::string(what));
      return std::nullopt;
    }
    if (!n.warning.empty()) report(Severity::warning, v.loc, n.warning);
    if (n.length < v.body.size()) {
      report(Severity::warning, v.loc,
             "'" + std::string(v.body) + "' read as " + std::string(v.body.substr(0, n.length)) + " for " +
                 std::string(what) + "; SPICE ignores the rest '" + std::string(v.body.substr(n.length)) +
                 "'");
    }
    return n.value;
  }
  const ExprResult r = evaluate_expression(
      v.body, [&](std::string_view name) { return resolve(scope, name); }, limits_.max_expression_depth);
  for (const auto& w : r.warnings) report(Severity::warning, v.loc, w);
  if (r.value) return r.value;
  if (!already_reported(r.error)) {
    const std::size_t off = std::min(r.error_offset, v.body.size());
    std::string msg = r.error;
    if (msg.find("--max-expression-depth") == std::string::npos &&
        msg.find("deeper than") != std::string::npos)
      msg += " (--max-expression-depth)";
    report(Severity::error, shifted(v.body_loc, off), msg + " in " + std::string(what));
  }
  return std::nullopt;
}

NameValue ParamEvaluator::resolve(ParamScope& scope, std::string_view name) {
  const std::string key = to_lower(name);
  for (ParamScope* s = &scope; s; s = s->parent) {
    auto it = s->entries.find(key);
    if (it == s->entries.end()) continue;
    ParamScope::Entry& e = it->second;
    if (e.state == ParamScope::Entry::State::busy) {
      // The cycle is found while evaluating the parameter on top of the stack (checklist item 75).
      std::string chain;
      auto from = std::find(stack_.begin(), stack_.end(), &e);
      for (auto p = from; p != stack_.end(); ++p) chain += (*p)->decl.name + " -> ";
      chain += e.decl.name;
      const SourceLoc at = stack_.empty() ? e.decl.loc : stack_.back()->decl.loc;
      report(Severity::error, at, "circular parameter definition: " + chain);
      return {std::nullopt, std::string(kReported)};
    }
    if (e.state == ParamScope::Entry::State::fresh) evaluate_entry(e);
    if (e.value) return {e.value, {}};
    return {std::nullopt, std::string(kReported)};
  }
  return {};
}

void ParamEvaluator::evaluate_entry(ParamScope::Entry& e) {
  // A parameter is evaluated while the one using it waits, a few C++ frames a link, so the chain is
  // bounded by kMostParameterChain whatever --max-expression-depth allows (expressions themselves
  // are evaluated without recursion).
  if (stack_.size() >= std::min(limits_.max_expression_depth, kMostParameterChain)) {
    const bool option_binds = limits_.max_expression_depth <= kMostParameterChain;
    report(Severity::error, e.decl.loc,
           "parameter '" + e.decl.name + "' depends on a chain of more than " +
               std::to_string(std::min(limits_.max_expression_depth, kMostParameterChain)) + " parameters" +
               (option_binds ? " (--max-expression-depth)" : " (the longest chain the reader follows)"));
    e.state = ParamScope::Entry::State::done;
    return;
  }
  e.state = ParamScope::Entry::State::busy;
  stack_.push_back(&e);
  ValueText v = e.decl.value;
  // A bare right-hand side that is not a number is an expression (`.param c=a*b+1`, item 68).
  if (!v.is_expr && (!looks_numeric(v.body) || parse_spice_number(v.body).length < v.body.size()))
    v.is_expr = true;
  e.value = evaluate(v, *e.eval_scope, "parameter '" + e.decl.name + "'");
  stack_.pop_back();
  e.state = ParamScope::Entry::State::done;
}

void ParamEvaluator::evaluate_all(ParamScope& scope) {
  for (auto& [key, e] : scope.entries) {
    if (e.state == ParamScope::Entry::State::fresh) evaluate_entry(e);
  }
}

}  // namespace mainscheck::parser
