#!/usr/bin/env bash
# The README's run command: installs what is missing, builds, and runs the main job.
set -euo pipefail
cd "$(dirname "$0")/.."

scripts/install-deps.sh
cmake --preset dev >/dev/null
cmake --build --preset dev

build/dev/app/cli/sagline-cli plan resources/demo-setup.json
