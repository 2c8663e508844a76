#include "analysis/recognisers/switchable_doubler.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

TEST(SwitchableDoubler, UniversalInputExampleWithLink) {
  auto d = recognise_example("bench-supply-115-230-doubler.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("switchable-doubler");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "link");
  EXPECT_EQ(d->refs(b, "rectifier"), (Refs{"D1", "D2", "D3", "D4"}));
  EXPECT_EQ(d->refs(b, "upper_capacitor"), (Refs{"C1"}));
  EXPECT_EQ(d->refs(b, "lower_capacitor"), (Refs{"C2"}));
  EXPECT_EQ(d->refs(b, "selector"), (Refs{"XLINK"}));
  ASSERT_TRUE(b.outputs[0].centre_tap);
  EXPECT_EQ(d->net(*b.outputs[0].centre_tap), "mid");
  // Through the closed link the bridge's own diodes also form a symmetric doubler; only the
  // switchable block is reported for them.
  EXPECT_TRUE(d->of_kind("voltage-doubler").empty());
}

TEST(SwitchableDoubler, SelectorSwitchOnLineSideInSubcircuit) {
  auto d = recognise_deck(R"(voltage selector switch to the line side
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
XB L N P M BRIDGE4
C1 P MID 470u
C2 MID M 470u
*@part XSW type=switch
XSW L MID SPST
RL P M 2k
.subckt BRIDGE4 a b plus minus
D1 a plus DR
D2 b plus DR
D3 minus a DR
D4 minus b DR
.ends
.subckt SPST a b
R1 a b 100MEG
.ends
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("switchable-doubler");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "switch");
  EXPECT_EQ(d->refs(*blocks[0], "selector"), (Refs{"XSW"}));
  EXPECT_EQ(d->refs(*blocks[0], "rectifier"), (Refs{"XB.D1", "XB.D2", "XB.D3", "XB.D4"}));
}

}  // namespace
}  // namespace mainscheck::testing
