#include <fstream>
#include <sstream>

#include <gtest/gtest.h>

#include "analysis/recognition_support.hpp"

namespace mainscheck::analysis {
namespace {

using testing::Deck;

std::string slurp(const std::string& path) {
  std::ifstream in(path);
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

std::string kinds(const Deck& d) {
  std::string out;
  for (const auto& b : d.result.blocks) out += b.kind + (b.variant.empty() ? "" : "/" + b.variant) + " ";
  return out;
}

// The rectifier and protection examples of the Harrow Lane product line each show their block.
TEST(RecogniserExamples, EachExampleShowsItsBlock) {
  struct Case {
    const char* file;
    const char* kind;
  };
  for (const Case& c : {Case{"bench-supply-bridge.cir", "bridge-rectifier"},
                        Case{"bench-supply-bridge.cir", "protection"},
                        Case{"nightlight-half-wave.cir", "half-wave-rectifier"},
                        Case{"charger-centre-tap.cir", "centre-tap-rectifier"},
                        Case{"amplifier-dual-rail.cir", "dual-rail-rectifier"}}) {
    const std::string path = std::string(MAINSCHECK_SOURCE_DIR "/examples/") + c.file;
    Deck d(slurp(path), path);
    ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
    d.run();
    ASSERT_FALSE(d.diags.has_errors()) << d.rendered();
    EXPECT_EQ(d.blocks(c.kind).size(), 1u) << c.file << ": " << kinds(d);
  }
}

TEST(RecogniserExamples, BenchSupplyRolesAndRatings) {
  const std::string path = MAINSCHECK_SOURCE_DIR "/examples/bench-supply-bridge.cir";
  Deck d(slurp(path), path);
  d.run();
  const auto prot = d.blocks("protection");
  ASSERT_EQ(prot.size(), 1u) << kinds(d);
  EXPECT_EQ(d.refs(*prot[0], "common_mode_choke"), (std::vector<std::string>{"LCM1", "LCM2"}));
  EXPECT_EQ(d.refs(*prot[0], "x_capacitor"), (std::vector<std::string>{"CX1"}));
  const auto& dev = d.result.devices;
  const auto& cx1 = d.result.info[*dev.find_part_index("CX1")];
  EXPECT_EQ(cx1.text("class"), "X2");
  EXPECT_EQ(cx1.number("v_rated_ac"), 305.0);
  const auto& rd1 = d.result.info[*dev.find_part_index("RD1")];
  EXPECT_EQ(rd1.number("p_rated"), 0.25);
  EXPECT_EQ(rd1.find("p_rated")->source, InfoSource::element_param);
  const auto br = d.blocks("bridge-rectifier");
  ASSERT_EQ(br.size(), 1u);
  EXPECT_EQ(d.refs(*br[0], "bleeder"), (std::vector<std::string>{"RB1"}));
  EXPECT_EQ(d.refs(*br[0], "load"), (std::vector<std::string>{"RLOAD"}));
}

}  // namespace
}  // namespace mainscheck::analysis
