"""Phosphide, arsenide and antimonide salts get a melting index; III-V semiconductors keep their rule.

Pauling's crystal radii of P(3-), As(3-) and Sb(3-) (``scorer/data/fallback_radii.csv``; Pauling, The
Nature of the Chemical Bond, 3rd ed., 1960, table 13-4; from memory) give these anions a lattice
energy. No weight is fitted here: the salt index's weights are unchanged (the open training set's
screen admits no phosphide, so neither calibration nor validation rows move). The melting points
below are registry values (``chemicals.phase_change.Tm``, CRC Handbook) read at test time.
"""
from __future__ import annotations

import math

import pytest

from ionicity.scorer import melting_routes
from ionicity.scorer.record import score_formula

from _builders import registry_melting_point_K





@pytest.mark.parametrize("formula, cas", [
    ("Mg3P2", "12057-74-8"),   # trimagnesium diphosphide
    ("Zn3P2", "1314-84-7"),    # zinc phosphide
    ("Mg3As2", "12044-49-4"),  # magnesium arsenide
])
def test_phosphide_and_arsenide_salts_get_an_index_in_their_measured_band(formula, cas):
    measured = registry_melting_point_K(cas)
    assert measured, f"the registry has no melting point for {formula}"
    out = score_formula(formula)
    assert out["mp_route"] == "salt" and math.isfinite(out["mp_trend_index"])
    assert out["melting_class"] == melting_routes.melting_class_for(measured, salt=True)
    assert abs(out["mp_trend_index"] - math.log10(measured)) < math.log10(1.5)


def test_the_lattice_energy_says_which_radius_it_used():
    from ionicity.scorer.radii import ion_radius_pm
    from ionicity.scorer.ion_library import monatomic_ion
    radius, why = ion_radius_pm(monatomic_ion("P", -3))
    assert radius == 212.0 and "Pauling" in why


@pytest.mark.parametrize("formula", ["GaP", "InSb", "GaAs", "AlSb"])
def test_iii_v_semiconductors_do_not_take_a_formal_reading_from_pauling_radii(formula):
    # their tetrahedral bonds are no P(3-) lattice: the formal reading would put InSb (800 K, CRC
    # Handbook 95th ed., 2014; from memory) at about 1960 K; the element-mixture rule stands
    out = score_formula(formula)
    assert out["substance_class"] == "semiconductor" and out["mp_route"] == "element_mixture"
    from ionicity.scorer.melting_routes import element_mixture_melting_K
    from ionicity.scorer.formula import parse_formula
    mixture, _ = element_mixture_melting_K(tuple(parse_formula(formula).counts))
    assert 10 ** out["mp_trend_index"] == pytest.approx(mixture, rel=1e-3)  # the column keeps 4 decimals


@pytest.mark.parametrize("formula", ["BP", "BAs", "SiP2"])
def test_boron_and_silicon_pnictides_are_covalent_networks(formula):
    # BP and BAs: zinc-blende networks; SiP2: a layered network (Greenwood & Earnshaw, Chemistry of the
    # Elements, 2nd ed., 1997, ch. 6.7 and 9.3; from memory). BP was read as a molecule melting at 58 K.
    out = score_formula(formula)
    assert out["substance_class"] == "covalent_network"
    assert out["melting_class"] in ("high_melting_solid", "refractory")
