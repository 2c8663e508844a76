// Hostile and malformed inputs that cannot live in tests/data/bad as files: empty files, a 100 MB
// line, and the same deck with different line endings (generated into a temporary directory at test
// time). Each run of the built CLI is bounded in wall time and in peak memory (wait4 rusage of the
// child); the bounds are generous, they catch hangs and blow-ups, they are not performance tests.
#include <gtest/gtest.h>
#include <sys/stat.h>

#include <chrono>
#include <filesystem>
#include <string>
#include <vector>

#include "support/cli_runner.hpp"

namespace mainscheck::parser {
namespace {

namespace fs = std::filesystem;
using test_support::ProcessResult;
using test_support::TempDir;
using test_support::write_file;

constexpr auto kCpuBound = std::chrono::seconds(20);  // the 100 MB line: 0.7 s plain, 6.5 s under ASan+UBSan
constexpr auto kTimeBound = std::chrono::seconds(60);   // wall clock, for a child that blocks
constexpr long kMemoryBound_kB = 500 * 1024;

/// Runs `mainscheck ARGS...` in `dir`, bounded in time; asserts it ended by itself within the bounds.
ProcessResult run_in(const fs::path& dir, const std::vector<std::string>& args) {
  std::vector<std::string> argv{MAINSCHECK_BINARY};
  argv.insert(argv.end(), args.begin(), args.end());
  test_support::ProcessOptions opt;
  opt.working_dir = dir.string();
  opt.timeout = kTimeBound;
  opt.env = {{"NO_COLOR", "1"}, {"SOURCE_DATE_EPOCH", test_support::kFixedEpoch}};
  ProcessResult r = test_support::run_process(argv, opt);
  EXPECT_TRUE(r.exited()) << "did not finish by itself: timed out=" << r.timed_out << " signal=" << r.term_signal
                          << "\n" << r.err;
  EXPECT_LT(r.max_rss_kB, kMemoryBound_kB) << "peak memory of the child";
  EXPECT_LT(r.cpu, kCpuBound) << "CPU time of the child";
  return r;
}

std::string first_line(const std::string& s) { return s.substr(0, s.find('\n')); }

TEST(HostileInput, EmptyFileIsAnErrorAtLineOne) {
  TempDir tmp("hostile");
  write_file(tmp.path() / "empty.cir", "");
  const ProcessResult r = run_in(tmp.path(), {"netlist", "empty.cir"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_EQ(first_line(r.err), "empty.cir:1:1: error: the netlist has no parts");
}

TEST(HostileInput, WhitespaceOnlyFileIsAnError) {
  TempDir tmp("hostile");
  write_file(tmp.path() / "blank.cir", "\n  \t\r\n\n");
  const ProcessResult r = run_in(tmp.path(), {"netlist", "blank.cir"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_EQ(first_line(r.err), "blank.cir:1:1: error: the netlist has no parts");
}

TEST(HostileInput, EmptyFileGivesNoCleanCheck) {
  TempDir tmp("hostile");
  write_file(tmp.path() / "empty.cir", "");
  const ProcessResult r = run_in(tmp.path(), {"-q", "check", "empty.cir"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("empty.cir:1:1: error: the netlist has no parts"), std::string::npos) << r.err;
}

TEST(HostileInput, HundredMegabyteLineIsRefusedWithinBounds) {
  TempDir tmp("hostile");
  std::string deck = "Harrow Lane Workshop kettle with a 100 MB line\nVIN a 0 DC 12\nR1 a 0 ";
  deck.append(100u << 20, '9');
  deck += "\nR2 a 0 1k\n";
  write_file(tmp.path() / "long.cir", deck);
  deck.clear();
  deck.shrink_to_fit();
  const ProcessResult r = run_in(tmp.path(), {"netlist", "long.cir"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_EQ(first_line(r.err),
            "long.cir:3:1: error: line is 104857607 bytes long, more than the limit of 1048576 bytes (--max-line-length)");
  // The quoted line is cut, not 100 MB of stderr.
  EXPECT_LT(r.err.size(), 4096u);
}

TEST(HostileInput, FileOverTheSizeLimitIsRefusedBeforeReading) {
  TempDir tmp("hostile");
  std::string deck = "Harrow Lane Workshop kettle\nVIN a 0 DC 12\n* ";
  deck.append(2u << 20, 'x');
  deck += "\nR1 a 0 1k\n";
  write_file(tmp.path() / "big.cir", deck);
  const ProcessResult r = run_in(tmp.path(), {"netlist", "--max-file-size", "1000000", "big.cir"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("1000000"), std::string::npos) << r.err;
  EXPECT_NE(r.err.find("--max-file-size"), std::string::npos) << r.err;
}

/// The deck with its LF line endings replaced by `eol`; `mixed` alternates LF and CRLF.
std::string with_line_endings(const std::string& lf_text, const std::string& eol, bool mixed = false) {
  std::string out;
  bool odd = false;
  for (char c : lf_text) {
    if (c != '\n') {
      out += c;
      continue;
    }
    out += (mixed && odd) ? std::string("\n") : eol;
    odd = !odd;
  }
  return out;
}

TEST(HostileInput, CrlfCrAndMixedLineEndingsReadLikeLf) {
  const std::string lf = test_support::slurp(fs::path(MAINSCHECK_SOURCE_DIR) / "examples" / "lamp-dimmer-triac.cir");
  ASSERT_FALSE(lf.empty());
  ASSERT_EQ(lf.find('\r'), std::string::npos);
  TempDir tmp("hostile");
  const std::vector<std::pair<std::string, std::string>> variants{
      {"lf", lf}, {"crlf", with_line_endings(lf, "\r\n")}, {"mixed", with_line_endings(lf, "\r\n", true)},
      {"cr", with_line_endings(lf, "\r")}};
  std::vector<std::string> listings, reports;
  for (const auto& [name, text] : variants) {
    fs::create_directory(tmp.path() / name);
    write_file(tmp.path() / name / "deck.cir", text);
    const ProcessResult n = run_in(tmp.path() / name, {"netlist", "--format", "json", "deck.cir"});
    EXPECT_EQ(n.exit_code, 0) << name << "\n" << n.err;
    listings.push_back(n.out);
    const ProcessResult c = run_in(tmp.path() / name, {"-q", "check", "--format", "json", "deck.cir"});
    reports.push_back(c.out + "exit " + std::to_string(c.exit_code) + "\n" + c.err);
  }
  EXPECT_FALSE(listings[0].empty());
  for (std::size_t i = 1; i < variants.size(); ++i) {
    EXPECT_EQ(listings[i], listings[0]) << variants[i].first << " netlist differs from LF";
    EXPECT_EQ(reports[i], reports[0]) << variants[i].first << " report differs from LF";
  }
}

TEST(HostileInput, Latin1InTitleAndCommentsIsAccepted) {
  TempDir tmp("hostile");
  write_file(tmp.path() / "latin1.cir",
             "Caf\xe9 lamp, 4,7 \xb5" "F\n* r\xe9sistance \xff\xfe\nVIN a 0 DC 12\nR1 a 0 1k ; 1 k\xa6\n");
  const ProcessResult r = run_in(tmp.path(), {"netlist", "latin1.cir"});
  EXPECT_EQ(r.exit_code, 0) << r.err;
  EXPECT_EQ(r.err, "");
}

TEST(HostileInput, MachineReadableReportsStayValidUtf8) {
  // A Latin-1 title is accepted (it reaches the netlist with U+FFFD for each malformed byte), and a
  // message about a non-ASCII element letter quotes the whole character. Both once made the JSON
  // writer throw (found by check_pipeline_fuzz).
  TempDir tmp("hostile");
  std::string deck = test_support::slurp(fs::path(MAINSCHECK_SOURCE_DIR) / "examples" / "nightlight-half-wave.cir");
  ASSERT_FALSE(deck.empty());
  deck = "Caf\xe9 night light, 4,7 \xb5" "F\n" + deck.substr(deck.find('\n') + 1);
  write_file(tmp.path() / "latin1.cir", deck);
  write_file(tmp.path() / "letter.cir", "t\nVIN a 0 DC 12\n\xd4\x8cubckt DIAC_HL A B\nR1 a 0 1k\n");
  for (const std::string format : {"json", "sarif"}) {
    const ProcessResult ok = run_in(tmp.path(), {"-q", "check", "--format", format, "latin1.cir"});
    EXPECT_EQ(ok.exit_code, 0) << format << "\n" << ok.err;
    EXPECT_EQ(ok.err.find("internal error"), std::string::npos) << ok.err;
    const ProcessResult bad = run_in(tmp.path(), {"-q", "check", "--format", format, "letter.cir"});
    EXPECT_EQ(bad.exit_code, 2) << format << "\n" << bad.err;
    EXPECT_EQ(bad.err.find("internal error"), std::string::npos) << bad.err;
    EXPECT_NE(bad.err.find("unknown element type '\xd4\x8c' in '\xd4\x8cubckt'"), std::string::npos) << bad.err;
  }
  const ProcessResult listing = run_in(tmp.path(), {"netlist", "--format", "json", "latin1.cir"});
  EXPECT_EQ(listing.exit_code, 0) << listing.err;
  EXPECT_NE(listing.out.find("Caf\xef\xbf\xbd night light"), std::string::npos) << listing.out.substr(0, 400);
}

TEST(HostileInput, ValidUtf8InStatementsIsAccepted) {
  TempDir tmp("hostile");
  write_file(tmp.path() / "utf8.cir", "lamp\nVIN n\xc3\xa9ud 0 DC 12\nR1 n\xc3\xa9ud 0 1k\n");
  const ProcessResult r = run_in(tmp.path(), {"netlist", "utf8.cir"});
  EXPECT_EQ(r.exit_code, 0) << r.err;
}

TEST(HostileInput, IncludeOfAFifoOutsideTheTreeIsRefusedWithoutOpeningIt) {
  // Opening a FIFO blocks until a writer appears; confinement must be decided before any open.
  TempDir tmp("hostile");
  ASSERT_EQ(::mkfifo((tmp.path() / "pipe").c_str(), 0600), 0);
  fs::create_directory(tmp.path() / "deck");
  write_file(tmp.path() / "deck" / "top.cir", "Harrow Lane Workshop kettle\nVIN a 0 DC 12\n.include ../pipe\nR1 a 0 1k\n");
  const ProcessResult r = run_in(tmp.path() / "deck", {"netlist", "top.cir"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_EQ(first_line(r.err).rfind("top.cir:3:10: error: include file '../pipe' resolves to", 0), 0u) << r.err;
  EXPECT_NE(r.err.find("outside the netlist's directory"), std::string::npos) << r.err;
}

TEST(HostileInput, SubcircuitBombIsRefusedInWellUnderASecond) {
  std::string deck = "Harrow Lane Workshop: 2^60 resistors\nVIN a 0 DC 12\n";
  for (int i = 0; i < 60; ++i) {
    deck += ".subckt b" + std::to_string(i) + " a c\nX1 a c b" + std::to_string(i + 1) + "\nX2 a c b" +
            std::to_string(i + 1) + "\n.ends\n";
  }
  deck += ".subckt b60 a c\nR1 a c 1k\n.ends\nX0 a 0 b0\n";
  TempDir tmp("hostile");
  write_file(tmp.path() / "bomb.cir", deck);
  const ProcessResult r = run_in(tmp.path(), {"netlist", "bomb.cir"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("--max-parts"), std::string::npos) << r.err;
  // "Well under a second" (issue 8): CPU time, so a loaded host does not matter; sanitizers included.
  EXPECT_LT(r.cpu, std::chrono::seconds(1));
}

}  // namespace
}  // namespace mainscheck::parser
