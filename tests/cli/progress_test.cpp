// The batch progress line (cli/progress.*): when it shows, what it writes, that it is cleared, and
// that a batch whose stderr is not a terminal never shows it.
#include "cli/progress.hpp"

#include <gtest/gtest.h>

#include <unistd.h>

#include <sstream>

#include "support/cli_runner.hpp"

namespace mainscheck::cli {
namespace {

using std::chrono::milliseconds;

TEST(ShowProgress, OnlyOnATerminalWithoutQuietForABatchThatTakesAMoment) {
  EXPECT_TRUE(show_progress(true, false, 12, milliseconds(501)));
  EXPECT_FALSE(show_progress(true, false, 12, milliseconds(500)));   // not yet a moment
  EXPECT_FALSE(show_progress(true, false, 12, milliseconds(100)));
  EXPECT_FALSE(show_progress(false, false, 12, milliseconds(5000)));  // not a terminal
  EXPECT_FALSE(show_progress(true, true, 12, milliseconds(5000)));    // --quiet
  EXPECT_FALSE(show_progress(true, false, 1, milliseconds(5000)));    // one netlist is no batch
}

TEST(ProgressText, SaysHowManyOfHowMany) { EXPECT_EQ(progress_text(3, 12), "checked 3/12 netlists"); }

TEST(ProgressLine, SilentBeforeTheDelayThenRewritesInPlaceAndClears) {
  std::ostringstream err;
  {
    ProgressLine p(err, true, 12);
    p.update(1, milliseconds(100));
    EXPECT_EQ(err.str(), "");
    p.update(3, milliseconds(600));
    EXPECT_EQ(err.str(), "\rchecked 3/12 netlists");
    p.update(3, milliseconds(700));  // unchanged: nothing written
    EXPECT_EQ(err.str(), "\rchecked 3/12 netlists");
    p.update(10, milliseconds(800));
    EXPECT_EQ(err.str(), "\rchecked 3/12 netlists\rchecked 10/12 netlists");
    p.finish();
  }
  const std::string blank(std::string("checked 10/12 netlists").size(), ' ');
  EXPECT_EQ(err.str(), "\rchecked 3/12 netlists\rchecked 10/12 netlists\r" + blank + "\r");  // cleared once
}

TEST(ProgressLine, DisabledWritesNothing) {
  std::ostringstream err;
  {
    ProgressLine p(err, false, 12);
    p.update(5, milliseconds(5000));
  }
  EXPECT_EQ(err.str(), "");
}

TEST(ProgressLine, QuickBatchLeavesNoTrace) {
  std::ostringstream err;
  {
    ProgressLine p(err, true, 4);
    p.update(4, milliseconds(20));
  }
  EXPECT_EQ(err.str(), "");
}

TEST(ProgressLine, BatchWithStderrNotATerminalShowsNoProgress) {
  // The test runner captures stderr through a pipe, so isatty() is false for the child.
  const auto r = test_support::run_mainscheck({"check", "examples/bench-supply-bridge.cir",
                                               "examples/lamp-dimmer-triac.cir", "examples/tool-voltage-doubler.cir",
                                               "--jobs", "1", "--format", "json"});
  ASSERT_TRUE(r.exited()) << r.err;
  EXPECT_EQ(r.err.find("checked "), std::string::npos) << r.err;
  EXPECT_EQ(r.err.find('\r'), std::string::npos) << r.err;
}

TEST(ProgressLine, BatchOnATerminalShowsAndClearsTheLine) {
  // util-linux `script` runs the check with a pseudo-terminal as stdin/stdout/stderr.
  if (::access("/usr/bin/script", X_OK) != 0) GTEST_SKIP() << "no /usr/bin/script (Debian package bsdutils)";
  // The example folder four times over, one at a time, so the batch outlasts the progress delay.
  const std::string cmd =
      std::string(MAINSCHECK_BINARY) + " check examples examples examples examples --jobs 1 --format json > /dev/null";
  test_support::ProcessOptions opt;
  opt.working_dir = MAINSCHECK_SOURCE_DIR;
  opt.timeout = std::chrono::seconds(300);
  opt.env = {{"NO_COLOR", "1"}, {"SOURCE_DATE_EPOCH", test_support::kFixedEpoch}};
  const auto r = test_support::run_process({"/usr/bin/script", "-qec", cmd, "/dev/null"}, opt);
  ASSERT_TRUE(r.exited()) << r.error << r.err;
  if (r.elapsed < std::chrono::milliseconds(800)) GTEST_SKIP() << "the batch finished before the progress delay";
  const std::size_t first = r.out.find("\rchecked ");
  ASSERT_NE(first, std::string::npos) << r.out;
  EXPECT_NE(r.out.find(" netlists", first), std::string::npos);
  // The last thing on the line is the clearing: carriage return, blanks, carriage return.
  const std::size_t last = r.out.rfind("\rchecked ");
  const std::size_t end = r.out.find(" netlists", last) + 9;
  const std::size_t clear = r.out.find('\r', end);
  ASSERT_NE(clear, std::string::npos);
  const std::size_t clear_end = r.out.find('\r', clear + 1);
  ASSERT_NE(clear_end, std::string::npos);
  EXPECT_EQ(r.out.substr(clear + 1, clear_end - clear - 1).find_first_not_of(' '), std::string::npos);
  EXPECT_GE(clear_end - clear - 1, end - last - 1);
}

}  // namespace
}  // namespace mainscheck::cli
