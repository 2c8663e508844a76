#include "analysis/recognisers/series_string.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

TEST(SeriesString, FestoonExampleTenLamps) {
  auto d = recognise_example("festoon-lamp-string.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("series-string");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "lamp");
  EXPECT_EQ(d->refs(b, "element").size(), 10u);
  EXPECT_DOUBLE_EQ(b.figures.at("elements"), 10);
  // Equal series elements share the voltage equally: 1/n (series circuit).
  EXPECT_DOUBLE_EQ(b.figures.at("voltage_share"), 0.1);
  EXPECT_NEAR(b.figures.at("r_total_ohm"), 529.0, 1e-9);
}

TEST(SeriesString, LedStringWithLimiterAndReversedPins) {
  auto d = recognise_deck(R"(LED string with a series resistor
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
*@part D1 type=led
D1 L A1 DL
*@part D2 type=led
D2 A1 A2 DL
*@part D3 type=led
D3 A2 A3 DL
*@part D4 type=led
D4 A3 A4 DL
R1 N A4 47k
* the reverse LED protects the string in the other half cycle
D5 N L DR
.model DL D(IS=1e-20 N=1.8)
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("series-string");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "led");
  EXPECT_EQ(d->refs(*blocks[0], "element"), (Refs{"D1", "D2", "D3", "D4"}));
  EXPECT_EQ(d->refs(*blocks[0], "series_limiter"), (Refs{"R1"}));
}

TEST(SeriesString, HeaterElementsInSubcircuit) {
  auto d = recognise_deck(R"(two heater halves
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
XH L N HEATER
.subckt HEATER a b
RH1 a m 26.45
RH2 m b 26.45
.ends
*@part XH.RH1 type=heater
*@part XH.RH2 type=heater
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("series-string");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "heater");
  EXPECT_EQ(d->refs(*blocks[0], "element"), (Refs{"XH.RH1", "XH.RH2"}));
}

TEST(SeriesString, UnequalResistorsAreNotAString) {
  auto d = recognise_deck(R"(unequal chain
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
R1 L J1 100
R2 J1 J2 220
R3 J2 N 470
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("series-string").empty());
}

TEST(SeriesString, EqualLowResistorsAreAString) {
  // 230²/200 = 264 W: this chain is a load, not a bleeder (common practice threshold 1 W).
  auto d = recognise_deck(R"(resistive load string
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
R1 L J1 100
R2 J1 N 100
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("series-string");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "resistor");
}

}  // namespace
}  // namespace mainscheck::testing
