#!/usr/bin/env bash
# Checks the include lines of the project's modules against the layering of
# DEVELOPERS.md: a file may include only files of its own layer or of a layer
# below it. Prints every offending file:line and exits 1; exits 0 when clean.
#
#   0 kinematics/common   helpers every module uses
#   1 kinematics
#   2 collision
#   3 planner/program     the program model
#   4 planner             (all of planner/ but program/ and cli/)
#   5 postproc
#   6 planner/cli         the commands
#
# Usage: scripts/check_layering.sh [ROOT]   (default: the repository root)
set -euo pipefail
root="${1:-$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)}"
cd "$root"

layer_of() {
  case "$1" in
    kinematics/common/*) echo 0 ;;
    kinematics/*) echo 1 ;;
    collision/*) echo 2 ;;
    planner/program/*) echo 3 ;;
    planner/cli/*) echo 6 ;;
    planner/*) echo 4 ;;
    postproc/*) echo 5 ;;
    *) echo "" ;;
  esac
}

violations=0
checked=0
while IFS= read -r file; do
  checked=$((checked + 1))
  from=$(layer_of "$file")
  while IFS=: read -r line included; do
    to=$(layer_of "$included")
    if [ -n "$to" ] && [ "$to" -gt "$from" ]; then
      echo "$file:$line: includes \"$included\" (layer $to) from layer $from; see the layering in DEVELOPERS.md"
      violations=$((violations + 1))
    fi
  done < <(grep -n '^[[:space:]]*#[[:space:]]*include[[:space:]]*"' "$file" |
           sed -E 's/^([0-9]+):[[:space:]]*#[[:space:]]*include[[:space:]]*"([^"]+)".*/\1:\2/')
done < <(find kinematics collision planner postproc -type f \( -name '*.hpp' -o -name '*.cpp' \) | sort)

if [ "$checked" -eq 0 ]; then
  echo "check_layering: no source files found under $root" >&2
  exit 2
fi
if [ "$violations" -gt 0 ]; then
  echo "check_layering: $violations include(s) against the layering in $checked files" >&2
  exit 1
fi
echo "check_layering: $checked files, includes follow the layering"
