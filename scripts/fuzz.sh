#!/usr/bin/env bash
# Builds the libFuzzer targets with clang and runs each for SECONDS (default 60) on its seed corpus.
#   scripts/fuzz.sh [SECONDS]
set -euo pipefail
cd "$(dirname "$0")/.."
secs="${1:-60}"
command -v clang++ >/dev/null || apt-get install -y -qq clang libclang-rt-14-dev
cmake -S . -B build-fuzz -DCMAKE_CXX_COMPILER=clang++ -DMAINSCHECK_FUZZ=ON -DMAINSCHECK_TESTS=OFF >/dev/null
cmake --build build-fuzz -j"$(nproc)" --target spice_number_fuzz expression_fuzz
for t in spice_number_fuzz expression_fuzz; do
  mkdir -p "build-fuzz/corpus-$t"
  "build-fuzz/fuzz/$t" -max_total_time="$secs" -print_final_stats=1 "build-fuzz/corpus-$t" "fuzz/corpus/${t%_fuzz}" || exit 1
done
