#!/usr/bin/env python3
"""The 24-chart benchmark brief drawn with pandas and matplotlib: the
yardstick for peerpack's chart drawing in the README's performance table.

It reads the files `worldgen -brief charts` writes (register, dictionary,
long values, brief.md), takes the chart blocks from the brief (kind, groups,
indicators, limit, fit), computes what each chart shows (type 7 quartiles,
Tukey's whiskers at 1.5 x IQR, medians and interquartile ranges by year,
the focus's percentile rank: worse plus half the ties, itself among them)
and draws every chart into one PDF, one chart a page, in brief order:

  box      one panel per indicator, one box per group, the focus marked
  trend    one panel per indicator, each group's median line and IQR band,
           the focus's values
  scatter  every member of the groups, the focus marked, an optional
           least-squares line
  bars     the `limit` highest (lowest when lower is better) members, the
           focus added, the group's median as a line
  heatmap  the focus's percentile in each group (rows) and indicator
  radar    the focus's percentile on each indicator in the group

Usage: /usr/bin/python3 charts_peer.py WORLD_DIR OUT.pdf
"""

import os
import re
import sys

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402
import numpy as np  # noqa: E402
import pandas as pd  # noqa: E402
import yaml  # noqa: E402
from matplotlib.backends.backend_pdf import PdfPages  # noqa: E402

FOCUS_COLOUR = "#d55e00"
GROUP_COLOURS = ["#0072b2", "#009e73", "#cc79a7", "#e69f00", "#56b4e9", "#999999"]


def read_brief(path):
    with open(path, encoding="utf-8") as f:
        text = f.read()
    _, front, body = text.split("---\n", 2)
    meta = yaml.safe_load(front)
    charts = [yaml.safe_load(b) for b in re.findall(r"```chart\n(.*?)```", body, re.S)]
    return meta, charts


def load(world):
    reg = pd.read_csv(os.path.join(world, "institutions.csv"), dtype=str, keep_default_na=False)
    with open(os.path.join(world, "indicators.yaml"), encoding="utf-8") as f:
        inds = pd.DataFrame(yaml.safe_load(f)["indicators"]).set_index("key")
    vals = pd.read_csv(os.path.join(world, "values.csv"),
                       dtype={"institution": str, "year": "int16", "indicator": str, "value": "float64"})
    if not vals["institution"].isin(reg["id"]).all() or not vals["indicator"].isin(inds.index).all():
        sys.exit("values name an unknown institution or indicator")
    if vals.duplicated(["institution", "year", "indicator"]).any():
        sys.exit("a value is given twice")
    wide = vals.pivot(index="institution", columns=["indicator", "year"], values="value").reindex(reg["id"])
    return reg, inds, wide


def groups_of(reg, names):
    out = {}
    for g in names:
        if g == "World":
            out[g] = np.ones(len(reg), dtype=bool)
        else:
            out[g] = (reg["country"] == g).to_numpy()
    return out


def box_stats(v):
    v = v[~np.isnan(v)]
    q1, med, q3 = np.quantile(v, [0.25, 0.5, 0.75])  # type 7
    iqr = q3 - q1
    inside = v[(v >= q1 - 1.5 * iqr) & (v <= q3 + 1.5 * iqr)]
    out = v[(v < q1 - 1.5 * iqr) | (v > q3 + 1.5 * iqr)]
    return {"med": med, "q1": q1, "q3": q3, "whislo": inside.min(), "whishi": inside.max(), "fliers": out,
            "n": len(v)}


def percentile(members, value, better, in_group):
    m = members[~np.isnan(members)]
    if np.isnan(value):
        return np.nan
    worse = (m > value).sum() if better == "lower" else (m < value).sum()
    ties = (m == value).sum()
    of = len(m)
    if not in_group:
        of, ties = of + 1, ties + 1
    return 100 * (worse + 0.5 * ties) / of


def label(inds, k):
    return f"{inds.at[k, 'short']} ({inds.at[k, 'unit']})"


def main():
    world, out = sys.argv[1], sys.argv[2]
    meta, charts = read_brief(os.path.join(world, "brief.md"))
    reg, inds, wide = load(world)
    year, first, last = meta["year"], meta["years"][0], meta["years"][1]
    years = [y for y in range(first, last + 1)]
    ids = reg["id"].to_numpy()
    names = reg["short_name"].to_numpy()
    fi = int(np.flatnonzero(ids == meta["focus"])[0])
    groups = groups_of(reg, sorted({g for c in charts for g in c["groups"]}))

    def col(k, y=year):
        return wide[(k, y)].to_numpy()

    with PdfPages(out, metadata={"Title": meta["title"]}) as pdf:
        for no, c in enumerate(charts, 1):
            kind, gs, ks = c["kind"], c["groups"], c["indicators"]
            if kind == "box":
                fig, axes = plt.subplots(1, len(ks), figsize=(6.7, 0.9 + 0.6 * len(gs)), squeeze=False)
                for ax, k in zip(axes[0], ks):
                    stats = [box_stats(col(k)[groups[g]]) for g in gs]
                    ax.bxp(stats, vert=False, showfliers=True, flierprops={"markersize": 2})
                    ax.plot([col(k)[fi]] * len(gs), range(1, len(gs) + 1), "D", color=FOCUS_COLOUR,
                            markeredgecolor="black")
                    for i, s in enumerate(stats, 1):
                        ax.annotate(f"{s['med']:.2f}", (s["med"], i + 0.3), fontsize=6, ha="center")
                    ax.set_yticks(range(1, len(gs) + 1), [f"{g} n={s['n']}" for g, s in zip(gs, stats)], fontsize=6)
                    ax.set_xlabel(label(inds, k), fontsize=7)
                    ax.tick_params(labelsize=6)
            elif kind == "trend":
                fig, axes = plt.subplots(1, len(ks), figsize=(6.7, 3), squeeze=False)
                for ax, k in zip(axes[0], ks):
                    for gi, g in enumerate(gs):
                        qs = np.array([np.nanquantile(col(k, y)[groups[g]], [0.25, 0.5, 0.75]) for y in years])
                        ax.fill_between(years, qs[:, 0], qs[:, 2], alpha=0.2, color=GROUP_COLOURS[gi])
                        ax.plot(years, qs[:, 1], "o--", color=GROUP_COLOURS[gi], markersize=3, label=g)
                    ax.plot(years, [col(k, y)[fi] for y in years], "D-", color=FOCUS_COLOUR, markersize=4,
                            label=meta["focus"])
                    ax.set_ylabel(label(inds, k), fontsize=7)
                    ax.tick_params(labelsize=6)
                    ax.legend(fontsize=5)
            elif kind == "scatter":
                x, y = ks
                fig, ax = plt.subplots(figsize=(6.7, 4))
                cx, cy = col(x), col(y)
                seen = np.zeros(len(reg), dtype=bool)
                allx, ally = [], []
                for gi, g in enumerate(gs):
                    ok = groups[g] & ~seen & ~np.isnan(cx) & ~np.isnan(cy)
                    seen |= ok
                    ax.scatter(cx[ok], cy[ok], s=9, color=GROUP_COLOURS[gi], alpha=0.5, edgecolors=GROUP_COLOURS[gi],
                               label=f"{g} (n={ok.sum()})")
                    allx.append(cx[ok])
                    ally.append(cy[ok])
                if c.get("fit"):
                    ax_, ay_ = np.concatenate(allx), np.concatenate(ally)
                    a, b = np.polyfit(ax_, ay_, 1)
                    xs = np.array([ax_.min(), ax_.max()])
                    ax.plot(xs, a * xs + b, "--", color="grey")
                ax.plot(cx[fi], cy[fi], "D", color=FOCUS_COLOUR, markeredgecolor="black")
                ax.annotate(names[fi], (cx[fi], cy[fi]), xytext=(5, 5), textcoords="offset points", fontsize=7)
                ax.set_xlabel(label(inds, x), fontsize=7)
                ax.set_ylabel(label(inds, y), fontsize=7)
                ax.tick_params(labelsize=6)
                ax.legend(fontsize=6)
            elif kind == "bars":
                k, g = ks[0], gs[0]
                v = col(k)
                idx = np.flatnonzero(groups[g] & ~np.isnan(v))
                sign = 1 if inds.at[k, "better"] == "lower" else -1
                order = list(idx[np.argsort(sign * v[idx], kind="stable")][: c.get("limit", 15)])
                if fi not in order:
                    order.append(fi)
                fig, ax = plt.subplots(figsize=(6.7, 0.5 + 0.17 * len(order)))
                ax.barh(range(len(order)), v[order],
                        color=[FOCUS_COLOUR if i == fi else "#9aa5b1" for i in order])
                ax.set_yticks(range(len(order)), names[order], fontsize=6)
                for r, i in enumerate(order):
                    ax.annotate(f"{v[i]:.2f}", (v[i], r), xytext=(2, 0), textcoords="offset points", fontsize=5,
                                va="center")
                ax.axvline(np.nanmedian(v[groups[g]]), color="black", linestyle="--", linewidth=0.8)
                ax.invert_yaxis()
                ax.set_xlabel(label(inds, k), fontsize=7)
                ax.tick_params(labelsize=6)
            elif kind == "heatmap":
                grid = np.array([[percentile(col(k)[groups[g]], col(k)[fi], inds.at[k, "better"], bool(groups[g][fi]))
                                  for k in ks] for g in gs])
                fig, ax = plt.subplots(figsize=(6.7, 0.8 + 0.3 * len(gs)))
                ax.imshow(grid, cmap="Blues", vmin=0, vmax=100, aspect="auto")
                ax.set_xticks(range(len(ks)), [inds.at[k, "short"] for k in ks], rotation=45, ha="right", fontsize=6)
                ax.set_yticks(range(len(gs)), gs, fontsize=6)
                for r in range(grid.shape[0]):
                    for q in range(grid.shape[1]):
                        ax.text(q, r, f"{grid[r, q]:.0f}", ha="center", va="center", fontsize=6)
            elif kind == "radar":
                g = gs[0]
                pct = [percentile(col(k)[groups[g]], col(k)[fi], inds.at[k, "better"], bool(groups[g][fi])) for k in ks]
                ang = np.linspace(0, 2 * np.pi, len(ks), endpoint=False)
                fig = plt.figure(figsize=(6.7, 4))
                ax = fig.add_subplot(projection="polar")
                ax.plot(np.append(ang, ang[0]), pct + pct[:1], "D-", color=FOCUS_COLOUR, markersize=3)
                ax.fill(np.append(ang, ang[0]), pct + pct[:1], color=FOCUS_COLOUR, alpha=0.15)
                ax.plot(np.append(ang, ang[0]), [50] * (len(ks) + 1), "--", color="grey", linewidth=0.8)
                ax.set_xticks(ang, [inds.at[k, "short"] for k in ks], fontsize=6)
                ax.set_ylim(0, 100)
                ax.tick_params(labelsize=6)
            else:
                sys.exit(f"chart {no}: kind {kind} is not drawn here")
            fig.suptitle(c.get("title", ""), fontsize=9, weight="bold")
            fig.text(0.01, 0.01, f"Figure {no}. {c.get('caption', '')}", fontsize=7)
            fig.tight_layout(rect=(0, 0.03, 1, 0.95))
            pdf.savefig(fig)
            plt.close(fig)


if __name__ == "__main__":
    main()
