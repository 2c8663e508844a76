// Bad-input corpus: every malformed netlist in tests/data/bad/ (SPICE, *.cir) and
// tests/data/bad/xml/ (*.xml) is run through the built CLI as `mainscheck netlist FILE` from the
// repository root, so paths print relative, as given. Each case states what must happen in its own
// first lines (the error list is section K of spice-syntax.md; XML cases follow docs/xml-format.md).
//
// Expectation header: among the first 15 lines of a case, one line per expected error,
//     * expect: [exit=N] at=FILE:LINE:COL [via=FILE:LINE:COL ...] message=TEXT
// or in XML cases the same inside a comment:  <!-- expect: ... -->
//   exit=N     exit status of the run; must appear on at least one line of the case (2 = input error)
//   at=        the error's location exactly as printed before ": error: " (FILE relative to the repo root)
//   via=       "In file included from FILE:LINE:COL:" lines printed right above the error, innermost
//              first, one via= per level
//   message=   a substring of the error's message; it runs to the end of the line (in XML to " -->")
//              and so must come last
// Checked for every case:
//   - the exit status;
//   - each expected error is on stderr as `AT: error: ...TEXT...`, preceded by its via= lines and
//     followed by the quoted physical line of FILE and a caret under COL (the render_diagnostic form);
//   - the number of error lines equals the number of expectations: no missed and no cascaded errors;
//   - the run finishes within kRunBound (wall) and kCpuBound (CPU), and its peak resident memory (wait4 rusage of the child) stays
//     under kMemoryBound_kB (generous: these bound hangs and blow-ups, they are not performance tests).
#include <gtest/gtest.h>

#include <algorithm>
#include <cctype>
#include <chrono>
#include <filesystem>
#include <fstream>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include "support/process_runner.hpp"

namespace mainscheck::parser {
namespace {

namespace fs = std::filesystem;
using test_support::split_lines;

constexpr auto kRunBound = std::chrono::seconds(30);  // wall clock: only catches a child that blocks
constexpr long kMemoryBound_kB = 500 * 1024;
constexpr auto kCpuBound = std::chrono::seconds(5);
constexpr std::size_t kHeaderLines = 15;

const fs::path kRepoRoot = fs::path(MAINSCHECK_SOURCE_DIR);

/// One expected error of a case.
struct ExpectedError {
  std::string at;                // "tests/data/bad/x.cir:4:1"
  std::vector<std::string> via;  // include chain, innermost first
  std::string message;           // substring of the message
};

/// What a case file says must happen.
struct CaseExpectation {
  std::optional<int> exit_code;
  std::vector<ExpectedError> errors;
  std::string problem;  // a malformed header
};

std::string trim(std::string s) {
  const auto b = s.find_first_not_of(" \t");
  if (b == std::string::npos) return {};
  const auto e = s.find_last_not_of(" \t");
  return s.substr(b, e - b + 1);
}

/// Parses the `expect:` lines of a case (format at the top of this file).
CaseExpectation parse_expectation(const std::vector<std::string>& lines, bool xml) {
  CaseExpectation exp;
  for (std::size_t n = 0; n < lines.size() && n < kHeaderLines; ++n) {
    std::string line = lines[n];
    const std::size_t tag = line.find("expect:");
    if (tag == std::string::npos) continue;
    const std::string lead = trim(line.substr(0, tag));
    if (lead != (xml ? "<!--" : "*")) continue;
    std::string rest = line.substr(tag + 7);
    if (xml) {
      const std::size_t close = rest.rfind("-->");
      if (close == std::string::npos) {
        exp.problem = "line " + std::to_string(n + 1) + ": XML expect comment not closed on its line";
        return exp;
      }
      rest = rest.substr(0, close);
    }
    ExpectedError err;
    const std::size_t msg = rest.find("message=");
    if (msg == std::string::npos) {
      exp.problem = "line " + std::to_string(n + 1) + ": expect line without message=";
      return exp;
    }
    err.message = trim(rest.substr(msg + 8));
    std::istringstream keys(rest.substr(0, msg));
    std::string kv;
    while (keys >> kv) {
      const std::size_t eq = kv.find('=');
      const std::string key = kv.substr(0, eq);
      const std::string value = eq == std::string::npos ? "" : kv.substr(eq + 1);
      if (key == "exit" && !value.empty() && std::all_of(value.begin(), value.end(), ::isdigit)) {
        exp.exit_code = std::stoi(value);
      } else if (key == "at" && !value.empty()) {
        err.at = value;
      } else if (key == "via" && !value.empty()) {
        err.via.push_back(value);
      } else {
        exp.problem = "line " + std::to_string(n + 1) + ": unknown expect key '" + kv + "'";
        return exp;
      }
    }
    if (err.at.empty() || err.message.empty()) {
      exp.problem = "line " + std::to_string(n + 1) + ": expect line needs at= and a non-empty message=";
      return exp;
    }
    exp.errors.push_back(err);
  }
  if (exp.errors.empty()) exp.problem = "no expect: line in the first " + std::to_string(kHeaderLines) + " lines";
  if (!exp.exit_code && exp.problem.empty()) exp.problem = "no exit= in the expect lines";
  return exp;
}

std::vector<std::string> read_lines(const fs::path& p) {
  std::ifstream f(p, std::ios::binary);
  std::stringstream ss;
  ss << f.rdbuf();
  return split_lines(ss.str());
}

/// The two lines render_diagnostic prints under a diagnostic: the quoted physical line (control
/// characters shown as '?') and a caret under the column (tabs kept so the caret lines up).
std::pair<std::string, std::string> expected_quote(const std::string& at) {
  // at = FILE:LINE:COL; FILE itself has no colon in this corpus.
  const std::size_t c2 = at.rfind(':');
  const std::size_t c1 = at.rfind(':', c2 - 1);
  const fs::path file = kRepoRoot / at.substr(0, c1);
  const std::size_t line_no = std::stoul(at.substr(c1 + 1, c2 - c1 - 1));
  const std::size_t col = std::stoul(at.substr(c2 + 1));
  const auto lines = read_lines(file);
  if (line_no == 0 || line_no > lines.size()) return {"<line " + std::to_string(line_no) + " not in " + file.string() + ">", ""};
  const std::string& text = lines[line_no - 1];
  std::string quote = "  ", caret = "  ";
  for (char c : text) quote += (static_cast<unsigned char>(c) < 0x20 && c != '\t') ? '?' : c;
  for (std::size_t i = 0; i + 1 < col && i < text.size(); ++i) caret += text[i] == '\t' ? '\t' : ' ';
  caret += '^';
  return {quote, caret};
}

/// The case files: tests/data/bad/*.cir and tests/data/bad/xml/*.xml (included files are .inc/.lib).
std::vector<std::string> bad_cases() {
  std::vector<std::string> cases;
  auto collect = [&](const fs::path& dir, const std::string& ext) {
    std::error_code ec;
    for (const auto& e : fs::directory_iterator(kRepoRoot / dir, ec)) {
      if (e.is_regular_file() && e.path().extension() == ext) cases.push_back((dir / e.path().filename()).string());
    }
  };
  collect(fs::path("tests") / "data" / "bad", ".cir");
  collect(fs::path("tests") / "data" / "bad" / "xml", ".xml");
  std::sort(cases.begin(), cases.end());
  return cases;
}

std::string case_name(const ::testing::TestParamInfo<std::string>& info) {
  const fs::path p(info.param);
  std::string name = (p.extension() == ".xml" ? "xml_" : "") + p.stem().string();
  for (char& c : name)
    if (!std::isalnum(static_cast<unsigned char>(c))) c = '_';
  return name;
}

class BadInput : public ::testing::TestWithParam<std::string> {};

TEST_P(BadInput, ReportsLocatedErrorAndExitsWithInputError) {
  const std::string rel = GetParam();
  const bool xml = fs::path(rel).extension() == ".xml";
  const CaseExpectation exp = parse_expectation(read_lines(kRepoRoot / rel), xml);
  ASSERT_TRUE(exp.problem.empty()) << rel << ": " << exp.problem;

  test_support::ProcessOptions opt;
  opt.working_dir = kRepoRoot.string();
  opt.timeout = kRunBound;
  const auto run = test_support::run_process({MAINSCHECK_BINARY, "netlist", rel}, opt);
  ASSERT_TRUE(run.started) << run.error;
  ASSERT_FALSE(run.timed_out) << "mainscheck netlist " << rel << " did not finish within "
                              << std::chrono::duration_cast<std::chrono::seconds>(kRunBound).count() << " s";
  ASSERT_EQ(run.term_signal, 0) << "killed by signal " << run.term_signal << "\nstderr:\n" << run.err;
  EXPECT_EQ(run.exit_code, *exp.exit_code) << "stderr:\n" << run.err;
  EXPECT_LT(run.max_rss_kB, kMemoryBound_kB) << "peak memory of mainscheck netlist " << rel;
  EXPECT_LT(run.cpu, kCpuBound) << "CPU time of mainscheck netlist " << rel;

  const auto err_lines = split_lines(run.err);
  std::size_t error_lines = 0;
  for (const auto& l : err_lines)
    if (l.find(": error: ") != std::string::npos) ++error_lines;
  EXPECT_EQ(error_lines, exp.errors.size()) << "number of errors reported; stderr:\n" << run.err;

  for (const auto& want : exp.errors) {
    const std::string prefix = want.at + ": error: ";
    std::optional<std::size_t> hit;
    for (std::size_t i = 0; i < err_lines.size() && !hit; ++i) {
      if (err_lines[i].rfind(prefix, 0) == 0 && err_lines[i].find(want.message, prefix.size()) != std::string::npos) hit = i;
    }
    if (!hit) {
      ADD_FAILURE() << "expected `" << prefix << "...'" << want.message << "'...` on stderr:\n" << run.err;
      continue;
    }
    const auto [quote, caret] = expected_quote(want.at);
    EXPECT_EQ(*hit + 1 < err_lines.size() ? err_lines[*hit + 1] : "", quote) << "quoted line of " << want.at;
    EXPECT_EQ(*hit + 2 < err_lines.size() ? err_lines[*hit + 2] : "", caret) << "caret line of " << want.at;
    for (std::size_t v = 0; v < want.via.size(); ++v) {
      const std::size_t above = want.via.size() - v;  // printed innermost first; the outermost is right above
      const std::string expected_via = "In file included from " + want.via[v] + ":";
      const std::size_t row = *hit >= above ? *hit - above : err_lines.size();
      EXPECT_EQ(row < err_lines.size() ? err_lines[row] : "", expected_via) << "include chain of " << want.at;
    }
  }
}

INSTANTIATE_TEST_SUITE_P(Corpus, BadInput, ::testing::ValuesIn(bad_cases()), case_name);

TEST(BadInputCorpus, HasAtLeastFortyCases) { EXPECT_GE(bad_cases().size(), 40u); }

TEST(BadInputCorpus, HeaderParserReadsAllKeys) {
  const auto exp = parse_expectation(
      {"* expect: exit=2 at=a.cir:4:1 via=b.inc:2:1 via=a.cir:3:1 message=include cycle: a -> b", "R1 a b 1k"}, false);
  ASSERT_TRUE(exp.problem.empty()) << exp.problem;
  EXPECT_EQ(exp.exit_code, 2);
  ASSERT_EQ(exp.errors.size(), 1u);
  EXPECT_EQ(exp.errors[0].at, "a.cir:4:1");
  EXPECT_EQ(exp.errors[0].via, (std::vector<std::string>{"b.inc:2:1", "a.cir:3:1"}));
  EXPECT_EQ(exp.errors[0].message, "include cycle: a -> b");
  const auto x = parse_expectation({"<?xml version=\"1.0\"?>", "<!-- expect: exit=2 at=n.xml:3:5 message=no ref -->"}, true);
  ASSERT_TRUE(x.problem.empty()) << x.problem;
  EXPECT_EQ(x.errors.at(0).message, "no ref");
  EXPECT_FALSE(parse_expectation({"* expect: exit=2 message=x"}, false).problem.empty());
  EXPECT_FALSE(parse_expectation({"* expect: exit=2 at=a:1:1 colour=red message=x"}, false).problem.empty());
}

TEST(ProcessRunner, CapturesExitStatusAndBothStreams) {
  const auto r = test_support::run_process({"sh", "-c", "echo out; echo err >&2; exit 3"});
  ASSERT_TRUE(r.exited()) << r.error;
  EXPECT_EQ(r.exit_code, 3);
  EXPECT_EQ(r.out, "out\n");
  EXPECT_EQ(r.err, "err\n");
}

TEST(ProcessRunner, FeedsStdinAndRunsInWorkingDir) {
  test_support::ProcessOptions opt;
  opt.stdin_text = "R1 a b 1k\n";
  opt.working_dir = kRepoRoot.string();
  const auto r = test_support::run_process({"sh", "-c", "cat; test -f CMakeLists.txt && echo here"}, opt);
  ASSERT_TRUE(r.exited()) << r.error;
  EXPECT_EQ(r.out, "R1 a b 1k\nhere\n");
}

TEST(ProcessRunner, KillsAChildThatOutlivesItsTimeout) {
  test_support::ProcessOptions opt;
  opt.timeout = std::chrono::milliseconds(200);
  const auto r = test_support::run_process({"sleep", "30"}, opt);
  EXPECT_TRUE(r.timed_out);
  EXPECT_FALSE(r.exited());
  EXPECT_LT(r.elapsed, std::chrono::seconds(10));
}

TEST(ProcessRunner, MeasuresPeakMemoryAndCpuTimeOfTheChild) {
  const auto small = test_support::run_process({"sh", "-c", "exit 0"});
  const auto big = test_support::run_process({"python3", "-c", "x = b'x' * (200 * 1024 * 1024)"});
  ASSERT_TRUE(big.exited()) << big.error << big.err;
  EXPECT_GT(small.max_rss_kB, 0);
  EXPECT_LT(small.max_rss_kB, 100 * 1024);
  EXPECT_GT(big.max_rss_kB, 190 * 1024);
  const auto spin = test_support::run_process({"python3", "-c", "import time\nt = time.process_time()\nwhile time.process_time() - t < 0.3: pass"});
  EXPECT_GE(spin.cpu, std::chrono::milliseconds(250));
}

TEST(ProcessRunner, ReportsAProgramThatCannotStart) {
  const auto r = test_support::run_process({"/nonexistent/mainscheck-refcheck"});
  EXPECT_FALSE(r.started);
  EXPECT_NE(r.error.find("No such file"), std::string::npos) << r.error;
}

}  // namespace
}  // namespace mainscheck::parser
