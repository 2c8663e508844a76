// `mainscheck diff OLD.json NEW.json` (cli/diff_command.cpp): new, gone and unchanged findings by
// fingerprint, exit 1 for a new unwaived finding at or above --fail-on, 2 for a file that is no report.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <string>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

class DiffCommand : public ::testing::Test {
 protected:
  void SetUp() override {
    ASSERT_FALSE(dir_.path().empty());
    clean_ = report("tests/data/cli/clean-heater.cir", "clean.json");
    fuse_ = report("tests/data/cli/fuse-underrated.cir", "fuse.json");
    warn_ = report("tests/data/cli/indicator-resistor-warm.cir", "warn.json");
  }
  std::string report(const std::string& netlist, const std::string& name) {
    const std::string path = (dir_.path() / name).string();
    const ProcessResult r = run_mainscheck({"-q", "check", netlist, "--format", "json", "--output", "json=" + path});
    EXPECT_TRUE(r.exited());
    return path;
  }
  TempDir dir_{"diff"};
  std::string clean_, fuse_, warn_;
};

TEST_F(DiffCommand, SameReportIsAllUnchanged) {
  const ProcessResult r = run_mainscheck({"diff", fuse_, fuse_});
  EXPECT_EQ(r.exit_code, 0);
  EXPECT_EQ(r.out.rfind("new findings:\n  none\ngone since the earlier report:\n  none\n", 0), 0u) << r.out;
  const auto doc = nlohmann::json::parse(slurp(fuse_));
  EXPECT_NE(r.out.find(std::to_string(doc["findings"].size()) + " unchanged\n"), std::string::npos) << r.out;
}

TEST_F(DiffCommand, NewErrorIsListedAndGates) {
  const ProcessResult r = run_mainscheck({"diff", clean_, fuse_});
  EXPECT_EQ(r.exit_code, 1);
  EXPECT_NE(r.out.find("new findings:\n  + tests/data/cli/fuse-underrated.cir:5: error: RF1 circuit voltage 230 V"),
            std::string::npos)
      << r.out;
  EXPECT_NE(r.out.find("[voltage-rating.fuse]"), std::string::npos);
  EXPECT_NE(r.out.find("gone since the earlier report:\n  none\n"), std::string::npos);
  EXPECT_NE(r.out.find(" unchanged\n"), std::string::npos);
  EXPECT_EQ(run_mainscheck({"diff", clean_, fuse_, "--fail-on", "never"}).exit_code, 0);
}

TEST_F(DiffCommand, GoneFindingDoesNotGate) {
  const ProcessResult r = run_mainscheck({"diff", fuse_, clean_});
  EXPECT_EQ(r.exit_code, 0);
  EXPECT_NE(r.out.find("new findings:\n  none\n"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("gone since the earlier report:\n  - tests/data/cli/fuse-underrated.cir:5: error:"),
            std::string::npos)
      << r.out;
}

TEST_F(DiffCommand, FailOnWarningGatesOnANewWarning) {
  EXPECT_EQ(run_mainscheck({"diff", clean_, warn_}).exit_code, 0);
  EXPECT_EQ(run_mainscheck({"diff", clean_, warn_, "--fail-on", "warning"}).exit_code, 1);
}

TEST_F(DiffCommand, FileThatIsNoReportExitsTwo) {
  const ProcessResult r = run_mainscheck({"diff", fuse_, "tests/data/cli/clean-heater.cir"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("is not a mainscheck JSON report"), std::string::npos) << r.err;
  EXPECT_EQ(run_mainscheck({"diff", fuse_}).exit_code, 2);
}

}  // namespace
}  // namespace mainscheck::test_support
