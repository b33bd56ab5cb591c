"""Alkali-metal amides of secondary amines written by their groups (scorer.metal_amides): LDA and the HMDS salts.

References:

* the compositions and melting points: the registry package ``chemicals`` (``identifiers.search_chemical`` and
  ``phase_change.Tm`` by CAS number: LiHMDS 4039-32-1, 343.65 K; NaHMDS 1070-89-9, 439.15 K). Not in any
  calibration set (the organic weights the index uses are fitted on the calibration half of
  ``datasets/melting/organic_molecules.csv``): a validation of two compounds;
* the chemistry: polar M-N bonds in aggregates, strong bases that water and protic solvents protonate at once to
  the amine and the metal hydroxide (Clayden et al., Organic Chemistry, 2nd ed., 2012, ch. 20 and 25;
  Elschenbroich, Organometallics, 3rd ed., 2006, ch. 5; from memory). Before, LiN(C3H7)2 read "metal-carbon
  bonds of alkyl" with no water behaviour.
"""
from __future__ import annotations

import math

import pytest

from ionicity.scorer import score_formula
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.metal_amides import written_metal_amide


@pytest.mark.parametrize("text, metal, amine", [
    ("LiN(C3H7)2", "Li", "C6H15N"),        # lithium diisopropylamide (LDA), diisopropylamine
    ("LiN(iPr)2", "Li", "C6H15N"),
    ("NaN(Si(CH3)3)2", "Na", "C6H19NSi2"),  # sodium bis(trimethylsilyl)amide, hexamethyldisilazane
    ("LiN(SiMe3)2", "Li", "C6H19NSi2"),
    ("KN(Si(CH3)3)2", "K", "C6H19NSi2"),
])
def test_written_metal_amides_react_violently_with_water(text, metal, amine):
    out = score_formula(text)
    assert out["substance_class"] == "covalent_molecular"
    assert f"{metal}:+1" in out["oxidation_states"] and "N:-3" in out["oxidation_states"]
    assert "M-N bonds" in out["message"] and "metal-carbon bonds of alkyl" not in out["message"]
    assert (out["water_behaviour"], out["solution_ph"]) == ("reacts_violently", "basic")
    assert out["water_reaction_products"] == f"{metal}OH;{amine}"


@pytest.mark.parametrize("text", ["NaNH2", "LiN(C6H5)2", "LiNO3", "LiN(CH3)3", "MgN(C3H7)2"])
def test_other_texts_are_no_written_metal_amide(text):
    # the amide salt NaNH2 reads as Na(+) NH2(-); an aryl amide, three groups or an alkaline-earth metal are not
    # this rule's
    assert written_metal_amide(text) is None


@pytest.mark.parametrize("text, cas", [("LiN(Si(CH3)3)2", "4039-32-1"), ("NaN(Si(CH3)3)2", "1070-89-9")])
def test_hmds_salts_melting_trend_within_a_factor_1_5_of_the_registry(text, cas):
    chemicals = pytest.importorskip("chemicals")
    assert chemicals.identifiers.search_chemical(cas).formula == parse_formula(text).hill
    predicted = 10 ** score_formula(text)["mp_trend_index"]
    assert abs(math.log10(predicted / chemicals.phase_change.Tm(cas))) <= math.log10(1.5)


@pytest.mark.parametrize("name, cas", [("lithium bis(trimethylsilyl)amide", "4039-32-1"),
                                       ("sodium hexamethyldisilazide", "1070-89-9"),
                                       ("lithium diisopropylamide", "4111-54-0")])
def test_amides_by_name_read_as_the_registry_formula(name, cas):
    # before, these names were errors ("neither a formula nor a name the name reader knows")
    identifiers = pytest.importorskip("chemicals.identifiers")
    out = score_formula(name)
    assert parse_formula(out["formula_normalized"]).hill == identifiers.search_chemical(cas).formula
    assert out["water_behaviour"] == "reacts_violently"
