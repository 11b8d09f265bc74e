#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Second README command: install what is missing, build everything, run every test.
set -euo pipefail
cd "$(dirname "$0")/.."

bash scripts/install-deps.sh
bash scripts/build.sh quietrail quietrail_tests
cd build
ctest --output-on-failure -j"$(nproc 2>/dev/null || echo 2)"
