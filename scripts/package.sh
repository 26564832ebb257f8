#!/usr/bin/env bash
# Builds the Debian package: installs what is missing, builds the release preset, and writes
# build/package/sagline_<version>_<arch>.deb (install it with `sudo apt install ./build/package/sagline_*.deb`).
set -euo pipefail
cd "$(dirname "$0")/.."

scripts/install-deps.sh
cmake --preset release >/dev/null
cmake --build --preset release
cpack --config build/release/CPackConfig.cmake -B build/package
ls -l build/package/*.deb
