#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# First README command: install what is missing, build the tool, run the main job on
# the shipped example rail and say where the report went.
set -euo pipefail
cd "$(dirname "$0")/.."

bash scripts/install-deps.sh
bash scripts/build.sh quietrail

example=examples/projects/core_rail_network.json
out=out/core_rail_network
echo "quickstart: sweeping ${example}"
./build/quietrail sweep "${example}" --out "${out}"
echo "quickstart: report files are in $(pwd)/${out}/"
