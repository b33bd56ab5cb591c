"""Molecules no one stocks: a lost count read as a molecule with impossible or unusual oxidation states.

Before 5 December 2026 (tenth round) ``SO4``, ``NO4``, ``HClO5``, ``CO3`` and ``H2SO`` came back ``ok`` as
covalent molecules, with oxygen positive beside sulfur at -2 (SO4: S -2, O +0.5) or sulfur at 0 (H2SO). Two
changes (``scorer.substance``, ``scorer.record``):

* formal oxidation states: the most electronegative element is never the positive or zero partner; where no
  other element can take the balance within its listed states, the nearest one takes its bound and the rest
  goes to the most electronegative element (peroxo oxygen: Caro's acid H2SO5 S +6, O -1.6);
* a small inorganic molecule that the registry's tables list no compound of gets a warning when its states
  are strained that way, or when an element beside the most electronegative one sits at zero or below and a
  spelling one count away is listed (H2SO -> H2SO4).

Which compounds exist is read from the registry package ``chemicals`` (its identifier tables, CRC Handbook and
PubChem, through ``scorer/data/inorganic_formulas.csv`` and ``registry_names.csv``; the builder is checked
against the installed package below); the oxidation states of the named compounds are textbook values
(Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 14-17; from memory).

Salts: a short salt formula the tables do not list whose reading needs a metal cation in an uncommon state,
one metal in two states or a peroxide beside a cation that forms none warns where a spelling one count away
is listed (PbCl3, KMnO3, CuO2); real compounds the tables list (NbCl3, ThF3, KO2, K2MnO4) stay ``ok``.
"""
from __future__ import annotations

import itertools

import pytest

from ionicity.scorer.record import score_formula
from ionicity.scorer.registry_formulas import inorganic_formula_listed as registry_knows
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.substance import formal_oxidation_states, formal_state_strain, most_electronegative


@pytest.mark.parametrize("counts, expected", [
    ({"S": 1, "O": 4}, {"S": 6.0, "O": -1.5}),          # had read S -2, O +0.5
    ({"H": 2, "S": 1, "O": 5}, {"H": 1.0, "S": 6.0, "O": -1.6}),   # Caro's acid, one peroxo group
    ({"H": 2, "S": 2, "O": 8}, {"H": 1.0, "S": 6.0, "O": -1.75}),  # peroxodisulfuric acid
    ({"H": 1, "N": 1, "O": 4}, {"H": 1.0, "N": 5.0, "O": -1.5}),   # peroxynitric acid
    ({"Br": 1, "N": 3}, {"Br": 1.0, "N": -1 / 3}),      # bromine azide: the N3 group -1
    ({"I": 1, "N": 3}, {"I": 1.0, "N": -1 / 3}),
    ({"H": 2, "S": 1, "O": 4}, {"H": 1.0, "S": 6.0, "O": -2.0}),   # unchanged where nothing is strained
    ({"Cl": 2, "O": 7}, {"Cl": 7.0, "O": -2.0}),
    ({"O": 1, "F": 2}, {"O": 2.0, "F": -1.0}),          # OF2: oxygen positive beside fluorine
])
def test_formal_states_of_peroxo_and_azide_molecules(counts, expected):
    states = dict(formal_oxidation_states(counts))
    assert states == pytest.approx(expected, abs=1e-5)


def test_the_most_electronegative_element_is_never_the_positive_partner():
    # every composition of two or three of these non-metals with counts 1-4 (a property over 3,000 formulas):
    # the states balance, and the most electronegative element with a negative usual state is never above 0
    elements = ("H", "B", "N", "O", "F", "Si", "P", "S", "Cl", "Br", "I", "Se")
    checked = 0
    for k in (2, 3):
        for symbols in itertools.combinations(elements, k):
            for counts in itertools.product((1, 2, 3, 4), repeat=k):
                comp = dict(zip(symbols, map(float, counts)))
                states = dict(formal_oxidation_states(comp))
                assert sum(states[s] * n for s, n in comp.items()) == pytest.approx(0.0, abs=1e-4)
                most = most_electronegative(tuple(comp))
                if most in ("O", "N", "F", "Cl", "S"):
                    assert states[most] < 1e-9 or formal_state_strain(comp, states) is not None, comp
                checked += 1
    assert checked > 3000


def test_strain_is_said_only_where_no_element_can_take_the_balance():
    assert "S at its highest listed state +6 leaves O at -1.5" in formal_state_strain(
        {"S": 1, "O": 4}, formal_oxidation_states({"S": 1, "O": 4}))
    for counts in ({"S": 1, "O": 3}, {"N": 2, "O": 5}, {"H": 2, "O": 2}, {"P": 4, "O": 10}):
        assert formal_state_strain(counts, formal_oxidation_states(counts)) is None


@pytest.mark.parametrize("text, meant", [
    ("H2SO", "H2SO4"),       # S 0: the 4 lost
    ("H3BO", "H3BO3"),       # B -1
    ("H2SeO", "H2SeO3"),     # Se 0
    ("HClO5", "HClO4"),      # Cl at +7 leaves O at -1.6
    ("SO4", "SO3"),          # the sulfate ion's formula without its charge or cation
    ("NO4", "NO2"),
])
def test_molecules_the_tables_do_not_list_get_a_warning_with_the_listed_neighbours(text, meant):
    assert not registry_knows(dict(parse_formula(text).counts))
    assert registry_knows(dict(parse_formula(meant).counts))
    row = score_formula(text)
    assert row["status"] == "warning"
    assert "no compound of this formula is listed" in row["message"]
    assert "a count may be missing" in row["message"]
    assert meant in row["message"]


@pytest.mark.parametrize("text", [
    "SO3", "HNO3", "H2O2", "PCl5", "SOCl2", "N2O5", "Cl2O7", "SF6", "XeF4", "P4O10", "H2SO4", "H3PO3", "NO2",
    "ClO2", "BrF5", "SiCl4", "B2H6", "S2Cl2",
    # not in the tables, but every element in a usual state: kept as written
    "NO2Cl", "Cl2O6", "XeO4", "I2O4",
])
def test_listed_and_plausible_molecules_stay_ok(text):
    row = score_formula(text)
    assert row["status"] == "ok", row["message"]


def test_organic_and_metal_formulas_are_not_asked():
    # carbon with hydrogen (the tables hold a small share of the organic molecules) and metal compounds keep
    # their own rules
    for text in ("C7H9NO5S", "CH4N2O2"):
        assert "no compound of this formula is listed" not in (score_formula(text)["message"] or "")


@pytest.mark.parametrize("text, meant", [
    ("PbCl3", "PbCl2"),      # Pb(3+)
    ("SnCl3", "SnCl2"),
    ("KMnO3", "KMnO4"),      # Mn(5+)
    ("AgNO4", "AgNO3"),      # Ag(3+)
    ("CuO2", "CuO"),         # Cu(4+)
    ("MnO3", "MnO2"),        # Mn in two states
    ("TiO3", "TiO2"),        # a peroxide beside Ti(4+)
])
def test_unlisted_salts_with_an_uncommon_reading_warn(text, meant):
    assert not registry_knows(dict(parse_formula(text).counts))
    row = score_formula(text)
    assert row["status"] == "warning" and "no compound of this formula is listed" in row["message"]
    assert meant in row["message"]


@pytest.mark.parametrize("text", [
    "NbCl3", "WCl3", "ThF3", "KO2", "MgO2", "K2MnO4", "KHSO5", "NaBO3", "LiNiO2", "Fe3O4", "Pb3O4", "Co3O4",
    "PrO2", "CuCl", "TiCl3", "CrCl2", "AgO", "BaO2", "Li2O2",
])
def test_listed_and_peroxo_salts_stay_ok(text):
    assert score_formula(text)["status"] == "ok", score_formula(text)["message"]


def test_the_formula_table_is_the_registry_packages():
    pytest.importorskip("chemicals")
    from ionicity.scorer.data import build_inorganic_formulas

    assert build_inorganic_formulas.build() == build_inorganic_formulas.OUT.read_text(encoding="utf-8")
