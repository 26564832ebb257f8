#!/usr/bin/env bash
# The README's run command: installs what is missing, builds, and opens the desktop app with a
# sweep on the virtual bench. Without a display it says so in one line and runs the headless
# demo sweep on the virtual bench instead, printing where the session and its report went.
set -euo pipefail
cd "$(dirname "$0")/.."

scripts/install-deps.sh
cmake --preset dev >/dev/null
cmake --build --preset dev

if [ -n "${DISPLAY:-}" ] || [ -n "${WAYLAND_DISPLAY:-}" ]; then
    exec build/dev/app/gui/sagline --demo "$@"
fi

echo "run.sh: no display (DISPLAY and WAYLAND_DISPLAY are unset), so no window: running the headless demo sweep on the virtual bench instead."
out=build/dev/demo
mkdir -p "$out"
session="$out/demo-$(date -u +%Y%m%d-%H%M%S).sagline"
report="${session%.sagline}.pdf"
status=0
build/dev/app/cli/sagline-cli run resources/demo-setup.json --sim -o "$session" || status=$?
if [ -f "$session" ]; then
    QT_QPA_PLATFORM=offscreen build/dev/app/cli/sagline-cli report "$session" -o "$report"
    echo "session: $session"
    echo "report:  $report"
fi
exit "$status"
