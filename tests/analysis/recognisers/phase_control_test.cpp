#include "analysis/recognisers/phase_control.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

// Black-box switch models: recognition collapses each annotated instance to one part.
constexpr const char* kModels = R"(
.subckt TRI MT2 G MT1
R1 MT2 G 1G
R2 G MT1 1k
.ends
.subckt TRI_GFIRST G MT1 MT2
R1 MT2 G 1G
R2 G MT1 1k
.ends
.subckt SCR A G K
R1 A G 1G
R2 G K 1k
.ends
.subckt DIAC A B
R1 A B 1G
.ends
.end
)";

TEST(PhaseControl, DimmerExampleTriacWithDiac) {
  auto d = recognise_example("lamp-dimmer-triac.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("phase-control");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "triac-diac");
  EXPECT_EQ(d->refs(b, "triac"), (Refs{"XT1"}));
  EXPECT_EQ(d->refs(b, "diac"), (Refs{"XD1"}));
  EXPECT_EQ(d->refs(b, "timing_resistor"), (Refs{"RPOT", "RT1"}));
  EXPECT_EQ(d->refs(b, "timing_capacitor"), (Refs{"CT1"}));
  EXPECT_EQ(d->refs(b, "snubber_resistor"), (Refs{"RS1"}));
  EXPECT_EQ(d->refs(b, "snubber_capacitor"), (Refs{"CS1"}));
  EXPECT_EQ(d->refs(b, "load"), (Refs{"RLAMP"}));
  EXPECT_EQ(d->net(b.outputs[0].net), "lf");
  EXPECT_EQ(d->net(b.outputs[0].ret), "mt2");
  EXPECT_DOUBLE_EQ(b.figures.at("v_breakover_V"), 32);
  EXPECT_DOUBLE_EQ(b.figures.at("c_timing_F"), 100e-9);
  EXPECT_DOUBLE_EQ(b.figures.at("r_timing_ohm"), 153.3e3);
  // The snubber and the timing capacitor are not a capacitive dropper.
  EXPECT_TRUE(d->of_kind("capacitive-dropper").empty());
}

TEST(PhaseControl, TriacInLineSideRcGateNamedPinsInOtherOrder) {
  auto d = recognise_deck(std::string(R"(triac before the load, RC gate drive
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
*@part XQ type=triac
XQ G OUT L TRI_GFIRST
RLOAD OUT N 100
RT L TIM 68k
CT TIM OUT 47n
RG TIM G 1k
)") + kModels);
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("phase-control");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "triac-rc");
  EXPECT_EQ(d->refs(b, "gate_resistor"), (Refs{"RG"}));
  EXPECT_EQ(d->refs(b, "timing_capacitor"), (Refs{"CT"}));
  EXPECT_EQ(d->refs(b, "timing_resistor"), (Refs{"RT"}));
  EXPECT_EQ(d->refs(b, "load"), (Refs{"RLOAD"}));
}

TEST(PhaseControl, ThyristorHalfWave) {
  auto d = recognise_deck(std::string(R"(SCR half-wave heater control
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
*@part XS type=thyristor
XS A G N SCR
*@part RH type=heater
RH L A 53
R1 A T 100k
C1 T N 100n
*@part XD type=diac
XD T G DIAC
)") + kModels);
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("phase-control");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "thyristor-half-wave");
  EXPECT_EQ(d->refs(*blocks[0], "thyristor"), (Refs{"XS"}));
  EXPECT_EQ(d->refs(*blocks[0], "diac"), (Refs{"XD"}));
  EXPECT_EQ(d->refs(*blocks[0], "load"), (Refs{"RH"}));
}

TEST(PhaseControl, ThyristorInsideBridge) {
  auto d = recognise_deck(std::string(R"(full-wave control: SCR across the DC side of a bridge
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
RLOAD L AC1 53
D1 AC1 P DR
D2 N P DR
D3 M AC1 DR
D4 M N DR
*@part XS type=scr
XS P G M SCR
RG P G 47k
.model DR D(IS=5n)
)") + kModels);
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("phase-control");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "thyristor-bridge");
  EXPECT_EQ(d->refs(*blocks[0], "rectifier"), (Refs{"D1", "D2", "D3", "D4"}));
  EXPECT_EQ(d->refs(*blocks[0], "load"), (Refs{"RLOAD"}));
}

TEST(PhaseControl, AntiparallelThyristorsReportedOnce) {
  auto d = recognise_deck(std::string(R"(two SCRs back to back
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
RLOAD L A 26
*@part XS1 type=thyristor
XS1 A G1 N SCR
*@part XS2 type=thyristor
XS2 N G2 A SCR
RG1 G1 N 1k
RG2 G2 A 1k
)") + kModels);
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("phase-control");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "thyristor-antiparallel");
  EXPECT_EQ(d->refs(*blocks[0], "thyristor"), (Refs{"XS1", "XS2"}));
}

TEST(PhaseControl, PinsFromNamesOrOrder) {
  parser::Part p;
  p.nets = {1, 2, 3};
  auto pins = analysis::thyristor_pins(p);  // unnamed: MT2 G MT1
  ASSERT_TRUE(pins);
  EXPECT_EQ(pins->a, 1u);
  EXPECT_EQ(pins->gate, 2u);
  EXPECT_EQ(pins->k, 3u);
  p.pin_names = {"K", "A", "G"};
  pins = analysis::thyristor_pins(p);
  EXPECT_EQ(pins->a, 2u);
  EXPECT_EQ(pins->gate, 3u);
  EXPECT_EQ(pins->k, 1u);
}

}  // namespace
}  // namespace mainscheck::testing
