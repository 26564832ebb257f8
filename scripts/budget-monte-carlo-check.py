#!/usr/bin/python3
"""Independent Monte Carlo check of Sagline's uncertainty budgets (JCGM 101:2008, "Propagation
of distributions using a Monte Carlo method", GUM Supplement 1), with NumPy, for the two sweeps
that tests/core/MonteCarloBudgetTest.cpp checks:

  demo   resources/demo-readings.csv with resources/demo-setup.json, winding 23 degC, reference 75 degC
  own    tests/data/own-sweep-25va.csv with tests/data/own-sweep-25va-setup.json, winding 31 degC

The model is the measurement itself. The true line is the fitted one (V0, R); each draw takes
  the voltmeter gain g_V and offset o_V, the ammeter gain g_I and offset o_I: rectangular within
  the setup's limits, common to every reading of the sweep (JCGM 101 6.4.2);
  the readings' random error: normal with sigma = s, the residual SD of the fit (the
  propagation check, "u"), or sigma^2 = s^2 nu / chi2_nu with nu = n - 2 (JCGM 101 6.4.9: a
  Type A input of unknown variance, which gives the t character; the coverage check, "U95");
  the winding temperature: normal with the setup's standard uncertainty;
then the observed I' = (1 + g_I) I + o_I and V' = (1 + g_V)(V0 - R I) + o_V + e, fits V' on I'
by ordinary least squares and computes R, V0, regulation at rated current (full-load base) and
R at the reference temperature. "u" is the standard deviation of the draws, "U95" the half-width
of the probabilistically symmetric 95 % interval (2.5 % and 97.5 % quantiles), JCGM 101 7.7.

Prints the values pinned in MonteCarloBudgetTest.cpp. Debian's /usr/bin/python3 with
python3-numpy (scripts/install-deps.sh installs python3-scipy, which brings it). A million draws
per sweep, seed 20261212."""
import argparse
import csv
import json
import pathlib
import re

import numpy as np

ROOT = pathlib.Path(__file__).resolve().parent.parent
DRAWS = 1_000_000
T_K = 234.5  # copper, IEEE C57.12.90
PREFIX = {"": 1.0, "m": 1e-3, "µ": 1e-6, "u": 1e-6, "k": 1e3}


def quantity(value):
    """A setup number: plain SI, or text such as "3 mV" or "0.5 %"."""
    if isinstance(value, (int, float)):
        return float(value)
    m = re.fullmatch(r"\s*([-+0-9.eE]+)\s*([mµuk]?)(V|A|%|°C)?\s*", value)
    return float(m.group(1)) * (PREFIX[m.group(2)] if m.group(3) != "%" else 1.0)


def load(csv_path, setup_path):
    rows = list(csv.DictReader((ROOT / csv_path).open()))
    # An export's excluded or superseded rows are not fitted.
    rows = [r for r in rows if (r.get("excluded") or "false") not in ("true", "1", "yes")
            and not (r.get("superseded_reason") or "")]
    current = np.array([float(r["current_a"]) for r in rows])
    voltage = np.array([float(r["voltage_v"]) for r in rows])
    setup = json.loads((ROOT / setup_path).read_text())
    return current, voltage, setup


def check(name, csv_path, setup_path, winding_c, reference_c, rng):
    current, voltage, setup = load(csv_path, setup_path)
    n = len(current)
    plate = setup["nameplate"]
    rated = plate["rated_power_va"] / plate["secondary_voltage_v"]
    meters = setup["meters"]
    vm, am = meters["voltmeter"], meters["ammeter"]
    gain_v, offset_v = quantity(vm["gain_percent_of_reading"]) / 100, quantity(vm["offset_v"])
    gain_i, offset_i = quantity(am["gain_percent_of_reading"]) / 100, quantity(am["offset_a"])
    u_t = quantity(meters.get("winding_temperature_u_c") or 2.0)

    design = np.column_stack([np.ones(n), current])
    (v0, slope), *_ = np.linalg.lstsq(design, voltage, rcond=None)
    r = -slope
    residual = voltage - design @ np.array([v0, slope])
    s = np.sqrt(residual @ residual / (n - 2))
    print(f"{name}: V0 {v0:.9g} V, R {r:.9g} ohm, residual SD {s:.6g} V, n {n}")

    def draw(t_character):
        g_v = rng.uniform(-gain_v, gain_v, DRAWS)
        o_v = rng.uniform(-offset_v, offset_v, DRAWS)
        g_i = rng.uniform(-gain_i, gain_i, DRAWS)
        o_i = rng.uniform(-offset_i, offset_i, DRAWS)
        sigma = s * np.sqrt((n - 2) / rng.chisquare(n - 2, DRAWS)) if t_character else np.full(DRAWS, s)
        noise = rng.standard_normal((DRAWS, n)) * sigma[:, None]
        i_obs = (1 + g_i)[:, None] * current[None, :] + o_i[:, None]
        v_obs = (1 + g_v)[:, None] * (v0 - r * current)[None, :] + o_v[:, None] + noise
        i_mean = i_obs.mean(axis=1, keepdims=True)
        v_mean = v_obs.mean(axis=1, keepdims=True)
        b = ((i_obs - i_mean) * (v_obs - v_mean)).sum(axis=1) / ((i_obs - i_mean) ** 2).sum(axis=1)
        a = v_mean[:, 0] - b * i_mean[:, 0]
        r_hat = -b
        winding = winding_c + u_t * rng.standard_normal(DRAWS)
        return {
            "R": r_hat,
            "V0": a,
            "regulation": 100 * r_hat * rated / (a - r_hat * rated),
            "R_ref": r_hat * (T_K + reference_c) / (T_K + winding),
        }

    spread = draw(False)
    coverage = draw(True)
    for key in ("R", "V0", "regulation", "R_ref"):
        low, high = np.percentile(coverage[key], [2.5, 97.5])
        print(f"  {key:10s} u {spread[key].std(ddof=1):.6g}   U95 {(high - low) / 2:.6g}")


def main():
    parser = argparse.ArgumentParser(
        description="Monte Carlo check of the budgets; with no options the two pinned sweeps, else the "
        "sweep given (a readings CSV, e.g. from `sagline-cli export SESSION --csv`, and its setup).")
    parser.add_argument("--csv", help="readings CSV (current_a, voltage_v columns)")
    parser.add_argument("--setup", help="the setup JSON with its meters section")
    parser.add_argument("--winding", type=float, default=23.0, help="winding temperature, degC")
    parser.add_argument("--reference", type=float, default=75.0, help="reference temperature, degC")
    parser.add_argument("--name", default="given")
    parser.add_argument("--seed", type=int, default=20261212)
    args = parser.parse_args()
    rng = np.random.default_rng(args.seed)
    if args.csv or args.setup:
        if not (args.csv and args.setup):
            parser.error("--csv and --setup go together")
        check(args.name, pathlib.Path(args.csv).resolve(), pathlib.Path(args.setup).resolve(), args.winding,
              args.reference, rng)
        return
    check("demo", "resources/demo-readings.csv", "resources/demo-setup.json", 23.0, 75.0, rng)
    check("own", "tests/data/own-sweep-25va.csv", "tests/data/own-sweep-25va-setup.json", 31.0, 75.0, rng)


if __name__ == "__main__":
    main()
