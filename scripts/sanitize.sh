#!/usr/bin/env bash
# The whole test suite under AddressSanitizer + UndefinedBehaviorSanitizer, in build-asan/ (or $1).
#   scripts/sanitize.sh [BUILD_DIR] [extra ctest arguments...]
# Run after ./setup.sh (which installs the dependencies). -O1 rather than -O0: the solver tests run
# several times faster and ASan still reports exact lines; benchmarks and fuzz targets are not built.
# Leaks are errors (detect_leaks=1), UB aborts the test (halt_on_error). Timings: docs/robustness.md.
set -euo pipefail
cd "$(dirname "$0")/.."
build="${1:-build-asan}"
shift $(( $# > 0 ? 1 : 0 ))
launcher=()
command -v ccache >/dev/null && launcher=(-DCMAKE_CXX_COMPILER_LAUNCHER=ccache)
# Warnings are not errors here: with -fsanitize=address GCC 12 reports -Wmaybe-uninitialized inside
# libstdc++'s <regex> and <functional> that the normal build does not (a known false positive of the
# instrumented code); the normal build (./setup.sh test) keeps -Werror for every source.
cmake -S . -B "$build" -DCMAKE_BUILD_TYPE=RelWithDebInfo -DCMAKE_CXX_FLAGS_RELWITHDEBINFO="-O1 -g" \
  -DMAINSCHECK_SANITIZE=ON -DMAINSCHECK_WERROR=OFF -DMAINSCHECK_BENCHMARKS=OFF -DMAINSCHECK_FUZZ=OFF \
  "${launcher[@]}" >/dev/null
cmake --build "$build" -j"$(nproc)"
ASAN_OPTIONS=detect_leaks=1:abort_on_error=1:detect_stack_use_after_return=1 \
UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 \
  ctest --test-dir "$build" --output-on-failure -j"$(nproc)" "$@"
