"""Tests for pipelines.melting_screen: the consensus of sources, the name check, the salt screen, the CV groups."""
from __future__ import annotations

import math

import pytest

from ionicity.pipelines import melting_screen
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.melting import formal_salt_reading
from ionicity.scorer.ions import decompose


def _dec(formula: str):
    return decompose(parse_formula(formula))


# ------------------------------------------------------- flagged targets


@pytest.mark.parametrize("names, how, value_K, formula, expected", [
    # NaAl(SO4)2 is listed at 333 K (CRC via chemicals 1.5.2): the dodecahydrate's melting (soda alum, about
    # 334 K, CRC Handbook, from memory), not the anhydrous salt's
    (["aluminum sodium disulfate"], "single: CRC_INORG=333.1", 333.15, "NaAl(SO4)2",
     ("one source, below 100 C for an inorganic salt",)),
    (["sodium sulfate decahydrate"], "agree: A=305.1, B=305.4", 305.3, "Na2SO4", ("a name says hydrate",)),
    (["copper sulfate pentahydrate"], "single: X=383.1", 383.15, "CuSO4", ("a name says hydrate",)),
    # two sources agreeing below 100 C: kept unflagged (Na2S2O3 is listed so by two tables)
    (["sodium thiosulfate"], "agree: WIKIDATA=321.6, COMMON_CHEMISTRY=321.1", 321.4, "Na2S2O3", ()),
    # a low-melting organic salt: unflagged ([C2mim]Cl about 360 K, from memory)
    (["1-ethyl-3-methylimidazolium chloride"], "single: X=360.1", 360.15, "[C2mim]Cl", ()),
    (["sodium chloride"], "single: X=1074.0", 1074.0, "NaCl", ()),
])
def test_target_flags_read_the_data_not_the_index(names, how, value_K, formula, expected):
    assert melting_screen.target_flags(names, how, value_K, _dec(formula)) == expected


# ------------------------------------------------------------------ consensus


def test_consensus_keeps_agreeing_sources_and_the_majority():
    assert melting_screen.consensus_melting_point_K({"a": 1074.0, "b": 1074.2, "c": 1073.0})[0] == 1074.0
    value, how = melting_screen.consensus_melting_point_K({"a": 1000.0, "b": 1010.0, "c": 1400.0})
    assert value == 1005.0 and how.startswith("consensus (2 of 3")


def test_consensus_drops_disagreement_and_records_why():
    value, how = melting_screen.consensus_melting_point_K({"a": 1000.0, "b": 1100.0})
    assert math.isnan(value) and how.startswith("disagree")
    value, how = melting_screen.consensus_melting_point_K({"a": 1000.0, "b": 1100.0, "c": 1300.0, "d": 1500.0})
    assert math.isnan(value)


def test_consensus_edge_cases():
    assert melting_screen.consensus_melting_point_K({}) == (math.nan, "no value") or math.isnan(melting_screen.consensus_melting_point_K({})[0])
    assert melting_screen.consensus_melting_point_K({"a": 500.0, "b": float("nan")})[1].startswith("single")
    # exactly the tolerance apart still agrees; the tolerance is a parameter
    assert melting_screen.consensus_melting_point_K({"a": 1000.0, "b": 1020.0})[1].startswith("agree")
    assert math.isnan(melting_screen.consensus_melting_point_K({"a": 1000.0, "b": 1020.0}, tolerance_K=5.0)[0])


# -------------------------------------------------------------- name and screen


@pytest.mark.parametrize("name, formula", [
    ("sodium sulphate", "Na2SO4"),
    ("ferric chloride", "FeCl3"),
    ("iron(III) chloride", "FeCl3"),
    ("caesium iodide", "CsI"),
    ("aluminium oxide", "Al2O3"),
    ("barium titanate", "BaTiO3"),
    ("1-ethyl-3-methylimidazolium tetrafluoroborate", "[C2mim][BF4]"),
    ("tetrabutylammonium bromide", "[N4444]Br"),
])
def test_names_that_agree_with_the_formula(name, formula):
    assert melting_screen.name_agrees_with_ions(name, _dec(formula)) == (True, "")


@pytest.mark.parametrize("name, formula", [
    ("potassium chloride", "NaCl"),
    ("sodium nitrate", "NaNO2"),
    ("1,2-dimethylpyridinium iodide", "[C2py]I"),  # an isomer: the formula cannot tell
    ("", "NaCl"),
])
def test_names_that_do_not_agree(name, formula):
    assert melting_screen.name_agrees_with_ions(name, _dec(formula))[0] is False


@pytest.mark.parametrize("formula, name, reason", [
    ("CuSO4.5H2O", "copper sulfate pentahydrate", "hydrate"),
    ("NaCl", "sodium chloride hydrate", "hydrate"),
    ("HCl", "hydrochloric acid", "not a salt"),
    ("SiO2", "silica", "not a salt"),
    ("Fe0.95O", "wustite", "fractional"),
    ("Al4C3", "aluminium carbide", "not a salt"),
])
def test_screen_refuses_what_is_not_an_anhydrous_simple_salt(formula, name, reason):
    kept, why = melting_screen.screen_salt(_dec(formula), name)
    assert not kept and reason in why


def test_screen_keeps_a_plain_salt():
    assert melting_screen.screen_salt(_dec("K2SO4"), "potassium sulfate") == (True, "")
    assert melting_screen.screen_salt(_dec("CuCl"), "cuprous chloride") == (True, "")  # Cu+ is common
    assert melting_screen.screen_salt(_dec("Nd2S3"), "neodymium sulfide (Nd2S3)") == (True, "")


@pytest.mark.parametrize("formula, name, reason", [
    # identifier formulas that lost their counts read only through odd +1 states
    ("BaOZr", "barium zirconate", "uncommon oxidation state Ba(+)"),
    # the name writes the real formula in brackets
    ("NdS", "neodymium sulfide (Nd2S3)", "another formula"),
    # nitrosyl and nitryl halides are molecules (NOCl boils at -6 C; CRC Handbook, from memory):
    # the scorer itself calls them covalent_molecular now
    ("NOCl", "nitrosyl chloride", "not a salt (covalent_molecular)"),
    ("NO2F", "nitryl fluoride", "not a salt (covalent_molecular)"),
    # a nitrosonium salt is kept out of the open set all the same (it decomposes rather than melts;
    # Greenwood & Earnshaw, 2nd ed., 1997, ch. 11.3.6, from memory)
    ("NOBF4", "nitrosonium tetrafluoroborate", "molecular oxocation NO(+)"),
])
def test_screen_catches_broken_identifier_formulas(formula, name, reason):
    kept, why = melting_screen.screen_salt(_dec(formula), name)
    assert not kept and reason in why


def test_groups_for_cross_validation():
    assert melting_screen.anion_family(_dec("NaCl")) == "halide"
    assert melting_screen.anion_family(_dec("MgO")) == "oxide"
    assert melting_screen.anion_family(_dec("ZnS")) == "chalcogenide"
    assert melting_screen.anion_family(_dec("KNO3")) == "nitrate"
    assert melting_screen.anion_family(_dec("[C2mim][BF4]")) == "halo-complex"
    assert melting_screen.cation_element(_dec("Fe2(SO4)3")) == "Fe"
    assert melting_screen.cation_element(_dec("(NH4)2SO4")) == "NH4"
    assert melting_screen.cation_element(_dec("[C4mim]Cl")) == "organic"


@pytest.mark.parametrize("formula, family", [
    # read without ions by the interstitial-nitride rule (Haegg 1931; Greenwood & Earnshaw, Chemistry of the
    # Elements, 2nd ed. 1997, ch. 11.3.2) and the layered-dichalcogenide rule (Wilson & Yoffe, Adv. Phys. 1969,
    # 18, 193), both keeping their formal salt reading: grouped with the salts of their metal, as the
    # training screen reads them (cation_element), not in one group of every compound without ions
    ("TiN", "Ti"), ("UN", "U"), ("ZrS2", "Zr"), ("WTe2", "W"),
    # a covalent molecule has no formal salt reading to fall back on (common practice: no cation, no family)
    ("CH4", "none"),
])
def test_cation_family_of_compounds_read_without_ions(formula, family):
    assert melting_screen.cation_family(_dec(formula)) == family
    if family != "none":
        assert melting_screen.cation_family(_dec(formula)) == melting_screen.cation_element(
            formal_salt_reading(_dec(formula)))


@pytest.mark.parametrize("formula, name, kept", [
    # the hydroxides of the alkali metals, Sr and Ba melt as salts (NaOH 596 K, KOH 679 K, Ba(OH)2 681 K,
    # CRC Handbook via chemicals); Mg(OH)2 and Ca(OH)2 give off water and leave the oxide first, so their
    # registry values (623 K, 853 K) are decomposition temperatures (Greenwood & Earnshaw, Chemistry of the
    # Elements, 2nd ed., 1997, ch. 5; from memory)
    ("NaOH", "sodium hydroxide", True),
    ("Ba(OH)2", "barium hydroxide", True),
    ("Mg(OH)2", "magnesium hydroxide", False),
    ("Ca(OH)2", "calcium hydroxide", False),
    ("NH3", "ammonia", False),
])
def test_screen_keeps_the_hydroxides_that_melt_as_salts(formula, name, kept):
    assert melting_screen.screen_salt(_dec(formula), name)[0] is kept
