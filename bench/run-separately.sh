#!/usr/bin/env bash
# Runs every case of a Google Benchmark program in a process of its own, so that no case
# inherits the heap another left behind (glibc moves its mmap threshold after large frees,
# which changed york/100000 by 5x depending on what ran before it).
#
# usage: bench/run-separately.sh PROGRAM [FILTER] [-- more benchmark options]
#   e.g. bench/run-separately.sh build/release/bench/FitBenchmark 'fitReadings|gsl|sum'
# Prints one console line per case (the program's own format, context header once).
set -euo pipefail
if [ $# -lt 1 ]; then
    sed -n '2,9p' "$0" >&2
    exit 2
fi
program=$1
shift
filter=.
if [ $# -gt 0 ] && [ "$1" != "--" ]; then
    filter=$1
    shift
fi
[ "${1:-}" = "--" ] && shift
mapfile -t cases < <("$program" --benchmark_list_tests=true --benchmark_filter="$filter")
if [ ${#cases[@]} -eq 0 ]; then
    echo "run-separately: no case of $program matches '$filter'" >&2
    exit 2
fi
first=1
for name in "${cases[@]}"; do
    # Exact match: escape the regular-expression characters a case name can hold.
    pattern="^$(printf '%s' "$name" | sed 's/[][\.*^$+?(){}|]/\\&/g')\$"
    if [ $first -eq 1 ]; then
        "$program" --benchmark_filter="$pattern" "$@" 2>&1
        first=0
    else
        "$program" --benchmark_filter="$pattern" "$@" 2>/dev/null | sed -n '/^-\{10,\}/,$p' | sed '1,3d'
    fi
done
