"""Hill formulas that the registry's tables know as molecules are read as those molecules, not as the organic
salts of the ion library that share their composition.

External reference: the registry package ``chemicals`` (``chemicals.identifiers.search_chemical(name)``:
the formula and SMILES of the compound, from its PubChem and CRC identifier tables). The reader consults the
same package's tables through ``scorer/data/registry_names.csv`` (built from them), not the lookup below.
Before this rule, 325 registry molecules read as salts (triethanolamine as [N1112][HCO3], melamine as
guanidinium dicyanamide, lysine as cholinium cyanate, adenine as formamidinium tricyanomethanide).
"""
from __future__ import annotations

import pytest
from ionicity.scorer.record import score_formula


@pytest.mark.parametrize("name", ["triethanolamine", "melamine", "hexamethylenetetramine", "adenine", "lysine",
                                  "1-methylpiperazine", "dimethylglyoxime", "1,3-dimethylurea"])
def test_registry_molecules_read_as_molecules(name):
    identifiers = pytest.importorskip("chemicals.identifiers")
    found = identifiers.search_chemical(name)  # source: chemicals (PubChem/CRC identifier tables)
    assert "." not in found.smiles  # one component: a molecule
    row = score_formula(found.formula)
    assert row["substance_class"] == "covalent_molecular", (found.formula, row["cations"], row["anions"])


def test_a_formula_that_is_also_an_ionic_liquid_says_so():
    # C6H12N4 is hexamethylenetetramine and also [N1111][dca]; C8H11N5 phenyl biguanide and also [C2mim][dca]
    row = score_formula("C6H12N4")
    assert row["substance_class"] == "covalent_molecular" and "[N1111][dca]" in row["message"]
    assert score_formula("[N1111][dca]")["substance_class"] == "ionic_liquid_pair"


@pytest.mark.parametrize("text, cation", [("C8H15ClN2", "[C4mim](+)*1"), ("C2H8N2O3", "[EtNH3](+)*1"),
                                          ("CH3COOH", "H(+)*1")])
def test_salts_and_acids_the_registry_does_not_contradict_stay(text, cation):
    # [C4mim]Cl and ethylammonium nitrate have no registry molecule of their formula; acetic acid keeps its
    # acid reading (common practice)
    assert score_formula(text)["cations"] == cation


@pytest.mark.parametrize("name, cas, cation", [
    # the name says an open-chain ammonium ion, and its Hill formula is also a pyridinium salt of the library:
    # benzyltrimethylammonium chloride read as 1-butyl-3-methylpyridinium chloride, phenyltrimethylammonium
    # iodide as 1-butylpyridinium iodide; now the cation is built by rule from the groups the name says
    # (scorer.onium_groups)
    ("Benzyltrimethylammonium chloride", "56-93-9", "[(C7H7)(CH3)3N](+)"),
    ("Phenyltrimethylammonium iodide", "98-04-4", "[(C6H5)(CH3)3N](+)"),
    ("Trimethylphenylammonium chloride", "138-24-9", "[(C6H5)(CH3)3N](+)"),
])
def test_an_ammonium_name_is_no_ring_cation_of_the_same_formula(name, cas, cation):
    # melting points: chemicals.phase_change.Tm (CRC Handbook, read at test time); each melts (with
    # decomposition) between 490 and 520 K, the low_melting_salt band, where the pyridinium reading said
    # ionic_liquid
    phase_change = pytest.importorskip("chemicals.phase_change")
    from ionicity.scorer.melting import MELTING_CLASS_BANDS
    out = score_formula(name)
    assert out["cations"].split("*")[0] == cation and "pyridinium" not in (out["systematic_name"] or "")
    lo, hi = {band: (a, b) for band, a, b, _ in MELTING_CLASS_BANDS}[out["melting_class"]]
    assert lo <= phase_change.Tm(cas) < hi
