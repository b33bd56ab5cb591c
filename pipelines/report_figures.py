"""The figures of ``ionicity report``: inline SVG written by our own
:mod:`ionicity.pipelines.svg_plot` from the streaming aggregates of
:mod:`ionicity.pipelines.report` (no plotting library: the figures of a
report take under a tenth of a second, not the second and a quarter matplotlib took).

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

import numpy as np

from ionicity.pipelines.report import (
    CHI_DELTA_BINS, CHI_MEAN_BINS, HUNDRED_C_K, LATTICE_LOG_BINS, LIQUIDUS_BINS, TREND_BINS, Bins, ReportData,
    melting_bands,
)
from ionicity.pipelines.svg_plot import Plot, Scale, ramp_colour, text_px
from ionicity.scorer.character import (
    COVALENT_MIN_MEAN_CHI, IONIC_DELTA_CHI, IONIC_MAX_LOW_CHI, METALLIC_MAX_MEAN_CHI, NONMETAL_MIN_HIGH_CHI,
    POLAR_DELTA_CHI,
)

__all__ = ["PALETTE", "MARKERS", "MELTING_COLOURS", "DENSITY_RAMP", "CLASS_GROUPS", "group_of", "region_polygons",
           "figures"]

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
    "ionic salt": "circle", "ionic liquid": "diamond", "acid or base": "triangle", "molecular": "square",
    "network or semiconductor": "plus", "metallic": "triangle_down", "element": "star", "other": "cross",
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
#: melting classes by temperature tier (below 100 C, to 300 C, to 1500 C, above; the last for a class the
#: bands do not know): the palette's own hues, so the CVD check above covers them
MELTING_COLOURS = ("#e8a33d", "#c85fb8", "#1f4e9c", "#7a4a16", "#a8a8a8")
#: single-hue density ramp, light to dark (its lightness falls monotonically: tests/test_report.py)
DENSITY_RAMP = ("#ffffff", "#d5dde8", "#8fa3c0", "#3d5a80", "#14243a")
#: hatches of the classes that share a tier (salts first, as the bands list them, then other compounds),
#: so that the classes stay apart in print and without colour
_HATCHES = ("", "//", "xx", "..")
_REGION_TINTS = {
    "ionic": "#f3e9d2", "ionic_covalent": "#e2ecf4", "covalent": "#eef0e4",
    "covalent_metallic": "#e9e4ef", "metallic": "#ece6df", "metallic_ionic": "#f3e4e9",
}
_REGION_LABELS = {   # data position and rotation of each region's name
    "ionic": (2.35, 2.45, 0), "ionic_covalent": (2.95, 1.05, 0), "metallic_ionic": (1.45, 0.9, 0),
    "metallic": (1.35, 0.2, 0), "covalent_metallic": (2.07, 0.24, -90), "covalent": (2.95, 0.2, 0),
}
CHI_MIN, CHI_MAX = 0.79, 3.98   # Cs and F on the Pauling scale (the triangle's corners)


def group_of(substance_class) -> str:
    """The colour group of a substance class.

    >>> group_of("ionic_liquid_pair"), group_of("unknown")
    ('ionic liquid', 'other')
    """
    return CLASS_GROUPS.get(substance_class, "other")


def _clip(poly: list[tuple[float, float]], a: float, b: float, c: float) -> list[tuple[float, float]]:
    """The part of a convex polygon where a*x + b*y <= c (Sutherland-Hodgman, one edge)."""
    out = []
    for (x1, y1), (x2, y2) in zip(poly, poly[1:] + poly[:1]):
        f1, f2 = a * x1 + b * y1 - c, a * x2 + b * y2 - c
        if f1 <= 0:
            out.append((x1, y1))
        if f1 * f2 < 0:
            t = f1 / (f1 - f2)
            out.append((x1 + t * (x2 - x1), y1 + t * (y2 - y1)))
    return out


def region_polygons() -> list[tuple[str, list[tuple[float, float]]]]:
    """The regions of the van Arkel-Ketelaar triangle as convex polygons (mean_chi, delta_chi), drawn from the
    thresholds of :func:`ionicity.scorer.character.van_arkel_ketelaar_bond_type` (every boundary is a line
    parallel to a side of the triangle, so each region is an intersection of half-planes; ionic_covalent,
    which is not convex, comes in two pieces).

    >>> [name for name, _ in region_polygons()]
    ['ionic', 'ionic_covalent', 'ionic_covalent', 'metallic_ionic', 'metallic', 'covalent_metallic', 'covalent']
    """
    triangle = [(CHI_MIN, 0.0), (CHI_MAX, 0.0), ((CHI_MIN + CHI_MAX) / 2, CHI_MAX - CHI_MIN)]
    y_ionic, y_polar = IONIC_DELTA_CHI, POLAR_DELTA_CHI

    def cut(*planes):
        poly = triangle
        for plane in planes:
            poly = _clip(poly, *plane)
        return poly

    # (a, b, c) means a*x + b*y <= c; "x - y/2 < 2.0" is (1, -0.5, 2.0), "x + y/2 >= 2.15" is (-1, -0.5, -2.15)
    low_partner_metal, high_partner_nonmetal = (1, -0.5, IONIC_MAX_LOW_CHI), (-1, -0.5, -NONMETAL_MIN_HIGH_CHI)
    return [
        ("ionic", cut((0, -1, -y_ionic), low_partner_metal)),
        ("ionic_covalent", cut((0, -1, -y_polar), (0, 1, y_ionic), high_partner_nonmetal)),
        ("ionic_covalent", cut((0, -1, -y_ionic), (-1, 0.5, -IONIC_MAX_LOW_CHI), high_partner_nonmetal)),
        ("metallic_ionic", cut((0, -1, -y_polar), (1, 0.5, NONMETAL_MIN_HIGH_CHI))),
        ("metallic", cut((0, 1, y_polar), (1, 0, METALLIC_MAX_MEAN_CHI))),
        ("covalent_metallic", cut((0, 1, y_polar), (-1, 0, -METALLIC_MAX_MEAN_CHI), (1, 0, COVALENT_MIN_MEAN_CHI))),
        ("covalent", cut((0, 1, y_polar), (-1, 0, -COVALENT_MIN_MEAN_CHI))),
    ]


def _sample_note(data: ReportData, shown: int) -> str:
    """What the points are: every row, or a sample (said on the figure)."""
    if len(data.sample.get("x", ())) >= data.rows:
        return f"Points: all {shown:,} rows with values (of {data.rows:,})."
    return (f"Points: a uniform random sample of {len(data.sample['x']):,} of {data.rows:,} rows ({shown:,} with values);"
            " shading: every row, binned.")


def _legend_title(data: ReportData) -> str:
    return "substance class" + (" (sample)" if data.rows > len(data.sample.get("x", ())) else "")


def _density(plot: Plot, counts: np.ndarray, xbins: Bins, ybins: Bins, ylog: bool, label: str, at: tuple) -> None:
    """Shade the non-empty cells of a 2-D histogram (log colour scale) and add its colour bar at pixel ``at``."""
    i, j = np.nonzero(counts)
    if not len(i):
        return
    c = counts[i, j].astype(float)
    top = float(c.max())
    t = 0.15 + 0.85 * (np.log10(c) / np.log10(top) if top > 1 else np.ones_like(c))
    xe, ye = xbins.edges(), ybins.edges()
    if ylog:
        ye = 10.0 ** ye
    plot.cells(xe[i], xe[i + 1], ye[j], ye[j + 1], [ramp_colour(DENSITY_RAMP, v) for v in t], opacity=0.8)
    plot.colour_bar(DENSITY_RAMP[1:], 1.0, max(top, 10.0), label, *at)


def _scatter_groups(plot: Plot, x, y, classes) -> int:
    """Markers of the sample by substance-class group (colour and shape); the number drawn."""
    lookup = {c: group_of(c) for c in set(classes.tolist())}
    groups = np.array([lookup[c] for c in classes], dtype=object)
    drawn = 0
    for g in PALETTE:
        m = groups == g
        if m.any():
            n = int(np.sum(np.isfinite(x[m]) & np.isfinite(y[m])))
            if n:
                drawn += plot.scatter(x[m], y[m], PALETTE[g], MARKERS[g], label=f"{g} ({n:,})")
    return drawn


def bond_map(data: ReportData) -> str:
    """The van Arkel-Ketelaar triangle: mean against difference of electronegativity."""
    title = "Bond-type map (van Arkel-Ketelaar triangle)"
    s = data.sample
    x, y = s.get("x", np.empty(0)), s.get("y", np.empty(0))
    shown = int(np.sum(np.isfinite(x) & np.isfinite(y)))
    plot = Plot("bondmap", Scale(CHI_MIN - 0.1, CHI_MAX + 0.1, target=8), Scale(-0.05, CHI_MAX - CHI_MIN + 0.1, target=8),
                width=860, height=600, legend_px=230)
    plot.legend_title = _legend_title(data)
    for region, poly in region_polygons():
        plot.polygon([p[0] for p in poly], [p[1] for p in poly], _REGION_TINTS[region], stroke="#9a9a9a", width=0.8)
    corners = [CHI_MIN, CHI_MAX, (CHI_MIN + CHI_MAX) / 2, CHI_MIN]
    plot.line(corners, [0, 0, CHI_MAX - CHI_MIN, 0], colour="#4d4d4d", width=1.2)
    for region, (lx, ly, rot) in _REGION_LABELS.items():
        plot.data_text(lx, ly, region.replace("_", "-"), size=11, anchor="middle", colour="#333333", rotate=rot,
                       extra=' font-style="italic" dominant-baseline="middle"')
    if data.rows > len(x):
        _density(plot, data.bond_map, CHI_MEAN_BINS, CHI_DELTA_BINS, False, "rows per 0.05 x 0.05 bin",
                 (plot.x1 - 60, plot.y1 + 70))  # right of the triangle's upper half: empty
    if s:
        _scatter_groups(plot, x, y, s["substance_class"])
    plot.axes("mean electronegativity of the contact pair, mean_chi_pauling (Pauling units)",
              "electronegativity difference, delta_chi_pauling (Pauling units)", title, _sample_note(data, shown))
    return plot.svg(title)


def _class_styles(data: ReportData, bands) -> list[tuple[str, int, str]]:
    """(melting class, colour index, hatch) in stacking order: the colour says the temperature tier of the
    class's band (tiers cut at the upper bounds from 100 C up), the hatch tells apart classes of one tier."""
    tiers = sorted({hi for _, _, hi, _ in bands if hi >= HUNDRED_C_K - 1e-9})
    out, used = [], {}
    for name, _, hi, _ in bands:
        tier = next(i for i, t in enumerate(tiers) if hi <= t + 1e-9)
        out.append((name, min(tier, len(MELTING_COLOURS) - 2), _HATCHES[used.get(tier, 0) % len(_HATCHES)]))
        used[tier] = used.get(tier, 0) + 1
    known = {b[0] for b in bands}
    return out + [(k, len(MELTING_COLOURS) - 1, "") for k in sorted(data.trend_by_class) if k not in known]


def melting_distribution(data: ReportData) -> str:
    """Stacked histogram of mp_trend_index by melting class, class bands marked."""
    title = "Melting trend by melting class (every row, binned by 0.025)"
    bands = melting_bands()
    stacked = [(name, colour, hatch, data.trend_by_class[name]) for name, colour, hatch in _class_styles(data, bands)
               if name in data.trend_by_class and data.trend_by_class[name].sum()]
    total = sum((h for *_, h in stacked), np.zeros(TREND_BINS.n, np.int64))
    top = max(float(total.max()) * 1.12, 1.0)
    width = max([text_px(f"{n} ({int(h.sum()):,} rows)") for n, *_, h in stacked] + [120.0])
    plot = Plot("melting", Scale(TREND_BINS.lo, TREND_BINS.hi), Scale(0, top), width=860, height=470,
                legend_px=int(width) + 40, top=70)
    plot.legend_title = "melting_class"
    edges = TREND_BINS.edges()
    bottom = np.zeros(TREND_BINS.n)
    for i, (name, colour, hatch, hist) in enumerate(stacked):
        fill = plot.hatch(f"class{i}", hatch, MELTING_COLOURS[colour])
        upper = bottom + hist
        # one outline per class (steps up along the top, back along the bottom): a shape, not 100 bars
        xs = np.concatenate([np.repeat(edges, 2)[1:-1], np.repeat(edges, 2)[1:-1][::-1]])
        ys = np.concatenate([np.repeat(upper, 2), np.repeat(bottom, 2)[::-1]])
        plot.polygon(xs, ys, fill, stroke="#ffffff", width=0.4)
        plot.legend_entry(f"{name} ({int(hist.sum()):,} rows)", fill)
        bottom = upper
    for row, upper in enumerate(sorted({hi for _, _, hi, _ in bands if np.isfinite(hi) and hi > 0})):
        plot.vline(np.log10(upper), f"{upper - 273.15:.0f} C", row=row % 2)  # two rows: 25 C and 100 C are close
    celsius = [c for c in (-200, -100, 0, 100, 300, 1000, 3000, 9000)
               if TREND_BINS.lo <= np.log10(c + 273.15) <= TREND_BINS.hi]
    plot.top_axis([np.log10(c + 273.15) for c in celsius], [f"{c:,}" for c in celsius], "trend temperature (C)")
    plot.axes("mp_trend_index (dimensionless: log10 of the trend temperature in K)", "rows", title)
    return plot.svg(title)


def lattice_vs_trend(data: ReportData) -> str:
    """Lattice energy (volume-based) against the melting trend."""
    title = "Lattice energy against the melting trend"
    s = data.sample
    trend = s.get("trend", np.empty(0))
    lattice = np.where(s.get("lattice", np.empty(0)) > 0, s.get("lattice", np.empty(0)), np.nan)
    shown = int(np.sum(np.isfinite(trend) & np.isfinite(lattice)))
    plot = Plot("lattice", Scale(TREND_BINS.lo, TREND_BINS.hi), Scale(10 ** LATTICE_LOG_BINS.lo, 10 ** LATTICE_LOG_BINS.hi, log=True),
                width=860, height=520, legend_px=230)
    plot.legend_title = _legend_title(data)
    if data.rows > len(trend):
        _density(plot, data.lattice_trend, TREND_BINS, LATTICE_LOG_BINS, True, "rows per bin",
                 (plot.x1 - 70, plot.y0 - 190))
    if s:
        _scatter_groups(plot, trend, lattice, s["substance_class"])
    plot.axes("mp_trend_index (dimensionless: log10 of the trend temperature in K)",
              "lattice energy, volume-based (kJ/mol, log scale)", title, _sample_note(data, shown))
    return plot.svg(title)


def hsab_pairing(data: ReportData) -> str:
    """Counts of cation HSAB class against anion HSAB class, as a table of shaded cells."""
    title = "Hard and soft pairing (rows)"
    order = ["hard", "borderline", "soft"]
    cations = order + sorted({a for a, _ in data.hsab_pairs} - set(order))
    anions = order + sorted({b for _, b in data.hsab_pairs} - set(order))
    grid = np.array([[data.hsab_pairs.get((a, b), 0) for b in anions] for a in cations], dtype=float)
    plot = Plot("hsab", Scale(-0.5, len(anions) - 0.5), Scale(len(cations) - 0.5, -0.5), width=560, height=400,
                left=110)
    top = max(float(np.log10(grid.max() + 1)), 1.0)
    level = np.log10(grid + 1) / top
    ii, jj = np.meshgrid(np.arange(len(cations)), np.arange(len(anions)), indexing="ij")
    plot.cells((jj - 0.5).ravel(), (jj + 0.5).ravel(), (ii - 0.5).ravel(), (ii + 0.5).ravel(),
               [ramp_colour(DENSITY_RAMP, v) for v in level.ravel()])
    for i, j in zip(ii.ravel(), jj.ravel()):
        plot.data_text(j, i, f"{int(grid[i, j]):,}", size=13, anchor="middle",
                       colour="#ffffff" if level[i, j] > 0.55 else "#1a1a1a", extra=' dominant-baseline="middle"')
    plot.axes("anion_hsab_class (Pearson class of the anion)", "cation_hsab_class (Pearson class)", title,
              xticks=range(len(anions)), xtick_labels=anions, yticks=range(len(cations)), ytick_labels=cations,
              grid=False)
    return plot.svg(title)


def liquidus(data: ReportData) -> str:
    """Histogram of the mixtures' liquidus estimates."""
    title = "Liquidus estimates of the mixtures (binned by 25 K)"
    edges = LIQUIDUS_BINS.edges()
    nonzero = np.flatnonzero(data.liquidus)
    lo, hi = (edges[max(nonzero[0] - 2, 0)], edges[min(nonzero[-1] + 3, len(edges) - 1)]) if len(nonzero) else (0, 2500)
    plot = Plot("liquidus", Scale(lo, hi), Scale(0, max(float(data.liquidus.max()) * 1.12, 1.0)), width=760, height=400)
    k = np.flatnonzero(data.liquidus)
    plot.cells(edges[k] + 0.5, edges[k + 1] - 0.5, np.zeros(len(k)), data.liquidus[k], [PALETTE["ionic salt"]] * len(k))
    plot.vline(373.15, "100 C")
    plot.axes("liquidus_estimate_K (K)", "rows", title)
    return plot.svg(title)


def figures(data: ReportData) -> dict[str, str]:
    """Every figure the page shows, as SVG text keyed by section."""
    out = {
        "bond_map": bond_map(data),
        "melting": melting_distribution(data),
        "lattice": lattice_vs_trend(data),
        "hsab": hsab_pairing(data),
    }
    if data.has("liquidus_estimate_K") and data.liquidus.sum():
        out["liquidus"] = liquidus(data)
    return out
