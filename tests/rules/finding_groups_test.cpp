// group_identical_findings (rules/finding_groups.cpp): identical findings on identical parts become one
// finding listing the parts (issue 15 item 11).
#include "rules/finding_groups.hpp"

#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

Finding lamp_finding(const std::string& ref, std::uint32_t offset, double value = 12.1) {
  Finding f;
  f.rule_id = "series-string";
  f.severity = Severity::error;
  f.message = ref + " in B1 has 12.1 W dissipation in normal operation, above its 10 W rating";
  f.parts = {ref};
  f.subject = ref;
  f.block = "B1";
  f.loc = {0, offset};
  f.measurement = Measurement{"p_avg", value, 10, "W", "high-line"};
  f.notes.push_back({f.loc, "rating: p_rated from annotation"});
  return f;
}

TEST(FindingGroups, IdenticalFindingsOnIdenticalPartsAreOne) {
  std::vector<Finding> v;
  for (int i = 1; i <= 10; ++i) v.push_back(lamp_finding("RLP" + std::to_string(i), 10u * i));
  group_identical_findings(v);
  ASSERT_EQ(v.size(), 1u);
  const Finding& g = v.front();
  EXPECT_EQ(g.parts.size(), 10u);
  EXPECT_EQ(g.parts.front(), "RLP1");
  EXPECT_EQ(g.parts.back(), "RLP10");  // RLP10 is not mistaken for RLP1 followed by 0
  EXPECT_EQ(
      g.message,
      "RLP1 in B1 has 12.1 W dissipation in normal operation, above its 10 W rating; the same on RLP2, RLP3, "
      "RLP4, RLP5, RLP6, RLP7, RLP8, RLP9, RLP10");
  EXPECT_EQ(g.loc.offset, 10u);
  // Each further part keeps its own location as a note (SARIF logical locations list them all).
  ASSERT_EQ(g.notes.size(), 10u);
  EXPECT_EQ(g.notes[1].loc.offset, 20u);
  EXPECT_EQ(g.notes[1].message, "RLP2: the same finding");
}

TEST(FindingGroups, DifferentValuesOrWaiversStaySeparate) {
  std::vector<Finding> v{lamp_finding("RLP1", 10), lamp_finding("RLP2", 20, 12.1001),
                         lamp_finding("RLP3", 30)};
  v[2].waived_by = "reviewer: accepted";
  group_identical_findings(v);
  ASSERT_EQ(v.size(), 3u);  // a measured value differing in the 5th digit is another finding
  EXPECT_EQ(v[0].parts.size(), 1u);
}

TEST(FindingGroups, FindingsAboutSeveralPartsAreNeverMerged) {
  Finding a = lamp_finding("RV1", 10);
  a.parts.push_back("RF1");
  Finding b = lamp_finding("RV2", 20);
  b.parts.push_back("RF1");
  std::vector<Finding> v{a, b};
  group_identical_findings(v);
  EXPECT_EQ(v.size(), 2u);
}

TEST(FindingGroups, TenEqualLampsOfAStringGiveOneFindingPerRating) {
  // examples/festoon-lamp-string.cir reduced to three lamps: 253 V / 3 = 84.3 V on each 80 V lamp.
  RuleBench b(R"(festoon
*@supply mains=230V+-10%/50Hz line=L neutral=0
V1 L 0 SIN(0 325.27 50)
*@part RF1 type=fuse i_rated=1 v_rated_ac=250
RF1 L LF 0.1
*@part RLP1 type=lamp v_rated=80 p_rated=30
RLP1 LF J1 224
*@part RLP2 type=lamp v_rated=80 p_rated=30
RLP2 J1 J2 224
*@part RLP3 type=lamp v_rated=80 p_rated=30
RLP3 J2 0 224
.end
)");
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  std::vector<Finding> v = b.run("series-string");
  ASSERT_GE(v.size(), 3u) << b.rendered();
  group_identical_findings(v);
  for (const auto& f : v) {
    if (f.severity == Severity::note) continue;
    EXPECT_EQ(f.parts, (std::vector<std::string>{"RLP1", "RLP2", "RLP3"})) << f.message;
  }
}

}  // namespace
}  // namespace mainscheck::rules::testing
