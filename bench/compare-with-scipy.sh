#!/usr/bin/env bash
# Times `sagline-cli fit X.csv --json` against the script a user would write with Debian's
# /usr/bin/python3, NumPy and SciPy (read the CSV, fit, print slope, intercept and their standard
# errors): scipy.stats.linregress for the ordinary fit and scipy.odr for York's errors in both
# variables. Whole processes, alternating (the order swaps every round so neither side always
# runs on a warm page cache), medians of the wall times; peak resident memory from
# /usr/bin/time. Also times `fit SESSION.sagline` (text and --json) of a session imported from the
# 1e5 CSV, which has no script counterpart. With a CLI that writes the per-point array only on
# request (--points), also times `fit --json --points` at 1e6 against the same script.
#
# usage: bench/compare-with-scipy.sh [--cli PATH] [--rounds N] [--sizes "1000 100000 1000000"]
#   default CLI build/ci/app/cli/sagline-cli, 7 rounds.
# Ratio = CLI median / script median (below 1: the CLI is faster); for York, script / CLI.
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
cli=$here/../build/ci/app/cli/sagline-cli
rounds=7
sizes="1000 100000 1000000"
while [ $# -gt 0 ]; do
    case $1 in
        --cli) cli=$2; shift 2 ;;
        --rounds) rounds=$2; shift 2 ;;
        --sizes) sizes=$2; shift 2 ;;
        *) sed -n '2,13p' "$0" >&2; exit 2 ;;
    esac
done
python=/usr/bin/python3
[ -x "$cli" ] || { echo "compare-with-scipy: no CLI at $cli (build it, or give --cli)" >&2; exit 2; }
[ -x /usr/bin/time ] || { echo "compare-with-scipy: needs /usr/bin/time (Debian package time)" >&2; exit 2; }
$python -c 'import numpy, scipy' 2>/dev/null \
    || { echo "compare-with-scipy: needs python3-numpy and python3-scipy (scripts/install-deps.sh)" >&2; exit 2; }

work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

cat > "$work/linregress.py" <<'PY'
import sys
import numpy
from scipy import stats
data = numpy.loadtxt(sys.argv[1], delimiter=",", skiprows=1, usecols=(0, 1))
r = stats.linregress(data[:, 0], data[:, 1])
print(f"slope {r.slope!r} intercept {r.intercept!r} slope_se {r.stderr!r} intercept_se {r.intercept_stderr!r}")
PY
cat > "$work/odr.py" <<'PY'
import sys
import numpy
from scipy import odr
data = numpy.loadtxt(sys.argv[1], delimiter=",", skiprows=1)
x, y, ux, uy = data[:, 0], data[:, 1], data[:, 2], data[:, 3]
fit = odr.ODR(odr.RealData(x, y, sx=ux, sy=uy), odr.unilinear, beta0=[-0.5, 20.0]).run()
print(f"slope {fit.beta[0]!r} intercept {fit.beta[1]!r} slope_se {fit.sd_beta[0]!r} intercept_se {fit.sd_beta[1]!r}")
PY

# run NAME COMMAND...: one timed run; appends "seconds kilobytes" to $work/NAME.times.
run() {
    local name=$1
    shift
    local start end
    start=$(date +%s%N)
    /usr/bin/time -f %M -o "$work/rss" "$@" > /dev/null
    end=$(date +%s%N)
    echo "$(( (end - start) / 1000 )) $(cat "$work/rss")" >> "$work/$name.times"
}

median() { # column 1 = microseconds, 2 = KB; prints the median of column $2 of file $1
    sort -n -k"$2" "$1" | awk -v c="$2" '{ v[NR] = $c } END { m = (NR % 2) ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2; print m }'
}

# pair LABEL A-NAME A-COMMAND -- B-NAME B-COMMAND: alternating rounds of two commands.
pair() {
    local label=$1 a=$2 b
    shift 2
    local -a acmd=() bcmd=()
    while [ "$1" != "--" ]; do acmd+=("$1"); shift; done
    shift
    b=$1
    shift
    bcmd=("$@")
    rm -f "$work/$a.times" "$work/$b.times"
    # One untimed run each: the page cache holds the input and the programs for both.
    "${acmd[@]}" > /dev/null
    "${bcmd[@]}" > /dev/null
    for ((r = 0; r < rounds; ++r)); do
        if ((r % 2 == 0)); then
            run "$a" "${acmd[@]}"; run "$b" "${bcmd[@]}"
        else
            run "$b" "${bcmd[@]}"; run "$a" "${acmd[@]}"
        fi
    done
    local ta tb ma mb
    ta=$(median "$work/$a.times" 1); tb=$(median "$work/$b.times" 1)
    ma=$(median "$work/$a.times" 2); mb=$(median "$work/$b.times" 2)
    awk -v l="$label" -v ta="$ta" -v tb="$tb" -v ma="$ma" -v mb="$mb" -v a="$a" 'BEGIN {
        ratio = (a == "york") ? tb / ta : ta / tb
        printf "%-32s %10.1f %10.1f %8.2f %10.1f %10.1f\n", l, ta / 1000, tb / 1000, ratio, ma / 1024, mb / 1024 }'
}

echo "compare-with-scipy: $rounds alternating rounds per row, medians; $(nproc) cores, load $(cut -d' ' -f1-3 /proc/loadavg)"
echo "CLI: $cli ($("$cli" --version 2>/dev/null | head -1)); $($python -c 'import numpy, scipy; print("NumPy", numpy.__version__, "SciPy", scipy.__version__)')"
printf "%-32s %10s %10s %8s %10s %10s\n" "case" "CLI ms" "script ms" "ratio" "CLI MB" "script MB"
for n in $sizes; do
    $python "$here/make-readings-csv.py" "$n" random "$work/r$n.csv"
    pair "fit --json vs linregress $n" cli "$cli" fit "$work/r$n.csv" --json -- scipy "$python" "$work/linregress.py" "$work/r$n.csv"
done
if "$cli" fit --help 2>/dev/null | grep -q -- '--points'; then
    for n in $sizes; do
        [ "$n" = 1000000 ] || continue
        pair "--json --points vs linregress $n" cli "$cli" fit "$work/r$n.csv" --json --points -- scipy "$python" "$work/linregress.py" "$work/r$n.csv"
    done
fi
if [ -f "$work/r100000.csv" ] || $python "$here/make-readings-csv.py" 100000 random "$work/r100000.csv"; then
    pair "york --json vs odr 100000" york "$cli" fit "$work/r100000.csv" --method york --json -- odr "$python" "$work/odr.py" "$work/r100000.csv"
    pair "york (text) vs odr 100000" york "$cli" fit "$work/r100000.csv" --method york -- odr "$python" "$work/odr.py" "$work/r100000.csv"
    # The demo transformer's setup (resources/demo-setup.json), so the session's fit has the
    # analysis at rated current and the verdict as a real session does.
    if "$cli" import "$work/r100000.csv" --setup "$here/../resources/demo-setup.json" \
        -o "$work/s100000.sagline" --by bench > /dev/null; then
        pair "fit SESSION 100000: text, json" sessiontext "$cli" fit "$work/s100000.sagline" -- sessionjson "$cli" fit "$work/s100000.sagline" --json
        echo "(the session row's ratio is text / json; both columns are the CLI)"
    fi
fi
echo "ratio: CLI / script for linregress (<= 1 is the goal); script / CLI for York (>= 10 is the goal)"
