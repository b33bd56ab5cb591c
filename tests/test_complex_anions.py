"""Complex anions built by rule (``scorer.complex_anions``): the solver's last
resort for salts whose anion the library lacks (K2GeF6, Na4GeO4, K2SeCl6).

References beside each value:
- formulas of the salts: K2GeF6 is potassium hexafluorogermanate, CAS
  7783-73-5, formula F6GeK2 in the ``chemicals`` package's identifier database
  (checked below); the others (Na2GeF6, Li2GeF6, BaGeF6, K2GeCl6, K2GeO3,
  Na4GeO4, K2SeCl6, CsGeCl3) from Greenwood & Earnshaw, Chemistry of the
  Elements, 2nd ed., 1997, ch. 10 and 16 (from memory);
- anion names: Connelly et al., Nomenclature of Inorganic Chemistry, IUPAC
  Recommendations 2005, IR-7.1 and IR-9.2 (additive names, ``-ido`` ligands,
  ``-ate`` anion, Stock number); the library's own rows spell
  hexafluoridosilicate and hexachloridostannate(IV) the same way;
- the charge rule q = m*|x| - s: the definition of oxidation state
  (IUPAC Red Book IR-4.6.1; common practice).
"""
from __future__ import annotations

import csv
from pathlib import Path

import pytest

from ionicity.scorer import ions, score_formula
from ionicity.scorer.complex_anions import CONSTRUCTED_SOURCE, complex_anion, complex_anion_readings
from ionicity.scorer.formula import parse_formula

CASES_FILE = Path(__file__).resolve().parent / "data" / "formula_cases.csv"

# formula -> (cations, anions, oxidation states) expected; sources in the module docstring
SALTS = {
    "K2GeF6": ("K(+)*2", "GeF6(2-)*1", "K:+1;Ge:+4;F:-1"),
    "Na2GeF6": ("Na(+)*2", "GeF6(2-)*1", "Na:+1;Ge:+4;F:-1"),
    "Li2GeF6": ("Li(+)*2", "GeF6(2-)*1", "Li:+1;Ge:+4;F:-1"),
    "BaGeF6": ("Ba(2+)*1", "GeF6(2-)*1", "Ba:+2;Ge:+4;F:-1"),
    "K2GeCl6": ("K(+)*2", "GeCl6(2-)*1", "K:+1;Ge:+4;Cl:-1"),
    "K2GeO3": ("K(+)*2", "GeO3(2-)*1", "K:+1;Ge:+4;O:-2"),
    "Na4GeO4": ("Na(+)*4", "GeO4(4-)*1", "Na:+1;Ge:+4;O:-2"),
    "K2SeCl6": ("K(+)*2", "SeCl6(2-)*1", "K:+1;Se:+4;Cl:-1"),
    # germanium(II): trichloridogermanate(II), the pyramidal GeCl3(-) of CsGeCl3
    "CsGeCl3": ("Cs(+)*1", "GeCl3(-)*1", "Cs:+1;Ge:+2;Cl:-1"),
}


def _states(text: str) -> dict[str, str]:
    return dict(item.split(":") for item in text.split(";"))


@pytest.mark.parametrize("formula", sorted(SALTS))
def test_salts_without_a_library_anion_read_with_a_constructed_one(formula):
    cations, anions, states = SALTS[formula]
    row = score_formula(formula)
    assert (row["cations"], row["anions"]) == (cations, anions)
    assert _states(row["oxidation_states"]) == _states(states)
    assert row["substance_class"] == "ionic_salt"
    # the row says the anion was built, not found
    assert row["status"] == "warning"
    assert "constructed by rule" in row["message"] and "not taken from the ion library" in row["message"]


def test_k2gef6_formula_matches_the_chemicals_database():
    identifiers = pytest.importorskip("chemicals.identifiers")
    # chemicals' identifier database: CAS 7783-73-5, formula F6GeK2
    entry = identifiers.search_chemical("potassium hexafluorogermanate")
    assert parse_formula(entry.formula).as_dict() == parse_formula("K2GeF6").as_dict()
    assert score_formula(entry.formula)["anions"] == "GeF6(2-)*1"


@pytest.mark.parametrize("args, ion_id, name, family", [
    (("Ge", "F", 6, 4), "GeF6(2-)", "hexafluoridogermanate(IV)", "halo-complex"),
    (("Se", "Cl", 6, 4), "SeCl6(2-)", "hexachloridoselenate(IV)", "halo-complex"),
    (("Ge", "O", 3, 4), "GeO3(2-)", "trioxidogermanate(IV)", "oxoanion"),
    (("Ge", "Cl", 3, 2), "GeCl3(-)", "trichloridogermanate(II)", "halo-complex"),
    (("Te", "I", 6, 4), "TeI6(2-)", "hexaiodidotellurate(IV)", "halo-complex"),
    (("Bi", "Br", 6, 3), "BiBr6(3-)", "hexabromidobismuthate(III)", "halo-complex"),
])
def test_names_charges_and_metadata_of_constructed_anions(args, ion_id, name, family):
    ion = complex_anion(*args)
    assert (ion.ion_id, ion.name, ion.family) == (ion_id, name, family)
    centre, ligand, count, state = args
    ligand_charge = -2 if ligand == "O" else -1
    # q = m * |x| - s, written as a negative charge
    assert ion.charge == count * ligand_charge + state
    assert dict(ion.oxidation_states) == {centre: state, ligand: ligand_charge}
    assert dict(ion.composition) == {centre: 1.0, ligand: float(count)}
    assert ion.source == CONSTRUCTED_SOURCE and not ion.organic and not ion.monatomic


def test_library_ion_is_returned_where_the_library_lists_it():
    # hexafluoridosilicate is a library row (scorer/data/ions.csv)
    ion = complex_anion("Si", "F", 6, 4)
    assert ion.ion_id == "SiF6(2-)" and ion.source != CONSTRUCTED_SOURCE


def test_no_anion_where_the_charge_would_not_be_negative():
    # GeF4 is a neutral molecule: 4 * 1 - 4 = 0
    assert complex_anion("Ge", "F", 4, 4) is None


def test_higher_coordination_wins_ties():
    # K3GeF7 as 3 K(+), GeF6(2-), F(-), not GeF5(-) with 2 F(-)
    # (six-coordinate Ge(IV) fluoro complexes; Greenwood & Earnshaw, ch. 10, from memory)
    row = score_formula("K3GeF7")
    assert row["anions"] == "F(-)*1;GeF6(2-)*1"
    assert "ambiguous" not in row["message"]


def test_no_fallback_without_a_metal_cation():
    readings, notes = complex_anion_readings({"Ge": 1.0, "Cl": 4.0}, [10_000])
    assert readings == [] and notes == []
    # GeCl4 stays the molecule it is (no ions)
    row = score_formula("GeCl4")
    assert row["substance_class"] == "covalent_molecular" and not row["anions"]


@pytest.mark.parametrize("formula, anions", [
    # readings that exist without the fallback stay as they are
    ("K2SiF6", "SiF6(2-)*1"),        # library row
    ("Na2SnCl6", "SnCl6(2-)*1"),     # library row
    ("K2SnF6", "F(-)*6"),            # monatomic Sn(4+) reading
    ("K2TeBr6", "Br(-)*6"),          # monatomic Te(4+) reading
    ("Na2SeO3", "SeO3(2-)*1"),       # library oxoanion
])
def test_existing_readings_do_not_change(formula, anions):
    row = score_formula(formula)
    assert row["anions"] == anions
    assert "constructed by rule" not in row["message"]


def test_reference_cases_never_need_the_fallback():
    """No formula of tests/data/formula_cases.csv (handbook assignments, sources
    per row) reads with a constructed anion: the fallback changes none of them."""
    with CASES_FILE.open(encoding="utf-8", newline="") as fh:
        formulas = [row["formula"] for row in csv.DictReader(fh)]
    assert len(formulas) > 400
    for formula in formulas:
        dec = ions.decompose(parse_formula(formula))
        built = [t.ion.ion_id for t in dec.cations + dec.anions if t.ion.source == CONSTRUCTED_SOURCE]
        assert not built, formula
        assert not any("constructed by rule" in note for note in dec.notes), formula


def test_fallback_changes_only_rows_that_had_no_reading(monkeypatch):
    """With the fallback switched off, every reference formula reads the same;
    K2GeF6 goes back to the 'no charge-balanced set of ions' error."""
    with CASES_FILE.open(encoding="utf-8", newline="") as fh:
        formulas = [row["formula"] for row in csv.DictReader(fh)] + sorted(SALTS)

    def reading(formula):
        dec = ions.decompose(parse_formula(formula))
        return dec.cations, dec.anions, dec.substance_class, dec.oxidation_states

    with_fallback = {f: reading(f) for f in formulas}
    monkeypatch.setattr(ions, "complex_anion_readings", lambda remaining, budget: ([], []))
    ions._decompose.cache_clear()
    try:
        without = {f: reading(f) for f in formulas}
    finally:
        ions._decompose.cache_clear()
    changed = sorted(f for f in formulas if with_fallback[f] != without[f])
    assert changed == sorted(SALTS)
    assert all(without[f][2] == "unknown" for f in changed)


# Sodium perborate: library rows, not a constructed anion. Its anion is the
# peroxo-bridged dimer [B2(O2)2(OH)4](2-): NaBO3.4H2O is Na2[B2(O2)2(OH)4].6H2O
# (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 6; from
# memory); the monohydrate is BH2NaO4, CAS 10332-33-9, in the chemicals
# package's identifier database (checked below).
@pytest.mark.parametrize("formula, cations, anions", [
    ("NaBO3.H2O", "Na(+)*1", "BO3(-)*1"),
    ("NaBO3.4H2O", "Na(+)*1", "BO3(-)*1"),
    ("Na2[B2(O2)2(OH)4]", "Na(+)*2", "B2(O2)2(OH)4(2-)*1"),
    ("Na2B2O4(OH)4.6H2O", "Na(+)*2", "B2(O2)2(OH)4(2-)*1"),
])
def test_sodium_perborate_reads_as_a_peroxoborate(formula, cations, anions):
    row = score_formula(formula)
    assert (row["cations"], row["anions"], row["status"]) == (cations, anions, "ok")
    states = _states(row["oxidation_states"])
    # boron stays B(III); the peroxo oxygen brings the mean O state above -2
    assert states["B"] == "+3" and -2 < float(states["O"]) < -1


def test_perborate_monohydrate_composition_matches_the_chemicals_database():
    identifiers = pytest.importorskip("chemicals.identifiers")
    entry = identifiers.search_chemical("sodium perborate monohydrate")
    flat = parse_formula(entry.formula).as_dict()
    written = parse_formula("NaBO3.H2O")
    expected = dict(written.as_dict())
    expected["H"] = expected.get("H", 0.0) + 2 * written.hydrate_water
    expected["O"] += written.hydrate_water
    assert flat == expected


def test_borates_keep_their_readings():
    # orthoborate and metaborate are B(III) oxoanions with O(-II) (Greenwood &
    # Earnshaw, ch. 6; from memory): the perborate rows do not take them over
    assert score_formula("Na3BO3")["anions"] == "BO3(3-)*1"
    assert score_formula("NaBO2")["anions"] == "BO2(-)*1"
    assert score_formula("Na2B4O7.10H2O")["anions"] == "B4O7(2-)*1"
