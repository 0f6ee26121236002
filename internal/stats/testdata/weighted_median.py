"""Reference values for stats.WeightedMedian, written with Python's own
statistics module (Debian's /usr/bin/python3, standard library only): each
value is repeated as many times as its integer weight and
statistics.median is taken of the result. Run from the repository root:

    /usr/bin/python3 internal/stats/testdata/weighted_median.py > internal/stats/testdata/weighted_median.csv
"""
import csv
import random
import statistics
import sys

rng = random.Random(20260302)
out = csv.writer(sys.stdout, lineterminator="\n")
out.writerow(["case", "values", "weights", "median"])
for case in range(60):
    n = rng.randint(1, 25)
    # Ties on purpose: values drawn from a small set half of the time.
    if case % 2:
        values = [rng.choice([1.5, 2.0, 2.5, 7.25, 10.0]) for _ in range(n)]
    else:
        values = [round(rng.uniform(-50, 150), 3) for _ in range(n)]
    weights = [rng.randint(1, 40) for _ in range(n)]
    expanded = []
    for v, w in zip(values, weights):
        expanded.extend([v] * w)
    out.writerow([case, " ".join(repr(v) for v in values), " ".join(str(w) for w in weights), repr(statistics.median(expanded))])
