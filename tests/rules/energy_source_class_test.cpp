// energy-source-class (rules/safety/energy_source_class.cpp, rules/safety/energy_source_tables.cpp): IEC 62368-1
// table 4 steady-state limits as transcribed in ../shared/reference/safety-data.md 2.3 (source S3; the ES2 a.c.
// current 5 mA r.m.s. is from memory there, and so is the ES2 form of the combined a.c. + d.c. rule).
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

#include "rule_test_support.hpp"
#include "rules/safety/energy_source_tables.hpp"

namespace mainscheck::rules::testing {
namespace {

using safety::EnergyClass;

TEST(EnergySourceTables, DcVoltageRowsOfTable4) {
  // Table 4 d.c.: ES1 60 V, ES2 120 V ([C: S3]).
  EXPECT_EQ(safety::classify_voltage(60.0, 0, 50), EnergyClass::es1);
  EXPECT_EQ(safety::classify_voltage(60.1, 0, 50), EnergyClass::es2);
  EXPECT_EQ(safety::classify_voltage(120.0, 0, 50), EnergyClass::es2);
  EXPECT_EQ(safety::classify_voltage(120.1, 0, 50), EnergyClass::es3);
}

TEST(EnergySourceTables, AcVoltageRowsOfTable4) {
  // Table 4 a.c. up to 1 kHz: ES1 30 V r.m.s., ES2 50 V r.m.s. ([C: S3]).
  EXPECT_EQ(safety::classify_voltage(0, 30.0, 50), EnergyClass::es1);
  EXPECT_EQ(safety::classify_voltage(0, 30.1, 60), EnergyClass::es2);
  EXPECT_EQ(safety::classify_voltage(0, 50.0, 50), EnergyClass::es2);
  EXPECT_EQ(safety::classify_voltage(0, 50.1, 50), EnergyClass::es3);
  // 1-100 kHz: ES1 30 V + 0.4 f, ES2 50 V + 0.9 f, f in kHz ([C: S3]); at 10 kHz 34 V and 59 V.
  EXPECT_DOUBLE_EQ(safety::es_voltage_limits_ac(10e3).es1, 34.0);
  EXPECT_DOUBLE_EQ(safety::es_voltage_limits_ac(10e3).es2, 59.0);
  // Above 100 kHz: 70 V and 140 V r.m.s. ([C: S3]); the 1-100 kHz formulas meet them at 100 kHz.
  EXPECT_DOUBLE_EQ(safety::es_voltage_limits_ac(100e3).es1, 70.0);
  EXPECT_DOUBLE_EQ(safety::es_voltage_limits_ac(100e3).es2, 140.0);
  EXPECT_DOUBLE_EQ(safety::es_voltage_limits_ac(250e3).es1, 70.0);
  EXPECT_DOUBLE_EQ(safety::es_voltage_limits_ac(250e3).es2, 140.0);
}

TEST(EnergySourceTables, CurrentRowsOfTable4) {
  // d.c. 2 mA / 25 mA ([C: S3]); a.c. up to 1 kHz 0.5 mA ([C: S3]) / 5 mA (from memory, S3's OCR shows 0.5).
  EXPECT_DOUBLE_EQ(safety::es_current_limits_dc().es1, 2e-3);
  EXPECT_DOUBLE_EQ(safety::es_current_limits_dc().es2, 25e-3);
  EXPECT_DOUBLE_EQ(safety::es_current_limits_ac(50).es1, 0.5e-3);
  EXPECT_DOUBLE_EQ(safety::es_current_limits_ac(50).es2, 5e-3);
  // 1-100 kHz: 0.5 mA × f and 5 mA + 0.95 f; 10 kHz: 5 mA and 14.5 mA; above 100 kHz 50 / 100 mA ([C: S3]).
  EXPECT_NEAR(safety::es_current_limits_ac(10e3).es1, 5e-3, 1e-15);
  EXPECT_NEAR(safety::es_current_limits_ac(10e3).es2, 14.5e-3, 1e-15);
  EXPECT_NEAR(safety::es_current_limits_ac(100e3).es1, 50e-3, 1e-15);
  EXPECT_NEAR(safety::es_current_limits_ac(100e3).es2, 100e-3, 1e-15);
  EXPECT_EQ(safety::classify_current(0, 0.5e-3, 50), EnergyClass::es1);
  EXPECT_EQ(safety::classify_current(0, 0.51e-3, 50), EnergyClass::es2);
  EXPECT_EQ(safety::classify_current(2e-3, 0, 50), EnergyClass::es1);
}

TEST(EnergySourceTables, CombinedAcAndDcRule) {
  // Table 4: U_dc/60 + U_ac/30 <= 1 for ES1 ([C: S3]): 30 V d.c. + 15 V a.c. sits on the limit.
  EXPECT_EQ(safety::classify_voltage(30.0, 15.0, 50), EnergyClass::es1);
  EXPECT_EQ(safety::classify_voltage(30.5, 15.0, 50), EnergyClass::es2);
  // The ES2 form U_dc/120 + U_ac/50 <= 1 (from memory): 60 V + 25 V on the limit.
  EXPECT_EQ(safety::classify_voltage(60.0, 25.0, 50), EnergyClass::es2);
  EXPECT_EQ(safety::classify_voltage(60.5, 25.0, 50), EnergyClass::es3);
  // Either voltage or current within ES1 makes the source ES1 (table 4 note, [C: S3]).
  EXPECT_EQ(safety::lower_class(EnergyClass::es3, EnergyClass::es1), EnergyClass::es1);
}

/// Transformer supply after examples/bench-supply-transformer.cir with secondary inductance `ls` (turns ratio
/// k·√(Ls/Lp), docs/blocks.md); SA is marked SELV; the 1 GΩ / 1 MΩ resistors to ground are simulator references.
std::string transformer_deck(const std::string& ls, const std::string& extra = "") {
  return transformer_supply_deck("energy class test", "*@net SA selv=yes\n" + extra, ls, "100");
}


TEST(EnergySourceClass, AcSecondaryJustInsideAndJustOutsideEs1) {
  // 253 V × 0.998 × √(56 mH / 4 H) = 29.88 V r.m.s. → ES1; 57 mH gives 30.14 V → ES2 (table 4, 30 V r.m.s.).
  RuleBench inside(transformer_deck("56m"));
  const Finding in = only(inside.run("energy-source-class"));
  EXPECT_EQ(in.severity, Severity::note) << in.message;
  EXPECT_NEAR(in.measurement->value, 253.0 * 0.998 * std::sqrt(0.056 / 4), 1e-6);
  EXPECT_NE(in.message.find("isolated from the mains: ES1"), std::string::npos) << in.message;
  RuleBench outside(transformer_deck("57m"));
  const Finding out = only(outside.run("energy-source-class"));
  EXPECT_EQ(out.severity, Severity::error);
  EXPECT_NEAR(out.measurement->value, 253.0 * 0.998 * std::sqrt(0.057 / 4), 1e-6);
  EXPECT_NE(out.message.find("ES2"), std::string::npos) << out.message;
  // Where only instructed persons reach it, ES2 is allowed.
  outside.option("energy-source-class.accessible-class", "ES2");
  EXPECT_EQ(only(outside.run("energy-source-class")).severity, Severity::note);
}

TEST(EnergySourceClass, YCapacitorCurrentTowardsEarth) {
  // I = 2πfCV (safety-data.md 2.6): 1 nF at 253 V 50 Hz = 79.5 µA, within ES1's 0.5 mA; 10 nF = 0.795 mA → ES2.
  RuleBench small(transformer_deck("17m", "*@part CY1 class=Y1\nCY1 LF SB 1n\n"));
  const Finding s = only(small.run("energy-source-class"));
  EXPECT_EQ(s.severity, Severity::note) << s.message;
  bool noted = false;
  for (const auto& n : s.notes) noted = noted || n.message.find("79.5 µA through CY1") != std::string::npos;
  EXPECT_TRUE(noted);
  RuleBench large(transformer_deck("17m", "*@part CY1 class=Y1\nCY1 LF SB 10n\n"));
  EXPECT_EQ(only(large.run("energy-source-class")).severity, Severity::error);
}

TEST(EnergySourceClass, DropperOutputIsAtMainsPotential) {
  RuleBench b("dropper energy class test\n"
              "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
              "V1 L N SIN(0 325.27 50)\n"
              "*@part RS1 type=fusible-resistor p_rated=1\n"
              "RS1 L LS 100\n"
              "*@part C1 class=X2\n"
              "C1 LS A 470n\n"
              "D2 N A DR\nD1 A VZ DR\n"
              "*@part DZ1 type=zener v_zener=12\n"
              "DZ1 N VZ DZ12\nC2 VZ N 470u\nRL VZ N 1k\n"
              "*@net VZ access=user\n"
              ".model DR D(IS=5n RS=0.03 N=1.8 BV=1000)\n.model DZ12 D(IS=1e-14 RS=5 BV=12)\n.end\n");
  // Whatever the 12 V output, the circuit is joined to the mains: 253 V r.m.s. > the a.c. ES2 limit of 50 V.
  const Finding f = only(of_severity(b.run("energy-source-class"), Severity::error));
  EXPECT_NE(f.message.find("is joined to the mains: ES3"), std::string::npos) << f.message;
  EXPECT_NEAR(f.measurement->limit, 50.0, 1e-12);
}

/// Sets a computed d.c. output on the first block of `kind`.
void set_output(RuleBench& b, const std::string& kind, const std::string& net, const std::string& ret, double v_dc,
                double ripple_pp) {
  std::size_t idx = b.rec.blocks.size();
  for (std::size_t i = 0; i < b.rec.blocks.size(); ++i)
    if (b.rec.blocks[i].kind == kind) idx = i;
  ASSERT_LT(idx, b.rec.blocks.size()) << b.rendered();
  auto id = [&](const std::string& name) {
    for (std::size_t n = 0; n < b.rec.devices.nets().size(); ++n)
      if (b.rec.devices.nets()[n].name == name) return static_cast<parser::NetId>(n);
    ADD_FAILURE() << "no net " << name;
    return parser::kGroundNet;
  };
  analysis::BlockStress bs;
  bs.block = idx;
  bs.converged = true;
  bs.outputs.push_back({id(net), id(ret), analysis::StressValue{v_dc, "high-line", "solver", {}},
                        analysis::StressValue{ripple_pp, "high-line", "solver", {}}, std::nullopt, std::nullopt,
                        std::nullopt});
  b.stress.blocks.push_back(bs);
}

std::string rectified_deck() {
  return transformer_deck("17m", "D1 SA P DR\nD2 SB P DR\nD3 M SA DR\nD4 M SB DR\nC1 P M 1000u\nRL P M 100\n"
                                 "*@net P selv=yes\n.model DR D(IS=5n RS=0.03 N=1.8 BV=1000)\n");
}

TEST(EnergySourceClass, DcOutputWithRippleByTheCombinedRule) {
  // Ripple 17.32 V p-p is 5 V r.m.s. for a triangle (Vpp / 2√3, textbook); 49.9 V / 60 + 5 / 30 < 1 → ES1,
  // 50.1 V → above 1 → ES2 (table 4 combined rule, [C: S3]).
  const double pp = 5.0 * 2 * std::sqrt(3.0);
  RuleBench inside(rectified_deck());
  set_output(inside, "bridge-rectifier", "P", "M", 49.9, pp);
  const auto fs = inside.run("energy-source-class");
  const auto it = std::find_if(fs.begin(), fs.end(), [](const Finding& f) { return f.message.find("net P") != std::string::npos; });
  ASSERT_NE(it, fs.end());
  EXPECT_EQ(it->severity, Severity::note) << it->message;
  RuleBench outside(rectified_deck());
  set_output(outside, "bridge-rectifier", "P", "M", 50.1, pp);
  const auto gs = outside.run("energy-source-class");
  const auto jt = std::find_if(gs.begin(), gs.end(), [](const Finding& f) { return f.message.find("net P") != std::string::npos; });
  ASSERT_NE(jt, gs.end());
  EXPECT_EQ(jt->severity, Severity::error) << jt->message;
}

TEST(EnergySourceClass, DualRailIsClassifiedRailToRail) {
  // ±51.8 V rails (after examples/amplifier-dual-rail.cir): each rail is ES1 (d.c. 60 V), but touching both
  // rails gives 103.6 V → ES2 (table 4 d.c. 120 V, [C: S3]).
  RuleBench b("dual rail energy class test\n"
              "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
              "V1 L N SIN(0 325.27 50)\n"
              "RF1 L LF 0.2 type=fuse i_rated=1\n"
              "LP LF N 4\nLS1 A 0 92.9m\nLS2 0 B 92.9m\nK12 LP LS1 0.998\nK13 LP LS2 0.998\nK23 LS1 LS2 0.998\n"
              "D1 A VP DBR\nD2 B VP DBR\nD3 VN A DBR\nD4 VN B DBR\n"
              "C1 VP 0 10000u\nC2 0 VN 10000u\nRLP VP 0 100\nRLN 0 VN 100\nRNREF N 0 1G\n"
              ".model DBR D(IS=10n RS=0.02 N=1.8 BV=200 IBV=10u)\n.end\n");
  std::size_t idx = b.rec.blocks.size();
  for (std::size_t i = 0; i < b.rec.blocks.size(); ++i)
    if (b.rec.blocks[i].kind == "dual-rail-rectifier") idx = i;
  ASSERT_LT(idx, b.rec.blocks.size()) << b.rendered();
  const auto& blk = b.rec.blocks[idx];
  ASSERT_GE(blk.outputs.size(), 2u);
  analysis::BlockStress bs;
  bs.block = idx;
  bs.converged = true;
  for (const auto& o : blk.outputs) {
    const bool positive = b.rec.devices.net(o.net).name == "VP";
    bs.outputs.push_back({o.net, o.ret, analysis::StressValue{positive ? 51.8 : -51.8, "high-line", "solver", {}},
                          analysis::StressValue{0.4, "high-line", "solver", {}}, std::nullopt, std::nullopt,
                          std::nullopt});
  }
  b.stress.blocks.push_back(bs);
  const auto fs = b.run("energy-source-class");
  const auto pair = std::find_if(fs.begin(), fs.end(),
                                 [](const Finding& f) { return f.message.find("between nets") != std::string::npos; });
  ASSERT_NE(pair, fs.end());
  EXPECT_NEAR(pair->measurement->value, 103.6, 1e-9);
  EXPECT_NE(pair->message.find(": ES2"), std::string::npos) << pair->message;
  const auto rail = std::find_if(fs.begin(), fs.end(),
                                 [](const Finding& f) { return f.message.find("(net VP)") != std::string::npos; });
  ASSERT_NE(rail, fs.end());
  EXPECT_NE(rail->message.find(": ES1"), std::string::npos) << rail->message;
}

// A transformer secondary whose only tie to the rest of the circuit is a 10 MΩ simulator reference
// to the mains neutral (a drawing habit: every node needs a d.c. path to node 0).
std::string referenced_secondary_deck(const std::string& primary_taps) {
  return "secondary referenced to the neutral\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "*@net SA selv=yes\n"
         "V1 L N SIN(0 325.27 50)\n"
         "RN N 0 1m\n"
         "*@part RF1 type=fuse i_rated=0.5\n"
         "RF1 L LF 0.2\n" +
         primary_taps +
         "LS1 SA SB 17m\n"
         "RLA SA SB 100\n"
         "RREF SB N 10meg\n"
         ".end\n";
}

TEST(EnergySourceClass, ReferenceResistorIsClassedByItsCurrent) {
  // IEC 62368-1 table 4: ES1 a.c. current 0.5 mA r.m.s. (from memory in safety-data.md); a person
  // touching SA closes 253 V / 10 MΩ = 25.3 µA through the reference: ES1, so the 16.5 V secondary
  // (253 V × 0.998 × √(17 mH / 4 H)) stays ES1 and its SELV mark holds.
  RuleBench b(referenced_secondary_deck("LP1 LF N 4\nK1 LP1 LS1 0.998\n"));
  const Finding f = only(b.run("energy-source-class"));
  EXPECT_EQ(f.severity, Severity::note) << f.message;
  EXPECT_NE(f.message.find("ES1"), std::string::npos) << f.message;
  bool noted = false;
  for (const auto& n : f.notes) noted = noted || n.message.find("through simulator reference RREF (10 MΩ): 25.3 µA") != std::string::npos;
  EXPECT_TRUE(noted) << f.message << (f.notes.empty() ? "" : "\n" + f.notes.back().message);
  EXPECT_TRUE(of_severity(b.run("isolation"), Severity::error).empty());
}

TEST(EnergySourceClass, WorstPrimaryTapIsStatedAsAnAssumption) {
  // Tapped primary with unstated selectors: the secondary is classed at the 115 V tap (the fewest
  // turns) and the finding says it assumed so; a stated position is used and named.
  const std::string taps = "LP1 N T115 1\nLP2 T115 T230 1\nK1 LP1 LP2 0.998\nK2 LP1 LS1 0.998\nK3 LP2 LS1 0.998\n"
                           "VC C 0 DC 5\n";
  auto selectors = [](const std::string& s230, const std::string& s115) {
    std::string out;
    if (!s230.empty()) out += "*@part S230 state=" + s230 + "\n";
    out += "S230 LF T230 C 0 SWM\n";
    if (!s115.empty()) out += "*@part S115 state=" + s115 + "\n";
    return out + "S115 LF T115 C 0 SWM\n.model SWM SW(VT=2.5 RON=0.1 ROFF=1e9)\n";
  };
  auto note_says = [](const Finding& f, const std::string& text) {
    return std::any_of(f.notes.begin(), f.notes.end(), [&](const auto& n) { return n.message.find(text) != std::string::npos; });
  };
  RuleBench worst(referenced_secondary_deck(taps + selectors("", "")));
  const Finding w = only(worst.run("energy-source-class"));
  EXPECT_NEAR(w.measurement->value, 253.0 * 0.998 * std::sqrt(0.017 / 1), 1e-6);
  EXPECT_TRUE(note_says(w, "worst primary tap assumed")) << w.message;
  RuleBench stated(referenced_secondary_deck(taps + selectors("closed", "open")));
  const Finding s = only(stated.run("energy-source-class"));
  EXPECT_NEAR(s.measurement->value, 253.0 * 0.998 * std::sqrt(0.017 / 4), 1e-6);
  EXPECT_TRUE(note_says(s, "stated positions")) << s.message;
}

TEST(EnergySourceClass, AccessibleNetWithoutComputedVoltageIsNotAPass) {
  RuleBench b(rectified_deck());  // no stress computed: the rectifier output P has no voltage
  const auto ws = of_severity(b.run("energy-source-class"), Severity::warning);
  ASSERT_EQ(ws.size(), 1u);
  EXPECT_NE(ws[0].message.find("net P is marked user-accessible"), std::string::npos) << ws[0].message;
}

TEST(EnergySourceClass, NotApplicableWithoutOutputsOrAccessibleNets) {
  RuleBench b(heater_only_deck());
  EXPECT_TRUE(b.run("energy-source-class").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
