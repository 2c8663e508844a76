#include "analysis/recognisers/transformer.hpp"

#include <cmath>

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

TEST(IsolationTransformer, BenchSupplyTappedPrimaryCentreTappedSecondary) {
  auto d = recognise_example("bench-supply-transformer.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("isolation-transformer");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "tapped-primary-centre-tapped");
  EXPECT_EQ(d->refs(b, "primary"), (Refs{"LP1", "LP2"}));
  EXPECT_EQ(d->refs(b, "secondary"), (Refs{"LS1", "LS2"}));
  EXPECT_EQ(d->refs(b, "tap_selector"), (Refs{"XSEL115", "XSEL230"}));
  EXPECT_EQ(d->refs(b, "coupling").size(), 6u);
  ASSERT_EQ(b.outputs.size(), 1u);
  const auto& o = b.outputs[0];
  EXPECT_TRUE(o.ac);
  ASSERT_TRUE(o.centre_tap);
  EXPECT_EQ(d->net(*o.centre_tap), "ct");
  // The selectors' stated positions (XSEL230 closed, XSEL115 open) put both 1 H sections in circuit:
  // V2/V1 = k·(√0.017+√0.017)/(√1+√1).
  ASSERT_TRUE(o.v_ratio);
  EXPECT_NEAR(*o.v_ratio, 0.998 * std::sqrt(0.017), 1e-9);
  EXPECT_DOUBLE_EQ(b.figures.at("primary_taps"), 1);
  EXPECT_DOUBLE_EQ(b.figures.at("tap_position_stated"), 1);
  // ngspice-39 on this deck with the 230 V tap selected: 29.95 V r.m.s. across SA–SB, i.e.
  // 230·0.998·2·√0.017/2 = 29.93 V, within 0.1 % of the turns-law value used above.
  EXPECT_NEAR(230.0 * *o.v_ratio, 29.953, 0.05);
  // The two load resistors on the centre-tapped winding are not a divider.
  EXPECT_TRUE(d->of_kind("resistive-divider").empty());
}

TEST(IsolationTransformer, UnstatedSelectorTakesTheWorstTap) {
  // The same tapped primary with S elements for selectors: no stated position, so the ratio is the
  // worst case (the 115 V tap, one 1 H section: the highest secondary voltage).
  auto d = recognise_deck(R"(tapped primary, selectors drawn as switches
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
VC C 0 DC 5
S1 L P230 C 0 SWM
S2 L P115 C 0 SWM
LP1 N P115 1
LP2 P115 P230 1
LS SA SB 0.017
K1 LP1 LP2 0.998
K2 LP1 LS 0.998
K3 LP2 LS 0.998
RL SA SB 100
.model SWM SW(VT=2.5 RON=0.1 ROFF=1e9)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("isolation-transformer");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  ASSERT_EQ(b.outputs.size(), 1u);
  ASSERT_TRUE(b.outputs[0].v_ratio);
  EXPECT_NEAR(*b.outputs[0].v_ratio, 0.998 * std::sqrt(0.017), 1e-9);
  EXPECT_DOUBLE_EQ(b.figures.at("tap_position_stated"), 0);
}

// Two 115 V primaries joined by a series/parallel selector of three switches (a drawing style of
// dual-voltage transformers): the windings are one primary through the switches.
std::string split_primary_deck(const std::string& series_state, const std::string& parallel_state) {
  std::string deck = R"(split primary with a series/parallel selector
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
VC C 0 DC 5
LP1 L X1 1
LP2 Y1 N 1
LS SA SB 0.0109
K1 LP1 LP2 0.998
K2 LP1 LS 0.998
K3 LP2 LS 0.998
)";
  auto annotate = [](const std::string& ref, const std::string& state) {
    return state.empty() ? std::string() : "*@part " + ref + " state=" + state + "\n";
  };
  deck += annotate("SSER", series_state) + "SSER X1 Y1 C 0 SWM\n";
  deck += annotate("SPA", parallel_state) + "SPA L Y1 C 0 SWM\n";
  deck += annotate("SPB", parallel_state) + "SPB X1 N C 0 SWM\n";
  deck += "RL SA SB 100\n.model SWM SW(VT=2.5 RON=0.1 ROFF=1e9)\n.end\n";
  return deck;
}

TEST(IsolationTransformer, SeriesParallelSelectorJoinsSplitPrimaries) {
  // Turns law with coupled inductors: N ∝ √L, so two 1 H sections in series are 2 turns-units
  // against √0.0109 on the secondary (Sedra & Smith, coupled inductors as an ideal transformer).
  const double n_sec = std::sqrt(0.0109);
  auto series = recognise_deck(split_primary_deck("closed", "open"));
  ASSERT_FALSE(series->has_errors()) << series->errors();
  auto blocks = series->of_kind("isolation-transformer");
  ASSERT_EQ(blocks.size(), 1u);
  ASSERT_TRUE(blocks[0]->outputs.at(0).v_ratio);
  EXPECT_NEAR(*blocks[0]->outputs[0].v_ratio, 0.998 * n_sec / 2.0, 1e-9);
  EXPECT_DOUBLE_EQ(blocks[0]->figures.at("tap_position_stated"), 1);
  EXPECT_EQ(series->refs(*blocks[0], "tap_selector"), (std::vector<std::string>{"SPA", "SPB", "SSER"}));

  auto parallel = recognise_deck(split_primary_deck("open", "closed"));
  blocks = parallel->of_kind("isolation-transformer");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_NEAR(*blocks[0]->outputs.at(0).v_ratio, 0.998 * n_sec / 1.0, 1e-9);

  // Unstated: the worst case is the parallel position (one section across the mains), never the
  // zero-turn loop all three closed switches would make.
  auto unstated = recognise_deck(split_primary_deck("", ""));
  blocks = unstated->of_kind("isolation-transformer");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_NEAR(*blocks[0]->outputs.at(0).v_ratio, 0.998 * n_sec / 1.0, 1e-9);
  EXPECT_DOUBLE_EQ(blocks[0]->figures.at("tap_position_stated"), 0);
}

TEST(IsolationTransformer, SecondaryBecomesTheSupplyOfADoubler) {
  auto d = recognise_deck(R"(transformer feeding a symmetric doubler
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
LP L N 4
LS A B 40m
K1 LP LS 0.99
D1 A P DR
D2 Q A DR
C1 P B 1000u
C2 B Q 1000u
RL P Q 100
RG B 0 1MEG
.model DR D(IS=5n)
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto tx = d->of_kind("isolation-transformer");
  ASSERT_EQ(tx.size(), 1u);
  EXPECT_EQ(tx[0]->variant, "single-secondary");
  ASSERT_TRUE(tx[0]->outputs[0].v_ratio);
  EXPECT_NEAR(*tx[0]->outputs[0].v_ratio, 0.99 * std::sqrt(0.04 / 4.0), 1e-12);
  const auto dbl = d->of_kind("voltage-doubler");
  ASSERT_EQ(dbl.size(), 1u);
  ASSERT_TRUE(dbl[0]->fed_by);
  const auto& src = d->result.ac_sources.at(*dbl[0]->fed_by);
  EXPECT_EQ(src.origin, tx[0]->id);
}

TEST(IsolationTransformer, TwoSecondariesInSubcircuit) {
  auto d = recognise_deck(R"(two isolated secondaries inside a transformer subcircuit
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
XT L N S1A S1B S2A S2B XFMR
R1 S1A S1B 100
R2 S2A S2B 100
.subckt XFMR p1 p2 a1 b1 a2 b2
LP p1 p2 1
LA a1 b1 10m
LB a2 b2 40m
KA LP LA 0.99
KB LP LB 0.99
KC LA LB 0.99
.ends
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("isolation-transformer");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "multi-winding");
  EXPECT_EQ(blocks[0]->outputs.size(), 2u);
  EXPECT_EQ(d->refs(*blocks[0], "primary"), (Refs{"XT.LP"}));
  EXPECT_DOUBLE_EQ(blocks[0]->figures.at("secondaries"), 2);
}

TEST(IsolationTransformer, CommonModeChokeIsNotATransformer) {
  auto d = recognise_deck(R"(common-mode choke in the mains leads
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
L1 L L2 10m
L2 N N2 10m
K1 L1 L2 0.99
RLOAD L2 N2 1k
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("isolation-transformer").empty());
  EXPECT_TRUE(d->of_kind("autotransformer").empty());
}

}  // namespace
}  // namespace mainscheck::testing
