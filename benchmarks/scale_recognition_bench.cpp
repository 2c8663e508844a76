// Recognition growth on the generated boards: recognise() at 10k, 100k and 1M parts (the board is
// read once per size, outside the timing). Goal (issue 9): linear, each 10x step costs at most 11x;
// the counter x_step is this size's time over the previous size's, measured in the same run.
#include <benchmark/benchmark.h>

#include <map>
#include <memory>

#include "analysis/recognition.hpp"
#include "benchmarks/board_files.hpp"
#include "parser/readers.hpp"

namespace {

using namespace mainscheck;

struct ReadBoard {
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  parser::Netlist nl;
};

// One board in memory at a time: the 1M-part board is large.
const ReadBoard& board(std::size_t parts) {
  static std::size_t held = 0;
  static std::unique_ptr<ReadBoard> b;
  if (held != parts) {
    b.reset();
    b = std::make_unique<ReadBoard>();
    parser::DiskFileReader files;
    b->nl = parser::read_spice_file(bench::board_file(parts, tools::BoardFormat::spice), files, b->sm, b->diags);
    held = parts;
  }
  return *b;
}

void recognise_generated_board(benchmark::State& state) {
  static std::map<std::size_t, double> ms_by_parts;
  const auto parts = static_cast<std::size_t>(state.range(0));
  const ReadBoard& b = board(parts);
  if (b.diags.has_errors()) {
    state.SkipWithError("the generated board read with errors");
    return;
  }
  double total_s = 0;
  std::size_t blocks = 0;
  for (auto _ : state) {
    // As `mainscheck check` does it: the netlist moves into recognition (no device-view copy). The
    // copy that stands for a fresh read is made outside the measured time.
    parser::Netlist nl = b.nl;
    total_s += bench::seconds_of([&] {
      parser::DiagnosticSink diags;
      const auto r = analysis::recognise(std::move(nl), {}, nullptr, diags);
      blocks = r.blocks.size();
    });
  }
  const double ms = total_s * 1e3 / static_cast<double>(state.iterations());
  ms_by_parts[parts] = ms;
  state.counters["parts"] = static_cast<double>(b.nl.parts.size());
  state.counters["blocks"] = static_cast<double>(blocks);
  state.counters["ns_per_part"] = ms * 1e6 / static_cast<double>(parts);
  if (auto prev = ms_by_parts.find(parts / 10); prev != ms_by_parts.end()) {
    state.counters["x_step"] = ms / prev->second;
    state.counters["goal_x"] = 11.0;
  }
}

}  // namespace

BENCHMARK(recognise_generated_board)->Arg(10'000)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);
