// Hostile and malformed inputs that cannot live in tests/data/bad as files: empty files, a 100 MB
// line, and the same deck with different line endings (generated into a temporary directory at test
// time). Each run of the built CLI is bounded in wall time and in peak memory (wait4 rusage of the
// child); the bounds are generous, they catch hangs and blow-ups, they are not performance tests.
#include <gtest/gtest.h>
#include <sys/stat.h>
#include <unistd.h>

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

constexpr auto kCpuBound = std::chrono::seconds(20);   // the 100 MB line: 0.7 s plain, 6.5 s under ASan+UBSan
constexpr auto kTimeBound = std::chrono::seconds(60);  // wall clock, for a child that blocks
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
  EXPECT_TRUE(r.exited()) << "did not finish by itself: timed out=" << r.timed_out
                          << " signal=" << r.term_signal << "\n"
                          << r.err;
  EXPECT_LT(r.max_rss_kB, kMemoryBound_kB) << "peak memory of the child";
  EXPECT_LT(r.cpu, kCpuBound) << "CPU time of the child";
  return r;
}

std::string first_line(const std::string& s) {
  return s.substr(0, s.find('\n'));
}

std::size_t count_of(const std::string& text, const std::string& what) {
  std::size_t n = 0;
  for (std::size_t at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) ++n;
  return n;
}

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
            "long.cir:3:1: error: line is 104857607 bytes long, more than the limit of 1048576 bytes "
            "(--max-line-length)");
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
  const std::string lf =
      test_support::slurp(fs::path(MAINSCHECK_SOURCE_DIR) / "examples" / "lamp-dimmer-triac.cir");
  ASSERT_FALSE(lf.empty());
  ASSERT_EQ(lf.find('\r'), std::string::npos);
  TempDir tmp("hostile");
  const std::vector<std::pair<std::string, std::string>> variants{
      {"lf", lf},
      {"crlf", with_line_endings(lf, "\r\n")},
      {"mixed", with_line_endings(lf, "\r\n", true)},
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
             "Caf\xe9 lamp, 4,7 \xb5"
             "F\n* r\xe9sistance \xff\xfe\nVIN a 0 DC 12\nR1 a 0 1k ; 1 k\xa6\n");
  const ProcessResult r = run_in(tmp.path(), {"netlist", "latin1.cir"});
  EXPECT_EQ(r.exit_code, 0) << r.err;
  EXPECT_EQ(r.err, "");
}

TEST(HostileInput, MachineReadableReportsStayValidUtf8) {
  // A Latin-1 title is accepted (it reaches the netlist with U+FFFD for each malformed byte), and a
  // message about a non-ASCII element letter quotes the whole character. Both once made the JSON
  // writer throw (found by check_pipeline_fuzz).
  TempDir tmp("hostile");
  std::string deck =
      test_support::slurp(fs::path(MAINSCHECK_SOURCE_DIR) / "examples" / "nightlight-half-wave.cir");
  ASSERT_FALSE(deck.empty());
  deck =
      "Caf\xe9 night light, 4,7 \xb5"
      "F\n" +
      deck.substr(deck.find('\n') + 1);
  write_file(tmp.path() / "latin1.cir", deck);
  write_file(tmp.path() / "letter.cir", "t\nVIN a 0 DC 12\n\xd4\x8cubckt DIAC_HL A B\nR1 a 0 1k\n");
  for (const std::string format : {"json", "sarif"}) {
    const ProcessResult ok = run_in(tmp.path(), {"-q", "check", "--format", format, "latin1.cir"});
    EXPECT_EQ(ok.exit_code, 0) << format << "\n" << ok.err;
    EXPECT_EQ(ok.err.find("internal error"), std::string::npos) << ok.err;
    const ProcessResult bad = run_in(tmp.path(), {"-q", "check", "--format", format, "letter.cir"});
    EXPECT_EQ(bad.exit_code, 2) << format << "\n" << bad.err;
    EXPECT_EQ(bad.err.find("internal error"), std::string::npos) << bad.err;
    EXPECT_NE(bad.err.find("unknown element type '\xd4\x8c' in '\xd4\x8cubckt'"), std::string::npos)
        << bad.err;
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
  write_file(tmp.path() / "deck" / "top.cir",
             "Harrow Lane Workshop kettle\nVIN a 0 DC 12\n.include ../pipe\nR1 a 0 1k\n");
  const ProcessResult r = run_in(tmp.path() / "deck", {"netlist", "top.cir"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_EQ(first_line(r.err).rfind("top.cir:3:10: error: include file '../pipe' resolves to", 0), 0u)
      << r.err;
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

TEST(HostileInput, FifoAsTheDeckOrAnIncludeIsRefusedWithoutBlocking) {
  // Issue 15 item 16: opening a FIFO blocks until a writer appears, so it is refused before it is opened.
  TempDir tmp("hostile");
  ASSERT_EQ(::mkfifo((tmp.path() / "deck.cir").c_str(), 0600), 0);
  const ProcessResult top = run_in(tmp.path(), {"netlist", "deck.cir"});
  EXPECT_EQ(top.exit_code, 2);
  EXPECT_EQ(first_line(top.err),
            "mainscheck: error: cannot read netlist 'deck.cir': is a FIFO, not a regular file");
  ASSERT_EQ(::mkfifo((tmp.path() / "models.lib").c_str(), 0600), 0);
  write_file(tmp.path() / "top.cir",
             "Harrow Lane Workshop kettle\nVIN a 0 DC 12\n.include models.lib\nR1 a 0 1k\n");
  const ProcessResult inc = run_in(tmp.path(), {"netlist", "top.cir"});
  EXPECT_EQ(inc.exit_code, 2);
  EXPECT_EQ(first_line(inc.err),
            "top.cir:3:10: error: cannot read include file 'models.lib' (models.lib): is a FIFO, not a "
            "regular file");
}

TEST(HostileInput, DeviceNodesAreRefusedNotReadUntilMemoryRunsOut) {
  // /dev/zero never ends: linked into the tree as the deck, or included from a tree that allows it.
  TempDir tmp("hostile");
  ASSERT_EQ(::symlink("/dev/zero", (tmp.path() / "zero.cir").c_str()), 0);
  const ProcessResult top = run_in(tmp.path(), {"netlist", "zero.cir"});
  EXPECT_EQ(top.exit_code, 2);
  EXPECT_EQ(first_line(top.err),
            "mainscheck: error: cannot read netlist 'zero.cir': is a character device, not a regular file");
  write_file(tmp.path() / "top.cir",
             "Harrow Lane Workshop kettle\nVIN a 0 DC 12\n.include zero.cir\nR1 a 0 1k\n");
  const ProcessResult inc = run_in(tmp.path(), {"netlist", "--include-path", "/dev", "top.cir"});
  EXPECT_EQ(inc.exit_code, 2);
  EXPECT_EQ(
      first_line(inc.err),
      "top.cir:3:10: error: cannot read include file 'zero.cir' (zero.cir): is a character device, not a "
      "regular file");
  fs::create_directory(tmp.path() / "dir.cir");
  const ProcessResult dir = run_in(tmp.path(), {"netlist", "dir.cir"});
  EXPECT_EQ(dir.exit_code, 2);
  EXPECT_EQ(first_line(dir.err),
            "mainscheck: error: cannot read netlist 'dir.cir': is a directory, not a regular file");
}

TEST(HostileInput, StandardInputStopsAtTheSizeLimit) {
  // An endless stream on stdin: reading stops once the limit is passed instead of filling the memory.
  test_support::ProcessOptions opt;
  opt.timeout = kTimeBound;
  const std::string command =
      std::string("exec '") + MAINSCHECK_BINARY + "' netlist --max-file-size 1000000 - < /dev/zero";
  const ProcessResult r = test_support::run_process({"/bin/sh", "-c", command}, opt);
  ASSERT_TRUE(r.exited()) << r.error << r.err;
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_EQ(first_line(r.err),
            "mainscheck: error: standard input is larger than the limit of 1000000 bytes (--max-file-size)");
  EXPECT_LT(r.max_rss_kB, kMemoryBound_kB);
}

std::string nested_definitions(int depth) {
  std::string deck = "Harrow Lane Workshop kettle\nVIN a 0 DC 12\nR1 a 0 1k\n";
  for (int i = 0; i < depth; ++i) deck += ".subckt s" + std::to_string(i) + " a b\n";
  deck += "R1 a b 1k\n";
  for (int i = depth; i-- > 0;) deck += ".ends s" + std::to_string(i) + "\n";
  return deck;
}

TEST(HostileInput, FiftyThousandNestedDefinitionsGiveOneErrorOrReadLinearly) {
  // Issue 15 item 17: 50 000 nested `.subckt` definitions (1.6 MB) took quadratic time and gigabytes
  // (a path string per definition, one error per level beyond the limit).
  TempDir tmp("hostile");
  write_file(tmp.path() / "deep.cir", nested_definitions(50000));
  const ProcessResult r = run_in(tmp.path(), {"netlist", "deep.cir"});
  EXPECT_EQ(r.exit_code, 2);
  // Lines 1-3 are the title, VIN and R1; s0 opens on line 4 and s64 is the 65th level.
  EXPECT_EQ(first_line(r.err),
            "deep.cir:68:9: error: '.subckt' definitions are nested more than 64 deep "
            "(--max-subckt-depth)");
  EXPECT_EQ(count_of(r.err, "error:"), 1u) << r.err.substr(0, 2000);
  // Allowed by the limit, the same nest is read (and torn down) without recursion.
  const ProcessResult allowed = run_in(tmp.path(), {"netlist", "--max-subckt-depth", "50000", "deep.cir"});
  EXPECT_EQ(allowed.exit_code, 0) << allowed.err.substr(0, 2000);
}

TEST(HostileInput, PartLimitStopsReadingAtTheFirstElementBeyondIt) {
  // Issue 15 item 18: --max-parts is checked while the deck is read, before anything is built.
  std::string deck = "Harrow Lane Workshop kettle\nVIN a 0 DC 12\n";
  for (int i = 1; i <= 10; ++i) deck += "R" + std::to_string(i) + " a 0 1k\n";
  TempDir tmp("hostile");
  write_file(tmp.path() / "deck.cir", deck);
  const ProcessResult r = run_in(tmp.path(), {"netlist", "--max-parts", "5", "deck.cir"});
  EXPECT_EQ(r.exit_code, 2);
  // VIN and R1-R4 are five parts; R5 on line 7 is the sixth.
  EXPECT_EQ(first_line(r.err),
            "deck.cir:7:1: error: the netlist has more than 5 parts (--max-parts); reading stopped at R5");
  EXPECT_EQ(count_of(r.err, "error:"), 1u) << r.err;
  EXPECT_EQ(run_in(tmp.path(), {"netlist", "--max-parts", "11", "deck.cir"}).exit_code, 0);
}

#if defined(__SANITIZE_ADDRESS__)
constexpr bool kSanitized = true;
#else
constexpr bool kSanitized = false;
#endif

TEST(HostileInput, MemoryPerPartIsBoundedOnAFlatBoard) {
  // Issue 15 item 18: 4.6 M resistor lines took 9-12 GB (2-2.6 kB a part). Measured now: 1.13 kB a
  // part above a one-part deck, plus the file (peak resident memory of the whole check, wait4
  // rusage); the issue's target of 1 kB is not reached yet (docs/robustness.md). The bound, 1.5 kB,
  // catches a return to the old figures without tripping on allocator noise.
  if (kSanitized) GTEST_SKIP() << "AddressSanitizer's shadow memory and redzones are not the program's";
  constexpr int kParts = 200000;
  const std::string head =
      "Harrow Lane Workshop board\n*@supply line=L neutral=N mains=230V+-10%/50Hz\n"
      "V1 L N SIN(0 325.27 50)\n*@part RF1 type=fuse i_rated=5 v_rated_ac=300 i2t_melt=50\n"
      "RF1 L LF 0.02\n";
  std::string deck = head;
  for (int i = 0; i < kParts; ++i)
    deck += "R" + std::to_string(i + 2) + " N" + std::to_string(i) + " N" + std::to_string(i + 1) + " 1k\n";
  TempDir tmp("hostile");
  write_file(tmp.path() / "small.cir", head + "R2 N0 N1 1k\n");
  write_file(tmp.path() / "board.cir", deck);
  const ProcessResult small = run_in(tmp.path(), {"-q", "check", "small.cir"});
  const ProcessResult board = run_in(tmp.path(), {"-q", "check", "board.cir"});
  ASSERT_TRUE(small.exited() && board.exited());
  const long file_kB = static_cast<long>(deck.size() / 1024);
  const long budget_kB = file_kB + kParts * 1500L / 1024;
  EXPECT_LT(board.max_rss_kB - small.max_rss_kB, budget_kB)
      << "peak " << board.max_rss_kB << " kB for " << kParts << " parts, " << small.max_rss_kB
      << " kB for one";
}

}  // namespace
}  // namespace mainscheck::parser
