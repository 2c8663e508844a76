// Block recognition time against netlist size on the generated board of
// tests/analysis/recognition_support.hpp (three front-end blocks among RC ladders and decoy diode
// strings): recognise() only, the deck is read once per size. The growth from 1k to 100k parts
// should be linear. Run: recognition_bench [--benchmark_filter=...].
#include <benchmark/benchmark.h>

#include "analysis/recognition.hpp"
#include "analysis/recognition_support.hpp"
#include "parser/readers.hpp"

namespace {

using namespace mainscheck;

void recognise_board(benchmark::State& state) {
  const int cells = static_cast<int>(state.range(0));
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  parser::MemoryFileReader files;
  const parser::Netlist nl = parser::read_spice_text("board.cir", analysis::testing::board_deck(cells), files, sm, diags);
  for (auto _ : state) {
    parser::DiagnosticSink run_diags;
    auto r = analysis::recognise(nl, {}, nullptr, run_diags);
    benchmark::DoNotOptimize(r.blocks.data());
  }
  state.counters["parts"] = static_cast<double>(nl.parts.size());
  state.SetComplexityN(static_cast<benchmark::IterationCount>(nl.parts.size()));
}

}  // namespace

BENCHMARK(recognise_board)->Arg(250)->Arg(2500)->Arg(25000)->Unit(benchmark::kMillisecond)->Complexity();

BENCHMARK_MAIN();
