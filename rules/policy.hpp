#pragma once
// The policy file (XML, `--policy FILE`): derating factors and other rule options, severity
// overrides, rules switched off, the supply tolerance. Format: docs/policy.md.
#include <map>
#include <optional>
#include <string>

#include "parser/diagnostics.hpp"
#include "parser/file_reader.hpp"
#include "parser/source_manager.hpp"
#include "rules/finding.hpp"

namespace mainscheck::rules {

/// Per-rule settings from the policy.
struct PolicyRule {
  std::optional<Severity> severity;
  std::optional<bool> enabled;
  parser::SourceLoc loc;
};

/// An option value as written, keyed in Policy::options by `<rule id>.<option>`.
struct PolicyOption {
  std::string value;
  parser::SourceLoc loc;
};

/// A parsed policy; an empty one means "all built-in defaults".
struct Policy {
  std::map<std::string, PolicyRule> rules;
  std::map<std::string, PolicyOption> options;
  std::optional<std::string> supply_tolerance;  // "+10/-15"
  parser::SourceLoc supply_loc;
};

/// Reads a policy file; syntax errors go to `diags` with file:line:col.
Policy read_policy_file(const std::string& path, parser::FileReader& files, parser::SourceManager& sm,
                        parser::DiagnosticSink& diags);
/// Reads a policy from text (tests).
Policy read_policy_text(const std::string& name, std::string text, parser::SourceManager& sm,
                        parser::DiagnosticSink& diags);

/// Checks every rule id and option key against the registry, and every value against its option's
/// kind; unknown names get a located error with the nearest known name ("did you mean ...").
void validate_policy(const Policy& policy, parser::DiagnosticSink& diags);

/// Parses "error" / "warning" / "note".
std::optional<Severity> parse_severity(std::string_view text);

}  // namespace mainscheck::rules
