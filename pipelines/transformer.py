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
import warnings

import numpy as np
from sklearn.base import BaseEstimator, TransformerMixin
from sklearn.utils.validation import check_is_fitted

from ionicity.scorer import melting_model
from ionicity.scorer.audit import COLUMNS as AUDIT_COLUMNS
from ionicity.scorer.columns import output_columns

__all__ = ["FormulaDescriptors", "numeric_descriptor_columns", "categorical_descriptor_columns", "CATEGORIES"]

ON_ERROR = ("nan", "warn", "raise")


#: categorical columns one-hot encoding may take, each with its categories in a
#: fixed order (so the output's width and meaning never depend on the data; a
#: value outside the list is all zeros). substance_class lists the classes
#: agreed between branches, new ones included.
CATEGORIES: dict[str, tuple[str, ...]] = {
    "substance_class": ("ionic_salt", "ionic_liquid_pair", "acid", "base", "covalent_molecular", "covalent_network",
                        "metallic", "element", "ion", "unknown", "chain_layer_solid", "semiconductor",
                        "intermetallic", "zintl_phase", "mixture"),
    "melting_class": ("ionic_liquid", "low_melting_salt", "molten_salt", "refractory"),
    "covalency_risk": ("low", "moderate", "high"),
    "cation_hsab_class": ("hard", "borderline", "soft", "mixed"),
    "anion_hsab_class": ("hard", "borderline", "soft", "mixed"),
    "hsab_pairing": ("matched", "borderline", "mismatched"),
    "structure_type_origin": ("known", "guessed", "none"),
}


def categorical_descriptor_columns() -> dict[str, tuple[str, ...]]:
    """The categorical generated columns ``one_hot`` takes, with their
    categories in a fixed order (:data:`CATEGORIES`, those the scorer declares)."""
    names = {c.name for c in output_columns()}
    return {n: c for n, c in CATEGORIES.items() if n in names}


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
    on_error : {"nan", "warn", "raise"}, default="nan"
        What a formula that cannot be scored (status ``error``, or an empty
        cell) does: NaN values silently, NaN with a ``UserWarning``, or a
        ``ValueError``.
    validity_column : bool, default=False
        Add ``formula_valid``: 1.0 where the formula was scored, else 0.0.
    one_hot : list of str, default=()
        Categorical columns (:data:`CATEGORIES`) to add as one 0/1 column per
        category, named ``NAME=CATEGORY``, the categories fixed in advance.

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

    def __init__(self, formula_column=None, columns="numeric", on_error="nan", validity_column=False, one_hot=()):
        self.formula_column = formula_column
        self.columns = columns
        self.on_error = on_error
        self.validity_column = validity_column
        self.one_hot = one_hot

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
        if self.on_error not in ON_ERROR:
            raise ValueError(f"on_error={self.on_error!r} is not allowed; use one of {', '.join(ON_ERROR)}")
        categorical = categorical_descriptor_columns()
        one_hot = [self.one_hot] if isinstance(self.one_hot, str) else list(self.one_hot)
        unknown = [n for n in one_hot if n not in categorical]
        if unknown:
            raise ValueError(f"one_hot: {unknown} are not categorical columns; choose from {sorted(categorical)}")
        self.columns_ = self._resolve_columns()
        # stable categories: the declared ones, whatever the data hold
        self.categories_ = {n: categorical[n] for n in one_hot}
        self._formulas(X, fitting=True)
        return self

    def _check_width(self, X) -> None:
        width = X.shape[1] if getattr(X, "ndim", np.asarray(X, dtype=object).ndim) == 2 else 1
        if hasattr(X, "iloc") and not hasattr(X, "columns"):
            width = 1
        if width != self.n_features_in_:
            raise ValueError(f"X has {width} features, but FormulaDescriptors is expecting {self.n_features_in_}"
                             " features as input")

    def transform(self, X):
        """Descriptor values, one row per input row.

        Parameters
        ----------
        X : same layout as in ``fit``

        Returns
        -------
        ndarray of shape (n_samples, n_features_out)
            float64: the ``columns_``, then one 0/1 column per category of
            each ``one_hot`` column, then ``formula_valid`` (1/0) when
            ``validity_column``; NaN where a value does not apply. With
            ``on_error="warn"`` a formula that cannot be read warns (once per
            call, naming the first), with ``"raise"`` it raises ValueError.
        """
        check_is_fitted(self, "columns_")
        self._check_width(X)
        formulas = self._formulas(X, fitting=False)
        derived = set(melting_model.MODEL_FEATURES) - set(numeric_descriptor_columns())
        needs_derived = any(c in derived for c in self.columns_)
        cache: dict = {}
        width = len(self.get_feature_names_out())
        out = np.full((len(formulas), width), np.nan)
        failed = []
        for i, cell in enumerate(formulas):
            key = cell if isinstance(cell, str) else repr(cell)
            if key not in cache:
                cache[key] = self._row(cell, needs_derived)
            out[i], ok = cache[key]
            if not ok:
                failed.append(cell)
        if failed and self.on_error != "nan":
            text = f"{len(failed)} formula(s) could not be scored, the first {failed[0]!r}"
            if self.on_error == "raise":
                raise ValueError(text)
            warnings.warn(text + "; their values are NaN", UserWarning, stacklevel=2)
        return out

    def _row(self, cell, needs_derived: bool):
        values, record = _row_values(cell, self.columns_, needs_derived)
        ok = record is not None and record.get("status") != "error"
        parts = [values]
        for name, categories in self.categories_.items():
            value = record.get(name) if record is not None else None
            parts.append(np.array([float(value == c) for c in categories]) if value is not None
                         else np.full(len(categories), np.nan))
        if self.validity_column:
            parts.append(np.array([1.0 if ok else 0.0]))
        return np.concatenate(parts), ok

    def get_feature_names_out(self, input_features=None):
        """Names of the output columns: ``columns_``, then ``NAME=CATEGORY``
        for each one-hot column, then ``formula_valid``.

        Returns
        -------
        ndarray of str
        """
        check_is_fitted(self, "columns_")
        names = list(self.columns_)
        for name, categories in self.categories_.items():
            names += [f"{name}={c}" for c in categories]
        if self.validity_column:
            names.append("formula_valid")
        return np.asarray(names, dtype=object)

    def __sklearn_tags__(self):
        tags = super().__sklearn_tags__()
        # formulas are text: the numeric-input checks do not apply
        tags.input_tags.string = True
        tags.input_tags.two_d_array = True
        tags.requires_fit = True
        return tags


def _row_values(cell, columns: list[str], needs_derived: bool):
    """(values of ``columns``, the record or None for an empty cell)."""
    if cell is None or (isinstance(cell, float) and math.isnan(cell)):
        return np.full(len(columns), np.nan), None
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
    return np.array(values, dtype=float), record
