#!/usr/bin/env bash
# The whole test suite under AddressSanitizer + UndefinedBehaviorSanitizer, in build-asan/.
# Run after ./setup.sh (which installs the dependencies). Not part of .ci/run yet: a second full build
# doubles CI time on 2 cores (docs/limits.md).
set -euo pipefail
cd "$(dirname "$0")/.."
cmake -S . -B build-asan -DCMAKE_BUILD_TYPE=Debug -DMAINSCHECK_SANITIZE=ON -DMAINSCHECK_WERROR=ON >/dev/null
cmake --build build-asan -j"$(nproc)"
ASAN_OPTIONS=detect_leaks=1:abort_on_error=1 UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 \
  ctest --test-dir build-asan --output-on-failure -j"$(nproc)"
