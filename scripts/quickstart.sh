#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# First README command: install what is missing, build the tool, run the main job (plan a
# rail's decoupling from its target and a part library) on a shipped example, re-check the
# answer as a BOM, and say where the reports went.
set -euo pipefail
cd "$(dirname "$0")/.."

bash scripts/install-deps.sh
bash scripts/build.sh quietrail

example=examples/projects/decade_rail_plan.json
out=out/decade_rail_plan
echo "quickstart: planning ${example}"
# Exit 1 means "no selection meets the target": a finished plan, not a failure of this script.
status=0
./build/quietrail plan "${example}" --out "${out}" || status=$?
if [ "${status}" -gt 1 ]; then
  echo "quickstart: the plan could not run (exit ${status})" >&2
  exit "${status}"
fi
if [ "${status}" -eq 0 ]; then
  echo "quickstart: checking the planned BOM (${out}/decade_rail_plan_planned.json)"
  ./build/quietrail check "${out}/decade_rail_plan_planned.json" --out "${out}/check" >/dev/null
  echo "quickstart: the planned BOM meets the target (check exit 0)"
fi
echo "quickstart: open $(pwd)/${out}/decade_rail_plan_report.html (plan JSON, planned project, BOM CSV, SVG and CSV beside it)"
