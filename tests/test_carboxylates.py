"""Metal carboxylates the ion library does not list (scorer.carboxylates): written groups, names, Hill formulas.

References:

* the chemistry: a metal carboxylate is the salt M(RCOO)n of the metal cation and the acid's conjugate base,
  with no metal-carbon bond (IUPAC Red Book 2005, IR-5.4; Greenwood & Earnshaw, Chemistry of the Elements,
  2nd ed., 1997, ch. 8; from memory). Before this module, such salts of metals outside the s block read as
  organometallic molecules ("metal-carbon bonds of alkyl") and their names were unread;
* the compositions: the registry package ``chemicals`` (its identifier database, PubChem formulas), which a
  name's reading must match atom for atom.
"""
from __future__ import annotations

import pytest

from ionicity.scorer import score_formula
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.name_reader import read_name


def _composition(text: str) -> dict[str, float]:
    return {s: round(n, 6) for s, n in parse_formula(text).total_counts.items()}


@pytest.mark.parametrize("text, cation, anions", [
    ("Zn(C11H23COO)2", "Zn(2+)*1", "C11H23COO(-)*2"),    # zinc laurate
    ("Sn(C7H15COO)2", "Sn(2+)*1", "C7H15COO(-)*2"),      # tin(II) octanoate / 2-ethylhexanoate
    ("Cu(CH3(CH2)6COO)2", "Cu(2+)*1", "C7H15COO(-)*2"),  # the chain written with an inner bracket
    ("Pb(C3H7COO)2", "Pb(2+)*1", "C3H7COO(-)*2"),        # lead(II) butanoate
    ("Fe(C7H15CO2)3", "Fe(3+)*1", "C7H15COO(-)*3"),      # the group written CO2
    ("NaC11H23COO", "Na(+)*1", "C11H23COO(-)*1"),        # without a bracket
    ("NH4C11H23COO", "NH4(+)*1", "C11H23COO(-)*1"),      # ammonium laurate
])
def test_written_carboxylate_groups_make_salts(text, cation, anions):
    out = score_formula(text)
    assert out["substance_class"] == "ionic_salt"
    assert (out["cations"], out["anions"]) == (cation, anions)
    assert "metal-carbon" not in out["message"]
    assert "a carboxylate the ion library does not list" in out["message"]


def test_a_listed_carboxylate_keeps_its_library_ion():
    # stearate is a library ion: no built anion, no note
    out = score_formula("Zn(C17H35COO)2")
    assert (out["anions"], out["status"]) == ("C17H35COO(-)*2", "ok")


def test_a_charge_the_metal_never_takes_is_no_reading():
    # five carboxylates on one zinc would need Zn(5+): not this rule's salt
    assert score_formula("Zn(C11H23COO)5")["cations"] != "Zn(5+)*1"


@pytest.mark.parametrize("name, cas", [
    ("zinc laurate", "2452-01-9"),
    ("tin(II) 2-ethylhexanoate", "301-10-0"),
    ("stannous octoate", "301-10-0"),
    ("zinc octanoate", "557-09-5"),
    ("calcium 2-ethylhexanoate", "136-51-6"),
    ("sodium laurate", "629-25-4"),
])
def test_carboxylate_names_read_as_the_registry_compound(name, cas):
    from chemicals.identifiers import search_chemical

    formula = read_name(name)
    assert formula is not None
    assert _composition(formula) == _composition(search_chemical(cas).formula)
    assert score_formula(name)["substance_class"] == "ionic_salt"


@pytest.mark.parametrize("name", ["lauric acid", "heptadecanoic acid", "Heptadecanoic acid"])
def test_carboxylic_acid_names_stay_molecules(name):
    # the carboxylate words name salts; the acids are read by the registry, as before (not H+ with the anion, and
    # not "hepta" times "decanoate")
    out = score_formula(name)
    assert out["substance_class"] == "covalent_molecular" and not out["cations"]


@pytest.mark.parametrize("hill, cas, cation, anions", [
    ("C24H46O4Zn", "2452-01-9", "Zn(2+)*1", "C11H23COO(-)*2"),
    ("C16H30O4Zn", "557-09-5", "Zn(2+)*1", "C7H15COO(-)*2"),
])
def test_hill_formulas_of_metal_carboxylates(hill, cas, cation, anions):
    from chemicals.identifiers import search_chemical

    assert _composition(hill) == _composition(search_chemical(cas).formula)
    out = score_formula(hill)
    assert (out["substance_class"], out["cations"], out["anions"]) == ("ionic_salt", cation, anions)


@pytest.mark.parametrize("formula", ["Zn(C2H5)2", "C4H10Zn", "C10H14FeO4"])
def test_metal_alkyls_and_chelates_are_not_carboxylates(formula):
    # diethylzinc has no oxygen; Fe(acac)2 (C10H14FeO4) splits into C5H7O2 halves, no saturated carboxylate
    # (G&E ch. 8 and 25, from memory)
    assert score_formula(formula)["substance_class"] == "covalent_molecular"
