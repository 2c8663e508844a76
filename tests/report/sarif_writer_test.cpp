// SARIF output against the official SARIF 2.1.0 schema (tests/data/schemas/sarif-schema-2.1.0.json,
// validated with python3-jsonschema), plus the properties code-scanning services rely on.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <set>
#include <string>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

const char* kSarifSchema = MAINSCHECK_SOURCE_DIR "/tests/data/schemas/sarif-schema-2.1.0.json";

// Validates a JSON file against a JSON schema; prints the first error and exits 1 when invalid.
const char* kValidate =
    "import json, sys, jsonschema\n"
    "schema = json.load(open(sys.argv[1]))\n"
    "doc = json.load(open(sys.argv[2]))\n"
    "cls = jsonschema.validators.validator_for(schema)\n"
    "errors = sorted(cls(schema).iter_errors(doc), key=lambda e: list(e.path))\n"
    "for e in errors[:5]: print(list(e.path), e.message)\n"
    "sys.exit(1 if errors else 0)\n";

void expect_schema_valid(const std::vector<std::string>& check_args) {
  const auto py = python_with_jsonschema();
  if (!py) GTEST_SKIP() << "no python3 on PATH can import jsonschema (Debian package python3-jsonschema)";
  ASSERT_TRUE(std::filesystem::exists(kSarifSchema)) << kSarifSchema;
  TempDir dir("sarif");
  ASSERT_FALSE(dir.path().empty());
  std::vector<std::string> args{"-q", "check"};
  args.insert(args.end(), check_args.begin(), check_args.end());
  args.insert(args.end(), {"--format", "sarif"});
  const ProcessResult r = run_mainscheck(args);
  ASSERT_TRUE(r.exited()) << r.error;
  ASSERT_FALSE(r.out.empty()) << r.err;
  const auto file = dir.path() / "report.sarif";
  write_file(file, r.out);
  const ProcessResult v = run_process({*py, "-c", kValidate, kSarifSchema, file.string()});
  ASSERT_TRUE(v.exited()) << v.error;
  EXPECT_EQ(v.exit_code, 0) << "SARIF does not validate:\n" << v.out << v.err;
}

TEST(SarifWriter, ValidatesAgainstSchemaForOneNetlist) { expect_schema_valid({"examples/bench-supply-bridge.cir"}); }

TEST(SarifWriter, ValidatesAgainstSchemaForAnAnalysisFailure) {
  expect_schema_valid({"examples/timer-capacitive-dropper.cir"});
}

TEST(SarifWriter, ValidatesAgainstSchemaForABatch) {
  expect_schema_valid({"examples/bench-supply-bridge.cir", "examples/lamp-dimmer-triac.cir"});
}

TEST(SarifWriter, MergedFindingsLocateEveryPart) {
  // Ten equal lamps over their rating (issue 15 item 11): one result per rating, every lamp a logical
  // location, each further lamp a related location at its own line; the log stays schema-valid.
  expect_schema_valid({"examples/festoon-lamp-string.cir"});
  const ProcessResult r = run_mainscheck({"-q", "check", "examples/festoon-lamp-string.cir", "--format", "sarif"});
  const auto doc = nlohmann::json::parse(r.out);
  int merged = 0;
  for (const auto& res : doc["runs"][0]["results"]) {
    if (res["ruleId"] != "series-string" || res["level"] != "error") continue;
    ++merged;
    EXPECT_EQ(res["locations"][0]["logicalLocations"].size(), 10u);
    ASSERT_EQ(res["relatedLocations"].size(), 9u) << res.dump();
    EXPECT_EQ(res["relatedLocations"][0]["message"]["text"], "RLP2: the same finding");
    EXPECT_EQ(res["relatedLocations"][0]["physicalLocation"]["region"]["startLine"], 8);
  }
  EXPECT_EQ(merged, 2);  // power and voltage, not twenty
}

TEST(SarifWriter, ResultsCarryRuleLocationAndFingerprint) {
  const ProcessResult r = run_mainscheck({"-q", "check", "examples/bench-supply-bridge.cir", "--format", "sarif"});
  ASSERT_TRUE(r.exited());
  const auto doc = nlohmann::json::parse(r.out);
  ASSERT_EQ(doc["runs"].size(), 1u);
  const auto& run = doc["runs"][0];
  std::set<std::string> rule_ids;
  for (const auto& rule : run["tool"]["driver"]["rules"]) {
    rule_ids.insert(rule["id"].get<std::string>());
    EXPECT_TRUE(rule.contains("helpUri")) << rule["id"];
    EXPECT_TRUE(rule.contains("help")) << rule["id"];
  }
  ASSERT_FALSE(run["results"].empty());
  std::set<std::string> fingerprints;
  for (const auto& res : run["results"]) {
    EXPECT_EQ(rule_ids.count(res["ruleId"].get<std::string>()), 1u) << res["ruleId"];
    const auto& loc = res["locations"][0]["physicalLocation"];
    EXPECT_EQ(loc["artifactLocation"]["uri"], "examples/bench-supply-bridge.cir");
    EXPECT_GT(loc["region"]["startLine"].get<int>(), 0);
    ASSERT_TRUE(res.contains("partialFingerprints"));
    for (const auto& [k, v] : res["partialFingerprints"].items()) fingerprints.insert(k + "=" + v.get<std::string>());
  }
  // Each finding is told apart by its fingerprint, or code scanning would merge them.
  EXPECT_EQ(fingerprints.size(), run["results"].size());
  // Errors keep the SARIF level "error"; the 250 V fuse on 230 V mains is none of them (its rated
  // voltage is compared with the 230 V nominal system voltage, IEC 60038, not the 253 V high line).
  bool fuse_finding = false, any_error = false;
  for (const auto& res : run["results"]) {
    fuse_finding = fuse_finding || res["ruleId"] == "voltage-rating.fuse";
    any_error = any_error || res["level"] == "error";
  }
  EXPECT_FALSE(fuse_finding);
  EXPECT_TRUE(any_error);
}

}  // namespace
}  // namespace mainscheck::test_support
