#include "report/markdown_writer.hpp"

#include <fmt/format.h>

#include "report/rating_table.hpp"
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
      one += fmt::format(": {} vs {} ({}{})", format_si(f->measurement->value, f->measurement->unit),
                         format_si(f->measurement->limit, f->measurement->unit),
                         margin_phrase(f->measurement->margin()),
                         f->measurement->corner.empty() ? "" : ", " + f->measurement->corner);
    }
    out += (out.empty() ? "" : "; ") + one;
  }
  return out.empty() ? "—" : out;
}

void append_rating_table(std::string& out, const CheckReport& r) {
  const std::vector<RatingRow> rows = rating_rows(r);
  if (rows.empty()) return;
  const RatingCounts n = count_ratings(rows);
  out += fmt::format("## Part ratings\n\nWorst first: {} fail, {} unknown, {} pass, {} not applicable. The limit is the "
                     "rating times the rule's derating; the margin is the headroom as a fraction of the limit.\n\n",
                     n.fail, n.unknown, n.pass, n.not_applicable);
  out += "| part | type | block | rating | rated | source | limit | stress | corner | margin | verdict |\n"
         "|---|---|---|---|---|---|---|---|---|---|---|\n";
  for (const RatingRow& row : rows) {
    const RatingCells c = rating_cells(row);
    out += fmt::format("| {} | {} | {} | {} | {} | {} | {} | {} | {} | {} | {} |\n", cell(row.ref), row.type,
                       row.block.empty() ? "—" : row.block, c.quantity, c.rated, c.source, c.limit, c.stress,
                       cell(c.corner), c.margin, c.verdict);
  }
  out += "\n";
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
  append_rating_table(out, r);
  out += "## Rules\n\n| ✓ | rule | block | verdict | measured vs limit |\n|---|---|---|---|---|\n";
  std::vector<CitedBasis> bases;
  for (const VerdictCell& v : verdict_matrix(r)) {
    if (bases.empty() || bases.back().rule_id != v.rule_id) bases.push_back({v.rule_id, v.basis});
    // Cells where the rule has nothing to say about a block stay in the list: the reviewer signs
    // for every rule, but "design" rows without findings are folded to keep the table readable.
    if (v.block == "design" && v.findings.empty()) continue;
    out += fmt::format("| [ ] | `{}` | {}{} | {} | {} |\n", v.rule_id, v.block, v.block == "design" ? "" : " " + v.block_kind,
                       verdict_name(v.verdict), cell(measured(v.findings)));
  }
  out += "\n## Basis of each rule\n\n";
  for (const CitedBasis& b : bases) out += fmt::format("- `{}`: {}\n", b.rule_id, b.basis);
  out += "\n## Findings\n\n";
  if (r.findings.empty()) out += "None.\n";
  for (const auto& f : r.findings) {
    std::string where = r.file;
    if (f.loc.valid() && r.sources != nullptr) {
      const parser::LineCol lc = r.sources->line_col(f.loc);
      where = fmt::format("{}:{}", r.sources->name(f.loc.file), lc.line);
    }
    out += fmt::format("- **{}** `{}` {}: {}{}\n", parser::severity_name(f.severity), f.rule_id, where, f.message,
                       f.waived_by ? " — waived by " + *f.waived_by : "");
  }
  out += "\n## Sign-off\n\n| field | entry |\n|---|---|\n| Reviewer | |\n| Date | |\n"
         "| Decision (accept / accept with actions / reject) | |\n| Actions and waivers | |\n";
  return out;
}

}  // namespace mainscheck::report
