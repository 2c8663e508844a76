// The recognition skeleton (analysis/skeleton.*): front-ends drawn with series resistors, winding
// resistances and simulator references are recognised as the same blocks as without them, and the
// folded parts join those blocks with their own roles (docs/blocks.md, "Skeleton"). Decks drawn by
// hand in the styles of issue 14's failure classes, not after the recognisers.
#include <gtest/gtest.h>

#include "recognition_support.hpp"

namespace mainscheck::analysis::testing {
namespace {

const Block* only_block(Deck& d, const std::string& kind) {
  const auto found = d.blocks(kind);
  if (found.size() != 1) {
    std::string kinds;
    for (const auto& b : d.result.blocks) kinds += " " + b.kind;
    ADD_FAILURE() << "expected one " << kind << ", found:" << kinds << "\n" << d.rendered();
    return nullptr;
  }
  return found.front();
}

void expect_output(const Deck& d, const Block& b, const std::string& net, const std::string& ret) {
  ASSERT_FALSE(b.outputs.empty());
  EXPECT_EQ(d.net(b.outputs.front().net), net);
  EXPECT_EQ(d.net(b.outputs.front().ret), ret);
}

bool has_kind(const Deck& d, const std::string& kind) {
  for (const auto& b : d.result.blocks)
    if (b.kind == kind) return true;
  return false;
}

const char* kHalfWaveSurgeDeck = R"(half-wave through a 10 ohm resistor
*@supply line=L neutral=N mains=230V/50Hz
V1 L N SIN(0 325 50)
R1 L A 10
D1 A OUT DX
C1 OUT N 47u
RL OUT N 10k
.model DX D(IS=7n RS=0.04 N=1.9)
.end
)";

TEST(Skeleton, HalfWaveBehindPlainSurgeResistorIsARectifierNotADropper) {
  Deck d(kHalfWaveSurgeDeck);
  d.run();
  const Block* b = only_block(d, "half-wave-rectifier");
  ASSERT_NE(b, nullptr);
  EXPECT_FALSE(has_kind(d, "resistive-dropper"));
  EXPECT_EQ(d.refs(*b, "series_limiter"), std::vector<std::string>{"R1"});
  expect_output(d, *b, "OUT", "N");
  EXPECT_TRUE(d.result.unrecognised.empty());
}

TEST(Skeleton, SymmetricDoublerThroughSeriesResistor) {
  Deck d(R"(doubler with surge resistor
*@supply line=L neutral=N mains=115V/60Hz
V1 L N SIN(0 163 60)
RSURGE L A 4.7
D1 A P DX
D2 Q A DX
C1 P N 220u
C2 N Q 220u
RL P Q 4.7k
.model DX D(IS=7n RS=0.04 N=1.9)
.end
)");
  d.run();
  const Block* b = only_block(d, "voltage-doubler");
  ASSERT_NE(b, nullptr);
  expect_output(d, *b, "P", "Q");
  EXPECT_EQ(d.refs(*b, "series_limiter"), std::vector<std::string>{"RSURGE"});
  EXPECT_FALSE(has_kind(d, "resistive-dropper"));
}

TEST(Skeleton, ThreeStageCascadeThroughSeriesResistorReportsItsLastStage) {
  Deck d(R"(cascade
*@supply line=L neutral=N mains=230V/50Hz
V1 L N SIN(0 325 50)
RS L IN 100
C1 IN A1 100n
D1 N A1 DX
D2 A1 B1 DX
C2 B1 N 100n
C3 A2 A1 100n
D3 B1 A2 DX
D4 A2 B2 DX
C4 B2 B1 100n
C5 A3 A2 100n
D5 B2 A3 DX
D6 A3 B3 DX
C6 B3 B2 100n
RL B3 N 100Meg
.model DX D(IS=7n RS=0.04 N=1.9)
.end
)");
  d.run();
  const Block* b = only_block(d, "cockcroft-walton");
  ASSERT_NE(b, nullptr);
  expect_output(d, *b, "B3", "N");
  EXPECT_DOUBLE_EQ(b->figures.at("stages"), 3.0);
  EXPECT_EQ(d.refs(*b, "series_limiter"), std::vector<std::string>{"RS"});
  EXPECT_FALSE(has_kind(d, "resistive-dropper")) << "the cascade's load is no dropper";
}

TEST(Skeleton, TransformerWithWindingResistancesAndReferenceStaysIsolated) {
  // Primary resistance between the mains and the winding, secondary resistance between the winding
  // and the bridge, the DC output tied to the neutral (node 0) through 10 MΩ for the simulator.
  Deck d(R"(transformer with winding resistances
*@supply line=L neutral=0 mains=230V/50Hz
V1 L 0 SIN(0 325 50)
RP L P1 12
LP P1 0 10
LS S1 S2 0.1
RSEC S2 S3 0.3
K1 LP LS 0.999
D1 S1 POS DX
D2 S3 POS DX
D3 NEG S1 DX
D4 NEG S3 DX
C1 POS NEG 2200u
RL POS NEG 100
RREF NEG 0 10Meg
.model DX D(IS=7n RS=0.04 N=1.9)
.end
)");
  d.run();
  const Block* t = only_block(d, "isolation-transformer");
  ASSERT_NE(t, nullptr);
  EXPECT_EQ(d.refs(*t, "winding_resistance"), std::vector<std::string>{"RP"});
  const Block* br = only_block(d, "bridge-rectifier");
  ASSERT_NE(br, nullptr);
  expect_output(d, *br, "POS", "NEG");
  // The secondary's resistance feeds the bridge's diodes directly: the bridge's limiter.
  EXPECT_EQ(d.refs(*br, "series_limiter"), std::vector<std::string>{"RSEC"});
  ASSERT_TRUE(br->fed_by);
  EXPECT_NE(*br->fed_by, 0u) << "fed by the secondary, not the mains";
  ASSERT_EQ(d.result.references.size(), 1u);
  EXPECT_EQ(d.result.devices.parts[d.result.references[0]].ref, "RREF");
  EXPECT_FALSE(has_kind(d, "resistive-dropper"));
}

TEST(Skeleton, CapacitiveDropperWithTwoBleedersInSeries) {
  Deck d(R"(capacitive dropper, two bleeders in series
*@supply line=L neutral=N mains=230V/50Hz
V1 L N SIN(0 325 50)
CX L M 470n
RB1 L BM 470k
RB2 BM M 470k
RS M A 100
D1 A P DX
D2 N P DX
D3 Q A DX
D4 Q N DX
DZ Q P DZ12
C1 P Q 470u
RL P Q 1k
.model DX D(IS=7n RS=0.04 N=1.9)
.model DZ12 D(IS=1n N=1 BV=12 IBV=5m)
.end
)");
  d.run();
  const Block* b = only_block(d, "capacitive-dropper");
  ASSERT_NE(b, nullptr);
  EXPECT_EQ(d.refs(*b, "bleeder"), (std::vector<std::string>{"RB1", "RB2"}));
  EXPECT_FALSE(has_kind(d, "bridge-rectifier")) << "the dropper's bridge is no block of its own";
  EXPECT_DOUBLE_EQ(b->figures.at("r_bleeder_ohm"), 940e3);
  expect_output(d, *b, "P", "Q");
}

TEST(Skeleton, ResistiveDropperIsNotFolded) {
  // 10 kΩ into a zener node: the resistor is the dropper, not a limiter.
  Deck d(R"(resistive dropper
*@supply line=L neutral=N mains=230V/50Hz
V1 L N SIN(0 325 50)
RD L A 10k
D1 A OUT DX
DZ N OUT DZ12
C1 OUT N 100u
RL OUT N 2k
.model DX D(IS=7n RS=0.04 N=1.9)
.model DZ12 D(IS=1n N=1 BV=12 IBV=5m)
.end
)");
  d.run();
  ASSERT_NE(only_block(d, "resistive-dropper"), nullptr);
  EXPECT_FALSE(has_kind(d, "half-wave-rectifier"));
}

TEST(Skeleton, PinsAreRestoredAfterRecognition) {
  Deck d(kHalfWaveSurgeDeck);
  d.run();
  const auto& parts = d.result.devices.parts;
  ASSERT_EQ(parts.size(), 5u);
  EXPECT_EQ(d.net(parts[1].nets[0]), "L");
  EXPECT_EQ(d.net(parts[1].nets[1]), "A");
  EXPECT_EQ(d.net(parts[2].nets[0]), "A");
}

}  // namespace
}  // namespace mainscheck::analysis::testing
