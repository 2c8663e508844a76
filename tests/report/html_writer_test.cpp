// The HTML report (report/html_writer.*): page structure, the caution up front, one diagram box per
// block, stress tables with the JSON report's parts, the expected waveform plots, escaping of every
// netlist string, self-containment (nothing fetched, no scripts) and byte-identical output.
#include "report/html_writer.hpp"

#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "report/markup.hpp"
#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

std::size_t count(const std::string& hay, const std::string& needle) {
  std::size_t n = 0;
  for (std::size_t p = hay.find(needle); p != std::string::npos; p = hay.find(needle, p + needle.size())) ++n;
  return n;
}

/// The `<svg class="plot">` elements of a page, in order.
std::vector<std::string> plot_svgs(const std::string& html) {
  std::vector<std::string> out;
  for (std::size_t p = html.find("<svg class=\"plot\""); p != std::string::npos;
       p = html.find("<svg class=\"plot\"", p + 1)) {
    const std::size_t e = html.find("</svg>", p);
    out.push_back(html.substr(p, e == std::string::npos ? std::string::npos : e - p));
  }
  return out;
}

std::string html_of(const std::vector<std::string>& files, std::vector<std::string> extra = {}) {
  std::vector<std::string> args{"-q", "check"};
  args.insert(args.end(), files.begin(), files.end());
  args.insert(args.end(), {"--format", "html"});
  args.insert(args.end(), extra.begin(), extra.end());
  const ProcessResult r = run_mainscheck(args);
  EXPECT_TRUE(r.exited()) << r.error << r.err;
  return r.out;
}

TEST(HtmlWriter, PageStructureAndCautionFirst) {
  const std::string html = html_of({"examples/bench-supply-bridge.cir"});
  ASSERT_EQ(html.rfind("<!DOCTYPE html>\n<html lang=\"en\">", 0), 0u) << html.substr(0, 200);
  EXPECT_EQ(html.substr(html.size() - 8), "</html>\n");
  EXPECT_NE(html.find("<meta charset=\"utf-8\">"), std::string::npos);
  const std::string caution = report::escape_markup(report::kSafetyCaution);
  const std::size_t c = html.find("<p class=\"caution\" role=\"note\">" + caution + "</p>");
  ASSERT_NE(c, std::string::npos);
  EXPECT_LT(c, html.find("<article"));  // above everything else
  EXPECT_EQ(count(html, caution), 2u);  // and again in the footer
  // The example has errors (golden text report): the verdict says so.
  EXPECT_NE(html.find("<span class=\"verdict v-fail\">fail: "), std::string::npos);
  EXPECT_NE(html.find("<table class=\"corners\">"), std::string::npos);
  EXPECT_NE(html.find("<table class=\"supply\">"), std::string::npos);
}

TEST(HtmlWriter, DiagramBoxesAndStressTablesFollowTheJsonReport) {
  const std::string html = html_of({"examples/bench-supply-bridge.cir"});
  const ProcessResult j = run_mainscheck({"-q", "check", "examples/bench-supply-bridge.cir", "--format", "json"});
  const auto doc = nlohmann::json::parse(j.out);
  const auto& blocks = doc["blocks"];
  ASSERT_GE(blocks.size(), 2u);
  EXPECT_EQ(count(html, "<svg class=\"diagram\""), 1u);
  EXPECT_EQ(count(html, "<g class=\"box block\">"), blocks.size());
  EXPECT_EQ(count(html, "<g class=\"box mains\">"), 1u);
  // An arrow into every block box (from the mains or a transformer).
  EXPECT_GE(count(html, "<path class=\"wire\""), blocks.size());
  for (const auto& b : blocks) {
    const std::string id = b["id"];
    EXPECT_NE(html.find("<section class=\"block\" id=\"" + id + "\">"), std::string::npos) << id;
  }
  // Every part with stresses in the JSON report has a stress-table row (its ref in the first cell).
  std::size_t with_stress = 0;
  for (const auto& p : doc["parts"]) {
    const std::string ref = p["ref"];
    bool in_block = false;
    for (const auto& b : blocks)
      for (const auto& bp : b["parts"]) in_block = in_block || bp == ref;
    if (!in_block) continue;
    ++with_stress;
    EXPECT_NE(html.find("<tr><td>" + ref + "</td>"), std::string::npos) << ref;
  }
  EXPECT_GT(with_stress, 0u);
  // Findings: one row per finding, each rule linked to its page.
  EXPECT_EQ(count(html, "<tr class=\"\"><td class=\"sev-") + count(html, "<tr class=\"waived\"><td class=\"sev-"),
            doc["findings"].size());
  for (const auto& f : doc["findings"]) {
    const std::string rule = f["rule"];
    EXPECT_NE(html.find("/rules/" + rule + ".md\">" + rule + "</a>"), std::string::npos) << rule;
  }
}

TEST(HtmlWriter, BridgeRectifierPlotsDiodeCurrentsReservoirVoltageAndInrush) {
  const std::string html = html_of({"examples/bench-supply-bridge.cir"});
  const std::vector<std::string> plots = plot_svgs(html);
  // Bridge B2: the four diode currents in one plot, the P − M reservoir voltage in another; the
  // switch-on supply current in a third (analysis/waveforms.cpp picks these per block kind).
  ASSERT_EQ(plots.size(), 3u);
  EXPECT_EQ(count(plots[0], "<polyline class=\"trace\""), 4u);
  for (const char* d : {"D1 current", "D2 current", "D3 current", "D4 current"})
    EXPECT_NE(plots[0].find(d), std::string::npos) << d;
  EXPECT_EQ(count(plots[1], "<polyline class=\"trace\""), 1u);
  EXPECT_NE(plots[1].find("P − M voltage (reservoir C1)"), std::string::npos);
  EXPECT_EQ(count(plots[2], "<polyline class=\"trace\""), 1u);
  EXPECT_NE(plots[2].find("supply current at switch-on"), std::string::npos);
  EXPECT_NE(plots[2].find("time after switch-on (s)"), std::string::npos);
  // SI-prefixed tick labels on the time axis of a 50 Hz period.
  EXPECT_NE(plots[0].find(">10 ms</text>"), std::string::npos);
  for (const auto& p : plots) {
    // Each trace is bounded (StressOptions::waveform_points, 400).
    const std::size_t pts = p.find("points=\"");
    ASSERT_NE(pts, std::string::npos);
    EXPECT_LE(count(p.substr(pts, p.find('"', pts + 8) - pts), ","), 400u);
  }
}

TEST(HtmlWriter, PhaseControlPlotsTheTriacCurrentAtItsFiring) {
  const std::string html = html_of({"examples/lamp-dimmer-triac.cir"});
  const std::vector<std::string> plots = plot_svgs(html);
  ASSERT_GE(plots.size(), 1u);
  EXPECT_NE(plots[0].find("XT1 current (fired by XD1)"), std::string::npos);
}

TEST(HtmlWriter, MultiplierPlotsStageVoltagesAndDropperPlotsItsSeriesCurrent) {
  // tester-voltage-quadrupler: B3 symmetric quadrupler with stage capacitors C1–C4 (B2 a doubler).
  const std::string quad = html_of({"examples/tester-voltage-quadrupler.cir"});
  const std::vector<std::string> qp = plot_svgs(quad);
  bool stages = false;
  for (const auto& p : qp) {
    if (p.find("voltage-quadrupler: voltages") == std::string::npos) continue;
    stages = true;
    EXPECT_NE(p.find("POS − NEG voltage"), std::string::npos);
    for (const char* c : {"C2 voltage (stage)", "C4 voltage (stage)"}) EXPECT_NE(p.find(c), std::string::npos) << c;
  }
  EXPECT_TRUE(stages);
  // flawed-night-light-dropper: capacitive dropper C1 into a zener-regulated half-wave tail.
  const std::string drop = html_of({"examples/flawed-night-light-dropper.cir"});
  const std::vector<std::string> dp = plot_svgs(drop);
  ASSERT_GE(dp.size(), 2u);
  EXPECT_NE(dp[0].find("capacitive-dropper: current"), std::string::npos);
  EXPECT_NE(dp[0].find("C1 current"), std::string::npos);
  EXPECT_NE(dp[1].find("(reservoir C2)"), std::string::npos);
}

TEST(HtmlWriter, SelfContainedWithoutScriptsOrFetches) {
  const std::string html = html_of({"examples/bench-supply-bridge.cir", "examples/lamp-dimmer-triac.cir"});
  for (const char* banned : {"<script", "<link", "<img", "<iframe", "<object", "<embed", " src=", "@import", "url(",
                             "http://", "https://", " onload=", " onerror=", " onclick="}) {
    EXPECT_EQ(html.find(banned), std::string::npos) << banned;
  }
  // Links are in-page anchors or the installed rule pages (file://, like SARIF's helpUri).
  for (std::size_t p = html.find("href=\""); p != std::string::npos; p = html.find("href=\"", p + 1)) {
    const std::string target = html.substr(p + 6, html.find('"', p + 6) - p - 6);
    const bool anchor = target.rfind("#", 0) == 0;
    const bool doc = target.rfind("file://", 0) == 0 && target.find("/rules/") != std::string::npos &&
                     target.substr(target.size() - 3) == ".md";
    EXPECT_TRUE(anchor || doc) << target;
  }
}

TEST(HtmlWriter, EscapesEveryNetlistString) {
  TempDir dir("html-escape");
  ASSERT_FALSE(dir.path().empty());
  const auto deck = dir.path() / "x<script>.cir";
  write_file(deck,
             "escape test\n"
             "*@supply line=L neutral=N mains=230V/50Hz\n"
             "VMAINS L N SIN(0 325.27 50)\n"
             "R<script> L A 47\n"
             "D&x A DC<b> D1N4007\n"
             "*@part C1 v_rated=400\n"
             "C1 DC<b> N 10u\n"
             "RLOAD DC<b> N 33k\n"
             ".model D1N4007 D(IS=7n RS=0.04 N=1.9 BV=1000 IBV=5u)\n"
             ".end\n");
  const ProcessResult r = run_mainscheck({"-q", "check", deck.string(), "--format", "html"});
  ASSERT_TRUE(r.exited()) << r.err;
  ASSERT_FALSE(r.out.empty()) << r.err;
  EXPECT_EQ(r.out.find("<script"), std::string::npos);
  EXPECT_EQ(r.out.find("<b>"), std::string::npos);
  EXPECT_NE(r.out.find("R&lt;script&gt;"), std::string::npos);
  EXPECT_NE(r.out.find("D&amp;x"), std::string::npos);
  EXPECT_NE(r.out.find("DC&lt;b&gt;"), std::string::npos);
  // The names reach the diagram and the plot legends escaped as well.
  EXPECT_NE(r.out.find("diode: D&amp;x"), std::string::npos);
  EXPECT_NE(r.out.find(">D&amp;x current, "), std::string::npos);
}

TEST(HtmlWriter, EscapesFileNameAndFindingTextDirectly) {
  report::CheckReport r;
  r.file = "<img src=x onerror=alert(1)>.cir";
  r.status = report::CheckStatus::input_error;
  r.failure = "</p><script>x</script>";
  rules::Finding f;
  f.rule_id = "fuse";
  f.severity = rules::Severity::error;
  f.message = "F1 <rated> \"250 V\" & 'slow'";
  f.parts = {"F<1>"};
  f.basis = "<basis>";
  r.findings.push_back(f);
  const std::string html = report::check_to_html(r);
  EXPECT_EQ(html.find("<img"), std::string::npos);
  EXPECT_EQ(html.find("<script"), std::string::npos);
  EXPECT_EQ(html.find("<rated>"), std::string::npos);
  EXPECT_NE(html.find("&lt;img src=x onerror=alert(1)&gt;.cir"), std::string::npos);
  EXPECT_NE(html.find("F1 &lt;rated&gt; &quot;250 V&quot; &amp; &#39;slow&#39;"), std::string::npos);
  EXPECT_NE(html.find("F&lt;1&gt;"), std::string::npos);
  // An input error is never shown as a pass, even with the error finding removed.
  r.findings.clear();
  const std::string empty = report::check_to_html(r);
  EXPECT_EQ(empty.find("verdict v-pass"), std::string::npos);
  EXPECT_NE(empty.find("verdict v-unverified"), std::string::npos);
}

TEST(HtmlWriter, AnalysisFailureIsMarkedUnverified) {
  // A transistor straight across the mains: the solver has no transistor model (analysis failed).
  const std::string html = html_of({"tests/data/cli/bjt-across-mains.cir"});
  EXPECT_EQ(html.find("verdict v-pass"), std::string::npos);
  EXPECT_NE(html.find("check incomplete"), std::string::npos);
  EXPECT_NE(html.find("stresses not verified: "), std::string::npos);
}

TEST(HtmlWriter, BatchIsOnePageAndByteIdenticalAcrossJobs) {
  const std::vector<std::string> files{"examples/bench-supply-bridge.cir", "examples/lamp-dimmer-triac.cir",
                                       "examples/tester-voltage-quadrupler.cir"};
  const std::string one = html_of(files, {"--jobs", "1"});
  const std::string two = html_of(files, {"--jobs", "3"});
  const std::string again = html_of(files, {"--jobs", "3"});
  EXPECT_EQ(one, two);
  EXPECT_EQ(two, again);
  EXPECT_EQ(count(one, "<!DOCTYPE html>"), 1u);
  for (const char* id : {"r1-report", "r2-report", "r3-report"}) {
    EXPECT_NE(one.find(std::string("<article id=\"") + id + "\">"), std::string::npos) << id;
    EXPECT_NE(one.find(std::string("href=\"#") + id + "\""), std::string::npos) << id;
  }
}

TEST(HtmlWriter, OutputOptionWritesTheSamePage) {
  TempDir dir("html-output");
  ASSERT_FALSE(dir.path().empty());
  const auto file = dir.path() / "report.html";
  const ProcessResult r =
      run_mainscheck({"-q", "check", "examples/bench-supply-bridge.cir", "--output", "html=" + file.string()});
  ASSERT_TRUE(r.exited()) << r.err;
  EXPECT_EQ(slurp(file), html_of({"examples/bench-supply-bridge.cir"}));
}

}  // namespace
}  // namespace mainscheck::test_support
