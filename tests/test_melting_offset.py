"""Tests for the regression's offset (pipelines/melting_offset.py, scorer.melting_model.model_trend_index):
the trend index's organic weights refitted with a model and carried in its file, the ionic liquids' share of
the trees, the onium rows flagged as hydrates or decomposition points, and the table rows added for the
regression.

Reference values: the index equation of scorer/melting_index.py (the delocalisation term is linear in
log10 of the enthalpy, so removing it moves the index by weight times the delocalised share exactly: a
closed form); registry melting points from chemicals 1.5.2 (CAS Common Chemistry), named per row.
"""
from __future__ import annotations

import csv
import importlib.util
import math
import re
from pathlib import Path

import numpy as np
import pytest

from ionicity.pipelines import melting_cv
from ionicity.pipelines import melting_offset as mo
from ionicity.scorer import melting, melting_model
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose
from ionicity.scorer.melting_model_format import INDEX_WEIGHT_KEYS
from ionicity.scorer.record import score_formula

needs_sklearn = pytest.mark.skipif(importlib.util.find_spec("sklearn") is None, reason="scikit-learn not installed")
needs_scipy = pytest.mark.skipif(importlib.util.find_spec("scipy") is None, reason="scipy not installed")
IL_TABLE = Path(__file__).resolve().parents[1] / "datasets" / "melting" / "ionic_liquids.csv"
SHIPPED = {k: melting.TREND_WEIGHTS[k] for k in INDEX_WEIGHT_KEYS}


def _index(formula, weights=()):
    return melting_model.model_trend_index(decompose(parse_formula(formula)), score_formula(formula), weights)


@pytest.mark.parametrize("formula", ["NaCl", "[C4mim][NTf2]", "[EtNH3][NO3]", "[N4444]Br", "TiCl4", "ZnCl2"])
def test_the_shipped_weights_give_the_column_back(formula):
    # invariance: the model's index with TREND_WEIGHTS' own organic values is the mp_trend_index column
    assert _index(formula, SHIPPED) == score_formula(formula)["mp_trend_index"]


def test_dropping_the_delocalisation_weight_moves_the_index_by_its_term():
    # closed form: with no chain packing entropy, I = ionic part + log10(s_ion / s_total) and the
    # delocalisation term is -w * share in the ionic part, so w = 0 raises I by w * share exactly
    # ([C2mim][BF4]: the imidazolium cation is delocalised, one ion of two)
    terms = melting.melting_terms(decompose(parse_formula("[C2mim][BF4]")))
    assert terms.chain_packing_entropy_J_mol_K == 0.0 and terms.delocalised_fraction > 0
    moved = _index("[C2mim][BF4]", {**SHIPPED, "delocalised": 0.0}) - _index("[C2mim][BF4]")
    assert moved == pytest.approx(SHIPPED["delocalised"] * terms.delocalised_fraction, abs=2e-4)


def test_weights_do_not_reach_the_other_routes():
    # TiCl4 takes the molecular route (scorer.melting_routes): the organic weights do not enter it
    assert _index("TiCl4", {"flexibility": 0.0, "delocalised": 0.0, "protic": 0.0}) == score_formula("TiCl4")["mp_trend_index"]


def _model(**extra):
    # ln T = ln 10 * mp_trend_index + 0.1 + one leaf of 0.3: the trees add 0.4 to ln T
    document = {
        "format": melting_model.MODEL_FORMAT, "format_version": 1, "model_type": "gradient_boosted_trees",
        "target": "ln_mp_K", "features": ["mp_trend_index"], "baseline": 0.1,
        "trees": [{"feature": [0], "threshold": [0.0], "left": [0], "right": [0], "missing_left": [0],
                   "leaf": [1], "value": [0.3]}],
        "offset": {"feature": "mp_trend_index", "scale": math.log(10.0)},
        "interval": {"log_halfwidth": 0.2}, "domain": {"feature_min": [0.0], "feature_max": [5.0]},
        **extra,
    }
    return melting_model.model_from_dict(document)


def test_a_model_file_reads_the_index_with_its_own_weights():
    weights = {"flexibility": 0.089, "delocalised": 0.0, "protic": 0.1}
    own, shipped = _model(index_weights=weights), _model()
    (with_own,), (with_shipped,) = (melting_model.predict_for_formulas(m, ["[C2mim][BF4]"]) for m in (own, shipped))
    assert with_own.mp_predicted_K == pytest.approx(10 ** _index("[C2mim][BF4]", weights) * math.exp(0.4), rel=1e-3)
    assert with_shipped.mp_predicted_K == pytest.approx(10 ** _index("[C2mim][BF4]") * math.exp(0.4), rel=1e-3)
    # NaCl has no organic term: the same prediction under both files
    (a,), (b,) = (melting_model.predict_for_formulas(m, ["NaCl"]) for m in (own, shipped))
    assert a.mp_predicted_K == b.mp_predicted_K


def test_tree_weights_scale_the_trees_of_the_named_group_only():
    model = _model(tree_weights={"ionic_liquid": 0.25})
    x = np.full((2, len(melting_model.MODEL_FEATURES)), np.nan)
    x[:, 0] = 2.5
    x[:, melting_model.MODEL_FEATURES.index("ions_per_formula_unit")] = 2.0  # so the rows count as salts
    pred, _, _ = melting_model.predict_melting_K(model, x, ["ionic_liquid", "other"])
    assert pred[0] == pytest.approx(10 ** 2.5 * math.exp(0.25 * 0.4))
    assert pred[1] == pytest.approx(10 ** 2.5 * math.exp(0.4))


def _calibration_rows():
    with open(IL_TABLE, newline="", encoding="utf-8") as handle:
        rows = [r for r in csv.DictReader(handle) if r["set"] == "calibration"]
    return [melting.melting_terms(decompose(parse_formula(r["formula"]))) for r in rows], np.array(
        [float(r["mp_K"]) for r in rows])


@needs_scipy
def test_index_weights_refit_on_the_index_s_calibration_rows_land_on_the_shipped_ones():
    # calibration cross-check: the same rows and the same least squares as TREND_WEIGHTS' organic values
    # (pipelines/melting_weights.py), reached through the model's own fitting path
    terms, mp = _calibration_rows()
    weights = mo.fit_index_weights(terms, mp, np.arange(len(terms)))
    for key in INDEX_WEIGHT_KEYS:
        assert weights[key] == pytest.approx(SHIPPED[key], abs=0.01)


def test_too_few_organic_rows_keep_the_shipped_weights():
    terms, mp = _calibration_rows()
    assert mo.fit_index_weights(terms, mp, np.arange(mo.MIN_ORGANIC_ROWS - 1)) == SHIPPED


def test_the_rebuilt_column_changes_only_salt_rows():
    formulas = ["[C4mim][NTf2]", "TiCl4", "NaCl"]
    records = [score_formula(f) for f in formulas]
    terms = mo.index_terms([{"formula_normalized": f} for f in formulas], records)
    assert terms[1] is None  # molecular route
    x = np.vstack([melting_model.features_for_formula(f)[1] for f in formulas])
    rebuilt = mo.with_index_weights(x, terms, {**SHIPPED, "delocalised": 0.0})
    column = melting_model.MODEL_FEATURES.index("mp_trend_index")
    assert rebuilt[0, column] > x[0, column] and rebuilt[1, column] == x[1, column] and rebuilt[2, column] == x[2, column]
    assert np.array_equal(np.delete(rebuilt, column, axis=1), np.delete(x, column, axis=1), equal_nan=True)


def _synthetic(il_follows_the_trees: bool):
    # 4 "families" of ionic liquids and 200 other rows; T = 10**index * exp(0.5 * f) for the others;
    # for the ionic liquids either the same law or the index alone
    rng = np.random.default_rng(3)
    n_il, n_other = 80, 200
    x = np.full((n_il + n_other, len(melting_model.MODEL_FEATURES)), np.nan)
    x[:, 0] = rng.uniform(2.3, 3.3, n_il + n_other)  # mp_trend_index
    x[:, 3] = rng.normal(size=n_il + n_other)  # delta_chi_pauling as the one informative feature
    y = 10 ** x[:, 0] * np.exp(0.5 * x[:, 3])
    if not il_follows_the_trees:
        y[:n_il] = 10 ** x[:n_il, 0]
    labels = np.array(["ionic_liquid"] * n_il + ["other"] * n_other)
    groups = np.array([f"fam{i % 4}" for i in range(n_il)] + [f"el{i % 10}" for i in range(n_other)])
    return x, y, labels, groups


@needs_sklearn
@pytest.mark.parametrize("follows", [True, False])
def test_the_inner_cross_validation_picks_the_share_that_fits(fast_pipeline, follows):
    from ionicity.pipelines import melting_fit as mf

    x, y, labels, groups = _synthetic(follows)
    share, errors = mo.choose_tree_weight(x, y, np.arange(len(y)), labels, groups, None,
                                          lambda xs, ys, ls: mf._fit_pipeline(xs, ys, 0, ls))
    assert set(errors) == set(mo.TREE_WEIGHT_CANDIDATES)
    assert share >= 0.75 if follows else share == 0.0


@needs_sklearn
def test_interval_half_widths_come_from_the_inner_cross_validation(fast_pipeline):
    # ln T = ln 10 * index + 0.5 f + noise of spread 0.1 that no feature carries: the inner grouped
    # cross-validation predicts every fitted row without its group, and the 90 % quantile of its
    # absolute log residuals comes out near the noise's, z_0.95 * sigma = 1.645 * 0.1 (standard normal
    # quantile, any statistics table; common practice), a little wider for the trees' own error
    from ionicity.pipelines import melting_fit as mf
    from ionicity.pipelines.melting_validation import _conformal_halfwidth

    rng = np.random.default_rng(5)
    n = 600
    x = np.full((n, len(melting_model.MODEL_FEATURES)), np.nan)
    x[:, 0] = rng.uniform(2.3, 3.3, n)
    x[:, 3] = rng.normal(size=n)
    y = 10 ** x[:, 0] * np.exp(0.5 * x[:, 3] + rng.normal(0.0, 0.1, n))
    labels = np.array(["other"] * n)
    groups = np.array([f"g{i % 20}" for i in range(n)])
    regressor, _, _, _ = mo.fit_offset_model(x, y, np.arange(n), labels, groups, None,
                                             lambda xs, ys, ls: mf._fit_pipeline(xs, ys, 0, ls))
    residuals = regressor.inner_log_residuals
    assert residuals.shape == (n,) and np.isfinite(residuals).all()
    assert 0.9 * 0.1645 < _conformal_halfwidth(residuals, 0.9) < 1.4 * 0.1645
    # without an inner cross-validation there are no residuals to set half-widths from
    regressor, _, _, _ = mo.fit_offset_model(x, y, np.arange(n), labels, None, None,
                                             lambda xs, ys, ls: mf._fit_pipeline(xs, ys, 0, ls))
    assert regressor.inner_log_residuals is None


def test_no_ionic_liquid_rows_keep_the_full_trees():
    x, y, labels, groups = _synthetic(True)
    others = np.flatnonzero(labels == "other")
    assert mo.choose_tree_weight(x, y, others, labels, groups, None, None) == (1.0, {})


@pytest.mark.parametrize("formula, mp_K, flag", [
    ("[N4444]F", 304.1, "hydrate"),  # sold as the trihydrate (Sharma & Fry, J. Org. Chem. 1983, 48, 2112; from memory)
    ("[N4444][OH]", 300.15, "hydrate"),  # chemicals 1.5.2 COMMON_CHEMISTRY 300.15 K: a hydrate's value
    ("[N1111]Cl", 642.15, "decomposition"),  # chemicals 1.5.2 COMMON_CHEMISTRY 642.15 K, above 550 K
    ("[N4444]Br", 376.0, ""),  # ionic_liquids.csv (CRC Handbook, from memory)
    ("[C2mim]Cl", 360.0, ""),  # not an onium salt: never flagged
    ("NaCl", 1074.0, ""),  # CRC Handbook (from memory)
])
def test_onium_rows_are_flagged_by_the_stated_rule(formula, mp_K, flag):
    assert melting_cv.suspect_melting_point(formula, mp_K) == flag


def _regression_rows():
    with open(IL_TABLE, newline="", encoding="utf-8") as handle:
        return [r for r in csv.DictReader(handle) if r["set"] == "regression"]


def test_rows_added_for_the_regression_name_a_registry_entry():
    rows = _regression_rows()
    assert len(rows) == 7
    for row in rows:
        assert re.search(r"CAS \d+-\d\d-\d", row["source"]), row["formula"]
        assert score_formula(row["formula"])["substance_class"] == "ionic_liquid_pair", row["formula"]


def test_rows_added_for_the_regression_agree_with_the_registry():
    phase_change = pytest.importorskip("chemicals.phase_change")
    for row in _regression_rows():
        cas = re.search(r"CAS (\d+-\d\d-\d)", row["source"]).group(1)
        assert phase_change.Tm(cas) == pytest.approx(float(row["mp_K"]), abs=10.0), row["formula"]


# ------------------------------------------------------------- stable folds
# A property of the measurement, no chemistry value: a group's fold depends on its name and the seed only, so
# one row more in the training table cannot redraw which ionic-liquid families are held out together (on
# 5 December 2026 one inorganic row, UF4, moved the held-out ionic-liquid figure 65.6 -> 70.6 K under
# scikit-learn's size-balanced GroupKFold; DEVELOPERS.md, "Stable folds").

def _held_out_sets(groups, folds, seed=0):
    return [frozenset(np.asarray(groups)[test].tolist()) for _, test in mo.stable_group_splits(groups, folds, seed)]


def test_stable_folds_partition_the_rows_by_whole_groups():
    rng = np.random.default_rng(4)
    groups = [f"g{int(v)}" for v in rng.integers(0, 40, size=500)]
    splits = mo.stable_group_splits(groups, 5)
    tested = np.concatenate([test for _, test in splits])
    assert sorted(tested.tolist()) == list(range(500))
    for train, test in splits:
        assert not set(np.asarray(groups)[train]) & set(np.asarray(groups)[test])
        assert len(train) + len(test) == 500


@needs_sklearn
def test_stable_folds_do_not_move_a_group_when_rows_or_groups_are_added():
    rng = np.random.default_rng(5)
    groups = [f"g{int(v)}" for v in rng.integers(0, 40, size=300)]
    before = _held_out_sets(groups, 5)
    grown = groups + ["g3"] * 7 + ["new family"] * 4 + ["Na"]
    after = _held_out_sets(grown, 5)
    for old in before:
        assert any(old <= new for new in after)
    # scikit-learn's size-balanced folds move groups for the same change (what this replaced)
    from sklearn.model_selection import GroupKFold

    def gkf(g):
        return [frozenset(np.asarray(g)[t].tolist()) for _, t in GroupKFold(5).split(np.zeros(len(g)), groups=g)]
    assert not all(any(old <= new for new in gkf(grown)) for old in gkf(groups))


def test_stable_folds_differ_by_seed_and_never_leave_one_fold():
    groups = [f"family {i}" for i in range(30)]
    assert _held_out_sets(groups, 5, seed=0) != _held_out_sets(groups, 5, seed=1)
    # two groups always make two folds, whatever their hashes
    assert all(len(mo.stable_group_splits(["a", "a", "b"], 5, seed=s)) == 2 for s in range(50))
    with pytest.raises(ValueError, match="2 groups"):
        mo.stable_group_splits(["a", "a"], 5)
