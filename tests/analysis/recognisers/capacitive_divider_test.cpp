#include "analysis/recognisers/capacitive_divider.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

TEST(CapacitiveDivider, ProbeExampleIsUnloadedWithBleeder) {
  auto d = recognise_example("probe-capacitive-divider.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("capacitive-divider");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "unloaded");
  EXPECT_EQ(d->refs(b, "upper"), (Refs{"CY1"}));
  EXPECT_EQ(d->refs(b, "lower"), (Refs{"C2"}));
  EXPECT_EQ(d->refs(b, "bleeder"), (Refs{"RB1"}));
  EXPECT_EQ(d->net(b.outputs[0].net), "tap");
  // Capacitive divider rule (series capacitors carry equal charge): Cu/(Cu+Cl) = 1n/101n.
  EXPECT_NEAR(b.figures.at("ratio"), 1.0 / 101.0, 1e-12);
}

TEST(CapacitiveDivider, LoadedTapInSubcircuit) {
  auto d = recognise_deck(R"(divider in a subcircuit feeding a filter
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
XC N TAP L CDIV
RO TAP OUT 10k
CF OUT N 10n
.subckt CDIV bot tap top
CA top tap 2.2n
CB bot tap 220n
.ends
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("capacitive-divider");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "loaded");
  EXPECT_EQ(d->refs(*blocks[0], "upper"), (Refs{"XC.CA"}));
  EXPECT_EQ(d->refs(*blocks[0], "lower"), (Refs{"XC.CB"}));
  EXPECT_EQ(d->refs(*blocks[0], "load"), (Refs{"RO"}));
}

TEST(CapacitiveDivider, YCapacitorsToEarthAreNotADivider) {
  auto d = recognise_deck(R"(Y capacitors
*@supply mains=230V/50Hz line=L neutral=N earth=PE
V1 L N SIN(0 325 50)
*@part CY1 class=Y2
CY1 L PE 2.2n
*@part CY2 class=Y2
CY2 PE N 2.2n
RPE PE 0 1
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("capacitive-divider").empty());
}

TEST(CapacitiveDivider, RectifierOnTapMakesItADropper) {
  auto d = recognise_deck(R"(dropper with a shunt capacitor
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
C1 L A 330n
C2 A N 10n
DZ N A DZ12
D1 A OUT DR
C3 OUT N 100u
.model DZ12 D(BV=12)
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("capacitive-divider").empty());
  EXPECT_EQ(d->of_kind("capacitive-dropper").size(), 1u);
}

}  // namespace
}  // namespace mainscheck::testing
