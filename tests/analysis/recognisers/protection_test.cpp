#include "analysis/recognisers/protection.hpp"

#include <gtest/gtest.h>

#include "analysis/recognition_support.hpp"

namespace mainscheck::analysis {
namespace {

using testing::Deck;
using StrVec = std::vector<std::string>;

// Harrow Lane bench supply mains entry: fuse, varistor, X2 with discharge string, Y2 pair to PE,
// common-mode choke, NTC inrush limiter, then the bridge.
constexpr const char* kMainsEntry = R"(mains entry
*@supply line=L neutral=N earth=PE mains=230V+-10%/50Hz
V1 L N SIN(0 325 50)
*@part RF1 type=fuse i_rated=2 v_rated_ac=250
RF1 L L1 0.1
*@part RV1 type=varistor v_rated_ac=275
RV1 L1 N 1meg
*@part CX1 class=X2 v_rated_ac=275
CX1 L1 N 100n
RD1 L1 MID 470k
RD2 MID N 470k
CY1 L1 PE 2.2n
CY2 N PE 2.2n
LCM1 L1 L2 10m
LCM2 N N2 10m
KCM LCM1 LCM2 0.98
RNTC1 L2 AC1 5
D1 AC1 P DX
D2 N2 P DX
D3 M AC1 DX
D4 M N2 DX
C1 P M 47u
.model DX D(BV=1000)
.end
)";

TEST(ProtectionRecogniser, FindsEveryProtectivePart) {
  Deck d(kMainsEntry);
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  d.run();
  ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
  const auto prot = d.blocks("protection");
  ASSERT_EQ(prot.size(), 1u) << d.rendered();
  const Block& b = *prot[0];
  EXPECT_EQ(d.refs(b, "fuse"), (StrVec{"RF1"}));
  EXPECT_EQ(d.refs(b, "varistor"), (StrVec{"RV1"}));
  EXPECT_EQ(d.refs(b, "x_capacitor"), (StrVec{"CX1"}));
  EXPECT_EQ(d.refs(b, "y_capacitor"), (StrVec{"CY1", "CY2"}));
  EXPECT_EQ(d.refs(b, "discharge_resistor"), (StrVec{"RD1", "RD2"}));
  EXPECT_EQ(d.refs(b, "common_mode_choke"), (StrVec{"LCM1", "LCM2"}));
  EXPECT_EQ(d.refs(b, "inrush_limiter"), (StrVec{"RNTC1"}));
  ASSERT_EQ(b.inputs.size(), 3u);
  EXPECT_EQ(d.net(b.inputs[2]), "PE");
  // Through fuse, choke and NTC the bridge still sees the mains.
  const auto br = d.blocks("bridge-rectifier");
  ASSERT_EQ(br.size(), 1u);
  EXPECT_EQ(br[0]->fed_by, 0u);
  EXPECT_TRUE(d.result.unrecognised.empty()) << d.result.unrecognised.size();
}

TEST(ProtectionRecogniser, SeriesResistorAheadOfRectifierIsInrushLimiter) {
  Deck d(R"(resistor inrush
V1 L N SIN(0 325 50)
R1 L A 22
D1 A P DX
C1 P N 10u
R2 L B 220k
R3 B N 220k
.model DX D(BV=1000)
.end
)");
  d.run();
  const auto prot = d.blocks("protection");
  ASSERT_EQ(prot.size(), 1u) << d.rendered();
  EXPECT_EQ(d.refs(*prot[0], "inrush_limiter"), (StrVec{"R1"}));
  // R2+R3 across the line with no X capacitor still drain it: a discharge string.
  EXPECT_EQ(d.refs(*prot[0], "discharge_resistor"), (StrVec{"R2", "R3"}));
}

TEST(ProtectionRecogniser, NothingProtectiveNoBlock) {
  Deck d("bare heater\nV1 L N SIN(0 325 50)\nRH L N 52.9\n.end\n");
  d.run();
  EXPECT_TRUE(d.blocks("protection").empty());
  // A heater straight across the mains is the product's load: checked part by part, not an
  // unrecognised block (docs/blocks.md).
  EXPECT_TRUE(d.result.unrecognised.empty());
}

}  // namespace
}  // namespace mainscheck::analysis
