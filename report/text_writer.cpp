#include "report/text_writer.hpp"

#include <fmt/format.h>

#include <cmath>
#include <algorithm>
#include <set>

#include "report/batch_summary.hpp"
#include "report/rating_table.hpp"
#include "report/units.hpp"

namespace mainscheck::report {

namespace {

using analysis::Quantity;

const char* color_of(rules::Severity s) {
  switch (s) {
    case rules::Severity::error: return "\x1b[1;31m";
    case rules::Severity::warning: return "\x1b[1;35m";
    case rules::Severity::note: return "\x1b[1;36m";
  }
  return "";
}

std::string net_name(const CheckReport& r, parser::NetId n) { return r.recognition->devices.net(n).name; }

std::string where(const CheckReport& r, parser::SourceLoc loc) {
  if (!loc.valid() || r.sources == nullptr) return r.file;
  const parser::LineCol lc = r.sources->line_col(loc);
  return fmt::format("{}:{}:{}", r.sources->name(loc.file), lc.line, lc.column);
}

void append_finding(std::string& out, const CheckReport& r, const rules::Finding& f, const TextOptions& o,
                    const char* indent) {
  const char* sev = parser::severity_name(f.severity);
  out += fmt::format("{}{}: {}{}{}: {} [{}]\n", indent, where(r, f.loc), o.color ? color_of(f.severity) : "", sev,
                     o.color ? "\x1b[0m" : "", f.message, f.rule_id);
  if (f.measurement) {
    const auto& m = *f.measurement;
    out += fmt::format("{}    measured {}, limit {}, {}{}\n", indent, format_si(m.value, m.unit),
                       format_si(m.limit, m.unit), margin_phrase(m.margin()),
                       m.corner.empty() ? "" : ", at " + m.corner);
  }
  for (const auto& n : f.notes) out += fmt::format("{}    note: {}\n", indent, n.message);
  if (f.waived_by) out += fmt::format("{}    WAIVED by {}\n", indent, *f.waived_by);
}

void append_stress_table(std::string& out, const CheckReport& r, const analysis::Block& b) {
  if (r.stress == nullptr) return;
  std::string rows;
  for (std::size_t part : b.parts()) {
    const analysis::PartStress* ps = r.stress->find(part);
    if (ps == nullptr) continue;
    std::string row = fmt::format("    {:<12}", r.recognition->devices.parts[part].ref);
    for (Quantity q : analysis::kAllQuantities) {
      const analysis::StressValue* v = ps->get(q);
      row += fmt::format(" {:>11}", v ? format_si(v->value, analysis::quantity_unit(q)) : "-");
    }
    rows += row + "\n";
  }
  if (rows.empty()) return;
  out += fmt::format("    {:<12} {:>11} {:>11} {:>11} {:>11} {:>11} {:>11}\n", "part", "v_peak", "v_rev_peak",
                     "i_peak", "i_rms", "i_avg", "p_avg");
  out += rows;
}

/// Columns need the width of what a terminal shows: count UTF-8 code points, not bytes ("µ", "—", "×").
std::size_t display_width(const std::string& s) {
  std::size_t n = 0;
  for (unsigned char c : s) n += (c & 0xC0) != 0x80;
  return n;
}

/// Left-aligned columns two spaces apart, each row indented by four.
std::string aligned(const std::vector<std::vector<std::string>>& rows) {
  std::vector<std::size_t> width;
  for (const auto& row : rows) {
    width.resize(std::max(width.size(), row.size()));
    for (std::size_t i = 0; i < row.size(); ++i) width[i] = std::max(width[i], display_width(row[i]));
  }
  std::string out;
  for (const auto& row : rows) {
    std::string line = "   ";
    for (std::size_t i = 0; i < row.size(); ++i) {
      line += " " + row[i];
      if (i + 1 < row.size()) line += std::string(width[i] - display_width(row[i]) + 1, ' ');
    }
    out += line + "\n";
  }
  return out;
}

std::vector<std::string> batch_cells(const BatchRow& row) {
  return {row.file, std::to_string(row.counts.errors), std::to_string(row.counts.warnings),
          std::to_string(row.counts.notes), verdict_name(row.verdict), format_elapsed(row.elapsed_s)};
}

void append_rating_table(std::string& out, const CheckReport& r) {
  const std::vector<RatingRow> rows = rating_rows(r);
  if (rows.empty()) {
    out += "\npart ratings: no part was solved, so no rating was compared\n";
    return;
  }
  const RatingCounts n = count_ratings(rows);
  out += fmt::format("\npart ratings, worst first: {} fail, {} unknown, {} pass, {} not applicable\n", n.fail, n.unknown,
                     n.pass, n.not_applicable);
  std::vector<std::vector<std::string>> table{
      {"part", "type", "block", "rating", "rated", "source", "limit", "stress", "corner", "margin", "verdict"}};
  for (const RatingRow& row : rows) {
    const RatingCells c = rating_cells(row);
    table.push_back({row.ref, row.type, row.block.empty() ? "—" : row.block, c.quantity, c.rated, c.source, c.limit,
                     c.stress, c.corner, c.margin, c.verdict});
  }
  out += aligned(table);
}

}  // namespace

std::string batch_summary_text(const std::vector<const CheckReport*>& reports) {
  std::vector<std::vector<std::string>> table{{"netlist", "errors", "warnings", "notes", "verdict", "time"}};
  const std::vector<BatchRow> rows = batch_rows(reports);
  BatchRow total = batch_total(rows);
  total.file = fmt::format("total ({} netlists)", rows.size());
  for (const BatchRow& row : rows) table.push_back(batch_cells(row));
  table.push_back(batch_cells(total));
  return "batch summary:\n" + aligned(table) + kSafetyCaution + "\n";
}

std::string check_to_text(const CheckReport& r, const TextOptions& o) {
  std::string out = fmt::format("mainscheck check {}\n", r.file);
  std::set<std::size_t> shown;
  if (r.recognition != nullptr) {
    const auto& rec = *r.recognition;
    const auto& s = rec.supply;
    if (s.line && s.neutral) {
      out += fmt::format("supply: line {}, neutral {}, earth {}", net_name(r, *s.line), net_name(r, *s.neutral),
                         s.earth ? net_name(r, *s.earth) : std::string("none"));
      if (s.mains && s.mains->v_nominal_V) out += fmt::format(", {}", format_si(*s.mains->v_nominal_V, "V"));
      if (s.mains && s.mains->f_nominal_Hz) out += fmt::format(" {}", format_si(*s.mains->f_nominal_Hz, "Hz"));
      out += fmt::format(" (from {})\n", s.mains_from.what);
    }
    if (r.corners != nullptr) {
      out += "corners:";
      for (const auto& c : r.corners->corners) out += fmt::format(" {} {} {};", c.name, format_si(c.v_rms_V, "V"), format_si(c.f_Hz, "Hz"));
      out += "\n";
    }
    for (std::size_t bi = 0; bi < rec.blocks.size(); ++bi) {
      const auto& b = rec.blocks[bi];
      std::string members;
      for (std::size_t p : b.parts()) members += " " + rec.devices.parts[p].ref;
      out += fmt::format("\n{} {}{}:{}\n", b.id, b.kind, b.variant.empty() ? "" : " (" + b.variant + ")", members);
      std::string outs;
      for (const auto& bo : b.outputs) outs += fmt::format(" {}/{}", net_name(r, bo.net), net_name(r, bo.ret));
      std::string ins;
      for (auto n : b.inputs) ins += " " + net_name(r, n);
      out += fmt::format("    in:{}  out:{}\n", ins.empty() ? " -" : ins, outs.empty() ? " -" : outs);
      if (r.stress != nullptr) {
        for (const auto& bs : r.stress->blocks) {
          if (bs.block != bi) continue;
          if (!bs.converged) out += fmt::format("    stresses not verified: {}\n", bs.failure);
          for (const auto& os : bs.outputs) {
            // An alternating output (a secondary, a phase-controlled load) is read by its r.m.s.
            // value; a mean below 1 % of it says the output alternates.
            const bool alternating = os.v_rms && os.v_dc && std::fabs(os.v_dc->value) < 0.01 * os.v_rms->value;
            if (alternating) {
              out += fmt::format("    output {}: {} r.m.s. ac ({})\n", net_name(r, os.net),
                                 format_si(os.v_rms->value, "V"), os.v_rms->corner);
            } else if (os.v_dc && os.v_ripple_pp) {
              out += fmt::format("    output {}: {} dc, {} ripple p-p ({})\n", net_name(r, os.net),
                                 format_si(os.v_dc->value, "V"), format_si(os.v_ripple_pp->value, "V"), os.v_dc->corner);
            }
          }
        }
      }
      append_stress_table(out, r, b);
      for (std::size_t fi = 0; fi < r.findings.size(); ++fi) {
        if (r.findings[fi].block == b.id) {
          append_finding(out, r, r.findings[fi], o, "  ");
          shown.insert(fi);
        }
      }
    }
    if (r.stress != nullptr && r.stress->inrush) {
      out += fmt::format("\ninrush at switch-on (worst at {}): {} peak, {} I²t\n", r.stress->inrush->where(),
                         format_si(r.stress->inrush->i_peak_A, "A"), format_si(r.stress->inrush->i2t_A2s, "A²s"));
    }
    if (r.stress != nullptr && !r.stress->assumptions.empty()) {
      out += "\nmodel assumptions:\n";
      for (const auto& a : r.stress->assumptions) out += "  - " + a + "\n";
    }
    if (!rec.unrecognised.empty()) {
      out += "\nparts on the mains in no recognised block:";
      for (std::size_t p : rec.unrecognised) out += " " + rec.devices.parts[p].ref;
      out += "\n";
    }
  }
  bool header = false;
  for (std::size_t fi = 0; fi < r.findings.size(); ++fi) {
    if (shown.count(fi) != 0) continue;
    if (!header) out += "\nfindings outside blocks:\n";
    header = true;
    append_finding(out, r, r.findings[fi], o, "  ");
  }
  if (o.parts_table) append_rating_table(out, r);
  const std::vector<CitedBasis> bases = cited_bases(r.findings);
  if (!bases.empty()) {
    out += "\nbasis of each rule with findings:\n";
    for (const auto& b : bases) out += fmt::format("  [{}] {}\n", b.rule_id, b.basis);
  }
  const FindingCounts c = count_findings(r.findings);
  out += fmt::format("\nsummary: {} error(s), {} warning(s), {} note(s)", c.errors, c.warnings, c.notes);
  if (c.waived != 0) out += fmt::format(", {} waived", c.waived);
  if (r.baseline_matched != 0) out += fmt::format(", {} already in the baseline (not shown)", r.baseline_matched);
  if (r.status != CheckStatus::complete) out += fmt::format("; CHECK INCOMPLETE: {}", r.failure);
  out += "\n";
  out += kSafetyCaution;
  out += "\n";
  return out;
}

}  // namespace mainscheck::report
