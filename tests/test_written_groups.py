"""Ions a formula writes out are the ions it is read with.

External reference: the registry package ``chemicals``: the SMILES of
``chemicals.identifiers.search_chemical(name)`` lists a salt's components ("[NH4+].[NH4+]" beside
oxalate for ammonium oxalate; "O=[U]=O" with two acetic acids for uranyl acetate, the registry's
neutral spelling of uranyl(VI) acetate). The uranyl ion's U(VI): IUPAC Red Book (Connelly et al.,
Nomenclature of Inorganic Chemistry, 2005), Table IX (from memory).
"""
from __future__ import annotations

import pytest
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.record import score_formula


def _ions(row, column):
    return {part.split("*")[0] for part in (row[column] or "").split(";") if part}


@pytest.mark.parametrize("text", ["UO2(CH3COO)2", "UO2(CH3COO)2·2H2O", "UO2(CH3CO2)2", "UO2(C2H3O2)2"])
def test_uranyl_acetate_written_out_is_uranyl_and_acetate(text):
    identifiers = pytest.importorskip("chemicals.identifiers")
    smiles = identifiers.search_chemical("uranyl acetate").smiles  # source: chemicals (PubChem identifiers)
    assert "O=[U]=O" in smiles and smiles.count("CC(=O)O") == 2
    row = score_formula(text)
    assert row["status"] == "ok", row["message"]
    assert _ions(row, "cations") == {"UO2(2+)"} and _ions(row, "anions") == {"CH3COO(-)"}
    assert "U:+6" in row["oxidation_states"]


def test_the_written_spelling_reads_as_the_abbreviated_one():
    # (CH3COO)2 and (OAc)2 name one ion; before, only the abbreviation was taken as written
    for metal in ("UO2", "VO", "Zn", "Pb", "Cu"):
        written = score_formula(f"{metal}(CH3COO)2")
        short = score_formula(f"{metal}(OAc)2")
        assert (written["cations"], written["anions"]) == (short["cations"], short["anions"]), metal


def test_an_organic_anion_in_round_brackets_is_an_ion_reference():
    assert parse_formula("UO2(CH3COO)2").ion_hints == (("CH3COO(-)", 2.0),)
    # inorganic groups are still read by the solver from the counts (no reference)
    assert parse_formula("Ca(NO3)2").ion_hints == ()
    # a group that is no library ion as written stays counts
    assert parse_formula("CH3(CH2)2COOH").ion_hints == ()


@pytest.mark.parametrize("text", ["(NH4)2C2O4", "(NH4)2C2O4·H2O", "ammonium oxalate"])
def test_ammonium_written_out_is_an_ammonium_salt(text):
    identifiers = pytest.importorskip("chemicals.identifiers")
    smiles = identifiers.search_chemical("ammonium oxalate").smiles  # source: chemicals (PubChem identifiers)
    assert smiles.count("[NH4+]") == 2
    row = score_formula(text)
    assert _ions(row, "cations") == {"NH4(+)"} and _ions(row, "anions") == {"C2O4(2-)"}
    assert row["substance_class"] == "ionic_salt"


def test_the_hill_formula_alone_stays_ambiguous():
    # C2H8N2O4 writes no ion out: ammonium oxalate and 2-hydroxyethylammonium nitrate tie, and the row says so
    row = score_formula("C2H8N2O4")
    assert "equally plausible" in row["message"]
