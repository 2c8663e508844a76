// Solver versus ngspice-39 on the decks of tests/data/solver/: for each deck, the CPU time of our
// periodic-steady-state solve (read + solve) and, in the same run, of ngspice's transient to the same
// steady state (child CPU time from getrusage(RUSAGE_CHILDREN)); then the ratio and the worst
// deviation of any compared stress. Run: solver_bench [--benchmark_filter=...].
#include <sys/resource.h>
#include <unistd.h>

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>

#include <benchmark/benchmark.h>

#include "analysis/solver/solver.hpp"
#include "parser/readers.hpp"
#include "support/ngspice_reference.hpp"
#include "tests/analysis/solver_reference.hpp"

namespace {

namespace fs = std::filesystem;
namespace ref = mainscheck::test_support::solver_ref;
using namespace mainscheck;

struct Row {
  double solver_cpu_s = 0;
  int solver_runs = 0;
  double ngspice_cpu_s = 0;
  double worst_dev = 0;
  std::string worst_what;
  bool converged = false;
};
std::map<std::string, Row> g_rows;

double self_cpu_s() {
  rusage u{};
  getrusage(RUSAGE_SELF, &u);
  return u.ru_utime.tv_sec + u.ru_utime.tv_usec * 1e-6 + u.ru_stime.tv_sec + u.ru_stime.tv_usec * 1e-6;
}

std::string slurp(const fs::path& p) {
  std::ifstream f(p);
  std::stringstream s;
  s << f.rdbuf();
  return s.str();
}

parser::Netlist read(const fs::path& p) {
  parser::DiskFileReader files;
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  return parser::read_spice_file(p.string(), files, sm, diags);
}

// Relative deviation beyond the test's absolute floor (the same floors as solver_ngspice_test.cpp).
void deviation(Row& r, double got, double want, double floor, const std::string& what) {
  const double d = std::max(0.0, std::abs(got - want) - floor) / std::max(std::abs(want), 1e-30);
  if (d > r.worst_dev) r.worst_dev = d, r.worst_what = what;
}

void bm_solver(benchmark::State& state, fs::path deck) {
  const std::string text = slurp(deck);
  const auto spec = ref::parse_spec(text);
  Row& row = g_rows[deck.stem().string()];
  const double c0 = self_cpu_s();
  int runs = 0;
  for (auto _ : state) {
    const parser::Netlist nl = read(deck);
    std::string err;
    auto req = ref::make_request(nl, spec, true, err);
    if (!req) {
      state.SkipWithError(err.c_str());
      return;
    }
    auto res = analysis::solver::solve_steady_state(nl, *req);
    row.converged = res.converged;
    state.counters["periods"] = res.periods_simulated;
    state.counters["shoot_it"] = res.shooting_iterations;
    state.counters["steps"] = static_cast<double>(res.time_steps);
    benchmark::DoNotOptimize(res);
    ++runs;
  }
  row.solver_cpu_s += self_cpu_s() - c0;
  row.solver_runs += runs;
}

void bm_ngspice(benchmark::State& state, fs::path deck) {
  const auto ngspice = test_support::find_ngspice();
  if (!ngspice) {
    state.SkipWithError("ngspice not found");
    return;
  }
  const std::string text = slurp(deck);
  const auto spec = ref::parse_spec(text);
  const parser::Netlist nl = read(deck);
  std::string err;
  auto req = ref::make_request(nl, spec, true, err);
  if (!req) {
    state.SkipWithError(err.c_str());
    return;
  }
  const double period = 1 / req->supply.f_Hz;
  const fs::path scratch = fs::temp_directory_path() / ("mainscheck_bench_" + deck.stem().string() + "_" +
                                                        std::to_string(::getpid()));
  Row& row = g_rows[deck.stem().string()];
  for (auto _ : state) {
    double cpu = 0;
    std::string log;
    const auto cols = ref::run_ngspice(*ngspice, ref::ngspice_deck(text, nl, spec, period, false, "out.txt"), scratch,
                                       log, &cpu);
    state.SetIterationTime(cpu);
    row.ngspice_cpu_s = cpu;
    if (cols.empty()) {
      state.SkipWithError(log.c_str());
      return;
    }
    const auto got = analysis::solver::solve_steady_state(nl, *req);
    if (!got.converged) continue;
    const auto want = ref::reference_from(cols, nl, *req, got.part_indices, period);
    const double i_floor = 1e-3 * want.supply.i_peak_A + 1e-6;
    for (std::size_t k = 0; k < got.parts.size() && k < want.parts.size(); ++k) {
      const auto& g = got.parts[k];
      const auto& w = want.parts[k];
      const double v_floor = 0.005 * std::max(w.v_peak_V, 1.0) + 0.05;
      deviation(row, g.v_peak_V, w.v_peak_V, v_floor, g.ref + " v_peak");
      if (g.v_reverse_peak_V && w.v_reverse_peak_V)
        deviation(row, *g.v_reverse_peak_V, *w.v_reverse_peak_V, v_floor, g.ref + " v_reverse_peak");
      deviation(row, g.i_peak_A, w.i_peak_A, i_floor, g.ref + " i_peak");
      deviation(row, g.i_rms_A, w.i_rms_A, i_floor, g.ref + " i_rms");
      deviation(row, g.i_avg_A, w.i_avg_A, 0.01 * w.i_rms_A + 1e-6, g.ref + " i_avg");
      deviation(row, g.p_avg_W, w.p_avg_W, 0.01 * w.v_peak_V * w.i_rms_A + 1e-6, g.ref + " p_avg");
    }
    for (std::size_t k = 0; k < got.outputs.size() && k < want.outputs.size(); ++k) {
      deviation(row, got.outputs[k].v_dc_V, want.outputs[k].v_dc_V, 0.01, "output v_dc");
      deviation(row, got.outputs[k].v_ripple_pp_V, want.outputs[k].v_ripple_pp_V,
                1e-3 * std::abs(want.outputs[k].v_dc_V) + 0.01, "output v_ripple_pp");
    }
    deviation(row, got.supply.i_rms_A, want.supply.i_rms_A, i_floor, "supply i_rms");
    deviation(row, got.supply.i_peak_A, want.supply.i_peak_A, i_floor, "supply i_peak");
  }
}

}  // namespace

int main(int argc, char** argv) {
  const fs::path dir = fs::path(MAINSCHECK_SOURCE_DIR) / "tests" / "data" / "solver";
  std::vector<fs::path> decks;
  for (const auto& e : fs::directory_iterator(dir))
    if (e.path().extension() == ".cir") decks.push_back(e.path());
  std::sort(decks.begin(), decks.end());
  for (const auto& d : decks) {
    benchmark::RegisterBenchmark(("solver/" + d.stem().string()).c_str(), bm_solver, d)->Unit(benchmark::kMillisecond);
    benchmark::RegisterBenchmark(("ngspice/" + d.stem().string()).c_str(), bm_ngspice, d)
        ->UseManualTime()
        ->Iterations(1)
        ->Unit(benchmark::kMillisecond);
  }
  benchmark::Initialize(&argc, argv);
  benchmark::RunSpecifiedBenchmarks();
  benchmark::Shutdown();
  std::printf("\n%-20s %12s %12s %9s %10s  %s\n", "deck", "solver ms", "ngspice ms", "ratio", "worst dev", "where");
  double worst = 0, min_ratio = 1e300;
  for (const auto& [name, r] : g_rows) {
    if (r.solver_runs == 0 || r.ngspice_cpu_s <= 0) continue;
    const double s_ms = 1e3 * r.solver_cpu_s / r.solver_runs;
    const double ratio = 1e3 * r.ngspice_cpu_s / s_ms;
    std::printf("%-20s %12.2f %12.1f %8.1fx %9.2f%%  %s%s\n", name.c_str(), s_ms, 1e3 * r.ngspice_cpu_s, ratio,
                100 * r.worst_dev, r.worst_what.c_str(), r.converged ? "" : " (solver not converged)");
    worst = std::max(worst, r.worst_dev);
    min_ratio = std::min(min_ratio, ratio);
  }
  std::printf("lowest ratio %.1fx, worst deviation beyond the floors %.2f%%\n", min_ratio, 100 * worst);
  return 0;
}
