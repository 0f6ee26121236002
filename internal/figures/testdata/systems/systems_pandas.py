"""Independent recomputation of the system section on the demo data, with
pandas and numpy from Debian (python3-pandas 1.5.3, python3-numpy).

    /usr/bin/python3 systems_pandas.py DIR > out.csv

DIR holds the demo's institutions.csv, values.csv and values-wide.csv.
Writes group,indicator,measure,value rows for every country:

  n_defined      institutions of the country in the register
  n_ranked       those whose papers summed over 2023-2025 reach 600
                 (the brief's population rule; missing years add nothing)
  median_weighted  for intl_staff_share and intl_student_share in 2025:
                 numpy.median of the ranked institutions' values, each
                 repeated as many times as its students in 2025 (an integer
                 count in the demo); the ordinary median of the repeated
                 sample, computed without the weighted-median definition.
"""
import csv
import sys

import numpy as np
import pandas as pd

d = sys.argv[1]
reg = pd.read_csv(f"{d}/institutions.csv", dtype=str, keep_default_na=False)
long = pd.read_csv(f"{d}/values.csv", dtype={"institution": str})
wide = pd.read_csv(f"{d}/values-wide.csv", dtype={"institution": str})

papers = long[(long.indicator == "papers") & long.year.between(2023, 2025)]
psum = papers.groupby("institution")["value"].sum(min_count=1)
ranked = set(psum[psum >= 600].index)

w25 = wide[wide.year == 2025].set_index("institution")
out = csv.writer(sys.stdout, lineterminator="\n")
out.writerow(["group", "indicator", "measure", "value"])
for country, rows in reg.groupby("country"):
    ids = list(rows.id)
    members = [i for i in ids if i in ranked]
    out.writerow([country, "", "n_defined", len(ids)])
    out.writerow([country, "", "n_ranked", len(members)])
    for ind in ["intl_staff_share", "intl_student_share"]:
        sub = w25.loc[[i for i in members if i in w25.index], [ind, "students"]].dropna()
        sub = sub[sub.students > 0]
        if len(sub) == 0:
            continue
        rep = np.repeat(sub[ind].to_numpy(), sub.students.astype(int).to_numpy())
        out.writerow([country, ind, "median_weighted", repr(float(np.median(rep)))])
