#include "analysis/supply.hpp"

#include <cmath>

#include <gtest/gtest.h>

#include "analysis/recognition_support.hpp"

namespace mainscheck::analysis {
namespace {

using testing::Deck;

TEST(ParseMainsSpec, NominalOnly) {
  const auto p = parse_mains_spec("230V/50Hz");
  ASSERT_TRUE(p.spec) << p.error;
  EXPECT_EQ(p.spec->v_nominal_V, 230.0);
  EXPECT_FALSE(p.spec->v_min_V);
  EXPECT_EQ(p.spec->f_nominal_Hz, 50.0);
  EXPECT_TRUE(p.spec->usable());
}

TEST(ParseMainsSpec, RangesAndUnitsOptional) {
  const auto p = parse_mains_spec("85-264V/47-63Hz");
  ASSERT_TRUE(p.spec) << p.error;
  EXPECT_EQ(p.spec->v_min_V, 85.0);
  EXPECT_EQ(p.spec->v_max_V, 264.0);
  EXPECT_FALSE(p.spec->v_nominal_V);
  EXPECT_EQ(p.spec->f_min_Hz, 47.0);
  EXPECT_EQ(p.spec->f_max_Hz, 63.0);
  const auto bare = parse_mains_spec("120/60");
  ASSERT_TRUE(bare.spec) << bare.error;
  EXPECT_EQ(bare.spec->v_nominal_V, 120.0);
  EXPECT_EQ(bare.spec->f_nominal_Hz, 60.0);
  const auto mixed = parse_mains_spec("230v/50-60hz");
  ASSERT_TRUE(mixed.spec) << mixed.error;
  EXPECT_EQ(mixed.spec->f_max_Hz, 60.0);
}

TEST(ParseMainsSpec, Tolerances) {
  // IEC 60038: 230 V +-10 % gives 207-253 V (safety-data.md section 11).
  const auto sym = parse_mains_spec("230V+-10%/50Hz");
  ASSERT_TRUE(sym.spec) << sym.error;
  EXPECT_NEAR(*sym.spec->v_min_V, 207.0, 1e-9);
  EXPECT_NEAR(*sym.spec->v_max_V, 253.0, 1e-9);
  EXPECT_EQ(sym.spec->v_nominal_V, 230.0);
  const auto pm = parse_mains_spec("230V\xC2\xB1" "10%/50Hz");
  ASSERT_TRUE(pm.spec) << pm.error;
  EXPECT_NEAR(*pm.spec->v_max_V, 253.0, 1e-9);
  // +10 % / -14 %: the IEC 60038 utilisation range.
  const auto asym = parse_mains_spec("230V+10%-14%/50Hz");
  ASSERT_TRUE(asym.spec) << asym.error;
  EXPECT_NEAR(*asym.spec->v_min_V, 197.8, 1e-9);
  EXPECT_NEAR(*asym.spec->v_max_V, 253.0, 1e-9);
  const auto rev = parse_mains_spec("230V-14%+10%/50Hz");
  ASSERT_TRUE(rev.spec) << rev.error;
  EXPECT_NEAR(*rev.spec->v_min_V, 197.8, 1e-9);
  const auto same = parse_mains_spec("230V+10%-10%/50Hz");
  ASSERT_TRUE(same.spec) << same.error;
  EXPECT_NEAR(*same.spec->v_min_V, 207.0, 1e-9);
}

TEST(ParseMainsSpec, Errors) {
  EXPECT_EQ(parse_mains_spec("230V").error, "supply '230V' gives no frequency; write it like 230V/50Hz");
  EXPECT_EQ(parse_mains_spec("264-85V/50Hz").error, "voltage range 264-85 runs downwards");
  EXPECT_EQ(parse_mains_spec("85-264V+-10%/50Hz").error, "a voltage range takes no tolerance");
  EXPECT_EQ(parse_mains_spec("230V+-10/50Hz").error, "tolerance needs a '%' sign at '/50Hz'");
  EXPECT_EQ(parse_mains_spec("230V+10%/50Hz").error, "an asymmetric tolerance needs both sides, like +10%-15%");
  EXPECT_EQ(parse_mains_spec("230V/50Hz x").error, "unexpected text 'x' after the frequency");
  EXPECT_EQ(parse_mains_spec("V/50").error, "expected the voltage as a number at 'V/50'");
  EXPECT_EQ(parse_mains_spec("0V/50Hz").error, "supply '0V/50Hz' has a value that is not positive");
  EXPECT_FALSE(parse_mains_spec("230k/50").spec);  // no SPICE suffixes in supply text
}

TEST(ResolveSupply, SinSourceGivesNetsAndRms) {
  Deck d("kettle\nV1 LIVE NEU SIN(0 325.27 50)\nR1 LIVE NEU 26\n.end\n");
  const Supply s = resolve_supply(d.nl, {}, d.diags);
  ASSERT_TRUE(s.complete()) << d.rendered();
  EXPECT_EQ(d.nl.net(*s.line).name, "LIVE");
  EXPECT_EQ(d.nl.net(*s.neutral).name, "NEU");
  // RMS of a sinusoid = peak / sqrt(2): 325.27 / 1.41421 = 230.0 V.
  EXPECT_NEAR(*s.mains->v_nominal_V, 230.0, 0.01);
  EXPECT_EQ(s.mains->f_nominal_Hz, 50.0);
  EXPECT_EQ(s.mains_from.what, "source V1");
  EXPECT_EQ(s.source_part, 0u);
  EXPECT_FALSE(d.diags.has_errors());
}

TEST(ResolveSupply, CommandLineWinsOverSourceAndAnnotation) {
  Deck d("lamp\n*@supply line=A neutral=B mains=120V/60Hz\nV1 X Y SIN(0 325 50)\nR1 A B 1k\nR2 X Y 1k\n.end\n");
  SupplyOptions o;
  o.supply = "85-264V/47-63Hz";
  o.line = "X";
  const Supply s = resolve_supply(d.nl, o, d.diags);
  ASSERT_TRUE(s.complete()) << d.rendered();
  EXPECT_EQ(d.nl.net(*s.line).name, "X");          // command line
  EXPECT_EQ(d.nl.net(*s.neutral).name, "B");       // annotation
  EXPECT_EQ(s.mains->v_max_V, 264.0);              // command line
  EXPECT_EQ(s.mains_from.what, "command line");
  EXPECT_EQ(s.nets_from.what, "command line");
}

TEST(ResolveSupply, AnnotationSupply) {
  Deck d("dimmer\n*@supply line=L1 neutral=N1 earth=PE1 mains=230V+-10%/50Hz\nR1 L1 N1 1k\nC1 L1 PE1 2.2n\n.end\n");
  const Supply s = resolve_supply(d.nl, {}, d.diags);
  ASSERT_TRUE(s.complete()) << d.rendered();
  EXPECT_EQ(d.nl.net(*s.earth).name, "PE1");
  EXPECT_NEAR(*s.mains->v_max_V, 253.0, 1e-9);
  EXPECT_EQ(s.mains_from.what, "supply annotation");
}

TEST(ResolveSupply, NetNamesAreAFallbackWithANote) {
  Deck d("heater\nR1 L N 52.9\n.end\n");
  SupplyOptions o;
  o.supply = "230V/50Hz";
  const Supply s = resolve_supply(d.nl, o, d.diags);
  ASSERT_TRUE(s.complete()) << d.rendered();
  EXPECT_EQ(s.nets_from.what, "net name");
  bool noted = false;
  for (const auto& diag : d.diags.diagnostics())
    noted = noted || diag.message == "net L taken as line from its name";
  EXPECT_TRUE(noted) << d.rendered();
}

TEST(ResolveSupply, NothingIsAnError) {
  Deck d("anonymous\nR1 A B 1k\n.end\n");
  const Supply s = resolve_supply(d.nl, {}, d.diags);
  EXPECT_FALSE(s.complete());
  ASSERT_EQ(d.diags.error_count(), 2u) << d.rendered();
  EXPECT_EQ(d.diags.diagnostics()[0].message,
            "no mains line and neutral found: name it with --line/--neutral, a *@supply annotation or an XML "
            "<supply> element, or drive the deck from a SIN source");
}

TEST(ResolveSupply, TwoSinSourcesAreAmbiguous) {
  Deck d("two\nV1 A 0 SIN(0 325 50)\nV2 B 0 SIN(0 170 60)\n.end\n");
  resolve_supply(d.nl, {}, d.diags);
  ASSERT_TRUE(d.diags.has_errors());
  EXPECT_EQ(d.diags.diagnostics()[0].message,
            "several sinusoidal sources could be the mains (V1 and V2); state the supply with "
            "--supply/--line/--neutral or a *@supply annotation");
  EXPECT_EQ(d.diags.diagnostics()[0].notes.size(), 1u);
}

TEST(ResolveSupply, TwoLineNamesAreAmbiguous) {
  Deck d("two names\nR1 L N 1k\nR2 LINE N 1k\n.end\n");
  SupplyOptions o;
  o.supply = "230V/50Hz";
  const Supply s = resolve_supply(d.nl, o, d.diags);
  EXPECT_FALSE(s.line);
  EXPECT_TRUE(d.diags.has_errors()) << d.rendered();
}

TEST(ResolveSupply, UnknownNetOnCommandLine) {
  Deck d("x\nV1 L N SIN(0 325 50)\n.end\n");
  SupplyOptions o;
  o.earth = "PE";
  resolve_supply(d.nl, o, d.diags);
  ASSERT_TRUE(d.diags.has_errors());
  EXPECT_EQ(d.diags.diagnostics()[0].message, "--earth names net 'PE', which is not in the netlist");
}

}  // namespace
}  // namespace mainscheck::analysis
