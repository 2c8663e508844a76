// surge-current.diode (rules/surge_current/diode.cpp): switch-on peak against derated IFSM.
#include <gtest/gtest.h>

#include <cmath>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

const char* kDeck = R"(inrush test
*@supply mains=230V+-10%/50Hz line=L neutral=N
V1 L N SIN(0 325.27 50)
R1 L A 47 p_rated=5 v_rated=500
*@part D1 v_rated=1000 i_rated=3 i_surge=30
D1 A OUT DR
C1 OUT N 47u v_rated=450 i_rated=5
RL OUT N 1k p_rated=300 v_rated=1000
.model DR D(IS=5n RS=0.03 N=1.8)
.end
)";

TEST(SurgeCurrentDiode, Boundary) {
  RuleBench inside(kDeck);
  inside.set_inrush("D1", 29.99, 1.0);
  EXPECT_TRUE(inside.run("surge-current.diode").empty());

  RuleBench outside(kDeck);
  outside.set_inrush("D1", 30.01, 1.0, "high-line/50Hz");
  const Finding& f = only(outside.run("surge-current.diode"));
  EXPECT_EQ(f.severity, Severity::error);  // derating 1.0: the limit is IFSM itself
  EXPECT_DOUBLE_EQ(f.measurement->value, 30.01);
  EXPECT_DOUBLE_EQ(f.measurement->limit, 30.0);
  EXPECT_EQ(f.measurement->corner, "switch-on at high-line/50Hz");
}

TEST(SurgeCurrentDiode, RatingWithNoSurgeThroughThePartIsNotApplicable) {
  // The switch-on surge is computed (through R1) but none flows in D1: its 30 A IFSM meets nothing.
  RuleBench b(kDeck);
  b.set_inrush("R1", 20, 1.0);
  EXPECT_TRUE(b.run("surge-current.diode").empty());
  const auto rs = b.ratings("surge-current.diode");
  ASSERT_EQ(rs.size(), 1u);
  EXPECT_EQ(rs[0].verdict, RatingVerdict::not_applicable);
  EXPECT_DOUBLE_EQ(*rs[0].rated, 30.0);
  EXPECT_FALSE(rs[0].stress.has_value());
}

TEST(SurgeCurrentDiode, DeratedLimitWarns) {
  RuleBench b(kDeck);
  b.option("surge-current.diode.derating", "50%");
  b.set_inrush("D1", 20, 1.0);
  const Finding& f = only(b.run("surge-current.diode"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_DOUBLE_EQ(f.measurement->limit, 15.0);
}

TEST(SurgeCurrentDiode, NotApplicableWithoutInrushOrToResistors) {
  RuleBench b(kDeck);
  b.set("D1", Quantity::i_peak, 100);  // a steady-state peak is not a surge
  EXPECT_TRUE(b.run("surge-current.diode").empty());
  b.set_inrush("R1", 100, 1.0);
  EXPECT_TRUE(b.run("surge-current.diode").empty());
}

TEST(SurgeCurrentDiode, EndToEndSwitchOnAtTheCrest) {
  RuleBench b(kDeck);
  b.option("surge-current.diode.derating", "0.2");  // limit 6 A, below the expected 7.6 A
  b.solve();
  std::string why;
  for (const auto& a : b.stress.assumptions) why += a + "\n";
  ASSERT_TRUE(b.stress.inrush.has_value()) << why << b.stress.failure;
  const Finding& f = only(b.run("surge-current.diode"));
  // Capacitor empty, switched on at the crest: i = V_pk / R = 357.8 V / 47 ohm = 7.6 A
  // (safety-data.md 7, [D]); the diode drop and its RS take a little off.
  EXPECT_NEAR(f.measurement->value, std::sqrt(2.0) * 253.0 / 47.0, 0.5);
}

}  // namespace
}  // namespace mainscheck::rules::testing
