// Deterministic output (cli/check_pipeline.cpp, the batch pool in cli/check_command.cpp): the same
// input gives byte-identical JSON and SARIF, and a batch gives the same bytes whatever --jobs is.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <string>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

std::string output_of(const std::vector<std::string>& args) {
  const ProcessResult r = run_mainscheck(args);
  EXPECT_TRUE(r.exited()) << r.error;
  EXPECT_FALSE(r.out.empty()) << r.err;
  return r.out;
}

TEST(CheckDeterminism, SameInputGivesByteIdenticalJsonAndSarif) {
  for (const std::string format : {"json", "sarif"}) {
    const std::vector<std::string> args{"-q", "check", "examples/bench-supply-bridge.cir", "--format", format};
    EXPECT_EQ(output_of(args), output_of(args)) << format;
  }
}

TEST(CheckDeterminism, BatchOutputDoesNotDependOnJobs) {
  const std::vector<std::string> files{"examples/bench-supply-bridge.cir", "examples/lamp-dimmer-triac.cir",
                                       "tests/data/cli/fuse-underrated.cir", "tests/data/cli/clean-heater.cir"};
  for (const std::string format : {"json", "sarif", "junit", "text"}) {
    std::vector<std::string> one{"-q", "check", "--format", format, "--jobs", "1"};
    one.insert(one.end(), files.begin(), files.end());
    std::vector<std::string> two = one;
    two[5] = "2";
    const std::string serial = output_of(one);
    EXPECT_EQ(serial, output_of(two)) << format;
    // Reports appear in input order.
    if (format == "text") {
      EXPECT_LT(serial.find("examples/bench-supply-bridge.cir"), serial.find("examples/lamp-dimmer-triac.cir"));
      EXPECT_LT(serial.find("examples/lamp-dimmer-triac.cir"), serial.find("tests/data/cli/fuse-underrated.cir"));
    }
  }
}

TEST(CheckDeterminism, BatchJsonHoldsOneReportPerNetlistInOrder) {
  const ProcessResult r = run_mainscheck({"-q", "check", "--format", "json", "--jobs", "2",
                                          "tests/data/cli/fuse-underrated.cir", "tests/data/cli/clean-heater.cir"});
  const auto doc = nlohmann::json::parse(r.out);
  ASSERT_EQ(doc["reports"].size(), 2u);
  EXPECT_EQ(doc["reports"][0]["file"], "tests/data/cli/fuse-underrated.cir");
  EXPECT_EQ(doc["reports"][1]["file"], "tests/data/cli/clean-heater.cir");
}

}  // namespace
}  // namespace mainscheck::test_support
