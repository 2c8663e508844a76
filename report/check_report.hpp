#pragma once
// Everything one check of one netlist produced, as the writers see it. Plain data assembled by
// the CLI's check pipeline; every writer renders the same object.
#include <string>
#include <vector>

#include "analysis/corners.hpp"
#include "analysis/recognition.hpp"
#include "analysis/stress.hpp"
#include "parser/diagnostics.hpp"
#include "parser/netlist.hpp"
#include "parser/source_manager.hpp"
#include "rules/finding.hpp"

namespace mainscheck::report {

/// How far the check got; anything but `complete` must never read as a pass.
enum class CheckStatus {
  complete,         // every stage ran
  input_error,      // the netlist (or policy, parts library) could not be read completely
  analysis_failed,  // recognition or the solver could not complete
};

/// The result of checking one netlist.
struct CheckReport {
  std::string file;  // as given on the command line
  CheckStatus status = CheckStatus::complete;
  std::string failure;  // why, when status != complete
  const parser::SourceManager* sources = nullptr;
  const parser::DiagnosticSink* diagnostics = nullptr;
  const parser::Netlist* netlist = nullptr;
  const analysis::RecognitionResult* recognition = nullptr;  // null when recognition did not run
  const analysis::CornerPlan* corners = nullptr;
  const analysis::StressResult* stress = nullptr;            // null when stresses were not computed
  std::vector<rules::Finding> findings;
  /// Every rating comparison of the rating rules, pass or not (the per-part rating table).
  std::vector<rules::RatingCheck> ratings;
  /// Wall-clock time the check took, for the batch summary; negative when not measured.
  double elapsed_s = -1;
  /// Findings left out because a --baseline report already had them (matched by fingerprint).
  std::size_t baseline_matched = 0;
};

/// Counts of findings by severity.
struct FindingCounts {
  std::size_t errors = 0, warnings = 0, notes = 0;
  std::size_t waived = 0;  // not in the three counts above
};
FindingCounts count_findings(const std::vector<rules::Finding>& findings);

/// One basis a report cites: the rule and what it rests on.
struct CitedBasis {
  std::string rule_id;
  std::string basis;
};
/// The distinct bases of the findings, by rule id: text, Markdown and HTML print each once instead of
/// on every finding (JSON and SARIF keep it per finding).
std::vector<CitedBasis> cited_bases(const std::vector<rules::Finding>& findings);

/// The caution every report carries (README, every format).
extern const char* const kSafetyCaution;

}  // namespace mainscheck::report
