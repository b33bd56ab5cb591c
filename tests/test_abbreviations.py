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
    ("Cp2ZrCl2", "C10H10ZrCl2"), ("Cp*2Fe", "C20H30Fe"), ("PPh3", "C18H15P"),
    ("AcOH", "C2H4O2"), ("Ac2O", "C4H6O3"), ("AcCl", "C2H3ClO"), ("NaOMe", "CH3ONa"), ("Et3N", "C6H15N"),
])
def test_abbreviation_is_written_out_with_the_right_mass(typed, formula):
    out = score_formula(typed)
    assert out["status"] == "warning" and "read the abbreviations" in out["message"]
    assert out["molar_mass_g_mol"] == pytest.approx(periodictable.formula(formula).mass, rel=1e-4)


@pytest.mark.parametrize("typed, formula, cation", [
    # "Ac" after the cation, as buffer recipes and stock lists write acetate (common practice): these read as
    # actinium alloys and hydrides with status ok; molar masses of the acetates from periodictable
    ("NaAc", "C2H3O2Na", "Na(+)"), ("KAc", "C2H3O2K", "K(+)"), ("NH4Ac", "C2H7NO2", "NH4(+)"),
    ("Pb(Ac)2", "C4H6O4Pb", "Pb(2+)"), ("PbAc2", "C4H6O4Pb", "Pb(2+)"), ("AgAc", "C2H3O2Ag", "Ag(+)"),
    ("NaAc·3H2O", "C2H3O2Na(H2O)3", "Na(+)"), ("Zn(Ac)2·2H2O", "C4H6O4Zn(H2O)2", "Zn(2+)"),
])
def test_ac_after_a_cation_is_acetate(typed, formula, cation):
    out = score_formula(typed)
    assert "actinium" in out["message"] and "Ac" not in out["oxidation_states"]
    assert out["cations"].split("*")[0] == cation and "CH3COO(-)" in out["anions"]
    assert out["molar_mass_g_mol"] == pytest.approx(periodictable.formula(formula).mass, rel=1e-4)


def test_acetic_acid_written_hac_and_actinium_compounds_written_metal_first():
    assert score_formula("HAc")["formula_normalized"] == "C2H4O2"
    for text, state in (("AcCl3", "Ac:+3"), ("Ac2O3", "Ac:+3"), ("Ac(NO3)3", "Ac:+3"), ("K3AcF6", "Ac:+3")):
        assert state in score_formula(text)["oxidation_states"].split(";"), text


@pytest.mark.parametrize("typed, formula, state", [
    # acac is the library's acetylacetonate ion (charge -1), read as written; each complex is a neutral
    # chelate molecule with the metal in the state the ligands balance (IUPAC Red Book 2005, IR-9; formulas
    # and states from memory); molar masses from periodictable
    ("Cu(acac)2", "C10H14O4Cu", "Cu:+2"), ("Fe(acac)3", "C15H21O6Fe", "Fe:+3"), ("Al(acac)3", "C15H21O6Al", "Al:+3"),
    ("VO(acac)2", "C10H14O5V", "V:+4"), ("Li(acac)", "C5H7O2Li", "Li:+1"), ("Pd(acac)2", "C10H14O4Pd", "Pd:+2"),
])
def test_metal_acetylacetonates_are_chelate_molecules(typed, formula, state):
    out = score_formula(typed)
    assert out["substance_class"] == "covalent_molecular"
    assert state in out["oxidation_states"].split(";")
    assert out["molar_mass_g_mol"] == pytest.approx(periodictable.formula(formula).mass, rel=1e-4)
    # no organometallic (metal-carbon) reading and its pyrophoric caution: the ligand binds through O
    assert "organometallic" not in (out["message"] or "")


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


@pytest.mark.parametrize("text, cation", [("Co(en)3Cl3", "[Co(en)3](3+)*1"), ("[Cu(en)2]SO4", "[Cu(en)2](2+)*1")])
def test_neutral_n_donor_ligands_make_complex_ions_not_atoms_read_as_ions(text, cation):
    # the ligand's atoms are never read as ions (an error said so before scorer.coordination read the complexes);
    # six donor atoms of three en fill cobalt's octahedron, so the chlorides are counter-ions (common practice)
    row = score_formula(text)
    assert row["status"] == "ok" and row["substance_class"] == "ionic_salt" and row["cations"] == cation


@pytest.mark.parametrize("text", ["Cu(acac)2", "LiHMDS"])
def test_mixed_case_text_is_never_recased_into_a_rare_element(text):
    # "acac" is no actinium, "MD" no mendelevium (common practice)
    out = score_formula(text)
    assert "Ac" not in (out["formula_suggested"] or "") and "Md" not in (out["message"] or "")


def test_all_capitals_may_still_be_recased_into_any_element():
    # PUO2 typed in capitals is plutonium dioxide (a re-casing of the whole text)
    assert score_formula("PUO2")["formula_suggested"] == "PuO2"


# Hybrid perovskites as their literature writes them: MA methylammonium CH3NH3+, FA
# formamidinium HC(NH2)2+ (guanidinium C(NH2)3+ written out: GA in capitals is gallium) (Jena, Kulkarni & Miyasaka, Chem. Rev.
# 2019, 119, 3036, from memory); Pb(2+) and the halide, molar mass against periodictable.
@pytest.mark.parametrize("typed, formula, cation", [
    ("MAPbI3", "CH6NPbI3", "[MeNH3](+)*1"), ("FAPbI3", "CH5N2PbI3", "[FA](+)*1"),
    ("C(NH2)3PbI3", "CH6N3PbI3", "[GA](+)*1"), ("(MA)2PbI4", "C2H12N2PbI4", "[MeNH3](+)*2"),
])
def test_perovskite_a_site_abbreviations(typed, formula, cation):
    out = score_formula(typed)
    assert cation in out["cations"] and "Pb(2+)*1" in out["cations"]
    assert out["molar_mass_g_mol"] == pytest.approx(periodictable.formula(formula).mass, rel=1e-4)


def test_mixed_a_site_keeps_the_written_fractions():
    out = score_formula("Cs0.05FA0.8MA0.15PbI3")
    assert out["cations"] == "Cs(+)*0.05;Pb(2+)*1;[FA](+)*0.8;[MeNH3](+)*0.15"


# Amidinium salts written with their NH2 groups are salts (guanidinium chloride and nitrate;
# formamidinium iodide, the perovskite precursor), urea and thiourea stay molecules
# (Greenwood & Earnshaw ch. 8; from memory).
@pytest.mark.parametrize("typed, cls", [
    ("C(NH2)3Cl", "ionic_liquid_pair"), ("C(NH2)3NO3", "ionic_liquid_pair"), ("HC(NH2)2I", "ionic_liquid_pair"),
    ("guanidinium chloride", "ionic_liquid_pair"), ("CO(NH2)2", "covalent_molecular"), ("CS(NH2)2", "covalent_molecular"),
])
def test_amidinium_salts_and_amides(typed, cls):
    assert score_formula(typed)["substance_class"] == cls


def test_choline_chloride_as_deep_eutectic_recipes_write_it():
    # ChCl: choline chloride, the hydrogen-bond acceptor of the reline deep eutectic solvent
    # (Abbott et al., Chem. Commun. 2003, 70, "ChCl:urea 1:2"; from memory); it was a typing-slip
    # proposal CHCl before
    out = score_formula("ChCl")
    assert (out["cations"], out["anions"]) == ("[Ch](+)*1", "Cl(-)*1")
    assert "cholinium" in out["message"]
    mixture = score_formula("ChCl:urea 1:2")
    assert mixture["substance_class"] == "mixture" and mixture["status"] == "ok"
    assert score_formula("CHCl3")["substance_class"] == "covalent_molecular"


@pytest.mark.parametrize("hyphenated, plain, formula", [
    # the trade writes the alkyl prefixes with or without a hyphen (common practice); masses from periodictable
    ("n-BuLi", "nBuLi", "C4H9Li"), ("t-BuLi", "tBuLi", "C4H9Li"), ("sec-BuLi", "sBuLi", "C4H9Li"),
    ("tert-BuOK", "tBuOK", "C4H9OK"), ("i-PrOH", "iPrOH", "C3H8O"), ("n-PrOH", "nPrOH", "C3H8O"),
    ("Ti(O-i-Pr)4", "Ti(OiPr)4", "C12H28O4Ti"), ("n-Bu4NBr", "nBu4NBr", "C16H36NBr"),
])
def test_hyphenated_alkyl_prefixes_read_as_the_plain_ones(hyphenated, plain, formula):
    out, same = score_formula(hyphenated), score_formula(plain)
    assert out["substance_class"] != "mixture" and out["status"] != "error", out["message"]
    assert (out["formula_normalized"], out["substance_class"]) == (same["formula_normalized"], same["substance_class"])
    assert out["molar_mass_g_mol"] == pytest.approx(periodictable.formula(formula).mass, rel=1e-4)


def test_a_hyphen_between_formulas_is_still_a_mixture():
    assert score_formula("NaCl-KCl")["substance_class"] == "mixture"


@pytest.mark.parametrize("typed, formula, spacer", [
    # the spacer cations of layered hybrid perovskites as that literature writes them (common practice): BA2PbI4
    # had been re-cased into Ba2PBI4, a barium phosphorus boron iodide; PEA2PbI4 was an error. Masses from
    # periodictable
    ("BA2PbI4", "(C4H12N)2PbI4", "[BuNH3](+)"), ("(BA)2PbI4", "(C4H12N)2PbI4", "[BuNH3](+)"),
    ("PEA2PbI4", "(C8H12N)2PbI4", "[PEA](+)"), ("(PEA)2SnI4", "(C8H12N)2SnI4", "[PEA](+)"),
    ("BA2MA2Pb3I10", "(C4H12N)2(CH6N)2Pb3I10", "[BuNH3](+)"),
])
def test_layered_perovskite_spacers_are_their_ammonium_ions(typed, formula, spacer):
    out = score_formula(typed)
    assert spacer in out["cations"] and ("Pb(2+)" in out["cations"] or "Sn(2+)" in out["cations"])
    assert out["molar_mass_g_mol"] == pytest.approx(periodictable.formula(formula).mass, rel=1e-4)


def test_ba_in_capitals_without_a_perovskite_halide_is_still_barium():
    assert score_formula("BACl2")["formula_normalized"] == "BaCl2"


@pytest.mark.parametrize("typed, formula", [
    # alkoxides of the p-block metals (aluminium isopropoxide, a tetramer of Al-O-Al bridges; Greenwood &
    # Earnshaw, 2nd ed., 1997, ch. 7, from memory) are metal-organic molecules, as the titanium ones were; they
    # were errors, then "metal-organic" molecules, now metal alkoxides by their written groups
    # (scorer.alkoxides). Masses from periodictable
    ("Al(OiPr)3", "C9H21AlO3"), ("Ga(OiPr)3", "C9H21GaO3"),
])
def test_p_block_metal_alkoxides_are_metal_organic_molecules(typed, formula):
    out = score_formula(typed)
    assert out["status"] == "warning" and out["substance_class"] == "covalent_molecular"
    assert "a metal alkoxide M(OR)n" in out["message"]
    assert out["molar_mass_g_mol"] == pytest.approx(periodictable.formula(formula).mass, rel=1e-4)
