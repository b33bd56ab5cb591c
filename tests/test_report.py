"""``ionicity report``: the streaming aggregates against a plain full read
(pandas and numpy are the references), the optional columns of other
features, the command line's errors, the figures as SVG (well-formed,
titled, axes labelled with units, the sample stated; no plotting library
imported) and the colour scheme against a colour-vision-deficiency
simulation.

The demo table (datasets/demo, invented) is scored once per module. The
optional columns (slips, name checks, duplicates, mixtures) are added to a
copy by hand where a test needs them: the test checks that the report
counts and lists what the table says, not the values themselves.
"""
from __future__ import annotations

import itertools
import re
import subprocess
import sys
from pathlib import Path

import numpy as np
import pandas as pd
import pyarrow as pa
import pyarrow.parquet as pq
import pytest

from ionicity.pipelines.report import (
    CHI_DELTA_BINS, CHI_MEAN_BINS, TREND_BINS, aggregate, classes_melting_below, melting_bands, reason_of,
)
from ionicity.pipelines.report_html import SECTIONS, report_file
from ionicity.pipelines.run import score_file

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "datasets" / "demo" / "inventory.csv"


@pytest.fixture(scope="module")
def scored(tmp_path_factory):
    out = tmp_path_factory.mktemp("report") / "demo.parquet"
    score_file(str(DEMO), str(out), name_col="name", quiet=True)
    return out


@pytest.fixture(scope="module")
def frame(scored):
    return pd.read_parquet(scored)


def test_counts_match_a_full_read(scored, frame):
    data = aggregate(str(scored), batch_rows=37)  # many small batches: the sums must still be exact
    assert data.rows == len(frame) == 208  # datasets/demo/README.md: 208 data rows
    assert dict(data.counts["status"]) == frame["status"].value_counts().to_dict()
    assert dict(data.counts["substance_class"]) == frame["substance_class"].value_counts().to_dict()
    assert dict(data.counts["melting_class"]) == frame["melting_class"].value_counts().to_dict()
    pairs = frame.dropna(subset=["cation_hsab_class", "anion_hsab_class"])
    pairs = pairs[(pairs.cation_hsab_class != "") & (pairs.anion_hsab_class != "")]
    assert dict(data.hsab_pairs) == pairs.groupby(["cation_hsab_class", "anion_hsab_class"]).size().to_dict()


def test_binned_densities_equal_numpy_histograms(scored, frame):
    data = aggregate(str(scored), batch_rows=50)
    x, y = frame["mean_chi_pauling"].to_numpy(float), frame["delta_chi_pauling"].to_numpy(float)
    ok = np.isfinite(x) & np.isfinite(y)
    expected, _, _ = np.histogram2d(x[ok], y[ok], bins=[CHI_MEAN_BINS.edges(), CHI_DELTA_BINS.edges()])
    assert np.array_equal(data.bond_map, expected.astype(int))
    for name, hist in data.trend_by_class.items():
        t = frame.loc[frame.melting_class == name, "mp_trend_index"].to_numpy(float)
        assert np.array_equal(hist, np.histogram(t[np.isfinite(t)], bins=TREND_BINS.edges())[0]), name


def test_the_sample_is_bounded_and_uniform(scored):
    small = aggregate(str(scored), batch_rows=20, sample_rows=50, seed=1)
    assert len(small.sample["x"]) == 50
    whole = aggregate(str(scored), sample_rows=5000)
    assert len(whole.sample["x"]) == 208
    # bottom-k sampling is uniform: over many seeds each quarter of the file is kept k/4 times per run on
    # average, however the batches fall (binomial spread: 5 standard deviations allowed)
    per_quarter = np.zeros(4)
    for seed in range(60):
        d = aggregate(str(scored), batch_rows=64, sample_rows=52, seed=seed)
        assert len(set(d.sample["row"].tolist())) == 52
        per_quarter += np.bincount((d.sample["row"] - 1) // 52, minlength=4)
    expected = 60 * 13
    assert np.all(np.abs(per_quarter - expected) < 5 * np.sqrt(expected * 0.75)), per_quarter


def test_rows_below_100_c_are_those_a_filter_finds(scored, frame):
    data = aggregate(str(scored))
    below = classes_melting_below()
    # every class whose band ends at or below 100 C: the salts' ionic_liquid (the trade's
    # definition, Wasserscheid & Welton 2008, from memory), the two bands of other compounds
    # and the water-rich salt hydrates' melts_in_own_water (Lane 1983, from memory), and the gases (their
    # registry boiling points below 25 C, scorer/data/gases.csv)
    assert below == ("ionic_liquid", "liquid_at_room_temperature", "gas_at_room_temperature", "melts_below_100C",
                     "melts_in_own_water")
    low = frame[frame.melting_class.isin(below)]
    assert data.low_melting_rows == len(low)
    assert set(data.low_melting) == set(low.formula_normalized)
    for formula, info in data.low_melting.items():
        rows = low[low.formula_normalized == formula]
        assert info["rows"] == len(rows)
        assert info["first_row"] == rows.index[0] + 1
        assert info["name"] == rows.name.iloc[0]


def test_melting_bands_cover_every_class_without_gaps():
    # two ladders on one temperature scale: the salts' classes and the other compounds',
    # both ending in refractory (scorer.melting_routes.MELTING_CLASS_BANDS)
    bands = melting_bands()
    salt = [b for b in bands if b[0] in ("ionic_liquid", "low_melting_salt", "molten_salt", "refractory")]
    other = [b for b in bands if b[0] not in ("ionic_liquid", "low_melting_salt", "molten_salt", "melts_in_own_water",
                                              "loses_water_below_300C", "decomposes_below_300C",
                                              "gas_at_room_temperature")]
    # a gas's class stands in for the other compounds' lowest band (its registry boiling point, gases.csv)
    gas = [b for b in bands if b[0] == "gas_at_room_temperature"] + other[1:]
    # a water-rich salt hydrate's class stands in for the salts' lowest band (scorer.melting_routes)
    hydrate = [b for b in bands if b[0] == "melts_in_own_water"] + salt[1:]
    # a lower salt hydrate's class stands in for the salts' two lowest bands (it loses its water below 300 C)
    lower_hydrate = [b for b in bands if b[0] == "loses_water_below_300C"] + salt[2:]
    # so does a salt that decomposes below 300 C (a decomposition band: ammonium and peroxide salts, bicarbonates)
    decomposing = [b for b in bands if b[0] == "decomposes_below_300C"] + salt[2:]
    for ladder in (salt, other, hydrate, gas, lower_hydrate, decomposing):
        assert ladder[0][1] == 0.0 and ladder[-1][2] == float("inf")
        for (_, _, upper, _), (_, lower, _, _) in zip(ladder, ladder[1:]):
            assert upper == lower
    assert salt[0][2] == pytest.approx(100 + 273.15)  # 0 C = 273.15 K (SI definition)


def test_errors_are_listed_with_ids_names_and_grouped_reasons(scored, frame):
    data = aggregate(str(scored))
    errors = frame[frame.status == "error"]
    assert data.kind_rows["error"] == len(errors) >= 8  # datasets/demo/README.md plants at least 8
    first = data.first_rows["error"]
    assert [r["row"] for r in first] == [i + 1 for i in errors.index[: len(first)]]
    assert [r["id"] for r in first] == errors.item_id.tolist()[: len(first)]
    assert first[0]["name"] == errors.name.iloc[0]
    assert sum(data.reasons["error"].values()) == len(errors)
    # the placeholder N/A (datasets/demo/README.md) fails at its '/'; NaCl/KCl is read as a mixture
    assert data.reasons["error"][reason_of("unexpected character '/' at position 2 of 'N/A'")] == 1


def test_the_page_has_every_section_and_answers_the_two_questions(scored, tmp_path):
    out = tmp_path / "r.html"
    report_file(str(scored), str(out))
    page = out.read_text(encoding="utf-8")
    for sid, title in SECTIONS:
        assert f'<section id="{sid}"><h2>{title}</h2>' in page
    frame = pd.read_parquet(scored)
    assert f"Rows that could not be scored (status error): {int((frame.status == 'error').sum())}" in page
    below = int(frame.melting_class.isin(classes_melting_below()).sum())
    assert f"Predicted to melt below 100 C: {below} rows" in page
    assert "safety data sheet" in page
    # the scored demo carries the audit columns (slips, names, duplicates): each has its count
    assert "Typing slips with a suggestion:" in page and "Duplicates of an earlier row:" in page
    # self-contained: nothing fetched from anywhere
    assert not re.search(r"""(src|href)\s*=\s*["']?(https?:|//)""", page)
    assert "@import" not in page and "url(http" not in page
    assert page.count("<svg") >= 4


def _with_optional_columns(scored, path):
    table = pq.read_table(scored)
    # the scorer writes these columns itself now; they are set here to known values
    table = table.drop_columns([c for c in ("formula_suggested", "name_check", "name_formula",
                                            "first_row_same_compound", "liquidus_estimate_K", "mixture_components")
                                if c in table.column_names])
    n = table.num_rows
    suggested = [None] * n
    suggested[40] = "NaCl"                                       # QTS-0041 NaCL (datasets/demo/README.md)
    check = ["match"] * n
    check[2], check[96] = "mismatch", "hydrate_differs"
    name_formula = [None] * n
    name_formula[2] = "KCl"
    first = [None] * n
    first[190], first[202] = 1, 40                               # QTS-0191 and QTS-0203 duplicates (README)
    liquidus = [float("nan")] * n
    liquidus[179] = 931.0
    components = [None] * n
    components[179] = "NaCl;KCl"
    for name, values, typ in (("formula_suggested", suggested, pa.string()), ("name_check", check, pa.string()),
                              ("name_formula", name_formula, pa.string()),
                              ("first_row_same_compound", first, pa.int64()),
                              ("liquidus_estimate_K", liquidus, pa.float64()),
                              ("mixture_components", components, pa.string())):
        table = table.append_column(name, pa.array(values, typ))
    pq.write_table(table, path)
    return path


def test_optional_columns_are_shown_when_present(scored, tmp_path):
    path = _with_optional_columns(scored, tmp_path / "more.parquet")
    data = aggregate(str(path), batch_rows=64)
    assert data.kind_rows["slip"] == 1 and data.first_rows["slip"][0]["id"] == "QTS-0041"
    assert data.kind_rows["name_mismatch"] == 2
    assert [r["row"] for r in data.first_rows["duplicate"]] == [191, 203]
    assert data.kind_rows["mixture"] == 1 and data.liquidus.sum() == 1
    out = tmp_path / "more.html"
    report_file(str(path), str(out))
    page = out.read_text(encoding="utf-8")
    assert "Typing slips with a suggestion: 1" in page
    assert "Duplicates of an earlier row: 2" in page
    assert "Liquidus estimates of the mixtures" in page
    assert "not checked in this run" not in page.lower()


def test_a_scored_csv_is_reported_too(tmp_path, frame):
    scored_csv = tmp_path / "demo.csv"
    score_file(str(DEMO), str(scored_csv), name_col="name", quiet=True)  # as the fixture was scored
    data = aggregate(str(scored_csv), batch_rows=100)
    assert data.rows == 208 and dict(data.counts["status"]) == frame["status"].value_counts().to_dict()
    assert data.name_col == "name" and data.id_col == "item_id"  # found by name, the CSV carries no run options
    assert data.bond_map.sum() == int(np.sum(np.isfinite(frame.mean_chi_pauling) & np.isfinite(frame.delta_chi_pauling)))


def _cli(*args):
    return subprocess.run([sys.executable, "-m", "ionicity", *args], capture_output=True, text=True, cwd=ROOT, timeout=300)


def test_command_line_report_and_score_report(scored, tmp_path):
    out = tmp_path / "a.html"
    done = _cli("report", str(scored), "-o", str(out))
    assert done.returncode == 0, done.stderr
    assert out.stat().st_size > 10_000
    again = _cli("report", str(scored), "-o", str(out))
    assert again.returncode == 2 and "exists" in again.stderr and len(again.stderr.strip().splitlines()) == 1
    both = _cli("score", str(DEMO), "-o", str(tmp_path / "s.parquet"), "--report", str(tmp_path / "s.html"), "--quiet")
    assert both.returncode == 0, both.stderr
    assert "Run summary" in (tmp_path / "s.html").read_text(encoding="utf-8")


@pytest.mark.parametrize("args, says", [
    (("report", "datasets/demo/inventory.csv", "-o", "{tmp}/x.html"), "not a table scored by ionicity"),
    (("report", "{tmp}/missing.parquet", "-o", "{tmp}/x.html"), "missing.parquet"),
    (("report", "{scored}", "-o", "{tmp}/x.pdf"), "must end in .html"),
    (("report", "{scored}", "-o", "{tmp}/x.html", "--id-col", "nope"), "--id-col 'nope'"),
    (("score", "datasets/demo/inventory.csv", "--report", "{tmp}/x.html"), "--report needs the scored table in a file"),
])
def test_bad_report_usage_is_one_line_exit_2(scored, tmp_path, args, says):
    done = _cli(*(a.format(tmp=tmp_path, scored=scored) for a in args))
    assert done.returncode == 2, done.stderr
    assert says in done.stderr and "Traceback" not in done.stderr


def test_the_report_draws_without_matplotlib(scored, tmp_path):
    # the figures are our own SVG: with matplotlib blocked the page is written, and nothing imported it
    code = ("import sys; sys.modules['matplotlib'] = None\n"
            "from ionicity.pipelines.cli import main\n"
            f"code = main(['report', {str(scored)!r}, '-o', {str(tmp_path / 'x.html')!r}])\n"
            "assert not any(m.startswith('matplotlib') for m in sys.modules if sys.modules[m] is not None), 'imported'\n"
            "sys.exit(code)")
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT, timeout=120)
    assert done.returncode == 0, done.stderr
    assert (tmp_path / "x.html").read_text(encoding="utf-8").count("<svg") >= 4


def test_palette_stays_distinct_under_simulated_colour_vision_deficiency():
    """Machado, Oliveira & Fernandes, IEEE TVCG 15 (2009) 1291, as implemented by
    colorspacious (severity 100); distances in CAM02-UCS (Luo, Cui & Li 2006).
    A difference of about 10 is plainly visible for markers (common practice)."""
    colorspacious = pytest.importorskip("colorspacious")
    from ionicity.pipelines.report_figures import PALETTE

    def rgb(h):
        return np.array([int(h[i:i + 2], 16) for i in (1, 3, 5)]) / 255

    def distance(a, b, cvd):
        a, b = rgb(a), rgb(b)
        if cvd:
            space = {"name": "sRGB1+CVD", "cvd_type": cvd, "severity": 100}
            a = np.clip(colorspacious.cspace_convert(a, space, "sRGB1"), 0, 1)
            b = np.clip(colorspacious.cspace_convert(b, space, "sRGB1"), 0, 1)
        return float(np.linalg.norm(colorspacious.cspace_convert(a, "sRGB1", "CAM02-UCS")
                                    - colorspacious.cspace_convert(b, "sRGB1", "CAM02-UCS")))

    for cvd, floor in ((None, 20.0), ("protanomaly", 10.0), ("deuteranomaly", 10.0), ("tritanomaly", 10.0)):
        worst = min(distance(PALETTE[a], PALETTE[b], cvd) for a, b in itertools.combinations(PALETTE, 2))
        assert worst >= floor, (cvd, worst)
    # the melting tiers use hues of the palette, so the check above covers them too
    from ionicity.pipelines.report_figures import DENSITY_RAMP, MELTING_COLOURS
    assert set(MELTING_COLOURS) <= set(PALETTE.values())
    # the density ramp reads as "more" under every simulated deficiency: its lightness J' falls monotonically
    for cvd in (None, "protanomaly", "deuteranomaly", "tritanomaly"):
        stops = np.array([rgb(h) for h in DENSITY_RAMP])
        if cvd:
            stops = np.clip(colorspacious.cspace_convert(stops, {"name": "sRGB1+CVD", "cvd_type": cvd, "severity": 100},
                                                         "sRGB1"), 0, 1)
        lightness = colorspacious.cspace_convert(stops, "sRGB1", "CAM02-UCS")[:, 0]
        assert np.all(np.diff(lightness) < -5), (cvd, lightness)


def test_melting_bands_follow_the_scorer_once_it_exports_them(monkeypatch):
    from ionicity.scorer import melting

    bands = (("ionic_liquid", 0.0, 373.15, "below 100 C"), ("warm_salt", 373.15, 400.0, "invented for this test"),
             ("hot_salt", 400.0, float("inf"), "invented for this test"))
    monkeypatch.setattr(melting, "MELTING_CLASS_BANDS", bands, raising=False)
    assert melting_bands() == bands
    assert classes_melting_below(400.0) == ("ionic_liquid", "warm_salt")


def test_score_refuses_an_existing_report_before_scoring(tmp_path):
    page = tmp_path / "page.html"
    page.write_text("kept", encoding="utf-8")
    done = _cli("score", str(DEMO), "-o", str(tmp_path / "o.parquet"), "--report", str(page))
    assert done.returncode == 2 and "exists" in done.stderr
    assert not (tmp_path / "o.parquet").exists() and page.read_text(encoding="utf-8") == "kept"
