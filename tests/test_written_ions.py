"""Salts written as their ions run together (scorer.written_ions): N2H5HCOO, C2H5NH3NO3, CH3NH3CH3COO.

References:

* the compositions and what the compounds are: the registry package ``chemicals`` (its CRC Handbook table of
  inorganic compounds names C2H8N2O2 "Hydrazine acetate", CAS 13255-48-6; ``scorer/data/registry_names.csv``,
  read here through the registry's own lookup where the package is installed);
* the protic ionic liquids: ethylammonium nitrate, the first room-temperature ionic liquid (mp 12-14 C;
  Walden, Bull. Acad. Imp. Sci. St.-Petersbourg 8 (1914) 405), and the alkylammonium formates and acetates
  (Greaves & Drummond, Protic ionic liquids: properties and applications, Chem. Rev. 108 (2008) 206, Table 1;
  from memory): each is the salt of the protonated amine with the acid's anion, written so in those papers.
  Before this module, CH3NH3HCOO read as ammonium acetate, N2H5HCOO as methylammonium nitrite and
  C2H5NH3CH3COO as a molecule.
* the rule that a bracketed spelling names its ions is the parser's own (``(CH3NH3)2SO4``); these tests hold
  the unbracketed spelling to the same reading (a property of the project, not an outside value).
"""
from __future__ import annotations

import pytest

from ionicity.scorer import score_formula
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.written_ions import written_ion_hints


@pytest.mark.parametrize("text, cations, anions", [
    ("N2H5HCOO", "N2H5(+)*1", "HCOO(-)*1"),                  # hydrazinium formate
    ("N2H5CH3COO", "N2H5(+)*1", "CH3COO(-)*1"),              # hydrazine acetate (CRC inorganic, C2H8N2O2)
    ("C2H5NH3NO3", "[EtNH3](+)*1", "NO3(-)*1"),              # ethylammonium nitrate (Walden 1914)
    ("CH3NH3HCOO", "[MeNH3](+)*1", "HCOO(-)*1"),             # methylammonium formate (Greaves & Drummond 2008)
    ("C2H5NH3HCOO", "[EtNH3](+)*1", "HCOO(-)*1"),            # ethylammonium formate (same)
    ("CH3NH3CH3COO", "[MeNH3](+)*1", "CH3COO(-)*1"),         # methylammonium acetate
    ("C2H5NH3CH3COO", "[EtNH3](+)*1", "CH3COO(-)*1"),        # ethylammonium acetate
    ("C2H5NH3HSO4", "[EtNH3](+)*1", "HSO4(-)*1"),            # ethylammonium hydrogen sulfate
    ("CH3NH3HCOO·H2O", "[MeNH3](+)*1", "HCOO(-)*1"),         # with lattice water
])
def test_salts_written_as_their_ions_read_as_written(text, cations, anions):
    out = score_formula(text)
    assert (out["cations"], out["anions"]) == (cations, anions)
    assert out["status"] == "ok", out["message"]  # no "ambiguous" warning: the text says which isomer


@pytest.mark.parametrize("written, bracketed", [
    ("N2H5HCOO", "[N2H5][HCOO]"),
    ("CH3NH3CH3COO", "[MeNH3][OAc]"),
    ("C2H5NH3NO3", "[EtNH3][NO3]"),
])
def test_the_unbracketed_spelling_reads_as_the_bracketed_one(written, bracketed):
    a, b = score_formula(written), score_formula(bracketed)
    for column in ("cations", "anions", "formula_normalized", "melting_class", "mp_trend_index", "substance_class"):
        assert a[column] == b[column], column


def test_the_hydrazine_acetate_of_the_registry_has_the_composition_read():
    # the registry's Hill formula of hydrazine acetate is the composition of N2H5(+) with CH3COO(-)
    chemicals = pytest.importorskip("chemicals")
    formula = chemicals.search_chemical("13255-48-6").formula
    assert parse_formula(formula).counts == parse_formula("N2H5CH3COO").counts


@pytest.mark.parametrize("text", [
    "CH3COOH",     # acetic acid: H is no monatomic ion of the rule, the acid reading stands
    "HCOOCH3",     # methyl formate, an ester: C and H are no monatomic ions
    "CH3COOCH3",   # methyl acetate
    "KNO3",        # inorganic ions only: the atoms say the same
    "NaHCO3",
    "CH3NH3PbI3",  # two monatomic elements: left to the solver
    "C6H12O6",     # no split into ions
])
def test_texts_that_are_not_written_ions_get_no_hint(text):
    assert written_ion_hints(text) == ()


def test_an_ester_and_an_acid_keep_their_readings():
    assert score_formula("HCOOCH3")["substance_class"] == "covalent_molecular"
    assert score_formula("CH3COOH")["substance_class"] == "acid"


def test_a_split_that_does_not_balance_is_no_hint():
    # N2H5 with two formates would need the hydrazinium at 2+: no hint, the solver reads the atoms
    assert written_ion_hints("N2H5(HCOO)2") == ()
    assert written_ion_hints("N2H6(HCOO)2") == (("HCOO(-)", 2.0), ("N2H6(2+)", 1.0))
