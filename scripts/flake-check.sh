#!/usr/bin/env bash
# Runs the whole ctest suite ROUNDS times (default 10) with -j4 and a CPU hog beside it (one
# busy loop per core), then lists every test that failed in any round with how often. A test
# that fails once in ten rounds is a defect. Slow (ROUNDS times the suite), so it is not part
# of scripts/test.sh or CI; run it after changing anything that waits on the wall clock.
#
# usage: scripts/flake-check.sh [--rounds N] [--build-dir DIR] [--jobs N] [--no-hog] [-- CTEST_ARGS...]
#   The package install test (it installs system-wide with dpkg) is always left out.
#   Logs: DIR/flake-check/round-K.log. Exit status: 0 when every round passed, 1 otherwise.
set -uo pipefail
cd "$(dirname "$0")/.."

rounds=10
build_dir=build/ci
jobs=4
hog=1
extra=()
while [ $# -gt 0 ]; do
    case "$1" in
        --rounds) rounds=$2; shift 2 ;;
        --build-dir) build_dir=$2; shift 2 ;;
        --jobs) jobs=$2; shift 2 ;;
        --no-hog) hog=0; shift ;;
        --) shift; extra=("$@"); break ;;
        -h|--help) sed -n '2,10p' "$0" | sed 's/^# \{0,1\}//'; exit 0 ;;
        *) echo "flake-check: unknown argument '$1' (see --help)" >&2; exit 2 ;;
    esac
done
[[ "$rounds" =~ ^[1-9][0-9]*$ ]] || { echo "flake-check: --rounds must be a whole number from 1" >&2; exit 2; }
[ -f "$build_dir/CTestTestfile.cmake" ] || { echo "flake-check: no ctest tree in $build_dir (build it first)" >&2; exit 2; }

log_dir="$build_dir/flake-check"
rm -rf "$log_dir"
mkdir -p "$log_dir"

hog_pids=()
stop_hog() {
    for pid in "${hog_pids[@]}"; do
        kill "$pid" 2>/dev/null
    done
    for pid in "${hog_pids[@]}"; do
        wait "$pid" 2>/dev/null
    done
    hog_pids=()
}
trap stop_hog EXIT INT TERM
if [ "$hog" = 1 ]; then
    for _ in $(seq "$(nproc)"); do
        ( while :; do :; done ) &
        hog_pids+=("$!")
    done
    echo "flake-check: CPU hog: ${#hog_pids[@]} busy loops (pids ${hog_pids[*]})"
fi

declare -A failures=()
started=$(date +%s)
for round in $(seq "$rounds"); do
    log="$log_dir/round-$round.log"
    round_start=$(date +%s)
    ctest --test-dir "$build_dir" -j "$jobs" --output-on-failure -E 'Package\.InstallsRunsAndRemovesCleanly' \
        "${extra[@]}" >"$log" 2>&1
    status=$?
    failed=$(sed -n 's/^[[:space:]]*[0-9]\+ - \(.*\) (\(Failed\|Timeout\|SEGFAULT\|Subprocess aborted\|Exception\|Child aborted\|Not Run\).*/\1/p' "$log")
    summary=$(grep -E '^[0-9]+% tests passed' "$log" || echo "no summary (ctest exit $status)")
    echo "round $round/$rounds: $summary ($(( $(date +%s) - round_start )) s)"
    for name in $failed; do
        failures[$name]=$(( ${failures[$name]:-0} + 1 ))
        echo "    failed: $name"
    done
    if [ -z "$failed" ] && [ "$status" -ne 0 ]; then
        failures["(ctest exit $status, see $log)"]=1
    fi
done
stop_hog

echo "flake-check: $rounds rounds in $(( $(date +%s) - started )) s, -j$jobs, hog $([ "$hog" = 1 ] && echo on || echo off)"
if [ ${#failures[@]} -eq 0 ]; then
    echo "flake-check: no test failed in any round"
    exit 0
fi
echo "flake-check: tests that failed at least once (failures/rounds):"
for name in "${!failures[@]}"; do
    echo "  ${failures[$name]}/$rounds  $name"
done | sort -rn
exit 1
