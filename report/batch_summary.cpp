#include "report/batch_summary.hpp"

#include <fmt/format.h>

namespace mainscheck::report {

std::vector<BatchRow> batch_rows(const std::vector<const CheckReport*>& reports) {
  std::vector<BatchRow> rows;
  for (const CheckReport* r : reports)
    rows.push_back({r->file, count_findings(r->findings), overall_verdict(*r), r->elapsed_s});
  return rows;
}

BatchRow batch_total(const std::vector<BatchRow>& rows) {
  BatchRow t{"total", {}, Verdict::pass, 0};
  // A failure outranks a check that did not complete, as for one netlist; the rest by severity.
  auto rank = [](Verdict v) { return v == Verdict::fail ? 10 : static_cast<int>(v); };
  for (const BatchRow& r : rows) {
    t.counts.errors += r.counts.errors;
    t.counts.warnings += r.counts.warnings;
    t.counts.notes += r.counts.notes;
    t.counts.waived += r.counts.waived;
    if (rank(r.verdict) > rank(t.verdict)) t.verdict = r.verdict;
    if (r.elapsed_s < 0 || t.elapsed_s < 0) t.elapsed_s = -1;
    else t.elapsed_s += r.elapsed_s;
  }
  return t;
}

std::string format_elapsed(double elapsed_s) {
  if (elapsed_s < 0) return "—";
  return fmt::format("{:.2f} s", elapsed_s);
}

}  // namespace mainscheck::report
