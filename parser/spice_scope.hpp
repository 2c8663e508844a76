#pragma once
// Parameter scopes of the SPICE reader: the global `.param`s and one scope per subcircuit
// instance, evaluated lazily so order does not matter, with cycle detection.
#include <map>
#include <optional>
#include <set>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "parser/diagnostics.hpp"
#include "parser/expression.hpp"
#include "parser/limits.hpp"
#include "parser/spice_deck.hpp"

namespace mainscheck::parser {

/// Parameters visible in one place; names not found here are looked up in `parent`.
struct ParamScope {
  struct Entry {
    ParamDecl decl;
    ParamScope* eval_scope = nullptr;  // where the right-hand side is evaluated (caller's for overrides)
    enum class State { fresh, busy, done } state = State::fresh;
    std::optional<double> value;
  };
  ParamScope* parent = nullptr;
  std::map<std::string, Entry> entries;

  /// Adds or replaces `decl`; `eval_scope` null means this scope.
  void define(const ParamDecl& decl, ParamScope* eval_scope = nullptr);
};

/// What a value is used for, for messages: "resistor R1", "parameter 'rload'".
using ValueContext = std::string_view;

/// Evaluates numbers and expressions against scopes, reporting each problem once.
class ParamEvaluator {
 public:
  ParamEvaluator(DiagnosticSink& diags, const ReadLimits& limits) : diags_(diags), limits_(limits) {}

  /// Value of a number token or expression; nullopt after reporting an error. A word that is not a
  /// number at all gives nullopt and sets `*not_numeric` (when given) without reporting.
  std::optional<double> evaluate(const ValueText& v, ParamScope& scope, ValueContext what,
                                 bool* not_numeric = nullptr);
  /// Evaluates every entry of `scope` so that errors in unused parameters are reported too.
  void evaluate_all(ParamScope& scope);
  /// Reports a diagnostic unless the same one (location and text) was already reported.
  void report(Severity sev, SourceLoc loc, std::string message);

 private:
  NameValue resolve(ParamScope& scope, std::string_view name);
  void evaluate_entry(ParamScope::Entry& e);

  DiagnosticSink& diags_;
  const ReadLimits& limits_;
  std::vector<const ParamScope::Entry*> stack_;
  std::set<std::pair<std::pair<FileId, std::uint32_t>, std::string>> seen_;
};

}  // namespace mainscheck::parser
