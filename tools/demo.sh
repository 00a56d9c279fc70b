#!/usr/bin/env bash
# Builds standfast (installing what is missing) and prints the postseason odds of the invented
# demo league. Extra arguments go to `standfast odds`.
set -euo pipefail
cd "$(dirname "$0")/.."
tools/setup.sh
"${STANDFAST_BUILD_DIR:-build}"/tools/standfast odds scenarios/demo/season.yaml "$@"
