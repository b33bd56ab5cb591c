"""Radius and volume helpers against Shannon (1976), Jenkins et al. and Hofmann."""
from __future__ import annotations

import math

import pytest

from ionicity.scorer.model import Ion
from ionicity.scorer.radii import (
    atomic_volumes_A3,
    ion_radius_pm,
    ion_volume_nm3,
    shannon_radius_pm,
    sphere_radius_pm,
    sphere_volume_nm3,
    tabulated_ion_volumes,
    thermochemical_radii,
)


def _mono(symbol: str, charge: int) -> Ion:
    sign = "+" if charge > 0 else "-"
    text = sign if abs(charge) == 1 else f"{abs(charge)}{sign}"
    return Ion(f"{symbol}({text})", symbol, charge, ((symbol, 1),), "monatomic", element=symbol)


# Shannon, Acta Cryst. A 1976, 32, 751, Table 1 (ionic radii, pm; from memory,
# and the snapshot the element helper built from mendeleev carries the same table).
@pytest.mark.parametrize(
    "symbol, charge, cn, spin, expected",
    [
        ("Na", 1, None, None, 102.0),
        ("Cl", -1, None, None, 181.0),
        ("O", -2, None, None, 140.0),
        ("F", -1, 4, None, 131.0),
        ("Zn", 2, 4, None, 60.0),
        ("Ca", 2, 8, None, 112.0),
        ("Fe", 2, None, None, 78.0),   # VI high spin (default when both are listed)
        ("Fe", 2, None, "LS", 61.0),
        ("Fe", 3, 6, "hs", 64.5),
        ("Cs", 1, 8, None, 174.0),
    ],
)
def test_shannon_values(symbol, charge, cn, spin, expected):
    radius, reason = shannon_radius_pm(symbol, charge, cn, spin)
    assert radius == expected
    assert "Shannon (1976)" in reason


def test_default_rule_is_stated():
    _, reason = shannon_radius_pm("Na", 1)
    assert "default: CN VI" in reason
    _, reason = shannon_radius_pm("Fe", 2)
    assert "high spin" in reason


def test_nearest_cn_and_tie_to_larger():
    # Cl(-) is listed only at VI.
    radius, reason = shannon_radius_pm("Cl", -1, 8)
    assert radius == 181.0 and "no CN VIII entry" in reason
    # Li(+) is listed at IV (59), VI (76) and VIII (92): CN 5 is equidistant, the larger wins.
    assert shannon_radius_pm("Li", 1, 5)[0] == 76.0
    # Si(4+) is listed at IV (26) and VI (40): the default is VI.
    assert shannon_radius_pm("Si", 4)[0] == 40.0


def test_plain_polyhedron_preferred_over_square_planar():
    # Fe(2+) high spin: IV 63 pm, IVSQ 64 pm (Shannon 1976).
    radius, reason = shannon_radius_pm("Fe", 2, 4)
    assert radius == 63.0
    assert "CN IV," in reason and "IVSQ" not in reason


def test_missing_values_return_nan_with_reason():
    radius, reason = shannon_radius_pm("Xx", 1)
    assert math.isnan(radius) and "Xx" in reason
    radius, reason = shannon_radius_pm("Na", 3)
    assert math.isnan(radius) and "Na(3+)" in reason
    # H(+) has only negative radii in Shannon's table: unusable for a size.
    assert math.isnan(shannon_radius_pm("H", 1)[0])


def test_bad_options_raise():
    with pytest.raises(ValueError, match="HS"):
        shannon_radius_pm("Fe", 2, spin="intermediate")
    with pytest.raises(ValueError, match="positive integer"):
        shannon_radius_pm("Fe", 2, coordination_number=0)
    with pytest.raises(ValueError, match="positive integer"):
        shannon_radius_pm("Fe", 2, coordination_number=4.5)


def test_ion_radius_routes():
    assert ion_radius_pm(_mono("K", 1))[0] == 138.0
    no3 = Ion("NO3(-)", "NO3", -1, (("N", 1), ("O", 3)), "oxoanion")
    radius, reason = ion_radius_pm(no3)
    assert radius == 179.0 and "thermochemical" in reason
    # CRC Handbook 'Lattice energies' (Jenkins & Roobottom) worked example: NH4+ 0.136 nm (read).
    nh4 = Ion("NH4(+)", "NH4", 1, (("H", 4), ("N", 1)), "polyatomic cation")
    assert ion_radius_pm(nh4)[0] == 136.0
    ntf2 = Ion("[NTf2](-)", "[NTf2]", -1, (("C", 2), ("F", 6), ("N", 1), ("O", 4), ("S", 2)), "sulfonylimide", organic=True)
    radius, reason = ion_radius_pm(ntf2)
    assert radius == pytest.approx(sphere_radius_pm(0.232)) and "sphere" in reason


def test_ion_volume_routes():
    # Jenkins et al., Inorg. Chem. 1999, 38, 3609, ion volumes (from memory): K+ 0.00986, Cl- 0.047 nm^3.
    assert ion_volume_nm3(_mono("K", 1))[0] == 0.00986
    assert ion_volume_nm3(_mono("Cl", -1))[0] == 0.047
    zn = ion_volume_nm3(_mono("Zn", 2))
    assert zn[0] == pytest.approx(sphere_volume_nm3(74.0)) and "sphere" in zn[1]
    weird = Ion("Og2(-)", "Og2", -1, (("Og", 2),), "polyatomic")
    volume, reason = ion_volume_nm3(weird)
    assert math.isnan(volume) and "Og" in reason


def test_hofmann_estimate_covers_ionic_liquid_ions():
    # Slattery et al., Angew. Chem. Int. Ed. 2007, 46, 5384 (from memory): [C4mim]+ 0.196,
    # [NTf2]- 0.232 nm^3. The additive estimate must land within 10 % and 15 % of them.
    c4 = Ion("[C4mimX](+)", "[C4mimX]", 1, (("C", 8), ("H", 15), ("N", 2)), "imidazolium", organic=True)
    ntf2 = Ion("[NTf2X](-)", "[NTf2X]", -1, (("C", 2), ("F", 6), ("N", 1), ("O", 4), ("S", 2)), "imide", organic=True)
    v_c4, why = ion_volume_nm3(c4)
    assert v_c4 == pytest.approx(0.196, rel=0.10) and "Hofmann" in why
    assert ion_volume_nm3(ntf2)[0] == pytest.approx(0.232, rel=0.15)
    # Hofmann, Acta Cryst. B 2002, 58, 489, Table 1: C 13.87, H 5.08, N 11.8 A^3 (read).
    assert v_c4 == pytest.approx((8 * 13.87 + 15 * 5.08 + 2 * 11.8) * 1e-3)


def test_sphere_helpers_round_trip():
    assert sphere_radius_pm(sphere_volume_nm3(181.0)) == pytest.approx(181.0)


@pytest.mark.parametrize(
    "table, minimum",
    [(thermochemical_radii, 20), (tabulated_ion_volumes, 20), (atomic_volumes_A3, 70)],
)
def test_tables_have_rows_and_sources(table, minimum):
    rows = table()
    assert len(rows) >= minimum
    for key, (value, source) in rows.items():
        assert value > 0, key
        assert source.strip(), key


def test_table_ion_ids_are_library_ions():
    ions = pytest.importorskip("ionicity.scorer.ions")
    for ion_id in list(thermochemical_radii()) + list(tabulated_ion_volumes()):
        assert ions.get_ion(ion_id).ion_id == ion_id


def test_a_cation_shannon_does_not_list_takes_the_fallback_table_with_its_source_named():
    # Shannon (Acta Cryst. 1976, A32, 751) lists no Sn(2+); the fallback table
    # gives Ahrens' radius (Geochim. Cosmochim. Acta 1952, 2, 155; from memory)
    from ionicity.scorer.model import Ion
    from ionicity.scorer.radii import ion_radius_pm
    from ionicity.scorer.record import score_formula

    sn = Ion("Sn(2+)", "Sn", 2, (("Sn", 1),), "monatomic", element="Sn")
    radius, why = ion_radius_pm(sn)
    assert radius == 93.0 and "fallback radius" in why and "Ahrens" in why
    # so that no value silently disappears for tin(II) salts
    for formula in ("SnCl2", "SnSO4", "SnF2"):
        assert score_formula(formula)["lattice_energy_kapustinskii_kJ_mol"] > 0
