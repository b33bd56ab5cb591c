"""The organic-salt and molecular-route weights of TREND_WEIGHTS sit where their calibration puts them.

Calibration checks (the sets the weights were fitted on, as ``pipelines/melting_weights.py``
says): with the other weights as shipped, the value of one weight that minimises the
squared log error on its calibration rows lies within 30 % of the shipped value. A
weight changed by +-50 % fails here (``tests/perturb_trend_weights.py``). Validation
of the same weights is in tests/test_melting.py (ionic-liquid validation rows) and
tests/test_melting_routes.py (molecular validation rows).

* organic weights (flexibility, delocalised, protic): the ``calibration`` rows of
  ``datasets/melting/ionic_liquids.csv`` (published values, a source per row);
* molecular weights: the ``calibration`` rows of ``datasets/melting/molecular_compounds.csv``,
  melting points read at run time from ``chemicals`` (CRC Handbook table);
  ``molecular_secondary_kJ_mol`` rests on HgCl2, the one calibration row with secondary
  contacts (HgBr2, HgI2 and BiCl3 validate it in tests/test_melting_routes.py).
"""
from __future__ import annotations

import csv
import math
from pathlib import Path

import numpy as np
import pytest
from ionicity.pipelines.melting_weights import MOLECULAR_WEIGHTS, ORGANIC_WEIGHTS, _index_with
from ionicity.scorer import melting, melting_routes
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose

DATA = Path(__file__).resolve().parents[1] / "datasets" / "melting"


@pytest.fixture(scope="module")
def organic_calibration():
    with open(DATA / "ionic_liquids.csv", newline="", encoding="utf-8") as handle:
        rows = [r for r in csv.DictReader(handle) if r["set"] == "calibration"]
    assert len(rows) >= 15 and all(r["source"] for r in rows)
    terms = [melting.melting_terms(decompose(parse_formula(r["formula"]))) for r in rows]
    return terms, np.log10([float(r["mp_K"]) for r in rows])


@pytest.mark.parametrize("name", ORGANIC_WEIGHTS)
def test_calibration_organic_weight_sits_at_its_optimum(organic_calibration, name):
    terms, log_mp = organic_calibration
    current = melting.TREND_WEIGHTS[name]
    grid = np.linspace(0.0, 3.0 * current, 601)
    errors = [np.sum((np.array([_index_with(t, {name: float(v)}) for t in terms]) - log_mp) ** 2) for v in grid]
    best = float(grid[int(np.argmin(errors))])
    assert abs(current - best) <= 0.3 * best, f"{name} = {current}, optimum on the calibration rows {best:.4g}"


@pytest.fixture(scope="module")
def molecular_calibration():
    chemicals = pytest.importorskip("chemicals.phase_change")
    with open(DATA / "molecular_compounds.csv", newline="", encoding="utf-8") as handle:
        rows = [r for r in csv.DictReader(handle) if r["set"] == "calibration"]
    out = []
    for row in rows:
        value = chemicals.Tm(row["cas"])
        if value is None:
            continue
        out.append((melting_routes.molecular_terms(decompose(parse_formula(row["formula"]))), float(value)))
    assert len(out) >= 25
    return out




def _log_errors(rows, weights) -> float:
    total = 0.0
    for m, measured in rows:
        entropy = melting_routes.walden_dannenfelser_yalkowsky_entropy_J_mol_K(m.symmetry_number, m.torsions_tau)
        cohesion = m.cohesion_kJ_mol(weights)
        total += math.log(melting_routes.molecular_melting_K(cohesion, entropy) / measured) ** 2
    return total


@pytest.mark.parametrize("name", MOLECULAR_WEIGHTS)
def test_calibration_molecular_weight_sits_at_its_optimum(molecular_calibration, name):
    current = melting.TREND_WEIGHTS[name]
    grid = np.linspace(0.02 * current, 3.0 * current, 600)
    errors = [_log_errors(molecular_calibration, {**melting.TREND_WEIGHTS, name: float(v)}) for v in grid]
    best = float(grid[int(np.argmin(errors))])
    assert abs(current - best) <= 0.3 * best, f"{name} = {current}, optimum on the calibration rows {best:.4g}"


def test_validation_tetrachlorides_melt_where_walden_and_dispersion_put_them():
    # TiCl4 249 K, SnCl4 239 K (chemicals Tm, CRC; validation rows): within a factor 1.2
    chemicals = pytest.importorskip("chemicals.phase_change")
    for formula, cas in (("TiCl4", "7550-45-0"), ("SnCl4", "7646-78-8")):
        m = melting_routes.molecular_terms(decompose(parse_formula(formula)))
        entropy = melting_routes.walden_dannenfelser_yalkowsky_entropy_J_mol_K(m.symmetry_number, m.torsions_tau)
        cohesion = melting_routes.molecular_cohesion_kJ_mol(m.ligand_polarisabilities_A3, m.open_sites,
                                                           m.bond_strength, melting.TREND_WEIGHTS)
        ratio = melting_routes.molecular_melting_K(cohesion, entropy) / chemicals.Tm(cas)
        assert 1 / 1.2 < ratio < 1.2
