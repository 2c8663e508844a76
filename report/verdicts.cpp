#include "report/verdicts.hpp"

#include <algorithm>

#include "rules/registry.hpp"

namespace mainscheck::report {

const char* verdict_name(Verdict v) {
  switch (v) {
    case Verdict::pass: return "pass";
    case Verdict::notes: return "pass with notes";
    case Verdict::warnings: return "warning";
    case Verdict::fail: return "fail";
    case Verdict::unverified: return "not verified";
    case Verdict::not_applicable: return "not applicable";
  }
  return "?";
}

namespace {

/// True when the rule recorded a rating it could not compare for a part of the block.
bool has_unchecked_rating(const CheckReport& r, const std::string& rule_id, const analysis::Block* block) {
  if (block == nullptr) return false;
  const auto parts = block->parts();
  for (const auto& c : r.ratings) {
    if (c.rule_id == rule_id && c.verdict == rules::RatingVerdict::unknown &&
        std::binary_search(parts.begin(), parts.end(), c.part))
      return true;
  }
  return false;
}

}  // namespace

Verdict overall_verdict(const CheckReport& r) {
  const FindingCounts c = count_findings(r.findings);
  if (c.errors != 0) return Verdict::fail;
  if (r.status != CheckStatus::complete) return Verdict::unverified;
  if (c.warnings != 0) return Verdict::warnings;
  if (c.notes != 0) return Verdict::notes;
  return Verdict::pass;
}

std::vector<VerdictCell> verdict_matrix(const CheckReport& r) {
  struct Column {
    std::string id, kind;
    const analysis::Block* block;  // null for "design"
  };
  std::vector<Column> blocks;
  if (r.recognition != nullptr) {
    for (const auto& b : r.recognition->blocks) blocks.push_back({b.id, b.kind, &b});
  }
  blocks.push_back({"design", "whole design", nullptr});
  std::vector<VerdictCell> cells;
  for (const auto& rule : rules::all_rules()) {
    for (const auto& [id, kind, block] : blocks) {
      VerdictCell c{rule->info().id, rule->info().basis, id, kind, {}, Verdict::pass};
      for (const auto& f : r.findings) {
        const std::string fb = f.block.empty() ? "design" : f.block;
        if (f.rule_id == c.rule_id && fb == id) c.findings.push_back(&f);
      }
      for (const rules::Finding* f : c.findings) {
        if (f->waived_by) continue;  // a reviewed acceptance; the finding is still listed
        const Verdict v = f->severity == rules::Severity::error     ? Verdict::fail
                          : f->severity == rules::Severity::warning ? Verdict::warnings
                                                                    : Verdict::notes;
        if (static_cast<int>(v) > static_cast<int>(c.verdict)) c.verdict = v;
      }
      const bool applies = !c.findings.empty() || block == nullptr ||
                           rules::rule_applies_to(rule->info(), *block, r.recognition->info);
      if (!applies) c.verdict = Verdict::not_applicable;
      else if (c.verdict != Verdict::fail &&
               (r.status != CheckStatus::complete || has_unchecked_rating(r, c.rule_id, block)))
        c.verdict = Verdict::unverified;
      cells.push_back(std::move(c));
    }
  }
  return cells;
}

}  // namespace mainscheck::report
