#!/usr/bin/env bash
# Builds the libFuzzer targets with clang (core instrumented for coverage, ASan and UBSan) in
# build/fuzz and runs each under the ctest label "fuzz".
#   scripts/fuzz.sh            the repeatable run (what the README's test command runs): a fixed
#                              seed and SAGLINE_FUZZ_RUNS inputs per target (default 200 000), so
#                              it passes or fails the same way on a fast or a loaded machine.
#   scripts/fuzz.sh --explore  a new seed each run, no input cap, SAGLINE_FUZZ_SECONDS per target
#                              (default 300): looks further; run it by hand, not in CI.
# A crash leaves crash-<hash> in build/fuzz: turn it into a regression test (DEVELOPERS.md).
set -euo pipefail
cd "$(dirname "$0")/.."
if [ "${1:-}" = "--explore" ]; then
    seconds="${SAGLINE_FUZZ_SECONDS:-300}"
    runs=-1
    seed=0
else
    seconds="${SAGLINE_FUZZ_SECONDS:-60}"
    runs="${SAGLINE_FUZZ_RUNS:-200000}"
    seed=1
fi
flags="-fsanitize=fuzzer-no-link,address,undefined -fno-omit-frame-pointer -fno-sanitize-recover=all"
CC=clang CXX=clang++ cmake -S . -B build/fuzz -G Ninja \
    -DCMAKE_BUILD_TYPE=RelWithDebInfo \
    -DSAGLINE_FUZZERS=ON -DSAGLINE_CORE_ONLY=ON -DSAGLINE_BENCHMARKS=OFF \
    -DSAGLINE_FUZZ_SECONDS="$seconds" -DSAGLINE_FUZZ_RUNS="$runs" -DSAGLINE_FUZZ_SEED="$seed" \
    -DCMAKE_C_FLAGS="$flags" -DCMAKE_CXX_FLAGS="$flags"
cmake --build build/fuzz -j 2
ctest --test-dir build/fuzz -L fuzz --output-on-failure
