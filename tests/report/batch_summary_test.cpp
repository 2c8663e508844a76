// The batch summary (report/batch_summary.*) on the examples folder: the text report ends with one
// row per netlist (errors, warnings, notes, verdict, time) and a total; JSON and HTML carry the same
// rows. The summary section is compared with tests/data/golden/examples.batch-summary.txt (times are
// "—": the tests fix SOURCE_DATE_EPOCH, which asks for reproducible output); refresh with
// MAINSCHECK_UPDATE_GOLDEN=1.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include <filesystem>
#include <regex>
#include <string>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

std::size_t netlists_in_examples() {
  std::size_t n = 0;
  for (const auto& e : std::filesystem::directory_iterator(std::filesystem::path(MAINSCHECK_SOURCE_DIR) / "examples")) {
    const std::string ext = e.path().extension().string();
    if (ext == ".cir") ++n;
    // XML parts libraries sit beside the netlists and are not checked.
    if (ext == ".xml" && slurp(e.path()).find("<mainscheck-parts") == std::string::npos) ++n;
  }
  return n;
}

class ExamplesBatch : public ::testing::Test {
 protected:
  static void SetUpTestSuite() {
    dir_ = std::filesystem::temp_directory_path() / ("mainscheck-batch-" + std::to_string(::getpid()));
    std::filesystem::create_directories(dir_);
    result_ = run_mainscheck({"-q", "check", "examples", "--output", "json=" + (dir_ / "b.json").string(), "--output",
                              "html=" + (dir_ / "b.html").string()});
  }
  static void TearDownTestSuite() { std::filesystem::remove_all(dir_); }
  static inline std::filesystem::path dir_;
  static inline ProcessResult result_;
};

TEST_F(ExamplesBatch, TextEndsWithOneRowPerNetlistAndATotal) {
  ASSERT_TRUE(result_.exited()) << result_.error << result_.err;
  const std::size_t at = result_.out.rfind("batch summary:\n");
  ASSERT_NE(at, std::string::npos) << result_.out.substr(result_.out.size() > 2000 ? result_.out.size() - 2000 : 0);
  const std::string summary = result_.out.substr(at);
  // Header, one row per netlist, the total, the caution.
  const auto lines = split_lines(summary);
  ASSERT_EQ(lines.size(), 1 + 1 + netlists_in_examples() + 1 + 1) << summary;
  EXPECT_NE(lines[1].find("netlist"), std::string::npos);
  EXPECT_NE(lines[1].find("time"), std::string::npos);
  EXPECT_NE(summary.find("total (" + std::to_string(netlists_in_examples()) + " netlists)"), std::string::npos);
  EXPECT_NE(summary.find("Caution: mains voltages are lethal"), std::string::npos);
  const std::filesystem::path golden =
      std::filesystem::path(MAINSCHECK_SOURCE_DIR) / "tests/data/golden/examples.batch-summary.txt";
  const char* update = std::getenv("MAINSCHECK_UPDATE_GOLDEN");
  if (update != nullptr && std::string(update) == "1") {
    write_file(golden, summary);
    GTEST_SKIP() << "rewrote " << golden.string();
  }
  EXPECT_EQ(summary, slurp(golden)) << "refresh with MAINSCHECK_UPDATE_GOLDEN=1 after checking the change is intended";
}

TEST_F(ExamplesBatch, JsonSummaryMatchesTheReports) {
  ASSERT_TRUE(result_.exited()) << result_.error;
  const nlohmann::json j = nlohmann::json::parse(slurp(dir_ / "b.json"));
  ASSERT_EQ(j["schema"], "mainscheck-batch/1");
  const auto& rows = j["summary"]["netlists"];
  ASSERT_EQ(rows.size(), j["reports"].size());
  ASSERT_EQ(rows.size(), netlists_in_examples());
  std::size_t errors = 0;
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const auto& rep = j["reports"][i];
    EXPECT_EQ(rows[i]["file"], rep["file"]);
    EXPECT_EQ(rows[i]["errors"], rep["summary"]["errors"]);
    EXPECT_EQ(rows[i]["warnings"], rep["summary"]["warnings"]);
    EXPECT_EQ(rows[i]["notes"], rep["summary"]["notes"]);
    EXPECT_TRUE(rows[i]["time_s"].is_null());  // reproducible output: no times
    // A check that did not complete is never a pass, whatever its counts.
    if (rep["status"] != "complete" && rep["summary"]["errors"] == 0) {
      EXPECT_EQ(rows[i]["verdict"], "not verified");
    }
    errors += rows[i]["errors"].get<std::size_t>();
  }
  EXPECT_EQ(j["summary"]["total"]["errors"], errors);
  EXPECT_FALSE(j["summary"]["total"].contains("file"));
  EXPECT_NE(j["caution"].get<std::string>().find("lethal"), std::string::npos);
}

TEST_F(ExamplesBatch, HtmlSummaryTableHasEveryNetlistAndATotal) {
  ASSERT_TRUE(result_.exited()) << result_.error;
  const std::string html = slurp(dir_ / "b.html");
  EXPECT_NE(html.find("<h2>Batch summary</h2>"), std::string::npos);
  EXPECT_NE(html.find("<th>time</th>"), std::string::npos);
  EXPECT_NE(html.find("total (" + std::to_string(netlists_in_examples()) + " netlists)"), std::string::npos);
  EXPECT_NE(html.find("examples/lamp-dimmer-triac.cir</a>"), std::string::npos);
}

TEST(BatchSummary, TimesEachCheckUnlessReproducibleOutputIsAsked) {
  const ProcessResult r = run_mainscheck(
      {"-q", "check", "examples/lamp-dimmer-triac.cir", "examples/bench-supply-bridge.cir"}, {{"SOURCE_DATE_EPOCH", ""}});
  ASSERT_TRUE(r.exited()) << r.error;
  const std::size_t at = r.out.rfind("batch summary:\n");
  ASSERT_NE(at, std::string::npos);
  const std::string summary = r.out.substr(at);
  EXPECT_TRUE(std::regex_search(summary, std::regex(R"(examples/lamp-dimmer-triac\.cir +0 +1 +4 +warning +\d+\.\d\d s)")))
      << summary;
  EXPECT_TRUE(std::regex_search(summary, std::regex(R"(total \(2 netlists\) +1 +\d+ +\d+ +fail +\d+\.\d\d s)")))
      << summary;
}

}  // namespace
}  // namespace mainscheck::test_support
