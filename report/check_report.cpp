#include "report/check_report.hpp"

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

}  // namespace mainscheck::report
