// dropper-regulation (rules/regulation/dropper_regulation.cpp): a dropper's shunt zener must conduct at
// low line (issue 15 item 14).
#include <gtest/gtest.h>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

using analysis::Quantity;

// Resistive dropper after examples/fan-resistive-dropper.cir on 230 V ± 10 %: RD1 from the line, half-wave
// D1, 12 V zener DZ1 across the output, load RL.
std::string deck(const std::string& r_dropper, const std::string& r_load) {
  return "resistive dropper\n"
         "*@supply mains=230V+-10%/50Hz line=L neutral=N\n"
         "V1 L N SIN(0 325.27 50)\n"
         "RD1 L A " +
         r_dropper +
         " p_rated=5 v_rated=750\n"
         "D1 A VCC DR v_rated=1000 i_rated=1\n"
         "DZ1 N VCC DZ12 type=zener v_zener=12 p_rated=1.3\n"
         "C1 VCC N 220u v_rated=25\n"
         "RL VCC N " +
         r_load +
         " p_rated=1 v_rated=200\n"
         ".model DR D(IS=5n RS=0.03 N=1.8)\n"
         ".model DZ12 D(IS=1e-14 RS=5 BV=12 IBV=5m)\n"
         ".end\n";
}

TEST(DropperRegulation, OutOfRegulationAtLowLine) {
  // 68 kΩ half-wave at 207 V: I_avg ≈ (V_pk − V_out)/(π R) = (292.7 − 12)/(π·68k) ≈ 1.3 mA (half-wave
  // rectified sine through R, textbook), while 1 kΩ at 12 V needs 12 mA: the output sags far below V_Z.
  RuleBench b(deck("68k", "1k"));
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  const Finding f = only(b.run("dropper-regulation"));
  EXPECT_EQ(f.severity, Severity::warning);
  EXPECT_EQ(f.parts.front(), "DZ1");
  ASSERT_TRUE(f.measurement);
  EXPECT_EQ(f.measurement->corner.rfind("low-line", 0), 0u) << f.measurement->corner;
  EXPECT_EQ(f.measurement->quantity, "v_zener_needed");
  EXPECT_DOUBLE_EQ(f.measurement->value, 12.0);
  // Ohm's law bound: the output cannot exceed I_avg·R_L ≈ 1.3 V plus its ripple.
  EXPECT_LT(f.measurement->limit, 3.0);
  EXPECT_LT(f.measurement->margin(), 0.0);
  EXPECT_TRUE(f.message.starts_with("output VCC is out of regulation at low-line")) << f.message;
}

TEST(DropperRegulation, RegulatingAtLowLineIsSilent) {
  // 22 kΩ into 4.7 kΩ (the fan example): (292.7 − 12)/(π·22k) ≈ 4.1 mA > 12 V / 4.7 kΩ = 2.6 mA, so the
  // zener conducts at low line too.
  RuleBench b(deck("22k", "4.7k"));
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure;
  EXPECT_TRUE(b.run("dropper-regulation").empty());
}

TEST(DropperRegulation, MarginIsAPolicyOption) {
  RuleBench b(deck("68k", "1k"));
  b.solve();
  b.option("dropper-regulation.margin", "100%");  // any crest counts as regulating
  EXPECT_TRUE(b.run("dropper-regulation").empty());
}

}  // namespace
}  // namespace mainscheck::rules::testing
