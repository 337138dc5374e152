#!/usr/bin/env bash
# Set-up and the main job on the bundled sample: install, build, then plan the
# sample welding job; its outputs land in out/bracket-welds/.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
bash "$root/scripts/build.sh"
cd "$root"
build/planner/cli/tracewright plan samples/jobs/bracket_welds.xml
echo "open out/bracket-welds/bracket_welds_report.html in a browser to review the path"
