// Reading at board scale: SPICE read + flatten and XML read of the generated boards against the
// I/O floor of the same file (read it, count '\n'), measured in the same run. Goals (issue 9):
// SPICE within 10x of the floor, XML within 5x. Counters: x_floor is the ratio, goal_x the goal.
#include <benchmark/benchmark.h>

#include "benchmarks/board_files.hpp"
#include "parser/readers.hpp"

namespace {

using namespace mainscheck;

void line_count(benchmark::State& state, tools::BoardFormat format) {
  const std::string path = bench::board_file(static_cast<std::size_t>(state.range(0)), format);
  std::size_t lines = 0;
  for (auto _ : state) benchmark::DoNotOptimize(lines = bench::count_lines(path));
  state.counters["lines"] = static_cast<double>(lines);
  state.counters["file_MB"] = static_cast<double>(bench::file_bytes(path)) / 1e6;
  state.SetBytesProcessed(static_cast<std::int64_t>(state.iterations() * bench::file_bytes(path)));
}

void read_board(benchmark::State& state, tools::BoardFormat format, double goal_x) {
  const std::string path = bench::board_file(static_cast<std::size_t>(state.range(0)), format);
  const double floor_s = bench::line_count_floor_s(path);
  double total_s = 0;
  std::size_t parts = 0;
  bool errors = false;
  for (auto _ : state) {
    total_s += bench::seconds_of([&] {
      parser::SourceManager sm;
      parser::DiagnosticSink diags;
      parser::DiskFileReader files;
      const parser::Netlist nl = format == tools::BoardFormat::xml ? parser::read_xml_file(path, files, sm, diags)
                                                                   : parser::read_spice_file(path, files, sm, diags);
      parts = nl.parts.size();
      errors = diags.has_errors();
    });
  }
  if (errors) state.SkipWithError("the generated board read with errors");
  const double per_iter_s = total_s / static_cast<double>(state.iterations());
  state.counters["parts"] = static_cast<double>(parts);
  state.counters["floor_ms"] = floor_s * 1e3;
  state.counters["x_floor"] = per_iter_s / floor_s;
  state.counters["goal_x"] = goal_x;
  state.SetBytesProcessed(static_cast<std::int64_t>(state.iterations() * bench::file_bytes(path)));
}

void spice_line_count(benchmark::State& s) { line_count(s, tools::BoardFormat::spice); }
void xml_line_count(benchmark::State& s) { line_count(s, tools::BoardFormat::xml); }
void spice_read_flatten(benchmark::State& s) { read_board(s, tools::BoardFormat::spice, 10.0); }
void xml_read(benchmark::State& s) { read_board(s, tools::BoardFormat::xml, 5.0); }

}  // namespace

BENCHMARK(spice_line_count)->Arg(10'000)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);
BENCHMARK(spice_read_flatten)->Arg(10'000)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);
BENCHMARK(xml_line_count)->Arg(10'000)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);
BENCHMARK(xml_read)->Arg(10'000)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);
