#!/usr/bin/env bash
# The README's test command: installs what is missing, builds with warnings as errors,
# runs every test through ctest, saves screenshots of the window, then the core tests again under ASan + UBSan.
set -euo pipefail
cd "$(dirname "$0")/.."

scripts/install-deps.sh

cmake --preset ci
cmake --build --preset ci
ctest --preset ci
# The long run in simulated time (100 000 readings with faults), about a minute.
ctest --preset soak
# The main window after a demo sweep, light and dark, for people to look at (build/ci/screenshots).
cmake --build --preset ci --target screenshots

cmake --preset asan-ubsan
cmake --build --preset asan-ubsan
ctest --preset asan-ubsan

# libFuzzer targets (clang), each run for about 30 s under the ctest label "fuzz".
scripts/fuzz.sh
