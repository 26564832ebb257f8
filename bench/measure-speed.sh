#!/usr/bin/env bash
# Every speed figure of DEVELOPERS.md "Speed, measured" (second pass) in one run: the scipy
# comparison, the fit and York benchmarks, opening sessions in the window, the startup probe,
# import of 1e6 rows, compare over 500 and 2 000 sessions, and the CLI's start-up. With --load,
# a busy loop keeps one of the two cores occupied for the whole run (the "loaded machine").
#
# usage: bench/measure-speed.sh [--build DIR] [--load] [--work DIR]
#   default build build/ci (RelWithDebInfo), work folder a fresh temporary one (removed after).
# Needs what scripts/install-deps.sh installs (python3-numpy, python3-scipy, time, linux-perf
# is optional: without perf the start-up line is skipped).
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
source_dir=$(cd "$here/.." && pwd)
build=$source_dir/build/ci
load=0
work=""
while [ $# -gt 0 ]; do
    case $1 in
        --build) build=$(cd "$2" && pwd); shift 2 ;;
        --load) load=1; shift ;;
        --work) work=$2; shift 2 ;;
        *) sed -n '2,10p' "$0" >&2; exit 2 ;;
    esac
done
cli=$build/app/cli/sagline-cli
for program in "$cli" "$build/app/gui/sagline" "$build/bench/FitBenchmark" "$build/bench/UiBenchmark" \
               "$build/bench/ReviewScanBenchmark"; do
    [ -x "$program" ] || { echo "measure-speed: $program is missing: build $build first" >&2; exit 2; }
done
hog=""
own_work=0
if [ -z "$work" ]; then
    work=$(mktemp -d)
    own_work=1
fi
cleanup() {
    [ -n "$hog" ] && kill "$hog" 2>/dev/null
    [ "$own_work" = 1 ] && rm -rf "$work"
    return 0
}
trap cleanup EXIT
mkdir -p "$work"
if [ "$load" = 1 ]; then
    sh -c 'while :; do :; done' &
    hog=$!
    sleep 2
fi

echo "== measure-speed: $(date -u +%FT%TZ), $(nproc) cores, load $(cut -d' ' -f1-3 /proc/loadavg)," \
     "$([ "$load" = 1 ] && echo "one core kept busy" || echo "no added load"), commit $(git -C "$source_dir" rev-parse --short HEAD)"
echo "== data"
/usr/bin/python3 "$here/make-readings-csv.py" 100000 rising "$work/r1e5.csv" >/dev/null
/usr/bin/python3 "$here/make-readings-csv.py" 1000000 rising "$work/r1e6.csv" >/dev/null
"$cli" import "$work/r1e5.csv" --setup "$source_dir/resources/demo-setup.json" -o "$work/s1e5.sagline" --by bench >/dev/null

echo "== whole process against the scipy scripts"
"$here/compare-with-scipy.sh" --cli "$cli" --rounds 5 2>&1 | tail -n 10

echo "== fitReadings (from Readings, from columns, a session's readings via columnsToFit), GSL, the summing floor, the outputs floor, York (each case in its own process)"
"$here/run-separately.sh" "$build/bench/FitBenchmark" 'gsl|Floor|fit(Readings|Columns|SessionReadings).*/(100000|1000000)$|york' -- \
    --benchmark_repetitions=3 --benchmark_report_aggregates_only=true 2>&1 | grep -E 'median'

echo "== opening a session in the window"
QT_QPA_PLATFORM=offscreen SAGLINE_BENCH_DIR=$work "$here/run-separately.sh" "$build/bench/UiBenchmark" \
    'OpenSession/.*/(10000|100000|1000000)/' 2>&1 | grep -E '^OpenSession'

echo "== first painted frame from process start: empty window, then with the 1e5 session (3 runs)"
for _ in 1 2 3; do
    QT_QPA_PLATFORM=offscreen "$build/app/gui/sagline" --startup-probe 2>/dev/null | tail -n 1
    QT_QPA_PLATFORM=offscreen "$build/app/gui/sagline" --startup-probe "$work/s1e5.sagline" 2>/dev/null | tail -n 1
done

echo "== import of 1e6 rows (3 runs)"
for _ in 1 2 3; do
    rm -f "$work/i1e6.sagline"
    /usr/bin/time -f "import 1e6: %e s wall, %U s user, %M KB" "$cli" import "$work/r1e6.csv" \
        --setup "$source_dir/resources/demo-setup.json" -o "$work/i1e6.sagline" --by bench >/dev/null
done

echo "== compare over a folder of sessions (built once by ReviewScanBenchmark in the temp folder)"
"$here/run-separately.sh" "$build/bench/ReviewScanBenchmark" 'ScanAndCompare' 2>&1 | grep -E '^BM'
for n in 500 2000; do
    /usr/bin/time -f "compare $n sessions: %e s wall, %M KB" "$cli" compare "${TMPDIR:-/tmp}/sagline-review-bench-${n}x50" \
        --json >/dev/null
done

if command -v perf >/dev/null; then
    echo "== sagline-cli start-up"
    perf stat -r 20 "$cli" --version 2>&1 >/dev/null | grep elapsed
fi
echo "== load at the end: $(cut -d' ' -f1-3 /proc/loadavg)"
