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

TEST(BridgeRecogniser, OtherPinOrderAndDrawingStyle) {
  // The same bridge drawn with the diodes listed bottom-first, the AC pair swapped, ground as the
  // negative rail and an extra load and snubber capacitor around it.
  Deck d(R"(bench supply redrawn
VIN AC_L AC_N SIN(0 325 50)
DB4 0 AC_L DX
DB3 0 AC_N DX
DB2 AC_L VBUS DX
DB1 AC_N VBUS DX
CS1 AC_L VBUS 10n
RL VBUS 0 2k
CB 0 VBUS 470u
.model DX D(BV=1000)
.end
)");
  d.run();
  const auto br = d.blocks("bridge-rectifier");
  ASSERT_EQ(br.size(), 1u) << d.rendered();
  EXPECT_EQ(d.refs(*br[0], "diodes"), (StrVec{"DB4", "DB3", "DB2", "DB1"}));
  EXPECT_EQ(d.refs(*br[0], "reservoir"), (StrVec{"CB"}));
  EXPECT_EQ(d.refs(*br[0], "load"), (StrVec{"RL"}));
  EXPECT_EQ(d.refs(*br[0], "diode_snubber"), (StrVec{"CS1"}));
  EXPECT_EQ(d.net(br[0]->outputs[0].net), "VBUS");
  EXPECT_EQ(d.net(br[0]->outputs[0].ret), "0");
}

TEST(BridgeRecogniser, FedThroughDropperCapacitorAndSurgeResistor) {
  // A capacitive-dropper supply: the bridge is fed through C1 + R1 from the line.
  Deck d(R"(timer dropper
V1 L N SIN(0 325 50)
C1 L A 470n
R1 A B 100
D1 B P DX
D2 N P DX
D3 M B DX
D4 M N DX
C2 P M 220u
.model DX D(BV=1000)
.end
)");
  d.run();
  // One block per function (docs/blocks.md): the bridge is the dropper's rectifier, not a block of
  // its own beside it.
  EXPECT_TRUE(d.blocks("bridge-rectifier").empty()) << d.rendered();
  const auto dr = d.blocks("capacitive-dropper");
  ASSERT_EQ(dr.size(), 1u) << d.rendered();
  EXPECT_EQ(d.refs(*dr[0], "rectifier"), (StrVec{"D1", "D2", "D3", "D4"}));
  EXPECT_EQ(d.refs(*dr[0], "surge_resistor"), (StrVec{"R1"}));
  EXPECT_EQ(d.refs(*dr[0], "series_capacitor"), (StrVec{"C1"}));
  EXPECT_EQ(dr[0]->fed_by, 0u);
}

TEST(BridgeRecogniser, FourDiodesThatAreNotABridge) {
  // (a) two diode strings in parallel between DC rails: the bridge shape with undriven midpoints;
  // (b) a ring of four diodes (the negative rail is the positive rail); (c) two parallel pairs;
  // (d) a series string of four across the mains.
  Deck d(R"(look-alikes
V1 L N SIN(0 325 50)
V2 VA 0 DC 24
D1 VA X DX
D2 X VB DX
D3 VA Y DX
D4 Y VB DX
R1 VB 0 1k
D5 R1N R1P DX
D6 R1Q R1P DX
D7 R1P R1N DX
D8 R1P R1Q DX
D9 L Q DX
D10 L Q DX
D11 Q2 Q DX
D12 Q2 Q DX
D13 L S1 DX
D14 S1 S2 DX
D15 S2 S3 DX
D16 S3 N DX
.model DX D(BV=1000)
.end
)");
  d.run();
  EXPECT_TRUE(d.blocks("bridge-rectifier").empty()) << d.rendered();
}

TEST(BridgeRecogniser, ModuleWithNamedPins) {
  parser::Netlist nl;
  const auto net = [&](const char* n) { return nl.intern_net(n); };
  parser::Part v;
  v.ref = "V1";
  v.kind = parser::PartKind::vsource;
  v.nets = {net("L"), net("N")};
  v.source = parser::SourceSpec{};
  v.source->waveform = parser::Waveform{"sin", {0, 325, 50}, {}};
  nl.add_part(v);
  parser::Part br;
  br.ref = "BR1";
  br.kind = parser::PartKind::other;
  br.type_name = "bridge";
  br.nets = {net("P"), net("L"), net("M"), net("N")};
  br.pin_names = {"+", "ac1", "-", "ac2"};
  nl.add_part(br);
  parser::Part c;
  c.ref = "C1";
  c.kind = parser::PartKind::capacitor;
  c.nets = {net("P"), net("M")};
  c.value = 100e-6;
  nl.add_part(c);
  parser::DiagnosticSink diags;
  const RecognitionResult r = recognise(nl, {}, nullptr, diags);
  ASSERT_FALSE(diags.has_errors());
  ASSERT_EQ(r.blocks.size(), 1u);
  EXPECT_EQ(r.blocks[0].kind, "bridge-rectifier");
  EXPECT_EQ(r.blocks[0].variant, "module");
  EXPECT_EQ(r.blocks[0].roles.at("bridge"), (std::vector<std::size_t>{1}));
  EXPECT_EQ(r.blocks[0].roles.at("reservoir"), (std::vector<std::size_t>{2}));
  EXPECT_EQ(r.blocks[0].outputs[0].net, *nl.find_net("P"));
  EXPECT_EQ(r.blocks[0].outputs[0].ret, *nl.find_net("M"));
}

}  // namespace
}  // namespace mainscheck::analysis
