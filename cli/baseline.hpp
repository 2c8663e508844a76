#pragma once
// Baselines: an earlier JSON report whose findings are already known, so a pull request is gated on
// what it changed (matched by fingerprint, which ignores line numbers).
#include <set>
#include <string>
#include <vector>

#include "parser/diagnostics.hpp"
#include "rules/finding.hpp"

namespace mainscheck::cli {

/// Fingerprints of every finding in a JSON report (single or batch); problems go to `diags`.
std::set<std::string> read_baseline_fingerprints(const std::string& path, parser::DiagnosticSink& diags);

/// Removes findings whose fingerprint is in `baseline`; returns how many were removed.
std::size_t drop_baseline_findings(const std::set<std::string>& baseline, std::vector<rules::Finding>& findings);

}  // namespace mainscheck::cli
