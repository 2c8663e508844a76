#include "analysis/recognisers/centre_tap.hpp"

#include <gtest/gtest.h>

#include "analysis/recognisers/bridge.hpp"
#include "analysis/recognition_support.hpp"

namespace mainscheck::analysis {
namespace {

using testing::Deck;
using testing::SingleRun;
using StrVec = std::vector<std::string>;

// Harrow Lane 12 V bench charger: centre-tapped secondary, two diodes, reservoir to the tap.
constexpr const char* kCharger = R"(charger
V1 L N SIN(0 325 50)
LP L N 10
LS1 A CT 0.027
LS2 CT B 0.027
K1 LP LS1 LS2 0.999
D1 A OUT DX
D2 B OUT DX
C1 OUT CT 2200u
R1 OUT CT 10k
.model DX D(BV=100)
.end
)";

TEST(CentreTapRecogniser, PositiveOutputToTheTap) {
  Deck d(kCharger);
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  SingleRun run(d);
  run.add_secondary("A", "B", "CT", 0.052);
  const auto& blocks = run.run(*make_centre_tap_rectifier_recogniser());
  ASSERT_EQ(blocks.size(), 1u) << d.rendered();
  const Block& b = blocks[0];
  EXPECT_EQ(b.kind, "centre-tap-rectifier");
  EXPECT_EQ(b.variant, "positive");
  EXPECT_EQ(run.refs(b, "diodes"), (StrVec{"D1", "D2"}));
  EXPECT_EQ(run.refs(b, "reservoir"), (StrVec{"C1"}));
  EXPECT_EQ(run.refs(b, "bleeder"), (StrVec{"R1"}));
  EXPECT_EQ(run.net(b.outputs[0].net), "OUT");
  EXPECT_EQ(run.net(b.outputs[0].ret), "CT");
  EXPECT_EQ(b.fed_by, 1u);
}

TEST(CentreTapRecogniser, NegativeWithGroundTapAndSwappedWindingOrder) {
  Deck d(R"(negative supply
V1 L N SIN(0 325 50)
LP L N 10
LS2 0 B 0.027
LS1 A 0 0.027
K1 LP LS1 LS2 0.999
D2 NEG B DX
D1 NEG A DX
C1 0 NEG 1000u
.model DX D(BV=100)
.end
)");
  SingleRun run(d);
  run.add_secondary("B", "A", "0", 0.052);
  const auto& blocks = run.run(*make_centre_tap_rectifier_recogniser());
  ASSERT_EQ(blocks.size(), 1u) << d.rendered();
  EXPECT_EQ(blocks[0].variant, "negative");
  EXPECT_EQ(run.refs(blocks[0], "reservoir"), (StrVec{"C1"}));
}

TEST(CentreTapRecogniser, WithoutCentreTapOrWithBridgeItIsNot) {
  // The same two diodes on a winding without a tap: nothing to return to.
  Deck d(kCharger);
  SingleRun run(d);
  run.add_secondary("A", "B", nullptr, 0.052);
  EXPECT_TRUE(run.run(*make_centre_tap_rectifier_recogniser()).empty());

  // Four diodes on a tapped winding form a bridge; its top pair is not a centre-tap rectifier.
  Deck b(R"(bridge on tapped winding
V1 L N SIN(0 325 50)
D1 A P DX
D2 B P DX
D3 M A DX
D4 M B DX
C1 P M 1000u
R1 P CT 1k
.model DX D(BV=100)
.end
)");
  SingleRun rb(b);
  rb.add_secondary("A", "B", "CT", 0.05);
  EXPECT_TRUE(rb.run(*make_centre_tap_rectifier_recogniser()).empty());
  EXPECT_EQ(rb.run(*make_bridge_rectifier_recogniser()).size(), 1u);
}

}  // namespace
}  // namespace mainscheck::analysis
