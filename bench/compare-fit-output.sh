#!/usr/bin/env bash
# Golden comparison of two sagline-cli builds (e.g. main's and a branch's): every `fit` output,
# text and --json, stdout, stderr and exit code, byte for byte, on the demo files, 1e5 and 1e6
# CSVs in three orders (bench/make-readings-csv.py) and a session imported from the 1e5 CSV.
# A speed change must leave every line identical.
#
# usage: bench/compare-fit-output.sh OLD-CLI NEW-CLI
set -euo pipefail
if [ $# -ne 2 ]; then
    sed -n '2,7p' "$0" >&2
    exit 2
fi
old=$1 new=$2
here=$(cd "$(dirname "$0")" && pwd)
resources=$here/../resources
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
python=/usr/bin/python3
$python "$here/make-readings-csv.py" 1000 random "$work/r1000.csv"
$python "$here/make-readings-csv.py" 100000 random "$work/r100000.csv"
$python "$here/make-readings-csv.py" 100000 falling "$work/f100000.csv"
$python "$here/make-readings-csv.py" 1000000 rising "$work/u1000000.csv"
"$old" import "$work/r100000.csv" --setup "$resources/demo-setup.json" -o "$work/s100000.sagline" --by bench > /dev/null
cases=(
    "$resources/demo-readings.csv"
    "$resources/demo-readings.csv --setup $resources/demo-setup.json"
    "$resources/demo-readings.csv --method york --setup $resources/demo-setup.json"
    "$resources/demo-readings.csv --method wls --budget"
    "$work/r1000.csv --budget"
    "$work/r100000.csv"
    "$work/r100000.csv --setup $resources/demo-setup.json --method york"
    "$work/f100000.csv --method wls"
    "$work/s100000.sagline"
    "$work/u1000000.csv"
)
differ=0
for args in "${cases[@]}"; do
    for format in --json ""; do
        # shellcheck disable=SC2086 # the case is a list of words
        code_old=0; "$old" fit $args $format > "$work/old.out" 2> "$work/old.err" || code_old=$?
        # shellcheck disable=SC2086
        code_new=0; "$new" fit $args $format > "$work/new.out" 2> "$work/new.err" || code_new=$?
        label="fit ${args//$work\//} $format"
        label=${label//$resources\//resources/}
        if cmp -s "$work/old.out" "$work/new.out" && cmp -s "$work/old.err" "$work/new.err" && [ $code_old = $code_new ]; then
            echo "same  $(wc -c < "$work/old.out") bytes, sha256 $(sha256sum < "$work/old.out" | cut -c1-16): $label"
        else
            echo "DIFFERENT: $label"
            differ=1
        fi
    done
done
exit $differ
