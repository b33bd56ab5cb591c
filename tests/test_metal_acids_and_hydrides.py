"""The metals' acids read whole, hydride never beside an oxoanion, protons held by an anion, Keggin anions.

Sources: the registry package ``chemicals`` (the formula it gives for a name, ``search_chemical``, and the
mass of a formula from ``molmass``); the chemistry, from memory, from Greenwood & Earnshaw, Chemistry of the
Elements, 2nd ed., 1997 (ch. 3.6 hydrides, ch. 22-25 the metals' oxoacids, ch. 28 gold and platinum) and Pope,
Heteropoly and Isopoly Oxometalates, Springer, 1983 (the Keggin anions).
"""
from __future__ import annotations

import pytest

from ionicity import score_formula


def _registry_formula(name: str) -> str:
    from chemicals.identifiers import search_chemical

    return search_chemical(name).formula


def _states(row) -> dict[str, float]:
    return {s: float(v) for s, v in (p.split(":") for p in row["oxidation_states"].split(";"))}


# registry name, the metal, its state in the acid (the group state; Greenwood & Earnshaw, from memory).
# Before: tungstic and molybdic acid were M(4+) with hydroxide and peroxide (O -1.5), chromic acid Cr(2+)
# with two hydroperoxides; permanganic and perrhenic acid Mn(7+) and Re(7+) cations with oxide and hydroxide,
# chloroauric and chloroplatinic acid salts ("ionic_salt")
@pytest.mark.parametrize("name, metal, state", [
    ("tungstic acid", "W", 6),
    ("molybdic acid", "Mo", 6),
    ("chromic acid", "Cr", 6),
    ("permanganic acid", "Mn", 7),
    ("perrhenic acid", "Re", 7),
    ("chloroauric acid", "Au", 3),
    ("chloroplatinic acid", "Pt", 4),
])
def test_metal_acids_are_the_proton_and_their_anion(name, metal, state):
    formula = _registry_formula(name)
    for text in (formula, name):
        row = score_formula(text)
        assert row["status"] in ("ok", "warning"), row["message"]  # a name in the formula cell warns
        assert row["substance_class"] == "acid"
        assert row["cations"].startswith("H(+)*") and ";" not in row["cations"]
        states = _states(row)
        assert states[metal] == state and states["H"] == 1
        assert states.get("O", -2) == -2  # no peroxide
        assert row["solution_ph"] == "acidic"


def test_metal_acids_carry_no_melting_trend_but_say_why():
    # they are kept as hydrates or solutions and lose water or decompose on heating (HAuCl4.3H2O melts near
    # 303 K, chromic acid decomposes near 470 K; from memory): the molecular reading gave 250-2,800 K
    row = score_formula("H2CrO4")
    assert row["melting_class"] is None
    assert "metal's acid" in row["value_notes"]


@pytest.mark.parametrize("text", ["HAlO2", "HCrO2"])
def test_amphoteric_oxide_hydroxides_are_no_acids(text):
    # boehmite AlO(OH) and CrO(OH): oxide hydroxides of the lower states, not acids
    row = score_formula(text)
    assert row["substance_class"] != "acid"


@pytest.mark.parametrize("text", ["Ca(OH)Cl", "Mg(OH)Cl", "CaHClO"])
def test_hydride_never_beside_an_oxoanion(text):
    # the hydroxide chloride, not hydride with hypochlorite (the two tied before): H(-) reduces an oxoanion
    row = score_formula(text)
    assert row["status"] == "ok", row["message"]
    assert {t.split("*")[0] for t in row["anions"].split(";")} == {"Cl(-)", "OH(-)"}


@pytest.mark.parametrize("text", ["NaH", "CaHCl", "LaHO", "NaBH4", "LiAlH4"])
def test_hydrides_with_halide_oxide_or_as_complexes_stay(text):
    # hydride halides, the oxyhydride LaHO and the hydrido complexes (from memory)
    row = score_formula(text)
    assert row["status"] == "ok"
    assert _states(row)["H"] == -1


@pytest.mark.parametrize("text, suggestion", [("Al(OH)", "Al(OH)3"), ("Ti(OH)", "Ti(OH)4"), ("Fe(OH)", "Fe(OH)2")])
def test_a_hydroxide_that_lost_its_count_is_no_oxide_hydride(text, suggestion):
    # oxide hydrides need an electropositive host: the s-block and rare-earth metals (LaHO, BaTiO3-xHx, SrVO2H;
    # Kobayashi et al., Nat. Mater. 11 (2012) 507, from memory); "Al(OH)" had read as Al(3+), H(-), O(2-) with
    # status ok
    row = score_formula(text)
    assert row["status"] == "error" and suggestion in row["message"]


@pytest.mark.parametrize("text", ["BaTiO2.5H0.5", "SrVO2H", "GdHO"])
def test_oxide_hydrides_of_electropositive_hosts_stay(text):
    row = score_formula(text)
    assert row["status"] == "ok" and _states(row)["H"] == -1


def test_a_proton_sits_in_an_anion_beside_metal_cations():
    # talc, Mg3Si4O10(OH)2 (the registry's formula H2Mg3O12Si4 for the name): Mg(2+) with hydroxide and
    # Si2O5(2-) sheets; it tied with H(+) beside metasilicate, which carries no melting trend
    for text in ("Mg3Si4O10(OH)2", "talc"):
        row = score_formula(text)
        assert row["status"] in ("ok", "warning"), row["message"]  # a name in the formula cell warns
        assert "H(+)" not in row["cations"] and "OH(-)" in row["anions"]
        assert row["melting_class"] is not None


@pytest.mark.parametrize("text, anion", [
    ("H3PW12O40", "PW12O40(3-)"),
    ("H3PMo12O40", "PMo12O40(3-)"),
    ("H4SiW12O40", "SiW12O40(4-)"),
    ("K3PW12O40", "PW12O40(3-)"),
    ("(NH4)3PO4·12MoO3", "PMo12O40(3-)"),
    ("Na6V10O28", "V10O28(6-)"),
])
def test_keggin_and_decavanadate_anions(text, anion):
    row = score_formula(text)
    assert row["status"] == "ok", row["message"]
    assert row["anions"] == f"{anion}*1"


def test_ammonium_phosphomolybdate_written_as_an_adduct_has_the_keggin_mass():
    from molmass import Formula

    row = score_formula("(NH4)3PO4·12MoO3")
    assert row["formula_normalized"] == "(NH4)3PMo12O40"
    assert row["molar_mass_g_mol"] == pytest.approx(Formula("(NH4)3PMo12O40").mass, rel=1e-4)
