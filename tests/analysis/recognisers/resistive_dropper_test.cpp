#include "analysis/recognisers/resistive_dropper.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

TEST(ResistiveDropper, FanControllerExample) {
  auto d = recognise_example("fan-resistive-dropper.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("resistive-dropper");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "half-wave-zener");
  EXPECT_EQ(d->refs(b, "series_resistor"), (Refs{"RD1"}));
  EXPECT_EQ(d->refs(b, "rectifier"), (Refs{"D1"}));
  EXPECT_EQ(d->refs(b, "shunt_regulator"), (Refs{"DZ1"}));
  EXPECT_EQ(d->refs(b, "reservoir"), (Refs{"C1"}));
  EXPECT_EQ(d->refs(b, "load"), (Refs{"RL"}));
  ASSERT_EQ(b.outputs.size(), 1u);
  EXPECT_EQ(d->net(b.outputs[0].net), "vcc");
  EXPECT_EQ(d->net(b.outputs[0].ret), "0");
  EXPECT_DOUBLE_EQ(b.figures.at("r_series_ohm"), 22e3);
}

TEST(ResistiveDropper, TwoResistorsOnNeutralSideIntoBridge) {
  auto d = recognise_deck(R"(neutral-side dropper into a bridge
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
RA N X 15k
RB A X 15k
D1 L P DR
D2 A P DR
D3 Q L DR
D4 Q A DR
C1 P Q 100u
*@part DZ type=zener
DZ Q P DZ5
.model DR D(IS=5n BV=1000)
.model DZ5 D(BV=5.1)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("resistive-dropper");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "bridge-zener");
  EXPECT_EQ(d->refs(*blocks[0], "series_resistor"), (Refs{"RA", "RB"}));
  EXPECT_EQ(d->refs(*blocks[0], "rectifier"), (Refs{"D1", "D2", "D3", "D4"}));
  EXPECT_EQ(d->refs(*blocks[0], "reservoir"), (Refs{"C1"}));
  EXPECT_EQ(d->net(blocks[0]->outputs[0].net), "p");
  EXPECT_EQ(d->net(blocks[0]->outputs[0].ret), "q");
}

TEST(ResistiveDropper, DividerIsNotADropper) {
  auto d = recognise_deck(R"(divider with a diode on its tap
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
R1 L T 1MEG
R2 T N 10k
D1 T OUT DR
C1 OUT N 1u
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("resistive-dropper").empty());
  EXPECT_EQ(d->of_kind("resistive-divider").size(), 1u);
}

TEST(ResistiveDropper, SeriesResistorIntoResistiveLoadIsNot) {
  auto d = recognise_deck(R"(no rectifier
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
R1 L T 1k
C1 T N 1u
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("resistive-dropper").empty());
}

}  // namespace
}  // namespace mainscheck::testing
