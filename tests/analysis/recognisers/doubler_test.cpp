#include "analysis/recognisers/doubler.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

TEST(SymmetricDoubler, DrillExample) {
  auto d = recognise_example("tool-voltage-doubler.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("voltage-doubler");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "symmetric");
  EXPECT_EQ(d->refs(b, "rectifier"), (Refs{"D1", "D2"}));
  EXPECT_EQ(d->refs(b, "upper_capacitor"), (Refs{"C1"}));
  EXPECT_EQ(d->refs(b, "lower_capacitor"), (Refs{"C2"}));
  EXPECT_EQ(d->net(b.outputs[0].net), "p");
  EXPECT_EQ(d->net(b.outputs[0].ret), "q");
  ASSERT_TRUE(b.outputs[0].centre_tap);
  EXPECT_EQ(d->net(*b.outputs[0].centre_tap), "0");
  EXPECT_EQ(d->net(b.inputs[0]), "ln");  // behind the NTC inrush limiter
  // Not also taken for a bridge-based switchable doubler or a half-wave doubler.
  EXPECT_TRUE(d->of_kind("switchable-doubler").empty());
  EXPECT_TRUE(d->of_kind("half-wave-doubler").empty());
}

TEST(SymmetricDoubler, MidpointOnLineSideAndParallelCapacitors) {
  auto d = recognise_deck(R"(doubler drawn the other way round
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
D1 N P DR
D2 Q N DR
C1A L P 220u
C1B P L 220u
C2 Q L 470u
RL P Q 1k
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("voltage-doubler");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(d->refs(*blocks[0], "upper_capacitor"), (Refs{"C1A", "C1B"}));
  EXPECT_DOUBLE_EQ(blocks[0]->figures.at("c_upper_F"), 440e-6);
}

TEST(SymmetricDoubler, BridgeWithSplitBankAndNoLinkIsNotADoubler) {
  auto d = recognise_deck(R"(bridge with series capacitors, midpoint not joined to the mains
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
D1 L P DR
D2 N P DR
D3 M L DR
D4 M N DR
C1 P MID 220u
C2 MID M 220u
RB1 P MID 100k
RB2 MID M 100k
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("voltage-doubler").empty());
  EXPECT_TRUE(d->of_kind("switchable-doubler").empty());
}

}  // namespace
}  // namespace mainscheck::testing
