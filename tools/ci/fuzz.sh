#!/usr/bin/env bash
# CI: libFuzzer (Debian clang 14) on the season-file loader and the games CSV reader, built with
# AddressSanitizer and UndefinedBehaviorSanitizer. Each target runs for FUZZ_SECONDS (default
# 60) from the corpus in tests/fuzz/corpus/, then the corpus is replayed input by input. A crash,
# a leak, a hang of more than 10 s on one input or more than 2 GiB of memory fails the step and
# leaves the input in build-fuzz/artifacts/ (add it to the corpus once fixed). The fuzzer's own
# random seed is fixed (FUZZ_SEED, default 1) so that a CI run is repeatable. Prints the
# executions of each target.
set -euo pipefail
cd "$(dirname "$0")/../.."
seconds=${FUZZ_SECONDS:-60}

need=()
command -v clang++-14 >/dev/null || need+=(clang-14)
dpkg-query -W -f='${Status}' libclang-rt-14-dev 2>/dev/null | grep -q "install ok installed" ||
  need+=(libclang-rt-14-dev)
if ((${#need[@]})); then
  sudo_cmd=()
  [ "$(id -u)" -eq 0 ] || sudo_cmd=(sudo)
  "${sudo_cmd[@]}" apt-get update >&2
  DEBIAN_FRONTEND=noninteractive "${sudo_cmd[@]}" apt-get install -y "${need[@]}" >&2
fi

flags="-fsanitize=address,undefined,fuzzer-no-link -fno-sanitize-recover=undefined"
cmake -S . -B build-fuzz -DCMAKE_CXX_COMPILER=clang++-14 -DCMAKE_BUILD_TYPE=RelWithDebInfo \
  -DBUILD_TESTING=OFF -DSTANDFAST_FUZZ=ON -DCMAKE_CXX_FLAGS="$flags" \
  -DCMAKE_EXE_LINKER_FLAGS="-fsanitize=address,undefined" >/dev/null
cmake --build build-fuzz -j "${FUZZ_JOBS:-$(nproc)}" --target season_fuzz games_csv_fuzz >&2

mkdir -p build-fuzz/artifacts
for target in season games_csv; do
  program=build-fuzz/tests/fuzz/${target}_fuzz
  work=build-fuzz/corpus-$target  # new inputs found in this run; the repository's stay as they are
  mkdir -p "$work"
  "$program" -seed="${FUZZ_SEED:-1}" -max_total_time="$seconds" -max_len=65536 -timeout=10 -rss_limit_mb=2048 \
    -artifact_prefix=build-fuzz/artifacts/ -dict=tests/fuzz/$target.dict -print_final_stats=1 \
    "$work" "tests/fuzz/corpus/$target" 2>"build-fuzz/$target.log" ||
    { tail -50 "build-fuzz/$target.log"; exit 1; }
  runs=$(grep -o 'stat::number_of_executed_units: *[0-9]*' "build-fuzz/$target.log" | grep -o '[0-9]*$')
  echo "fuzz: $target: $runs executions in $seconds s, no crash"
  # Replay: every corpus input once (libFuzzer runs the files it is given as arguments).
  "$program" -runs=1 tests/fuzz/corpus/$target/* 2>"build-fuzz/$target-replay.log" ||
    { tail -50 "build-fuzz/$target-replay.log"; exit 1; }
  echo "fuzz: $target: corpus of $(ls tests/fuzz/corpus/$target | wc -l) inputs replayed"
done
