#include "analysis/recognition.hpp"

#include <gtest/gtest.h>

#include "analysis/recognition_support.hpp"

namespace mainscheck::analysis {
namespace {

using testing::Deck;
using StrVec = std::vector<std::string>;

std::vector<std::string> summary(const RecognitionResult& r) {
  std::vector<std::string> out;
  for (const auto& b : r.blocks) {
    std::string s = b.id + " " + b.kind + " " + b.variant + ":";
    for (std::size_t p : b.parts()) s += " " + r.devices.parts[p].ref;
    out.push_back(s);
  }
  return out;
}

TEST(Recognition, BlocksNumberedByFirstMemberAndDeterministic) {
  const char* deck = R"(two rectifiers
V1 L N SIN(0 325 50)
D9 L HW DX
C9 HW N 10u
*@part RF1 type=fuse
RF1 L LF 0.1
D1 LF P DX
D2 N P DX
D3 M LF DX
D4 M N DX
C1 P M 100u
.model DX D(BV=1000)
.end
)";
  Deck a(deck), b(deck);
  a.run();
  b.run();
  const StrVec want{"B1 half-wave-rectifier positive: D9 C9", "B2 protection : RF1",
                    "B3 bridge-rectifier discrete: D1 D2 D3 D4 C1"};
  EXPECT_EQ(summary(a.result), want) << a.rendered();
  EXPECT_EQ(summary(b.result), want);
  ASSERT_EQ(a.result.blocks[2].member_locs.size(), 5u);
  EXPECT_EQ(a.sm.line_col(a.result.blocks[2].member_locs[0]).line, 7u);  // D1
}

TEST(Recognition, SubcircuitInstanceShownAsOnePart) {
  // A fuse modelled for the simulator as a subcircuit; the annotation makes it one part.
  Deck d(R"(wrapped fuse and wrapped bridge
V1 L N SIN(0 325 50)
.subckt FUSEMODEL a b
R1 a b 0.1
.ends
.subckt BRIDGE4 ac1 ac2 p m
D1 ac1 p DX
D2 ac2 p DX
D3 m ac1 DX
D4 m ac2 DX
.ends
*@part XF1 type=fuse i_rated=1.6
XF1 L LF FUSEMODEL
XB1 LF N P M BRIDGE4
C1 P M 47u
.model DX D(BV=1000)
.end
)");
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  d.run();
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  const auto& dev = d.result.devices;
  const auto xf = dev.find_part_index("XF1");
  ASSERT_TRUE(xf) << d.rendered();
  EXPECT_FALSE(dev.find_part_index("XF1.R1"));
  EXPECT_EQ(d.result.info.type(*xf), FrontEndType::fuse);
  EXPECT_EQ(d.result.info[*xf].number("i_rated"), 1.6);
  ASSERT_EQ(d.result.members_of(*xf).size(), 1u);
  EXPECT_EQ(d.nl.parts[d.result.members_of(*xf)[0]].ref, "XF1.R1");
  const auto prot = d.blocks("protection");
  ASSERT_EQ(prot.size(), 1u);
  EXPECT_EQ(d.refs(*prot[0], "fuse"), (StrVec{"XF1"}));
  // The bridge inside XB1 is flattened (no type given) and still found, fed through the fuse.
  const auto br = d.blocks("bridge-rectifier");
  ASSERT_EQ(br.size(), 1u) << d.rendered();
  EXPECT_EQ(d.refs(*br[0], "diodes"), (StrVec{"XB1.D1", "XB1.D2", "XB1.D3", "XB1.D4"}));
  EXPECT_EQ(d.refs(*br[0], "reservoir"), (StrVec{"C1"}));
}

TEST(Recognition, MissingSupplyIsAnErrorAndNoBlockClaimsToBeFed) {
  Deck d("no supply\nD1 A P DX\nD2 B P DX\nD3 M A DX\nD4 M B DX\nC1 P M 1u\n.model DX D(BV=100)\n.end\n");
  d.run();
  EXPECT_TRUE(d.diags.has_errors());
  EXPECT_TRUE(d.result.blocks.empty());
  EXPECT_TRUE(d.result.ac_sources.empty());
}

TEST(Recognition, TwentyThousandPartBoardWithThreeFrontEndBlocks) {
  Deck d(testing::board_deck(5000));
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered().substr(0, 2000);
  ASSERT_GT(d.nl.parts.size(), 20000u);
  d.run();
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered().substr(0, 2000);
  const StrVec want{"B1 protection : RF1 CX1", "B2 bridge-rectifier discrete: D1 D2 D3 D4 C1 R1",
                    "B3 half-wave-rectifier positive: DAUX CAUX"};
  EXPECT_EQ(summary(d.result), want);
  EXPECT_TRUE(d.result.unrecognised.empty());
}

}  // namespace
}  // namespace mainscheck::analysis
