// The whole check at board scale, and its memory. full_check runs the CLI pipeline in-process
// (read, recognise, corners, stresses, rules, report) against the line-count floor of the same
// file. peak_rss runs the built `mainscheck` binary on the 1M-part board in a child process and
// reads its peak resident set from wait4(); goal (issue 9): at most 2x the file size + 50 MB.
// Run the peak_rss rows in a process of their own (--benchmark_filter=peak_rss).
#include <benchmark/benchmark.h>

#include <spawn.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <fcntl.h>

#include <string>
#include <vector>

#include "benchmarks/board_files.hpp"
#include "cli/check_pipeline.hpp"

extern char** environ;

namespace {

using namespace mainscheck;

void full_check(benchmark::State& state, tools::BoardFormat format) {
  const auto parts = static_cast<std::size_t>(state.range(0));
  const std::string path = bench::board_file(parts, format);
  const double floor_s = bench::line_count_floor_s(path);
  double total_s = 0;
  bool complete = true;
  std::size_t findings = 0, blocks = 0;
  for (auto _ : state) {
    total_s += bench::seconds_of([&] {
      cli::CheckRun run;
      cli::run_check(path, cli::CheckSettings{}, run);
      complete = run.report.status == report::CheckStatus::complete;
      findings = run.report.findings.size();
      blocks = run.recognition ? run.recognition->blocks.size() : 0;
    });
  }
  if (!complete) state.SkipWithError("the check of the generated board did not complete");
  const double per_iter_s = total_s / static_cast<double>(state.iterations());
  state.counters["parts"] = static_cast<double>(parts);
  state.counters["blocks"] = static_cast<double>(blocks);
  state.counters["findings"] = static_cast<double>(findings);
  state.counters["x_floor"] = per_iter_s / floor_s;
  state.counters["ns_per_part"] = per_iter_s * 1e9 / static_cast<double>(parts);
}

// Peak RSS of `mainscheck <command> FILE` in a child process, in bytes.
long long child_peak_rss_bytes(const std::vector<std::string>& args) {
  std::vector<char*> argv;
  for (const auto& a : args) argv.push_back(const_cast<char*>(a.c_str()));
  argv.push_back(nullptr);
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, 1, "/dev/null", O_WRONLY, 0);
  posix_spawn_file_actions_addopen(&actions, 2, "/dev/null", O_WRONLY, 0);
  pid_t pid = 0;
  const int rc = posix_spawn(&pid, argv[0], &actions, nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  if (rc != 0) return -1;
  int status = 0;
  rusage usage{};
  if (wait4(pid, &status, 0, &usage) != pid || !WIFEXITED(status) || WEXITSTATUS(status) >= 2) return -1;
  return static_cast<long long>(usage.ru_maxrss) * 1024;  // ru_maxrss is in KiB on Linux (getrusage(2))
}

void peak_rss(benchmark::State& state, tools::BoardFormat format, const char* command) {
  const auto parts = static_cast<std::size_t>(state.range(0));
  const std::string path = bench::board_file(parts, format);
  long long rss = 0;
  for (auto _ : state) rss = child_peak_rss_bytes({MAINSCHECK_BINARY, command, path});
  if (rss < 0) {
    state.SkipWithError("mainscheck failed on the generated board");
    return;
  }
  // posix_spawn shares this process's memory until the exec, and the kernel carries that peak into
  // the child's ru_maxrss: the figure is only the child's when this process stayed small.
  rusage self{};
  getrusage(RUSAGE_SELF, &self);
  const long long parent = static_cast<long long>(self.ru_maxrss) * 1024;
  if (parent * 2 > rss) {
    state.SkipWithError("this process grew too large to measure a child; run --benchmark_filter=peak_rss alone");
    return;
  }
  const double file_MB = static_cast<double>(bench::file_bytes(path)) / 1e6;
  const double goal_MB = 2 * file_MB + 50;
  state.counters["parts"] = static_cast<double>(parts);
  state.counters["file_MB"] = file_MB;
  state.counters["rss_MB"] = static_cast<double>(rss) / 1e6;
  state.counters["goal_MB"] = goal_MB;
  state.counters["x_goal"] = static_cast<double>(rss) / 1e6 / goal_MB;
  state.counters["B_per_part"] = static_cast<double>(rss) / static_cast<double>(parts);
}

void spice_full_check(benchmark::State& s) { full_check(s, tools::BoardFormat::spice); }
void xml_full_check(benchmark::State& s) { full_check(s, tools::BoardFormat::xml); }
void spice_peak_rss_netlist(benchmark::State& s) { peak_rss(s, tools::BoardFormat::spice, "netlist"); }
void spice_peak_rss_check(benchmark::State& s) { peak_rss(s, tools::BoardFormat::spice, "check"); }
void xml_peak_rss_check(benchmark::State& s) { peak_rss(s, tools::BoardFormat::xml, "check"); }

}  // namespace

BENCHMARK(spice_full_check)->Arg(10'000)->Arg(100'000)->Unit(benchmark::kMillisecond);
BENCHMARK(spice_full_check)->Arg(1'000'000)->Iterations(1)->Unit(benchmark::kMillisecond);
BENCHMARK(xml_full_check)->Arg(100'000)->Unit(benchmark::kMillisecond);
BENCHMARK(spice_peak_rss_netlist)->Arg(1'000'000)->Iterations(1)->Unit(benchmark::kMillisecond);
BENCHMARK(spice_peak_rss_check)->Arg(1'000'000)->Iterations(1)->Unit(benchmark::kMillisecond);
BENCHMARK(xml_peak_rss_check)->Arg(1'000'000)->Iterations(1)->Unit(benchmark::kMillisecond);
