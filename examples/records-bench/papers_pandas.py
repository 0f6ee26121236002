#!/usr/bin/env python3
"""The papers computation of `peerpack papers` (whole span, full counting)
written in pandas, for the side-by-side bench (run.sh) and as an independent
reference for the Go code (TestAgainstPandas).

Usage: papers_pandas.py PAPERS.csv OUT.csv
Writes institution,indicator,value for papers, citation_impact,
top10_share, intl_coauthorship and the six field_* shares.
Method: the item-oriented mean normalised citation score (Waltman et al.
2011) with fractional field weights, the top 10 % share with fractional
ties at the threshold (Waltman and Schreiber 2013), as in internal/records.
"""
import sys
import time

import numpy as np
import pandas as pd

t0 = time.time()
src, out = sys.argv[1], sys.argv[2]
df = pd.read_csv(src, usecols=["paper", "year", "type", "field", "citations", "institutions", "countries"],
                 dtype={"paper": str, "year": np.int32, "type": "category", "field": str,
                        "citations": np.int64, "institutions": str, "countries": str})
df["pid"] = np.arange(len(df))
keys = ["field", "year", "type"]

# Papers by field, each of k fields weighted 1/k.
f = df[["pid", "year", "type", "citations"]].copy()
fl = df["field"].str.split(";")
f["w"] = 1.0 / fl.str.len().to_numpy()
f["field"] = fl
f = f.explode("field", ignore_index=True)
f["wc"] = f["w"] * f["citations"]

# Baselines: weighted papers, citations, expected citations.
base = f.groupby(keys, observed=True).agg(W=("w", "sum"), C=("wc", "sum")).reset_index()
base["expected"] = base["C"] / base["W"]

# Top 10 %: weight at each citation level, weight above it, share inside.
lv = f.groupby(keys + ["citations"], observed=True)["w"].sum().reset_index()
lv = lv.sort_values(keys + ["citations"], ascending=[True, True, True, False], kind="stable")
lv["above"] = lv.groupby(keys, observed=True)["w"].cumsum() - lv["w"]
lv = lv.merge(base[keys + ["W"]], on=keys)
lv["frac"] = ((0.1 * lv["W"] - lv["above"]) / lv["w"]).clip(0, 1)

f = f.merge(base[keys + ["expected"]], on=keys).merge(lv[keys + ["citations", "frac"]], on=keys + ["citations"])
f["ratio"] = np.where(f["expected"] > 0, f["citations"] / f["expected"].where(f["expected"] > 0, 1), np.nan)
f["broad"] = f["field"].str[0]
paper = f.groupby("pid").agg(score=("ratio", "mean"), top=("frac", "mean"))
prof = f.pivot_table(index="pid", columns="broad", values="w", aggfunc="sum", fill_value=0.0)

# International: two or more distinct countries.
c = df["countries"].str.split(";").explode()
paper["intl"] = (c.groupby(level=0).nunique() >= 2).to_numpy()

# Institutions: explode, distinct per paper, full counting.
a = df[["pid", "institutions"]].copy()
a["inst"] = a["institutions"].str.split(";")
a = a.drop(columns="institutions").explode("inst").drop_duplicates()
a = a.merge(paper, left_on="pid", right_index=True).merge(prof, left_on="pid", right_index=True)
g = a.groupby("inst")
res = pd.DataFrame({
    "papers": g.size(),
    "citation_impact": g["score"].mean(),
    "top10_share": 100 * g["top"].mean(),
    "intl_coauthorship": 100 * g["intl"].mean(),
})
names = {"1": "field_natural", "2": "field_engineering", "3": "field_health",
         "4": "field_agriculture", "5": "field_social", "6": "field_humanities"}
for b, name in names.items():
    res[name] = 100 * g[b].mean() if b in a.columns else 0.0
res.index.name = "institution"
res.reset_index().melt(id_vars="institution", var_name="indicator").to_csv(out, index=False, float_format="%.17g")
print(f"pandas {pd.__version__}: {len(df)} papers in {time.time() - t0:.1f} s", file=sys.stderr)
