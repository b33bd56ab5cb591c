"""The figures of ``ionicity report``: inline SVG drawn by matplotlib from
the streaming aggregates of :mod:`ionicity.pipelines.report`.

The colours are chosen here. Eight substance-class groups, each also given
its own marker so colour is never the only cue. The hex values were picked
for this page and checked with a colour-vision-deficiency simulation
(Machado, Oliveira & Fernandes 2009, as implemented by the colorspacious
package, severity 100): the smallest distance between two groups in
CAM02-UCS is about 24 for normal vision and stays above 10 under simulated
protanomaly, deuteranomaly and tritanomaly (``tests/test_report.py``
recomputes it). Densities use one light-to-dark ramp of a single hue, which
reads the same under every simulated deficiency.
"""
from __future__ import annotations

import io
import re

import numpy as np

from ionicity.pipelines.report_extra import require_matplotlib
from ionicity.pipelines.report import (
    CHI_DELTA_BINS, CHI_MEAN_BINS, LATTICE_LOG_BINS, LIQUIDUS_BINS, TREND_BINS, ReportData, melting_bands,
)
from ionicity.scorer.character import van_arkel_ketelaar_bond_type

__all__ = ["PALETTE", "MARKERS", "CLASS_GROUPS", "group_of", "figures"]

#: substance-class group -> colour (chosen for this page; see the module docstring for the check)
PALETTE = {
    "ionic salt": "#1f4e9c",
    "ionic liquid": "#e8a33d",
    "acid or base": "#c85fb8",
    "molecular": "#5fb8e8",
    "network or semiconductor": "#3a8a5c",
    "metallic": "#7a4a16",
    "element": "#262626",
    "other": "#a8a8a8",
}
MARKERS = {
    "ionic salt": "o", "ionic liquid": "D", "acid or base": "^", "molecular": "s",
    "network or semiconductor": "P", "metallic": "v", "element": "*", "other": "x",
}
#: substance_class values (today's and those agreed for the classification work) -> group
CLASS_GROUPS = {
    "ionic_salt": "ionic salt", "zintl_phase": "ionic salt",
    "ionic_liquid_pair": "ionic liquid",
    "acid": "acid or base", "base": "acid or base",
    "covalent_molecular": "molecular",
    "covalent_network": "network or semiconductor", "semiconductor": "network or semiconductor",
    "chain_layer_solid": "network or semiconductor",
    "metallic": "metallic", "intermetallic": "metallic",
    "element": "element",
}
#: melting class -> colour (the same hues, ordered from low to high melting)
MELTING_COLOURS = ("#e8a33d", "#c85fb8", "#1f4e9c", "#7a4a16", "#262626", "#a8a8a8")
_RAMP = ("#ffffff", "#d5dde8", "#8fa3c0", "#3d5a80", "#14243a")   # single-hue density ramp
_REGION_TINTS = {
    "ionic": "#f3e9d2", "ionic_covalent": "#e2ecf4", "covalent": "#eef0e4",
    "covalent_metallic": "#e9e4ef", "metallic": "#ece6df", "metallic_ionic": "#f3e4e9",
}
_REGION_LABELS = {
    "ionic": (2.35, 2.45, 0), "ionic_covalent": (2.95, 1.05, 0), "metallic_ionic": (1.45, 0.9, 0),
    "metallic": (1.35, 0.2, 0), "covalent_metallic": (2.07, 0.24, 90), "covalent": (2.95, 0.2, 0),
}
CHI_MIN, CHI_MAX = 0.79, 3.98   # Cs and F on the Pauling scale (the triangle's corners)


def group_of(substance_class) -> str:
    """The colour group of a substance class.

    >>> group_of("ionic_liquid_pair"), group_of("unknown")
    ('ionic liquid', 'other')
    """
    return CLASS_GROUPS.get(substance_class, "other")


def _mpl():
    """The matplotlib pieces the figures use. matplotlib is the optional report extra: imported only when a
    figure is drawn (about 0.3 s, python -X importtime), after :func:`require_matplotlib` has checked it."""
    from matplotlib import colors, ticker
    from matplotlib.backends.backend_svg import FigureCanvasSVG
    from matplotlib.figure import Figure

    return colors, ticker, FigureCanvasSVG, Figure


def _figure(width=7.2, height=4.6):
    _, _, FigureCanvasSVG, Figure = _mpl()
    fig = Figure(figsize=(width, height))
    FigureCanvasSVG(fig)
    return fig


def _svg(fig) -> str:
    buf = io.StringIO()
    fig.savefig(buf, format="svg", bbox_inches="tight")
    text = buf.getvalue()
    text = re.sub(r"^<\?xml[^>]*>\s*", "", text)
    text = re.sub(r"<!DOCTYPE[^>]*>\s*", "", text)
    return re.sub(r"<metadata>.*?</metadata>", "", text, flags=re.S)


def _ramp():
    return _mpl()[0].LinearSegmentedColormap.from_list("ionicity_density", _RAMP)


def _sample_note(data: ReportData, shown: int) -> str:
    """What the points are: every row, or a sample (said on the figure)."""
    if len(data.sample.get("x", ())) >= data.rows:
        return f"points: all {shown:,} rows with values (of {data.rows:,})"
    return (f"points: a uniform random sample of {len(data.sample['x']):,} of {data.rows:,} rows ({shown:,} with values);"
            " shading: every row, binned")


def _scatter_groups(ax, x, y, classes):
    lookup = {c: group_of(c) for c in set(classes.tolist())}
    groups = np.array([lookup[c] for c in classes], dtype=object)
    # thousands of vector markers make the page slow to write and to open: above a few hundred
    # points the markers are drawn as one embedded image (axes, labels and legend stay vector)
    raster = len(classes) > 600
    for g in PALETTE:
        m = (groups == g) & np.isfinite(x) & np.isfinite(y)
        if m.any():
            ax.scatter(x[m], y[m], s=22 if MARKERS[g] != "*" else 50, marker=MARKERS[g], c=PALETTE[g],
                       edgecolors="white" if MARKERS[g] not in ("x", "P") else None, linewidths=0.4,
                       label=f"{g} ({int(m.sum()):,})", alpha=0.9, zorder=3, rasterized=raster)


def bond_map(data: ReportData) -> str:
    """The van Arkel-Ketelaar triangle: mean against difference of electronegativity."""
    fig = _figure(7.4, 5.4)
    ax = fig.add_subplot()
    gx = np.linspace(CHI_MIN, CHI_MAX, 160)
    gy = np.linspace(0, CHI_MAX - CHI_MIN, 140)
    X, Y = np.meshgrid(gx, gy)
    inside = (X - Y / 2 >= CHI_MIN - 1e-9) & (X + Y / 2 <= CHI_MAX + 1e-9)
    regions = list(_REGION_TINTS)
    code = np.full(X.shape, np.nan)
    for i, j in zip(*np.nonzero(inside)):
        code[i, j] = regions.index(van_arkel_ketelaar_bond_type(X[i, j], Y[i, j]))
    tints = _mpl()[0].ListedColormap([_REGION_TINTS[r] for r in regions]).with_extremes(bad=(1, 1, 1, 0))
    # an image, not a mesh: 44,000 vector cells would make the page megabytes long
    ax.imshow(np.ma.masked_invalid(code), cmap=tints, vmin=-0.5, vmax=len(regions) - 0.5, origin="lower",
              extent=(gx[0], gx[-1], gy[0], gy[-1]), aspect="auto", interpolation="nearest", zorder=0)
    ax.contour(gx, gy, np.nan_to_num(code, nan=-1), levels=np.arange(-0.5, len(regions)), colors="#7d7d7d",
               linewidths=0.6, zorder=1)
    ax.plot([CHI_MIN, CHI_MAX, (CHI_MIN + CHI_MAX) / 2, CHI_MIN], [0, 0, CHI_MAX - CHI_MIN, 0], color="#4d4d4d", lw=1)
    for region, (lx, ly, rot) in _REGION_LABELS.items():
        ax.text(lx, ly, region.replace("_", "-"), ha="center", va="center", rotation=rot, fontsize=8,
                color="#333333", style="italic", zorder=2)
    s = data.sample
    shown = int(np.sum(np.isfinite(s.get("x", np.empty(0))) & np.isfinite(s.get("y", np.empty(0)))))
    if data.rows > len(s.get("x", ())) and data.bond_map.sum():
        hist = np.where(data.bond_map > 0, data.bond_map, np.nan).T
        mesh = ax.imshow(hist, cmap=_ramp(), norm=_mpl()[0].LogNorm(), alpha=0.75, zorder=2, origin="lower", aspect="auto",
                         extent=(CHI_MEAN_BINS.lo, CHI_MEAN_BINS.hi, CHI_DELTA_BINS.lo, CHI_DELTA_BINS.hi),
                         interpolation="nearest")
        # inside the empty top-right corner of the triangle, clear of the legend beside the axes
        bar = fig.colorbar(mesh, cax=ax.inset_axes([0.8, 0.5, 0.025, 0.45]), format="{x:,.0f}")  # plain numbers
        bar.minorticks_off()
        bar.set_label("rows per bin (0.05 x 0.05)", fontsize=7)
        bar.ax.tick_params(labelsize=7)
    if s:
        _scatter_groups(ax, s["x"], s["y"], s["substance_class"])
    ax.set_xlim(CHI_MIN - 0.1, CHI_MAX + 0.1)
    ax.set_ylim(-0.05, CHI_MAX - CHI_MIN + 0.1)
    ax.set_xlabel("mean electronegativity of the contact pair, mean_chi_pauling (Pauling units)")
    ax.set_ylabel("electronegativity difference, delta_chi_pauling (Pauling units)")
    ax.set_title("Bond-type map (van Arkel-Ketelaar triangle)")
    if ax.get_legend_handles_labels()[0]:  # a table whose every row failed has nothing to place
        ax.legend(fontsize=7, loc="upper left", bbox_to_anchor=(1.01, 1.0), title="substance class", title_fontsize=7)
    ax.text(0.0, -0.13, _sample_note(data, shown), transform=ax.transAxes, ha="left", va="top", fontsize=7)
    return _svg(fig)


def melting_distribution(data: ReportData) -> str:
    """Stacked histogram of mp_trend_index by melting class, class bands marked."""
    fig = _figure(7.4, 4.2)
    ax = fig.add_subplot()
    edges = TREND_BINS.edges()
    bottom = np.zeros(TREND_BINS.n)
    bands = melting_bands()
    order = [b[0] for b in bands] + sorted(k for k in data.trend_by_class if k not in {b[0] for b in bands})
    for i, name in enumerate(order):
        hist = data.trend_by_class.get(name)
        if hist is None or not hist.sum():
            continue
        # one outline per class (not a bar per bin): 4 shapes in the SVG instead of 400
        ax.stairs(bottom + hist, edges, baseline=bottom.copy(), fill=True,
                  facecolor=MELTING_COLOURS[min(i, len(MELTING_COLOURS) - 1)], edgecolor="white", linewidth=0.3,
                  label=f"{name} ({int(hist.sum()):,} rows)", hatch=("", "//", "", "..", "xx", "")[min(i, 5)])
        bottom += hist
    for name, lower, upper, _ in bands[:-1]:
        if np.isfinite(upper) and upper > 0:
            x = np.log10(upper)
            ax.axvline(x, color="#4d4d4d", ls="--", lw=0.8)
            ax.text(x, 1.0, f" {upper - 273.15:.0f} C", transform=ax.get_xaxis_transform(), fontsize=7,
                    va="top", ha="left")
    ax.set_xlim(TREND_BINS.lo, TREND_BINS.hi)
    ax.set_xlabel("mp_trend_index (dimensionless: log10 of the trend temperature in K)")
    ax.set_ylabel("rows")
    ax.set_title("Melting trend by melting class (every row, binned by 0.025)")
    top = ax.secondary_xaxis("top", functions=(lambda v: 10 ** np.asarray(v) - 273.15,
                                                lambda c: np.log10(np.maximum(np.asarray(c) + 273.15, 1e-3))))
    celsius = [c for c in (-200, -100, 0, 100, 300, 1000, 3000, 9000) if TREND_BINS.lo <= np.log10(c + 273.15) <= TREND_BINS.hi]
    top.set_xticks(celsius, [f"{c:,}" for c in celsius])
    top.set_xlabel("trend temperature (C)", fontsize=8)
    if ax.get_legend_handles_labels()[0]:
        ax.legend(fontsize=7, loc="upper left")
    return _svg(fig)


def lattice_vs_trend(data: ReportData) -> str:
    """Lattice energy (volume-based) against the melting trend."""
    fig = _figure(7.4, 4.6)
    ax = fig.add_subplot()
    s = data.sample
    finite = np.isfinite(s.get("trend", np.empty(0))) & (s.get("lattice", np.empty(0)) > 0) if s else np.empty(0, bool)
    if data.rows > len(s.get("trend", ())) and data.lattice_trend.sum():
        hist = np.where(data.lattice_trend > 0, data.lattice_trend, np.nan).T
        # a mesh (not an image) because the y axis is logarithmic; 100 x 60 cells
        mesh = ax.pcolormesh(TREND_BINS.edges(), 10 ** LATTICE_LOG_BINS.edges(), hist, cmap=_ramp(), norm=_mpl()[0].LogNorm(),
                             alpha=0.8, zorder=1, rasterized=True)
        bar = fig.colorbar(mesh, cax=ax.inset_axes([0.9, 0.06, 0.025, 0.4]), format="{x:,.0f}")
        bar.minorticks_off()
        bar.set_label("rows per bin", fontsize=7)
        bar.ax.tick_params(labelsize=7)
    if s:
        _scatter_groups(ax, s["trend"], np.where(s["lattice"] > 0, s["lattice"], np.nan), s["substance_class"])
    ax.set_yscale("log")
    ax.set_xlim(TREND_BINS.lo, TREND_BINS.hi)
    ax.set_ylim(10 ** LATTICE_LOG_BINS.lo, 10 ** LATTICE_LOG_BINS.hi)
    ticker = _mpl()[1]
    # plain numbers, not 10^n: the exponent labels go through mathtext, a third of the drawing time (cProfile)
    ticks = [100, 300, 1000, 3000, 10000, 30000, 100000]
    ax.yaxis.set_major_locator(ticker.FixedLocator(ticks))
    ax.yaxis.set_minor_locator(ticker.NullLocator())
    ax.set_yticks(ticks, [f"{t:,}" for t in ticks])
    ax.set_xlabel("mp_trend_index (dimensionless: log10 of the trend temperature in K)")
    ax.set_ylabel("lattice energy, volume-based (kJ/mol, log scale)")
    ax.set_title("Lattice energy against the melting trend")
    ax.text(0.0, -0.13, _sample_note(data, int(finite.sum())), transform=ax.transAxes, ha="left", va="top", fontsize=7)
    if s and finite.any():
        ax.legend(fontsize=7, loc="upper left", bbox_to_anchor=(1.01, 1.0), title="substance class", title_fontsize=7)
    return _svg(fig)


def hsab_pairing(data: ReportData) -> str:
    """Counts of cation HSAB class against anion HSAB class, as a table of shaded cells."""
    order = ["hard", "borderline", "soft"]
    cations = order + sorted({a for a, _ in data.hsab_pairs} - set(order))
    anions = order + sorted({b for _, b in data.hsab_pairs} - set(order))
    grid = np.array([[data.hsab_pairs.get((a, b), 0) for b in anions] for a in cations])
    fig = _figure(5.2, 3.6)
    ax = fig.add_subplot()
    cmap = _ramp()
    mesh = ax.imshow(np.log10(grid + 1), cmap=cmap, vmin=0, vmax=max(np.log10(grid.max() + 1), 1))
    dark = np.log10(grid + 1) > 0.55 * max(np.log10(grid.max() + 1), 1)
    for i in range(len(cations)):
        for j in range(len(anions)):
            ax.text(j, i, f"{grid[i, j]:,}", ha="center", va="center", fontsize=9,
                    color="white" if dark[i, j] else "#1a1a1a")
    ax.set_xticks(range(len(anions)), anions)
    ax.set_yticks(range(len(cations)), cations)
    ax.set_xlabel("anion_hsab_class (Pearson class of the anion)")
    ax.set_ylabel("cation_hsab_class")
    ax.set_title("Hard and soft pairing (rows)")
    del mesh
    return _svg(fig)


def liquidus(data: ReportData) -> str:
    """Histogram of the mixtures' liquidus estimates."""
    fig = _figure(7.0, 3.6)
    ax = fig.add_subplot()
    edges = LIQUIDUS_BINS.edges()
    ax.bar(edges[:-1], data.liquidus, width=np.diff(edges), align="edge", color=PALETTE["ionic salt"],
           edgecolor="white", linewidth=0.3)
    nonzero = np.flatnonzero(data.liquidus)
    if len(nonzero):
        ax.set_xlim(edges[max(nonzero[0] - 2, 0)], edges[min(nonzero[-1] + 3, len(edges) - 1)])
    lo, hi = ax.get_xlim()
    if lo < 373.15 < hi:  # a label outside the axes would stretch the tight bounding box
        ax.axvline(373.15, color="#4d4d4d", ls="--", lw=0.8)
        ax.text(373.15, 1.0, " 100 C", transform=ax.get_xaxis_transform(), fontsize=7, va="top")
    ax.set_xlabel("liquidus_estimate_K (K)")
    ax.set_ylabel("rows")
    ax.set_title("Liquidus estimates of the mixtures (binned by 25 K)")
    return _svg(fig)


def figures(data: ReportData) -> dict[str, str]:
    """Every figure the page shows, as SVG text keyed by section."""
    matplotlib = require_matplotlib()
    with matplotlib.rc_context({"svg.fonttype": "none", "font.size": 9, "font.family": "sans-serif",
                                "svg.hashsalt": "ionicity-report"}):
        out = {
            "bond_map": bond_map(data),
            "melting": melting_distribution(data),
            "lattice": lattice_vs_trend(data),
            "hsab": hsab_pairing(data),
        }
        if data.has("liquidus_estimate_K") and data.liquidus.sum():
            out["liquidus"] = liquidus(data)
    return out
