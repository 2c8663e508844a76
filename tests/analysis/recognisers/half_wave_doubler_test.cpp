#include "analysis/recognisers/half_wave_doubler.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

TEST(HalfWaveDoubler, FlashChargerExample) {
  auto d = recognise_example("flash-half-wave-doubler.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("half-wave-doubler");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "positive");
  EXPECT_EQ(d->refs(b, "rectifier"), (Refs{"D1", "D2"}));
  EXPECT_EQ(d->refs(b, "pump_capacitor"), (Refs{"C1"}));
  EXPECT_EQ(d->refs(b, "smoothing_capacitor"), (Refs{"C2"}));
  EXPECT_EQ(d->net(b.outputs[0].net), "out");
  EXPECT_EQ(d->net(b.outputs[0].ret), "0");
  // Greinacher no-load output 2·Vpk; ngspice-39 on this deck: 646 V mean against 2·325 = 650 V.
  EXPECT_DOUBLE_EQ(b.figures.at("multiplication"), 2);
  EXPECT_TRUE(d->of_kind("capacitive-dropper").empty());
  EXPECT_TRUE(d->of_kind("cockcroft-walton").empty());
}

TEST(HalfWaveDoubler, NegativeOnTransformerSecondary) {
  auto d = recognise_deck(R"(negative doubler on a secondary, pins written cathode-first
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
LP L N 1
LS S 0 0.04
K1 LP LS 0.995
C1 A S 10u
D1 A 0 DR
D2 OUT A DR
C2 0 OUT 10u
RL OUT 0 100k
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("half-wave-doubler");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "negative");
  ASSERT_TRUE(blocks[0]->fed_by);
  EXPECT_NE(d->result.ac_sources.at(*blocks[0]->fed_by).origin, "mains");
}

TEST(HalfWaveDoubler, SeriesDiodeStackIsNotAMultiplier) {
  // A high-voltage diode stack with grading capacitors across each diode: no pump column.
  auto d = recognise_deck(R"(diode stack with grading capacitors
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
D1 L J1 DR
D2 J1 J2 DR
D3 J2 OUT DR
CG1 L J1 1n
CG2 J1 J2 1n
CG3 J2 OUT 1n
C1 OUT N 10u
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("half-wave-doubler").empty());
  EXPECT_TRUE(d->of_kind("cockcroft-walton").empty());
  EXPECT_TRUE(d->of_kind("voltage-quadrupler").empty());
}

}  // namespace
}  // namespace mainscheck::testing
