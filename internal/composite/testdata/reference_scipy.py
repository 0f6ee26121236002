#!/usr/bin/python3
"""Writes reference_scipy.csv: normalisations, skewness and kurtosis of a
small invented sample, computed with SciPy and NumPy (Debian's
python3-scipy), for composite's tests.

Run from this folder: /usr/bin/python3 reference_scipy.py > reference_scipy.csv
"""
import sys

import numpy as np
from scipy import stats

# An invented, right-skewed sample with ties and one far value.
x = np.array([3.1, 4.7, 4.7, 5.2, 6.0, 6.8, 7.3, 8.8, 9.1, 10.4,
              11.0, 12.5, 13.9, 15.2, 18.7, 21.3, 26.0, 31.8, 44.1, 120.0])

z = stats.zscore(x, ddof=1)
mm = 100 * (x - x.min()) / (x.max() - x.min())
pct = np.array([stats.percentileofscore(x, v, kind="mean") for v in x])
cdf = 100 * stats.norm.cdf(z)
med = np.median(x)
dist = 100 * (1 + (x - med) / abs(med))

out = sys.stdout
out.write("# scipy %s numpy %s\n" % (__import__("scipy").__version__, np.__version__))
out.write("measure,i,value\n")
for name, arr in (("zscore", z), ("minmax", mm), ("percentile", pct),
                  ("zscore-cdf", cdf), ("distance", dist)):
    for i, v in enumerate(arr):
        out.write("%s,%d,%.17g\n" % (name, i, v))
out.write("skewness,,%.17g\n" % stats.skew(x, bias=False))
out.write("kurtosis,,%.17g\n" % stats.kurtosis(x, fisher=True, bias=False))
y = np.log(x)
out.write("skewness_log,,%.17g\n" % stats.skew(y, bias=False))
out.write("kurtosis_log,,%.17g\n" % stats.kurtosis(y, fisher=True, bias=False))
