#include "report/markdown_writer.hpp"

#include <fmt/format.h>

#include "report/units.hpp"
#include "report/verdicts.hpp"

namespace mainscheck::report {

namespace {

// Table cells may not hold a bare '|' or a newline.
std::string cell(std::string s) {
  std::string out;
  for (char c : s) {
    if (c == '|') out += "\\|";
    else if (c == '\n') out += ' ';
    else out += c;
  }
  return out;
}

std::string measured(const std::vector<const rules::Finding*>& fs) {
  std::string out;
  for (const rules::Finding* f : fs) {
    std::string one = f->parts.empty() ? f->message : f->parts.front();
    if (f->measurement) {
      one += fmt::format(": {} vs {} ({} margin{})", format_si(f->measurement->value, f->measurement->unit),
                         format_si(f->measurement->limit, f->measurement->unit),
                         format_percent(f->measurement->margin()),
                         f->measurement->corner.empty() ? "" : ", " + f->measurement->corner);
    }
    out += (out.empty() ? "" : "; ") + one;
  }
  return out.empty() ? "—" : out;
}

}  // namespace

std::string check_to_markdown(const CheckReport& r) {
  std::string out = fmt::format("# Mains front-end review checklist: `{}`\n\n", r.file);
  out += fmt::format("> **{}**\n\n", kSafetyCaution);
  const FindingCounts c = count_findings(r.findings);
  out += fmt::format("Result: {} error(s), {} warning(s), {} note(s)", c.errors, c.warnings, c.notes);
  if (r.status != CheckStatus::complete) out += fmt::format(" — **check incomplete: {}**", cell(r.failure));
  out += "\n\n";
  if (r.recognition != nullptr && !r.recognition->blocks.empty()) {
    out += "## Blocks\n\n| block | kind | variant | parts |\n|---|---|---|---|\n";
    for (const auto& b : r.recognition->blocks) {
      std::string parts;
      for (std::size_t p : b.parts()) parts += (parts.empty() ? "" : ", ") + r.recognition->devices.parts[p].ref;
      out += fmt::format("| {} | {} | {} | {} |\n", b.id, b.kind, b.variant.empty() ? "—" : b.variant, cell(parts));
    }
    out += "\n";
  }
  out += "## Rules\n\n| ✓ | rule | block | verdict | measured vs limit | basis |\n|---|---|---|---|---|---|\n";
  for (const VerdictCell& v : verdict_matrix(r)) {
    // Cells where the rule has nothing to say about a block stay in the list: the reviewer signs
    // for every rule, but "design" rows without findings are folded to keep the table readable.
    if (v.block == "design" && v.findings.empty()) continue;
    out += fmt::format("| [ ] | `{}` | {} {} | {} | {} | {} |\n", v.rule_id, v.block, v.block == "design" ? "" : v.block_kind,
                       verdict_name(v.verdict), cell(measured(v.findings)), cell(v.basis));
  }
  out += "\n## Findings\n\n";
  if (r.findings.empty()) out += "None.\n";
  for (const auto& f : r.findings) {
    std::string where = r.file;
    if (f.loc.valid() && r.sources != nullptr) {
      const parser::LineCol lc = r.sources->line_col(f.loc);
      where = fmt::format("{}:{}", r.sources->name(f.loc.file), lc.line);
    }
    out += fmt::format("- **{}** `{}` {}: {} — basis: {}\n", parser::severity_name(f.severity), f.rule_id, where,
                       f.message, f.basis);
  }
  out += "\n## Sign-off\n\n| field | entry |\n|---|---|\n| Reviewer | |\n| Date | |\n"
         "| Decision (accept / accept with actions / reject) | |\n| Actions and waivers | |\n";
  return out;
}

}  // namespace mainscheck::report
