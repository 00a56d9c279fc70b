#!/usr/bin/env bash
# Set-up on a fresh Debian 12 machine: installs the Debian packages standfast needs (when
# missing), then configures and builds into build/. Safe to run again; it only does what is
# missing. Used by tools/demo.sh, tools/test.sh and .ci/run.
set -euo pipefail
cd "$(dirname "$0")/.."

packages=(build-essential cmake libtbb-dev libboost-math-dev libboost-graph-dev libyaml-cpp-dev
          libpcg-cpp-dev catch2 libcli11-dev nlohmann-json3-dev libfmt-dev python3 python3-scipy
          python3-numpy)
packages+=(libeigen3-dev)  # sparse Cholesky factorisation of the joint fit (models/joint_fit.cpp)
packages+=(libsqlite3-dev sqlite3)  # the odds history (tools/history.h) and its tests
packages+=(chromium)  # headless browser of the report page test (tests/browser/check_report.py)
packages+=(libssl-dev)  # OpenSSL's SHA-256 for the provenance of every report
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if ((${#missing[@]})); then
  echo "setup: installing ${missing[*]}" >&2
  sudo_cmd=()
  [ "$(id -u)" -eq 0 ] || sudo_cmd=(sudo)
  "${sudo_cmd[@]}" apt-get update >&2
  DEBIAN_FRONTEND=noninteractive "${sudo_cmd[@]}" apt-get install -y "${missing[@]}" >&2
fi

build_dir=${STANDFAST_BUILD_DIR:-build}
# Build messages go to stderr so that the output of tools/demo.sh can be piped or redirected.
cmake -S . -B "$build_dir" -DCMAKE_BUILD_TYPE=Release ${STANDFAST_CMAKE_ARGS:-} >/dev/null
cmake --build "$build_dir" -j "$(nproc)" >&2
