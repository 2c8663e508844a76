#include "analysis/recognisers/resistive_divider.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

TEST(ResistiveDivider, KettleExampleIsLoadedTwoResistorUpperLeg) {
  auto d = recognise_example("kettle-mains-sense-divider.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("resistive-divider");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "loaded");
  EXPECT_EQ(d->refs(b, "upper"), (Refs{"R1", "R2"}));
  EXPECT_EQ(d->refs(b, "lower"), (Refs{"R3"}));
  EXPECT_EQ(d->refs(b, "load"), (Refs{"RAF"}));
  ASSERT_EQ(b.outputs.size(), 1u);
  EXPECT_EQ(d->net(b.outputs[0].net), "sense");
  EXPECT_EQ(d->net(b.outputs[0].ret), "0");
  EXPECT_EQ(d->net(b.inputs[0]), "l");
  // Voltage-divider rule (any circuits textbook): Rl/(Ru+Rl) = 4.7k/(940k+4.7k).
  EXPECT_NEAR(b.figures.at("ratio"), 4.7e3 / 944.7e3, 1e-9);
}

TEST(ResistiveDivider, ReversedPinsAndComparatorInputIsUnloaded) {
  auto d = recognise_deck(R"(reversed pins
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
R1 TAP L 1MEG
R2 N TAP 10k
C1 N TAP 1n
E1 CMP 0 TAP N 1
RCMP CMP 0 10k
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("resistive-divider");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "unloaded");  // only a capacitor and a controlled-source input on the tap
  EXPECT_EQ(d->refs(*blocks[0], "upper"), (Refs{"R1"}));
  EXPECT_EQ(d->refs(*blocks[0], "lower"), (Refs{"R2"}));
  EXPECT_EQ(d->refs(*blocks[0], "load"), (Refs{"C1", "E1"}));
}

TEST(ResistiveDivider, InsideSubcircuitWithFuseInFront) {
  auto d = recognise_deck(R"(wrapped divider
*@supply mains=120V/60Hz line=LINE neutral=NEUT
V1 LINE NEUT SIN(0 170 60)
*@part RF1 type=fuse i_rated=0.5
RF1 LINE LF 0.1
XD LF SENSE NEUT SENSEDIV
RLOAD SENSE OPTO 47k
DOPTO OPTO NEUT DLED
.model DLED D(IS=1e-18 N=2)
.subckt SENSEDIV top tap bot
RA top mid 220k
RB mid tap 220k
RC tap bot 22k
.ends
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("resistive-divider");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "loaded");
  EXPECT_EQ(d->refs(*blocks[0], "upper"), (Refs{"XD.RA", "XD.RB"}));
  EXPECT_EQ(d->refs(*blocks[0], "lower"), (Refs{"XD.RC"}));
  EXPECT_EQ(d->net(blocks[0]->inputs[0]), "lf");  // the fuse is looked through
}

TEST(ResistiveDivider, BleederChainIsNotADivider) {
  // Three equal resistors across the mains, nothing on their junctions: a discharge/bleeder chain.
  auto d = recognise_deck(R"(bleeder chain
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
CX L N 470n
R1 L J1 330k
R2 J1 J2 330k
R3 J2 N 330k
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("resistive-divider").empty());
  EXPECT_TRUE(d->of_kind("series-string").empty());
}

TEST(ResistiveDivider, UnusedTapIsNotADivider) {
  auto d = recognise_deck(R"(two resistors, tap unused
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
R1 L T 100k
R2 T N 100k
R3 T N 100k
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("resistive-divider").empty());
}

TEST(ResistiveDivider, FactoryName) { EXPECT_EQ(analysis::make_resistive_divider_recogniser()->name(), "resistive-divider"); }

}  // namespace
}  // namespace mainscheck::testing
