"""Applying a fitted melting-point model: its file layout, its features and its prediction.

``ionicity fit-melting`` (the trainer, :mod:`pipelines.melting_fit`) fits
gradient-boosted trees on :data:`MODEL_FEATURES` and writes them as JSON:
every tree as arrays of plain numbers. :func:`model_from_dict` (in
:mod:`scorer.melting_model_format`, re-exported here) checks such a
document against the expected layout and refuses anything else;
:func:`predict_melting_K` walks the trees in numpy and adds the conformal-style
interval (half-widths set by the trainer, see the file's ``interval.method``). No pickle is involved, so a model file cannot run code. Scoring
imports this module, never the trainer.

Predicted melting points are estimates for screening, not for process safety:
decomposition, hydration and pressure are not modelled. Check measured data
and the safety data sheet before heating anything.
"""
from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass

import numpy as np
from ionicity.scorer.melting import CAUTION, melting_terms
from ionicity.scorer.melting_ion_features import ionic_liquid_descriptors
from ionicity.scorer.melting_model_format import (
    _DERIVED_FEATURES,
    _RECORD_FEATURES,
    INDEX_WEIGHT_KEYS,
    INTERVAL_GROUPS,
    MODEL_FEATURES,
    MODEL_FORMAT,
    MODEL_FORMAT_VERSION,
    MeltingModel,
    ModelFormatError,
    model_from_dict,
    model_to_dict,
)
from ionicity.scorer.melting_routes import MELTING_CLASS_BANDS, ROUTE_OF_CLASS, melting_class_for
from ionicity.scorer.formula import FormulaError, parse_formula
from ionicity.scorer.ions import decompose
from ionicity.scorer.model import Column, Decomposition
from ionicity.scorer.record import score_formula
from ionicity.scorer.verdict import Verdict, with_warnings

__all__ = [
    "MODEL_COLUMNS",
    "MODEL_FEATURES",
    "MeltingModel",
    "ModelFormatError",
    "derived_ion_features",
    "model_features",
    "features_for_formula",
    "model_trend_index",
    "model_from_dict",
    "predict_melting_K",
    "outside_training_domain",
    "apply_model_to_records",
    "ModelPrediction",
    "predict_for_formulas",
    "INTERVAL_GROUPS",
    "INDEX_WEIGHT_KEYS",
    "interval_group",
    "class_disagreement",
]

#: the --columns group of MODEL_COLUMNS (added with --mp-model)
GROUP = "melting"

MODEL_COLUMNS: tuple[Column, ...] = (
    Column(
        "mp_predicted_K", "float64", "K",
        "melting point predicted by the model given with --mp-model (ionicity fit-melting); " + CAUTION,
        "gradient-boosted trees on log melting point over ionicity's own columns (MODEL_FEATURES),"
        " on top of ln 10 * mp_trend_index when the model file has an offset",
        "the model file's training data; see its metadata",
    ),
    Column(
        "mp_interval_low_K", "float64", "K",
        "lower end of the prediction interval (coverage in the model file, 90 % by default)",
        "prediction / exp(q), q the quantile of absolute log residuals of rows predicted without their group"
        " (the model file's interval method: inner grouped cross-validation; older files: calibration rows)",
        "Lei et al., J. Am. Stat. Assoc. 2018, 113, 1094, doi:10.1080/01621459.2017.1307116",
    ),
    Column(
        "mp_interval_high_K", "float64", "K",
        "upper end of the prediction interval",
        "prediction * exp(q)",
        "Lei et al., J. Am. Stat. Assoc. 2018, 113, 1094, doi:10.1080/01621459.2017.1307116",
    ),
)


def interval_group(substance_class: str | None) -> str:
    """The conformal group of a compound: ``ionic_liquid`` for an organic-cation salt, else ``other``.

    >>> interval_group("ionic_liquid_pair"), interval_group("ionic_salt")
    ('ionic_liquid', 'other')
    """
    return "ionic_liquid" if substance_class == "ionic_liquid_pair" else "other"


def derived_ion_features(dec: Decomposition | None) -> tuple[float, ...]:
    """The :data:`_DERIVED_FEATURES` of one compound, read from its decomposition.

    ``ions_per_formula_unit`` (nu, the sum of ion counts), ``max_cation_charge``
    and ``max_anion_charge`` (magnitudes), ``polyatomic_anion_fraction`` (count
    share of anions of more than one atom) and ``organic_ion_fraction`` (count
    share of ions written as bracketed abbreviations, ``[C4mim]``, ``[NTf2]``:
    the ions of ionic liquids; carboxylates, which the ion library also marks
    organic, do not count, as in every model fitted so far). Definitions
    fixed here; all NaN when the compound has no cation or no anion.

    Parameters
    ----------
    dec : Decomposition or None
        :func:`scorer.ions.decompose` of the parsed formula; None when the
        formula could not be read.

    Returns
    -------
    tuple of float
        One value per name in ``_DERIVED_FEATURES``.

    Examples
    --------
    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> derived_ion_features(decompose(parse_formula("Al2(SO4)3")))
    (5.0, 3.0, 2.0, 1.0, 0.0)
    >>> derived_ion_features(decompose(parse_formula("[C4mim]Cl")))
    (2.0, 1.0, 1.0, 0.0, 0.5)
    """
    if dec is None or not dec.cations or not dec.anions:
        return (math.nan,) * len(_DERIVED_FEATURES)
    terms = dec.cations + dec.anions
    nu = float(sum(t.count for t in terms))
    anion_total = sum(t.count for t in dec.anions)
    polyatomic = sum(t.count for t in dec.anions if t.ion.atom_count > 1) / anion_total
    organic = sum(t.count for t in terms if t.ion.label.startswith("[")) / nu
    return (
        nu,
        float(max(t.ion.charge for t in dec.cations)),
        float(max(-t.ion.charge for t in dec.anions)),
        float(polyatomic),
        float(organic),
    )


def model_features(dec: Decomposition | None, record: Mapping) -> np.ndarray:
    """The :data:`MODEL_FEATURES` vector of one compound (NaN where missing).

    The one feature function of the melting model: the trainer
    (:mod:`pipelines.melting_fit`), the scikit-learn transformer
    (:mod:`pipelines.transformer`) and prediction (:func:`predict_for_formulas`)
    all call it. Record features are the scored record's numeric values;
    derived features come from the decomposition (:func:`derived_ion_features`,
    :func:`scorer.melting_ion_features.ionic_liquid_descriptors`), never from the
    record's text columns.

    Parameters
    ----------
    dec : Decomposition or None
        The compound's decomposition (None: the formula could not be read).
    record : mapping
        Its scored record (:func:`scorer.score_formula`); only the numeric
        columns named in ``_RECORD_FEATURES`` are read.

    Returns
    -------
    ndarray of shape (len(MODEL_FEATURES),)

    See Also
    --------
    features_for_formula : record, decomposition and features from a formula text.

    Examples
    --------
    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> x = model_features(decompose(parse_formula("Al2(SO4)3")), {"molar_mass_g_mol": 342.1})
    >>> named = dict(zip(MODEL_FEATURES, x.tolist()))
    >>> named["ions_per_formula_unit"], named["max_cation_charge"], named["molar_mass_g_mol"]
    (5.0, 3.0, 342.1)
    """
    values = [_float(record.get(name)) for name in _RECORD_FEATURES]
    values += derived_ion_features(dec)
    values += ionic_liquid_descriptors(dec)
    return np.array(values, dtype=float)


def _decomposition_of(text) -> Decomposition | None:
    """The decomposition of a formula cell as scoring reads it (None when unreadable)."""
    if isinstance(text, (bytes, bytearray)):
        try:
            text = bytes(text).decode("utf-8")
        except UnicodeDecodeError:
            return None
    elif text is None or (isinstance(text, float) and math.isnan(text)):
        return None
    elif not isinstance(text, str):
        text = str(text)
    try:
        return decompose(parse_formula(text))
    except FormulaError:
        return None


def features_for_formula(text) -> tuple[dict, np.ndarray]:
    """A formula's scored record and its :data:`MODEL_FEATURES` vector (:func:`model_features`).

    Parameters
    ----------
    text : str or None
        A formula as typed.

    Returns
    -------
    (dict, ndarray of shape (len(MODEL_FEATURES),))
        The record of :func:`scorer.score_formula` and the features; the
        derived features are NaN for a record with status ``error``.

    Examples
    --------
    >>> record, x = features_for_formula("NaCl")
    >>> record["status"], float(x[MODEL_FEATURES.index("ions_per_formula_unit")])
    ('ok', 2.0)
    """
    record = score_formula(text)
    dec = None if record.get("status") == "error" else _decomposition_of(text)
    return record, model_features(dec, record)


def model_trend_index(dec: Decomposition | None, record: Mapping, weights=()) -> float:
    """``mp_trend_index`` as a model with its own organic weights reads it.

    A model file's ``index_weights`` (the trend index's ``flexibility``,
    ``delocalised`` and ``protic`` weights refitted on the model's training
    rows, :func:`pipelines.melting_fit.fit_index_weights`) replace those of
    :data:`scorer.melting_index.TREND_WEIGHTS` in the salt route's index
    (:meth:`scorer.melting.MeltingTerms.index`). Other routes, and compounds
    without salt terms, keep the record's index: the organic weights do not
    enter them. Without weights, the record's index.

    Parameters
    ----------
    dec : Decomposition or None
    record : mapping
        The compound's scored record (``mp_trend_index``, ``mp_route``).
    weights : mapping or sequence of (name, value) pairs, default=()

    Returns
    -------
    float
        NaN where the record has no index.

    Examples
    --------
    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> dec = decompose(parse_formula("[C4mim][NTf2]"))
    >>> record = score_formula("[C4mim][NTf2]")
    >>> model_trend_index(dec, record) == record["mp_trend_index"]
    True
    >>> model_trend_index(dec, record, {"flexibility": 0.089, "delocalised": 0.0, "protic": 0.1}) > record["mp_trend_index"]
    True
    """
    shipped = _float(record.get("mp_trend_index"))
    weights = dict(weights)
    if not weights or dec is None or record.get("mp_route") != "salt" or not math.isfinite(shipped):
        return shipped
    terms = melting_terms(dec)
    if terms is None or not math.isfinite(terms.lattice_energy_kJ_mol):
        return shipped
    # rounded as the column is, so the shipped weights give the column's value exactly
    return round(float(terms.trend_index(weights)), 4)


def _predict_ln(model: MeltingModel, x: np.ndarray, groups=None) -> np.ndarray:
    """Sum of tree outputs plus baseline, plus the offset if the model has one, for rows of ``x``
    (columns in ``model.features`` order); with ``groups`` (interval group per row), a model's
    ``tree_weights`` scale the trees' part of the rows of the groups it names."""
    n = x.shape[0]
    total = np.full(n, model.baseline, dtype=float)
    rows = np.arange(n)
    for feature, threshold, left, right, missing_left, leaf, value in model.trees:
        node = np.zeros(n, dtype=np.int64)
        # children point forward, so depth <= node count; the loop ends
        for _ in range(len(value)):
            active = ~leaf[node]
            if not active.any():
                break
            f = feature[node]
            v = x[rows, np.where(active, f, 0)]
            go_left = np.where(np.isnan(v), missing_left[node], v <= threshold[node])
            node = np.where(active, np.where(go_left, left[node], right[node]), node)
        total += value[node]
    if groups is not None and model.tree_weights:
        share = dict(model.tree_weights)
        total *= np.array([share.get(g, 1.0) for g in groups], dtype=float)
    if model.offset_position >= 0:
        # NaN where the compound has no trend index: the trees only correct the index
        total += model.offset_scale * x[:, model.offset_position]
    return total


def predict_melting_K(model: MeltingModel, features, groups=None) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Predicted melting point and its conformal interval, in K.

    Parameters
    ----------
    model : MeltingModel
    features : array-like of shape (n_samples, len(MODEL_FEATURES))
        Rows of :func:`model_features`.
    groups : sequence of str, optional
        :func:`interval_group` of each row; a model with a half-width per group
        (Mondrian) uses the row's own, else the pooled one; a
        model with ``tree_weights`` scales the trees' part of the named groups' rows.

    Returns
    -------
    (prediction, low, high) : three ndarrays of shape (n_samples,)
        NaN where the row has no ions at all (every derived feature NaN).
    """
    x_all = np.atleast_2d(np.asarray(features, dtype=float))
    x = x_all[:, model.feature_indices]
    ln_pred = _predict_ln(model, x, groups)
    unusable = np.all(np.isnan(x_all[:, len(_RECORD_FEATURES):]), axis=1)
    ln_pred[unusable] = np.nan
    per_group = dict(model.group_log_halfwidths)
    q = np.full(len(ln_pred), model.interval_log_halfwidth)
    if groups is not None and per_group:
        q = np.array([per_group.get(g, model.interval_log_halfwidth) for g in groups], dtype=float)
    return np.exp(ln_pred), np.exp(ln_pred - q), np.exp(ln_pred + q)


def outside_training_domain(model: MeltingModel, features, substance_class: str | None = None,
                            predicted_K: float = math.nan) -> list[str]:
    """Why one row lies outside the model's training domain (empty when inside).

    Exactly three checks, each named in its reason:

    1. every feature the model uses, against the smallest and largest value
       of that feature among the training rows (``domain.feature_min`` and
       ``feature_max``): a value below the minimum or above the maximum is
       outside, with no tolerance; a missing value (NaN) is not checked;
    2. the substance class, against the classes of the training rows;
    3. the predicted melting point, against the lowest and highest measured
       melting point of the training rows (``domain.target_min_K`` and
       ``target_max_K``, in model files that have them): trees cannot predict
       outside the range they were fitted on, so a prediction at either end
       may be capped.

    >>> doc = {"format": MODEL_FORMAT, "format_version": 1, "model_type": "gradient_boosted_trees",
    ...        "target": "ln_mp_K", "features": ["mp_trend_index"], "baseline": 6.0,
    ...        "trees": [{"feature": [0], "threshold": [0.0], "left": [0], "right": [0], "missing_left": [0],
    ...                   "leaf": [1], "value": [0.0]}],
    ...        "interval": {"log_halfwidth": 0.2}, "domain": {"feature_min": [2.3], "feature_max": [3.4],
    ...        "target_min_K": 200.0, "target_max_K": 3000.0}}
    >>> x = np.full(len(MODEL_FEATURES), np.nan); x[0] = 2.29
    >>> outside_training_domain(model_from_dict(doc), x, None, 150.0)
    ['mp_trend_index = 2.29 below the training minimum 2.3', 'predicted 150 K below the lowest training melting point 200 K']
    """
    x = np.asarray(features, dtype=float)[model.feature_indices]
    reasons = []
    for name, value, lo, hi in zip(model.features, x, model.feature_min, model.feature_max):
        if math.isnan(value):
            continue
        if value < lo:
            reasons.append(f"{name} = {value:.4g} below the training minimum {lo:.4g}")
        elif value > hi:
            reasons.append(f"{name} = {value:.4g} above the training maximum {hi:.4g}")
    if substance_class and model.substance_classes and substance_class not in model.substance_classes:
        reasons.append(f"substance class {substance_class} not in the training set")
    if math.isfinite(predicted_K):
        if predicted_K < model.target_min_K:
            reasons.append(f"predicted {predicted_K:.0f} K below the lowest training melting point {model.target_min_K:.0f} K")
        elif predicted_K > model.target_max_K:
            reasons.append(f"predicted {predicted_K:.0f} K above the highest training melting point {model.target_max_K:.0f} K")
    return reasons


# ------------------------------------------------------- applying to records

def _float(value) -> float:
    try:
        return float(value) if value is not None else math.nan
    except (TypeError, ValueError):
        return math.nan


_BAND_OF_CLASS = {name: (lo, hi) for name, lo, hi, _ in MELTING_CLASS_BANDS}
_DOMAIN_NOTE = "mp model: outside the training domain ({}); treat mp_predicted_K as a guess"
_DISAGREE_NOTE = (
    "mp model: melting_class {index_class} (trend index) disagrees with the model, whose {predicted:.0f} K"
    " falls in {model_class}"
)


def class_disagreement(record: Mapping, predicted_K: float) -> str | None:
    """The note for a row whose ``melting_class`` contradicts the model's predicted temperature, else None.

    The model's class is the band of :data:`scorer.melting.MELTING_CLASS_BANDS` the
    prediction falls in (salt names for salts), so a class and a prediction never
    stand side by side unremarked.

    >>> class_disagreement({"melting_class": "ionic_liquid", "mp_route": "salt"}, 409.0)
    'mp model: melting_class ionic_liquid (trend index) disagrees with the model, whose 409 K falls in low_melting_salt'
    >>> class_disagreement({"melting_class": "ionic_liquid", "mp_route": "salt"}, 300.0) is None
    True
    """
    index_class = record.get("melting_class")
    if not index_class or not math.isfinite(predicted_K):
        return None
    salt = (record.get("mp_route") or ROUTE_OF_CLASS.get(record.get("substance_class") or "")) == "salt"
    model_class = melting_class_for(predicted_K, salt)
    lo, hi = _BAND_OF_CLASS.get(index_class, (math.nan, math.nan))
    if model_class == index_class or lo <= predicted_K < hi:  # a class of its own (a hydrate's) on the same band
        return None
    return _DISAGREE_NOTE.format(index_class=index_class, predicted=predicted_K, model_class=model_class)


def _predictions(records, x: np.ndarray, model: MeltingModel) -> list[ModelPrediction]:
    """One prediction per scored record, from its row of :func:`model_features` in ``x``."""
    if not records:
        return []
    groups = [interval_group(r.get("substance_class")) for r in records]
    pred, low, high = predict_melting_K(model, x, groups)
    out = []
    for record, row, p, lo, hi in zip(records, x, pred, low, high):
        ionic = math.isfinite(p) and record.get("status") != "error" and math.isfinite(_float(record.get("mp_trend_index")))
        if not ionic:
            out.append(ModelPrediction(math.nan, math.nan, math.nan))
            continue
        reasons = outside_training_domain(model, row, record.get("substance_class"), float(p))
        warnings = [_DOMAIN_NOTE.format("; ".join(reasons))] if reasons else []
        disagreement = class_disagreement(record, round(float(p), 1))
        if disagreement:
            warnings.append(disagreement)
        out.append(ModelPrediction(round(float(p), 1), round(float(lo), 1), round(float(hi), 1), tuple(warnings)))
    return out


@dataclass(frozen=True)
class ModelPrediction:
    """A fitted model's answer for one compound: :data:`MODEL_COLUMNS` values, and the
    row's warnings: why it lies outside the training domain, and whether its
    ``melting_class`` disagrees with the prediction (empty when neither)."""

    mp_predicted_K: float
    mp_interval_low_K: float
    mp_interval_high_K: float
    domain_warnings: tuple[str, ...] = ()

    def values(self) -> tuple[float, float, float]:
        """The :data:`MODEL_COLUMNS` values, in their order."""
        return (self.mp_predicted_K, self.mp_interval_low_K, self.mp_interval_high_K)


def predict_for_formulas(model: MeltingModel, formulas) -> list[ModelPrediction]:
    """The model applied to formulas as typed, one :class:`ModelPrediction` each.

    What every engine calls for ``--mp-model``; the engine turns
    ``domain_warnings`` into the row's verdict with
    :func:`scorer.verdict.with_warnings`. Rows the model does not apply to
    (no ions, an error) get NaN.

    Parameters
    ----------
    model : MeltingModel
    formulas : sequence of str or None
        Formula texts (None for an empty cell).

    Returns
    -------
    list of ModelPrediction
    """
    scored = [features_for_formula(f) for f in formulas]
    if not scored:
        return []
    x = np.vstack([x for _, x in scored])
    if model.index_weights:
        column = MODEL_FEATURES.index("mp_trend_index")
        for i, (text, (record, _)) in enumerate(zip(formulas, scored)):
            if record.get("mp_route") == "salt":
                x[i, column] = model_trend_index(_decomposition_of(text), record, model.index_weights)
    return _predictions([r for r, _ in scored], x, model)


def apply_model_to_records(formulas, model: MeltingModel) -> list[dict]:
    """Score formulas and add ``mp_predicted_K``, ``mp_interval_low_K`` and
    ``mp_interval_high_K`` to each record.

    Rows outside the training domain keep their prediction but get status
    ``warning`` and a message saying which feature lies outside
    (:func:`scorer.verdict.with_warnings`); rows without ions get NaN.

    Parameters
    ----------
    formulas : sequence of str or None
        Formula texts.
    model : MeltingModel

    Returns
    -------
    list of dict
        The records of :func:`scorer.score_formula` with the model's columns.

    See Also
    --------
    predict_for_formulas : the predictions alone, as the engines take them.
    """
    records = [dict(score_formula(f)) for f in formulas]
    for record, prediction in zip(records, predict_for_formulas(model, formulas)):
        record.update(zip((c.name for c in MODEL_COLUMNS), prediction.values()))
        if not prediction.domain_warnings:
            continue
        verdict = with_warnings(
            Verdict(record.get("status"), record.get("message") or "", record.get("value_notes") or ""),
            prediction.domain_warnings,
        )
        record["status"], record["message"] = verdict.status, verdict.message
    return records
