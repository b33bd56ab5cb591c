"""Names that give no oxidation state: read as the compound the registry knows, or refused with the options.

External reference: the registry package ``chemicals`` (its name lookup
``chemicals.identifiers.search_chemical(name).formula``, CRC Handbook and PubChem identifier tables), which
the reader does not call: it checks its readings against the formulas of ``scorer/data/registry_names.csv``.
Which compounds exist (FeCl2 and FeCl3, SnCl2 and SnCl4): the same package's lookup of the Stock names.
"""
from __future__ import annotations

import pytest
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.name_grammar import unsaid_readings
from ionicity.scorer.name_reader import known_reading, read_name, read_name_parts
from ionicity.scorer.record import score_formula


def _composition(text: str) -> dict[str, float]:
    return {s: n for s, n in parse_formula(text).counts if n}


# the name grammar's usual charge of a non-metal (P +3, N +3) gives way where the registry knows only
# another state's compound (POCl3, not POCl); names the usual charge already read right stay as they were
@pytest.mark.parametrize("name", [
    "phosphorus oxychloride",   # POCl3 (the usual-charge reading was POCl)
    "vanadium oxytrichloride",  # VOCl3, prefixes literal
    "selenium oxychloride",     # SeOCl2
    "nitrogen oxychloride",     # NOCl
    "phosphorus chloride",      # PCl3
])
def test_reading_matches_the_registry_lookup(name):
    chemicals_identifiers = pytest.importorskip("chemicals.identifiers")
    expected = chemicals_identifiers.search_chemical(name).formula  # source: chemicals (CRC/PubChem tables)
    assert _composition(read_name(name)) == _composition(expected)


def test_a_metals_usual_charge_is_not_overridden():
    # Nd2S3 is the usual salt (Nd(III), common practice); the registry table holds NdS but not Nd2S3
    assert _composition(read_name("neodymium sulfide")) == {"Nd": 2, "S": 3}
    assert _composition(read_name("copper chloride")) == {"Cu": 1, "Cl": 2}


@pytest.mark.parametrize("name, stock_names", [
    ("iron chloride", ("iron(II) chloride", "iron(III) chloride")),
    ("tin chloride", ("tin(II) chloride", "tin(IV) chloride")),
    ("iron sulfate heptahydrate", ("iron(II) sulfate", "iron(III) sulfate")),
])
def test_an_ambiguous_name_is_refused_with_the_compounds_it_could_mean(name, stock_names):
    chemicals_identifiers = pytest.importorskip("chemicals.identifiers")
    row = score_formula(name)
    assert row["status"] == "error" and row["formula_normalized"] is None
    message = row["message"]
    assert repr(name) in message and "oxidation state" in message
    named = [part.strip(" ;") for part in message.split("fits: ")[1].split(";")[0].split(",")]
    # every compound the Stock names mean (source: chemicals' lookup) is among the options the error names
    for stock in stock_names:
        expected = _composition(chemicals_identifiers.search_chemical(stock).formula)
        assert any(_composition(text) == expected for text in named), (stock, named)


def test_candidates_cover_every_positive_state_highest_first():
    assert unsaid_readings(read_name_parts("phosphorusoxychloride")) == ("POCl3", "POCl2", "POCl")
    assert unsaid_readings(read_name_parts("copper(ii)chloride")) == ()  # the state is said


def test_known_reading_rules():
    assert known_reading("POCl", ("POCl3", "POCl2", "POCl"), metal=False) == ("POCl3", ())
    assert known_reading("CuCl2", ("CuCl2", "CuCl"), metal=True) == ("CuCl2", ())
    # nothing known: the grammar's reading stands
    assert known_reading("XyZ", ("NoSuch3",), metal=False) == ("XyZ", ())
    assert known_reading(None, ("FeCl3", "FeCl2"), metal=True) == (None, ("FeCl3", "FeCl2"))


@pytest.mark.parametrize("name", ["ceric ammonium nitrate", "cerium(IV) ammonium nitrate", "ammonium cerium(IV) nitrate"])
def test_ceric_ammonium_nitrate_is_the_hexanitratocerate(name):
    # (NH4)2Ce(NO3)6 (The Merck Index, 15th ed., 2013; from memory): the smallest whole counts of a double salt,
    # CeNH4(NO3)5, are not the compound, and no registry table holds it; a trivial name fixes it
    assert _composition(read_name(name)) == {"N": 8, "H": 8, "Ce": 1, "O": 18}
