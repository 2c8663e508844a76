// varistor (rules/safety/varistor.cpp): placement after the fuse, not to accessible nets, to earth with
// a GDT, thermal-protection note. Basis: safety-data.md 5 ([C: S45] IEC 60065 14.12, [C: S46] TC108,
// [C: S-alpha-therm, S-dxmht] thermal protection and fuse at the MOV).
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

std::string deck(const std::string& rv_nets, const std::string& extra = "") {
  return "varistor test\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N earth=PE\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RF1 type=fuse i_rated=10\n"
         "RF1 L LF 0.05\n"
         "*@part RV1 type=varistor v_rated_ac=275\n"
         "RV1 " + rv_nets + " 1meg\n" + extra +
         "*@part RH type=heater p_rated=2000\n"
         "RH LF N 26.5\n"
         ".end\n";
}

std::vector<Finding> gating(const std::vector<Finding>& all) { return without_notes(all); }

TEST(Varistor, AfterTheFuseGivesOnlyTheThermalNote) {
  RuleBench b(deck("LF N"));
  const Finding f = only(b.run("varistor"));
  EXPECT_EQ(f.severity, Severity::note) << f.message;
  EXPECT_NE(f.message.find("thermally protected"), std::string::npos);
}

TEST(Varistor, AheadOfTheFuseIsAnError) {
  RuleBench b(deck("L N"));
  const Finding f = only(gating(b.run("varistor")));
  EXPECT_EQ(f.severity, Severity::error);
  EXPECT_NE(f.message.find("ahead of fuse RF1"), std::string::npos) << f.message;
}

TEST(Varistor, ToEarthIsAWarning) {
  RuleBench b(deck("LF PE"));
  const Finding f = only(gating(b.run("varistor")));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_NE(f.message.find("protective earth"), std::string::npos);
}

TEST(Varistor, ToAnAccessibleNetIsAnError) {
  RuleBench b(deck("LF OUT", "ROUT OUT N 1meg\n*@net OUT access=user\n"));
  const Finding f = only(gating(b.run("varistor")));
  EXPECT_NE(f.message.find("accessible net OUT"), std::string::npos) << f.message;
}

TEST(Varistor, NotApplicableWithoutVaristor) {
  RuleBench b(heater_only_deck());
  EXPECT_TRUE(b.run("varistor").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
