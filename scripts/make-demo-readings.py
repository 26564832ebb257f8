#!/usr/bin/env python3
"""Writes resources/demo-readings.csv: a made-up load sweep for the demo transformer of
resources/demo-setup.json (60 VA, 230 V to 18 V at full load, 19.6 V at no load).

The invented unit follows V = V0 - R*I with V0 = 19.55 V and R = 0.42 ohm (a little better
than its nameplate), plus a small heating sag of -0.004 V/A^2 (a winding warming up). Steps I_k = k/8 * 3.333 A, k = 0..8.
Each reading gets Gaussian noise and is rounded to the meters' resolution (1 mV, 1 mA);
the u_* columns are the meters' specifications as standard uncertainties (GUM 4.3.7):
voltmeter +/-(0.5 % + 3 counts) and ammeter +/-(1 % + 3 counts), u = a/sqrt(3).
Invented data, for demos only. Seeded, so the file is reproducible."""
import math
import random
import pathlib

V0, R, SAG = 19.55, 0.42, -0.004
I_RATED = 60.0 / 18.0
rng = random.Random(20261202)
lines = ["current_a,voltage_v,u_current_a,u_voltage_v"]
for k in range(9):
    i_true = k / 8 * I_RATED
    v_true = V0 - R * i_true + SAG * i_true ** 2
    u_i = (0.01 * i_true + 3 * 0.001) / math.sqrt(3)
    u_v = (0.005 * v_true + 3 * 0.001) / math.sqrt(3)
    i = round(i_true + rng.gauss(0, u_i / 3), 3)
    v = round(v_true + rng.gauss(0, u_v / 3), 3)
    u_i = (0.01 * i + 3 * 0.001) / math.sqrt(3)
    u_v = (0.005 * v + 3 * 0.001) / math.sqrt(3)
    lines.append(f"{i:.3f},{v:.3f},{u_i:.5f},{u_v:.5f}")
out = pathlib.Path(__file__).resolve().parent.parent / "resources" / "demo-readings.csv"
out.write_text("\n".join(lines) + "\n")
print(out)
