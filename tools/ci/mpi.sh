#!/usr/bin/env bash
# CI step: builds standfast with MPI (Open MPI, -DSTANDFAST_MPI=ON, in build-mpi/) and checks that
# `mpirun -np 2` prints byte for byte what one process prints with the same seed, for a fixed
# number of seasons and for a run that stops early (--target-se). About two minutes on 2 cores.
set -euo pipefail
cd "$(dirname "$0")/../.."
packages=(libopenmpi-dev openmpi-bin)
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if ((${#missing[@]})); then
  sudo_cmd=()
  [ "$(id -u)" -eq 0 ] || sudo_cmd=(sudo)
  "${sudo_cmd[@]}" apt-get update >&2
  DEBIAN_FRONTEND=noninteractive "${sudo_cmd[@]}" apt-get install -y "${missing[@]}" >&2
fi
build=${STANDFAST_MPI_BUILD_DIR:-build-mpi}
cmake -S . -B "$build" -DCMAKE_BUILD_TYPE=Release -DSTANDFAST_MPI=ON -DBUILD_TESTING=OFF \
  ${STANDFAST_CMAKE_ARGS:-} >/dev/null
cmake --build "$build" -j "$(nproc)" --target standfast >&2
bin="$build/tools/standfast"
export OMPI_ALLOW_RUN_AS_ROOT=1 OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1
mpirun=(mpirun --allow-run-as-root --oversubscribe)
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
for args in "--seasons 20000" "--seasons 400000 --target-se 0.004"; do
  # shellcheck disable=SC2086
  "$bin" odds scenarios/demo/season.yaml $args --threads 2 --format json >"$tmp/one.json"
  # shellcheck disable=SC2086
  "${mpirun[@]}" -np 2 "$bin" odds scenarios/demo/season.yaml $args --threads 1 --format json \
    >"$tmp/two.json"
  if ! cmp -s "$tmp/one.json" "$tmp/two.json"; then
    echo "mpi.sh: 2 ranks differ from one process for: $args" >&2
    diff "$tmp/one.json" "$tmp/two.json" | head -20 >&2
    exit 1
  fi
  echo "mpi.sh: 2 ranks = 1 process, byte for byte ($args)" >&2
done
