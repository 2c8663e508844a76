// JUnit output against tests/data/schemas/junit.xsd (the Apache Ant JUnit schema), validated with
// xmllint from libxml2-utils, for one netlist, an analysis failure and a batch.
#include <gtest/gtest.h>

#include <string>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

const char* kJunitSchema = MAINSCHECK_SOURCE_DIR "/tests/data/schemas/junit.xsd";

void expect_junit_valid(const std::vector<std::string>& files) {
  const auto xmllint = find_program("xmllint");
  if (!xmllint) GTEST_SKIP() << "xmllint not on PATH (Debian package libxml2-utils)";
  ASSERT_TRUE(std::filesystem::exists(kJunitSchema)) << kJunitSchema;
  TempDir dir("junit");
  ASSERT_FALSE(dir.path().empty());
  std::vector<std::string> args{"-q", "check"};
  args.insert(args.end(), files.begin(), files.end());
  const auto file = dir.path() / "report.xml";
  args.insert(args.end(), {"--format", "text", "--output", "junit=" + file.string()});
  const ProcessResult r = run_mainscheck(args);
  ASSERT_TRUE(r.exited()) << r.error;
  ASSERT_TRUE(std::filesystem::exists(file)) << r.err;
  const std::string xml = slurp(file);
  // SOURCE_DATE_EPOCH=1767225600 is 2026-01-01T00:00:00Z; the report uses it instead of the clock.
  EXPECT_NE(xml.find("timestamp=\"2026-01-01T00:00:00\""), std::string::npos);
  const ProcessResult v = run_process({*xmllint, "--noout", "--schema", kJunitSchema, file.string()});
  ASSERT_TRUE(v.exited()) << v.error;
  EXPECT_EQ(v.exit_code, 0) << "JUnit does not validate:\n" << v.err;
}

TEST(JunitWriter, ValidatesAgainstSchemaForOneNetlist) { expect_junit_valid({"examples/bench-supply-bridge.cir"}); }

TEST(JunitWriter, ValidatesAgainstSchemaForAnAnalysisFailure) {
  expect_junit_valid({"examples/timer-capacitive-dropper.cir"});
}

TEST(JunitWriter, ValidatesAgainstSchemaForABatch) {
  expect_junit_valid({"examples/bench-supply-bridge.cir", "examples/lamp-dimmer-triac.cir"});
}

TEST(JunitWriter, AnErrorFindingIsAFailedTestCase) {
  const ProcessResult r = run_mainscheck({"-q", "check", "examples/bench-supply-bridge.cir", "--format", "junit"});
  ASSERT_TRUE(r.exited());
  EXPECT_EQ(r.exit_code, 1);
  // The fuse rated 250 V AC on a 253 V high line (230 V + 10 %) is an error, so a failed case.
  EXPECT_EQ(r.out.find("failures=\"0\""), std::string::npos) << r.out.substr(0, 600);
  EXPECT_NE(r.out.find("<failure"), std::string::npos);
  EXPECT_NE(r.out.find("voltage-rating.fuse"), std::string::npos);
}

}  // namespace
}  // namespace mainscheck::test_support
