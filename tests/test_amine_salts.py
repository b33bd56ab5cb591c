"""Amine hydrohalides: a base written or named with n HX is read as the base protonated n times beside n halides.

External reference: the registry package ``chemicals`` (``chemicals.identifiers.search_chemical(name)``): the
compound's formula and its SMILES, which writes the base and HCl as separate components (``CN.Cl`` for
methylamine hydrochloride, ``C(CN)N.Cl.Cl`` for ethylenediamine dihydrochloride): the composition and the count
of HX checked here. The protonated-base reading is IUPAC's (Red Book 2005, IR-5.5; Blue Book 2013, P-73.2; from
memory). Before this rule aniline hydrochloride read as 1-methylpyridinium chloride and triethylamine
hydrochloride as trimethylpropylammonium chloride (isomers from the ion library); ethylenediamine
dihydrochloride was unread.
"""
from __future__ import annotations

import pytest
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.record import score_formula


def _composition(text: str) -> dict[str, float]:
    return {s: n for s, n in parse_formula(text).counts if n}


@pytest.mark.parametrize("name", ["aniline hydrochloride", "pyridine hydrochloride", "methylamine hydrochloride",
                                  "triethylamine hydrochloride", "ethylenediamine dihydrochloride",
                                  "glycine hydrochloride", "guanidine hydrochloride"])
def test_named_hydrochlorides_are_protonated_bases(name):
    identifiers = pytest.importorskip("chemicals.identifiers")
    found = identifiers.search_chemical(name)  # source: chemicals (PubChem identifier table)
    n_acid = found.smiles.split(".").count("Cl")
    row = score_formula(name)
    assert row["substance_class"] == "ionic_liquid_pair", row["message"]
    assert row["anions"] == f"Cl(-)*{n_acid}"
    cation = row["cations"].split("*")[0]
    assert cation.endswith(f"({n_acid}+)" if n_acid > 1 else "(+)")
    # the composition is the registry's
    total = _composition(found.formula)
    assert _composition(row["formula_normalized"]) == total


@pytest.mark.parametrize("text, cation", [
    ("C6H5NH2·HCl", "[C6H8N](+)*1"), ("C2H8N2·2HCl", "[C2H10N2](2+)*1"), ("CH3NH2.HCl", "[MeNH3](+)*1"),
    ("C6H5NH2*HBr", "[C6H8N](+)*1"),
])
def test_written_hydrohalides(text, cation):
    row = score_formula(text)
    assert row["cations"] == cation and row["substance_class"] == "ionic_liquid_pair"


def test_a_listed_cation_only_where_no_isomer_is_possible():
    # C2H8N(+) is ethylammonium or dimethylammonium: the formula cannot say, so the built cation is taken
    assert score_formula("(CH3)2NH·HCl")["cations"] == "[C2H8N](+)*1"
    assert score_formula("hydroxylamine hydrochloride")["cations"] == "NH3OH(+)*1"  # inorganic: as before


@pytest.mark.parametrize("name", ["1,2-benzenediamine dihydrochloride", "2-chloroaniline hydrochloride",
                                  "acetylcholine bromide", "betaine hydrochloride"])
def test_hill_formulas_the_registry_lists_as_salts(name):
    # as a bare Hill formula these read as molecules; the registry (scorer/data/registry_names.csv, from the same
    # package's tables) lists each formula only as a salt: one organic cation beside as many halide ions as the
    # SMILES has halide components (source: chemicals' lookup below)
    identifiers = pytest.importorskip("chemicals.identifiers")
    found = identifiers.search_chemical(name)
    halides = [part for part in found.smiles.split(".") if part in ("Cl", "Br", "[Cl-]", "[Br-]")]
    row = score_formula(found.formula)
    assert row["substance_class"] == "ionic_liquid_pair", (found.formula, row["message"])
    assert row["anions"].endswith(f"*{len(halides)}")


def test_choline_chloride_is_no_hypochlorite():
    # C5H14ClNO tied between choline chloride and ethyltrimethylammonium hypochlorite, and took the hypochlorite
    # (an organic cation beside a hypohalite does not keep; common practice)
    assert score_formula("C5H14ClNO")["cations"] == "[Ch](+)*1"


@pytest.mark.parametrize("text", ["Acetylcholine chloride", "C7H16ClNO2", "CH6ClNO", "C9H14ClNO", "C6H11BrN2O2",
                                  "Methoxamine hydrochloride", "C8H19NO2", "C7H13N2O3"])
def test_an_organic_formula_holds_no_hypohalite_or_chlorite(text):
    # hypohalites and chlorite oxidise amines and onium ions (N-haloamines; Greenwood & Earnshaw, Chemistry of the
    # Elements, 2nd ed., 1997, ch. 17.2; from memory): acetylcholine chloride (CAS 60-31-1, the registry package
    # chemicals) had read as an ethylmethylpyrrolidinium chlorite, CH6ClNO as methylammonium hypochlorite
    row = score_formula(text)
    assert not any(code in (row["anions"] or "")
                   for code in ("ClO(-)", "BrO(-)", "IO(-)", "ClO2(-)", "ClO3(-)", "HO2(-)", "O3(-)"))
