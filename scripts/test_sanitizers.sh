#!/usr/bin/env bash
# The whole test suite again under AddressSanitizer and UBSan (build-asan/).
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
bash "$root/scripts/install_deps.sh"
cmake -S "$root" -B "$root/build-asan" -DCMAKE_BUILD_TYPE=RelWithDebInfo -DTW_SANITIZE=ON \
  -DTW_BUILD_BENCHMARKS=OFF
cmake --build "$root/build-asan" -j2
# The end-to-end tests that plan a job through the executable (names
# starting "plan " or "verify ", and the two that plan the sample and a
# circular seam before verifying them) are left out here:
# under ASan, Debian's OMPL 1.5.2 (not instrumented) trips "attempting free
# on address which was not malloc()-ed" inside
# ompl::base::ProjectionMatrix::ComputeRandom during SpaceInformation::setup()
# when planning the moved sample job. They run in the normal suite
# (scripts/test.sh), and the transit planner's own tests run here.
ASAN_OPTIONS=detect_leaks=1 UBSAN_OPTIONS=print_stacktrace=1 \
  ctest --test-dir "$root/build-asan" --output-on-failure -j2 \
  -E "^plan |^verify |verify accepts it|circular seam moves"
