#!/usr/bin/env bash
# Wall time and peak memory of the demo job end to end, and again after the
# fixture move (bar: <= 2 s each on 2 cores). Needs a build (scripts/build.sh).
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$root"
for job in samples/jobs/bracket_welds.xml samples/jobs/bracket_welds_moved.xml; do
  echo "== $job"
  /usr/bin/time -v build/planner/cli/tracewright plan "$job" --threads 2 > /dev/null 2> /tmp/tracewright_time.txt
  grep -E "Elapsed \(wall clock\)|Maximum resident set size" /tmp/tracewright_time.txt
done
