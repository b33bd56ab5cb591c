"""FormulaDescriptors: on_error, validity column, one-hot categories, n_features_in_, scikit-learn's checks.

The reference is scikit-learn's own estimator checks (sklearn.utils.estimator_checks) and its
developer guide's rules for transformers (common practice); no scientific reference values.
"""
from __future__ import annotations

import warnings

import numpy as np
import pytest

pytest.importorskip("sklearn")
from ionicity.pipelines.transformer import CATEGORIES, FormulaDescriptors  # noqa: E402
from ionicity.scorer.record import score_formula  # noqa: E402


def test_on_error_nan_warn_raise_and_validity():
    X = np.array(["NaCl", "Xx2O"])
    plain = FormulaDescriptors(columns=["mp_trend_index"], validity_column=True).fit(X)
    out = plain.transform(X)
    assert np.isnan(out[1, 0]) and out[:, 1].tolist() == [1.0, 0.0]
    with pytest.warns(UserWarning, match="Xx2O"):
        FormulaDescriptors(columns=["mp_trend_index"], on_error="warn").fit(X).transform(X)
    with pytest.raises(ValueError, match="Xx2O"):
        FormulaDescriptors(columns=["mp_trend_index"], on_error="raise").fit(X).transform(X)
    with pytest.raises(ValueError, match="on_error"):
        FormulaDescriptors(on_error="ignore").fit(X)


def test_one_hot_categories_are_fixed_and_named():
    t = FormulaDescriptors(columns=["mp_trend_index"], one_hot=["melting_class"]).fit(np.array(["NaCl"]))
    names = t.get_feature_names_out().tolist()
    assert names == ["mp_trend_index"] + [f"melting_class={c}" for c in CATEGORIES["melting_class"]]
    row = t.transform(np.array(["NaCl"]))[0]
    expected = score_formula("NaCl")["melting_class"]
    assert row[1:].tolist() == [float(c == expected) for c in CATEGORIES["melting_class"]]
    with pytest.raises(ValueError, match="not categorical"):
        FormulaDescriptors(one_hot=["cations"]).fit(np.array(["NaCl"]))


def test_n_features_in_is_checked():
    t = FormulaDescriptors(columns=["mp_trend_index"]).fit(np.array([["NaCl"]], dtype=object))
    with pytest.raises(ValueError, match="expecting 1 features"):
        t.transform(np.array([["NaCl", "x"]], dtype=object))


# Checks of scikit-learn that do not apply to a stateless transformer of one
# column of formula text, and why:
NOT_APPLICABLE = {
    "check_complex_data": "complex numbers are read as formula text, which fails as a formula, not as an array",
    "check_estimator_sparse_array": "formulas are text; there is no sparse text input",
    "check_estimator_sparse_matrix": "formulas are text; there is no sparse text input",
    "check_estimator_sparse_tag": "formulas are text; there is no sparse text input",
    "check_estimators_nan_inf": "a NaN cell is an empty formula: a row of NaN (or on_error), by design",
    "check_fit1d": "a 1-D array is a column of formulas, accepted by design",
    "check_fit2d_predict1d": "a 1-D array is a column of formulas, accepted by design",
    "check_estimators_empty_data_messages": "an empty table gives an empty result, not an error",
    "check_transformer_data_not_an_array": "the check's array-like wrapper holds numbers, read as formula text",
}


@pytest.mark.slow
def test_scikit_learn_estimator_checks():
    from sklearn.utils.estimator_checks import check_estimator

    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        results = check_estimator(FormulaDescriptors(formula_column=0, columns=["mp_trend_index"]), on_fail=None)
    failed = {r["check_name"] for r in results if r["status"] == "failed"}
    passed = {r["check_name"] for r in results if r["status"] == "passed"}
    assert failed <= set(NOT_APPLICABLE), sorted(failed - set(NOT_APPLICABLE))
    assert {"check_n_features_in", "check_fit_idempotent", "check_transformer_general", "check_estimators_pickle"} <= passed
