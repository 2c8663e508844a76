// Determinism across runs and thread counts for every report format (cli/check_command.cpp renders,
// report/ writes): the same files and options give byte-identical stdout and --output files, for
// SPICE and XML input, whatever --jobs is. check_pipeline_test.cpp covers JSON/SARIF/JUnit/text
// batches; this adds markdown and HTML, XML input and the --output files.
#include <gtest/gtest.h>

#include <string>
#include <vector>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

const std::vector<std::string> kFiles{"examples/bench_supply.xml", "examples/lamp-dimmer-triac.cir",
                                      "examples/dropper_timer.xml", "examples/flawed-night-light-dropper.cir"};
const std::vector<std::string> kFormats{"text", "json", "sarif", "junit", "markdown", "html"};

std::string run_batch(const std::string& format, const std::string& jobs) {
  std::vector<std::string> args{"-q", "check", "--format", format, "--jobs", jobs};
  args.insert(args.end(), kFiles.begin(), kFiles.end());
  const ProcessResult r = run_mainscheck(args);
  EXPECT_TRUE(r.exited()) << r.error;
  EXPECT_FALSE(r.out.empty()) << format << "\n" << r.err;
  return r.out + "\nexit " + std::to_string(r.exit_code) + "\n";
}

TEST(ReportDeterminism, EveryFormatIsByteIdenticalAcrossRunsAndJobs) {
  for (const auto& format : kFormats) {
    const std::string first = run_batch(format, "1");
    EXPECT_EQ(run_batch(format, "1"), first) << format << ": second serial run differs";
    EXPECT_EQ(run_batch(format, "2"), first) << format << ": --jobs 2 differs from --jobs 1";
    EXPECT_EQ(run_batch(format, "4"), first) << format << ": --jobs 4 differs from --jobs 1";
  }
}

TEST(ReportDeterminism, OutputFilesMatchAcrossJobs) {
  TempDir a("determinism"), b("determinism");
  auto run_to = [&](const std::filesystem::path& dir, const std::string& jobs) {
    // Files first: --output takes several values and would swallow the file names after it.
    std::vector<std::string> args{"-q", "check"};
    args.insert(args.end(), kFiles.begin(), kFiles.end());
    for (const std::string x : {"--format", "text", "--jobs", jobs.c_str()}) args.push_back(x);
    for (const auto& f : kFormats) args.push_back("--output=" + f + "=" + (dir / ("report." + f)).string());
    const ProcessResult r = run_mainscheck(args);
    EXPECT_TRUE(r.exited()) << r.error << r.err;
  };
  run_to(a.path(), "1");
  run_to(b.path(), "3");
  for (const auto& f : kFormats) {
    const std::string one = slurp(a.path() / ("report." + f));
    EXPECT_FALSE(one.empty()) << f;
    EXPECT_EQ(one, slurp(b.path() / ("report." + f))) << f;
  }
}

}  // namespace
}  // namespace mainscheck::test_support
