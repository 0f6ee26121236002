"""Reference values for the governing-body tables (internal/layout/council_tables_test.go),
computed with pandas (Debian's python3-pandas 1.5.3) from the demo scenario's files,
independently of peerpack. Write the files first, then run from the repository root:

    go run ./cmd/peerpack new --template governing-body /tmp/council-ref
    /usr/bin/python3 testdata/layout/council_reference.py /tmp/council-ref > testdata/layout/council_reference.csv

Definitions (README, "Statistics"): rank = 1 + the number of strictly better values; percentile
rank = 100 x (values worse + half the values tied, itself among them) / n; an institution outside a
group is placed among its members as one more value. Ranks and percentiles compare values at the
indicator's declared decimals (README, "Ranks at the declared precision"): each value rounded half
away from zero on its shortest decimal form (Python's repr, the digits as written), with Python's
decimal module. The ranked population: papers summed over 2023-2025 of at least 600. Money is
divided by the country's PPP factor for the year.
"""
import sys
from decimal import ROUND_HALF_UP, Decimal

import pandas as pd

d = sys.argv[1] if len(sys.argv) > 1 else "."
reg = pd.read_csv(f"{d}/institutions.csv", dtype=str, keep_default_na=False)
long = pd.read_csv(f"{d}/values.csv", na_values=["", "n/a"], keep_default_na=False)
wide = pd.read_csv(f"{d}/values-wide.csv")
ppp = pd.read_csv(f"{d}/ppp.csv")
focus = "KE007"
chosen = ["KE002", "KE004", "AL003", "OR002", "NV001", "WI002", "LU001"]
year = 2025
country = reg.set_index("id")["country"]


def value(ind, y):
    if ind == "students_per_academic":
        return value("students", y) / value("academic_staff", y)
    if ind in wide.columns:
        s = wide[wide.year == y].set_index("institution")[ind]
    else:
        s = long[(long.indicator == ind) & (long.year == y)].set_index("institution")["value"]
    s = s.reindex(reg.id).astype(float)
    if ind == "total_income":
        f = ppp[ppp.year == y].set_index("country")["factor"]
        s = s / country.reindex(s.index).map(f).values
    return s


papers = pd.concat([value("papers", y) for y in (2023, 2024, 2025)], axis=1)
ranked = (papers.notna().sum(axis=1) > 0) & (papers.sum(axis=1, skipna=True) >= 600)
sector = [i for i in reg.id if country[i] == "Kestria" and ranked[i]]

print("key,value")
for ind in ["academic_staff", "students", "total_income", "papers"]:
    v = value(ind, year)
    for i in chosen + [focus]:
        print(f"scale/{i}/{ind},{v[i]!r}")
    print(f"scale/median/{ind},{v[chosen].dropna().median()!r}")



def declared_decimals(ind):
    # the "decimals:" line of the indicator's entry in indicators.yaml
    key = None
    for line in open(f"{d}/indicators.yaml"):
        line = line.strip()
        if line.startswith("- key:"):
            key = line.split(":", 1)[1].strip()
        elif key == ind and line.startswith("decimals:"):
            return int(line.split(":", 1)[1])
    raise SystemExit(f"no decimals for {ind} in indicators.yaml")


def printed(s, places):
    # ROUND_HALF_UP in the decimal module rounds half away from zero
    q = Decimal(1).scaleb(-places)
    return s.map(lambda x: x if pd.isna(x) else float(Decimal(repr(x)).quantize(q, rounding=ROUND_HALF_UP)))


lower = {"students_per_academic"}
for ind in ["intl_staff_share", "students_per_academic", "completion_rate"]:
    v = printed(value(ind, year), declared_decimals(ind))
    for name, members in [("Chosen peers", chosen), ("Kestrian sector", sector)]:
        vals = v[[m for m in members if m != focus]].dropna()
        x = v[focus]
        if focus in members:
            vals = v[members].dropna()
            others = vals.drop(focus)
        else:
            others = vals
        better = (others < x).sum() if ind in lower else (others > x).sum()
        worse = (others > x).sum() if ind in lower else (others < x).sum()
        ties = (others == x).sum() + 1
        n = len(others) + 1
        print(f"standing/{name}/{ind}/rank,{1 + better}")
        print(f"standing/{name}/{ind}/of,{n}")
        print(f"standing/{name}/{ind}/percentile,{100 * (worse + ties / 2) / n!r}")
