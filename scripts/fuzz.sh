#!/usr/bin/env bash
# Builds the libFuzzer targets with clang (core instrumented for coverage, ASan and UBSan) in
# build/fuzz and runs each for SAGLINE_FUZZ_SECONDS (default 30) under the ctest label "fuzz".
# A crash leaves crash-<hash> in build/fuzz: turn it into a regression test (DEVELOPERS.md).
set -euo pipefail
cd "$(dirname "$0")/.."
seconds="${SAGLINE_FUZZ_SECONDS:-30}"
flags="-fsanitize=fuzzer-no-link,address,undefined -fno-omit-frame-pointer -fno-sanitize-recover=all"
CC=clang CXX=clang++ cmake -S . -B build/fuzz -G Ninja \
    -DCMAKE_BUILD_TYPE=RelWithDebInfo \
    -DSAGLINE_FUZZERS=ON -DSAGLINE_CORE_ONLY=ON -DSAGLINE_BENCHMARKS=OFF \
    -DSAGLINE_FUZZ_SECONDS="$seconds" \
    -DCMAKE_C_FLAGS="$flags" -DCMAKE_CXX_FLAGS="$flags"
cmake --build build/fuzz -j 2
ctest --test-dir build/fuzz -L fuzz --output-on-failure
