#include "analysis/recognisers/dual_rail.hpp"

#include <gtest/gtest.h>

#include "analysis/recognisers/bridge.hpp"
#include "analysis/recognisers/centre_tap.hpp"
#include "analysis/recognition_support.hpp"

namespace mainscheck::analysis {
namespace {

using testing::Deck;
using testing::SingleRun;
using StrVec = std::vector<std::string>;

// Harrow Lane audio amplifier: +-35 V rails from a bridge on a centre-tapped secondary.
constexpr const char* kAmpRails = R"(amp rails
V1 L N SIN(0 325 50)
LP L N 10
LS1 A 0 0.13
LS2 0 B 0.13
K1 LP LS1 LS2 0.999
D1 A VP DX
D2 B VP DX
D3 VN A DX
D4 VN B DX
C1 VP 0 4700u
C2 0 VN 4700u
R1 VP 0 4.7k
.model DX D(BV=200)
.end
)";

TEST(DualRailRecogniser, BridgeWithGroundedCentreTap) {
  Deck d(kAmpRails);
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  SingleRun run(d);
  run.add_secondary("A", "B", "0", 0.115);
  const auto& blocks = run.run(*make_dual_rail_rectifier_recogniser());
  ASSERT_EQ(blocks.size(), 1u) << d.rendered();
  const Block& b = blocks[0];
  EXPECT_EQ(b.variant, "bridge");
  EXPECT_EQ(run.refs(b, "diodes"), (StrVec{"D1", "D2", "D3", "D4"}));
  EXPECT_EQ(run.refs(b, "reservoir_pos"), (StrVec{"C1"}));
  EXPECT_EQ(run.refs(b, "reservoir_neg"), (StrVec{"C2"}));
  EXPECT_EQ(run.refs(b, "load_pos"), (StrVec{"R1"}));
  ASSERT_EQ(b.outputs.size(), 2u);
  EXPECT_EQ(run.net(b.outputs[0].net), "VP");
  EXPECT_EQ(run.net(b.outputs[1].net), "VN");
  EXPECT_EQ(run.net(b.outputs[1].ret), "0");
  // The same diodes are not reported again as a plain bridge.
  SingleRun again(d);
  again.add_secondary("A", "B", "0", 0.115);
  EXPECT_TRUE(again.run(*make_bridge_rectifier_recogniser()).empty());
}

TEST(DualRailRecogniser, TwoDiodesOnSplitEnds) {
  Deck d(R"(preamp rails
V1 L N SIN(0 325 50)
DP A VP DX
DN VN B DX
C1 VP CT 470u
C2 VN CT 470u
.model DX D(BV=200)
.end
)");
  SingleRun run(d);
  run.add_secondary("A", "B", "CT", 0.06);
  const auto& blocks = run.run(*make_dual_rail_rectifier_recogniser());
  ASSERT_EQ(blocks.size(), 1u) << d.rendered();
  EXPECT_EQ(blocks[0].variant, "two-diode");
  EXPECT_EQ(blocks[0].figures.at("same_end"), 0.0);
  EXPECT_EQ(run.refs(blocks[0], "reservoir_neg"), (StrVec{"C2"}));
  EXPECT_TRUE(SingleRun(d).run(*make_centre_tap_rectifier_recogniser()).empty());
}

TEST(DualRailRecogniser, BridgeWithOnlyOneRailCapacitorIsABridge) {
  Deck d(R"(single rail
V1 L N SIN(0 325 50)
D1 A VP DX
D2 B VP DX
D3 VN A DX
D4 VN B DX
C1 VP VN 4700u
C2 VP 0 100n
.model DX D(BV=200)
.end
)");
  SingleRun run(d);
  run.add_secondary("A", "B", "0", 0.115);
  EXPECT_TRUE(run.run(*make_dual_rail_rectifier_recogniser()).empty());
  SingleRun br(d);
  br.add_secondary("A", "B", "0", 0.115);
  EXPECT_EQ(br.run(*make_bridge_rectifier_recogniser()).size(), 1u);
}

}  // namespace
}  // namespace mainscheck::analysis
