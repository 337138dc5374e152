#!/usr/bin/env bash
# The layering check passes on the tree as it is, and fails, naming the file
# and line, on a copy of the tree with one include planted against the order
# (collision including the planner) and on one with a cycle-making include
# (the program model including a post-processor).
set -euo pipefail
source_dir="$1"
scratch="$2/layering"
check="$source_dir/scripts/check_layering.sh"

bash "$check" "$source_dir"

plant() {  # plant <file> <include>: a fresh copy of the modules, one include added
  rm -rf "$scratch"
  mkdir -p "$scratch"
  cp -r "$source_dir/kinematics" "$source_dir/collision" "$source_dir/planner" "$source_dir/postproc" "$scratch/"
  printf '#include "%s"\n' "$2" >> "$scratch/$1"
  wc -l < "$scratch/$1" | tr -d ' '
}

expect_failure() {  # expect_failure <file> <line>
  set +e
  output=$(bash "$check" "$scratch" 2>&1)
  status=$?
  set -e
  if [ "$status" -ne 1 ]; then
    echo "FAILED: the planted include in $1 was not caught (exit $status): $output"
    exit 1
  fi
  if ! grep -q "^$1:$2: " <<<"$output"; then
    echo "FAILED: the report does not name $1:$2: $output"
    exit 1
  fi
  echo "caught: $(grep "^$1:$2: " <<<"$output")"
}

line=$(plant collision/collision_world.cpp planner/seam/seam_solver.hpp)
expect_failure collision/collision_world.cpp "$line"
line=$(plant planner/program/program.cpp postproc/post_processor.hpp)
expect_failure planner/program/program.cpp "$line"
line=$(plant kinematics/common/number_text.cpp kinematics/arm_model.hpp)
expect_failure kinematics/common/number_text.cpp "$line"
rm -rf "$scratch"
echo "1 passed, 0 failed"
