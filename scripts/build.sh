#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Configure (once) and build into ./build. Arguments are target names (default: all).
# Warnings are errors when CI is set, as in the CI run.
set -euo pipefail
cd "$(dirname "$0")/.."

werror=OFF
[ -n "${CI:-}" ] && werror=ON
cmake -S . -B build -DCMAKE_BUILD_TYPE=Release -DQUIETRAIL_WERROR="${werror}" >/dev/null
jobs=$(nproc 2>/dev/null || echo 2)
if [ $# -eq 0 ]; then
  cmake --build build -j"${jobs}"
else
  for target in "$@"; do cmake --build build -j"${jobs}" --target "${target}"; done
fi
