#include "analysis/recognisers/cockcroft_walton.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

TEST(CockcroftWalton, IonizerExampleFourStages) {
  auto d = recognise_example("ionizer-cockcroft-walton.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("cockcroft-walton");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "positive");
  EXPECT_DOUBLE_EQ(b.figures.at("stages"), 4);
  // No-load output 2·n·Vpk (Cockcroft–Walton); ngspice-39 on this loaded deck: 2327 V after 2 s.
  EXPECT_DOUBLE_EQ(b.figures.at("multiplication"), 8);
  EXPECT_EQ(d->refs(b, "rectifier").size(), 8u);
  EXPECT_EQ(d->refs(b, "pump_capacitor"), (Refs{"C1", "C3", "C5", "C7"}));
  EXPECT_EQ(d->refs(b, "smoothing_capacitor"), (Refs{"C2", "C4", "C6", "C8"}));
  EXPECT_EQ(d->net(b.outputs[0].net), "b4");
  EXPECT_EQ(d->net(b.inputs[0]), "ls");
  EXPECT_TRUE(d->of_kind("half-wave-doubler").empty());
}

TEST(CockcroftWalton, NegativeThreeStagesInSubcircuitShuffledOrder) {
  auto d = recognise_deck(R"(negative cascade, parts out of order, inside a subcircuit
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
XM L N OUT CW3N
RL OUT N 100MEG
.subckt CW3N in ret out
C6 b3 b2 10n
D6 b3 a3 DR
C5 a3 a2 10n
D5 a3 b2 DR
C4 b2 b1 10n
D4 b2 a2 DR
C3 a2 a1 10n
D3 a2 b1 DR
C2 b1 ret 10n
D2 b1 a1 DR
C1 in a1 10n
D1 a1 ret DR
R1 b3 out 1MEG
.model DR D(IS=5n)
.ends
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("cockcroft-walton");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "negative");
  EXPECT_DOUBLE_EQ(blocks[0]->figures.at("stages"), 3);
  EXPECT_EQ(d->net(blocks[0]->outputs[0].net), "xm.b3");
}

TEST(CockcroftWalton, BrokenSecondStageCountsOneStage) {
  // Without C4 the second stage is incomplete: a half-wave doubler plus stray parts.
  auto d = recognise_deck(R"(incomplete ladder
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
C1 L A1 10n
D1 N A1 DR
D2 A1 B1 DR
C2 B1 N 10n
C3 A1 A2 10n
D3 B1 A2 DR
D4 A2 B2 DR
RL B2 N 1MEG
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("cockcroft-walton").empty());
  const auto hw = d->of_kind("half-wave-doubler");
  ASSERT_EQ(hw.size(), 1u);
  EXPECT_EQ(d->refs(*hw[0], "rectifier"), (Refs{"D1", "D2"}));
}

}  // namespace
}  // namespace mainscheck::testing
