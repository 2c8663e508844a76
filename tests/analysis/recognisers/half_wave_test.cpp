#include "analysis/recognisers/half_wave.hpp"

#include <gtest/gtest.h>

#include "analysis/recognition_support.hpp"

namespace mainscheck::analysis {
namespace {

using testing::Deck;
using StrVec = std::vector<std::string>;

TEST(HalfWaveRecogniser, PositiveWithReservoirThroughSurgeResistor) {
  // Harrow Lane night-light: 230 V, surge resistor, one diode, reservoir and bleeder to neutral.
  Deck d(R"(night light
V1 L N SIN(0 325 50)
RS L A 47
D1 A DC D1N4007
C1 DC N 10u
R2 DC N 470k
.model D1N4007 D(BV=1000)
.end
)");
  d.run();
  const auto hw = d.blocks("half-wave-rectifier");
  ASSERT_EQ(hw.size(), 1u) << d.rendered();
  const Block& b = *hw[0];
  EXPECT_EQ(b.variant, "positive");
  EXPECT_EQ(d.refs(b, "diode"), (StrVec{"D1"}));
  EXPECT_EQ(d.refs(b, "series_limiter"), (StrVec{"RS"}));
  EXPECT_EQ(d.refs(b, "reservoir"), (StrVec{"C1"}));
  EXPECT_EQ(d.refs(b, "bleeder"), (StrVec{"R2"}));
  ASSERT_EQ(b.outputs.size(), 1u);
  EXPECT_EQ(d.net(b.outputs[0].net), "DC");
  EXPECT_EQ(d.net(b.outputs[0].ret), "N");
  EXPECT_TRUE(d.blocks("bridge-rectifier").empty());
}

TEST(HalfWaveRecogniser, NegativeFromNeutralSideWithReversedPins) {
  // Diode drawn cathode-to-line: negative output; the supply nets come from annotation.
  Deck d(R"(negative rail
*@supply line=AC1 neutral=AC2 mains=120V/60Hz
V1 AC1 AC2 SIN(0 170 60)
D7 NEG AC1 DX
C3 AC2 NEG 220u
.model DX D(BV=400)
.end
)");
  d.run();
  const auto hw = d.blocks("half-wave-rectifier");
  ASSERT_EQ(hw.size(), 1u) << d.rendered();
  EXPECT_EQ(hw[0]->variant, "negative");
  EXPECT_EQ(d.refs(*hw[0], "reservoir"), (StrVec{"C3"}));
  EXPECT_EQ(d.net(hw[0]->outputs[0].net), "NEG");
}

TEST(HalfWaveRecogniser, WithoutReservoirFeedingAHeater) {
  // Half-power setting of a heater: diode in series with the element.
  Deck d(R"(heater half power
V1 L N SIN(0 325 50)
D1 L H DX
*@part RH type=heater p_rated=1000
RH H N 52.9
.model DX D(BV=1000)
.end
)");
  d.run();
  const auto hw = d.blocks("half-wave-rectifier");
  ASSERT_EQ(hw.size(), 1u) << d.rendered();
  EXPECT_TRUE(d.refs(*hw[0], "reservoir").empty());
  EXPECT_EQ(d.refs(*hw[0], "load"), (StrVec{"RH"}));
}

TEST(HalfWaveRecogniser, LookAlikesAreNotHalfWave) {
  // A symmetric doubler pair (D1 up, D2 down from the same AC net, capacitors to neutral) and a
  // diode continuing into another diode (a multiplier stage) are other blocks' business; a diode
  // straight across the supply is no rectifier.
  Deck d(R"(look-alikes
V1 L N SIN(0 325 50)
D1 L P DX
D2 M L DX
C1 P N 100u
C2 N M 100u
D3 L N DX
.model DX D(BV=1000)
.end
)");
  d.run();
  EXPECT_TRUE(d.blocks("half-wave-rectifier").empty()) << d.rendered();
}

TEST(HalfWaveRecogniser, UndrivenDiodeIsNotARectifier) {
  Deck d(R"(dc circuit
V1 L N SIN(0 325 50)
R9 L N 1k
V2 A 0 DC 12
D1 A B DX
C1 B 0 10u
.model DX D(BV=100)
.end
)");
  d.run();
  EXPECT_TRUE(d.blocks("half-wave-rectifier").empty()) << d.rendered();
}

}  // namespace
}  // namespace mainscheck::analysis
