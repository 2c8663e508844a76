#include "analysis/recognisers/optocoupler.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

// A mains-side LED drive (R1 from line) and a detector on a separate 5 V circuit; the subcircuit is
// collapsed to one part by its type annotation (docs/blocks.md "Device view").
constexpr const char* kDeck = R"(optocoupler recognition
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
R1 L LA 100k
*@part XU3 type=optocoupler
XU3 LA N OUT G2 OPTO4
V2 VCC G2 5
R2 VCC OUT 10k
.subckt OPTO4 A K C E
D1 A K DL
R1 C E 10meg
.ends
.model DL D(IS=1e-20 N=1.8)
.end
)";

TEST(Optocoupler, TypedSubcircuitInstanceIsOneBarrierBlock) {
  auto d = recognise_deck(kDeck);
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("optocoupler");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(d->refs(b, "coupler"), (Refs{"XU3"}));
  ASSERT_EQ(b.inputs.size(), 2u);
  EXPECT_EQ(d->net(b.inputs[0]), "la");
  EXPECT_EQ(d->net(b.inputs[1]), "n");
  ASSERT_EQ(b.outputs.size(), 1u);
  EXPECT_EQ(d->net(b.outputs[0].net), "out");
  EXPECT_EQ(d->net(b.outputs[0].ret), "g2");
  EXPECT_DOUBLE_EQ(b.figures.at("detector_pins"), 2);
}

TEST(Optocoupler, UntypedInstanceIsNoBarrier) {
  std::string deck = kDeck;
  deck.erase(deck.find("*@part XU3 type=optocoupler\n"), std::string("*@part XU3 type=optocoupler\n").size());
  auto d = recognise_deck(deck);
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("optocoupler").empty());
}

TEST(Optocoupler, ThreePinPartIsWarnedAboutAndSkipped) {
  auto d = recognise_deck(R"(three-pin optocoupler
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
*@part XU3 type=optocoupler
XU3 L N OUT OPTO3
R2 OUT N 10k
.subckt OPTO3 A K C
R1 A K 1k
R2 C K 1k
.ends
.end
)");
  EXPECT_TRUE(d->of_kind("optocoupler").empty());
  bool warned = false;
  for (const auto& diag : d->diags.diagnostics())
    warned = warned || diag.message.find("optocoupler XU3 has 3 pins") != std::string::npos;
  EXPECT_TRUE(warned);
}

}  // namespace
}  // namespace mainscheck::testing
