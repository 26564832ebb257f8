#!/usr/bin/python3
"""Writes a readings CSV (DESIGN.md columns) of invented demo data for the benchmarks:
V = 19.6 - 0.48 I + noise for a made-up 60 VA transformer, I from 0 to 3.33 A.

usage: make-readings-csv.py N ORDER OUT.csv
  ORDER: rising (current goes up row by row), falling, or random (shuffled, seeded)
The noise and the shuffle are seeded, so the same arguments give the same file."""
import random
import sys


def main():
    if len(sys.argv) != 4 or sys.argv[2] not in ("rising", "falling", "random"):
        sys.exit(__doc__)
    n = int(sys.argv[1])
    order = sys.argv[2]
    rng = random.Random(20261202)
    currents = [3.33 * i / max(n - 1, 1) for i in range(n)]
    if order == "falling":
        currents.reverse()
    elif order == "random":
        rng.shuffle(currents)
    with open(sys.argv[3], "w") as out:
        out.write("current_a,voltage_v,u_current_a,u_voltage_v\n")
        for current in currents:
            # Independent errors in I and V (what York and ODR assume), of the stated size.
            i = abs(current + rng.gauss(0.0, 0.002))  # an RMS reading is never below zero
            v = 19.6 - 0.48 * current + rng.gauss(0.0, 0.01)
            out.write(f"{i:.6f},{v:.6f},0.002,0.01\n")


if __name__ == "__main__":
    main()
