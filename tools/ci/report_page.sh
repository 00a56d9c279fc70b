#!/usr/bin/env bash
# CI step: the report page in headless Chromium (tests/report_page_test.cpp with
# tests/browser/check_report.py). Installs Chromium when missing, then runs that test alone with
# a time limit; unlike the plain test run, a missing browser is a failure here, not a skip.
set -euo pipefail
cd "$(dirname "$0")/../.."
if ! command -v chromium >/dev/null; then
  sudo_cmd=()
  [ "$(id -u)" -eq 0 ] || sudo_cmd=(sudo)
  "${sudo_cmd[@]}" apt-get update
  DEBIAN_FRONTEND=noninteractive "${sudo_cmd[@]}" apt-get install -y chromium
fi
build_dir=${STANDFAST_BUILD_DIR:-build}
cmake --build "$build_dir" -j "$(nproc)" --target standfast report_page_test >&2
timeout 600 ctest --test-dir "$build_dir" -R '^report_page_test$' --timeout 300 --output-on-failure
# The run leaves its screenshots here for a look.
ls -l "$build_dir"/report_page_test/browser/shots/*.png
