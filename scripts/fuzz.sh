#!/usr/bin/env bash
# Builds the libFuzzer targets with clang (build-fuzz/) and runs each, one after another, on its
# seed corpus for a given time or number of executions, in one process each (the machine is shared).
#   scripts/fuzz.sh [-t SECONDS | -r RUNS] [TARGET...]
# Default: 60 s each for every target. Targets: spice_number_fuzz expression_fuzz spice_reader_fuzz
# xml_reader_fuzz check_pipeline_fuzz. New corpus entries go to build-fuzz/corpus-TARGET, crash/
# leak/timeout inputs to build-fuzz/artifacts-TARGET/ (the script stops at the first finding).
# Extra libFuzzer flags come from FUZZ_FLAGS, e.g. FUZZ_FLAGS=-entropic=0 (docs/robustness.md).
set -euo pipefail
cd "$(dirname "$0")/.."
limit=(-max_total_time=60)
while getopts "t:r:" opt; do
  case "$opt" in
    t) limit=(-max_total_time="$OPTARG") ;;
    r) limit=(-runs="$OPTARG") ;;
    *) sed -n '2,9p' "$0"; exit 64 ;;
  esac
done
shift $((OPTIND - 1))
all=(spice_number_fuzz expression_fuzz spice_reader_fuzz xml_reader_fuzz check_pipeline_fuzz)
targets=("${@:-${all[@]}}")
command -v clang++ >/dev/null || apt-get install -y -qq clang libclang-rt-14-dev
launcher=()
command -v ccache >/dev/null && launcher=(-DCMAKE_CXX_COMPILER_LAUNCHER=ccache)
cmake -S . -B build-fuzz -DCMAKE_CXX_COMPILER=clang++ -DMAINSCHECK_FUZZ=ON -DMAINSCHECK_TESTS=OFF "${launcher[@]}" >/dev/null
cmake --build build-fuzz -j"$(nproc)" --target "${targets[@]}"

# Longest input per target: numbers and expressions are short; decks are small so each execution
# stays fast (the pipeline solves every input).
max_len() {
  case "$1" in
    spice_number_fuzz) echo 64 ;;
    expression_fuzz) echo 512 ;;
    spice_reader_fuzz | xml_reader_fuzz) echo 8192 ;;
    check_pipeline_fuzz) echo 4096 ;;
  esac
}
seeds() {
  case "$1" in
    spice_number_fuzz) echo fuzz/corpus/spice_number ;;
    expression_fuzz) echo fuzz/corpus/expression ;;
    spice_reader_fuzz) echo fuzz/corpus/spice_reader build-fuzz/fuzz/seeds/spice ;;
    xml_reader_fuzz) echo fuzz/corpus/xml_reader build-fuzz/fuzz/seeds/xml ;;
    check_pipeline_fuzz) echo fuzz/corpus/check_pipeline build-fuzz/fuzz/seeds/pipeline ;;
  esac
}
for t in "${targets[@]}"; do
  mkdir -p "build-fuzz/corpus-$t" "build-fuzz/artifacts-$t"
  # shellcheck disable=SC2046
  "build-fuzz/fuzz/$t" "${limit[@]}" -max_len="$(max_len "$t")" -timeout=10 -rss_limit_mb=2048 \
    -print_final_stats=1 -artifact_prefix="build-fuzz/artifacts-$t/" ${FUZZ_FLAGS:-} \
    "build-fuzz/corpus-$t" $(seeds "$t") || exit 1
done
