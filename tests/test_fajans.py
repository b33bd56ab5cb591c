"""Tests for scorer.fajans: polarising power, anion polarisability, the
18/18+2 flag, the contact index and covalency risk."""
from __future__ import annotations

import math

import pytest

from ionicity.scorer import fajans as F
from ionicity.scorer.ion_library import get_ion, monatomic_ion
from ionicity.scorer.model import Decomposition

from _builders import salt


def binary(m, zm, x, zx) -> Decomposition:
    # Charge-balanced M_a X_b.
    g = math.gcd(abs(zm), abs(zx))
    return salt([((m, zm), abs(zx) // g)], [((x, zx), abs(zm) // g)])


RISK = {level: i for i, level in enumerate(F.COVALENCY_RISK_LEVELS)}


def value(dec, key):
    return F.describe(dec)[0][key]


# ------------------------------------------------------------ polarisability table

# Tessman, Kahn & Shockley, "Electronic polarizabilities of ions in crystals",
# Phys. Rev. 1953, 92, 890, abstract: best values for the sodium D line in
# angstrom^3; O, S, Se, Te given as ranges.
TKS = {
    "Li(+)": 0.03, "Na(+)": 0.41, "K(+)": 1.33, "Rb(+)": 1.98, "Cs(+)": 3.34,
    "F(-)": 0.64, "Cl(-)": 2.96, "Br(-)": 4.16, "I(-)": 6.43,
    "Ca(2+)": 1.1, "Sr(2+)": 1.6, "Ba(2+)": 2.5,
    "Ag(+)": 2.4, "Cu(+)": 1.6, "Cu(2+)": 0.2, "Zn(2+)": 0.8, "Cd(2+)": 1.8,
    "Ge(4+)": 1.0, "Sn(4+)": 3.4, "Pb(2+)": 4.9,
}
TKS_RANGES = {"O(2-)": (0.5, 3.2), "S(2-)": (4.8, 5.9), "Se(2-)": (6.0, 7.5), "Te(2-)": (8.3, 10.2)}


def test_polarisability_table_matches_tessman_kahn_shockley():
    table = F.ion_polarisabilities()
    assert set(table) == set(TKS) | set(TKS_RANGES)
    for ion_id, alpha in TKS.items():
        assert table[ion_id]["polarisability_A3"] == alpha, ion_id
    for ion_id, (low, high) in TKS_RANGES.items():
        row = table[ion_id]
        assert (row["range_low_A3"], row["range_high_A3"]) == (low, high)
        assert row["polarisability_A3"] == pytest.approx((low + high) / 2)
    assert all("Tessman" in row["source"] for row in table.values())


def test_lorentz_lorenz_reproduces_tks_additivity_for_nacl():
    # NaCl: n_D 1.544, a = 5.640 angstrom, Z = 4 (CRC Handbook, from memory);
    # Tessman, Kahn & Shockley (1953) fit Na+ + Cl- = 0.41 + 2.96 to such data.
    volume = 5.640**3 / 4
    assert F.lorentz_lorenz_polarisability_A3(volume, 1.544) == pytest.approx(0.41 + 2.96, abs=0.05)


def test_polyatomic_anion_polarisability_is_a_flagged_estimate():
    alpha, why, estimate = F.anion_polarisability_A3(get_ion("SO4(2-)"))
    assert estimate and "estimate" in why
    # Larger than Cl- and smaller than I- x 2: the right order for sulfate.
    assert 2.96 < alpha < 12.0
    values, _ = F.describe(salt([(("K", 1), 2)], [("SO4(2-)", 1)]))
    assert values["anion_polarisability_basis"] == "volume_estimate"
    values, _ = F.describe(binary("Na", 1, "Cl", -1))
    assert values["anion_polarisability_basis"] == "table"


# ------------------------------------------------------------ polarising power

@pytest.mark.parametrize("symbol, charge, radius_pm", [
    # Shannon, Acta Cryst. A 1976, 32, 751, Table 1, CN VI ionic radii (from memory).
    ("Na", 1, 102), ("Mg", 2, 72), ("Al", 3, 53.5), ("K", 1, 138), ("Ca", 2, 100), ("Li", 1, 76),
])
def test_polarising_power_uses_shannon_cn6_radius(symbol, charge, radius_pm):
    dec = salt([((symbol, charge), 1)], [(("Cl", -1), charge)])
    assert value(dec, "cation_polarising_power_e_per_A2") == pytest.approx(charge / (radius_pm / 100) ** 2, rel=1e-6)


def test_polarising_power_of_organic_cation_uses_effective_radius():
    dec = salt([("[C4mim](+)", 1)], [(("Cl", -1), 1)])
    power = value(dec, "cation_polarising_power_e_per_A2")
    assert 0 < power < 0.3  # a large singly charged ion
    text = "\n".join(F.explain(dec))
    assert "volume" in text or "thermochemical" in text


# ------------------------------------------------------------ Fajans' rules (orderings)

def test_fajans_cation_charge_and_size_nacl_mgcl2_alcl3():
    # Fajans' first rule (common practice): covalency NaCl < MgCl2 < AlCl3.
    decs = [binary("Na", 1, "Cl", -1), binary("Mg", 2, "Cl", -1), binary("Al", 3, "Cl", -1)]
    powers = [value(d, "cation_polarising_power_e_per_A2") for d in decs]
    index = [value(d, "fajans_contact_index") for d in decs]
    risk = [RISK[value(d, "covalency_risk")] for d in decs]
    assert powers == sorted(powers) and len(set(powers)) == 3
    assert index == sorted(index) and len(set(index)) == 3
    assert risk == sorted(risk) and risk[0] < risk[2]


def test_fajans_anion_size_lif_licl_libr_lii():
    # Fajans' second rule (common practice): covalency LiF < LiCl < LiBr < LiI.
    decs = [binary("Li", 1, x, -1) for x in ("F", "Cl", "Br", "I")]
    alphas = [value(d, "anion_polarisability_A3") for d in decs]
    index = [value(d, "fajans_contact_index") for d in decs]
    assert alphas == sorted(alphas) and len(set(alphas)) == 4
    assert index == sorted(index) and len(set(index)) == 4


@pytest.mark.parametrize("halide", ["Cl", "Br", "I"])
@pytest.mark.parametrize("metal", ["Ag", "Cu"])
def test_fajans_pseudo_noble_gas_cations_more_covalent_than_sodium(metal, halide):
    # Fajans' third rule (common practice): Ag+ and Cu+ halides are more covalent
    # than the Na+ halides although the cations are of similar size.
    d_metal, d_sodium = binary(metal, 1, halide, -1), binary("Na", 1, halide, -1)
    assert value(d_metal, "cation_pseudo_noble_gas") is True
    assert value(d_sodium, "cation_pseudo_noble_gas") is False
    assert RISK[value(d_metal, "covalency_risk")] > RISK[value(d_sodium, "covalency_risk")]


def test_covalency_risk_levels_for_textbook_salts():
    # Common practice: alkali halides ionic, AlCl3 and FeCl3 largely covalent,
    # ZnS and CdI2 (18-electron cations with soft anions) covalent.
    assert value(binary("Na", 1, "Cl", -1), "covalency_risk") == "low"
    assert value(binary("K", 1, "F", -1), "covalency_risk") == "low"
    assert value(binary("Al", 3, "Cl", -1), "covalency_risk") == "high"
    assert value(binary("Fe", 3, "Cl", -1), "covalency_risk") == "high"
    assert value(binary("Zn", 2, "S", -2), "covalency_risk") == "high"
    assert value(binary("Cd", 2, "I", -1), "covalency_risk") == "high"


# The 18-electron and 18+2-electron cations Fajans' third rule names (common
# practice; e.g. Greenwood & Earnshaw 1997), and noble-gas or open-shell ones.
PSEUDO = [("Cu", 1), ("Ag", 1), ("Au", 1), ("Zn", 2), ("Cd", 2), ("Hg", 2), ("Ga", 3), ("In", 3),
          ("Tl", 3), ("Tl", 1), ("Pb", 2), ("Sn", 2), ("Bi", 3), ("Sb", 3), ("In", 1), ("Sn", 4)]
NOT_PSEUDO = [("Na", 1), ("K", 1), ("Mg", 2), ("Ca", 2), ("Al", 3), ("Sc", 3), ("La", 3), ("Ti", 4),
              ("Fe", 3), ("Fe", 2), ("Cu", 2), ("Ni", 2), ("Mn", 2)]


@pytest.mark.parametrize("symbol, charge", PSEUDO)
def test_pseudo_noble_gas_flag_set(symbol, charge):
    assert F.outer_shell(monatomic_ion(symbol, charge))[0] in ("18", "18+2")


@pytest.mark.parametrize("symbol, charge", NOT_PSEUDO)
def test_pseudo_noble_gas_flag_clear(symbol, charge):
    assert F.outer_shell(monatomic_ion(symbol, charge))[0] in ("noble_gas", "open_shell")


def test_outer_shell_details():
    assert F.outer_shell(monatomic_ion("Ag", 1))[0] == "18"
    assert F.outer_shell(monatomic_ion("Pb", 2))[0] == "18+2"
    assert F.outer_shell(get_ion("Hg2(2+)"))[0] == "18+2"
    assert F.outer_shell(get_ion("NH4(+)"))[0] == "molecular"


# ------------------------------------------------------------ equations

def test_contact_index_equation():
    # alpha * z / d^3 with NaCl's numbers: 2.96 * 1 / 2.83^3.
    assert F.fajans_contact_index(2.96, 1, 283.0) == pytest.approx(2.96 / 2.83**3)
    assert F.fajans_contact_index(2.96, -2, 283.0) == pytest.approx(2 * 2.96 / 2.83**3)


def test_covalency_risk_level_rules():
    assert F.covalency_risk_level(0.1, False) == "low"
    assert F.covalency_risk_level(0.3, False) == "moderate"
    assert F.covalency_risk_level(0.7, False) == "high"
    assert F.covalency_risk_level(0.3, True) == "high"
    assert F.covalency_risk_level(math.nan, True) is None


# ------------------------------------------------------------ several ions

def test_alum_aggregation():
    dec = salt([(("K", 1), 1), (("Al", 3), 1)], [("SO4(2-)", 2)])
    values, _ = F.describe(dec)
    k = 1 / 1.38**2
    al = 3 / 0.535**2
    assert values["cation_polarising_power_e_per_A2"] == pytest.approx((k + al) / 2, rel=1e-6)
    assert values["cation_polarising_power_max_e_per_A2"] == pytest.approx(al, rel=1e-6)
    assert values["cation_pseudo_noble_gas"] is False
    # The risk is that of the worst pair: Al-SO4 alone is at least as risky as the mean.
    alone = F.describe(salt([(("Al", 3), 2)], [("SO4(2-)", 3)]))[0]
    assert values["covalency_risk"] == alone["covalency_risk"]


def test_mixed_anions_max_column():
    dec = salt([(("Pb", 2), 1)], [(("Cl", -1), 1), (("F", -1), 1)])
    values, _ = F.describe(dec)
    assert values["anion_polarisability_A3"] == pytest.approx((2.96 + 0.64) / 2)
    assert values["anion_polarisability_max_A3"] == 2.96


# ------------------------------------------------------------ protocol

def test_columns():
    names = [c.name for c in F.COLUMNS]
    assert len(names) == len(set(names))
    for required in ("cation_polarising_power_e_per_A2", "anion_polarisability_A3", "cation_pseudo_noble_gas",
                     "covalency_risk"):
        assert required in names
    assert all(c.aggregation and c.source and c.method for c in F.COLUMNS)


@pytest.mark.parametrize("dec", [
    Decomposition(),
    Decomposition(composition=(("Cu", 1),), substance_class="metallic"),
    salt([(("H", 1), 1)], [(("F", -1), 1)]),
    salt([(("Na", 1), 1)], [(("H", -1), 1)]),
], ids=["empty", "metal", "HF", "NaH"])
def test_describe_never_raises_and_notes_ionic_gaps(dec):
    values, notes = F.describe(dec)
    assert set(values) == {c.name for c in F.COLUMNS}
    if dec.is_ionic and any(isinstance(v, float) and math.isnan(v) for v in values.values()):
        assert notes
    assert F.explain(dec)
