"""Tests for pipelines.transformer.FormulaDescriptors: the scikit-learn face of the descriptors."""
from __future__ import annotations

import math

import numpy as np
import pandas as pd
import pytest

pytest.importorskip("sklearn")  # part of the optional 'melting' extra

from sklearn.base import clone  # noqa: E402
from sklearn.exceptions import NotFittedError  # noqa: E402
from sklearn.impute import SimpleImputer  # noqa: E402
from sklearn.linear_model import LinearRegression  # noqa: E402
from sklearn.pipeline import make_pipeline  # noqa: E402

from ionicity.pipelines.transformer import FormulaDescriptors, numeric_descriptor_columns  # noqa: E402
from ionicity.scorer import melting_model, score_formula  # noqa: E402


def test_numeric_columns_include_the_melting_index_and_no_text():
    names = numeric_descriptor_columns()
    assert "mp_trend_index" in names and "molar_mass_g_mol" in names
    assert "status" not in names and "cations" not in names and "melting_class" not in names


def test_values_match_score_formula():
    # the transformer must add nothing of its own: compare with the scoring function
    t = FormulaDescriptors(columns=["molar_mass_g_mol", "lattice_energy_vbt_kJ_mol"]).fit(["NaCl"])
    row = t.transform(["NaCl"])[0]
    record = score_formula("NaCl")
    assert row[0] == pytest.approx(record["molar_mass_g_mol"])
    assert row[1] == pytest.approx(record["lattice_energy_vbt_kJ_mol"])
    # NaCl 58.44 g/mol from IUPAC standard atomic weights (Na 22.990, Cl 35.45)
    assert row[0] == pytest.approx(58.44, abs=0.01)


def test_shapes_names_and_nan_for_bad_rows():
    t = FormulaDescriptors().fit(np.array(["NaCl", "MgO", "Qq2", None], dtype=object))
    out = t.transform(np.array(["NaCl", "MgO", "Qq2", None], dtype=object))
    names = t.get_feature_names_out()
    assert out.shape == (4, len(names)) and out.dtype == np.float64
    assert np.isnan(out[2]).all() and np.isnan(out[3]).all()
    assert list(names) == list(numeric_descriptor_columns())


def test_equivalent_spellings_give_equal_rows():
    t = FormulaDescriptors(columns="model").fit(["NaCl"])
    a, b = t.transform(["NaCl", "ClNa"])
    assert np.array_equal(a, b, equal_nan=True)


def test_model_columns_include_the_derived_counts():
    t = FormulaDescriptors(columns="model").fit(["Al2(SO4)3"])
    named = dict(zip(t.get_feature_names_out(), t.transform(["Al2(SO4)3"])[0]))
    assert list(t.get_feature_names_out()) == list(melting_model.MODEL_FEATURES)
    assert named["ions_per_formula_unit"] == 5.0 and named["max_cation_charge"] == 3.0


def test_dataframe_input_with_a_named_column_and_pandas_output():
    df = pd.DataFrame({"id": [1, 2], "formula": ["KCl", "CaF2"]})
    t = FormulaDescriptors(formula_column="formula", columns=["mp_trend_index"]).set_output(transform="pandas")
    out = t.fit_transform(df)
    assert isinstance(out, pd.DataFrame) and list(out.columns) == ["mp_trend_index"]
    assert list(out.index) == list(df.index)
    assert t.n_features_in_ == 2 and list(t.feature_names_in_) == ["id", "formula"]


def test_inside_a_users_pipeline():
    # melting points from the CRC Handbook (from memory), in K
    df = pd.DataFrame({"formula": ["NaCl", "KCl", "KBr", "MgO", "CaO", "CaF2", "NaNO3", "K2SO4"],
                       "mp_K": [1074, 1044, 1007, 3098, 2886, 1691, 580, 1342]})
    model = make_pipeline(
        FormulaDescriptors(formula_column="formula", columns=["mp_trend_index", "lattice_energy_vbt_kJ_mol"]),
        SimpleImputer(), LinearRegression(),
    )
    model.fit(df[["formula"]], df["mp_K"])
    pred = model.predict(df[["formula"]])
    assert pred.shape == (8,) and np.all(np.isfinite(pred))
    assert pred[3] > pred[0]  # MgO above NaCl
    assert list(model[:-1].get_feature_names_out()) == ["mp_trend_index", "lattice_energy_vbt_kJ_mol"]


def test_clone_and_params_follow_the_sklearn_contract():
    t = FormulaDescriptors(formula_column=0, columns=["mp_trend_index"])
    c = clone(t)
    assert c.get_params() == {"formula_column": 0, "columns": ["mp_trend_index"], "on_error": "nan",
                              "validity_column": False, "one_hot": ()}
    out = c.fit_transform(np.array([["NaCl", "x"], ["MgO", "y"]], dtype=object))
    assert out.shape == (2, 1)


def test_errors_say_what_to_do():
    with pytest.raises(NotFittedError):
        FormulaDescriptors().transform(["NaCl"])
    with pytest.raises(ValueError, match="'numeric', 'model'"):
        FormulaDescriptors(columns="everything").fit(["NaCl"])
    with pytest.raises(ValueError, match="unknown descriptor columns"):
        FormulaDescriptors(columns=["status"]).fit(["NaCl"])
    with pytest.raises(ValueError, match="formula_column"):
        FormulaDescriptors().fit(pd.DataFrame({"a": ["NaCl"], "b": ["KCl"]}))
    with pytest.raises(ValueError, match="no column 'formula'"):
        FormulaDescriptors(formula_column="formula").fit(pd.DataFrame({"a": ["NaCl"]}))


def test_hostile_cells_cost_little_and_give_nan():
    t = FormulaDescriptors(columns=["molar_mass_g_mol"]).fit(["NaCl"])
    out = t.transform(["(" * 500 + "Na", "Na" + "9" * 400, "", 3.5])
    assert all(math.isnan(v) for v in out[:, 0])
