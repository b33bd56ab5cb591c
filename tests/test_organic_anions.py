"""Salts of s-block metals with organic anions the ion library does not list (scorer/organic_anions.py).

The compounds are salts by their common names (sodium dodecyl sulfate, potassium hydrogen phthalate,
potassium sorbate, potassium tert-butoxide, disodium and tetrasodium EDTA: IUPAC Red Book 2005, IR-5.4;
Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 4; from memory). Before the rule,
SDS and KOtBu were called organometallic molecules, KHP was a row error, potassium sorbate a reading of
H(+) and OH(-) beside K(+), and Na2H2EDTA an imidazolium formate tartrate.
"""
from __future__ import annotations

import pytest

from ionicity.scorer.organic_anions import organic_anion_readings
from ionicity.scorer.record import score_formula


@pytest.mark.parametrize("formula, cations, anions", [
    ("C12H25NaO4S", "Na(+)*1", "C12H25O4S(-)*1"),     # sodium dodecyl sulfate
    ("KHC8H4O4", "K(+)*1", "C8H5O4(-)*1"),             # potassium hydrogen phthalate (KHP)
    ("C6H7KO2", "K(+)*1", "C6H7O2(-)*1"),              # potassium sorbate
    ("C4H9OK", "K(+)*1", "C4H9O(-)*1"),                # potassium tert-butoxide
    # (the edetates, the anions of disodium dihydrogen EDTA and tetrasodium EDTA, are rows of the ion library since
    # 5 December 2026: tests/test_stockroom_labels.py reads them there)
])
def test_salts_of_organic_acids_read_as_metal_and_organic_anion(formula, cations, anions):
    out = score_formula(formula)
    assert (out["substance_class"], out["cations"], out["anions"]) == ("ionic_salt", cations, anions)
    assert "organic anion the ion library does not list" in out["message"]


def test_alkaline_earth_salts_split_into_two_monoanions():
    # calcium and magnesium carboxylates hold two monoanions (calcium propionate, Ca(C2H5COO)2)
    readings, _ = organic_anion_readings({"C": 6.0, "H": 10.0, "Ca": 1.0, "O": 4.0})
    assert sorted(f"{ion.ion_id}*{n:g}" for ion, n in readings[0][1]) == ["C3H5O2(-)*2", "Ca(2+)*1"]


@pytest.mark.parametrize("formula", ["CH3Li", "C4H9Li", "C2H5MgCl", "C6H5Li"])
def test_metal_alkyls_without_oxygen_stay_organometallic(formula):
    # no oxygen to carry the charge: metal-carbon bonds (Elschenbroich, Organometallics, 2006; from memory)
    out = score_formula(formula)
    assert out["substance_class"] == "covalent_molecular" and "organometallic" in out["message"]


@pytest.mark.parametrize("formula, anion", [
    ("CH3COONa", "CH3COO(-)*1"), ("C6H5Na3O7", "C6H5O7(3-)*1"), ("C7H5NaO2", "C6H5COO(-)*1"),
])
def test_library_organic_anions_are_still_preferred(formula, anion):
    out = score_formula(formula)
    assert out["anions"] == anion and out["status"] == "ok"


def test_the_rule_needs_an_oxygen_per_charge_and_an_s_block_metal():
    assert organic_anion_readings({"C": 2.0, "H": 6.0, "Al": 1.0, "O": 3.0}) == ([], [])   # not s-block
    assert organic_anion_readings({"C": 6.0, "H": 5.0, "Na": 2.0, "O": 1.0}) == ([], [])   # 2 charges, 1 O


def test_a_truncated_hydrogencarbonate_is_no_formyl_salt():
    # NaHCO (NaHCO3 with its count lost) balanced as Na(+) with CHO(-), deprotonated formaldehyde, which is no acid
    # (common practice): now an error that names the complete formulas; alkoxides and phenoxides still read
    row = score_formula("NaHCO")
    assert row["status"] == "error" and "NaHCO3" in row["message"]
    assert score_formula("C4H9OK")["anions"] == "C4H9O(-)*1"


@pytest.mark.parametrize("text, anion, formula", [
    # ammonium octanoate written three ways, ammonium lauryl sulfate, and two registry names (the package chemicals);
    # the octanoate written as its COO group is labelled so (scorer.carboxylates), the same composition
    ("NH4C7H15COO", "C7H15COO(-)*1", "C8H19NO2"),
    ("CH3(CH2)6COONH4", "C7H15COO(-)*1", "C8H19NO2"),
    ("NH4C12H25SO4", "C12H25O4S(-)*1", "C12H29NO4S"),
    ("Ammonium hydrogen tartrate", "C4H5O6(-)*1", "C4H9NO6"),
])
def test_the_ammonium_written_beside_an_unlisted_organic_anion_is_an_ammonium_salt(text, anion, formula):
    # a salt of an organic acid is cation plus conjugate base (IUPAC Red Book 2005, IR-5.4); NH4C7H15COO had read
    # as a molecule C8H19NO2 with status ok. Molar mass against molmass (a registry package)
    molmass = pytest.importorskip("molmass")
    row = score_formula(text)
    assert row["substance_class"] == "ionic_salt" and row["cations"].startswith("NH4(+)")
    assert anion in row["anions"]
    assert row["molar_mass_g_mol"] == pytest.approx(molmass.Formula(formula).mass, rel=1e-4)


@pytest.mark.parametrize("name, cas, cation, anion", [
    # organic anions with no hydrogen or with S donors; names and formulas from the registry (the package
    # chemicals); each had come back "no charge-balanced set of ions found" (an error row)
    ("Sodium trichloroacetate", "650-51-1", "Na(+)*1", "C2Cl3O2(-)*1"),
    ("Sodium methyldithiocarbamate", "137-42-8", "Na(+)*1", "C2H4NS2(-)*1"),
    ("Potassium dichloroisocyanurate", "2244-21-5", "K(+)*1", "C3Cl2N3O3(-)*1"),
])
def test_perhalogenated_and_sulfur_donor_organic_anions(name, cas, cation, anion):
    # a salt of an organic acid is cation plus conjugate base (IUPAC Red Book 2005, IR-5.4); the dithiocarbamate
    # carries its charge on S as a carboxylate does on O (Greenwood & Earnshaw, 2nd ed., 1997, ch. 15; from memory)
    from chemicals.identifiers import search_chemical

    row = score_formula(search_chemical(cas).formula)
    assert (row["substance_class"], row["cations"], row["anions"]) == ("ionic_salt", cation, anion)
    assert score_formula(name)["anions"] == anion


@pytest.mark.parametrize("cas, anion", [("124-65-2", "C2H6AsO2(-)*1"), ("127-85-5", "C6H7AsNO3(-)*1")])
def test_organoarsenic_anions_of_sodium_salts(cas, anion):
    # sodium cacodylate and sodium arsanilate (the package chemicals): Na+ beside the arsinate or arsonate; they
    # had read as H(+), As(3-) and an acetate or a phenoxide (IUPAC Red Book 2005, IR-5.4)
    from chemicals.identifiers import search_chemical

    row = score_formula(search_chemical(cas).formula)
    assert (row["cations"], row["anions"]) == ("Na(+)*1", anion)
