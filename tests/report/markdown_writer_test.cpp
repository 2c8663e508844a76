// The Markdown checklist (report/markdown_writer.cpp, verdict matrix in report/verdicts.cpp): a rule
// with nothing to check in a block is "not applicable", never "pass"; a rating the rule could not
// compare makes its cell "not verified"; each rule's basis is printed once and cites no source file.
#include <gtest/gtest.h>

#include <regex>
#include <string>

#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

std::string checklist(const std::string& example) {
  const ProcessResult r = run_mainscheck({"-q", "check", "examples/" + example + ".cir", "--format", "markdown"});
  EXPECT_TRUE(r.exited()) << r.error;
  return r.out;
}

TEST(MarkdownChecklist, RulesWithNothingToCheckInABlockAreNotApplicable) {
  const std::string md = checklist("lamp-dimmer-triac");
  // B1 holds only the fuse RF1: no triac, diode, varistor or capacitor there.
  EXPECT_NE(md.find("| [ ] | `current-rating.triac` | B1 protection | not applicable | — |"), std::string::npos) << md;
  EXPECT_NE(md.find("| [ ] | `voltage-rating.diode` | B1 protection | not applicable | — |"), std::string::npos);
  EXPECT_NE(md.find("| [ ] | `varistor` | B1 protection | not applicable | — |"), std::string::npos);
  // B2 holds the triac XT1 (rated 8 A, 436 mA at high line): the rule applies and passes.
  EXPECT_NE(md.find("| [ ] | `current-rating.triac` | B2 phase-control | pass | — |"), std::string::npos);
  // The fuse rule applies to B1 (its fuse) and not to B2.
  EXPECT_NE(md.find("| [ ] | `fuse` | B2 phase-control | not applicable | — |"), std::string::npos);
  EXPECT_EQ(md.find("| `current-rating.triac` | B1 protection | pass"), std::string::npos);
}

TEST(MarkdownChecklist, AnUncomparedRatingIsNotVerifiedNeverPass) {
  // The fuse RF1 in B1 has no melting integral (i2t_melt): its switch-on pulse cannot be compared.
  const std::string md = checklist("lamp-dimmer-triac");
  EXPECT_NE(md.find("| [ ] | `fuse` | B1 protection | not verified | RF1 |"), std::string::npos) << md;
}

TEST(MarkdownChecklist, BasisOncePerRuleCitingNoSourceFile) {
  const std::string md = checklist("bench-supply-bridge");
  const std::size_t bases = md.find("## Basis of each rule");
  ASSERT_NE(bases, std::string::npos);
  EXPECT_EQ(md.find("— basis:"), std::string::npos);  // not repeated on every finding
  EXPECT_EQ(md.find("- `fuse`: "), md.rfind("- `fuse`: "));
  EXPECT_FALSE(std::regex_search(md, std::regex(R"([a-z_/]+\.(hpp|cpp)\b)"))) << "a basis cites a source file";
}

TEST(MarkdownChecklist, PartRatingsTableIsSortedWorstFirst) {
  const std::string md = checklist("bench-supply-bridge");
  const std::size_t table = md.find("## Part ratings");
  ASSERT_NE(table, std::string::npos);
  // RF1's pulse I²t (2.71 A²s with the IEC 60725 source impedance, against 22 % of 4.5 A²s) is the
  // worst margin: the first row.
  const std::size_t first = md.find("| RF1 | fuse | B1 | i2t | 4.5 A²s | annotation | 0.99 A²s | 2.71 A²s | "
                                    "high-line, positive crest | -174 % | fail |",
                                    table);
  EXPECT_NE(first, std::string::npos) << md.substr(table, 1500);
  EXPECT_LT(first, md.find("| unknown |", table));
  EXPECT_LT(md.find("| unknown |", table), md.find("| pass |", table));
}

}  // namespace
}  // namespace mainscheck::test_support
