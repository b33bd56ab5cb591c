"""The calibration-residual analysis of the salt melting index (pipelines/melting_residuals.py).

The analysis reads the calibration rows only (``datasets/melting/wikidata_salts.csv`` and the
calibration half of the open training set); these tests check that a validation row never enters
it, and the cross-validated gain against closed-form answers on invented numbers (no melting point
here is a measurement).
"""
from __future__ import annotations

import math

import numpy as np
import pytest
from ionicity.pipelines import melting_residuals as mr
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose

pytest.importorskip("scipy")


class _Terms:
    def __init__(self, index):
        self._index = index

    def index(self):
        return self._index


def test_validation_rows_are_never_read():
    rows = [("calibration", _Terms(3.0), 1000.0, "NaCl"), ("validation", _Terms(1.0), 1000.0, "KCl")]
    out = mr.calibration_residuals(rows)
    assert [formula for formula, *_ in out] == ["NaCl"]
    assert out[0][2] == pytest.approx(0.0)  # log10(1000) - 3.0


def test_a_term_that_explains_the_residual_is_found():
    # residual exactly 0.2 x feature: least squares without intercept gives 0.2 (closed form x.r / x.x)
    rng = np.random.default_rng(3)
    feature = rng.uniform(0.0, 1.0, 60)
    index = rng.uniform(2.5, 3.5, 60)
    residual = 0.2 * feature
    out = mr.cross_validated_gain(index + residual, residual, feature, repeats=5)
    assert out["weight"] == pytest.approx(0.2, abs=1e-3)
    assert out["mse_after"] < 1e-12 < out["mse_before"]
    assert out["spearman_after"] >= out["spearman_before"]


def test_a_term_of_noise_does_not_lower_the_out_of_fold_error():
    rng = np.random.default_rng(4)
    residual = rng.normal(0.0, 0.1, 200)
    index = rng.uniform(2.5, 3.5, 200)
    out = mr.cross_validated_gain(index + residual, residual, rng.normal(0.0, 1.0, 200), repeats=10)
    assert out["mse_after"] >= out["mse_before"] * 0.99


def test_a_feature_zero_everywhere_is_refused():
    with pytest.raises(ValueError, match="zero on every calibration row"):
        mr.cross_validated_gain([3.0, 2.9], [0.0, 0.1], [0.0, 0.0])


def test_radius_ratio_term_against_pauling_limit():
    # Shannon (1976), Acta Cryst. A32, 751, Table 1 (from memory): Li+ CN 6 76 pm, Cl- 181 pm, I- 220 pm;
    # Pauling's octahedral limit 0.414 (common practice): LiCl 0.42 just above it, LiI 0.345 below.
    assert mr.anion_contact_radius_ratio(decompose(parse_formula("LiCl"))) == 0.0
    assert mr.anion_contact_radius_ratio(decompose(parse_formula("LiI"))) == pytest.approx(
        math.log10(0.414 / (76 / 220)), abs=1e-6)
    # polyatomic anions have no radius ratio here
    assert mr.anion_contact_radius_ratio(decompose(parse_formula("LiNO3"))) == 0.0


def test_charge_asymmetry_is_antisymmetric_in_the_charge_ratio():
    # K2SO4 (anion charge twice the cation's) and Ca(NO3)2 (half): equal and opposite (invariance)
    k2so4 = mr.polyatomic_charge_asymmetry(decompose(parse_formula("K2SO4")))
    cano3 = mr.polyatomic_charge_asymmetry(decompose(parse_formula("Ca(NO3)2")))
    assert k2so4 == pytest.approx(-cano3) == pytest.approx(math.log10(2))


def test_flagged_targets_reads_the_fixture_and_the_decisions():
    # wikidata_salts.csv gives Na2SO4 360 K (one source, below 100 C: flagged); sodium sulfate melts at
    # 1157 K (CRC Handbook, from memory), its decahydrate near 305 K. NaCl 1074 K is not flagged.
    flagged = mr.flagged_targets([{"formula_normalized": "XyZ", "decision": "single: A=300.0; target flagged: x"}])
    assert {"Na2SO4", "XyZ"} <= flagged
    assert "NaCl" not in flagged


def test_labels_read_compounds_without_ions_by_their_formal_reading():
    # TiN (an interstitial nitride, no ions kept) is a calibration salt of the index by its formal reading
    # Ti(3+) N(3-); the residual report crashed on it (common practice: the index's own reading)
    from ionicity.pipelines.melting_residuals import _formal, _labels
    from ionicity.scorer.formula import parse_formula
    from ionicity.scorer.ions import decompose
    dec = _formal(decompose(parse_formula("TiN")))
    assert dec.cations and _labels(dec, "nitride")["cation charge"] == "3+"
