"""Onium cations built by rule from their codes (scorer/onium_codes.py).

Checks: (1) every library cation of the four ring families and of the quaternary families whose label is
such a code has the composition the rule gives (the library rows carry their own sources); (2) salts named
in the registry's PubChem table (``chemicals``) with the composition the rule gives for their code:
1-dodecylpyridinium chloride C17H30ClN and 1-hexadecylpyridinium bromide C21H38BrN; (3) codes the library
does not list now read, and codes no rule covers stay errors.
"""
from __future__ import annotations

import os

import pytest

from ionicity.scorer import ion_library
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.onium_codes import onium_from_code
from ionicity.scorer.record import score_formula


def _library_codes():
    for ion in ion_library.ion_library():
        code = ion.label.strip("[]")
        built = onium_from_code(code)
        if ion.organic and built is not None:
            yield ion, built


def test_the_rule_agrees_with_every_library_cation_it_covers():
    pairs = list(_library_codes())
    assert len(pairs) >= 25  # the imidazolium, pyridinium, pyrrolidinium and quaternary rows
    for ion, built in pairs:
        assert dict(built.composition) == dict(ion.composition), ion.ion_id
        assert built.family == ion.family, ion.ion_id


@pytest.mark.parametrize("text, registry_formula, name", [
    ("[C12py]Cl", "C17H30ClN", "1-dodecylpyridin-1-ium;chloride"),
    ("[C16py]Br", "C21H38BrN", "1-hexadecylpyridin-1-ium;bromide"),
])
def test_built_cations_match_registry_salts(text, registry_formula, name):
    chemicals = pytest.importorskip("chemicals")
    path = os.path.join(os.path.dirname(chemicals.__file__), "Identifiers", "chemical identifiers pubchem large.tsv")
    with open(path, encoding="utf-8") as handle:
        rows = [line.split("\t") for line in handle if f"\t{name}\t" in line]
    assert rows and rows[0][2] == registry_formula  # the registry's own formula of that name
    assert dict(parse_formula(text).counts) == dict(parse_formula(registry_formula).counts)


@pytest.mark.parametrize("text, cation", [
    ("[P4441][NTf2]", "[P1444](+)*1"),   # tributyl(methyl)phosphonium, chains sorted
    ("[C16mim]Cl", "[C16mim](+)*1"),
    ("[C4mpip][NTf2]", "[C4mpip](+)*1"),
    ("[N11116]Br", "[N11116](+)*1"),     # cetyltrimethylammonium bromide
    ("[C3mpyr][FSI]", "[C3mpyr](+)*1"),
])
def test_codes_the_library_does_not_list_read_as_salts(text, cation):
    row = score_formula(text)
    assert row["status"] == "ok", row["message"]
    assert row["substance_class"] == "ionic_liquid_pair" and row["cations"] == cation


@pytest.mark.parametrize("code", ["C21mim", "C0mim", "N222", "N1110", "P444444", "C4mpyrx", "DBUH"])
def test_codes_outside_the_rules_are_not_built(code):
    assert onium_from_code(code) is None


def test_a_built_cation_is_found_again_by_its_id():
    ion = onium_from_code("C14mim")
    assert ion_library.get_ion(ion.ion_id) == ion
    assert "built by rule" in ion.source


@pytest.mark.parametrize("text, normalized", [
    # an ionic liquid's codes joined by a hyphen, as catalogues write them (common practice)
    ("EMIM-BF4", "[C2mim][BF4]"),
    ("BMIM - Cl", "[C4mim]Cl"),
    ("C4mpyr-NTf2", "[C4mpyr][NTf2]"),
])
def test_hyphenated_ionic_liquid_codes_are_one_salt(text, normalized):
    row = score_formula(text)
    assert row["status"] == "ok" and row["formula_normalized"] == normalized


def test_hyphenated_salts_are_still_mixtures():
    assert score_formula("LiCl-KCl")["substance_class"] == "mixture"


@pytest.mark.parametrize("text, normalized", [
    # quaternary ammonium reagents by their catalogue codes (common practice): tetrabutylammonium bromide,
    # tetraethylammonium tetrafluoroborate, tetramethylammonium hydroxide, cetyltrimethylammonium bromide
    ("TBAB", "[N4444]Br"),
    ("TEABF4", "[N2222][BF4]"),
    ("TMAH", "[N1111][OH]"),
    ("CTAB", "[N11116]Br"),
    ("TBAHS", "[N4444][HSO4]"),
])
def test_quaternary_reagent_codes(text, normalized):
    row = score_formula(text)
    assert row["formula_normalized"] == normalized
    assert "read the reagent code" in row["message"]


@pytest.mark.parametrize("text", ["TEA", "DEA"])
def test_amine_codes_are_not_tritium_or_deuterium_with_ethylammonium(text):
    # TEA was read as T (tritium) and EA (ethylammonium), "ethylammonium tritide"
    assert score_formula(text)["status"] == "error"


@pytest.mark.parametrize("text, normalized", [
    # chains written apart, as papers write a two-digit chain (trihexyltetradecylphosphonium is P66614;
    # Wasserscheid & Welton, Ionic Liquids in Synthesis, 2nd ed., 2008; from memory)
    ("[P14,6,6,6][NTf2]", "[P66614][NTf2]"), ("[P14,6,6,6]Cl", "[P66614]Cl"),
    ("[N1,1,1,16]Br", "[N11116]Br"), ("[N4,4,4,4][BF4]", "[N4444][BF4]"),
    # aliases of the trade: BMPyrr for 1-butyl-1-methylpyrrolidinium, HNEt3 for triethylammonium, EAN for
    # ethylammonium nitrate (Greaves & Drummond, Chem. Rev. 108 (2008) 206; from memory)
    ("[BMPyrr][TFSI]", "[C4mpyr][NTf2]"), ("[HNEt3][HSO4]", "[Et3NH][HSO4]"), ("EAN", "[EtNH3][NO3]"),
    # the chloroaluminate electrolytes' imidazolium chlorides (EMIC-AlCl3; common practice, from memory)
    ("EMIC", "[C2mim]Cl"), ("BMIC", "[C4mim]Cl"),
])
def test_codes_of_the_trade_read_as_their_ions(text, normalized):
    row = score_formula(text)
    assert row["status"] in ("ok", "warning") and row["formula_normalized"] == normalized
    assert row["substance_class"] == "ionic_liquid_pair"


@pytest.mark.parametrize("name, normalized", [
    # the ring nitrogen's locant written N or 1 (IUPAC Blue Book 2013, P-31.1.4; both in use)
    ("N-butyl-N-methylpyrrolidinium bis(trifluoromethanesulfonyl)imide", "[C4mpyr][NTf2]"),
    ("N-methyl-N-propylpiperidinium bromide", "[C3mpip]Br"),
])
def test_n_locants_of_the_ring_onium_names_read_as_locant_one(name, normalized):
    row = score_formula(name)
    assert row["formula_normalized"] == normalized and row["substance_class"] == "ionic_liquid_pair"


@pytest.mark.parametrize("text, cation, anion", [
    # protic and amino-acid ionic liquids of the literature (Greaves & Drummond, Chem. Rev. 2008; Fukumoto,
    # Yoshizawa & Ohno, J. Am. Chem. Soc. 2005; from memory): they were unknown bracketed abbreviations
    ("[DEMA][OTf]", "[DEMA](+)*1", "[OTf](-)*1"),
    ("[Ch][Gly]", "[Ch](+)*1", "[Gly](-)*1"),
    ("[Ch][Ala]", "[Ch](+)*1", "[Ala](-)*1"),
    ("[C2mim][Gly]", "[C2mim](+)*1", "[Gly](-)*1"),
])
def test_protic_and_amino_acid_ionic_liquids(text, cation, anion):
    row = score_formula(text)
    assert row["status"] == "ok" and (row["cations"], row["anions"]) == (cation, anion)
    assert row["substance_class"] == "ionic_liquid_pair"


def test_tea_in_brackets_stays_unread():
    # [TEA] is triethylammonium in protic-ionic-liquid papers and tetraethylammonium beside BF4 (TEABF4): ambiguous
    assert score_formula("[TEA][HSO4]")["status"] == "error"


@pytest.mark.parametrize("text, normalized", [("[Py14][FSI]", "[C4mpyr][FSI]"), ("[PYR14][TFSI]", "[C4mpyr][NTf2]"),
                                              ("[Py13][FSI]", "[C3mpyr][FSI]")])
def test_the_battery_literature_codes_of_the_pyrrolidinium_cations(text, normalized):
    # Py14 / PYR14: N-butyl-N-methylpyrrolidinium, Py13: N-methyl-N-propylpyrrolidinium, as electrolyte papers
    # write them (Armand et al., Nat. Mater. 8 (2009) 621; from memory)
    from ionicity.scorer.record import score_formula
    row = score_formula(text)
    assert row["status"] == "ok" and row["formula_normalized"] == normalized


@pytest.mark.parametrize("text", ["[C2OHmim][BF4]", "[HOEMIM][BF4]", "HOEMIM BF4"])
def test_the_hydroxyethyl_imidazolium_cation_is_read(text):
    # 1-(2-hydroxyethyl)-3-methylimidazolium, C6H11N2O+ (Wasserscheid & Welton, Ionic Liquids in Synthesis, 2nd ed.,
    # 2008; from memory); molar mass of the BF4 salt checked against molmass (C6H11BF4N2O)
    molmass = pytest.importorskip("molmass")
    row = score_formula(text)
    assert row["formula_normalized"] == "[C2OHmim][BF4]" and row["substance_class"] == "ionic_liquid_pair"
    assert row["molar_mass_g_mol"] == pytest.approx(molmass.Formula("C6H11BF4N2O").mass, rel=1e-4)


def test_a_chloroaluminate_electrolyte_written_with_its_code_is_a_mixture():
    # "EMIC-AlCl3 (1:2)": an acidic chloroaluminate melt, 2 AlCl3 per [C2mim]Cl (common practice); the code had
    # stopped the mixture reader ("unknown element 'E'")
    row = score_formula("EMIC-AlCl3 (1:2)")
    assert row["substance_class"] == "mixture"
    assert row["formula_normalized"] == "[C2mim]Cl-AlCl3 (33.33-66.67 mol%)"
    assert "reacts_violently" in row["water_behaviour"]


@pytest.mark.parametrize("name, normalized, hill", [
    # tetraalkylammonium and -phosphonium salts named by their alkyl groups in any order, with the surfactant
    # trivial chain names (cetyl 16, myristyl 14, stearyl 18; common practice): were unread unless the
    # library lists the name; compositions from the chain lengths, molar masses from periodictable
    ("tributylmethylammonium chloride", "[N1444]Cl", "C13H30NCl"),
    ("methyltributylammonium chloride", "[N1444]Cl", "C13H30NCl"),
    ("trimethylbutylammonium bromide", "[N1114]Br", "C7H18NBr"),
    ("tetradecyltrihexylphosphonium chloride", "[P66614]Cl", "C32H68PCl"),
    ("myristyltrimethylammonium bromide", "[N11114]Br", "C17H38NBr"),
    ("tetrabutylammonium fluoride trihydrate", "[N4444]F·3H2O", "C16H36NF(H2O)3"),
    ("tributylmethylammonium bis(trifluoromethylsulfonyl)imide", "[N1444][NTf2]", "C15H30N2F6O4S2"),
])
def test_tetraalkyl_onium_names_read_as_their_codes(name, normalized, hill):
    periodictable = pytest.importorskip("periodictable")
    row = score_formula(name)
    assert row["formula_normalized"] == normalized and row["substance_class"] == "ionic_liquid_pair"
    assert row["molar_mass_g_mol"] == pytest.approx(periodictable.formula(hill).mass, rel=1e-4)


@pytest.mark.parametrize("name", ["didecyldimethylammonium chloride", "dimethyl sulfate", "tributylammonium"])
def test_names_no_onium_code_writes_are_not_forced_into_one(name):
    # two chains of ten carbons or more have no code (scorer.onium_codes); an ester or a bare cation word is
    # no tetraalkyl salt
    row = score_formula(name)
    assert not (row["formula_normalized"] or "").startswith("[N")
