"""Tests for pipelines.melting_data: users' tables, combining sets, the CC0 fixture, the open training set."""
from __future__ import annotations

import importlib.util
from pathlib import Path

import pandas as pd
import pytest

from ionicity.pipelines import melting_data
from ionicity.pipelines import melting_fit as mf

FIXTURE = Path(__file__).resolve().parents[1] / "datasets" / "melting" / "wikidata_salts.csv"

# chemicals (with scikit-learn and matplotlib) makes up the optional 'melting' extra
needs_extra = pytest.mark.skipif(
    any(importlib.util.find_spec(m) is None for m in ("sklearn", "matplotlib", "chemicals")),
    reason="the 'melting' extra is not installed",
)


# ---------------------------------------------------------------- user tables


def test_user_table_is_screened_and_logged(tmp_path):
    path = tmp_path / "mine.csv"
    path.write_text(
        "formula,mp_K\n"
        "NaCl,1074\n"          # CRC Handbook, from memory
        "NaCl,1075\n"          # a duplicate that agrees
        "KCl,771\n"            # 771 C typed as K: still in range, kept as given
        "KBr,734 C\n"          # not a number
        "CsCl,-5\n"            # out of range
        "CuSO4.5H2O,383\n"     # hydrate
        "SiO2,1986\n"          # not a salt
        "Qq2O,900\n",          # unreadable formula
        encoding="utf-8",
    )
    data = melting_data.read_user_table(path)
    kept = {r["formula_normalized"]: r["mp_K"] for r in data.rows}
    assert kept == {"NaCl": 1074.5, "KCl": 771.0}
    reasons = " | ".join(d["reason"] for d in data.decisions)
    for word in ("not a number", "outside 1-5000 K", "hydrate", "not a salt", "formula not parsed", "duplicate"):
        assert word in reasons
    assert len(data.decisions) == 8


def test_user_table_needs_its_columns(tmp_path):
    from ionicity.pipelines.io import InputError

    path = tmp_path / "bad.csv"
    path.write_text("compound,T\nNaCl,1074\n", encoding="utf-8")
    with pytest.raises(InputError, match="no column 'formula'"):
        melting_data.read_user_table(path)
    with pytest.raises(InputError, match="no melting-point column"):
        melting_data.read_user_table(path, formula_col="compound")
    assert melting_data.read_user_table(path, formula_col="compound", mp_col="T").rows[0]["mp_K"] == 1074.0


def test_combining_lets_the_user_value_win(tmp_path):
    open_set = melting_data.TrainingSet(rows=[{"formula": "ClNa", "formula_normalized": "NaCl", "mp_K": 1070.0,
                                     "origin": "chemicals", "anion_family": "halide", "cation_element": "Na"}],
                              decisions=[])
    path = tmp_path / "mine.csv"
    path.write_text("formula,mp_K\nNaCl,1074\n", encoding="utf-8")
    both = melting_data.combine_training_sets(open_set, melting_data.read_user_table(path))
    assert [r["mp_K"] for r in both.rows] == [1074.0]
    assert any("replaced by user table" in d["reason"] for d in both.decisions)


# ----------------------------------------------------------- the fixture data


def test_fixture_has_provenance_on_every_row():
    frame = pd.read_csv(FIXTURE)
    assert len(frame) == 140  # datasets/melting/README.md gives the same count
    assert frame["source"].str.startswith("Wikidata (CC0 1.0)").all()
    assert frame["mp_K"].between(1, 5000).all()
    assert frame["formula_normalized"].is_unique


# ------------------------------------------------------- the open training set


@needs_extra
def test_open_builder_on_a_few_cas_numbers():
    # NaCl, KCl, Na2SO4 and [C2mim][BF4] are salts; CuSO4.5H2O is a hydrate; water is no salt
    cas = ["7647-14-5", "7447-40-7", "7757-82-6", "143314-16-3", "7758-99-8", "7732-18-5"]
    data = melting_data.build_open_training_set(cas_numbers=cas)
    kept = {r["formula_normalized"]: r for r in data.rows}
    assert {"NaCl", "KCl", "Na2SO4"} <= set(kept)
    # NaCl 1074 K (CRC Handbook, from memory): the consensus of the package's sources is close
    assert kept["NaCl"]["mp_K"] == pytest.approx(1074, abs=5)
    assert all(r["origin"].startswith("chemicals") for r in data.rows)
    logged = {d["cas"] for d in data.decisions}
    assert set(cas) <= logged  # every CAS number looked at has a decision
    assert not any(d["kept"] for d in data.decisions if d["cas"] in ("7758-99-8", "7732-18-5"))


@needs_extra
def test_open_builder_reads_flat_organic_salts_from_their_names():
    # formulas as the chemicals identifier table writes them: C4H12ClN is tetramethylammonium or
    # butylammonium chloride (ambiguous alone), C7H11F3N2O3S an ion pair the solver does not split;
    # their names settle both. Expected ions from the names (IUPAC nomenclature, common practice).
    cas = ["75-57-0", "145022-44-2"]
    data = melting_data.build_open_training_set(cas_numbers=cas)
    kept = {r["cas"]: r for r in data.rows}
    assert kept["75-57-0"]["formula_normalized"] == "[N1111]Cl"
    assert kept["145022-44-2"]["formula_normalized"] == "[C2mim][OTf]"
    assert all("ions read from the name" in r["decision"] for r in data.rows)
    # 1-ethyl-3-methylimidazolium triflate: -9 C (Bonhote et al., Inorg. Chem. 1996, 35, 1168; from memory)
    assert kept["145022-44-2"]["mp_K"] == pytest.approx(264, abs=5)


@needs_extra
def test_open_builder_reads_the_onium_salts_of_the_added_ions():
    # cetylpyridinium chloride, tetrahexylammonium bromide and 1-methylpyridinium chloride, flat in the
    # identifier table (C21H38ClN, C24H52BrN, C6H8ClN): read through their names now that scorer/data/ions.csv
    # holds [C16py], [N6666] and [C1py]. Cetylpyridinium chloride melts at 77-83 C (anhydrous; Merck
    # Index, from memory); the other two are checked against the registry's own values.
    cas = ["123-03-5", "4328-13-6", "7680-73-1"]
    data = melting_data.build_open_training_set(cas_numbers=cas)
    kept = {r["cas"]: r for r in data.rows}
    assert kept["123-03-5"]["formula_normalized"] == "[C16py]Cl"
    assert kept["4328-13-6"]["formula_normalized"] == "[N6666]Br"
    assert kept["7680-73-1"]["formula_normalized"] == "[C1py]Cl"
    assert kept["123-03-5"]["mp_K"] == pytest.approx(353, abs=10)
    from chemicals.phase_change import Tm
    for number in ("4328-13-6", "7680-73-1"):
        assert kept[number]["mp_K"] == pytest.approx(Tm(number), abs=10)


def test_a_name_of_another_compound_or_a_hydrate_does_not_rescue_a_formula():
    from ionicity.scorer.formula import parse_formula

    flat = parse_formula("C4H12ClN")
    assert melting_data.reading_from_name(flat, ["butylamine hydrochloride hydrate"]) is None
    assert melting_data.reading_from_name(flat, ["tetraethylammonium chloride"]) is None  # C8H20ClN
    assert melting_data.reading_from_name(parse_formula("NaCl"), ["sodium chloride"]) is None  # inorganic: as written


@needs_extra
@pytest.mark.slow
def test_calibration_trend_index_ranks_the_open_training_set():
    # calibration: the inorganic weights were fitted on this set. The bar:
    # Spearman rho >= 0.75 against the set fit-melting builds
    data = melting_data.build_open_training_set()
    _, records = mf.feature_matrix(data.rows)
    report = mf.trend_index_report(data.rows, records)
    assert report["overall"]["n"] > 400
    assert report["overall"]["spearman_rho"] >= 0.75
