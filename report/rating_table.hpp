#pragma once
// The per-part rating table every format shows: each rating of each solved part with its source,
// derated limit, worst stress, corner, margin and verdict. Built from the rating rules' comparisons
// (rules::RatingCheck), so no rule logic is repeated here.
#include <cstddef>
#include <string>
#include <vector>

#include "report/check_report.hpp"

namespace mainscheck::report {

/// One row: one rating of one part, or a solved part for which no rating was compared.
struct RatingRow {
  std::size_t part = 0;
  std::string ref;
  std::string type;   // front-end type ("diode", "fuse", ...)
  std::string block;  // block id, or "" outside blocks
  const rules::RatingCheck* check = nullptr;  // null: no rating rule compares anything for this part
  rules::RatingVerdict verdict = rules::RatingVerdict::unknown;
};

/// Name used in every format: "pass", "fail", "unknown", "not-applicable".
const char* rating_verdict_name(rules::RatingVerdict v);

/// The verdict shown for a comparison: a pass of a check that did not complete is `unknown`.
rules::RatingVerdict shown_verdict(const CheckReport& r, const rules::RatingCheck& c);

/// The parts a review covers: the solved ones in the solver's order, then block members the solver
/// did not solve (a varistor taken as open).
std::vector<std::size_t> reviewed_parts(const CheckReport& r);

/// The comparisons recorded for one part, in rule order.
std::vector<const rules::RatingCheck*> ratings_of(const CheckReport& r, std::size_t part);

/// Every solved part and every block member except sources, sorted worst first: failures by margin, then unknown, then
/// passes by margin, then not-applicable; ties in netlist order.
std::vector<RatingRow> rating_rows(const CheckReport& r);

/// A row's cells as text (without markup), the same in every format; "—" where nothing applies.
struct RatingCells {
  std::string quantity, rated, source, limit, stress, corner, margin, verdict;
};
RatingCells rating_cells(const RatingRow& row);

/// Counts of rows by verdict, for the line above the table.
struct RatingCounts {
  std::size_t pass = 0, fail = 0, unknown = 0, not_applicable = 0;
};
RatingCounts count_ratings(const std::vector<RatingRow>& rows);

}  // namespace mainscheck::report
