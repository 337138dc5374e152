#!/usr/bin/env bash
# The whole test suite again under AddressSanitizer and UBSan (build-asan/).
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
bash "$root/scripts/install_deps.sh"
cmake -S "$root" -B "$root/build-asan" -DCMAKE_BUILD_TYPE=RelWithDebInfo -DTW_SANITIZE=ON \
  -DTW_BUILD_BENCHMARKS=OFF
cmake --build "$root/build-asan" -j2
ASAN_OPTIONS=detect_leaks=1 UBSAN_OPTIONS=print_stacktrace=1 \
  ctest --test-dir "$root/build-asan" --output-on-failure -j2
