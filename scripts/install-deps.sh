#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Installs the Debian packages quietrail needs, only those that are missing.
# Runs apt-get update at most once. Needs root (or sudo) when anything is missing.
set -euo pipefail

packages=(
  build-essential cmake pkg-config
  libeigen3-dev nlohmann-json3-dev libfmt-dev libboost-graph-dev
  catch2 libcli11-dev
  ngspice   # independent AC reference for the tests
  chromium  # headless browser for the HTML report render test
)

missing=()
for p in "${packages[@]}"; do
  if ! dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed"; then
    missing+=("$p")
  fi
done

if [ ${#missing[@]} -eq 0 ]; then
  echo "install-deps: all packages present"
  exit 0
fi

sudo_cmd=()
if [ "$(id -u)" -ne 0 ]; then
  if command -v sudo >/dev/null 2>&1; then sudo_cmd=(sudo); else
    echo "install-deps: missing ${missing[*]}; run this script as root" >&2; exit 1
  fi
fi

echo "install-deps: installing ${missing[*]}"
export DEBIAN_FRONTEND=noninteractive
"${sudo_cmd[@]}" apt-get update
"${sudo_cmd[@]}" apt-get install -y --no-install-recommends "${missing[@]}"
