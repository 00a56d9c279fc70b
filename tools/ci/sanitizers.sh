#!/usr/bin/env bash
# CI: the whole test suite built with AddressSanitizer and UndefinedBehaviorSanitizer (GCC), then
# the parallel tests (the engine's parallel run and the odds command, which runs it over several
# thread counts) built with ThreadSanitizer. Any report fails the step. Bounded: two extra builds
# (the TSan one of three targets only) and one pass of the suite; ctest stops any test after
# 20 minutes. Run after tools/setup.sh (the Debian packages must be there).
set -euo pipefail
cd "$(dirname "$0")/../.."
jobs=$(nproc)

# Build type None with our own flags: optimised (the Monte Carlo tests run long otherwise), line
# tables only (-g1) to keep the build short, assertions on.
flags="-O2 -g1 -fsanitize=address,undefined -fno-sanitize-recover=undefined -fno-omit-frame-pointer"
cmake -S . -B build-asan -DCMAKE_BUILD_TYPE=None -DSTANDFAST_WERROR=ON \
  -DCMAKE_CXX_FLAGS="$flags" -DCMAKE_EXE_LINKER_FLAGS="-fsanitize=address,undefined" >/dev/null
# The test programs and the programs they run; not the benchmarks.
targets=(standfast make_league)
for t in tests/*_test.cpp; do targets+=("$(basename "$t" .cpp)"); done
cmake --build build-asan -j "$jobs" --target "${targets[@]}" >&2
# The bad-input suite caps memory with ulimit -v, which AddressSanitizer's shadow memory cannot
# live with: STANDFAST_TEST_NO_ULIMIT turns that cap off (its time bound stays).
STANDFAST_TEST_NO_ULIMIT=1 ASAN_OPTIONS=detect_leaks=1:abort_on_error=1 \
  UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 \
  ctest --test-dir build-asan -j "$jobs" --timeout 1200 --output-on-failure

# The engine's season loop runs on std::thread here (STANDFAST_STD_THREADS, engine/parallel.h):
# the prebuilt oneTBB carries no TSan instrumentation, so TSan could not see its ordering.
cmake -S . -B build-tsan -DCMAKE_BUILD_TYPE=None -DSTANDFAST_WERROR=ON -DSTANDFAST_STD_THREADS=ON \
  -DCMAKE_CXX_FLAGS="-O2 -g1 -fsanitize=thread" -DCMAKE_EXE_LINKER_FLAGS="-fsanitize=thread" \
  >/dev/null
cmake --build build-tsan -j "$jobs" --target simulate_test odds_cli_test standfast >&2
TSAN_OPTIONS="halt_on_error=1:suppressions=$PWD/tools/ci/tsan.supp" \
  ctest --test-dir build-tsan -R '^(simulate_test|odds_cli_test)$' --timeout 1200 --output-on-failure
