#include "analysis/recognisers/capacitive_dropper.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

TEST(CapacitiveDropper, TimerExampleHasEveryRole) {
  auto d = recognise_example("timer-capacitive-dropper.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("capacitive-dropper");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "half-wave-zener-regulator");
  EXPECT_EQ(d->refs(b, "series_capacitor"), (Refs{"C1"}));
  EXPECT_EQ(d->refs(b, "surge_resistor"), (Refs{"RS1"}));
  EXPECT_EQ(d->refs(b, "bleeder"), (Refs{"RB1"}));
  EXPECT_EQ(d->refs(b, "return_diode"), (Refs{"D2"}));
  EXPECT_EQ(d->refs(b, "rectifier"), (Refs{"D1"}));
  EXPECT_EQ(d->refs(b, "shunt_regulator"), (Refs{"DZ1"}));
  EXPECT_EQ(d->refs(b, "reservoir"), (Refs{"C2"}));
  EXPECT_EQ(d->refs(b, "linear_regulator"), (Refs{"XU1"}));
  ASSERT_EQ(b.outputs.size(), 2u);
  EXPECT_EQ(d->net(b.outputs[0].net), "vz");
  EXPECT_EQ(d->net(b.outputs[1].net), "v5");
  EXPECT_EQ(d->net(b.inputs[0]), "l");
  EXPECT_DOUBLE_EQ(b.figures.at("c_series_F"), 470e-9);
  EXPECT_DOUBLE_EQ(b.figures.at("r_surge_ohm"), 100);
  // The same ladder shape is not also reported as a half-wave doubler.
  EXPECT_TRUE(d->of_kind("half-wave-doubler").empty());
}

TEST(CapacitiveDropper, NeutralSideCapacitorIntoBridgeForLeds) {
  auto d = recognise_deck(R"(LED lamp driver, series capacitor on the neutral side
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
RS A2 X 220
C1 N X 1u
R1 X N 1MEG
D1 L P DR
D2 A2 P DR
D3 Q L DR
D4 Q A2 DR
CB P Q 10u
*@part DL1 type=led
DL1 P M DL
*@part DL2 type=led
DL2 M Q DL
.model DR D(IS=5n BV=1000)
.model DL D(IS=1e-20 N=1.8)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("capacitive-dropper");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "bridge");
  EXPECT_EQ(d->refs(b, "series_capacitor"), (Refs{"C1"}));
  EXPECT_EQ(d->refs(b, "surge_resistor"), (Refs{"RS"}));
  EXPECT_EQ(d->refs(b, "bleeder"), (Refs{"R1"}));
  EXPECT_EQ(d->refs(b, "rectifier"), (Refs{"D1", "D2", "D3", "D4"}));
  EXPECT_EQ(d->refs(b, "reservoir"), (Refs{"CB"}));
  EXPECT_EQ(d->net(b.outputs[0].net), "p");
  EXPECT_EQ(d->net(b.outputs[0].ret), "q");
}

TEST(CapacitiveDropper, ZenerClampAtTheCapacitor) {
  auto d = recognise_deck(R"(zener straight after the capacitor, pins reversed
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
C1 A L 220n
DZ N A DZ15
D1 A OUT DR
C2 N OUT 220u
.model DZ15 D(BV=15)
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("capacitive-dropper");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "half-wave-zener");
  EXPECT_EQ(d->refs(*blocks[0], "shunt_regulator"), (Refs{"DZ"}));
  EXPECT_EQ(d->refs(*blocks[0], "reservoir"), (Refs{"C2"}));
}

TEST(CapacitiveDropper, RcSnubberAcrossMainsIsNotADropper) {
  auto d = recognise_deck(R"(X capacitor, bleeder and an RC snubber
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
CX L N 100n
RX L N 1MEG
RS L S 100
CS S N 100n
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("capacitive-dropper").empty());
  EXPECT_TRUE(d->of_kind("capacitive-divider").empty());
}

TEST(CapacitiveDropper, LargePumpCapacitorIsADoublerNotADropper) {
  auto d = recognise_deck(R"(Greinacher doubler with equal capacitors
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
C1 L A 47u
D1 N A DR
D2 A OUT DR
C2 OUT N 47u
RL OUT N 10k
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("capacitive-dropper").empty());
  EXPECT_EQ(d->of_kind("half-wave-doubler").size(), 1u);
}

TEST(CapacitiveDropper, CurrentLimitRatio) {
  // Common practice 1:20 between series and reservoir capacitance.
  EXPECT_TRUE(analysis::series_capacitor_limits_current(470e-9, 470e-6));
  EXPECT_FALSE(analysis::series_capacitor_limits_current(47e-6, 47e-6));
  EXPECT_FALSE(analysis::series_capacitor_limits_current(1e-6, 0));
}

}  // namespace
}  // namespace mainscheck::testing
