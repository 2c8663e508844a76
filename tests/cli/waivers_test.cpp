// Waivers through the CLI (rules/waivers.cpp, docs/waivers.md): a live waiver marks its finding as
// waived without deleting it, an expired one stops waiving and says so, an unused one is a finding,
// and a malformed file is an input error located at file:line. Tests run at the fixed date
// 2026-01-01 (SOURCE_DATE_EPOCH=1767225600).
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <string>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

const std::string kNetlist = "tests/data/cli/fuse-underrated.cir";  // one error: voltage-rating.fuse on RF1

nlohmann::json check_json(const std::string& waivers, int& exit_code) {
  const ProcessResult r = run_mainscheck({"-q", "check", kNetlist, "--waivers", waivers, "--format", "json"});
  EXPECT_TRUE(r.exited());
  exit_code = r.exit_code;
  return nlohmann::json::parse(r.out, nullptr, false);
}

const nlohmann::json* find_rule(const nlohmann::json& doc, const std::string& rule) {
  for (const auto& f : doc["findings"])
    if (f["rule"] == rule) return &f;
  return nullptr;
}

TEST(Waivers, WaivedFindingIsReportedAndNoLongerGates) {
  int code = -1;
  const auto doc = check_json("tests/data/cli/waive-fuse.xml", code);
  ASSERT_FALSE(doc.is_discarded());
  EXPECT_EQ(code, 0);  // the waived error was the only one
  const auto* f = find_rule(doc, "voltage-rating.fuse");
  ASSERT_NE(f, nullptr) << "a waived finding must still be reported";
  ASSERT_TRUE((*f)["waived"].is_string());
  EXPECT_EQ((*f)["waived"].get<std::string>(),
            "T. Marsh, until 2026-06-30: 300 V fuse ordered; the 250 V part is accepted for the two bench prototypes only");
  EXPECT_EQ(doc["summary"]["errors"], 0);
  EXPECT_EQ(doc["summary"]["waived"], 1);

  const ProcessResult text = run_mainscheck({"-q", "check", kNetlist, "--waivers", "tests/data/cli/waive-fuse.xml"});
  EXPECT_NE(text.out.find("WAIVED by T. Marsh, until 2026-06-30: 300 V fuse ordered"), std::string::npos) << text.out;
  EXPECT_NE(text.out.find("1 waived"), std::string::npos);
  const ProcessResult sarif =
      run_mainscheck({"-q", "check", kNetlist, "--waivers", "tests/data/cli/waive-fuse.xml", "--format", "sarif"});
  const auto s = nlohmann::json::parse(sarif.out);
  bool suppressed = false;
  for (const auto& res : s["runs"][0]["results"])
    if (res["ruleId"] == "voltage-rating.fuse") suppressed = res.contains("suppressions") && !res["suppressions"].empty();
  EXPECT_TRUE(suppressed) << "SARIF marks a waived result with a suppression";
}

TEST(Waivers, ExpiredWaiverStopsWaivingAndWarns) {
  int code = -1;
  const auto doc = check_json("tests/data/cli/waive-fuse-expired.xml", code);  // expired 2025-12-31
  ASSERT_FALSE(doc.is_discarded());
  EXPECT_EQ(code, 1);
  const auto* f = find_rule(doc, "voltage-rating.fuse");
  ASSERT_NE(f, nullptr);
  EXPECT_TRUE((*f)["waived"].is_null());
  const auto* e = find_rule(doc, "waiver.expired");
  ASSERT_NE(e, nullptr);
  EXPECT_EQ((*e)["severity"], "warning");
  EXPECT_NE((*e)["message"].get<std::string>().find("expired on 2025-12-31"), std::string::npos);
  EXPECT_EQ((*e)["location"]["file"], "tests/data/cli/waive-fuse-expired.xml");
  EXPECT_EQ((*e)["location"]["line"], 3);
}

TEST(Waivers, WaiverThatMatchesNothingIsAFinding) {
  int code = -1;
  const auto doc = check_json("tests/data/cli/waive-unused.xml", code);
  ASSERT_FALSE(doc.is_discarded());
  EXPECT_EQ(code, 0);  // the fuse error is waived; an unused waiver is a warning
  const auto* u = find_rule(doc, "waiver.unused");
  ASSERT_NE(u, nullptr);
  EXPECT_NE((*u)["message"].get<std::string>().find("voltage-rating.diode on D9"), std::string::npos);
  EXPECT_EQ((*u)["location"]["line"], 6);
  const ProcessResult strict = run_mainscheck(
      {"-q", "check", kNetlist, "--waivers", "tests/data/cli/waive-unused.xml", "--fail-on", "warning"});
  EXPECT_EQ(strict.exit_code, 1);
}

TEST(Waivers, MalformedWaiverFileIsAnInputErrorWithFileAndLine) {
  const ProcessResult r = run_mainscheck({"check", kNetlist, "--waivers", "tests/data/cli/waive-malformed.xml"});
  ASSERT_TRUE(r.exited());
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("tests/data/cli/waive-malformed.xml:6:"), std::string::npos) << r.err;
  EXPECT_NE(r.err.find("missing: reviewer"), std::string::npos) << r.err;
  EXPECT_NE(r.out.find("CHECK INCOMPLETE"), std::string::npos) << r.out;

  TempDir dir("waivers");
  const auto broken = dir.path() / "broken.xml";
  write_file(broken, "<mainscheck-waivers>\n  <waiver rule=\"x\"\n</mainscheck-waivers>\n");
  const ProcessResult x = run_mainscheck({"check", kNetlist, "--waivers", broken.string()});
  EXPECT_EQ(x.exit_code, 2);
  EXPECT_NE(x.err.find(broken.string() + ":"), std::string::npos) << x.err;
  EXPECT_NE(x.err.find("malformed XML"), std::string::npos) << x.err;

  const ProcessResult missing = run_mainscheck({"check", kNetlist, "--waivers", "tests/data/cli/no-such-waivers.xml"});
  EXPECT_EQ(missing.exit_code, 2);
}

}  // namespace
}  // namespace mainscheck::test_support
