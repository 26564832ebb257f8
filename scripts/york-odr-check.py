#!/usr/bin/python3
"""Independent check of the York fit on Pearson's data with York's weights
(tests/data/pearson-york.csv): an orthogonal-distance regression from SciPy's scipy.odr
(ODRPACK), weights wd = w(x), we = w(y). For a straight line ODR minimises the same sum
S = sum w_x dx^2 + w_y dy^2 as York (2004), so slope and intercept must agree. ODR's sd_beta is
scaled by the residual variance, i.e. it corresponds to the York standard errors times
sqrt(MSWD). Prints the values pinned in tests/core/YorkFitTest.cpp. Runs with Debian's
/usr/bin/python3 and python3-scipy (scripts/install-deps.sh)."""
import csv
import pathlib

import numpy as np
from scipy import odr

path = pathlib.Path(__file__).resolve().parent.parent / "tests" / "data" / "pearson-york.csv"
rows = list(csv.DictReader(path.open()))
x = np.array([float(r["x"]) for r in rows])
y = np.array([float(r["y"]) for r in rows])
wx = np.array([float(r["weight_x"]) for r in rows])
wy = np.array([float(r["weight_y"]) for r in rows])

model = odr.Model(lambda beta, t: beta[0] + beta[1] * t)
fit = odr.ODR(odr.Data(x, y, wd=wx, we=wy), model, beta0=[5.76, -0.54], sstol=1e-15, partol=1e-15, maxit=1000)
out = fit.run()
print(f"intercept      {out.beta[0]:.15g}")
print(f"slope          {out.beta[1]:.15g}")
print(f"sd intercept   {out.sd_beta[0]:.15g}")
print(f"sd slope       {out.sd_beta[1]:.15g}")
print(f"res_var (MSWD) {out.res_var:.15g}")
print(f"S (sum_square) {out.sum_square:.15g}")
