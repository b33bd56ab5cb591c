"""ionicity's descriptors as a scikit-learn transformer: formulas in, numeric columns out.

>>> import numpy as np
>>> from ionicity.pipelines.transformer import FormulaDescriptors
>>> t = FormulaDescriptors(columns=["lattice_energy_vbt_kJ_mol", "mp_trend_index"]).fit(np.array(["NaCl", "MgO"]))
>>> t.get_feature_names_out().tolist()
['lattice_energy_vbt_kJ_mol', 'mp_trend_index']
>>> t.transform(np.array(["NaCl", "MgO"])).shape
(2, 2)

Use it as the first step of a pipeline, on a DataFrame column:

>>> import pandas as pd
>>> from sklearn.pipeline import make_pipeline
>>> from sklearn.linear_model import Ridge
>>> df = pd.DataFrame({"formula": ["NaCl", "KCl", "MgO", "CaO"], "y": [1074.0, 1044.0, 3098.0, 2886.0]})
>>> model = make_pipeline(FormulaDescriptors(formula_column="formula", columns="model"), Ridge())
>>> model.fit(df[["formula"]], df["y"]).predict(df[["formula"]]).shape
(4,)

``Ridge`` needs finite inputs: put a ``SimpleImputer`` before it for salts
without some descriptor, or use an estimator that takes NaN
(``HistGradientBoostingRegressor``).
"""
from __future__ import annotations

import math

import numpy as np
from sklearn.base import BaseEstimator, TransformerMixin
from sklearn.utils.validation import check_is_fitted

from ionicity.scorer import melting_model
from ionicity.scorer.audit import COLUMNS as AUDIT_COLUMNS
from ionicity.scorer.columns import output_columns

__all__ = ["FormulaDescriptors", "numeric_descriptor_columns"]


def numeric_descriptor_columns() -> tuple[str, ...]:
    """Every numeric (``float64``, ``int64`` or ``bool``) generated column, the melting trend included;
    not the audit's row numbers (``first_row_same_compound`` says where a row is, not what it holds)."""
    audit = {c.name for c in AUDIT_COLUMNS}
    return tuple(c.name for c in output_columns() if c.dtype in ("float64", "bool", "int64") and c.name not in audit)


class FormulaDescriptors(TransformerMixin, BaseEstimator):
    """Turn a column of formulas into ionicity's numeric descriptor columns.

    Stateless apart from remembering which columns to produce: ``fit``
    checks the options and the input, ``transform`` scores every distinct
    formula once (:func:`scorer.score_formula`, cached per process) and
    returns one row per input row, NaN where a descriptor does not apply or
    the formula could not be read. ``bool`` columns become 0.0/1.0.

    Parameters
    ----------
    formula_column : str or int, default=None
        Column holding the formulas when ``X`` is a DataFrame (a name) or a
        2-D array (a position). None: ``X`` is one-dimensional or has a single
        column.
    columns : {"numeric", "model"} or list of str, default="numeric"
        ``"numeric"``: every numeric generated column
        (:func:`numeric_descriptor_columns`); ``"model"``: the features of the
        melting regression (:data:`scorer.melting_model.MODEL_FEATURES`, which adds
        ion counts and charges); or a list of names from either.

    Attributes
    ----------
    columns_ : list of str
        The output columns, in order.
    n_features_in_ : int
        Number of input columns seen in ``fit``.
    feature_names_in_ : ndarray of str
        Input column names, when ``X`` had string column names.

    See Also
    --------
    scorer.score_formula : the function behind each row.
    pipelines.score_table : the same descriptors added to a DataFrame, text columns included.

    Examples
    --------
    >>> FormulaDescriptors(columns=["no_such_column"]).fit(np.array(["NaCl"]))
    Traceback (most recent call last):
    ...
    ValueError: unknown descriptor columns ['no_such_column']; see pipelines.transformer.numeric_descriptor_columns() and scorer.melting_model.MODEL_FEATURES
    """

    def __init__(self, formula_column=None, columns="numeric"):
        self.formula_column = formula_column
        self.columns = columns

    # ---------------------------------------------------------------- options
    def _resolve_columns(self) -> list[str]:
        numeric = numeric_descriptor_columns()
        if isinstance(self.columns, str):
            if self.columns == "numeric":
                return list(numeric)
            if self.columns == "model":
                return list(melting_model.MODEL_FEATURES)
            raise ValueError(f"columns={self.columns!r} is not allowed; use 'numeric', 'model' or a list of column names")
        names = list(self.columns)
        if not names or not all(isinstance(n, str) for n in names):
            raise ValueError("columns must be 'numeric', 'model' or a non-empty list of column names")
        allowed = set(numeric) | set(melting_model.MODEL_FEATURES)
        unknown = [n for n in names if n not in allowed]
        if unknown:
            raise ValueError(
                f"unknown descriptor columns {unknown}; see pipelines.transformer.numeric_descriptor_columns()"
                " and scorer.melting_model.MODEL_FEATURES"
            )
        return names

    def _formulas(self, X, *, fitting: bool) -> list:
        """The formula cells of ``X`` as a list (one per row)."""
        if hasattr(X, "iloc") and hasattr(X, "columns"):  # DataFrame
            if fitting:
                self.n_features_in_ = X.shape[1]
                names = np.asarray(X.columns, dtype=object)
                if all(isinstance(n, str) for n in names):
                    self.feature_names_in_ = names
                elif hasattr(self, "feature_names_in_"):
                    del self.feature_names_in_
            if self.formula_column is None:
                if X.shape[1] != 1:
                    raise ValueError(f"X has {X.shape[1]} columns; pass formula_column= to say which holds formulas")
                return X.iloc[:, 0].tolist()
            if isinstance(self.formula_column, str):
                if self.formula_column not in X.columns:
                    raise ValueError(f"no column {self.formula_column!r} in X; columns: {list(X.columns)}")
                return X[self.formula_column].tolist()
            return X.iloc[:, int(self.formula_column)].tolist()
        if hasattr(X, "iloc"):  # Series
            if fitting:
                self.n_features_in_ = 1
            return X.tolist()
        array = np.asarray(X, dtype=object)
        if array.ndim == 1:
            if fitting:
                self.n_features_in_ = 1
            return array.tolist()
        if array.ndim != 2:
            raise ValueError(f"X must be 1-D or 2-D, got {array.ndim} dimensions")
        if fitting:
            self.n_features_in_ = array.shape[1]
        if self.formula_column is None:
            if array.shape[1] != 1:
                raise ValueError(f"X has {array.shape[1]} columns; pass formula_column= to say which holds formulas")
            return array[:, 0].tolist()
        if isinstance(self.formula_column, str):
            raise ValueError("formula_column is a name, but X is an array without column names; pass a position")
        return array[:, int(self.formula_column)].tolist()

    # -------------------------------------------------------------------- API
    def fit(self, X, y=None):
        """Check the options and the input; nothing is learned.

        Parameters
        ----------
        X : DataFrame, Series or array-like of shape (n_samples,) or (n_samples, n_columns)
        y : ignored

        Returns
        -------
        self
        """
        self.columns_ = self._resolve_columns()
        self._formulas(X, fitting=True)
        return self

    def transform(self, X):
        """Descriptor values, one row per input row.

        Parameters
        ----------
        X : same layout as in ``fit``

        Returns
        -------
        ndarray of shape (n_samples, len(columns_))
            float64; NaN where a value does not apply.
        """
        check_is_fitted(self, "columns_")
        formulas = self._formulas(X, fitting=False)
        derived = set(melting_model.MODEL_FEATURES) - set(numeric_descriptor_columns())
        needs_derived = any(c in derived for c in self.columns_)
        cache: dict = {}
        out = np.full((len(formulas), len(self.columns_)), np.nan)
        for i, cell in enumerate(formulas):
            key = cell if isinstance(cell, str) else repr(cell)
            if key not in cache:
                cache[key] = _row_values(cell, self.columns_, needs_derived)
            out[i] = cache[key]
        return out

    def get_feature_names_out(self, input_features=None):
        """Names of the output columns.

        Returns
        -------
        ndarray of str
        """
        check_is_fitted(self, "columns_")
        return np.asarray(self.columns_, dtype=object)


def _row_values(cell, columns: list[str], needs_derived: bool) -> np.ndarray:
    if cell is None or (isinstance(cell, float) and math.isnan(cell)):
        return np.full(len(columns), np.nan)
    # the melting model's own feature function, so transformer and model agree
    record, features = melting_model.features_for_formula(cell if isinstance(cell, str) else str(cell))
    derived = dict(zip(melting_model.MODEL_FEATURES, features.tolist())) if needs_derived else {}
    values = []
    for name in columns:
        value = derived[name] if name in derived else record.get(name)
        if value is None:
            values.append(np.nan)
            continue
        try:
            values.append(float(value))
        except (TypeError, ValueError):
            values.append(np.nan)
    return np.array(values, dtype=float)
