#!/usr/bin/env bash
# The README's test command: installs what is missing, builds with warnings as errors,
# runs every test through ctest, then the core tests again under ASan + UBSan.
set -euo pipefail
cd "$(dirname "$0")/.."

scripts/install-deps.sh

cmake --preset ci
cmake --build --preset ci
ctest --preset ci

cmake --preset asan-ubsan
cmake --build --preset asan-ubsan
ctest --preset asan-ubsan

# libFuzzer targets (clang), each run for about 30 s under the ctest label "fuzz".
scripts/fuzz.sh
