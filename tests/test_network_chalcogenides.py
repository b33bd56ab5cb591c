"""Chalcogenides of B, Si and Ge are networks, not molecules; methanides get a melting index.

* ``substance.nonionic_decomposition``: S, Se and Te with B, Si or Ge make chains, layers and
  networks (SiS2 edge-sharing chains, GeS and GeSe black-phosphorus-like layers, GeS2 and B2S3
  networks; Wells, Structural Inorganic Chemistry, 5th ed., 1984, ch. 16; from memory); with carbon
  alone they make molecules (CS2, COS). GeS was a molecule melting at 216 K.
* ``scorer/data/fallback_radii.csv``: Pauling's crystal radius of C(4-), 260 pm (Pauling, The Nature of
  the Chemical Bond, 3rd ed., 1960, table 13-4; from memory), so the methanides Al4C3 and Be2C get a
  lattice energy and a melting index (they had none). No weight is fitted: the open training set's
  screen admits no carbide anion, so the salt index's calibration rows do not move.

Melting points are registry values (``chemicals.phase_change.Tm``), read at test time.
"""
from __future__ import annotations

import math

import pytest

from ionicity.scorer import melting_routes
from ionicity.scorer.record import score_formula

from _builders import registry_melting_point_K




@pytest.mark.parametrize("formula, cas", [
    ("GeS", "12025-32-0"),   # 931 K
    ("GeSe", "12065-10-0"),  # 948 K
    ("SiS2", "13759-10-9"),  # 1363 K
    ("GeS2", "12025-34-2"),  # 1113 K
])
def test_chalcogenides_of_si_and_ge_are_networks_in_their_band(formula, cas):
    out = score_formula(formula)
    assert out["substance_class"] == "covalent_network" and out["status"] == "ok"
    assert out["melting_class"] == melting_routes.melting_class_for(registry_melting_point_K(cas), salt=False) == "high_melting_solid"


@pytest.mark.parametrize("formula", ["CS2", "COS", "CSe2"])
def test_carbon_chalcogenides_stay_molecules(formula):
    # CS2 melts at 161 K (registry), COS at 135 K (CRC Handbook; from memory)
    out = score_formula(formula)
    # below 25 C; COS also boils below it (223 K, registry), so it is called a gas
    assert out["substance_class"] == "covalent_molecular"
    assert out["melting_class"] in ("liquid_at_room_temperature", "gas_at_room_temperature")


def test_methanides_get_a_melting_index():
    # Be2C: 2400 K (registry, decomposes); Al4C3: 2373 K (CRC Handbook, 95th ed.; from memory)
    be2c = score_formula("Be2C")
    assert math.isfinite(be2c["mp_trend_index"]) and be2c["melting_class"] in ("molten_salt", "refractory")
    assert registry_melting_point_K("506-66-1") > 1773.15
    al4c3 = score_formula("Al4C3")
    assert abs(al4c3["mp_trend_index"] - math.log10(2373.0)) < math.log10(1.5)
    assert al4c3["melting_class"] == "refractory"


@pytest.mark.parametrize("formula, cas", [
    ("As2O3", "1327-53-3"),   # arsenic trioxide, 547 K (registry); molecules of As4O6 (arsenolite)
])
def test_empirical_formulas_of_cage_molecules_read_as_the_cage(formula, cas):
    # P2O5, P2O3, As2O3 and P2S5 are the empirical formulas of the cages P4O10, P4O6, As4O6 and P4S10
    # (Greenwood & Earnshaw, 2nd ed., 1997, ch. 12.3.5 and 13.3.4; from memory): read as written they were
    # "liquid at room temperature"
    out = score_formula(formula)
    assert out["melting_class"] == melting_routes.melting_class_for(registry_melting_point_K(cas), salt=False)


@pytest.mark.parametrize("empirical, cage", [("P2O5", "P4O10"), ("P2O3", "P4O6"), ("As2O3", "As4O6"), ("P2S5", "P4S10")])
def test_an_empirical_formula_and_its_cage_share_one_index(empirical, cage):
    assert score_formula(empirical)["mp_trend_index"] == score_formula(cage)["mp_trend_index"]
    assert score_formula(empirical)["melting_class"] not in ("liquid_at_room_temperature", "melts_below_100C")
