// The solver reads a triac's or thyristor's stresses between its main terminals (anode to cathode,
// MT2 to MT1), whatever the pin order of the part: `XT1 MT2 G MT1` once had its voltage read from
// MT2 to the gate, which made the dissipation of the lamp dimmer's triac come out negative.
#include <gtest/gtest.h>

#include <fstream>
#include <sstream>

#include "analysis/corners.hpp"
#include "analysis/recognition_support.hpp"
#include "analysis/stress_engine.hpp"

namespace mainscheck::analysis {
namespace {

TEST(LatchProbe, TriacDissipationIsItsOnStateLossBetweenTheMainTerminals) {
  std::ifstream in(MAINSCHECK_SOURCE_DIR "/examples/lamp-dimmer-triac.cir");
  std::stringstream text;
  text << in.rdbuf();
  testing::Deck d(text.str(), "lamp-dimmer-triac.cir");
  const RecognitionResult& rec = d.run();
  const CornerPlan plan = plan_corners(rec.supply.mains.value_or(MainsSpec{}), CornerOptions{});
  const StressResult s = compute_stresses(rec, plan, {});
  ASSERT_TRUE(s.failure.empty()) << s.failure;
  const std::size_t xt1 = *rec.devices.find_part_index("XT1");
  const PartStress* ps = s.find(xt1);
  ASSERT_NE(ps, nullptr);
  const double p_W = ps->get(Quantity::p_avg)->value;
  const double i_rms_A = ps->get(Quantity::i_rms)->value;
  // The triac model is a resistance of r_on = 0.05 Ω when on (analysis/solver/solver.hpp) and 1 GΩ
  // off: P = I_rms² · r_on (Joule's law) plus an off-state share below 1e-4 W at this voltage.
  EXPECT_GT(p_W, 0.0);
  EXPECT_NEAR(p_W, i_rms_A * i_rms_A * 0.05, 0.05 * i_rms_A * i_rms_A * 0.05 + 2e-4);
  // Off-state it blocks the mains less the lamp's small drop, in both directions (symmetric supply).
  const double v_fwd = ps->get(Quantity::v_peak)->value;
  const double v_rev = ps->get(Quantity::v_reverse_peak)->value;
  EXPECT_NEAR(v_fwd, v_rev, 0.02 * v_fwd);
}

}  // namespace
}  // namespace mainscheck::analysis
