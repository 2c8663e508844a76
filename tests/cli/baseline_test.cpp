// Baselines (`check --baseline OLD.json`, cli/baseline.cpp): findings already in an earlier JSON
// report are left out, matched by fingerprint, so moving unrelated lines does not make them new.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <string>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

const std::string kExample = "examples/bench-supply-bridge.cir";

/// The example with `extra` inserted after its title line (line 1 of a SPICE deck is the title).
std::string with_lines_after_title(const std::string& extra) {
  const std::string deck = slurp(std::filesystem::path(MAINSCHECK_SOURCE_DIR) / kExample);
  const std::size_t eol = deck.find('\n');
  return deck.substr(0, eol + 1) + extra + deck.substr(eol + 1);
}

class Baseline : public ::testing::Test {
 protected:
  void SetUp() override {
    ASSERT_FALSE(dir_.path().empty());
    baseline_ = (dir_.path() / "old.json").string();
    const ProcessResult r = run_mainscheck({"-q", "check", kExample, "--format", "json", "--output", "json=" + baseline_});
    ASSERT_TRUE(r.exited());
    ASSERT_EQ(r.exit_code, 1);  // the example has an error (fuse voltage)
    const auto doc = nlohmann::json::parse(r.out);
    known_ = doc["findings"].size();
    ASSERT_GT(known_, 0u);
  }
  TempDir dir_{"baseline"};
  std::string baseline_;
  std::size_t known_ = 0;
};

TEST_F(Baseline, SameNetlistHasNoNewFindings) {
  const ProcessResult r = run_mainscheck({"-q", "check", kExample, "--baseline", baseline_, "--format", "json"});
  EXPECT_EQ(r.exit_code, 0);
  const auto doc = nlohmann::json::parse(r.out);
  EXPECT_TRUE(doc["findings"].empty());
  EXPECT_EQ(doc["summary"]["baseline_matched"].get<std::size_t>(), known_);
  const ProcessResult text = run_mainscheck({"-q", "check", kExample, "--baseline", baseline_});
  EXPECT_NE(text.out.find(std::to_string(known_) + " already in the baseline"), std::string::npos) << text.out;
}

TEST_F(Baseline, MatchingSurvivesLinesMovingDown) {
  // Four comment lines after the title move every part four lines down; only the lines change.
  const auto shifted = dir_.path() / "bench-supply-bridge.cir";
  write_file(shifted, with_lines_after_title("* revision C: notes reworded, no circuit change\n*\n* reviewed 2026-01-01\n*\n"));
  const ProcessResult plain = run_mainscheck({"-q", "check", shifted.string(), "--format", "json"});
  const auto moved = nlohmann::json::parse(plain.out);
  ASSERT_EQ(moved["findings"].size(), known_);
  const auto old_doc = nlohmann::json::parse(slurp(baseline_));
  EXPECT_EQ(moved["findings"][0]["location"]["line"].get<int>(), old_doc["findings"][0]["location"]["line"].get<int>() + 4);

  const ProcessResult r = run_mainscheck({"-q", "check", shifted.string(), "--baseline", baseline_, "--format", "json"});
  EXPECT_EQ(r.exit_code, 0) << r.out;
  const auto doc = nlohmann::json::parse(r.out);
  EXPECT_TRUE(doc["findings"].empty()) << doc["findings"].dump(2);
  EXPECT_EQ(doc["summary"]["baseline_matched"].get<std::size_t>(), known_);
}

TEST_F(Baseline, NewFindingIsReportedAndGates) {
  // Y2 capacitor CY1 re-rated 100 V AC: about half the 253 V high line sits across it, a new error.
  std::string deck = slurp(std::filesystem::path(MAINSCHECK_SOURCE_DIR) / kExample);
  const std::string from = "*@part CY1 class=Y2 v_rated_ac=300";
  ASSERT_NE(deck.find(from), std::string::npos);
  deck.replace(deck.find(from), from.size(), "*@part CY1 class=Y2 v_rated_ac=100");
  const auto changed = dir_.path() / "bench-supply-bridge.cir";
  write_file(changed, deck);
  const ProcessResult r = run_mainscheck({"-q", "check", changed.string(), "--baseline", baseline_, "--format", "json"});
  EXPECT_EQ(r.exit_code, 1);
  const auto doc = nlohmann::json::parse(r.out);
  ASSERT_EQ(doc["findings"].size(), 1u) << doc["findings"].dump(2);
  EXPECT_EQ(doc["findings"][0]["rule"], "voltage-rating.capacitor");
  EXPECT_EQ(doc["findings"][0]["parts"][0], "CY1");
  EXPECT_EQ(doc["summary"]["baseline_matched"].get<std::size_t>(), known_);
}

TEST_F(Baseline, UnreadableBaselineIsAnInputError) {
  EXPECT_EQ(run_mainscheck({"check", kExample, "--baseline", kExample}).exit_code, 2);
  EXPECT_EQ(run_mainscheck({"check", kExample, "--baseline", "tests/data/cli/no-such.json"}).exit_code, 2);
}

}  // namespace
}  // namespace mainscheck::test_support
