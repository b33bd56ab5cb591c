"""Quaternary onium salts written or named by their groups (scorer.onium_groups, scorer.organic_cations).

References: the compositions are checked against the registry package ``chemicals`` (its identifier table,
PubChem-derived: ``chemicals.identifiers.search_chemical(name).formula``), the torsions against the
shape table of the ion library (``scorer/data/ion_shape.csv``, Dannenfelser-Yalkowsky counts of the
tetraalkyl ions), the melting points against ``chemicals.phase_change.Tm`` (CRC Handbook and Common
Chemistry values; never fitted on: the organic weights of the index are fitted on the calibration rows
of ``datasets/melting/ionic_liquids.csv``, which hold none of these salts).
"""
from __future__ import annotations

import math

import pytest
from ionicity.scorer.formula import hill_formula, parse_formula
from ionicity.scorer.ion_library import get_ion
from ionicity.scorer.ions import decompose
from ionicity.scorer.ion_shapes import ion_shape
from ionicity.scorer.onium_groups import onium_name, onium_shape, written_onium
from ionicity.scorer.record import score_formula


def _hill(record) -> str:
    return hill_formula(dict(parse_formula(record["formula_normalized"]).counts))


# names as catalogues write them, each with its CAS number's formula in the registry
@pytest.mark.parametrize("name", [
    "benzyltrimethylammonium chloride", "benzyltriethylammonium chloride", "benzyltributylammonium bromide",
    "didecyldimethylammonium chloride", "phenyltrimethylammonium chloride", "tetraphenylphosphonium bromide",
    "methyltriphenylphosphonium bromide", "benzyltriphenylphosphonium chloride", "tetraphenylarsonium chloride",
    "trimethylsulfonium iodide", "triphenylsulfonium triflate", "allyltriphenylphosphonium bromide",
    "benzyldimethylhexadecylammonium chloride", "benzyltrimethylammonium hydroxide",
])
def test_named_onium_salts_read_as_the_registry_formula_of_the_name(name):
    identifiers = pytest.importorskip("chemicals.identifiers")
    record = score_formula(name)
    assert record["status"] != "error" and record["substance_class"] == "ionic_liquid_pair"
    assert _hill(record) == identifiers.search_chemical(name).formula


@pytest.mark.parametrize("text, name", [
    ("(C2H5)3(C6H5CH2)NCl", "benzyltriethylammonium chloride"),
    ("(C6H5CH2)N(C2H5)3Cl", "benzyltriethylammonium chloride"),
    ("(C6H5)4PBr", "tetraphenylphosphonium bromide"),
    ("(C6H5)3PCH3Br", "methyltriphenylphosphonium bromide"),
    ("(C10H21)2N(CH3)2Cl", "didecyldimethylammonium chloride"),
    ("(CH3)3SI", "trimethylsulfonium iodide"),
    ("Ph3PCH2PhCl", "benzyltriphenylphosphonium chloride"),
    ("BnEt3NCl", "benzyltriethylammonium chloride"),
])
def test_written_groups_read_as_the_same_salt_as_the_name(text, name):
    # common practice: a condensed formula writes the groups on the central atom
    written, named = score_formula(text), score_formula(name)
    assert written["formula_normalized"] == named["formula_normalized"]
    assert written["cations"] == named["cations"] and written["substance_class"] == "ionic_liquid_pair"


def test_the_written_cation_is_not_a_ring_cation_of_the_same_composition():
    # C13H22ClN is also 1-octylpyridinium chloride, which the bare composition read before
    record = score_formula("(C2H5)3(C6H5CH2)NCl")
    assert "py" not in record["cations"] and record["systematic_name"] == "benzyltriethylammonium chloride"


def test_trimethylsulfonium_iodide_is_no_typing_slip_for_the_silyl_radical():
    record = score_formula("(CH3)3SI")
    assert record["formula_normalized"] == "[(CH3)3S]I" and "slip" not in (record["message"] or "")


def test_a_written_quaternary_salt_of_a_library_anion_reads_as_the_salt():
    # tetramethylammonium acetate written by its groups (common practice); its composition C6H15NO2 read as a
    # molecule before
    assert score_formula("(CH3)4NCH3COO")["formula_normalized"] == "[N1111][CH3COO]"


def test_n_alkyl_groups_take_the_code_of_the_trade_not_a_library_isomer():
    # (C5H11)(CH3)3N(+) has the composition of tetraethylammonium, which it is not
    assert score_formula("(C5H11)(CH3)3NBr")["formula_normalized"] == "[N1115]Br"
    assert score_formula("(HOCH2CH2)(CH3)3NCl")["formula_normalized"] == "[Ch]Cl"


# protonated amines written by their groups and hydrogens, each with the registry's formula of the hydrochloride
# (chemicals.identifiers, by CAS name) and the cation's name; before, (CH3)2NH2Cl read as ethylammonium chloride,
# (C2H5)2NH2Cl as tetramethylammonium chloride and (C2H5)3NHCl tied with trimethylpropylammonium chloride
@pytest.mark.parametrize("text, registry_name, cation", [
    ("(CH3)2NH2Cl", "dimethylamine hydrochloride", "dimethylammonium"),
    ("(CH3)3NHCl", "trimethylamine hydrochloride", "trimethylammonium"),
    ("(C2H5)2NH2Cl", "diethylamine hydrochloride", "diethylammonium"),
    ("(C2H5)3NHCl", "triethylamine hydrochloride", "triethylammonium"),
    ("(HOCH2CH2)3NHCl", "triethanolamine hydrochloride", "tris(2-hydroxyethyl)ammonium"),
    ("C6H5NH3Cl", "aniline hydrochloride", "phenylammonium"),          # one group written without brackets
    ("C6H5CH2NH3Cl", "benzylamine hydrochloride", "benzylammonium"),   # (C6H5NH3Cl read as methylpyridinium)
])
def test_protonated_amines_written_by_their_groups_read_as_that_cation(text, registry_name, cation):
    identifiers = pytest.importorskip("chemicals.identifiers")
    record = score_formula(text)
    assert record["status"] != "error" and "ambiguous" not in record["message"]
    assert _hill(record) == identifiers.search_chemical(registry_name).formula
    assert record["systematic_name"] == cation + " chloride"
    # a protic cation (the melting index's protic term counts it), not a quaternary one
    assert [t.ion.family for t in decompose(parse_formula(text)).cations] == ["ammonium-protic"]


def test_a_protonated_amine_takes_the_library_ion_of_its_name_not_an_isomer():
    # triethylammonium is a library ion ([Et3NH](+)); dimethylammonium is not, and [EtNH3](+) of the same
    # composition is no dimethylammonium
    assert score_formula("(C2H5)3NHCl")["cations"] == "[Et3NH](+)*1"
    assert score_formula("(CH3)2NH2Cl")["cations"] == "[(CH3)2NH2](+)*1"
    # the name of a protonated amine's salt with an anion other than a halide reads the same way
    assert score_formula("dimethylammonium nitrate")["cations"] == "[(CH3)2NH2](+)*1"


@pytest.mark.parametrize("text", ["(C6H5)3P", "(CH3)2SO", "(C2H5)3N", "(C2H5)2NH", "(C6H5)3PO", "(CH3)3SiCl",
                                  "C6H5NH2", "C6H5NO2", "C6H5NHCH3"])
def test_neutral_molecules_with_fewer_groups_are_not_onium_salts(text):
    assert written_onium(text) is None
    assert score_formula(text)["substance_class"] not in ("ionic_liquid_pair", "ionic_salt")


@pytest.mark.parametrize("ion_id, groups", [
    ("[N1111](+)", "(CH3)4N"), ("[N2222](+)", "(C2H5)4N"), ("[N4444](+)", "(C4H9)4N"),
    ("[N1114](+)", "(CH3)3(C4H9)N"), ("[P4444](+)", "(C4H9)4P"), ("[N11116](+)", "(CH3)3(C16H33)N"),
    ("[P66614](+)", "(C6H13)3(C14H29)P"),
])
def test_torsions_and_symmetry_of_written_groups_match_the_library_shape_table(ion_id, groups):
    # scorer/data/ion_shape.csv counts these by the Dannenfelser-Yalkowsky rule (Ind. Eng. Chem. Res. 1996,
    # 35, 1483; from memory); the groups' rule must give the same numbers
    centre, parsed, _ = written_onium(groups + "Cl")
    label = "[" + "".join(f"({g}){n if n > 1 else ''}" for g, n in parsed) + centre + "]"
    assert onium_shape(label) == pytest.approx(ion_shape(get_ion(ion_id))[:2])


def test_substitutive_names_put_the_prefixes_in_alphanumerical_order():
    # IUPAC Recommendations 2013, P-14.5 (multiplying prefixes not counted); from memory
    assert onium_name("N", (("C2H5", 3), ("C7H7", 1))) == "benzyltriethylammonium"
    assert onium_name("P", (("C6H5", 3), ("CH3", 1))) == "methyltriphenylphosphonium"
    # a compound substituent goes by its own first letter: (2-hydroxyethyl) under h, before methyl
    assert onium_name("N", (("C2H5O", 3), ("CH3", 1))).startswith("tris(2-hydroxyethyl)methylammonium")


@pytest.mark.parametrize("name, cas", [
    ("tetraphenylphosphonium bromide", "2751-90-8"), ("methyltriphenylphosphonium bromide", "1779-49-3"),
    ("benzyltrimethylammonium chloride", "56-93-9"), ("phenyltrimethylammonium chloride", "138-24-9"),
    ("benzyltriethylammonium chloride", "56-37-1"), ("tetraphenylarsonium chloride", "507-28-8"),
])
def test_validation_onium_salts_melting_trend_within_a_factor_1_5(name, cas):
    # registry melting points (chemicals.phase_change.Tm); none of these salts is a calibration row
    phase_change = pytest.importorskip("chemicals.phase_change")
    measured = float(phase_change.Tm(cas))
    record = score_formula(name)
    assert abs(math.log(10 ** record["mp_trend_index"] / measured)) < math.log(1.5)
