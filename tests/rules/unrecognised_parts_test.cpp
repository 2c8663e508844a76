// unrecognised-parts (rules/unrecognised_parts.cpp): mains-connected parts in no block, and the
// simulator references the recognition skeleton left out.
#include <gtest/gtest.h>

#include "rule_test_support.hpp"
#include "rules/registry.hpp"
#include "rules/unrecognised_parts.hpp"

namespace mainscheck::rules::testing {
namespace {

// A lamp in series with a 2.2 kΩ resistor across the mains: no front-end block of docs/blocks.md
// (a series string needs two equal loads, a dropper a rectifier).
const char* kOddDeck = R"(workbench lamp
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
*@part RA type=lamp p_rated=15
RA L M 1.5k
RB M N 2.2k p_rated=25
.end
)";

TEST(UnrecognisedParts, PartsInNoBlockAreOneWarningNamingThemAndTheSkippedRules) {
  RuleBench b(kOddDeck);
  const Finding& f = only(b.run("unrecognised-parts"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_EQ(f.parts, (std::vector<std::string>{"RA", "RB"}));
  EXPECT_TRUE(f.message.starts_with("2 mains-connected parts in no recognised block: RA, RB; the block rules ("))
      << f.message;
  EXPECT_NE(f.message.find("discharge.x-capacitor"), std::string::npos) << f.message;
  ASSERT_EQ(f.notes.size(), 1u);  // the first part is the finding's own location
  EXPECT_EQ(f.notes[0].message, "RB is in no block");
}

TEST(UnrecognisedParts, LoadStraightAcrossTheMainsIsNoGap) {
  // A heater across line and neutral is the product's load: checked part by part, no block rule.
  RuleBench b(heater_only_deck());
  EXPECT_TRUE(b.run("unrecognised-parts").empty()) << b.rendered();
}

TEST(UnrecognisedParts, RecognisedFrontEndIsSilent) {
  RuleBench b(R"(half-wave
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
D1 L OUT DR v_rated=1000 i_rated=1
C1 OUT N 10u v_rated=450
R1 OUT N 47k p_rated=2
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)");
  EXPECT_TRUE(b.run("unrecognised-parts").empty()) << b.rendered();
}

TEST(UnrecognisedParts, SimulatorReferencesAreOneNote) {
  // The transformer deck ties its secondary to ground through 1 MΩ and the primary through 1 GΩ:
  // references, each the only tie between two islands.
  RuleBench b(transformer_supply_deck("references", ""));
  const auto findings = b.run("unrecognised-parts");
  const auto refs = with_subject(findings, "references");
  ASSERT_TRUE(refs) << b.rendered();
  EXPECT_EQ(refs->severity, Severity::note);
  EXPECT_EQ(refs->parts.size(), 2u) << refs->message;
  EXPECT_FALSE(with_subject(findings, "unrecognised")) << findings.front().message;
}

TEST(UnrecognisedParts, NamedBlockRulesAreRegistered) {
  for (std::string_view id : block_rule_ids()) EXPECT_NE(find_rule(id), nullptr) << id;
}

}  // namespace
}  // namespace mainscheck::rules::testing
