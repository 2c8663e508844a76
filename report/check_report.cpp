#include "report/check_report.hpp"

#include <algorithm>

namespace mainscheck::report {

const char* const kSafetyCaution =
    "Caution: mains voltages are lethal. mainscheck is a review aid, not a certification; its values are "
    "screening values. Final judgement rests with local codes, the product's applicable safety standard and a "
    "qualified person.";

FindingCounts count_findings(const std::vector<rules::Finding>& findings) {
  FindingCounts c;
  for (const auto& f : findings) {
    if (f.waived_by) {
      ++c.waived;
      continue;
    }
    if (f.severity == rules::Severity::error) ++c.errors;
    else if (f.severity == rules::Severity::warning) ++c.warnings;
    else ++c.notes;
  }
  return c;
}

std::vector<CitedBasis> cited_bases(const std::vector<rules::Finding>& findings) {
  std::vector<CitedBasis> out;
  for (const auto& f : findings) {
    if (f.basis.empty()) continue;
    const bool seen = std::any_of(out.begin(), out.end(), [&](const CitedBasis& b) {
      return b.rule_id == f.rule_id && b.basis == f.basis;
    });
    if (!seen) out.push_back({f.rule_id, f.basis});
  }
  std::stable_sort(out.begin(), out.end(), [](const CitedBasis& a, const CitedBasis& b) { return a.rule_id < b.rule_id; });
  return out;
}

}  // namespace mainscheck::report
