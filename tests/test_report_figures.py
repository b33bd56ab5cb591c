"""The report's figures as SVG (``pipelines/report_figures.py`` on
``pipelines/svg_plot.py``): well-formed, titled, axes labelled with their
units, the sample stated on the scatter figures, ids unique on the page, and
the van Arkel-Ketelaar regions drawn where the scorer's own rule
(``scorer.character.van_arkel_ketelaar_bond_type``) puts them. Tick spacing
is checked against Heckbert's nice-number rule (Graphics Gems, 1990).

These are properties of our own drawing; the demo table (datasets/demo,
invented) supplies the data.
"""
from __future__ import annotations

import math
import re
import xml.etree.ElementTree as ET
from pathlib import Path

import numpy as np
import pytest

from ionicity.pipelines.report import aggregate
from ionicity.pipelines.report_figures import CHI_MAX, CHI_MIN, figures, region_polygons
from ionicity.pipelines.report_html import report_file
from ionicity.pipelines.run import score_file
from ionicity.pipelines.svg_plot import Scale, log_ticks, nice_step, nice_ticks
from ionicity.scorer.character import van_arkel_ketelaar_bond_type

ROOT = Path(__file__).resolve().parents[1]
SVG = "{http://www.w3.org/2000/svg}"
#: figure -> what its two axis labels must say (their units; counts are "rows")
UNITS = {
    "bond_map": ("(Pauling units)", "(Pauling units)"),
    "melting": ("(dimensionless", "rows"),
    "lattice": ("(dimensionless", "(kJ/mol"),
    "hsab": ("anion_hsab_class", "cation_hsab_class"),  # categories: no unit
}


@pytest.fixture(scope="module")
def scored(tmp_path_factory):
    out = tmp_path_factory.mktemp("figures") / "demo.parquet"
    score_file(str(ROOT / "datasets" / "demo" / "inventory.csv"), str(out), name_col="name", quiet=True)
    return out


def _texts(root, cls=None):
    return ["".join(t.itertext()) for t in root.iter(SVG + "text") if cls is None or t.get("class") == cls]


@pytest.mark.parametrize("sample_rows", [3000, 50])
def test_every_figure_is_well_formed_titled_and_labelled(scored, sample_rows):
    data = aggregate(str(scored), sample_rows=sample_rows)
    figs = figures(data)
    assert set(UNITS) <= set(figs)
    for key, svg in figs.items():
        root = ET.fromstring(svg)  # raises on malformed XML
        assert root.tag == SVG + "svg" and root.get("viewBox"), key
        assert root.find(SVG + "title").text, key
        assert len(_texts(root, "title")) == 1, key
        labels = _texts(root, "axis-label")
        for unit, label in zip(UNITS.get(key, ()), labels):
            assert unit in label, (key, label)
    for key in ("bond_map", "lattice"):  # the scatter figures say what their points are
        notes = [t for t in _texts(ET.fromstring(figs[key])) if t.startswith("Points:")]
        if sample_rows >= data.rows:
            assert notes and "all " in notes[0] and f"of {data.rows:,})" in notes[0], notes
        else:
            assert notes and f"a uniform random sample of {sample_rows:,} of {data.rows:,} rows" in notes[0], notes
            assert any(t.startswith("rows per") for t in _texts(ET.fromstring(figs[key]))), key  # the density's bar


def test_the_page_keeps_ids_unique_and_draws_markers_of_the_sample(scored, tmp_path):
    page = tmp_path / "p.html"
    data = report_file(str(scored), str(page))
    text = page.read_text(encoding="utf-8")
    ids = re.findall(r'\sid="([^"]+)"', text)
    assert len(ids) == len(set(ids))  # five inline SVGs share one document
    # every sampled row with both electronegativities is one marker of the bond map
    svg = ET.fromstring(figures(data)["bond_map"])
    legend = [t for t in _texts(svg) if re.search(r"\(\d[\d,]*\)$", t)]
    drawn = sum(int(re.search(r"\(([\d,]+)\)$", t).group(1).replace(",", "")) for t in legend)
    assert drawn == int(np.sum(np.isfinite(data.sample["x"]) & np.isfinite(data.sample["y"])))


def _area(poly):
    return 0.5 * abs(sum(x1 * y2 - x2 * y1 for (x1, y1), (x2, y2) in zip(poly, poly[1:] + poly[:1])))


def test_region_polygons_follow_the_scorers_rule():
    polys = region_polygons()
    # they tile the triangle: the areas add up to the whole (side 3.19, height 3.19, Pauling units)
    whole = 0.5 * (CHI_MAX - CHI_MIN) ** 2
    assert sum(_area(p) for _, p in polys) == pytest.approx(whole, rel=1e-9)
    rng = np.random.default_rng(0)
    for name, poly in polys:
        pts = np.array(poly)
        for _ in range(50):  # random points inside (convex combinations of the corners)
            w = rng.dirichlet(np.ones(len(pts)))
            x, y = w @ pts
            assert van_arkel_ketelaar_bond_type(x, y) == name, (name, x, y)


def test_ticks_are_nice_numbers():
    # Heckbert, "Nice numbers for graph labels", Graphics Gems (1990): steps of 1, 2 or 5 times a power of ten
    for lo, hi in ((0, 3.6), (1.5, 4.0), (0, 7123), (105, 543), (0.79, 3.98), (-3, 2500)):
        step = nice_step(hi - lo)
        mantissa = step / 10 ** math.floor(math.log10(step))
        assert round(mantissa, 9) in (1, 2, 5), (lo, hi, step)
        ticks = nice_ticks(lo, hi)
        assert ticks[0] >= lo and ticks[-1] <= hi and 3 <= len(ticks) <= 11, (lo, hi, ticks)
        assert np.allclose(np.diff(ticks), step)
    assert nice_step(543 - 105, target=5) == 100  # Heckbert's example range 105-543 labelled by 100 (from memory)
    assert log_ticks(100, 1e5)[::2] == [100, 1000, 10000, 100000]


def test_log_scale_places_decades_evenly():
    s = Scale(100, 100000, log=True, p0=0, p1=300)
    assert s(np.array([100, 1000, 10000, 100000])).tolist() == pytest.approx([0, 100, 200, 300])
