#!/usr/bin/env bash
# Golden comparison of two sagline-cli builds (e.g. main's and a branch's): every `fit` output,
# text and --json, stdout, stderr and exit code, byte for byte, on the demo files, 1e5 and 1e6
# CSVs in three orders (bench/make-readings-csv.py) and a session imported from the 1e5 CSV.
# A speed change must leave every line identical. One difference is explained, not failed: a
# number written with other digits that read back to the same double, the new text no longer
# (the shortest round-trip formatter against Grisu2); such cases print "same values" and how
# many numbers changed text, with an example. A build whose `fit` has --points (the per-point
# array only on request) is run with it, so its JSON holds what an older build's always held.
#
# usage: bench/compare-fit-output.sh OLD-CLI NEW-CLI
set -euo pipefail
if [ $# -ne 2 ]; then
    sed -n '2,11p' "$0" >&2
    exit 2
fi
old=$1 new=$2
here=$(cd "$(dirname "$0")" && pwd)
resources=$here/../resources
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
python=/usr/bin/python3
# Line by line (both builds lay the document out alike): every differing line must be the same
# key with a number that parses to the same double, written no longer. Exit 0 when so.
cat > "$work/same-values.py" <<'PY'
import re
import sys
number = re.compile(rb"-?\d+(?:\.\d+)?(?:[eE][-+]?\d+)?")
changed = 0
example = ""
with open(sys.argv[1], "rb") as old, open(sys.argv[2], "rb") as new:
    for index, (a, b) in enumerate(zip(old, new), start=1):
        if a == b:
            continue
        sa, sb = number.split(a), number.split(b)
        na, nb = number.findall(a), number.findall(b)
        if sa != sb or len(na) != len(nb):
            print(f"line {index}: the text around the numbers differs", file=sys.stderr)
            sys.exit(1)
        for x, y in zip(na, nb):
            if x == y:
                continue
            if float(x) != float(y) or len(y) > len(x):
                print(f"line {index}: {x.decode()} became {y.decode()}", file=sys.stderr)
                sys.exit(1)
            changed += 1
            example = example or f"{x.decode()} -> {y.decode()}"
    if old.read(1) or new.read(1):
        print("one document has more lines", file=sys.stderr)
        sys.exit(1)
print(f"{changed} numbers with other digits for the same double (e.g. {example})")
PY
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
# points BUILD: the option that makes BUILD's fit --json write the per-point array, if it has one.
points() { if "$1" fit --help 2>/dev/null | grep -q -- '--points'; then echo --points; fi; }
points_old=$(points "$old")
points_new=$(points "$new")
differ=0
for args in "${cases[@]}"; do
    for format in --json ""; do
        # shellcheck disable=SC2086 # the case is a list of words
        code_old=0; "$old" fit $args $format ${format:+$points_old} > "$work/old.out" 2> "$work/old.err" || code_old=$?
        # shellcheck disable=SC2086
        code_new=0; "$new" fit $args $format ${format:+$points_new} > "$work/new.out" 2> "$work/new.err" || code_new=$?
        label="fit ${args//$work\//} $format"
        label=${label//$resources\//resources/}
        if cmp -s "$work/old.out" "$work/new.out" && cmp -s "$work/old.err" "$work/new.err" && [ $code_old = $code_new ]; then
            echo "same  $(wc -c < "$work/old.out") bytes, sha256 $(sha256sum < "$work/old.out" | cut -c1-16): $label"
        elif [ "$format" = --json ] && cmp -s "$work/old.err" "$work/new.err" && [ $code_old = $code_new ] \
            && note=$($python "$work/same-values.py" "$work/old.out" "$work/new.out"); then
            echo "same values, $note: $label"
        else
            echo "DIFFERENT: $label"
            differ=1
        fi
    done
done
exit $differ
