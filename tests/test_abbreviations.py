"""Organic group abbreviations in formula text (scorer/abbreviations.py).

Molecular formulas of the reagents are from memory (the IUPAC Blue Book 2013,
P-61/P-68, for the group names; each formula is the reagent's standard one);
their molar masses are checked against periodictable, an independent formula
library, so an abbreviation written out wrongly fails here.
"""
from __future__ import annotations

import pytest

from ionicity.scorer.abbreviations import expand_abbreviations
from ionicity.scorer.record import score_formula

periodictable = pytest.importorskip("periodictable")


@pytest.mark.parametrize("typed, formula", [
    ("nBuLi", "C4H9Li"), ("tBuOK", "C4H9OK"), ("KOtBu", "C4H9OK"), ("PhMgBr", "C6H5MgBr"),
    ("Et2Zn", "C4H10Zn"), ("Me3Al", "C3H9Al"), ("SnBu3Cl", "C12H27SnCl"), ("Ti(OiPr)4", "C12H28O4Ti"),
    ("Cu(acac)2", "C10H14O4Cu"), ("Cp2ZrCl2", "C10H10ZrCl2"), ("Cp*2Fe", "C20H30Fe"), ("PPh3", "C18H15P"),
    ("AcOH", "C2H4O2"), ("Ac2O", "C4H6O3"), ("AcCl", "C2H3ClO"), ("NaOMe", "CH3ONa"), ("Et3N", "C6H15N"),
])
def test_abbreviation_is_written_out_with_the_right_mass(typed, formula):
    out = score_formula(typed)
    assert out["status"] == "warning" and "read the abbreviations" in out["message"]
    assert out["molar_mass_g_mol"] == pytest.approx(periodictable.formula(formula).mass, rel=1e-4)


@pytest.mark.parametrize("typed, substance_class", [
    # metal alkyls and aryls are molecules (Elschenbroich, Organometallics, 3rd ed., 2006; from memory)
    ("nBuLi", "covalent_molecular"), ("PhMgBr", "covalent_molecular"), ("Et2Zn", "covalent_molecular"),
    # acetic acid is an acid, tetrabutylammonium bromide an organic salt (common practice)
    ("AcOH", "acid"), ("Bu4NBr", "ionic_liquid_pair"), ("MeOH", "covalent_molecular"), ("NaOMe", "ionic_salt"),
])
def test_abbreviated_reagents_get_their_class(typed, substance_class):
    assert score_formula(typed)["substance_class"] == substance_class


@pytest.mark.parametrize("text", ["NaCl", "Pr2O3", "AcCl3", "Ac2O3", "LiPr", "CuSO4·5H2O", "[C4mim]Cl"])
def test_element_symbols_are_never_taken_for_abbreviations(text):
    # Pr is praseodymium and Ac actinium outside the whole words AcOH, Ac2O, AcCl
    assert expand_abbreviations(text) == (text, ())


@pytest.mark.parametrize("text", ["Co(en)3Cl3", "[Cu(en)2]SO4"])
def test_neutral_n_donor_ligands_stay_row_errors(text):
    # no reading of their complexes: an error says so rather than reading the ligand's atoms as ions
    assert score_formula(text)["status"] == "error"


@pytest.mark.parametrize("text", ["Cu(acac)2", "LiHMDS"])
def test_mixed_case_text_is_never_recased_into_a_rare_element(text):
    # "acac" is no actinium, "MD" no mendelevium (common practice)
    out = score_formula(text)
    assert "Ac" not in (out["formula_suggested"] or "") and "Md" not in (out["message"] or "")


def test_all_capitals_may_still_be_recased_into_any_element():
    # PUO2 typed in capitals is plutonium dioxide (a re-casing of the whole text)
    assert score_formula("PUO2")["formula_suggested"] == "PuO2"
