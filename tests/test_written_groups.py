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


def test_the_hill_formula_alone_takes_the_registry_s_compound():
    # C2H8N2O4 writes no ion out: ammonium oxalate and 2-hydroxyethylammonium nitrate tie in the penalties; the
    # registry (the package chemicals) lists the formula only as ammonium oxalate, so that reading wins the tie
    # (scorer.ions._registry_named); a formula the registry lists as several compounds keeps its tie
    identifiers = pytest.importorskip("chemicals.identifiers")
    assert identifiers.search_chemical("1113-38-8").formula == "C2H8N2O4"  # ammonium oxalate
    row = score_formula("C2H8N2O4")
    assert _ions(row, "cations") == {"NH4(+)"} and _ions(row, "anions") == {"C2O4(2-)"}
    assert "equally plausible" not in row["message"]


# sheet and framework silicates: the formula units Si2O5(2-) (layer silicates, sodium disilicate Na2Si2O5)
# and Si3O8(4-) (feldspars NaAlSi3O8, KAlSi3O8, with Al in the framework) balance where no discrete
# silicate ion does (Liebau, Structural Chemistry of Silicates, 1985; Greenwood & Earnshaw, 2nd ed., 1997,
# ch. 9.3; from memory); the formulas are the minerals' and compounds' usual ones (from memory). They were
# row errors ("no charge-balanced set of ions found").
@pytest.mark.parametrize("text, anion, cations", [
    ("Na2Si2O5", "Si2O5(2-)", {"Na(+)"}), ("Li2Si2O5", "Si2O5(2-)", {"Li(+)"}), ("BaSi2O5", "Si2O5(2-)", {"Ba(2+)"}),
    ("NaAlSi3O8", "Si3O8(4-)", {"Na(+)", "Al(3+)"}), ("KAlSi3O8", "Si3O8(4-)", {"K(+)", "Al(3+)"}),
])
def test_sheet_and_framework_silicates_read(text, anion, cations):
    row = score_formula(text)
    assert row["status"] == "ok", row["message"]
    assert _ions(row, "anions") == {anion} and _ions(row, "cations") == cations
    assert "Si:+4" in row["oxidation_states"]


@pytest.mark.parametrize("text", ["Na2SiO3", "Mg2SiO4", "CaAl2Si2O8", "Sc2Si2O7"])
def test_discrete_silicates_keep_their_ions(text):
    # the formula units are dearer than any discrete reading: metasilicate, orthosilicate and pyrosilicate stay
    assert not {"Si2O5(2-)", "Si3O8(4-)"} & _ions(score_formula(text), "anions")


def test_fractional_counts_as_battery_formulas_write_them():
    # LiNi1/3Mn1/3Co1/3O2 (NMC111; common practice) is LiNi(1/3)Mn(1/3)Co(1/3)O2, not a mixture of "LiNi1" and
    # "3Mn1"; its mass from periodictable with the fractions written out
    periodictable = pytest.importorskip("periodictable")
    third = 1 / 3
    for text in ("LiNi1/3Mn1/3Co1/3O2", "Li(Ni1/3Mn1/3Co1/3)O2"):
        row = score_formula(text)
        assert row["substance_class"] == "ionic_salt" and row["status"] == "ok", row["message"]
        assert row["molar_mass_g_mol"] == pytest.approx(
            periodictable.formula(f"LiNi{third}Mn{third}Co{third}O2").mass, rel=1e-5)
    # a slash between formulas still joins a mixture
    assert score_formula("KNO3/NaNO3")["substance_class"] == "mixture"
    assert score_formula("NaCl 1/0")["status"] == "error"


@pytest.mark.parametrize("labelled, plain", [
    # structure labels of materials data (common practice): Greek polymorphs, h-/c- for hexagonal and cubic,
    # Ramsdell polytypes; before, "2H-MoS2" was read as a mixture of H and MoS2 and "α-Al2O3" was an error
    ("α-Al2O3", "Al2O3"), ("alpha-Al2O3", "Al2O3"), ("γ-Fe2O3", "Fe2O3"), ("h-BN", "BN"), ("c-BN", "BN"),
    ("2H-MoS2", "MoS2"), ("4H-SiC", "SiC"), ("β-SiC", "SiC"),
])
def test_structure_labels_are_set_aside(labelled, plain):
    row, same = score_formula(labelled), score_formula(plain)
    assert row["substance_class"] == same["substance_class"] != "mixture"
    assert row["formula_normalized"] == same["formula_normalized"]
    assert "structure label" in row["message"]


def test_a_hyphen_between_formulas_after_a_label_is_still_read_as_written():
    assert score_formula("LiCl-KCl")["substance_class"] == "mixture"


@pytest.mark.parametrize("text, salt", [
    # a salt written as its ions with their charges (common practice in ion lists): before, "Na+ Cl-" read as
    # one ion, NaCl^-
    ("Na+ Cl-", "NaCl"), ("Na+Cl-", "NaCl"), ("Ca2+ 2Cl-", "CaCl2"), ("NH4+ NO3-", "NH4NO3"),
    ("2Na+ SO4^2-", "Na2SO4"), ("Al3+ 3 OH-", "Al(OH)3"),
])
def test_ions_written_with_their_charges_are_one_salt(text, salt):
    row, same = score_formula(text), score_formula(salt)
    assert (row["formula_normalized"], row["cations"], row["anions"]) == (
        same["formula_normalized"], same["cations"], same["anions"])
    assert "with their charges" in row["message"]


@pytest.mark.parametrize("text", ["SO4^2-", "Fe3+", "[C4mim]+ [BF4]-", "NaCl-KCl"])
def test_single_ions_codes_and_mixtures_are_not_taken_for_ion_lists(text):
    assert "with their charges" not in (score_formula(text)["message"] or "")


def test_a_black_circle_is_a_hydrate_dot():
    assert score_formula("CuSO4●5H2O")["formula_normalized"] == "CuSO4·5H2O"


@pytest.mark.parametrize("text, meant", [("Cu(NO3)", "Cu(NO3)2"), ("Cu(OH)", "Cu(OH)2")])
def test_a_bracketed_group_without_its_count_that_the_registry_lists_only_counted_warns(text, meant):
    # Cu(NO3) reads as copper(I) nitrate, which the registry's tables (chemicals' CRC and PubChem identifier
    # tables, scorer/data/registry_names.csv) do not list; Cu(NO3)2 they do
    from ionicity.scorer.registry_formulas import registry_knows

    assert not registry_knows(dict(parse_formula(text).counts)) and registry_knows(dict(parse_formula(meant).counts))
    row = score_formula(text)
    assert row["status"] == "warning" and f"did you mean {meant}?" in row["message"]


@pytest.mark.parametrize("text", ["Ag(NO3)", "Na(OH)", "Tl(NO3)", "Zn(SO4)", "K(MnO4)", "Cu(NO3)2"])
def test_a_bracketed_group_of_a_listed_salt_stays_ok(text):
    assert score_formula(text)["status"] == "ok"
