"""Tests for scorer.elements and the snapshot it reads (scorer/data/elements.json)."""
from __future__ import annotations

import json
import math
import subprocess
import sys
from pathlib import Path

import pytest

from ionicity.scorer import elements as E
from ionicity.scorer.data import build_elements

REPO_ROOT = Path(__file__).resolve().parents[1]
SNAPSHOT = REPO_ROOT / "scorer" / "data" / "elements.json"


def _radius(symbol: str, charge: int, coordination: str, spin: str = "") -> E.ShannonRadius:
    matches = [
        r
        for r in E.get_element(symbol).shannon_radii
        if (r.charge, r.coordination, r.spin) == (charge, coordination, spin)
    ]
    assert len(matches) == 1, (symbol, charge, coordination, spin, matches)
    return matches[0]


# ---------------------------------------------------------------- (a) snapshot


def test_snapshot_matches_installed_mendeleev():
    pytest.importorskip(
        "mendeleev", reason="mendeleev is not installed, so the snapshot cannot be rebuilt"
    )
    fresh = build_elements.build_snapshot()
    committed_text = SNAPSHOT.read_text(encoding="utf-8")
    # Dict comparison first: pytest prints a readable diff of what changed.
    assert fresh == json.loads(committed_text), (
        "elements.json is stale; run python -m ionicity.scorer.data.build_elements"
    )
    assert build_elements.render_snapshot(fresh) == committed_text


def test_render_is_deterministic_and_sorted():
    snapshot = json.loads(SNAPSHOT.read_text(encoding="utf-8"))
    text = build_elements.render_snapshot(snapshot)
    assert text == SNAPSHOT.read_text(encoding="utf-8")
    assert "NaN" not in text and "Infinity" not in text
    assert "timestamp" not in text.lower()


def test_meta_block():
    info = E.snapshot_info()
    assert info["mendeleev_version"] == "1.3.0"
    assert info["format_version"] == build_elements.SNAPSHOT_FORMAT_VERSION
    assert tuple(info["fields"]) == build_elements.ELEMENT_FIELDS
    assert info["units"]["shannon_radii.ionic_radius_pm"] == "pm"
    assert info["units"]["dipole_polarizability_bohr3"] == "bohr^3"
    # A copy: callers cannot corrupt the cached block.
    info["counts"]["elements"] = -1
    assert E.snapshot_info()["counts"]["elements"] == 118


@pytest.mark.parametrize(
    ("label", "number"),
    [("I", 1), ("II", 2), ("III", 3), ("IV", 4), ("IVSQ", 4), ("IIIPY", 3), ("IVPY", 4),
     ("V", 5), ("VI", 6), ("VII", 7), ("VIII", 8), ("IX", 9), ("X", 10), ("XI", 11),
     ("XII", 12), ("XIV", 14)],
)
def test_coordination_number_from_roman_numeral(label, number):
    assert build_elements.coordination_number(label) == number


def test_coordination_number_rejects_other_text():
    with pytest.raises(ValueError, match="'6'"):
        build_elements.coordination_number("6")


# ------------------------------------------------- (b) published reference values

# Pauling electronegativities as revised by Allred, J. Inorg. Nucl. Chem. 17, 215
# (1961), the values the CRC Handbook table "Electronegativity" reprints
# (from memory).
PAULING_ALLRED_1961 = {
    "H": 2.20, "Li": 0.98, "C": 2.55, "N": 3.04, "O": 3.44, "F": 3.98,
    "Na": 0.93, "Mg": 1.31, "S": 2.58, "Cl": 3.16, "K": 0.82, "Ca": 1.00,
    "Br": 2.96, "I": 2.66, "Cs": 0.79,
}


@pytest.mark.parametrize(("symbol", "chi"), sorted(PAULING_ALLRED_1961.items()))
def test_pauling_electronegativity(symbol, chi):
    assert E.get_element(symbol).electronegativity_pauling == pytest.approx(chi, abs=0.005)


# Shannon, Acta Cryst. A32, 751 (1976), doi:10.1107/S0567739476001551, Table 1
# (from memory), converted from angstrom to pm: (ion, charge, CN, spin, IR, CR).
SHANNON_1976_TABLE_1 = [
    ("Na", 1, "VI", "", 102.0, 116.0),
    ("Cl", -1, "VI", "", 181.0, 167.0),
    ("Mg", 2, "VI", "", 72.0, 86.0),
    ("Fe", 2, "VI", "HS", 78.0, 92.0),
    ("Fe", 2, "VI", "LS", 61.0, 75.0),
    ("Fe", 3, "VI", "HS", 64.5, 78.5),
    ("O", -2, "VI", "", 140.0, 126.0),
    ("F", -1, "VI", "", 133.0, 119.0),
]


@pytest.mark.parametrize(
    ("symbol", "charge", "cn", "spin", "ionic", "crystal"), SHANNON_1976_TABLE_1
)
def test_shannon_radii(symbol, charge, cn, spin, ionic, crystal):
    radius = _radius(symbol, charge, cn, spin)
    assert radius.ionic_radius_pm == pytest.approx(ionic, abs=0.05)
    assert radius.crystal_radius_pm == pytest.approx(crystal, abs=0.05)
    assert radius.coordination_number == 6


# Shannon 1976 defines crystal radii as ionic radii + 0.14 angstrom for cations
# and - 0.14 angstrom for anions. Exceptions: N5+ III, where Shannon's own table
# lists IR -0.104 and CR 0.044 angstrom (from memory); Ce4+ X and Cu3+ VI LS,
# where mendeleev 1.3.0 disagrees with Shannon's Table 1 (Ce4+ X IR 1.07,
# Cu3+ VI LS CR 0.68 angstrom, from memory) and looks mistyped upstream.
CRYSTAL_OFFSET_EXCEPTIONS = {("N", 5, "III", ""), ("Ce", 4, "X", ""), ("Cu", 3, "VI", "LS")}


def test_crystal_radius_offset_of_14_pm():
    offenders = []
    for symbol in E.element_symbols():
        for r in E.get_element(symbol).shannon_radii:
            key = (symbol, r.charge, r.coordination, r.spin)
            expected = 14.0 if r.charge > 0 else -14.0
            if key not in CRYSTAL_OFFSET_EXCEPTIONS and not math.isclose(
                r.crystal_radius_pm - r.ionic_radius_pm, expected, abs_tol=1e-6
            ):
                offenders.append(key)
    assert offenders == []


# NIST Atomic Spectra Database, ionization energies (Kramida, Ralchenko, Reader
# and NIST ASD Team), in eV (from memory).
NIST_ASD_IONIZATION_EV = [
    ("H", 1, 13.598434599702),
    ("He", 1, 24.587389011),
    ("Li", 1, 5.391714996),
    ("O", 1, 13.618055),
    ("Na", 1, 5.1390767),
    ("Na", 2, 47.28636),
    ("Mg", 2, 15.035271),
    ("Cl", 1, 12.967633),
    ("K", 1, 4.34066373),
    ("Fe", 1, 7.9024681),
    ("Cs", 1, 3.89390572743),
]


@pytest.mark.parametrize(("symbol", "n", "energy"), NIST_ASD_IONIZATION_EV)
def test_ionization_energies_vs_nist(symbol, n, energy):
    element = E.get_element(symbol)
    assert element.ionization_energy_eV(n) == pytest.approx(energy, abs=1e-3)
    assert element.ionization_energies_eV[n - 1] == element.ionization_energy_eV(n)


# IUPAC/CIAAW standard atomic weights, 2013 table (Meija et al., Pure Appl.
# Chem. 88, 265 (2016)); conventional values where IUPAC gives an interval
# (from memory). Au was revised to 196.966570 in 2017, hence the tolerance.
IUPAC_ATOMIC_WEIGHTS = {
    "H": 1.008, "C": 12.011, "N": 14.007, "O": 15.999, "Na": 22.98976928,
    "Cl": 35.45, "K": 39.0983, "Ca": 40.078, "Fe": 55.845, "Cu": 63.546,
    "Au": 196.966569, "U": 238.02891,
}


@pytest.mark.parametrize(("symbol", "weight"), sorted(IUPAC_ATOMIC_WEIGHTS.items()))
def test_atomic_weights_vs_iupac(symbol, weight):
    assert E.get_element(symbol).atomic_weight == pytest.approx(weight, abs=2e-6)


def test_polarizability_is_in_bohr_cubed():
    # Schwerdtfeger and Nagle, Mol. Phys. 117, 1200 (2019), "Table of static
    # dipole polarizabilities of the neutral elements": Li 164.1125, Na 162.7 a.u.
    # (from memory). In angstrom^3 sodium would be about 24.1.
    assert E.get_element("Li").dipole_polarizability_bohr3 == pytest.approx(164.1125, abs=1e-3)
    assert E.get_element("Na").dipole_polarizability_bohr3 == pytest.approx(162.7, abs=0.1)


def test_electron_affinities_in_eV():
    # CRC Handbook of Chemistry and Physics, "Electron affinities" table:
    # F 3.4011898, Cl 3.612724 eV (from memory).
    assert E.get_element("F").electron_affinity_eV == pytest.approx(3.4011898, abs=1e-4)
    assert E.get_element("Cl").electron_affinity_eV == pytest.approx(3.612724, abs=1e-4)


def test_allen_scale_is_in_eV_not_pauling_units():
    # Mann, Meek and Allen, J. Am. Chem. Soc. 122, 2780 (2000): configuration
    # energy of Na 5.14 eV, F 24.80 eV (from memory).
    assert E.get_element("Na").electronegativity_allen == pytest.approx(5.14, abs=0.01)
    assert E.get_element("F").electronegativity_allen == pytest.approx(24.80, abs=0.01)


def test_classification_properties():
    metals = ["Na", "Mg", "Fe", "Al", "Pb", "La", "U", "Cu"]
    metalloids = ["B", "Si", "Ge", "As", "Sb", "Te"]
    nonmetals = ["H", "C", "O", "F", "Cl", "Ne", "Xe"]
    assert all(E.get_element(s).is_metal for s in metals)
    assert all(E.get_element(s).is_metalloid and not E.get_element(s).is_metal for s in metalloids)
    assert not any(E.get_element(s).is_metal or E.get_element(s).is_metalloid for s in nonmetals)


def test_element_fields_and_missing_values():
    fe = E.get_element("Fe")
    assert (fe.period, fe.group, fe.block, fe.series) == (4, 8, "d", "Transition metals")
    assert fe.oxidation_states_main == (2, 3)
    assert fe.electron_configuration == "[Ar] 3d6 4s2"
    # Ce-Lu have no group number in mendeleev.
    assert E.get_element("Ce").group is None
    # Noble gases other than Xe have no Pauling value.
    assert math.isnan(E.get_element("Ne").electronegativity_pauling)
    # Elements above Z = 110 have no ionization energies in mendeleev 1.3.0.
    og = E.get_element("Og")
    assert og.ionization_energies_eV == () and math.isnan(og.ionization_energy_eV(1))
    # Mt (Z = 109) has no values for its first four ionizations.
    assert math.isnan(E.get_element("Mt").ionization_energy_eV(1))
    assert not math.isnan(E.get_element("Mt").ionization_energy_eV(5))


@pytest.mark.parametrize("n", [0, -1, 1.0, True, "1"])
def test_ionization_energy_rejects_bad_n(n):
    with pytest.raises(ValueError, match="positive integer"):
        E.get_element("Na").ionization_energy_eV(n)


def test_elements_are_shared_and_immutable():
    assert E.get_element("Na") is E.get_element("Na")
    with pytest.raises(AttributeError):
        E.get_element("Na").symbol = "K"  # type: ignore[misc]
    hash(E.get_element("Fe"))


# ------------------------------------------------------------- (c) unknown input


@pytest.mark.parametrize("bad", ["Xx", "CO", "na", "", " Na", "Uue"])
def test_unknown_symbol_raises_key_error_naming_it(bad):
    with pytest.raises(KeyError, match=repr(bad).replace("(", r"\(")):
        E.get_element(bad)


def test_key_error_suggests_capitalisation():
    with pytest.raises(KeyError, match="did you mean 'Co'"):
        E.get_element("CO")


def test_is_element_symbol_is_case_sensitive():
    assert E.is_element_symbol("Co")
    assert not E.is_element_symbol("CO")
    assert not E.is_element_symbol("co")
    assert not E.is_element_symbol(None)  # type: ignore[arg-type]
    assert not E.is_element_symbol("")


def test_element_symbols_in_order_of_z():
    symbols = E.element_symbols()
    assert symbols[:3] == ("H", "He", "Li") and symbols[-1] == "Og"
    assert [E.get_element(s).atomic_number for s in symbols] == list(range(1, len(symbols) + 1))


# ------------------------------------------------------ (d) no mendeleev at runtime


def test_import_does_not_load_mendeleev():
    code = (
        "import ionicity.scorer.elements, sys; ionicity.scorer.elements.get_element('Na'); "
        "assert 'mendeleev' not in sys.modules, 'mendeleev imported'; "
        "assert 'pandas' not in sys.modules, 'pandas imported'"
    )
    result = subprocess.run(
        [sys.executable, "-c", code], cwd=REPO_ROOT, capture_output=True, text=True, timeout=60
    )
    assert result.returncode == 0, result.stderr


def test_import_does_not_load_the_snapshot():
    code = (
        "import ionicity.scorer.elements as E, sys; "
        "assert E._snapshot.cache_info().currsize == 0, 'loaded at import'"
    )
    result = subprocess.run(
        [sys.executable, "-c", code], cwd=REPO_ROOT, capture_output=True, text=True, timeout=60
    )
    assert result.returncode == 0, result.stderr


# -------------------------------------------------------------------- (e) counts


def test_row_counts():
    # mendeleev 1.3.0 holds 118 elements, 507 Shannon rows (Shannon 1976 plus
    # 15 actinide(III) IX rows from Lundberg 2016), 5847 ionization energies
    # and 601 oxidation states.
    symbols = E.element_symbols()
    assert len(symbols) == 118
    radii = sum(len(E.get_element(s).shannon_radii) for s in symbols)
    energies = sum(
        sum(not math.isnan(v) for v in E.get_element(s).ionization_energies_eV) for s in symbols
    )
    states = sum(
        len(E.get_element(s).oxidation_states_main) + len(E.get_element(s).oxidation_states_extra)
        for s in symbols
    )
    assert (radii, energies, states) == (507, 5847, 601)
    counts = E.snapshot_info()["counts"]
    assert counts == {
        "elements": 118, "shannon_radii": 507, "ionization_energies": 5847, "oxidation_states": 601,
    }
    assert sum(r.most_reliable for s in symbols for r in E.get_element(s).shannon_radii) == 66
