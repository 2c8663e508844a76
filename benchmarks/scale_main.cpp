// scale_bench: reading, recognition, full check and memory on generated boards of 10k to 1M parts,
// each against its reference in the same run (docs/performance.md).
#include <benchmark/benchmark.h>

BENCHMARK_MAIN();
