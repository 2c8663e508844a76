#include "report/verdicts.hpp"

#include "rules/registry.hpp"

namespace mainscheck::report {

const char* verdict_name(Verdict v) {
  switch (v) {
    case Verdict::pass: return "pass";
    case Verdict::notes: return "pass with notes";
    case Verdict::warnings: return "warning";
    case Verdict::fail: return "fail";
    case Verdict::unverified: return "not verified";
  }
  return "?";
}

std::vector<VerdictCell> verdict_matrix(const CheckReport& r) {
  std::vector<std::pair<std::string, std::string>> blocks;  // id, kind
  if (r.recognition != nullptr) {
    for (const auto& b : r.recognition->blocks) blocks.emplace_back(b.id, b.kind);
  }
  blocks.emplace_back("design", "whole design");
  std::vector<VerdictCell> cells;
  for (const auto& rule : rules::all_rules()) {
    for (const auto& [id, kind] : blocks) {
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
      if (r.status != CheckStatus::complete && c.verdict != Verdict::fail) c.verdict = Verdict::unverified;
      cells.push_back(std::move(c));
    }
  }
  return cells;
}

}  // namespace mainscheck::report
