#include "analysis/recognisers/bridge.hpp"

#include <gtest/gtest.h>

#include "analysis/recognition_support.hpp"

namespace mainscheck::analysis {
namespace {

using testing::Deck;
using StrVec = std::vector<std::string>;

// Harrow Lane Workshop bench supply: fuse, bridge, reservoir and bleeder.
constexpr const char* kBenchFrontEnd = R"(bench supply front end
V1 L N SIN(0 325 50)
*@part RF1 type=fuse i_rated=1
RF1 L LF 0.1
D1 LF P D1N4007
D2 N P D1N4007
D3 M LF D1N4007
D4 M N D1N4007
C1 P M 100u
R1 P M 220k
.model D1N4007 D(IS=7n N=1.9 BV=1000)
.end
)";

TEST(BridgeRecogniser, DiscreteBridgeWithReservoirAndBleeder) {
  Deck d(kBenchFrontEnd);
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  d.run();
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  const auto bridges = d.blocks("bridge-rectifier");
  ASSERT_EQ(bridges.size(), 1u) << d.rendered();
  const Block& b = *bridges[0];
  EXPECT_EQ(b.variant, "discrete");
  EXPECT_EQ(d.refs(b, "diodes"), (StrVec{"D1", "D2", "D3", "D4"}));
  EXPECT_EQ(d.refs(b, "reservoir"), (StrVec{"C1"}));
  EXPECT_EQ(d.refs(b, "bleeder"), (StrVec{"R1"}));
  ASSERT_EQ(b.inputs.size(), 2u);
  EXPECT_EQ(d.net(b.inputs[0]), "LF");
  EXPECT_EQ(d.net(b.inputs[1]), "N");
  ASSERT_EQ(b.outputs.size(), 1u);
  EXPECT_EQ(d.net(b.outputs[0].net), "P");
  EXPECT_EQ(d.net(b.outputs[0].ret), "M");
  ASSERT_TRUE(b.fed_by.has_value());
  EXPECT_EQ(*b.fed_by, 0u);
  EXPECT_EQ(b.member_locs.size(), 6u);
}

}  // namespace
}  // namespace mainscheck::analysis
