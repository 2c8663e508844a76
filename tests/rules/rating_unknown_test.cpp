// rating-unknown (rules/rating_unknown.cpp): stressed parts without a rating are findings, never passes.
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

const char* kDeck = R"(unrated parts
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
D1 L OUT DR
*@part C1 v_rated=450
C1 OUT N 100u
R1 OUT N 47k package=0805
*@part D2 v_rated=1000 i_rated=1 i_surge=30
D2 L OUT2 DR
C2 OUT2 N 100n v_rated=630
R2 OUT2 N 47k p_rated=2 v_rated=500
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)";

TEST(RatingUnknown, ListsMissingRatingsAndTheStress) {
  RuleBench b(kDeck);
  b.set("D1", Quantity::v_reverse_peak, 715.6, "high-line/50Hz");
  b.set("D1", Quantity::i_avg, 0.0076, "high-line/50Hz");
  const Finding& f = only(b.run("rating-unknown"));
  EXPECT_EQ(f.severity, Severity::error);  // on the mains: an unchecked part must fail the default gate
  EXPECT_EQ(f.message,
            "D1 has no reverse voltage rating (v_rated) and no average current rating (i_rated) from any source: "
            "it must withstand 716 V v_reverse_peak, 7.6 mA i_avg (at high-line/50Hz)");
  EXPECT_EQ(b.sm.line_col(f.loc).line, 4u);
}

TEST(RatingUnknown, BoundaryOneRatingPresentOneMissing) {
  // The electrolytic has a voltage rating but no ripple rating: still a finding (only the ripple one).
  RuleBench b(kDeck);
  b.set("C1", Quantity::v_peak, 350);
  b.set("C1", Quantity::i_rms, 0.3);
  const Finding& f = only(b.run("rating-unknown"));
  EXPECT_TRUE(f.message.starts_with("C1 has no ripple-current rating (i_rated) from any source: it must withstand 300 mA"))
      << f.message;
  // The film capacitor with its rating is complete.
  RuleBench ok(kDeck);
  ok.set("C2", Quantity::v_peak, 350);
  EXPECT_TRUE(ok.run("rating-unknown").empty());
}

TEST(RatingUnknown, PackageCountsAsASource) {
  RuleBench b(kDeck);
  b.set("R1", Quantity::v_peak, 350);
  b.set("R1", Quantity::p_avg, 0.5);
  EXPECT_TRUE(b.run("rating-unknown").empty());
}

TEST(RatingUnknown, SurgeRatingNeededOnlyWhenTheInrushWasComputed) {
  RuleBench b(kDeck);
  b.set("D2", Quantity::v_reverse_peak, 700);
  b.set("D2", Quantity::i_avg, 0.01);
  EXPECT_TRUE(b.run("rating-unknown").empty());
  b.set_inrush("D2", 20, 0.1);
  EXPECT_TRUE(b.run("rating-unknown").empty());  // i_surge given
}

TEST(RatingUnknown, UnstressedPartsAreNotApplicable) {
  RuleBench b(kDeck);
  EXPECT_TRUE(b.run("rating-unknown").empty());
}

TEST(RatingUnknown, EndToEndNoCleanPass) {
  RuleBench b(kDeck);
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  std::vector<std::string> refs;
  for (const auto& f : b.run("rating-unknown")) refs.push_back(f.parts[0]);
  // D1 (no ratings), C1 (no ripple rating); D2, C2, R1 (package 0805), R2 are rated.
  EXPECT_EQ(refs, (std::vector<std::string>{"D1", "C1"}));
}

// Issue 15 item 5: an unrated stressed part on the mains is an error by default; a policy lowers it.
TEST(RatingUnknown, MainsSideIsAnErrorAPolicyLowersIt) {
  RuleBench b(kDeck);
  b.set("D1", Quantity::v_reverse_peak, 715.6);
  b.set("D1", Quantity::i_avg, 0.0076);
  EXPECT_EQ(only(b.run("rating-unknown")).severity, Severity::error);
  b.policy.rules["rating-unknown"].severity = Severity::warning;
  EXPECT_EQ(only(b.run("rating-unknown")).severity, Severity::warning);
}

TEST(RatingUnknown, TransformerSecondaryIsAWarning) {
  // The load on the secondary is not on the mains: still reported, as a warning that says why.
  RuleBench b(transformer_supply_deck("unrated load on a secondary", ""));
  b.set("RLA", Quantity::v_peak, 12);
  b.set("RLA", Quantity::p_avg, 7);
  const Finding f = only(b.run("rating-unknown"));
  EXPECT_EQ(f.severity, Severity::warning) << f.message;
  ASSERT_FALSE(f.notes.empty());
  EXPECT_NE(f.notes.front().message.find("galvanic path to the mains"), std::string::npos) << f.notes.front().message;
}

// Issue 15 item 10: parts whose every stress is below the floor (1 V, 1 mW) share one note.
const char* kHelpers = R"(simulator helpers
*@supply mains=230V+-10%/50Hz line=L neutral=0 earth=PE
V1 L 0 SIN(0 325.27 50)
*@part RH type=heater p_rated=600
RH L 0 100
RPE PE 0 1
RREF1 A 0 10meg
RREF2 B 0 10meg
.end
)";

TEST(RatingUnknown, BelowTheStressFloorOneGroupedNote) {
  RuleBench b(kHelpers);
  b.set("RPE", Quantity::v_peak, 5.28e-3);
  b.set("RPE", Quantity::p_avg, 13.9e-6);
  b.set("RREF1", Quantity::v_peak, 2e-9);
  b.set("RREF1", Quantity::p_avg, 1e-15);
  b.set("RREF2", Quantity::v_peak, 0.999);  // boundary: just below 1 V and 1 mW
  b.set("RREF2", Quantity::p_avg, 0.999e-3);
  const Finding f = only(b.run("rating-unknown"));
  EXPECT_EQ(f.severity, Severity::note);
  EXPECT_EQ(f.parts, (std::vector<std::string>{"RPE", "RREF1", "RREF2"}));
  EXPECT_EQ(f.message,
            "3 parts have no rating from any source, but every stress is below 1 V and 1 mW: RPE, RREF1, RREF2; "
            "not checked");
}

TEST(RatingUnknown, AtTheStressFloorAFindingOfItsOwn) {
  // Boundary: 1 V (or 1 mW) is not below the floor.
  RuleBench volts(kHelpers);
  volts.set("RREF1", Quantity::v_peak, 1.0);
  volts.set("RREF1", Quantity::p_avg, 1e-6);
  EXPECT_EQ(only(volts.run("rating-unknown")).severity, Severity::error);
  RuleBench watts(kHelpers);
  watts.set("RREF1", Quantity::v_peak, 0.5);
  watts.set("RREF1", Quantity::p_avg, 1e-3);
  EXPECT_EQ(only(watts.run("rating-unknown")).severity, Severity::error);
  // The floor is a policy option.
  RuleBench raised(kHelpers);
  raised.set("RREF1", Quantity::v_peak, 1.5);
  raised.set("RREF1", Quantity::p_avg, 1e-6);
  raised.option("rating-unknown.stress-floor-voltage", "2");
  EXPECT_EQ(only(raised.run("rating-unknown")).severity, Severity::note);
}

}  // namespace
}  // namespace mainscheck::rules::testing
