// The circuit solver against ngspice-39 on the front-end decks of tests/data/solver/: every part's
// v_peak, v_reverse_peak, i_peak, i_rms, i_avg, p_avg, each output's v_dc and v_ripple_pp, and the
// supply's i_rms, i_peak and power factor must agree within 3 % (absolute floors near zero, below).
// The reference is ngspice-39's own transient run long enough to settle (checked: the output mean
// moves by < 0.3 % between its last two periods), last period sampled with wrdata.
#include <unistd.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <sstream>

#include <gtest/gtest.h>

#include "analysis/solver/solver.hpp"
#include "parser/diagnostics.hpp"
#include "parser/readers.hpp"
#include "support/ngspice_reference.hpp"
#include "tests/analysis/solver_reference.hpp"

namespace mainscheck::analysis::solver {
namespace {

namespace fs = std::filesystem;
namespace ref = test_support::solver_ref;

fs::path data_dir() { return fs::path(MAINSCHECK_SOURCE_DIR) / "tests" / "data" / "solver"; }

std::vector<std::string> decks() {
  std::vector<std::string> out;
  for (const auto& e : fs::directory_iterator(data_dir()))
    if (e.path().extension() == ".cir") out.push_back(e.path().filename().string());
  std::sort(out.begin(), out.end());
  return out;
}

struct Loaded {
  std::string text;
  parser::Netlist nl;
  ref::DeckSpec spec;
  std::string error;
};

Loaded load(const std::string& name) {
  Loaded l;
  const fs::path p = data_dir() / name;
  std::ifstream f(p);
  std::stringstream ss;
  ss << f.rdbuf();
  l.text = ss.str();
  l.spec = ref::parse_spec(l.text);
  parser::DiskFileReader files;
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  l.nl = parser::read_spice_file(p.string(), files, sm, diags);
  for (const auto& d : diags.diagnostics())
    if (d.severity == parser::Severity::error) l.error += parser::render_diagnostic(d, sm);
  return l;
}

// Relative band of the comparison, with an absolute floor for quantities that are near zero.
void expect_close(double got, double want, double floor, const std::string& what) {
  EXPECT_NEAR(got, want, 0.03 * std::abs(want) + floor) << what << " — reference: ngspice-39 transient";
}

struct Case {
  std::string deck;
  bool with_latches;
};

class SolverVsNgspice : public ::testing::TestWithParam<Case> {};

TEST_P(SolverVsNgspice, SteadyStateStressesMatchNgspice39) {
  const auto ngspice = test_support::find_ngspice();
  if (!ngspice) GTEST_SKIP() << "ngspice not found in PATH (or MAINSCHECK_NGSPICE); the reference is ngspice-39";
  const Case c = GetParam();
  Loaded l = load(c.deck);
  ASSERT_TRUE(l.error.empty()) << l.error;
  std::string err;
  auto req = ref::make_request(l.nl, l.spec, c.with_latches, err);
  ASSERT_TRUE(req) << err;
  const SteadyStateResult got = solve_steady_state(l.nl, *req);
  ASSERT_TRUE(got.converged) << got.reason;
  const double period = 1 / req->supply.f_Hz;

  const fs::path scratch = fs::path(::testing::TempDir()) /
                           ("mainscheck_solver_" + fs::path(c.deck).stem().string() + "_" + std::to_string(::getpid()));
  std::string log;
  const auto cols = ref::run_ngspice(*ngspice, ref::ngspice_deck(l.text, l.nl, l.spec, period, false, "out.txt"),
                                     scratch, log);
  ASSERT_FALSE(cols.empty()) << log;
  const ref::Reference want = ref::reference_from(cols, l.nl, *req, got.part_indices, period);
  ASSERT_LT(want.drift, 3e-3) << "the ngspice-39 reference has not settled; raise *@ periods in " << c.deck;

  ASSERT_EQ(got.parts.size(), want.parts.size());
  const double i_floor = 1e-3 * want.supply.i_peak_A + 1e-6;
  for (std::size_t k = 0; k < got.parts.size(); ++k) {
    const PartStress& g = got.parts[k];
    const PartStress& w = want.parts[k];
    const std::string who = c.deck + " " + g.ref;
    const double v_floor = 0.005 * std::max(w.v_peak_V, 1.0) + 0.05;
    expect_close(g.v_peak_V, w.v_peak_V, v_floor, who + " v_peak");
    if (w.v_reverse_peak_V && (g.v_reverse_peak_V || l.nl.parts[g.part].kind == parser::PartKind::diode)) {
      ASSERT_TRUE(g.v_reverse_peak_V.has_value()) << who;
      expect_close(*g.v_reverse_peak_V, *w.v_reverse_peak_V, v_floor, who + " v_reverse_peak");
    }
    expect_close(g.i_peak_A, w.i_peak_A, i_floor, who + " i_peak");
    expect_close(g.i_rms_A, w.i_rms_A, i_floor, who + " i_rms");
    expect_close(g.i_avg_A, w.i_avg_A, 0.01 * w.i_rms_A + 1e-6, who + " i_avg");
    expect_close(g.p_avg_W, w.p_avg_W, 0.01 * w.v_peak_V * w.i_rms_A + 1e-6, who + " p_avg");
  }
  ASSERT_EQ(got.outputs.size(), want.outputs.size());
  for (std::size_t k = 0; k < got.outputs.size(); ++k) {
    const auto& g = got.outputs[k];
    const auto& w = want.outputs[k];
    const std::string who = c.deck + " output " + l.nl.net(w.net).name;
    expect_close(g.v_dc_V, w.v_dc_V, 0.01, who + " v_dc");
    expect_close(g.v_ripple_pp_V, w.v_ripple_pp_V, 1e-3 * std::abs(w.v_dc_V) + 0.01, who + " v_ripple_pp");
  }
  expect_close(got.supply.i_rms_A, want.supply.i_rms_A, i_floor, c.deck + " supply i_rms");
  expect_close(got.supply.i_peak_A, want.supply.i_peak_A, i_floor, c.deck + " supply i_peak");
  expect_close(got.supply.power_factor, want.supply.power_factor, 0.005, c.deck + " supply power factor");
}

TEST_P(SolverVsNgspice, InrushAtThePeakMatchesNgspice39) {
  const Case c = GetParam();
  Loaded l = load(c.deck);
  if (!l.spec.inrush) GTEST_SKIP() << c.deck << " has no inrush comparison";
  const auto ngspice = test_support::find_ngspice();
  if (!ngspice) GTEST_SKIP() << "ngspice not found in PATH (or MAINSCHECK_NGSPICE); the reference is ngspice-39";
  ASSERT_TRUE(l.error.empty()) << l.error;
  std::string err;
  auto req = ref::make_request(l.nl, l.spec, c.with_latches, err);
  ASSERT_TRUE(req) << err;
  const InrushResult got = solve_inrush(l.nl, *req);
  ASSERT_TRUE(got.ok) << got.reason;
  // The deck's source has phase 90°, so ngspice's t = 0 is the positive peak, as the solver's switch-on.
  EXPECT_NEAR(std::fmod(got.t_switch_on_s, 0.02), 0.0, 1e-9);
  const double period = 1 / req->supply.f_Hz;
  const fs::path scratch = fs::path(::testing::TempDir()) /
                           ("mainscheck_inrush_" + fs::path(c.deck).stem().string() + "_" + std::to_string(::getpid()));
  std::string log;
  const auto cols =
      ref::run_ngspice(*ngspice, ref::ngspice_deck(l.text, l.nl, l.spec, period, true, "out.txt"), scratch, log);
  ASSERT_FALSE(cols.empty()) << log;
  const auto want = ref::inrush_reference_from(cols, l.nl, got.part_indices, *req->supply.source_part);
  expect_close(got.i_peak_A, want.i_peak_A, 1e-3 * want.i_peak_A, c.deck + " inrush supply i_peak");
  expect_close(got.i2t_A2s, want.i2t_A2s, 1e-3 * want.i2t_A2s, c.deck + " inrush supply I²t");
  for (const auto& p : got.parts) {
    auto it = want.parts.find(p.part);
    if (it == want.parts.end()) continue;
    expect_close(p.i_peak_A, it->second.first, 1e-3 * want.i_peak_A, c.deck + " " + p.ref + " inrush i_peak");
    expect_close(p.i2t_A2s, it->second.second, 1e-3 * want.i2t_A2s, c.deck + " " + p.ref + " inrush I²t");
  }
}

std::vector<Case> cases() {
  std::vector<Case> out;
  for (const auto& d : decks()) {
    out.push_back({d, true});
    if (!load(d).spec.latches.empty()) out.push_back({d, false});
  }
  return out;
}

std::string case_name(const ::testing::TestParamInfo<Case>& info) {
  std::string n = fs::path(info.param.deck).stem().string() + (info.param.with_latches ? "" : "_as_switch");
  for (char& ch : n)
    if (!std::isalnum(static_cast<unsigned char>(ch))) ch = '_';
  return n;
}

INSTANTIATE_TEST_SUITE_P(Decks, SolverVsNgspice, ::testing::ValuesIn(cases()), case_name);

TEST(SolverVsNgspiceSet, CoversTheFrontEndKinds) {
  // At least twelve decks of our own, one per front-end kind named in issue 4.
  const auto d = decks();
  EXPECT_GE(d.size(), 12u);
  for (const char* kind : {"hw_reservoir", "bridge_reservoir", "centre_tap", "dual_rails", "cap_dropper", "doubler",
                           "quadrupler", "cw3", "resistive_dropper", "triac_phase", "rc_inrush", "transformer_bridge"})
    EXPECT_NE(std::find(d.begin(), d.end(), std::string(kind) + ".cir"), d.end()) << kind;
}

}  // namespace
}  // namespace mainscheck::analysis::solver
