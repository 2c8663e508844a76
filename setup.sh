#!/usr/bin/env bash
# Installs mainscheck's dependencies from Debian's packages, builds it, and with `test` runs the whole
# test suite. Meant for a fresh Debian 12 machine, run as root (or with sudo available).
#   ./setup.sh          install dependencies and build into build/
#   ./setup.sh test     the same, with warnings as errors, then run every test (what CI runs)
set -euo pipefail
cd "$(dirname "$0")"

mode="${1:-build}"
case "$mode" in
  build|test) ;;
  *) echo "usage: $0 [build|test]" >&2; exit 2 ;;
esac

packages=(
  cmake g++ make pkg-config
  libboost-dev libpugixml-dev libspdlog-dev libfmt-dev libcli11-dev nlohmann-json3-dev libeigen3-dev
  libgtest-dev libgmock-dev libbenchmark-dev
  ngspice libxml2-utils python3 python3-jsonschema chromium
)
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ "${#missing[@]}" -gt 0 ]; then
  echo "setup: installing ${missing[*]}" >&2
  sudo_cmd=()
  [ "$(id -u)" -eq 0 ] || sudo_cmd=(sudo)
  export DEBIAN_FRONTEND=noninteractive
  "${sudo_cmd[@]}" apt-get update -qq || echo "setup: apt-get update failed; trying the cached package lists" >&2
  "${sudo_cmd[@]}" apt-get install -y -qq --no-install-recommends "${missing[@]}"
fi

jobs="$(nproc)"
werror=OFF
[ "$mode" = test ] && werror=ON
cmake -S . -B build -DCMAKE_BUILD_TYPE=RelWithDebInfo -DMAINSCHECK_WERROR="$werror" >/dev/null
cmake --build build -j"$jobs"

if [ "$mode" = test ]; then
  # The full run needs every external tool: a missing one (chromium, ...) fails instead of skipping.
  MAINSCHECK_REQUIRE_TOOLS=1 ctest --test-dir build --output-on-failure -j"$jobs"
fi
