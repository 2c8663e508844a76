#!/usr/bin/env bash
# Board-scale figures: builds the benchmarks, runs scale_bench (reading, recognition, full check,
# peak RSS; each against its reference in the same run) and prints the peak RSS of the CLI on the
# 1M-part board next to its goal. See docs/performance.md.
#   scripts/bench.sh [BUILD_DIR] [extra scale_bench arguments]
set -euo pipefail
cd "$(dirname "$0")/.."
build=${1:-build-bench}
shift || true
cmake -S . -B "$build" -DCMAKE_BUILD_TYPE=RelWithDebInfo -DMAINSCHECK_BENCHMARKS=ON >/dev/null
cmake --build "$build" -j2 --target scale_bench mainscheck mainscheck-board-gen
"$build/benchmarks/scale_bench" --benchmark_counters_tabular=true --benchmark_filter=-peak_rss "$@"
# A process of their own: a child's ru_maxrss includes the spawning process's peak (see the bench).
"$build/benchmarks/scale_bench" --benchmark_counters_tabular=true --benchmark_filter=peak_rss

# The same memory figure from outside the process, with GNU time.
if [ -x /usr/bin/time ]; then
  board="$build/benchmarks/boards/board-1000000.cir"
  [ -s "$board" ] || "$build/mainscheck-board-gen" -n 1000000 -o "$board"
  size=$(stat -c %s "$board")
  rss_kb=$( { /usr/bin/time -f '%M' "$build/mainscheck" check "$board" >/dev/null 2>/dev/null; } 2>&1 | tail -1 || true)
  python3 - "$size" "$rss_kb" <<'PY'
import sys
size, rss_kb = int(sys.argv[1]), int(sys.argv[2])
file_mb, rss_mb = size / 1e6, rss_kb * 1024 / 1e6
goal = 2 * file_mb + 50
print(f"mainscheck check, 1M parts: file {file_mb:.1f} MB, peak RSS {rss_mb:.0f} MB, "
      f"goal {goal:.0f} MB (2x file + 50 MB): {rss_mb / goal:.2f}x the goal")
PY
fi
