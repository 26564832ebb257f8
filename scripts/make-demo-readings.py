#!/usr/bin/env python3
"""Writes resources/demo-readings.csv: a made-up load sweep for the demo transformer of
resources/demo-setup.json (60 VA, 230 V to 18 V at full load, 19.6 V at no load).

The invented unit follows V = V0 - R*I with V0 = 19.55 V and R = 0.42 ohm (a little better
than its nameplate), plus a slight heating sag of -0.001 V/A^2 (a winding warming up).
Steps I_k = k/8 * 3.333 A, k = 0..8. The meters are those of the demo setup's `meters`
section: a voltmeter with 1 mV resolution and an ammeter with 1 mA resolution. Each reading
gets the meters' repeatability (Gaussian, 4 mV and 1.5 mA) and is rounded to the last digit.
The u_* columns are the per-reading random part only (repeatability and rounding, GUM F.2.2.1:
u = sqrt(s^2 + delta^2/12)); the gain and offset of each meter are systematic and live in the
setup's `meters` section, not here. Invented data, for demos only. Seeded, so the file is
reproducible."""
import math
import random
import pathlib

V0, R, SAG = 19.55, 0.42, -0.001
I_RATED = 60.0 / 18.0
NOISE_V, NOISE_I = 0.004, 0.0015          # repeatability, V and A
RES_V, RES_I = 0.001, 0.001               # one count, V and A
U_V = math.sqrt(NOISE_V ** 2 + RES_V ** 2 / 12)
U_I = math.sqrt(NOISE_I ** 2 + RES_I ** 2 / 12)
rng = random.Random(20261202)
lines = ["current_a,voltage_v,u_current_a,u_voltage_v"]
for k in range(9):
    i_true = k / 8 * I_RATED
    v_true = V0 - R * i_true + SAG * i_true ** 2
    i = max(0.0, round(i_true + rng.gauss(0, NOISE_I), 3))
    v = round(v_true + rng.gauss(0, NOISE_V), 3)
    lines.append(f"{i:.3f},{v:.3f},{U_I:.5f},{U_V:.5f}")
out = pathlib.Path(__file__).resolve().parent.parent / "resources" / "demo-readings.csv"
out.write_text("\n".join(lines) + "\n")
print(out)
