"""Lattice energies against Born-Haber values: tests/data/lattice_reference.csv.

Every row has a source (CRC Handbook "Lattice energies", Jenkins & Roobottom, Table 1, U_POT,
from memory; spinel from Glasser & Jenkins 2000, from memory). The 44 halides and hydrides are
also checked against a Born-Haber cycle rebuilt from the CRC enthalpies of the chemicals package
(tests/test_thermochemistry_data.py: at most 0.9 % apart), which each row's source says. Sets:

* calibration (``set = calibration``): the Li, K and Cs halides, on which the Born-Mayer-Huggins
  repulsion range BMH_RHO_PM was set, and the salts on which the best-method rule was chosen
  (MgO, CaO, CaF2, BaF2, Li2O, Al2O3, NaNO3, CaCO3, AgF, CuBr, TlBr); AgF, CuBr and TlBr also
  decided that the point-charge columns are withheld where a thermochemical cycle exists;
* validation (``set = validation``): everything else, checked only. The figures in README.md are
  validation figures (python -m ionicity.pipelines.lattice_check prints them). PbCl2, CdCl2 and
  CdI2 are cycle values since the cycle was extended to Zn, Cd and Pb(II) halides after they were
  seen to miss: a data check, counted apart from the model-based rows.
"""
from __future__ import annotations

import csv
import math
import statistics
from pathlib import Path

import pytest

from ionicity.scorer.ions import get_ion
from ionicity.scorer.lattice import analyse, describe
from ionicity.scorer.model import Decomposition, IonTerm

REFERENCE = Path(__file__).with_name("data") / "lattice_reference.csv"
ROWS = list(csv.DictReader(REFERENCE.open(encoding="utf-8")))
ALKALI_HALIDE = {"Li", "Na", "K", "Rb", "Cs"}, {"F", "Cl", "Br", "I"}


def _terms(text):
    return tuple(IonTerm(get_ion(p.split("*")[0]), float(p.split("*")[1])) for p in text.split(";"))


def _values(row):
    dec = Decomposition(cations=_terms(row["cations"]), anions=_terms(row["anions"]), substance_class="ionic_salt")
    return describe(dec)[0]


def _error_pct(row, column):
    value = _values(row)[column]
    return abs(value - float(row["u_kJ_mol"])) / float(row["u_kJ_mol"]) * 100.0


def _is_alkali_halide(row):
    metal = row["cations"].split("(")[0]
    halogen = row["anions"].split("(")[0]
    return metal in ALKALI_HALIDE[0] and halogen in ALKALI_HALIDE[1]


def test_reference_table_is_split_and_sourced():
    assert len(ROWS) == 74
    assert {r["set"] for r in ROWS} == {"calibration", "validation"}
    assert all(r["source"].strip() for r in ROWS)
    assert sum(r["set"] == "validation" for r in ROWS) == 51


def test_validation_alkali_halides_best_method_median_within_two_percent():
    # Done-when of issue 12: median |error| of the best method at most 2 % (Na and Rb halides:
    # validation; the Li, K and Cs halides set the repulsion range).
    errors = [_error_pct(r, "lattice_energy_best_kJ_mol") for r in ROWS if _is_alkali_halide(r) and r["set"] == "validation"]
    assert len(errors) == 8
    assert statistics.median(errors) <= 2.0
    assert all(_values(r)["lattice_energy_best_method"] == "born_mayer_huggins" for r in ROWS if _is_alkali_halide(r))


def test_calibration_alkali_halides_are_the_ones_the_range_was_set_on():
    errors = [_error_pct(r, "lattice_energy_best_kJ_mol") for r in ROWS if _is_alkali_halide(r) and r["set"] == "calibration"]
    assert len(errors) == 12
    assert statistics.median(errors) <= 1.0


def test_validation_share_within_five_percent():
    # Measured (python -m ionicity.pipelines.lattice_check): 43 of the 51 validation salts (84 %)
    # within 5 %; 33 of the 41 whose best value is a model, not the thermochemical cycle (80 %).
    # Before the cycle covered the Zn, Cd, Pb(II) halides: 40/51 (78 %) and 33/44 (75 %); the three
    # gained rows (PbCl2, CdCl2, CdI2) are cycle values, a data check, not a model check. The misses
    # left are Cu2O, Ag2O, PbO, CdO, ZnO, ZnS (soft cations with oxide or sulfide, no cycle: the second
    # electron affinity is itself a cycle value) and Na2O, K2O (Kapustinskii 6-8 % high).
    validation = [r for r in ROWS if r["set"] == "validation"]
    within = [_error_pct(r, "lattice_energy_best_kJ_mol") <= 5.0 for r in validation]
    assert sum(within) / len(within) >= 0.80
    models = [r for r in validation if _values(r)["lattice_energy_best_method"] != "thermochemical_cycle"]
    within_models = [_error_pct(r, "lattice_energy_best_kJ_mol") <= 5.0 for r in models]
    assert len(models) == 41 and sum(within_models) / len(within_models) >= 0.80


@pytest.mark.parametrize("name", ["AgCl", "AgBr", "CuCl", "AgI", "CuI", "TlCl", "TlI", "PbCl2", "CdCl2", "CdI2"])
def test_covalent_halides_by_their_cycle_point_charge_withheld(name):
    # Issue 12: no method shown more than 8 % off for AgCl, AgBr, CuCl. The best value is the
    # thermochemical cycle (tabulated enthalpies), which agrees with the CRC cycle values by
    # construction: a data check, not a model check. The point-charge columns ran 12-27 % low on
    # these salts, so they are withheld (empty) with a note; the result object keeps them for the
    # melting index, whose weights were fitted on them.
    row = next(r for r in ROWS if r["compound"] == name)
    dec = Decomposition(cations=_terms(row["cations"]), anions=_terms(row["anions"]), substance_class="ionic_salt")
    values, notes = describe(dec)
    assert values["lattice_energy_best_method"] == "thermochemical_cycle"
    assert _error_pct(row, "lattice_energy_best_kJ_mol") <= 1.0
    shown = [c for c in values if c.endswith("_kJ_mol") and math.isfinite(values[c])]
    assert set(shown) == {"lattice_energy_cycle_kJ_mol", "lattice_energy_best_kJ_mol"}, shown
    assert any("withheld" in n and "covalency" in n for n in notes)
    result = analyse(dec)
    assert result.lattice_energy_kapustinskii_kJ_mol < 0.93 * float(row["u_kJ_mol"])
    assert "lattice_energy_vbt_kJ_mol" in result.withheld


@pytest.mark.parametrize("name", ["Ag2O", "Cu2O"])
def test_coinage_salts_without_a_cycle_say_their_values_run_low(name):
    row = next(r for r in ROWS if r["compound"] == name)
    values, notes = describe(
        Decomposition(cations=_terms(row["cations"]), anions=_terms(row["anions"]), substance_class="ionic_salt")
    )
    assert math.isfinite(values["lattice_energy_kapustinskii_kJ_mol"])
    assert any("run low" in n for n in notes)


def test_vbt_two_two_coefficients_on_validation_oxides():
    # Issue 12: VBT ran 11-15 % high on the 2:2 oxides with the general coefficients. With the 2:2
    # coefficients of Jenkins et al. 1999 (from memory, not fitted here), validation rock-salt
    # oxides measured +2.2 to +6.2 %.
    for name in ("SrO", "BaO", "MnO", "FeO", "CoO", "NiO"):
        row = next(r for r in ROWS if r["compound"] == name)
        assert _error_pct(row, "lattice_energy_vbt_kJ_mol") <= 7.0, name


def test_oxides_born_mayer_with_measured_distances():
    # Validation 2:2 oxides of the rock-salt type: Born-Mayer with the measured distance within 4 %.
    for name in ("SrO", "BaO", "MnO", "FeO", "CoO", "NiO"):
        row = next(r for r in ROWS if r["compound"] == name)
        assert _error_pct(row, "lattice_energy_born_mayer_kJ_mol") <= 4.0, name


def test_hydrides_get_values():
    # Issue 12: LiH, NaH, CaH2 had no lattice value at all.
    for name in ("LiH", "NaH", "KH", "CaH2"):
        row = next(r for r in ROWS if r["compound"] == name)
        values = _values(row)
        assert math.isfinite(values["lattice_energy_best_kJ_mol"]), name
        assert _error_pct(row, "lattice_energy_kapustinskii_kJ_mol") <= 5.0, name


def test_lattice_check_prints_the_validation_figures(capsys):
    # the script the README's lattice table is copied from; figures measured as in the tests above
    from ionicity.pipelines import lattice_check

    assert lattice_check.main([]) == 0
    out = capsys.readouterr().out
    assert "[validation] best value within 5 %: 43/51 (84 %)" in out
    assert "[validation] alkali halides (8): median |error| of the best method 0.16 %" in out
    assert "[validation] AgCl error % per method: kapustinskii withheld" in out
    assert lattice_check.main(["--reference", "/nonexistent.csv"]) == 2
