#pragma once
// The rule × block matrix that the JUnit and checklist writers share: for each rule and each block
// (plus "design" for findings outside blocks), the findings and the resulting verdict.
#include <string>
#include <vector>

#include "report/check_report.hpp"

namespace mainscheck::report {

/// Outcome of one rule on one block.
/// `not_applicable`: the block holds nothing the rule checks (RuleInfo::applies_to) and it found nothing there.
enum class Verdict { not_applicable, pass, notes, warnings, fail, unverified };

/// Lower-case name used in reports ("pass", "fail", ...).
const char* verdict_name(Verdict v);

/// One cell of the matrix.
struct VerdictCell {
  std::string rule_id;
  std::string basis;
  std::string block;  // block id, or "design" for findings not tied to a block
  std::string block_kind;
  std::vector<const rules::Finding*> findings;
  Verdict verdict = Verdict::pass;
};

/// The verdict of a whole check; a check that did not complete is never shown as a pass.
Verdict overall_verdict(const CheckReport& r);

/// Every registered rule × every block of the report (rule order, then block order); a check that
/// did not complete, or a rating the rule could not compare in the block (no rating, no stress),
/// makes a cell without a failing finding `unverified`, never `pass`.
std::vector<VerdictCell> verdict_matrix(const CheckReport& r);

}  // namespace mainscheck::report
