#pragma once
// A finding's identity across commits: rule, subject and quantity, never its line number, so a
// finding keeps its fingerprint when unrelated lines move (SARIF partialFingerprints, baselines).
#include <string>

#include "rules/finding.hpp"

namespace mainscheck::report {

/// 16 hex digits (FNV-1a, 64 bit) over rule id, subject (or first part) and measured quantity.
std::string finding_fingerprint(const rules::Finding& f);

}  // namespace mainscheck::report
