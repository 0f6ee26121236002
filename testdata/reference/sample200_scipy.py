"""Reference values for peerpack's percentile-rank convention, computed with
SciPy (Debian package python3-scipy). Run from the repository root:

    /usr/bin/python3 testdata/reference/sample200_scipy.py

It reads testdata/reference/sample200.csv (written by sample200.R) and writes
testdata/reference/sample200_scipy.csv. scipy.stats.percentileofscore with
kind="mean" is 100 x (count below + count at or below) / 2n, which for a
score in the sample is 100 x (below + ties/2) / n with the score among its
ties: peerpack's definition in the "higher is better" direction. A value
placed among the sample without belonging to it is appended first, as
peerpack counts it.
"""
import csv

import numpy as np
import scipy
from scipy import stats

rows = list(csv.DictReader(open("testdata/reference/sample200.csv")))
x = np.array([float(r["x"]) for r in rows])
y = np.array([float(r["y"]) for r in rows])
out = []
for i in (1, 2, 3, 17, 50, 99, 128, 200):
    out.append((f"percentile_higher_{i}", stats.percentileofscore(x, x[i - 1], kind="mean")))
    # "lower is better": the same on the negated scale
    out.append((f"percentile_lower_{i}", stats.percentileofscore(-x, -x[i - 1], kind="mean")))
for v in (50, 61.3, 10):
    out.append((f"outside_percentile_higher_{v:g}", stats.percentileofscore(np.append(x, v), v, kind="mean")))
out.append(("spearman_xy", stats.spearmanr(x, y).correlation))
out.append(("pearson_xy", stats.pearsonr(x, y)[0]))
out.append(("sd_x", float(np.std(x, ddof=1))))
# Adjusted Fisher-Pearson sample skewness (the z-score caution's statistic).
out.append(("skew_x", stats.skew(x, bias=False)))
out.append(("skew_y", stats.skew(y, bias=False)))
with open("testdata/reference/sample200_scipy.csv", "w") as f:
    f.write(f"# SciPy version: {scipy.__version__}\n")
    f.write("# Produced by testdata/reference/sample200_scipy.py; do not edit by hand.\n")
    f.write("name,value\n")
    for name, v in out:
        f.write(f"{name},{float(v)!r}\n")
