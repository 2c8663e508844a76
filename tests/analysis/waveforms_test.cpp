// The waveforms the stress engine keeps for reports (analysis/waveforms.*): which traces per block
// kind, bounded decimation that keeps the peaks, and consistency with the stresses computed from
// the same solver runs.
#include "analysis/waveforms.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <numbers>
#include <sstream>

#include "analysis/corners.hpp"
#include "analysis/recognition_support.hpp"
#include "analysis/stress_engine.hpp"

namespace mainscheck::analysis {
namespace {

using testing::Deck;

// The night-light example's front-end (examples/nightlight-half-wave.cir): 47 Ω, one diode,
// 10 µF reservoir, 33 kΩ load and a bleeder.
const char* kHalfWave = R"(half-wave rectifier
*@supply line=L neutral=N mains=230V/50Hz
VMAINS L N SIN(0 325.27 50)
RS1 L A 47
D1 A DC D1N4007
*@part C1 v_rated=400
C1 DC N 10u
RB1 DC N 470k
*@part RLED role=load
RLED DC N 33k
.model D1N4007 D(IS=7n RS=0.04 N=1.9 BV=1000 IBV=5u)
.end
)";

const Waveform* find(const StressResult& s, const std::string& name_prefix) {
  for (const auto& w : s.waveforms) {
    if (w.name.rfind(name_prefix, 0) == 0) return &w;
  }
  return nullptr;
}

StressResult solve(Deck& d, const StressOptions& options = {}) {
  const RecognitionResult& rec = d.run();
  const CornerPlan plan = plan_corners(rec.supply.mains.value_or(MainsSpec{}), CornerOptions{});
  return compute_stresses(rec, plan, options);
}

TEST(DecimateMinMax, KeepsEndsExtremaAndOrderWithinTheCap) {
  std::vector<double> t, y;
  for (int k = 0; k < 10000; ++k) {
    t.push_back(k * 1e-6);
    y.push_back(std::sin(2 * std::numbers::pi * k / 10000.0));
  }
  y[1234] = 5.0;   // a narrow spike must survive
  y[7777] = -4.0;
  const double first = y.front(), last = y.back();
  decimate_min_max(t, y, 200);
  ASSERT_EQ(t.size(), y.size());
  EXPECT_LE(t.size(), 200u);
  EXPECT_GE(t.size(), 150u);
  EXPECT_DOUBLE_EQ(t.front(), 0.0);
  EXPECT_DOUBLE_EQ(y.front(), first);
  EXPECT_DOUBLE_EQ(t.back(), 9999e-6);
  EXPECT_DOUBLE_EQ(y.back(), last);
  EXPECT_DOUBLE_EQ(*std::max_element(y.begin(), y.end()), 5.0);
  EXPECT_DOUBLE_EQ(*std::min_element(y.begin(), y.end()), -4.0);
  for (std::size_t k = 1; k < t.size(); ++k) EXPECT_LT(t[k - 1], t[k]) << k;
}

TEST(DecimateMinMax, LeavesShortTracesAlone) {
  std::vector<double> t{0, 1, 2}, y{3, 4, 5};
  decimate_min_max(t, y, 400);
  EXPECT_EQ(t, (std::vector<double>{0, 1, 2}));
  EXPECT_EQ(y, (std::vector<double>{3, 4, 5}));
}

TEST(Waveforms, HalfWaveRectifierKeepsDiodeCurrentAndReservoirVoltage) {
  Deck d(kHalfWave);
  const StressResult s = solve(d);
  ASSERT_TRUE(s.failure.empty()) << s.failure;
  const Waveform* id = find(s, "D1 current");
  const Waveform* vc = find(s, "DC − N voltage (reservoir C1)");
  ASSERT_NE(id, nullptr);
  ASSERT_NE(vc, nullptr);
  EXPECT_EQ(id->block, d.result.blocks.front().id);
  EXPECT_EQ(id->unit, "A");
  EXPECT_EQ(id->part, "D1");
  EXPECT_EQ(vc->unit, "V");
  EXPECT_EQ(vc->net, "DC");
  EXPECT_EQ(vc->ret, "N");
  EXPECT_EQ(id->interval, "period");
  for (const Waveform* w : {id, vc}) {
    EXPECT_LE(w->values.size(), kDefaultWaveformPoints) << w->name;
    EXPECT_EQ(w->t_s.size(), w->values.size()) << w->name;
    EXPECT_GE(w->t_s.front(), 0.0) << w->name;
  }
  // One 50 Hz period (20 ms) from 0.
  EXPECT_NEAR(id->t_s.back() - id->t_s.front(), 0.020, 0.0005);

  // The decimated traces keep the peaks the stress table reports from the same solver runs.
  const std::size_t d1 = *d.result.devices.find_part_index("D1");
  const PartStress* ps = s.find(d1);
  ASSERT_NE(ps, nullptr);
  EXPECT_NEAR(peak_magnitude(*id), ps->get(Quantity::i_peak)->value, 1e-9);
  EXPECT_EQ(id->corner, ps->get(Quantity::i_peak)->corner);
  // No inrush trace without an inrush result (this deck's switch-on run may not converge).
  EXPECT_EQ(find(s, "supply current at switch-on") != nullptr, s.inrush.has_value());

  // A peak rectifier charges its reservoir to about the source peak less the diode and series
  // resistor drop (textbook half-wave rectifier; the high-line corner is 253 V rms, 358 V peak).
  const double v_peak_high = std::sqrt(2.0) * 230.0 * 1.1;
  const double v_max = *std::max_element(vc->values.begin(), vc->values.end());
  EXPECT_LT(v_max, v_peak_high);
  EXPECT_GT(v_max, 0.9 * v_peak_high);
}

TEST(Waveforms, InrushTraceIsTheSwitchOnSupplyCurrent) {
  // examples/bench-supply-bridge.cir: NTC-limited bridge whose inrush the golden reports show.
  std::ifstream in(MAINSCHECK_SOURCE_DIR "/examples/bench-supply-bridge.cir");
  std::stringstream text;
  text << in.rdbuf();
  Deck d(text.str(), "bench-supply-bridge.cir");
  const StressResult s = solve(d);
  ASSERT_TRUE(s.failure.empty()) << s.failure;
  ASSERT_TRUE(s.inrush.has_value());
  const Waveform* w = find(s, "supply current at switch-on");
  ASSERT_NE(w, nullptr);
  EXPECT_EQ(w->interval, "inrush");
  EXPECT_EQ(w->corner, s.inrush->where());  // "high-line, positive crest"
  EXPECT_TRUE(w->block.empty());
  EXPECT_LE(w->values.size(), kDefaultWaveformPoints);
  // From switch-on over the first half cycle (10 ms at 50 Hz), peak kept through decimation.
  EXPECT_GE(w->t_s.front(), 0.0);
  EXPECT_NEAR(w->t_s.back(), 0.010, 0.0005);
  EXPECT_NEAR(peak_magnitude(*w), s.inrush->i_peak_A, 1e-9 * s.inrush->i_peak_A);
}

TEST(Waveforms, NoneKeptWhenDisabled) {
  Deck d(kHalfWave);
  StressOptions o;
  o.waveform_points = 0;
  const StressResult s = solve(d, o);
  ASSERT_TRUE(s.failure.empty()) << s.failure;
  EXPECT_TRUE(s.waveforms.empty());
}

TEST(Waveforms, PointCapIsHonoured) {
  Deck d(kHalfWave);
  StressOptions o;
  o.waveform_points = 50;
  const StressResult s = solve(d, o);
  ASSERT_FALSE(s.waveforms.empty());
  for (const auto& w : s.waveforms) EXPECT_LE(w.values.size(), 50u) << w.name;
}

TEST(Waveforms, PhaseControlKeepsTheTriacCurrentWithItsTrigger) {
  std::ifstream in(MAINSCHECK_SOURCE_DIR "/examples/lamp-dimmer-triac.cir");
  std::stringstream text;
  text << in.rdbuf();
  Deck d(text.str(), "lamp-dimmer-triac.cir");
  const RecognitionResult& rec = d.run();
  std::vector<solver::LatchSpec> latches(1);
  latches[0].part = *rec.devices.find_part_index("XT1");
  latches[0].firing.diac_part = *rec.devices.find_part_index("XD1");
  const std::vector<TraceSpec> specs = traces_that_matter(rec, latches);
  ASSERT_EQ(specs.size(), 1u);
  EXPECT_EQ(specs[0].name, "XT1 current (fired by XD1)");
  EXPECT_EQ(specs[0].source, TraceSource::part_current);
}

}  // namespace
}  // namespace mainscheck::analysis
