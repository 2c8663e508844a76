// Golden-file tests of every report writer (text, json, sarif, junit, markdown, html) through the CLI on
// example netlists: the output must match tests/data/golden/<example>.<ext> byte for byte.
// Refresh after an intended change with MAINSCHECK_UPDATE_GOLDEN=1 (DEVELOPERS.md, "Golden files").
#include <gtest/gtest.h>

#include <cstdlib>
#include <filesystem>
#include <string>
#include <vector>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

struct GoldenCase {
  std::string example;  // file stem under examples/
  std::string format;   // --format value
  std::string ext;      // golden file extension
  std::vector<std::string> extra = {};  // further options
};

std::vector<GoldenCase> golden_cases() {
  // bench-supply-bridge: protection + bridge with errors and warnings; timer-capacitive-dropper: a
  // regulator the solver cannot model (analysis-failed report); lamp-dimmer-triac: phase control.
  const std::vector<std::string> examples{"bench-supply-bridge", "timer-capacitive-dropper", "lamp-dimmer-triac"};
  const std::vector<std::pair<std::string, std::string>> formats{
      {"text", "txt"}, {"json", "json"}, {"sarif", "sarif"}, {"junit", "junit.xml"}, {"markdown", "md"}, {"html", "html"}};
  std::vector<GoldenCase> out;
  for (const auto& e : examples) {
    for (const auto& [f, x] : formats) out.push_back({e, f, x});
    // The per-part rating table is in every markdown, html and json report; text shows it on request.
    out.push_back({e, "text", "parts.txt", {"--parts-table"}});
  }
  return out;
}

class GoldenTest : public ::testing::TestWithParam<GoldenCase> {};

TEST_P(GoldenTest, OutputMatchesGoldenFile) {
  const GoldenCase& c = GetParam();
  std::vector<std::string> args{"-q", "check", "examples/" + c.example + ".cir", "--format", c.format};
  args.insert(args.end(), c.extra.begin(), c.extra.end());
  const ProcessResult r = run_mainscheck(args);
  ASSERT_TRUE(r.exited()) << r.error << r.err;
  // The examples have error findings (exit 1), only warnings (exit 0 under --fail-on error: the lamp
  // dimmer since its 250 V fuse is judged against the 230 V nominal) or an unmodellable part (exit 3);
  // in every case a report is written.
  EXPECT_TRUE(r.exit_code == 0 || r.exit_code == 1 || r.exit_code == 3) << "exit " << r.exit_code << "\n" << r.err;
  ASSERT_FALSE(r.out.empty());
  const std::filesystem::path golden =
      std::filesystem::path(MAINSCHECK_SOURCE_DIR) / "tests/data/golden" / (c.example + "." + c.ext);
  const char* update = std::getenv("MAINSCHECK_UPDATE_GOLDEN");
  if (update != nullptr && std::string(update) == "1") {
    write_file(golden, r.out);
    GTEST_SKIP() << "rewrote " << golden.string();
  }
  ASSERT_TRUE(std::filesystem::exists(golden)) << golden.string() << " is missing; run with MAINSCHECK_UPDATE_GOLDEN=1";
  const std::string expected = slurp(golden);
  if (r.out != expected) {
    // Point at the first differing line: the whole documents are too long to print usefully.
    const auto want = split_lines(expected);
    const auto got = split_lines(r.out);
    std::size_t i = 0;
    while (i < want.size() && i < got.size() && want[i] == got[i]) ++i;
    ADD_FAILURE() << golden.string() << " differs first at line " << (i + 1) << "\n  golden: "
                  << (i < want.size() ? want[i] : "<end>") << "\n  output: " << (i < got.size() ? got[i] : "<end>")
                  << "\n(refresh with MAINSCHECK_UPDATE_GOLDEN=1 after checking the change is intended)";
  }
}

INSTANTIATE_TEST_SUITE_P(Examples, GoldenTest, ::testing::ValuesIn(golden_cases()),
                         [](const ::testing::TestParamInfo<GoldenCase>& info) {
                           std::string name = info.param.example + "_" + info.param.format +
                                              (info.param.extra.empty() ? "" : "_parts_table");
                           for (char& ch : name)
                             if (ch == '-') ch = '_';
                           return name;
                         });

}  // namespace
}  // namespace mainscheck::test_support
