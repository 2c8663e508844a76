// examples/flawed-night-light-dropper.cir: every flaw its header lists is found by the rating rules.
#include <gtest/gtest.h>

#include <fstream>
#include <set>
#include <sstream>

#include "rule_test_support.hpp"

namespace mainscheck::rules::testing {
namespace {

std::string read_example(const std::string& name) {
  std::ifstream in(std::string(MAINSCHECK_SOURCE_DIR) + "/examples/" + name);
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

TEST(FlawedExamples, NightLightDropperShowsEveryListedFlaw) {
  RuleBench b(read_example("flawed-night-light-dropper.cir"));
  b.solve();
  ASSERT_TRUE(b.stress.failure.empty()) << b.stress.failure << "\n" << b.rendered();
  std::set<std::pair<std::string, std::string>> got;  // (rule id, part)
  for (const char* id : {"voltage-rating.capacitor", "voltage-rating.resistor", "surge-current.resistor",
                         "power-rating.zener", "voltage-rating.fuse", "rating-unknown"}) {
    for (const auto& f : b.run(id)) got.insert({f.rule_id, f.parts.at(0)});
  }
  const std::set<std::pair<std::string, std::string>> expected{
      {"voltage-rating.capacitor", "C1"},  // 253 V r.m.s. on a 250 V a.c. X2
      {"voltage-rating.resistor", "RB1"},  // 0805 chip (150 V) across the dropper
      {"surge-current.resistor", "RS1"},   // C V_pk^2 / 2 = 680 nF x 358^2 / 2 = 43.5 mJ vs 10 mJ
      {"power-rating.zener", "DZ1"},       // no-load V_Z I_dc on a 0.5 W zener
      {"voltage-rating.fuse", "RF1"},      // 125 V fuse on 253 V
      {"rating-unknown", "D2"},            // no ratings at all
  };
  for (const auto& e : expected) EXPECT_TRUE(got.count(e)) << e.first << " on " << e.second;
}

}  // namespace
}  // namespace mainscheck::rules::testing
