#include "report/html_writer.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <set>

#include "report/html_diagram.hpp"
#include "report/html_plots.hpp"
#include "report/markup.hpp"
#include "report/svg_plot.hpp"
#include "report/tool_info.hpp"
#include "report/units.hpp"
#include "report/batch_summary.hpp"
#include "report/rating_table.hpp"
#include "report/verdicts.hpp"

namespace mainscheck::report {

namespace {

using analysis::Quantity;

// Inline so the page needs nothing else; system fonts only.
constexpr const char* kStyle = R"(body{font-family:sans-serif;font-size:14px;color:#1a1a1a;margin:0 auto;max-width:1180px;padding:0 16px 32px}
h1{font-size:22px;margin:16px 0 8px}h2{font-size:19px;border-bottom:2px solid #345;padding-bottom:2px;margin-top:28px}
h3{font-size:16px;margin:20px 0 6px}h4{font-size:14px;margin:14px 0 4px}
.caution{border:3px solid #b00020;background:#fff0f0;padding:10px 14px;font-weight:bold;margin:12px 0}
.verdict{display:inline-block;padding:4px 12px;border-radius:4px;font-weight:bold;color:#fff}
.v-fail{background:#b00020}.v-warnings{background:#8a3ab9}.v-notes{background:#00748f}.v-pass{background:#2e7d32}
.v-unverified{background:#5f4b00}
table{border-collapse:collapse;margin:6px 0 10px}th,td{border:1px solid #ccc;padding:3px 7px;text-align:left;vertical-align:top}
th{background:#eef2f6}td.num{text-align:right;white-space:nowrap}
.sev-error{color:#b00020;font-weight:bold}.sev-warning{color:#8a3ab9;font-weight:bold}.sev-note{color:#00748f;font-weight:bold}
tr.waived td{color:#666}.unverified{color:#5f4b00;font-weight:bold}
.block{border-left:4px solid #345;padding-left:12px;margin:18px 0}
figure{margin:8px 0}svg{max-width:100%;height:auto}.plots{display:flex;flex-wrap:wrap;gap:0 16px}
.findings td:nth-child(4){min-width:20em}.findings td:nth-child(9){font-size:12px}
.rv-fail{color:#b00020;font-weight:bold}.rv-unknown{color:#5f4b00;font-weight:bold}.rv-pass{color:#2e7d32}
.rv-not-applicable{color:#666}.v-na{background:#777}dl.bases dd{margin:0 0 8px 20px;font-size:13px}
.diagram rect{fill:#f4f7fb;stroke:#345}.diagram .mains rect{fill:#fff6e0;stroke:#8a5a00}
.wire{fill:none;stroke:#345;stroke-width:1.5}.head{fill:#345}
.tables{display:flex;flex-wrap:wrap;gap:0 28px;align-items:flex-start}
.muted{color:#666}footer{margin-top:32px;font-size:12px;color:#555}
)";

std::string esc(std::string_view s) { return escape_markup(s); }

std::string net_name(const CheckReport& r, parser::NetId n) { return r.recognition->devices.net(n).name; }

std::string where(const CheckReport& r, parser::SourceLoc loc) {
  if (!loc.valid() || r.sources == nullptr) return r.file;
  const parser::LineCol lc = r.sources->line_col(loc);
  return fmt::format("{}:{}:{}", r.sources->name(loc.file), lc.line, lc.column);
}


const char* verdict_class(Verdict v) {
  switch (v) {
    case Verdict::pass: return "v-pass";
    case Verdict::notes: return "v-notes";
    case Verdict::warnings: return "v-warnings";
    case Verdict::fail: return "v-fail";
    case Verdict::unverified: return "v-unverified";
    case Verdict::not_applicable: return "v-na";
  }
  return "v-unverified";
}

std::string verdict_badge(const CheckReport& r) {
  const Verdict v = overall_verdict(r);
  const FindingCounts c = count_findings(r.findings);
  std::string text = fmt::format("{}: {} error(s), {} warning(s), {} note(s)", verdict_name(v), c.errors, c.warnings,
                                 c.notes);
  if (r.status != CheckStatus::complete) text += " — check incomplete, results not verified";
  return fmt::format("<span class=\"verdict {}\">{}</span>", verdict_class(v), esc(text));
}

std::string rule_link(const std::string& id) {
  return fmt::format("<a href=\"{}\">{}</a>", esc(rule_doc_uri(id)), esc(id));
}

void findings_table(std::string& out, const CheckReport& r, const std::vector<const rules::Finding*>& fs) {
  if (fs.empty()) {
    out += "<p class=\"muted\">No findings.</p>\n";
    return;
  }
  out += "<table class=\"findings\">\n<thead><tr><th>severity</th><th>rule</th><th>part</th><th>finding</th>"
         "<th>measured</th><th>limit</th><th>margin</th><th>corner</th><th>location</th></tr></thead>\n"
         "<tbody>\n";
  for (const rules::Finding* f : fs) {
    const char* sev = parser::severity_name(f->severity);
    std::string parts;
    for (const auto& p : f->parts) parts += (parts.empty() ? "" : ", ") + esc(p);
    std::string msg = esc(f->message);
    for (const auto& n : f->notes) msg += "<br><span class=\"muted\">note: " + esc(n.message) + "</span>";
    if (f->waived_by) msg += "<br><strong>waived</strong> by " + esc(*f->waived_by);
    std::string measured = "—", limit = "—", margin = "—", corner = "—";
    if (f->measurement) {
      const auto& m = *f->measurement;
      measured = esc(format_si(m.value, m.unit));
      limit = esc(format_si(m.limit, m.unit));
      margin = esc(format_margin(m.margin()));
      if (!m.corner.empty()) corner = esc(m.corner);
    }
    out += fmt::format(
        "<tr class=\"{}\"><td class=\"sev-{}\">{}</td><td>{}</td><td>{}</td><td>{}</td><td class=\"num\">{}</td>"
        "<td class=\"num\">{}</td><td class=\"num\">{}</td><td>{}</td><td>{}</td></tr>\n",
        f->waived_by ? "waived" : "", sev, sev, rule_link(f->rule_id), parts, msg, measured, limit, margin, corner,
        esc(where(r, f->loc)));
  }
  out += "</tbody>\n</table>\n";
}

std::string role_of(const analysis::Block& b, std::size_t part) {
  std::string out;
  for (const auto& [role, members] : b.roles) {
    if (std::find(members.begin(), members.end(), part) != members.end()) out += (out.empty() ? "" : ", ") + role;
  }
  return out;
}

void stress_table(std::string& out, const CheckReport& r, const analysis::Block& b) {
  if (r.stress == nullptr) return;
  std::string rows;
  for (std::size_t part : b.parts()) {
    const analysis::PartStress* ps = r.stress->find(part);
    if (ps == nullptr) continue;
    std::string row = fmt::format("<tr><td>{}</td><td>{}</td>", esc(r.recognition->devices.parts[part].ref),
                                  esc(role_of(b, part)));
    for (Quantity q : analysis::kAllQuantities) {
      const analysis::StressValue* v = ps->get(q);
      row += fmt::format("<td class=\"num\">{}</td>", v ? esc(format_si(v->value, analysis::quantity_unit(q))) : "—");
    }
    const analysis::StressValue* primary = ps->get(Quantity::v_peak);
    rows += row + fmt::format("<td>{}</td></tr>\n", primary ? esc(primary->corner) : "—");
  }
  if (rows.empty()) return;
  out += "<table class=\"stress\">\n<caption>stresses at each quantity's worst corner</caption>\n<thead><tr><th>part</th>"
         "<th>role</th>";
  for (Quantity q : analysis::kAllQuantities) out += fmt::format("<th>{}</th>", analysis::quantity_name(q));
  out += "<th>corner (v_peak)</th></tr></thead>\n<tbody>\n" + rows + "</tbody>\n</table>\n";
}

void block_section(std::string& out, const CheckReport& r, std::size_t bi, const std::string& prefix,
                   std::set<const rules::Finding*>& shown) {
  const auto& b = r.recognition->blocks[bi];
  out += fmt::format("<section class=\"block\" id=\"{}\">\n<h4>{} {}{}</h4>\n", esc(prefix + markup_id(b.id)),
                     esc(b.id), esc(b.kind), b.variant.empty() ? "" : " (" + esc(b.variant) + ")");
  std::string ins, outs;
  for (auto n : b.inputs) ins += (ins.empty() ? "" : ", ") + esc(net_name(r, n));
  for (const auto& o : b.outputs)
    outs += (outs.empty() ? "" : ", ") + esc(net_name(r, o.net) + " − " + net_name(r, o.ret)) + (o.ac ? " (ac)" : "");
  out += fmt::format("<p>in: {} · out: {}</p>\n", ins.empty() ? "—" : ins, outs.empty() ? "—" : outs);
  const analysis::BlockStress* bs = nullptr;
  if (r.stress != nullptr) {
    for (const auto& s : r.stress->blocks) {
      if (s.block == bi) bs = &s;
    }
  }
  if (bs != nullptr && !bs->converged) out += "<p class=\"unverified\">stresses not verified: " + esc(bs->failure) + "</p>\n";
  if (bs != nullptr && !bs->outputs.empty()) {
    out += "<table class=\"outputs\">\n<thead><tr><th>output</th><th>v_dc</th><th>v_ripple_pp</th><th>v_rms</th>"
           "<th>corner</th></tr></thead>\n<tbody>\n";
    for (const auto& os : bs->outputs) {
      out += fmt::format(
          "<tr><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td>{}</td></tr>\n",
          esc(net_name(r, os.net) + " − " + net_name(r, os.ret)), os.v_dc ? esc(format_si(os.v_dc->value, "V")) : "—",
          os.v_ripple_pp ? esc(format_si(os.v_ripple_pp->value, "V")) : "—",
          os.v_rms ? esc(format_si(os.v_rms->value, "V")) : "—", os.v_dc ? esc(os.v_dc->corner) : "—");
    }
    out += "</tbody>\n</table>\n";
  }
  stress_table(out, r, b);
  if (r.stress != nullptr) {
    const std::vector<Plot> plots = block_plots(*r.stress, b.id, b.id + " " + b.kind);
    if (!plots.empty()) {
      out += "<div class=\"plots\">\n";
      for (const Plot& p : plots) out += "<figure class=\"waveform\">\n" + svg_plot(p) + "</figure>\n";
      out += "</div>\n";
    }
  }
  std::vector<const rules::Finding*> fs;
  for (const auto& f : r.findings) {
    if (f.block == b.id) {
      fs.push_back(&f);
      shown.insert(&f);
    }
  }
  out += "<h4>findings</h4>\n";
  findings_table(out, r, fs);
  out += "</section>\n";
}

void summary_section(std::string& out, const CheckReport& r) {
  const FindingCounts c = count_findings(r.findings);
  out += "<section class=\"summary\">\n<h3>Summary</h3>\n<p>" + verdict_badge(r) + "</p>\n";
  if (r.status != CheckStatus::complete) out += "<p class=\"unverified\">check incomplete: " + esc(r.failure) + "</p>\n";
  out += "<div class=\"tables\">\n";
  out += fmt::format("<table class=\"counts\">\n<tbody><tr><th>errors</th><td class=\"num\">{}</td></tr>"
                     "<tr><th>warnings</th><td class=\"num\">{}</td></tr><tr><th>notes</th><td class=\"num\">{}</td></tr>"
                     "<tr><th>waived</th><td class=\"num\">{}</td></tr>"
                     "<tr><th>already in the baseline (not shown)</th><td class=\"num\">{}</td></tr></tbody>\n</table>\n",
                     c.errors, c.warnings, c.notes, c.waived, r.baseline_matched);
  if (r.recognition == nullptr) return void(out += "</div>\n</section>\n");
  const auto& s = r.recognition->supply;
  auto opt_net = [&](const std::optional<parser::NetId>& n) { return n ? esc(net_name(r, *n)) : std::string("none"); };
  out += "<table class=\"supply\">\n<caption>supply</caption>\n<tbody>\n";
  out += fmt::format("<tr><th>line / neutral / earth</th><td>{} / {} / {}</td></tr>\n", opt_net(s.line),
                     opt_net(s.neutral), opt_net(s.earth));
  if (s.mains) {
    auto range = [](const std::optional<double>& nom, const std::optional<double>& lo, const std::optional<double>& hi,
                    const char* unit) {
      std::string t = nom ? format_si(*nom, unit) : "—";
      if (lo && hi) t += " (" + format_si(*lo, unit) + " … " + format_si(*hi, unit) + ")";
      return t;
    };
    out += fmt::format("<tr><th>voltage</th><td>{}</td></tr>\n<tr><th>frequency</th><td>{}</td></tr>\n",
                       esc(range(s.mains->v_nominal_V, s.mains->v_min_V, s.mains->v_max_V, "V")),
                       esc(range(s.mains->f_nominal_Hz, s.mains->f_min_Hz, s.mains->f_max_Hz, "Hz")));
  }
  out += fmt::format("<tr><th>from</th><td>{}</td></tr>\n", esc(s.mains_from.what));
  if (r.stress != nullptr) {
    const auto& ss = r.stress->supply;
    if (ss.i_rms) out += fmt::format("<tr><th>supply current (rms)</th><td>{} ({})</td></tr>\n",
                                     esc(format_si(ss.i_rms->value, "A")), esc(ss.i_rms->corner));
    if (ss.i_peak) out += fmt::format("<tr><th>supply current (peak)</th><td>{} ({})</td></tr>\n",
                                      esc(format_si(ss.i_peak->value, "A")), esc(ss.i_peak->corner));
    if (ss.power_factor) out += fmt::format("<tr><th>power factor</th><td>{:.3f}</td></tr>\n", *ss.power_factor);
    if (r.stress->inrush) {
      const auto& in = *r.stress->inrush;
      out += fmt::format("<tr><th>inrush at switch-on</th><td>{} peak, {} I²t ({})</td></tr>\n",
                         esc(format_si(in.i_peak_A, "A")), esc(format_si(in.i2t_A2s, "A²s")), esc(in.corner));
    }
  }
  out += "</tbody>\n</table>\n";
  if (r.corners != nullptr && !r.corners->corners.empty()) {
    out += "<table class=\"corners\">\n<caption>supply corners</caption>\n<thead><tr><th>corner</th><th>v_rms</th>"
           "<th>f</th></tr></thead>\n<tbody>\n";
    for (const auto& co : r.corners->corners) {
      out += fmt::format("<tr><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>\n", esc(co.name),
                         esc(format_si(co.v_rms_V, "V")), esc(format_si(co.f_Hz, "Hz")));
    }
    out += "</tbody>\n</table>\n";
  }
  out += "</div>\n</section>\n";
}

/// The per-part rating table, worst first (sorted by margin: the page needs no script to sort it).
void ratings_section(std::string& out, const CheckReport& r) {
  const std::vector<RatingRow> rows = rating_rows(r);
  if (rows.empty()) return;
  const RatingCounts n = count_ratings(rows);
  out += fmt::format("<section class=\"ratings\">\n<h3>Part ratings</h3>\n<p>Worst first: {} fail, {} unknown, {} pass, "
                     "{} not applicable. The limit is the rating times the rule's derating; the margin is the "
                     "headroom as a fraction of the limit.</p>\n",
                     n.fail, n.unknown, n.pass, n.not_applicable);
  out += "<table class=\"ratings\">\n<thead><tr><th>part</th><th>type</th><th>block</th><th>rating</th><th>rated</th>"
         "<th>source</th><th>limit</th><th>stress</th><th>corner</th><th>margin</th><th>verdict</th></tr></thead>\n"
         "<tbody>\n";
  for (const RatingRow& row : rows) {
    const RatingCells c = rating_cells(row);
    out += fmt::format("<tr><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td class=\"num\">{}</td><td>{}</td>"
                       "<td class=\"num\">{}</td><td class=\"num\">{}</td><td>{}</td><td class=\"num\">{}</td>"
                       "<td class=\"rv-{}\">{}</td></tr>\n",
                       esc(row.ref), esc(row.type), row.block.empty() ? "—" : esc(row.block), esc(c.quantity),
                       esc(c.rated), esc(c.source), esc(c.limit), esc(c.stress), esc(c.corner), esc(c.margin),
                       c.verdict, esc(c.verdict));
  }
  out += "</tbody>\n</table>\n</section>\n";
}

/// What each rule with findings rests on, once per rule rather than on every finding.
void bases_section(std::string& out, const CheckReport& r) {
  const std::vector<CitedBasis> bases = cited_bases(r.findings);
  if (bases.empty()) return;
  out += "<section>\n<h3>Basis of each rule with findings</h3>\n<dl class=\"bases\">\n";
  for (const auto& b : bases) out += fmt::format("<dt>{}</dt><dd>{}</dd>\n", rule_link(b.rule_id), esc(b.basis));
  out += "</dl>\n</section>\n";
}

void list_section(std::string& out, const char* title, const std::vector<std::string>& items) {
  if (items.empty()) return;
  out += fmt::format("<section>\n<h3>{}</h3>\n<ul>\n", title);
  for (const auto& i : items) out += "<li>" + esc(i) + "</li>\n";
  out += "</ul>\n</section>\n";
}

/// One netlist's report as an <article>; ids start with `prefix` so several can share a page.
std::string report_article(const CheckReport& r, const std::string& prefix) {
  std::string out = fmt::format("<article id=\"{}report\">\n<h2>{}</h2>\n", esc(prefix), esc(r.file));
  summary_section(out, r);
  std::set<const rules::Finding*> shown;
  if (r.recognition != nullptr) {
    const std::string diagram = block_diagram_svg(r);
    if (!diagram.empty()) out += "<section class=\"diagram-section\">\n<h3>Blocks</h3>\n<figure>\n" + diagram + "</figure>\n";
    else out += "<section>\n<h3>Blocks</h3>\n<p class=\"muted\">No blocks recognised.</p>\n";
    for (std::size_t bi = 0; bi < r.recognition->blocks.size(); ++bi) block_section(out, r, bi, prefix, shown);
    out += "</section>\n";
    if (r.stress != nullptr) {
      const std::vector<Plot> inrush = inrush_plots(*r.stress);
      if (!inrush.empty()) {
        out += "<section class=\"inrush\">\n<h3>Inrush</h3>\n";
        for (const Plot& p : inrush) out += "<figure class=\"waveform\">\n" + svg_plot(p) + "</figure>\n";
        out += "</section>\n";
      }
    }
  }
  ratings_section(out, r);
  std::vector<const rules::Finding*> rest;
  for (const auto& f : r.findings) {
    if (shown.count(&f) == 0) rest.push_back(&f);
  }
  if (!rest.empty()) {
    out += "<section>\n<h3>Findings outside blocks</h3>\n";
    findings_table(out, r, rest);
    out += "</section>\n";
  }
  if (r.recognition != nullptr) {
    std::vector<std::string> unrec;
    for (std::size_t p : r.recognition->unrecognised) unrec.push_back(r.recognition->devices.parts[p].ref);
    list_section(out, "Parts on the mains in no recognised block", unrec);
  }
  bases_section(out, r);
  if (r.stress != nullptr) list_section(out, "Model assumptions", r.stress->assumptions);
  if (r.diagnostics != nullptr && r.sources != nullptr) {
    std::vector<std::string> diags;
    for (const auto& d : r.diagnostics->diagnostics()) {
      diags.push_back(fmt::format("{}: {}: {}", parser::format_location(d.loc, *r.sources),
                                  parser::severity_name(d.severity), d.message));
    }
    list_section(out, "Input diagnostics", diags);
  }
  out += "</article>\n";
  return out;
}

std::string page(const std::string& title, const std::string& body) {
  std::string out = "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n";
  out += "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n";
  out += "<title>" + esc(title) + "</title>\n<style>\n" + kStyle + "</style>\n</head>\n<body>\n";
  out += "<h1>" + esc(title) + "</h1>\n";
  out += std::string("<p class=\"caution\" role=\"note\">") + esc(kSafetyCaution) + "</p>\n";
  out += body;
  out += fmt::format("<footer>\n<p>{}</p>\n<p>mainscheck {}; rule pages: {}</p>\n</footer>\n</body>\n</html>\n",
                     esc(kSafetyCaution), esc(tool_version()), esc(doc_uri("rules/")));
  return out;
}

}  // namespace

std::string check_to_html(const CheckReport& r) {
  return page("mainscheck report: " + r.file, report_article(r, ""));
}

std::string checks_to_html(const std::vector<const CheckReport*>& reports) {
  if (reports.size() == 1) return check_to_html(*reports.front());
  std::string body = "<section class=\"batch\">\n<h2>Batch summary</h2>\n<table>\n<thead><tr><th>netlist</th>"
                     "<th>errors</th><th>warnings</th><th>notes</th><th>verdict</th><th>time</th></tr></thead>\n<tbody>\n";
  std::string articles;
  const std::vector<BatchRow> rows = batch_rows(reports);
  for (std::size_t i = 0; i < reports.size(); ++i) {
    const std::string prefix = fmt::format("r{}-", i + 1);
    const BatchRow& row = rows[i];
    body += fmt::format("<tr><td><a href=\"#{}report\">{}</a></td><td class=\"num\">{}</td><td class=\"num\">{}</td>"
                        "<td class=\"num\">{}</td><td>{}</td><td class=\"num\">{}</td></tr>\n",
                        prefix, esc(row.file), row.counts.errors, row.counts.warnings, row.counts.notes,
                        verdict_badge(*reports[i]), esc(format_elapsed(row.elapsed_s)));
    articles += report_article(*reports[i], prefix);
  }
  const BatchRow total = batch_total(rows);
  body += fmt::format("<tr><th>total ({} netlists)</th><td class=\"num\">{}</td><td class=\"num\">{}</td>"
                      "<td class=\"num\">{}</td><td><span class=\"verdict {}\">{}</span></td><td class=\"num\">{}</td>"
                      "</tr>\n",
                      rows.size(), total.counts.errors, total.counts.warnings, total.counts.notes,
                      verdict_class(total.verdict), esc(verdict_name(total.verdict)), esc(format_elapsed(total.elapsed_s)));
  body += "</tbody>\n</table>\n</section>\n" + articles;
  return page(fmt::format("mainscheck report: {} netlists", reports.size()), body);
}

}  // namespace mainscheck::report
