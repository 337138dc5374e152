#!/usr/bin/env bash
# Set-up and the main job on the bundled sample: install, build, then run the
# tool on the sample arm. Until the planner lands this lists every IK branch
# for a torch pose over the sample work table and checks one configuration.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
bash "$root/scripts/build.sh"
tool="$root/build/planner/cli/tracewright"
arm="$root/samples/arms/weld_arm_1400.xml"
echo
echo "== every branch reaching a torch pose 1100 mm out, 600 mm up, torch pointing down =="
"$tool" reach "$arm" --position 1100,150,600 --rpy 0,180,0
echo
echo "== flange pose and margins of one configuration =="
"$tool" pose "$arm" --joints 7.765,33.73,69.436,0,76.834,7.765
