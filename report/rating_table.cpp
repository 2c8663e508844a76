#include "report/rating_table.hpp"

#include <algorithm>
#include <limits>
#include <tuple>

#include "report/units.hpp"

namespace mainscheck::report {

namespace {

using analysis::FrontEndType;
using rules::RatingVerdict;

/// Sources, couplings and unknown elements carry no rating a front-end review asks for.
bool rated_kind(FrontEndType t) {
  return t != FrontEndType::vsource && t != FrontEndType::isource && t != FrontEndType::coupling;
}

int verdict_rank(RatingVerdict v) {
  switch (v) {
    case RatingVerdict::fail: return 0;
    case RatingVerdict::unknown: return 1;
    case RatingVerdict::pass: return 2;
    case RatingVerdict::not_applicable: return 3;
  }
  return 4;
}

std::string block_of(const CheckReport& r, std::size_t part) {
  for (const auto& b : r.recognition->blocks) {
    const auto parts = b.parts();
    if (std::binary_search(parts.begin(), parts.end(), part)) return b.id;
  }
  return "";
}

}  // namespace

const char* rating_verdict_name(RatingVerdict v) {
  switch (v) {
    case RatingVerdict::pass: return "pass";
    case RatingVerdict::fail: return "fail";
    case RatingVerdict::unknown: return "unknown";
    case RatingVerdict::not_applicable: return "not-applicable";
  }
  return "unknown";
}

RatingVerdict shown_verdict(const CheckReport& r, const rules::RatingCheck& c) {
  if (c.verdict == RatingVerdict::pass && r.status != CheckStatus::complete) return RatingVerdict::unknown;
  return c.verdict;
}

std::vector<const rules::RatingCheck*> ratings_of(const CheckReport& r, std::size_t part) {
  std::vector<const rules::RatingCheck*> out;
  for (const auto& c : r.ratings)
    if (c.part == part) out.push_back(&c);
  return out;
}

std::vector<std::size_t> reviewed_parts(const CheckReport& r) {
  std::vector<std::size_t> parts;
  if (r.stress == nullptr || r.recognition == nullptr) return parts;
  for (const auto& ps : r.stress->parts) parts.push_back(ps.part);
  for (const auto& b : r.recognition->blocks)
    for (std::size_t p : b.parts())
      if (std::find(parts.begin(), parts.end(), p) == parts.end()) parts.push_back(p);
  return parts;
}

std::vector<RatingRow> rating_rows(const CheckReport& r) {
  std::vector<RatingRow> rows;
  if (r.stress == nullptr || r.recognition == nullptr) return rows;
  const auto& devs = r.recognition->devices;
  for (std::size_t part : reviewed_parts(r)) {
    if (part >= devs.parts.size()) continue;
    const FrontEndType t = r.recognition->info.type(part);
    if (!rated_kind(t)) continue;
    RatingRow base{part, devs.parts[part].ref, std::string(analysis::front_end_type_name(t)), block_of(r, part),
                   nullptr, RatingVerdict::unknown};
    const auto checks = ratings_of(r, part);
    // A solved part no rating rule compares is not checked: unknown, never a pass.
    if (checks.empty()) rows.push_back(base);
    for (const rules::RatingCheck* c : checks) {
      RatingRow row = base;
      row.check = c;
      row.verdict = shown_verdict(r, *c);
      rows.push_back(std::move(row));
    }
  }
  auto margin = [](const RatingRow& row) {
    const auto m = row.check ? row.check->margin() : std::nullopt;
    return m ? *m : std::numeric_limits<double>::infinity();
  };
  std::stable_sort(rows.begin(), rows.end(), [&](const RatingRow& a, const RatingRow& b) {
    return std::make_tuple(verdict_rank(a.verdict), margin(a)) < std::make_tuple(verdict_rank(b.verdict), margin(b));
  });
  return rows;
}

RatingCells rating_cells(const RatingRow& row) {
  RatingCells c{"—", "—", "—", "—", "—", "—", "—", rating_verdict_name(row.verdict)};
  if (row.check == nullptr) {
    c.quantity = "no rating compared";
    return c;
  }
  const rules::RatingCheck& k = *row.check;
  c.quantity = k.quantity;
  if (k.rated) c.rated = format_si(*k.rated, k.unit);
  if (!k.source.empty()) c.source = k.source;
  if (const auto l = k.limit()) c.limit = format_si(*l, k.unit);
  if (k.stress) c.stress = format_si(*k.stress, k.unit);
  if (!k.corner.empty()) c.corner = k.corner;
  if (const auto m = k.margin()) c.margin = format_margin(*m);
  return c;
}

RatingCounts count_ratings(const std::vector<RatingRow>& rows) {
  RatingCounts c;
  for (const auto& row : rows) {
    switch (row.verdict) {
      case RatingVerdict::pass: ++c.pass; break;
      case RatingVerdict::fail: ++c.fail; break;
      case RatingVerdict::unknown: ++c.unknown; break;
      case RatingVerdict::not_applicable: ++c.not_applicable; break;
    }
  }
  return c;
}

}  // namespace mainscheck::report
