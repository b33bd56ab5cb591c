"""Salt hydrates written as one formula, their water counted into H and O (scorer/record.py).

Registry tables write a hydrate's formula in Hill order with the water folded in (the identifier tables of
the registry package ``chemicals``, read at test time by CAS number: ferrous sulfate heptahydrate is
FeH14O11S). Such a formula had read as a salt of H(+) beside O(2-), an acid beside a base in one solid;
it is read as the salt with its lattice water (common practice).
"""
from __future__ import annotations

import pytest
from ionicity.scorer.record import score_formula

identifiers = pytest.importorskip("chemicals.identifiers")


@pytest.mark.parametrize("cas, salt, water", [
    ("7782-63-0", "FeSO4", 7),     # ferrous sulfate heptahydrate
    ("7727-73-3", "Na2SO4", 10),   # Glauber's salt
    ("7758-99-8", "CuSO4", 5),     # copper(II) sulfate pentahydrate
    ("12230-71-6", "Ba(OH)2", 8),  # barium hydroxide octahydrate: the hydroxide stays, not BaO with 9 H2O
    ("10035-04-8", "CaCl2", 2),    # calcium chloride dihydrate
])
def test_a_registry_hill_formula_of_a_hydrate_reads_as_the_hydrate(cas, salt, water):
    flat = identifiers.search_chemical(cas).formula
    record = score_formula(flat)
    assert record["formula_normalized"] == f"{salt}·{water}H2O", (flat, record["formula_normalized"])
    assert record["hydrate_water"] == water
    assert record["status"] == "warning" and "water of crystallisation" in record["message"]
    # the same record as the hydrate written with its dot, apart from the message
    written = score_formula(f"{salt}·{water}H2O")
    for column in ("substance_class", "cations", "anions", "mp_trend_index", "melting_class", "water_behaviour"):
        assert record[column] == written[column], column


@pytest.mark.parametrize("formula", ["FeSO4", "NaOH", "Ba(OH)2", "H2SO4", "NaHCO3", "KH2PO4", "HClO4", "H3PO4"])
def test_salts_and_acids_without_water_are_left_as_they_are(formula):
    record = score_formula(formula)
    assert not record["hydrate_water"] and "water of crystallisation" not in (record["message"] or "")
