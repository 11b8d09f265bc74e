#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# First README command: install what is missing, build the tool, run the main job (the
# check of a rail's BOM against its target) on a shipped example and say where the report went.
set -euo pipefail
cd "$(dirname "$0")/.."

bash scripts/install-deps.sh
bash scripts/build.sh quietrail

example=examples/projects/core_rail.json
out=out/core_rail
echo "quickstart: checking ${example}"
# Exit 1 means "target not met": a finished check, not a failure of this script.
status=0
./build/quietrail check "${example}" --out "${out}" || status=$?
if [ "${status}" -gt 1 ]; then
  echo "quickstart: the check could not run (exit ${status})" >&2
  exit "${status}"
fi
echo "quickstart: open $(pwd)/${out}/core_rail_report.html (JSON, CSV and SVG beside it)"
