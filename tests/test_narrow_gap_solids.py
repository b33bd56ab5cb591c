"""Narrow-gap chalcogenides and pnictides, reversed polarity and metal-rich phases: not salts.

* ``applicability._criteria``: a salt reading of monatomic metal cations with S, Se, Te, P, As, Sb or Bi
  whose contact bond falls below Pauling's dchi = 0.5 (the van Arkel-Ketelaar triangle's covalent and
  metallic regions) is a covalent semiconductor or semimetal, with the ionic values left empty. PbTe,
  SnTe, Bi2Te3, Sb2Te3 and Cu2Te came back ``ionic_salt`` with lattice energies and the class
  ``molten_salt``. That they are semiconductors: Madelung, Semiconductors: Data Handbook, 3rd ed.,
  Springer 2004 (from memory).
* ``ions.reversed_polarity``: a reading that makes a non-metal a cation beside a monatomic anion of a
  less electronegative element is no reading (IUPAC Red Book 2005, IR-4.6.1: the bonding electrons go
  to the more electronegative partner). GeTe read as Te(4+) Ge(4-).
* ``substance.formal_oxidation_states``: beside a non-metal a metal is never the negative partner, though
  gold and platinum are more electronegative than tellurium on Pauling's scale: MoTe2 read Mo -4, Te +2.
* ``bond_class_rules.metal_rich_phase_reason``: Fe4N, Mn4N, Pd4S and Nb21S8 balance with no ion reading
  and were errors; they are metal-rich phases.

Melting points are registry values (``chemicals.phase_change.Tm``, CRC Handbook), read at test time;
the registry's names give the Stock numbers where it has one.
"""
from __future__ import annotations

import math

import pytest

from ionicity.scorer import melting_routes
from ionicity.scorer.record import score_formula

from _builders import registry_melting_point_K


@pytest.mark.parametrize("formula, cas", [
    ("PbTe", "1314-91-6"),     # 1197 K; registry name "lead(ii) telluride"
    ("SnTe", "12040-02-7"),    # 1079 K
    ("Sb2Te3", "1327-50-0"),   # 893 K
    ("Cu2Te", "12019-52-2"),   # 1400 K; "cuprous telluride"
    ("Ag2Te", "12002-99-2"),   # 1228 K
    ("Cd3As2", "12006-15-4"),  # 994 K
])
def test_narrow_gap_chalcogenides_and_pnictides_are_semiconductors(formula, cas):
    out = score_formula(formula)
    assert out["status"] == "ok"
    assert (out["substance_class"], out["ionic_model"]) == ("semiconductor", "not_applicable")
    assert out["cations"] == "" and math.isnan(out["lattice_energy_best_kJ_mol"])
    measured = registry_melting_point_K(cas)
    assert out["melting_class"] == melting_routes.melting_class_for(measured, salt=False) == "high_melting_solid"
    # within the trend index's stated scatter, a factor 1.5
    assert abs(out["mp_trend_index"] - math.log10(measured)) < math.log10(1.5)


def test_bismuth_telluride_is_a_semiconductor_with_its_states():
    # Bi2Te3 melts at 858 K (CRC Handbook, 95th ed.; from memory); Bi(III) telluride
    out = score_formula("Bi2Te3")
    assert (out["substance_class"], out["oxidation_states"]) == ("semiconductor", "Bi:+3;Te:-2")
    assert out["melting_class"] == "high_melting_solid"


@pytest.mark.parametrize("formula", ["PbS", "PbSe", "SnS", "Ag2S", "FeS", "MnTe", "(NH4)2S", "Na2Te"])
def test_polar_chalcogenides_stay_salts(formula):
    # dchi at or above 0.5, or a polyatomic cation (NH4+ contacts through H): the triangle's polar or ionic
    # regions, read as salts as before
    assert score_formula(formula)["substance_class"] == "ionic_salt"


def test_germanium_telluride_gives_the_electrons_to_tellurium():
    # GeTe: registry name "germanium telluride (GeTe)", 997 K; germanium(II) as in GeS and GeSe
    out = score_formula("GeTe")
    assert out["oxidation_states"] == "Ge:+2;Te:-2"
    assert out["substance_class"] in ("covalent_network", "semiconductor")
    assert out["melting_class"] == melting_routes.melting_class_for(registry_melting_point_K("12025-39-7"), salt=False)


@pytest.mark.parametrize("formula, states", [
    ("MoTe2", "Mo:+4;Te:-2"),   # registry name "molybdenum telluride"; molybdenum(IV) ditelluride
    ("PtTe2", "Pt:+4;Te:-2"),   # platinum(IV) ditelluride (from memory)
    ("H2Te", "H:+1;Te:-2"),     # hydrogen telluride, an acid: hydrogen keeps +1 (common practice)
])
def test_metals_and_hydrogen_stay_the_positive_partner(formula, states):
    assert score_formula(formula)["oxidation_states"] == states


@pytest.mark.parametrize("formula, elements", [
    ("Fe4N", "Fe N"), ("Mn4N", "Mn N"), ("Pd4S", "Pd S"), ("Nb21S8", "Nb S"),
    # metals with the semimetals As, Sb, Bi where no reading balances (beta-Zn4Sb3, the thermoelectric; Cd4Sb3,
    # Cu3Sb, Ni3Sb; Pearson's Handbook of Crystallographic Data, 1991; from memory): errors before
    ("Zn4Sb3", "Zn Sb"), ("Cd4Sb3", "Cd Sb"), ("Cu3Sb", "Cu Sb"), ("Ni3Sb", "Ni Sb"),
])
def test_metal_rich_phases_are_intermetallic(formula, elements):
    # Fe4N (gamma'), Mn4N, Pd4S and Nb21S8 are metallic metal-rich phases (Franzen, Prog. Solid State Chem.
    # 1978, 12, 53; Greenwood & Earnshaw, 2nd ed., 1997, ch. 11.3.2; from memory)
    out = score_formula(formula)
    assert out["status"] == "ok"
    assert (out["substance_class"], out["ionic_model"]) == ("intermetallic", "not_applicable")
    assert set(out["oxidation_states"].split(";")) == {f"{s}:0" for s in elements.split()}


@pytest.mark.parametrize("formula", ["Fe4O", "Na2Cl", "Ti3O", "InSb2", "Na4Sb3"])
def test_metal_rich_oxides_halides_and_unbalanced_pnictides_stay_errors(formula):
    # a formula of a metal with O or a halogen that no reading balances is far more often a typing slip
    # than a suboxide (common practice): it keeps its error; so do a pnictide with fewer metal atoms than
    # pnictogen atoms (InSb2) and one of an s-block metal (Na4Sb3), whose Zintl salts balance
    assert score_formula(formula)["status"] == "error"
