// series-string (rules/safety/series_string.cpp): element voltages of a series string and the single fault.
// Check values: resistive divider V_i = V·R_i/ΣR (textbook); high line 253 V = 230 V + 10 % (IEC 60038, S40).
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <optional>

#include "rules/safety/led_string.hpp"

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

std::string deck(const std::string& lamp_attrs) {
  std::string s = "series string test\n*@supply mains=230V+-10%/50Hz line=L neutral=N\nV1 L N SIN(0 325 50)\n";
  const char* nets[] = {"L", "A", "B", "C", "N"};
  for (int i = 0; i < 4; ++i) {
    const std::string ref = "RLA" + std::to_string(i + 1);
    s += "*@part " + ref + " type=lamp " + lamp_attrs + "\n" + ref + " " + nets[i] + " " + nets[i + 1] + " 240\n";
  }
  return s + ".end\n";
}


TEST(SeriesString, NoteWithNormalAndSingleFaultVoltages) {
  // Four equal 240 Ω lamps: 253 / 4 = 63.25 V each (printed to three digits); one shorted: 253 / 3 = 84.3 V on the other three.
  RuleBench b(deck(""));
  const Finding f = only(b.run("series-string"));
  EXPECT_EQ(f.severity, Severity::note);
  EXPECT_NE(f.message.find("63.3 V each; one element shorted: 84.3 V on each of the other 3"), std::string::npos)
      << f.message << b.rendered();
}

TEST(SeriesString, SingleFaultJustInsideAndJustOutside) {
  RuleBench inside(deck("v_rated=84.34"));
  EXPECT_TRUE(of_severity(inside.run("series-string"), Severity::warning).empty());
  RuleBench outside(deck("v_rated=84.33"));
  const auto w = of_severity(outside.run("series-string"), Severity::warning);
  ASSERT_EQ(w.size(), 4u);
  EXPECT_NEAR(w[0].measurement->value, 253.0 / 3.0, 1e-9);
  EXPECT_NEAR(w[0].measurement->limit, 84.33, 1e-9);
}

TEST(SeriesString, NormalOperationAboveTheRatingIsAnError) {
  RuleBench b(deck("v_rated=60"));
  const auto e = of_severity(b.run("series-string"), Severity::error);
  ASSERT_EQ(e.size(), 4u);
  EXPECT_NEAR(e[0].measurement->value, 253.0 / 4.0, 1e-9);
}

TEST(SeriesString, PowerWithOneElementShorted) {
  // One shorted: (253/3)² / 240 = 29.6 W against a 25 W rating.
  RuleBench b(deck("p_rated=25"));
  const auto w = of_severity(b.run("series-string"), Severity::warning);
  ASSERT_EQ(w.size(), 4u);
  EXPECT_NEAR(w[0].measurement->value, (253.0 / 3.0) * (253.0 / 3.0) / 240.0, 1e-9);
}

TEST(SeriesString, NotApplicableWithoutAString) {
  RuleBench b("single heater\n*@supply mains=230V+-10%/50Hz line=L neutral=N\nV1 L N SIN(0 325 50)\n"
              "*@part RH type=heater p_rated=2000\nRH L N 26.5\n.end\n");
  EXPECT_TRUE(b.run("series-string").empty());
}

/// Sets a computed d.c. output on the first block of `kind` (converged).
void set_output(RuleBench& b, const std::string& kind, const std::string& net, const std::string& ret, double v_dc) {
  std::size_t idx = b.rec.blocks.size();
  for (std::size_t i = 0; i < b.rec.blocks.size() && idx == b.rec.blocks.size(); ++i)
    if (b.rec.blocks[i].kind == kind) idx = i;
  ASSERT_LT(idx, b.rec.blocks.size()) << b.rendered();
  auto id = [&](const std::string& name) {
    for (std::size_t n = 0; n < b.rec.devices.nets().size(); ++n)
      if (b.rec.devices.nets()[n].name == name) return static_cast<parser::NetId>(n);
    ADD_FAILURE() << "no net " << name;
    return parser::kGroundNet;
  };
  for (auto& bs : b.stress.blocks)
    if (bs.block == idx) {
      bs.outputs.push_back({id(net), id(ret), analysis::StressValue{v_dc, "high-line", "solver", {}}, std::nullopt, std::nullopt,
                           std::nullopt, std::nullopt});
      return;
    }
  analysis::BlockStress bs;
  bs.block = idx;
  bs.converged = true;
  bs.outputs.push_back({id(net), id(ret), analysis::StressValue{v_dc, "high-line", "solver", {}}, std::nullopt, std::nullopt,
                           std::nullopt, std::nullopt});
  b.stress.blocks.push_back(bs);
}

/// Transformer (ratio 0.998·√(17 mH / 4 H) = 0.0651, docs/blocks.md), bridge, reservoir C1, load RLD, series resistor R1
/// and four LEDs of 2.0 V and 20 mA (v_forward, i_rated) from P to M.
std::string led_bridge_deck(const std::string& r1, const std::string& c1_attrs) {
  std::string s = "LED string behind a bridge\n"
                  "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
                  "V1 L N SIN(0 325.27 50)\n"
                  "*@part RF1 type=fuse i_rated=0.5\n"
                  "RF1 L LF 0.2\nLP1 LF N 4\nLS1 SA SB 17m\nK1 LP1 LS1 0.998\n"
                  "D1 SA P DR\nD2 SB P DR\nD3 M SA DR\nD4 M SB DR\n"
                  "*@part C1 " + c1_attrs + "\nC1 P M 470u\n"
                  "RLD P M 1k\n"  // a load straight across the output: parallel to the string, not its series resistor
                  "*@part R1 p_rated=0.25\nR1 P LA " + r1 + "\n";
  const char* nets[] = {"LA", "LB", "LC", "LD", "M"};
  for (int i = 0; i < 4; ++i) {
    const std::string ref = "DLED" + std::to_string(i + 1);  // a D element: SPICE reads L... as an inductor
    s += "*@part " + ref + " type=led v_forward=2.0 i_rated=20m\n" + ref + " " + nets[i] + " " + nets[i + 1] + " DL\n";
  }
  return s + ".model DR D(IS=5n RS=0.03 N=1.8 BV=1000)\n.model DL D(IS=1e-20 N=1.8)\n.end\n";
}

void set_led_current(RuleBench& b, double i_A) {
  for (const char* ref : {"DLED1", "DLED2", "DLED3", "DLED4"}) b.set(ref, analysis::Quantity::i_rms, i_A);
}

TEST(SeriesString, LedChainsAreFoundAnodeToCathode) {
  RuleBench b(led_bridge_deck("400", "v_rated=25"));
  CheckInput in{b.nl, b.rec, b.stress, &b.plan, &b.sm};
  const auto chains = led_chains(in);
  ASSERT_EQ(chains.size(), 1u) << b.rendered();
  ASSERT_EQ(chains[0].size(), 4u);
  EXPECT_EQ(b.rec.devices.parts[chains[0].front()].ref, "DLED1");
  EXPECT_EQ(b.rec.devices.parts[chains[0].back()].ref, "DLED4");
}

TEST(SeriesString, LedForwardVoltageFromTheModel) {
  // Shockley: V = N·Vt·ln(I/IS + 1), Vt = kT/q = 25.852 mV at 300 K (textbook); IS = 1e-20 A, N = 1.8, 20 mA:
  // 1.8 × 0.025852 × ln(2e18) = 1.9609 V.
  RuleBench b("LED model test\n*@supply mains=230V/50Hz line=L neutral=N\nV1 L N SIN(0 325 50)\n"
              "*@part DLED1 type=led\nDLED1 L A DL\nR1 A N 10k\n.model DL D(IS=1e-20 N=1.8)\n.end\n");
  CheckInput in{b.nl, b.rec, b.stress, &b.plan, &b.sm};
  const auto v = led_forward_voltage_V(in, b.part("DLED1"), 0.02);
  ASSERT_TRUE(v.has_value());
  EXPECT_NEAR(*v, 1.8 * 0.025852 * std::log(0.02 / 1e-20 + 1), 1e-12);
  EXPECT_NEAR(*v, 1.9609, 1e-4);
}

TEST(SeriesString, LedShortJustInsideAndJustOutsideTheRating) {
  // 15 V feed, four 2.0 V LEDs: one shorted gives (15 − 3 × 2) / R (Ohm's law); 460 Ω → 19.6 mA within 20 mA,
  // 440 Ω → 20.5 mA above it.
  RuleBench inside(led_bridge_deck("460", "v_rated=25"));
  set_led_current(inside, (15.0 - 8.0) / 460);
  set_output(inside, "bridge-rectifier", "P", "M", 15.0);
  const auto fi = inside.run("series-string");
  const std::optional<Finding> si = with_subject(fi, "DLED1 LED short");
  ASSERT_TRUE(si.has_value()) << inside.rendered();
  EXPECT_EQ(si->severity, Severity::note) << si->message;
  RuleBench outside(led_bridge_deck("440", "v_rated=25"));
  set_led_current(outside, (15.0 - 8.0) / 440);
  set_output(outside, "bridge-rectifier", "P", "M", 15.0);
  const std::optional<Finding> so = with_subject(outside.run("series-string"), "DLED1 LED short");
  ASSERT_TRUE(so.has_value());
  EXPECT_EQ(so->severity, Severity::warning) << so->message;
  EXPECT_NEAR(so->measurement->value, 9.0 / 440, 1e-12);
  EXPECT_NE(so->message.find("and R1 dissipates"), std::string::npos) << so->message;
  EXPECT_NEAR(so->measurement->limit, 0.020, 1e-12);
}

TEST(SeriesString, LedCurrentAboveItsRatingInNormalOperation) {
  RuleBench b(led_bridge_deck("300", "v_rated=25"));
  set_led_current(b, 0.0233);
  set_output(b, "bridge-rectifier", "P", "M", 15.0);
  const std::optional<Finding> f = with_subject(b.run("series-string"), "DLED1 LED rating");
  ASSERT_TRUE(f.has_value());
  EXPECT_EQ(f->severity, Severity::error);
  EXPECT_NE(f->message.find("above the 20 mA rating"), std::string::npos) << f->message;
}

TEST(SeriesString, LedStringOpenChargesTheReservoirToThePeak) {
  // Open string: C1 rises to the no-load peak 253 V × √2 × 0.998 × √(17 mH / 4 H) = 23.3 V (rectifier with a
  // reservoir, textbook, diode drops neglected): within 25 V, above 16 V.
  const double v_oc = 253.0 * std::sqrt(2.0) * 0.998 * std::sqrt(0.017 / 4);
  RuleBench ok(led_bridge_deck("400", "v_rated=25"));
  set_led_current(ok, 0.0175);
  set_output(ok, "bridge-rectifier", "P", "M", 15.0);
  const std::optional<Finding> fo = with_subject(ok.run("series-string"), "DLED1 LED open");
  ASSERT_TRUE(fo.has_value());
  EXPECT_EQ(fo->severity, Severity::note) << fo->message;
  RuleBench low(led_bridge_deck("400", "v_rated=16"));
  set_led_current(low, 0.0175);
  set_output(low, "bridge-rectifier", "P", "M", 15.0);
  const std::optional<Finding> fl = with_subject(low.run("series-string"), "DLED1 LED open");
  ASSERT_TRUE(fl.has_value());
  EXPECT_EQ(fl->severity, Severity::warning) << fl->message;
  EXPECT_NEAR(fl->measurement->value, v_oc, 1e-6);
}

/// Capacitive dropper (after examples/timer-capacitive-dropper.cir) with a 12 V zener DZ1 of `pz` rating and a
/// string of two LEDs through R3 from the output VZ.
std::string led_dropper_deck(const std::string& pz) {
  return "LED string on a dropper\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RS1 type=fusible-resistor p_rated=1\nRS1 L LS 100\n"
         "*@part C1 class=X2\nC1 LS A 470n\n"
         "D2 N A DR\nD1 A VZ DR\n"
         "*@part DZ1 type=zener v_zener=12 p_rated=" + pz + "\nDZ1 N VZ DZ12\nC2 VZ N 470u\n"
         "R3 VZ LA 330\n"
         "*@part DLED1 type=led v_forward=2 i_rated=30m\nDLED1 LA LB DL\n"
         "*@part DLED2 type=led v_forward=2 i_rated=30m\nDLED2 LB N DL\n"
         ".model DR D(IS=5n RS=0.03 N=1.8 BV=1000)\n.model DZ12 D(IS=1e-14 RS=5 BV=12)\n"
         ".model DL D(IS=1e-20 N=1.8)\n.end\n";
}

TEST(SeriesString, LedStringOnADropperIsCurrentFed) {
  // Open string: the zener takes the whole 25 mA: P = 12 V × 25 mA = 0.3 W (P = V·I) against 0.25 W / 0.5 W.
  RuleBench small(led_dropper_deck("0.25"));
  small.set("DLED1", analysis::Quantity::i_rms, 0.025);
  small.set("DLED2", analysis::Quantity::i_rms, 0.025);
  const auto fs = small.run("series-string");
  const std::optional<Finding> sh = with_subject(fs, "DLED1 LED short");
  ASSERT_TRUE(sh.has_value()) << small.rendered();
  EXPECT_NE(sh->message.find("series capacitor keeps the current"), std::string::npos) << sh->message;
  const std::optional<Finding> op = with_subject(fs, "DLED1 LED open");
  ASSERT_TRUE(op.has_value());
  EXPECT_EQ(op->severity, Severity::warning) << op->message;
  EXPECT_NEAR(op->measurement->value, 0.3, 1e-12);
  RuleBench big(led_dropper_deck("0.5"));
  big.set("DLED1", analysis::Quantity::i_rms, 0.025);
  big.set("DLED2", analysis::Quantity::i_rms, 0.025);
  const std::optional<Finding> op2 = with_subject(big.run("series-string"), "DLED1 LED open");
  ASSERT_TRUE(op2.has_value());
  EXPECT_EQ(op2->severity, Severity::note);
}

TEST(SeriesString, LedStringWithoutComputedCurrentIsNotAPass) {
  RuleBench b(led_dropper_deck("0.5"));
  const auto ws = of_severity(b.run("series-string"), Severity::warning);
  ASSERT_EQ(ws.size(), 1u);
  EXPECT_NE(ws[0].message.find("current not computed"), std::string::npos) << ws[0].message;
}

}  // namespace
}  // namespace mainscheck::rules::testing
