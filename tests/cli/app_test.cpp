// The command line's top level (cli/app.cpp) and each command's help: an unknown command is named and
// the commands listed; every --help lists the exit codes that command returns (docs/cli.md).
#include <gtest/gtest.h>

#include <string>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

TEST(App, UnknownCommandIsNamedAndTheCommandsListed) {
  const ProcessResult r = run_mainscheck({"chek", "examples/lamp-dimmer-triac.cir"});
  ASSERT_TRUE(r.exited()) << r.error;
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("mainscheck: error: unknown command 'chek'"), std::string::npos) << r.err;
  for (const char* c : {"netlist", "check", "rules", "explain", "diff"})
    EXPECT_NE(r.err.find(std::string("\n  ") + c + " "), std::string::npos) << c << "\n" << r.err;
  EXPECT_TRUE(r.out.empty());
}

TEST(App, NoCommandSaysOneIsRequired) {
  const ProcessResult r = run_mainscheck({"-q"});
  ASSERT_TRUE(r.exited()) << r.error;
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("mainscheck: error: a command is required"), std::string::npos) << r.err;
  EXPECT_NE(r.err.find("  check "), std::string::npos) << r.err;
}

TEST(App, EveryCommandHelpListsItsExitCodes) {
  struct Expect {
    const char* command;
    std::vector<std::string> lines;
  };
  const std::vector<Expect> cases{
      {"check",
       {"Exit codes:", "  0  completed; no finding at or above --fail-on", "  1  findings at or above --fail-on",
        "  2  usage error, or input that could not be read completely", "  3  the analysis could not complete"}},
      {"netlist", {"Exit codes:", "  0  the netlist was read completely", "  2  usage error"}},
      {"rules", {"Exit codes:", "  0  listed", "  2  usage error"}},
      {"explain", {"Exit codes:", "  0  printed", "  2  usage error or unknown rule id"}},
      {"diff", {"Exit codes:", "  0  compared", "  1  a new finding at or above --fail-on", "  2  usage error"}},
  };
  for (const auto& c : cases) {
    const ProcessResult r = run_mainscheck({c.command, "--help"});
    ASSERT_TRUE(r.exited()) << r.error;
    EXPECT_EQ(r.exit_code, 0) << c.command;
    for (const auto& l : c.lines) EXPECT_NE(r.out.find(l), std::string::npos) << c.command << ": " << l << "\n" << r.out;
  }
  const ProcessResult top = run_mainscheck({"--help"});
  EXPECT_NE(top.out.find("Exit codes:"), std::string::npos) << top.out;
}

}  // namespace
}  // namespace mainscheck::test_support
