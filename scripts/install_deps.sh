#!/usr/bin/env bash
# Installs the Debian packages the build needs, when any is missing.
# Runs as root on the project's machines; uses sudo only when not root.
set -euo pipefail

packages=(
  build-essential cmake pkg-config time
  libeigen3-dev libtinyxml2-dev libcli11-dev nlohmann-json3-dev
  libfcl-dev libassimp-dev nettle-dev
  libompl-dev libboost-serialization-dev libboost-filesystem-dev libboost-system-dev
  catch2 libbenchmark-dev liborocos-kdl-dev
)

missing=()
for package in "${packages[@]}"; do
  if ! dpkg-query -W -f='${Status}' "$package" 2>/dev/null | grep -q "install ok installed"; then
    missing+=("$package")
  fi
done

if [ ${#missing[@]} -eq 0 ]; then
  exit 0
fi

as_root=()
if [ "$(id -u)" -ne 0 ]; then
  as_root=(sudo)
fi
echo "installing: ${missing[*]}" >&2
"${as_root[@]}" apt-get update
DEBIAN_FRONTEND=noninteractive "${as_root[@]}" apt-get install -y --no-install-recommends "${missing[@]}"
