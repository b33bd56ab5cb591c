"""Applying a fitted melting-point model: its file layout, its features and its prediction.

``ionicity fit-melting`` (the trainer, :mod:`pipelines.melting_fit`) fits
gradient-boosted trees on :data:`MODEL_FEATURES` and writes them as JSON:
every tree as arrays of plain numbers. :func:`model_from_dict` checks such a
document against the expected layout and refuses anything else;
:func:`predict_melting_K` walks the trees in numpy and adds the split-conformal
interval. No pickle is involved, so a model file cannot run code. Scoring
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
from ionicity.scorer.melting import CAUTION
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
    "model_from_dict",
    "predict_melting_K",
    "outside_training_domain",
    "apply_model_to_records",
    "ModelPrediction",
    "predict_for_formulas",
]

#: the --columns group of MODEL_COLUMNS (added with --mp-model)
GROUP = "melting"

MODEL_COLUMNS: tuple[Column, ...] = (
    Column(
        "mp_predicted_K", "float64", "K",
        "melting point predicted by the model given with --mp-model (ionicity fit-melting); " + CAUTION,
        "gradient-boosted trees on log melting point over ionicity's own columns (MODEL_FEATURES)",
        "the model file's training data; see its metadata",
    ),
    Column(
        "mp_interval_low_K", "float64", "K",
        "lower end of the split-conformal prediction interval (coverage in the model file, 90 % by default)",
        "prediction / exp(q), q the conformal quantile of absolute log residuals on calibration rows",
        "Lei et al., J. Am. Stat. Assoc. 2018, 113, 1094, doi:10.1080/01621459.2017.1307116",
    ),
    Column(
        "mp_interval_high_K", "float64", "K",
        "upper end of the split-conformal prediction interval",
        "prediction * exp(q)",
        "Lei et al., J. Am. Stat. Assoc. 2018, 113, 1094, doi:10.1080/01621459.2017.1307116",
    ),
)


# ------------------------------------------------------- applying a fitted model

# Numeric output columns the regression reads (_RECORD_FEATURES), and counts
# and charges of the ions (_DERIVED_FEATURES, from the decomposition); both
# follow from the formula alone, so a model applies to any formula ionicity reads.
_RECORD_FEATURES = (
    "mp_trend_index",
    "lattice_energy_vbt_kJ_mol",
    "lattice_energy_kapustinskii_kJ_mol",
    "delta_chi_pauling",
    "ionic_character_pauling_pct",
    "mean_chi_pauling",
    "cation_polarising_power_e_per_A2",
    "cation_polarising_power_max_e_per_A2",
    "anion_polarisability_A3",
    "fajans_contact_index",
    "cation_pseudo_noble_gas",
    "hsab_pairing_score",
    "cation_hardness_eV",
    "anion_hardness_eV",
    "molar_mass_g_mol",
)
_DERIVED_FEATURES = (
    "ions_per_formula_unit",
    "max_cation_charge",
    "max_anion_charge",
    "polyatomic_anion_fraction",
    "organic_ion_fraction",
)
MODEL_FEATURES: tuple[str, ...] = _RECORD_FEATURES + _DERIVED_FEATURES

MODEL_FORMAT = "ionicity-melting-model"
MODEL_FORMAT_VERSION = 1
MODEL_TYPES = ("gradient_boosted_trees",)
_TOP_KEYS = frozenset({
    "format", "format_version", "model_type", "target", "features", "baseline", "trees", "interval", "domain",
    "training", "metrics", "caution",
})
_REQUIRED_KEYS = frozenset({"format", "format_version", "model_type", "target", "features", "baseline", "trees", "interval", "domain"})
_TREE_KEYS = frozenset({"feature", "threshold", "left", "right", "missing_left", "leaf", "value"})
_MAX_TREES = 5000
_MAX_NODES = 100_000


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
    derived features come from the decomposition (:func:`derived_ion_features`),
    never from the record's text columns.

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


class ModelFormatError(ValueError):
    """A melting-model document that is not one :func:`model_from_dict` accepts."""


@dataclass(frozen=True)
class MeltingModel:
    """A fitted melting-point model, as plain arrays (see :func:`model_from_dict`)."""

    features: tuple[str, ...]
    baseline: float
    trees: tuple[tuple[np.ndarray, ...], ...]  # (feature, threshold, left, right, missing_left, leaf, value)
    interval_log_halfwidth: float
    interval_coverage: float
    feature_min: np.ndarray
    feature_max: np.ndarray
    substance_classes: tuple[str, ...]
    document: dict

    @property
    def feature_indices(self) -> np.ndarray:
        position = {name: i for i, name in enumerate(MODEL_FEATURES)}
        return np.array([position[name] for name in self.features], dtype=int)


def _need(condition: bool, message: str) -> None:
    if not condition:
        raise ModelFormatError(message)


def _number_list(value, name: str, *, integer: bool = False, length: int | None = None) -> np.ndarray:
    _need(isinstance(value, list), f"'{name}' must be a list of numbers")
    _need(length is None or len(value) == length, f"'{name}' must have {length} entries, not {len(value)}")
    for item in value:
        _need(isinstance(item, (int, float)) and not isinstance(item, bool),
              f"'{name}' must hold only numbers (found {type(item).__name__})")
        _need(math.isfinite(item), f"'{name}' must hold only finite numbers")
        _need(not integer or float(item) == int(item), f"'{name}' must hold only whole numbers")
    return np.array(value, dtype=np.int64 if integer else float)


def _plain_json(value, depth: int = 0) -> bool:
    if depth > 6:
        return False
    if value is None or isinstance(value, (bool, int, float, str)):
        return True
    if isinstance(value, list):
        return all(_plain_json(v, depth + 1) for v in value)
    if isinstance(value, dict):
        return all(isinstance(k, str) and _plain_json(v, depth + 1) for k, v in value.items())
    return False


def model_from_dict(document) -> MeltingModel:
    """Check a parsed model document against the expected schema and build the model.

    Anything but the expected layout is refused with :class:`ModelFormatError`:
    an unknown ``format`` or ``model_type``, unknown keys, a feature ionicity
    does not compute, non-numeric or non-finite arrays, child indices that do
    not point forward inside the tree (so a tree cannot loop). The document is
    plain JSON data; nothing in it is executed.

    Parameters
    ----------
    document : dict
        ``json.load`` of a file written by ``ionicity fit-melting``.

    Returns
    -------
    MeltingModel

    Raises
    ------
    ModelFormatError
        With a message that names the offending part.

    Examples
    --------
    >>> model_from_dict({"format": "something-else"})
    Traceback (most recent call last):
    ...
    ionicity.scorer.melting_model.ModelFormatError: not an ionicity melting model: 'format' is 'something-else', expected 'ionicity-melting-model'
    """
    _need(isinstance(document, dict), "a melting model must be a JSON object")
    fmt = document.get("format")
    _need(fmt == MODEL_FORMAT, f"not an ionicity melting model: 'format' is {fmt!r}, expected {MODEL_FORMAT!r}")
    _need(document.get("format_version") == MODEL_FORMAT_VERSION,
          f"unsupported format_version {document.get('format_version')!r}; this ionicity reads {MODEL_FORMAT_VERSION}")
    model_type = document.get("model_type")
    _need(model_type in MODEL_TYPES, f"model_type {model_type!r} is not accepted; allowed: {', '.join(MODEL_TYPES)}")
    unknown = sorted(set(document) - _TOP_KEYS)
    _need(not unknown, f"unexpected keys in the model: {unknown}")
    missing = sorted(_REQUIRED_KEYS - set(document))
    _need(not missing, f"missing keys in the model: {missing}")
    _need(document["target"] == "ln_mp_K", f"target {document['target']!r} is not accepted; allowed: ln_mp_K")
    features = document["features"]
    _need(isinstance(features, list) and features and all(isinstance(f, str) for f in features),
          "'features' must be a non-empty list of column names")
    strange = [f for f in features if f not in MODEL_FEATURES]
    _need(not strange, f"features ionicity does not compute: {strange}; allowed: {', '.join(MODEL_FEATURES)}")
    _need(len(set(features)) == len(features), "'features' lists a column twice")
    baseline = document["baseline"]
    _need(isinstance(baseline, (int, float)) and not isinstance(baseline, bool) and math.isfinite(baseline),
          "'baseline' must be a finite number")
    trees_in = document["trees"]
    _need(isinstance(trees_in, list) and 0 < len(trees_in) <= _MAX_TREES, f"'trees' must be a list of 1 to {_MAX_TREES} trees")
    trees = []
    n_features = len(features)
    for k, tree in enumerate(trees_in):
        _need(isinstance(tree, dict) and set(tree) == _TREE_KEYS,
              f"tree {k} must have exactly the keys {sorted(_TREE_KEYS)}")
        n = len(tree["value"]) if isinstance(tree["value"], list) else 0
        _need(0 < n <= _MAX_NODES, f"tree {k}: between 1 and {_MAX_NODES} nodes expected")
        feature = _number_list(tree["feature"], f"trees[{k}].feature", integer=True, length=n)
        threshold = _number_list(tree["threshold"], f"trees[{k}].threshold", length=n)
        left = _number_list(tree["left"], f"trees[{k}].left", integer=True, length=n)
        right = _number_list(tree["right"], f"trees[{k}].right", integer=True, length=n)
        missing_left = _number_list(tree["missing_left"], f"trees[{k}].missing_left", integer=True, length=n)
        leaf = _number_list(tree["leaf"], f"trees[{k}].leaf", integer=True, length=n)
        value = _number_list(tree["value"], f"trees[{k}].value", length=n)
        inner = leaf == 0
        nodes = np.arange(n)
        _need(bool(np.all(np.isin(leaf, (0, 1))) and np.all(np.isin(missing_left, (0, 1)))),
              f"tree {k}: 'leaf' and 'missing_left' must be 0 or 1")
        _need(bool(np.all((feature[inner] >= 0) & (feature[inner] < n_features))),
              f"tree {k}: a split names a feature outside 0..{n_features - 1}")
        _need(bool(np.all((left[inner] > nodes[inner]) & (left[inner] < n) & (right[inner] > nodes[inner]) & (right[inner] < n))),
              f"tree {k}: child indices must point forward inside the tree")
        trees.append((feature, threshold, left, right, missing_left.astype(bool), leaf.astype(bool), value))
    interval = document["interval"]
    _need(isinstance(interval, dict), "'interval' must be an object")
    halfwidth = interval.get("log_halfwidth")
    coverage = interval.get("coverage", 0.9)
    _need(isinstance(halfwidth, (int, float)) and not isinstance(halfwidth, bool) and math.isfinite(halfwidth)
          and halfwidth >= 0, "'interval.log_halfwidth' must be a finite number >= 0")
    _need(isinstance(coverage, (int, float)) and 0 < coverage < 1, "'interval.coverage' must lie between 0 and 1")
    domain = document["domain"]
    _need(isinstance(domain, dict), "'domain' must be an object")
    fmin = _number_list(domain.get("feature_min"), "domain.feature_min", length=n_features)
    fmax = _number_list(domain.get("feature_max"), "domain.feature_max", length=n_features)
    classes = domain.get("substance_classes", [])
    _need(isinstance(classes, list) and all(isinstance(c, str) for c in classes),
          "'domain.substance_classes' must be a list of strings")
    for key in ("training", "metrics"):
        _need(_plain_json(document.get(key, {})), f"'{key}' must hold plain JSON values only")
    return MeltingModel(
        features=tuple(features),
        baseline=float(baseline),
        trees=tuple(trees),
        interval_log_halfwidth=float(halfwidth),
        interval_coverage=float(coverage),
        feature_min=fmin,
        feature_max=fmax,
        substance_classes=tuple(classes),
        document=document,
    )


def model_to_dict(model: MeltingModel) -> dict:
    """The JSON document of a model (the inverse of :func:`model_from_dict`)."""
    return model.document


def _predict_ln(model: MeltingModel, x: np.ndarray) -> np.ndarray:
    """Sum of tree outputs plus baseline for rows of ``x`` (columns in ``model.features`` order)."""
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
    return total


def predict_melting_K(model: MeltingModel, features) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Predicted melting point and its conformal interval, in K.

    Parameters
    ----------
    model : MeltingModel
    features : array-like of shape (n_samples, len(MODEL_FEATURES))
        Rows of :func:`model_features`.

    Returns
    -------
    (prediction, low, high) : three ndarrays of shape (n_samples,)
        NaN where the row has no ions at all (every derived feature NaN).
    """
    x_all = np.atleast_2d(np.asarray(features, dtype=float))
    x = x_all[:, model.feature_indices]
    ln_pred = _predict_ln(model, x)
    unusable = np.all(np.isnan(x_all[:, len(_RECORD_FEATURES):]), axis=1)
    ln_pred[unusable] = np.nan
    q = model.interval_log_halfwidth
    return np.exp(ln_pred), np.exp(ln_pred - q), np.exp(ln_pred + q)


def outside_training_domain(model: MeltingModel, features, substance_class: str | None = None) -> list[str]:
    """Why one row lies outside the model's training domain (empty when inside).

    A feature beyond the training range by more than 10 % of that range, or a
    substance class the training set did not hold, counts as outside.
    """
    x = np.asarray(features, dtype=float)[model.feature_indices]
    reasons = []
    span = np.maximum(model.feature_max - model.feature_min, 1e-12)
    for name, value, lo, hi, width in zip(model.features, x, model.feature_min, model.feature_max, span):
        if math.isnan(value):
            continue
        if value < lo - 0.1 * width or value > hi + 0.1 * width:
            reasons.append(f"{name} = {value:.3g} outside the training range {lo:.3g} to {hi:.3g}")
    if substance_class and model.substance_classes and substance_class not in model.substance_classes:
        reasons.append(f"substance class {substance_class} not in the training set")
    return reasons


# ------------------------------------------------------- applying to records

def _float(value) -> float:
    try:
        return float(value) if value is not None else math.nan
    except (TypeError, ValueError):
        return math.nan


_DOMAIN_NOTE = "mp model: outside the training domain ({}); treat mp_predicted_K as a guess"


def _predictions(records, x: np.ndarray, model: MeltingModel) -> list[ModelPrediction]:
    """One prediction per scored record, from its row of :func:`model_features` in ``x``."""
    if not records:
        return []
    pred, low, high = predict_melting_K(model, x)
    out = []
    for record, row, p, lo, hi in zip(records, x, pred, low, high):
        ionic = math.isfinite(p) and record.get("status") != "error" and math.isfinite(_float(record.get("mp_trend_index")))
        if not ionic:
            out.append(ModelPrediction(math.nan, math.nan, math.nan))
            continue
        reasons = outside_training_domain(model, row, record.get("substance_class"))
        out.append(ModelPrediction(
            round(float(p), 1), round(float(lo), 1), round(float(hi), 1),
            (_DOMAIN_NOTE.format("; ".join(reasons)),) if reasons else (),
        ))
    return out


@dataclass(frozen=True)
class ModelPrediction:
    """A fitted model's answer for one compound: :data:`MODEL_COLUMNS` values, and
    why the compound lies outside the model's training domain (empty when inside)."""

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
    return _predictions([r for r, _ in scored], np.vstack([x for _, x in scored]), model)


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
