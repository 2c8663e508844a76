// creepage-clearance (rules/safety/creepage_clearance.cpp): required distances per net pair and pad gaps
// that fall short. Check values from IEC 60664-1 tables F.1, F.2, F.5, F.8 as transcribed in
// ../shared/reference/safety-data.md section 1 (source S1).
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <optional>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;
constexpr double kMm = 1e-3;

std::string deck(const std::string& cx_attrs, const std::string& extra = "", const std::string& supply_extra = "") {
  return "creepage test\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N" + supply_extra + "\n"
         "V1 L N SIN(0 325.27 50)\n"
         "*@part RF1 type=fuse i_rated=10\n"
         "RF1 L LF 0.05\n"
         "*@part CX1 class=X2 " + cx_attrs + "\n"
         "CX1 LF N 100n\n"
         "*@part RH type=heater p_rated=2000\n"
         "RH LF N 26.5\n" + extra + ".end\n";
}

std::vector<Finding> of_severity(const std::vector<Finding>& fs, Severity s) {
  std::vector<Finding> out;
  std::copy_if(fs.begin(), fs.end(), std::back_inserter(out), [s](const Finding& f) { return f.severity == s; });
  return out;
}

std::string dump(const std::vector<Finding>& fs) {
  std::string s;
  for (const auto& f : fs) s += f.message + "\n";
  return s;
}

TEST(CreepageClearance, LineNeutralNoteAt230V) {
  // 230 V nominal → table F.1 300 V row, OVC II: 2500 V → table F.2 case A PD2: 1.5 mm. High line 253 V r.m.s.
  // → table F.5 other materials PD2 IIIa/b between 250 V (2.5 mm) and 320 V (3.2 mm): 2.53 mm.
  RuleBench b(deck(""));
  const auto fs = b.run("creepage-clearance");
  ASSERT_EQ(fs.size(), 1u) << b.rendered();
  const Finding& f = fs[0];
  EXPECT_EQ(f.severity, Severity::note);
  EXPECT_EQ(f.subject, "L/N");
  EXPECT_EQ(f.message,
            "nets L and N: 253 V RMS / 358 V peak working at high-line, functional: clearance >= 1.5 mm, "
            "creepage >= 2.53 mm (IEC 60664-1 tables F.1, F.2, F.5)");
}

TEST(CreepageClearance, PadGapJustInsideAndJustOutside) {
  const double creepage_mm = 2.5 + 0.7 * 3.0 / 70.0;  // 2.53 mm, table F.5 interpolated
  RuleBench inside(deck("pad_gap=2.531mm"));
  EXPECT_TRUE(of_severity(inside.run("creepage-clearance"), Severity::error).empty());
  RuleBench outside(deck("pad_gap=2.529mm"));
  const auto all = outside.run("creepage-clearance");
  ASSERT_EQ(of_severity(all, Severity::error).size(), 1u) << dump(all) << outside.rendered();
  const Finding f = only(of_severity(all, Severity::error));
  EXPECT_EQ(f.parts.front(), "CX1");
  EXPECT_EQ(f.measurement->quantity, "creepage");
  EXPECT_NEAR(f.measurement->value, 2.529 * kMm, 1e-12);
  EXPECT_NEAR(f.measurement->limit, creepage_mm * kMm, 1e-12);
}

TEST(CreepageClearance, PadGapBelowClearanceAndPinPitch) {
  RuleBench b(deck("pad_gap=1.4mm"));
  const Finding f = only(of_severity(b.run("creepage-clearance"), Severity::error));
  EXPECT_EQ(f.measurement->quantity, "clearance");  // below table F.2's 1.5 mm
  EXPECT_NEAR(f.measurement->limit, 1.5 * kMm, 1e-12);
  RuleBench pitch(deck("pin_pitch=2.54mm"));
  EXPECT_TRUE(of_severity(pitch.run("creepage-clearance"), Severity::error).empty());
  RuleBench narrow(deck("pin_pitch=2.5mm"));
  EXPECT_NE(only(of_severity(narrow.run("creepage-clearance"), Severity::error)).message.find("pin pitch 2.5 mm"),
            std::string::npos);
}

TEST(CreepageClearance, PolicyOptions) {
  // PD3, group I: table F.5 other materials PD3 group I between 250 V (3.2) and 320 V (4.0): 3.234 mm;
  // table F.2 PD3 at 2500 V: 1.5 mm; altitude 3000 m: × 1.14 (table A.2) = 1.71 mm.
  RuleBench b(deck(""));
  b.option("creepage-clearance.pollution-degree", "3");
  b.option("creepage-clearance.material-group", "I");
  b.option("creepage-clearance.altitude", "3000");
  const Finding f = only(b.run("creepage-clearance"));
  EXPECT_NE(f.message.find("clearance >= 1.71 mm, creepage >= 3.234 mm (IEC 60664-1 tables F.1, F.2, F.5, A.2)"),
            std::string::npos)
      << f.message;
  // OVC III: 4000 V → 3.0 mm (table F.1, F.2).
  RuleBench c(deck(""));
  c.option("creepage-clearance.overvoltage-category", "3");
  EXPECT_NE(only(c.run("creepage-clearance")).message.find("clearance >= 3 mm"), std::string::npos);
  // Printed wiring columns: PD2 250 V 1.0 mm, 320 V 1.6 mm → 1.0257 mm, raised to the 1.5 mm clearance.
  RuleBench d(deck(""));
  d.option("creepage-clearance.board", "printed");
  d.option("creepage-clearance.material-group", "IIIa");  // PD2 printed columns exclude IIIb (and so IIIa/b)
  EXPECT_NE(only(d.run("creepage-clearance")).message.find("creepage >= 1.5 mm"), std::string::npos);
}

TEST(CreepageClearance, EarthPairsAreBasic) {
  RuleBench b(deck("", "*@part CY1 class=Y2 pad_gap=2mm\nCY1 LF PE 2.2n\n", " earth=PE"));
  const auto fs = b.run("creepage-clearance");
  ASSERT_TRUE(with_subject(fs, "L/PE").has_value()) << b.rendered();
  ASSERT_TRUE(with_subject(fs, "N/PE").has_value());
  const auto errors = of_severity(fs, Severity::error);
  ASSERT_FALSE(errors.empty());
  EXPECT_TRUE(std::any_of(errors.begin(), errors.end(), [](const Finding& f) {
    return f.parts.front() == "CY1" && f.message.find("nets L and PE") != std::string::npos;
  }));
}

TEST(CreepageClearance, TransformerBarrierIsReinforced) {
  // 230 V → 12 V transformer: LS/LP = 0.0027 → N2/N1 = 0.052, v_ratio = k × N2/N1.
  RuleBench b(deck("",
                   "LP LF N 1\nLS S1 S2 2.7m\nK1 LP LS 0.99\nRL S1 S2 100\n"
                   "*@part CY2 class=Y1 pad_gap=5mm\nCY2 LF S2 1n\n"));
  const auto fs = b.run("creepage-clearance");
  const Finding* barrier = nullptr;
  for (const auto& f : fs)
    if (f.subject.find("barrier") != std::string::npos && f.severity == Severity::note) barrier = &f;
  ASSERT_NE(barrier, nullptr) << b.rendered();
  // Reinforced: impulse one step higher 2500 → 4000 V → 3.0 mm (table F.2); creepage 2 × table F.5.
  const double ratio = 0.99 * std::sqrt(2.7e-3 / 1.0);
  const double v = 253.0 * (1 + ratio);
  const double creepage_mm = 2 * (2.5 + 0.7 * (v - 250.0) / 70.0);
  EXPECT_NE(barrier->message.find("reinforced: clearance >= 3 mm"), std::string::npos) << barrier->message;
  const auto errors = of_severity(fs, Severity::error);
  const auto it = std::find_if(errors.begin(), errors.end(), [](const Finding& f) { return f.parts.front() == "CY2"; });
  ASSERT_NE(it, errors.end());
  EXPECT_NEAR(it->measurement->limit, creepage_mm * kMm, 1e-6 * kMm);
}

TEST(CreepageClearance, MultiplierNodeFromItsPeakVoltage) {
  // Half-wave doubler: C2 holds 715 V d.c. Table F.8 at 715 V: 0.10 mm, below the PD2 floor 0.2 mm; table F.5
  // other materials PD2 IIIa between 630 V (6.3 mm) and 800 V (8.0 mm): 7.15 mm.
  RuleBench b(deck("", ".model DX D(IS=1n)\nC1 LF A1 100n\nD1 N A1 DX\nD2 A1 B1 DX\nC2 B1 N 100n\nRL2 B1 N 100k\n"));
  for (const char* p : {"C1", "C2", "D1", "D2"}) b.set(p, Quantity::v_peak, 100);
  b.set("C2", Quantity::v_peak, 715);
  b.set("D1", Quantity::v_reverse_peak, 715);
  b.set("D2", Quantity::v_reverse_peak, 715);
  const auto fs = b.run("creepage-clearance");
  const std::optional<Finding> node = with_subject(fs, "B1/N");
  ASSERT_TRUE(node.has_value()) << b.rendered();
  EXPECT_NE(node->message.find("715 V RMS / 715 V peak"), std::string::npos) << node->message;
  EXPECT_NE(node->message.find("clearance >= 0.2 mm, creepage >= 7.15 mm (IEC 60664-1 tables F.8, F.5)"),
            std::string::npos)
      << node->message;
}

TEST(CreepageClearance, NotApplicableWithoutSupply) {
  RuleBench b("no mains\nV1 A 0 DC 12\nR1 A 0 1k\n.end\n");
  EXPECT_TRUE(b.run("creepage-clearance").empty());
}

TEST(CreepageClearance, ReferenceGroundIsNotABridgeAcrossTheBarrier) {
  // A 1 GΩ from neutral and a 1 MΩ from the secondary to ground 0 only give the simulator its reference
  // (examples/bench-supply-transformer.cir): the barrier pair is still reported.
  RuleBench b(deck("", "LP LF N 1\nLS S1 S2 2.7m\nK1 LP LS 0.99\nRL S1 S2 100\nRREF S2 0 1meg\nRNREF N 0 1G\n"));
  const auto fs = b.run("creepage-clearance");
  EXPECT_TRUE(std::any_of(fs.begin(), fs.end(), [](const Finding& f) {
    return f.subject.find("barrier") != std::string::npos && f.message.find("reinforced") != std::string::npos;
  })) << dump(fs);
}

/// A mains-driven optocoupler LED (R1 from the fused line) whose detector sits on a separate 5 V circuit; the
/// subcircuit instance is one part by its type annotation. `opto_attrs` go on XU3's annotation.
std::string opto_deck(const std::string& opto_attrs, const std::string& extra = "") {
  return deck("", "R1 LF LA 100k\n"
                  "*@part XU3 type=optocoupler " + opto_attrs + "\n"
                  "XU3 LA N OUT G2 OPTO4\n"
                  "V2 VCC G2 5\n"
                  "R2 VCC OUT 10k\n" + extra +
                  ".subckt OPTO4 A K C E\nD1 A K DL\nR1 C E 10meg\n.ends\n.model DL D(IS=1e-20 N=1.8)\n");
}

TEST(CreepageClearance, OptocouplerBarrierIsReinforcedByDefault) {
  // Reinforced (SELV side, safety-data.md 1.8): clearance for one impulse step above 2500 V → 4000 V → table F.2
  // case A PD2 3.0 mm (the step rule is from memory); creepage twice F.5's 2.53 mm (other materials, PD2,
  // IIIa/b, 253 V interpolated between the 250 V and 320 V rows) = 5.06 mm ([C-part: S-cui] for the doubling).
  RuleBench b(opto_deck(""));
  const auto fs = b.run("creepage-clearance");
  const std::optional<Finding> f = with_subject(fs, "XU3 barrier");
  ASSERT_TRUE(f.has_value()) << dump(fs) << b.rendered();
  EXPECT_EQ(f->severity, Severity::note);
  EXPECT_EQ(f->message,
            "mains and the detector side of optocoupler XU3: 253 V RMS / 358 V peak working at high-line, reinforced: "
            "clearance >= 3 mm, creepage >= 5.06 mm (IEC 60664-1 tables F.1, F.2, F.5)");
}

TEST(CreepageClearance, OptocouplerPadGapJustInsideAndJustOutside) {
  const double creepage_mm = 2 * (2.5 + 0.7 * 3.0 / 70.0);  // 5.06 mm, reinforced: twice table F.5
  RuleBench inside(opto_deck("pad_gap=5.061mm"));
  EXPECT_TRUE(of_severity(inside.run("creepage-clearance"), Severity::error).empty()) << inside.rendered();
  RuleBench outside(opto_deck("pad_gap=5.059mm"));
  const Finding f = only(of_severity(outside.run("creepage-clearance"), Severity::error));
  EXPECT_EQ(f.parts.front(), "XU3");
  EXPECT_EQ(f.measurement->quantity, "creepage");
  EXPECT_NEAR(f.measurement->limit, creepage_mm * kMm, 1e-12);
  // Below the 3.0 mm reinforced clearance (table F.2 case A, 4000 V) the clearance is what is short.
  RuleBench tight(opto_deck("pad_gap=2.9mm"));
  const Finding c = only(of_severity(tight.run("creepage-clearance"), Severity::error));
  EXPECT_EQ(c.measurement->quantity, "clearance");
  EXPECT_NEAR(c.measurement->limit, 3.0 * kMm, 1e-12);
}

TEST(CreepageClearance, OptocouplerPinPitchIsNotTheBarrierGap) {
  // 2.54 mm is the pitch along one row of a DIP package; it says nothing about the gap across the body.
  RuleBench b(opto_deck("pin_pitch=2.54mm"));
  EXPECT_TRUE(of_severity(b.run("creepage-clearance"), Severity::error).empty());
}

TEST(CreepageClearance, OptocouplerInsulationAttributeOverridesThePolicy) {
  // insulation=basic: table F.2 case A PD2 at 2500 V = 1.5 mm, table F.5 2.53 mm (as for line to neutral).
  RuleBench b(opto_deck("insulation=basic"));
  const std::optional<Finding> f = with_subject(b.run("creepage-clearance"), "XU3 barrier");
  ASSERT_TRUE(f.has_value());
  EXPECT_NE(f->message.find("basic: clearance >= 1.5 mm, creepage >= 2.53 mm"), std::string::npos) << f->message;
  // The policy option sets every barrier without its own attribute.
  RuleBench p(opto_deck(""));
  p.option("creepage-clearance.barrier-insulation", "supplementary");
  const std::optional<Finding> g = with_subject(p.run("creepage-clearance"), "XU3 barrier");
  ASSERT_TRUE(g.has_value());
  EXPECT_NE(g->message.find("supplementary: clearance >= 1.5 mm"), std::string::npos) << g->message;
}

TEST(CreepageClearance, OptocouplerWithBothSidesOnTheMainsIsNoBarrier) {
  // The detector's circuit is tied to neutral: no isolated side, no barrier pair.
  RuleBench b(opto_deck("", "R3 G2 N 1k\n"));
  EXPECT_FALSE(with_subject(b.run("creepage-clearance"), "XU3 barrier").has_value());
}

}  // namespace
}  // namespace mainscheck::rules::testing
