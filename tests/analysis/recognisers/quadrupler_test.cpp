#include "analysis/recognisers/quadrupler.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

TEST(Quadrupler, InsulationTesterExample) {
  auto d = recognise_example("tester-voltage-quadrupler.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("voltage-quadrupler");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "symmetric");
  EXPECT_EQ(d->refs(b, "rectifier"), (Refs{"D1", "D2", "D3", "D4"}));
  EXPECT_EQ(d->refs(b, "pump_capacitor"), (Refs{"C1", "C3"}));
  EXPECT_EQ(d->refs(b, "smoothing_capacitor"), (Refs{"C2", "C4"}));
  EXPECT_EQ(d->net(b.outputs[0].net), "pos");
  EXPECT_EQ(d->net(b.outputs[0].ret), "neg");
  // ngspice-39 on this deck: 1290 V mean between POS and NEG, against 4·325 V = 1301 V.
  EXPECT_DOUBLE_EQ(b.figures.at("multiplication"), 4);
  // The two halves are not reported again as half-wave doublers.
  EXPECT_TRUE(d->of_kind("half-wave-doubler").empty());
}

TEST(Quadrupler, TwoSameSignDoublersAreNot) {
  auto d = recognise_deck(R"(two positive doublers in parallel
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
C1 L A 1u
D1 N A DR
D2 A P1 DR
C2 P1 N 1u
C3 L B 1u
D3 N B DR
D4 B P2 DR
C4 P2 N 1u
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("voltage-quadrupler").empty());
  EXPECT_EQ(d->of_kind("half-wave-doubler").size(), 2u);
}

}  // namespace
}  // namespace mainscheck::testing
