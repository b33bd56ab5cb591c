"""The hydrogen isotopes D and T in formulas (scorer.grammar, scorer.isotopes).

References:
* the symbols: Connelly et al., Nomenclature of Inorganic Chemistry, IUPAC
  Recommendations 2005 (Red Book), IR-3.3.2: D and T may be used for 2H and 3H;
* isotope masses: periodictable 2.1 (a reference library on PyPI, in the test
  extra), ``periodictable.D.mass`` and ``periodictable.T.mass``, and its
  formula masses (``periodictable.formula("D2O").mass``);
* the chemistry: an isotope changes the mass, not the bonding, so every
  score of a deuterated or tritiated formula equals that of its protium
  formula (common practice: isotope effects on charge, oxidation state and
  electronegativity are below what these scores resolve). LiAlH4 is Li+
  [AlH4]- with hydride H(-1) (Greenwood and Earnshaw, Chemistry of the
  Elements, 2nd ed., 1997, ch. 7), so LiAlD4 is Li+ [AlD4]- with D(-1).
* where D and T stand in formula_normalized: in hydrogen's place (CHD3,
  CDCl3), common practice of isotope catalogues.
"""
from __future__ import annotations

import pytest

from ionicity.scorer import parse_formula, score_formula
from ionicity.scorer.formula import FormulaError
from ionicity.scorer.isotopes import ISOTOPE_MASS_G_MOL

periodictable = pytest.importorskip("periodictable")

# columns that name hydrogen or weigh it: everything else must equal the protium formula's
_ISOTOPE_COLUMNS = {"formula_normalized", "cations", "anions", "oxidation_states", "molar_mass_g_mol", "systematic_name"}

# (written with D or T, the same compound written with H)
_PAIRS = [
    ("D2O", "H2O"), ("T2O", "H2O"), ("HDO", "H2O"), ("CDCl3", "CHCl3"), ("LiAlD4", "LiAlH4"), ("NaBD4", "NaBH4"),
    ("D2Se", "H2Se"), ("NaOD", "NaOH"), ("DCl", "HCl"), ("CD3OD", "CH3OH"), ("ND4Cl", "NH4Cl"),
    ("D2SO4", "H2SO4"), ("CuSO4.5D2O", "CuSO4.5H2O"), ("CuSO4(D2O)5", "CuSO4(H2O)5"), ("[Co(D2O)6]Cl2", "[Co(H2O)6]Cl2"),
    ("Ca(OD)2", "Ca(OH)2"), ("CHD3", "CH4"), ("D2", "H2"),
]


def test_isotope_masses_are_periodictables():
    # periodictable 2.1: D.mass, T.mass (g/mol)
    assert ISOTOPE_MASS_G_MOL["D"] == pytest.approx(periodictable.D.mass, abs=1e-9)
    assert ISOTOPE_MASS_G_MOL["T"] == pytest.approx(periodictable.T.mass, abs=1e-9)


@pytest.mark.parametrize("ours, theirs", [
    ("D2O", "D2O"), ("T2O", "T2O"), ("HDO", "HDO"), ("LiAlD4", "LiAlD4"), ("CDCl3", "CDCl3"),
    ("CuSO4.5D2O", "CuSO4(D2O)5"), ("NaOD", "NaOD"), ("CD3OD", "CD3OD"), ("T2", "T2"),
])
def test_molar_mass_against_periodictable(ours, theirs):
    # periodictable.formula(...).mass; the standard atomic weights of the two
    # differ by under 0.001 g/mol per atom (O 15.999 / 15.9994, Li 6.94 / 6.941)
    assert score_formula(ours)["molar_mass_g_mol"] == pytest.approx(periodictable.formula(theirs).mass, abs=0.01)


def test_isotope_shifts_the_mass_by_its_own_mass():
    # the difference cancels the other elements: 2 x (m(2H) - Ar(H)), periodictable's D.mass
    # against the scorer's own hydrogen weight (1.008, IUPAC conventional)
    shift = score_formula("D2O")["molar_mass_g_mol"] - score_formula("H2O")["molar_mass_g_mol"]
    assert shift == pytest.approx(2 * (periodictable.D.mass - 1.008), abs=2e-4)


@pytest.mark.parametrize("heavy, light", _PAIRS)
def test_scored_as_hydrogen(heavy, light):
    ours, protium = score_formula(heavy), score_formula(light)
    assert ours["status"] == protium["status"]
    for column, value in protium.items():
        if column not in _ISOTOPE_COLUMNS:
            assert ours[column] == value or (value != value and ours[column] != ours[column]), column


@pytest.mark.parametrize("text, normalized, cations, anions, states", [
    ("D2O", "D2O", None, None, "D:+1;O:-2"),
    ("LiAlD4", "LiAlD4", "Li(+)*1", "AlD4(-)*1", "Li:+1;Al:+3;D:-1"),
    ("NaOD", "NaOD", "Na(+)*1", "OD(-)*1", "Na:+1;O:-2;D:+1"),
    ("DCl", "DCl", "D(+)*1", "Cl(-)*1", "D:+1;Cl:-1"),
    ("CuSO4.5D2O", "CuSO4·5D2O", "Cu(2+)*1", "SO4(2-)*1", "Cu:+2;S:+6;O:-2"),
])
def test_text_keeps_the_isotope(text, normalized, cations, anions, states):
    r = score_formula(text)
    assert (r["formula_normalized"], r["cations"] or None, r["anions"] or None, r["oxidation_states"]) == (
        normalized, cations, anions, states)


@pytest.mark.parametrize("text, normalized", [
    ("CDCl3", "CDCl3"), ("HDO", "HDO"), ("CHD3", "CHD3"), ("CH2D2", "CH2D2"), ("CD3OD", "CD4O"), ("T2O", "T2O"),
    ("HTO", "HTO"), ("CDT3", "CDT3"),
])
def test_hill_place_of_the_isotopes(text, normalized):
    # D and T in hydrogen's place, D before T (common practice); CD3OD flattens to Hill order
    assert score_formula(text)["formula_normalized"] == normalized


def test_isotopes_in_equality():
    # a deuterated compound is another compound; equivalent spellings of it are one
    assert parse_formula("D2O") != parse_formula("H2O")
    assert parse_formula("CuSO4.5D2O") == parse_formula("CuSO4(D2O)5") == parse_formula("CuSO4·5D2O")
    assert parse_formula("D2O").isotopes == (("D", 2.0),)


def test_mixtures_and_groups():
    r = score_formula("NaCl + D2O (50-50 mol%)")
    assert r["substance_class"] == "mixture" and "D2O" in r["formula_normalized"]
    assert score_formula("Mg(OD)2")["anions"] == "OD(-)*2"


def test_abbreviations_still_win():
    # ion-library codes holding a capital D or T are not read as isotopes (scorer/data/ions.csv)
    assert score_formula("[C4mim][DCA]")["formula_normalized"] == "[C4mim][dca]"
    assert score_formula("LiTFSI")["anions"] == "[NTf2](-)*1"


@pytest.mark.parametrize("text", ["Dx2O", "Tq"])
def test_other_letters_still_errors(text):
    with pytest.raises(FormulaError):
        parse_formula(text)


def test_slips_around_isotopes():
    # CDCl3 (deuterochloroform, the NMR solvent) is no slip for CdCl3 (cadmium is Cd(2+): CdCl3 is unbalanced)
    r = score_formula("CDCl3")
    assert r["status"] == "ok" and r["formula_suggested"] is None
    # a capital I typed for thallium's l is still a slip (common practice: TlCl, TlNO3 are stock salts)
    for written, meant in [("TICl", "TlCl"), ("TINO3", "TlNO3"), ("TI2SO4", "Tl2SO4"), ("TI2O", "Tl2O")]:
        assert score_formula(written)["formula_suggested"] == meant
