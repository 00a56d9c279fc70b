#!/usr/bin/env bash
# Builds standfast (installing what is missing) and runs the whole test suite.
set -euo pipefail
cd "$(dirname "$0")/.."
tools/setup.sh
ctest --test-dir "${STANDFAST_BUILD_DIR:-build}" --output-on-failure -j "$(nproc)" "$@"
