#!/usr/bin/env python3
"""The benchmark world's pack written with pandas and matplotlib, as an analyst
would write it in a notebook: the yardstick the README's performance table
compares peerpack with.

It does the same work as `peerpack build brief.md -o pack.pdf --figures
figures.csv` on the files examples/bench/worldgen writes (fixed brief, read
from the generator's layout, not parsed from brief.md):

  1. read and validate the register, the dictionary and the long values file
     (known ids and keys, one value per institution, indicator and year,
     percents within 0..100, no negative ratios or counts);
  2. coverage per indicator and year (the check summary);
  3. groups: the world, one per system (country) and the home region;
  4. for every group, indicator and year: n, missing, min, quartiles (type 7,
     pandas' default "linear"), max, IQR, Tukey's whiskers and outliers
     (1.5 x IQR), mean and sample SD;
  5. the focus's position in every group, indicator and year: value, rank
     (ties share the best rank, in the better direction), of, percentile rank
     (worse + half the ties, itself included), z, quarter; outside a group
     it is placed among the members as one more value;
  6. its trend over the span (change, percent change, least-squares slope)
     and the movement of each group's median;
  7. Pearson and Spearman correlations of every indicator pair in each group
     in the last year;
  8. the figures file (one row per figure, sorted) and a PDF: twelve charts
     (box plots, trends, scatters, bars, a heatmap, a radar), the position
     tables and a few sentences of commentary.

Usage: python3 peer.py WORLD_DIR OUT_DIR
"""

import math
import os
import sys

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402
import numpy as np  # noqa: E402
import pandas as pd  # noqa: E402
import yaml  # noqa: E402
from matplotlib.backends.backend_pdf import PdfPages  # noqa: E402

FOCUS = "I00007"
HOME = "System 001"


def load(world):
    reg = pd.read_csv(os.path.join(world, "institutions.csv"), dtype=str, keep_default_na=False)
    with open(os.path.join(world, "indicators.yaml"), encoding="utf-8") as f:
        dictionary = yaml.safe_load(f)["indicators"]
    inds = pd.DataFrame(dictionary).set_index("key")
    vals = pd.read_csv(
        os.path.join(world, "values.csv"),
        dtype={"institution": "category", "year": "int16", "indicator": "category", "value": "float64"},
    )
    problems = []
    unknown_i = ~vals["institution"].isin(reg["id"])
    if unknown_i.any():
        problems.append(f"{int(unknown_i.sum())} rows name an unknown institution")
    unknown_k = ~vals["indicator"].isin(inds.index)
    if unknown_k.any():
        problems.append(f"{int(unknown_k.sum())} rows name an unknown indicator")
    dup = vals.duplicated(["institution", "year", "indicator"])
    if dup.any():
        problems.append(f"{int(dup.sum())} values given twice")
    unit = vals["indicator"].map(inds["unit"]).astype(str)
    bad = ((unit == "percent") & ((vals["value"] < 0) | (vals["value"] > 100))) | (
        unit.isin(["ratio", "count"]) & (vals["value"] < 0)
    )
    if bad.any():
        problems.append(f"{int(bad.sum())} values outside their unit's range")
    if problems:
        sys.exit("; ".join(problems))
    # Wide: one column per (indicator, year), one row per institution in
    # register order.
    wide = vals.pivot(index="institution", columns=["indicator", "year"], values="value")
    wide = wide.reindex(reg["id"])
    return reg, inds, wide


def coverage(reg, inds, wide, years):
    rows = []
    for k in inds.index:
        for y in years:
            col = wide.get((k, y))
            n = 0 if col is None else int(col.notna().sum())
            rows.append((k, y, n / len(reg)))
    return rows


def groups_of(reg):
    out = {"World": np.ones(len(reg), dtype=bool)}
    for c in sorted(reg["country"].unique()):
        out[c] = (reg["country"] == c).to_numpy()
    out["Home region"] = (reg["region"] == "Region 1").to_numpy()
    return out


def box(v):
    v = v[~np.isnan(v)]
    if len(v) == 0:
        return None
    q1, med, q3 = np.quantile(v, [0.25, 0.5, 0.75])  # type 7
    iqr = q3 - q1
    lo_fence, hi_fence = q1 - 1.5 * iqr, q3 + 1.5 * iqr
    inside = v[(v >= lo_fence) & (v <= hi_fence)]
    out = v[(v < lo_fence) | (v > hi_fence)]
    return {
        "n": len(v),
        "min": v.min(),
        "q1": q1,
        "median": med,
        "q3": q3,
        "max": v.max(),
        "iqr": iqr,
        "whisker_low": inside.min() if len(inside) else np.nan,
        "whisker_high": inside.max() if len(inside) else np.nan,
        "mean": v.mean(),
        "sd": v.std(ddof=1) if len(v) > 1 else np.nan,
        "n_outliers": len(out),
        "outliers": np.sort(out),
    }


def place(members, value, better, in_group):
    """Rank (1 = best, ties share the best), of, percentile rank (worse plus
    half the ties, itself among them)."""
    m = members[~np.isnan(members)]
    if math.isnan(value):
        return None
    if better == "lower":
        worse, ahead = (m > value).sum(), (m < value).sum()
    else:
        worse, ahead = (m < value).sum(), (m > value).sum()
    ties = (m == value).sum()
    of = len(m)
    if not in_group:
        of += 1
        ties += 1
    pct = 100 * (worse + 0.5 * ties) / of
    quarter = 1 if pct > 75 else 2 if pct > 50 else 3 if pct > 25 else 4
    return {"rank": 1 + ahead, "of": of, "percentile": pct, "quartile": quarter}


def main():
    world, out = sys.argv[1], sys.argv[2]
    os.makedirs(out, exist_ok=True)
    reg, inds, wide = load(world)
    years = sorted({y for (_, y) in wide.columns})
    last = years[-1]
    cov = coverage(reg, inds, wide, years)
    groups = groups_of(reg)
    fi = int(np.flatnonzero(reg["id"].to_numpy() == FOCUS)[0])
    ids = reg["id"].to_numpy()

    rows = []  # section, group, indicator, institution, year, measure, value
    dists = {}
    for g, mask in groups.items():
        for k in inds.index:
            better = inds.at[k, "better"]
            series = []
            for y in years:
                col = wide.get((k, y))
                if col is None:
                    continue
                arr = col.to_numpy()
                members = arr[mask]
                b = box(members)
                if b is None:
                    continue
                b["missing"] = int(mask.sum()) - b["n"]
                dists[(g, k, y)] = b
                for meas in ("n", "missing", "min", "q1", "median", "q3", "max", "iqr",
                             "whisker_low", "whisker_high", "mean", "sd", "n_outliers"):
                    rows.append(("distribution", g, k, "", y, meas, b[meas]))
                outl = (members < b["q1"] - 1.5 * b["iqr"]) | (members > b["q3"] + 1.5 * b["iqr"])
                for i in np.flatnonzero(outl):
                    rows.append(("distribution", g, k, ids[mask][i], y, "outlier", members[i]))
                v = arr[fi]
                p = place(members, v, better, bool(mask[fi]))
                if p is not None:
                    z = (v - b["mean"]) / b["sd"] if b["sd"] else np.nan
                    for meas, val in (("value", v), ("rank", p["rank"]), ("of", p["of"]),
                                      ("percentile", p["percentile"]), ("quartile", p["quartile"]), ("z", z),
                                      ("vs_median", v - b["median"] if better != "lower" else b["median"] - v)):
                        rows.append(("position", g, k, FOCUS, y, meas, val))
                    series.append((y, v, b["median"]))
            if len(series) >= 2:
                ys = np.array([s[0] for s in series], dtype=float)
                vs = np.array([s[1] for s in series])
                ms = np.array([s[2] for s in series])
                slope = np.polyfit(ys, vs, 1)[0]
                for meas, val in (("change", vs[-1] - vs[0]),
                                  ("change_pct", 100 * (vs[-1] - vs[0]) / abs(vs[0]) if vs[0] else np.nan),
                                  ("slope", slope), ("median_change", ms[-1] - ms[0])):
                    rows.append(("trend", g, k, FOCUS, "", meas, val))
        # correlations in the last year
        cols = [k for k in inds.index if (k, last) in wide.columns]
        frame = pd.DataFrame({k: wide[(k, last)].to_numpy()[mask] for k in cols})
        pear = frame.corr(method="pearson")
        spear = frame.corr(method="spearman")
        for a in range(len(cols)):
            for c in range(a + 1, len(cols)):
                x, y = cols[a], cols[c]
                pair = f"{x}~{y}"
                n = int((frame[x].notna() & frame[y].notna()).sum())
                rows.append(("correlation", g, pair, "", last, "n", n))
                rows.append(("correlation", g, pair, "", last, "pearson", pear.at[x, y]))
                rows.append(("correlation", g, pair, "", last, "spearman", spear.at[x, y]))

    figs = pd.DataFrame(rows, columns=["section", "group", "indicator", "institution", "year", "measure", "value"])
    figs = figs[pd.to_numeric(figs["value"], errors="coerce").notna()]
    figs["year"] = figs["year"].astype(str)
    figs = figs.sort_values(["section", "group", "indicator", "institution", "year", "measure"], kind="stable")
    figs.to_csv(os.path.join(out, "figures.csv"), index=False)

    draw(os.path.join(out, "pack.pdf"), reg, inds, wide, groups, dists, fi, years, cov)


def short(inds, k):
    return inds.at[k, "short"]


def draw(path, reg, inds, wide, groups, dists, fi, years, cov):
    last = years[-1]
    home, world_mask = groups[HOME], groups["World"]
    with PdfPages(path, metadata={"Title": "World position"}) as pdf:
        # Summary page: commentary and the position table.
        fig = plt.figure(figsize=(8.27, 11.69))
        fig.text(0.08, 0.95, "World position", fontsize=18, weight="bold")
        lines = []
        for k in ["citation_impact", "top10_share", "papers_per_academic", "intl_coauthorship", "students_per_academic"]:
            b = dists[(HOME, k, last)]
            p = place(wide[(k, last)].to_numpy()[home], wide[(k, last)].to_numpy()[fi], inds.at[k, "better"], True)
            lines.append(f"{inds.at[k, 'label']}: {wide[(k, last)].to_numpy()[fi]:.2f}, rank {p['rank']} of {p['of']} "
                         f"in {HOME} (median {b['median']:.2f}).")
        lines.append("Rankings and composite scores can mislead: coverage is incomplete, the choice of indicators")
        lines.append("and their direction are value judgements, small differences are within the noise, and the")
        lines.append("figures say nothing about teaching quality or research value to society.")
        for i, s in enumerate(lines):
            fig.text(0.08, 0.9 - 0.025 * i, s, fontsize=8)
        table_rows = []
        keys = list(inds.index[:10])
        for k in keys:
            for g in (HOME, "World"):
                b = dists[(g, k, last)]
                col = wide[(k, last)].to_numpy()
                p = place(col[groups[g]], col[fi], inds.at[k, "better"], bool(groups[g][fi]))
                table_rows.append([short(inds, k), g, f"{col[fi]:.2f}", f"{p['rank']} of {p['of']}",
                                   f"{p['percentile']:.0f}", f"{b['median']:.2f}"])
        ax = fig.add_axes([0.08, 0.05, 0.84, 0.6])
        ax.axis("off")
        ax.table(cellText=table_rows, colLabels=["Indicator", "Group", "Value", "Rank", "Percentile", "Median"],
                 loc="upper center", fontsize=7)
        pdf.savefig(fig)
        plt.close(fig)

        def boxes(title, keys):
            fig, axes = plt.subplots(1, len(keys), figsize=(8.27, 4))
            for ax, k in zip(np.atleast_1d(axes), keys):
                col = wide[(k, last)].to_numpy()
                data = [col[groups[g]][~np.isnan(col[groups[g]])] for g in (HOME, "World")]
                ax.boxplot(data, labels=[HOME, "World"], whis=1.5, flierprops={"markersize": 2})
                ax.plot([1, 2], [col[fi]] * 2, "D", color="#d55e00", markeredgecolor="black")
                ax.set_title(short(inds, k), fontsize=8)
            fig.suptitle(title)
            pdf.savefig(fig)
            plt.close(fig)

        def trends(title, keys):
            fig, axes = plt.subplots(1, len(keys), figsize=(8.27, 4))
            for ax, k in zip(np.atleast_1d(axes), keys):
                for g, colour in ((HOME, "#0072b2"), ("World", "#009e73")):
                    ys = [y for y in years if (g, k, y) in dists]
                    ax.fill_between(ys, [dists[(g, k, y)]["q1"] for y in ys], [dists[(g, k, y)]["q3"] for y in ys],
                                    alpha=0.2, color=colour)
                    ax.plot(ys, [dists[(g, k, y)]["median"] for y in ys], color=colour, label=g)
                ax.plot(years, [wide[(k, y)].to_numpy()[fi] for y in years], "D-", color="#d55e00")
                ax.set_title(short(inds, k), fontsize=8)
                ax.legend(fontsize=6)
            fig.suptitle(title)
            pdf.savefig(fig)
            plt.close(fig)

        def scatter(title, g, x, y, fit):
            fig, ax = plt.subplots(figsize=(8.27, 5))
            cx, cy = wide[(x, last)].to_numpy()[groups[g]], wide[(y, last)].to_numpy()[groups[g]]
            ok = ~np.isnan(cx) & ~np.isnan(cy)
            ax.scatter(cx[ok], cy[ok], s=4, color="grey")
            if fit:
                a, b = np.polyfit(cx[ok], cy[ok], 1)
                xs = np.array([cx[ok].min(), cx[ok].max()])
                ax.plot(xs, a * xs + b, color="black")
            ax.plot(wide[(x, last)].to_numpy()[fi], wide[(y, last)].to_numpy()[fi], "D", color="#d55e00")
            ax.set_xlabel(short(inds, x))
            ax.set_ylabel(short(inds, y))
            fig.suptitle(title)
            pdf.savefig(fig)
            plt.close(fig)

        def bars(title, g, k, limit):
            col = wide[(k, last)].to_numpy()
            idx = np.flatnonzero(groups[g] & ~np.isnan(col))
            order = idx[np.argsort(-col[idx], kind="stable")][:limit]
            if fi not in order:
                order = np.append(order, fi)
            fig, ax = plt.subplots(figsize=(8.27, 5))
            ax.barh(range(len(order)), col[order], color=["#d55e00" if i == fi else "grey" for i in order])
            ax.set_yticks(range(len(order)), reg["name"].to_numpy()[order], fontsize=6)
            ax.axvline(dists[(g, k, last)]["median"], color="black", linestyle="--")
            ax.invert_yaxis()
            fig.suptitle(title)
            pdf.savefig(fig)
            plt.close(fig)

        boxes("Research output and impact", ["citation_impact", "top10_share", "papers_per_academic"])
        boxes("Research income and doctorates", ["research_income_per_academic", "doctorates_per_academic"])
        trends("Research over the span", ["citation_impact", "papers_per_academic"])
        scatter("Research income and citation impact", HOME, "research_income_per_academic", "citation_impact", True)
        boxes("International and industry links",
              ["intl_coauthorship", "industry_coauthorship", "intl_staff_share", "intl_student_share"])
        trends("International staff and students", ["intl_staff_share", "intl_student_share"])
        scatter("Students per academic and completion", "World", "students_per_academic", "completion_rate", False)
        bars("Citation impact, leading institutions of the home system", HOME, "citation_impact", 15)

        # Heatmap: the focus's percentile in the six largest systems.
        systems = [f"System {i:03d}" for i in range(1, 7)]
        hk = ["citation_impact", "top10_share", "papers_per_academic", "research_income_per_academic",
              "intl_coauthorship", "intl_student_share", "students_per_academic", "completion_rate"]
        grid = np.array([[place(wide[(k, last)].to_numpy()[groups[g]], wide[(k, last)].to_numpy()[fi],
                                inds.at[k, "better"], bool(groups[g][fi]))["percentile"] for k in hk] for g in systems])
        fig, ax = plt.subplots(figsize=(8.27, 4))
        ax.imshow(grid, cmap="Blues", vmin=0, vmax=100)
        ax.set_xticks(range(len(hk)), [short(inds, k) for k in hk], rotation=60, fontsize=6)
        ax.set_yticks(range(len(systems)), systems, fontsize=7)
        for r in range(grid.shape[0]):
            for c in range(grid.shape[1]):
                ax.text(c, r, f"{grid[r, c]:.0f}", ha="center", va="center", fontsize=6)
        fig.suptitle("Percentile of the focus within the largest systems")
        pdf.savefig(fig)
        plt.close(fig)

        boxes("Finance", ["income_per_student", "operating_surplus", "research_income_share"])

        # Radar: percentiles in the home system.
        rk = ["citation_impact", "top10_share", "papers_per_academic", "intl_coauthorship", "intl_staff_share",
              "completion_rate", "peer_esteem", "exchange_income_per_academic"]
        pct = [place(wide[(k, last)].to_numpy()[home], wide[(k, last)].to_numpy()[fi], inds.at[k, "better"], True)
               ["percentile"] for k in rk]
        ang = np.linspace(0, 2 * np.pi, len(rk), endpoint=False)
        fig = plt.figure(figsize=(8.27, 5))
        ax = fig.add_subplot(projection="polar")
        ax.plot(np.append(ang, ang[0]), pct + pct[:1], color="#d55e00")
        ax.set_xticks(ang, [short(inds, k) for k in rk], fontsize=6)
        ax.set_ylim(0, 100)
        fig.suptitle("Profile against the home system")
        pdf.savefig(fig)
        plt.close(fig)

        bars("Peer esteem, leading institutions of the world", "World", "peer_esteem", 20)

        # Coverage page, as the check summary.
        fig = plt.figure(figsize=(8.27, 11.69))
        fig.text(0.08, 0.95, "Coverage", fontsize=14, weight="bold")
        for i, (k, y, c) in enumerate(cov[:: len(years)]):
            fig.text(0.08, 0.9 - 0.02 * i, f"{k}: {100 * c:.0f}% in {y}", fontsize=7)
        pdf.savefig(fig)
        plt.close(fig)
    del world_mask


if __name__ == "__main__":
    main()
