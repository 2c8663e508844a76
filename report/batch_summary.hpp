#pragma once
// The overview that ends a batch report: one row per netlist with its finding counts, overall
// verdict and the time its check took, and a total row. Text, JSON and HTML render the same rows.
#include <string>
#include <vector>

#include "report/check_report.hpp"
#include "report/verdicts.hpp"

namespace mainscheck::report {

/// One netlist of a batch.
struct BatchRow {
  std::string file;
  FindingCounts counts;
  Verdict verdict = Verdict::unverified;
  double elapsed_s = -1;  // negative when not measured
};

/// The rows, in the order the netlists were given.
std::vector<BatchRow> batch_rows(const std::vector<const CheckReport*>& reports);

/// Sums over the batch; the verdict is the worst one (a failure first, then a check not verified).
BatchRow batch_total(const std::vector<BatchRow>& rows);

/// "1.23 s", or "—" when not measured.
std::string format_elapsed(double elapsed_s);

}  // namespace mainscheck::report
