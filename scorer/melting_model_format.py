"""The layout of a melting-model file: the features a model may name, and the checked reader.

:func:`model_from_dict` checks a parsed JSON document against the expected
layout and refuses anything else (no pickle: a model file cannot run code);
:class:`MeltingModel` holds it as plain arrays. Applying a model is in
:mod:`scorer.melting_model`, which re-exports these names.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

__all__ = [
    "MODEL_FEATURES",
    "MODEL_FORMAT",
    "MODEL_FORMAT_VERSION",
    "INTERVAL_GROUPS",
    "OFFSET_FEATURES",
    "INDEX_WEIGHT_KEYS",
    "MeltingModel",
    "ModelFormatError",
    "model_from_dict",
    "model_to_dict",
]


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
# ion size, shape, flexibility, charge delocalisation and H-bond donors (scorer.melting_ion_features),
# appended last so that files written before them, which name their features, still load; the one list
# of their names (scorer.melting_ion_features computes them in this order)
ION_FEATURES: tuple[str, ...] = (
    "cation_volume_nm3",
    "anion_volume_nm3",
    "cation_anion_volume_ratio",
    "cation_torsions_tau",
    "anion_torsions_tau",
    "cation_symmetry_number",
    "cation_charge_delocalised",
    "anion_charge_delocalised",
    "cation_hbond_donor",
    "cation_carbon_atoms",
)
MODEL_FEATURES: tuple[str, ...] = _RECORD_FEATURES + _DERIVED_FEATURES + ION_FEATURES

MODEL_FORMAT = "ionicity-melting-model"
MODEL_FORMAT_VERSION = 1
MODEL_TYPES = ("gradient_boosted_trees",)
_TOP_KEYS = frozenset({
    "format", "format_version", "model_type", "target", "features", "baseline", "trees", "interval", "domain",
    "training", "metrics", "caution", "offset", "index_weights",
    "tree_weights",
})
_REQUIRED_KEYS = frozenset({"format", "format_version", "model_type", "target", "features", "baseline", "trees", "interval", "domain"})
_TREE_KEYS = frozenset({"feature", "threshold", "left", "right", "missing_left", "leaf", "value"})
_INTERVAL_KEYS = frozenset({"method", "coverage", "log_halfwidth", "group_log_halfwidths", "calibration_rows"})
# optional: ln T = scale * feature + baseline + trees; the trees then fit what the trend index
# (log10 of a temperature, so scale ln 10) leaves over; files without it have no offset
_OFFSET_KEYS = frozenset({"feature", "scale"})
OFFSET_FEATURES = ("mp_trend_index",)
# optional: the trend index's organic weights refitted on the model's own training rows
# (pipelines.melting_fit.fit_index_weights); the model reads mp_trend_index computed with them
# (scorer.melting_model.model_trend_index), so a held-out family never set a weight its index uses.
# Exactly these keys of scorer.melting_index.TREND_WEIGHTS; files without it use the shipped weights.
INDEX_WEIGHT_KEYS = ("flexibility", "delocalised", "protic")
_INDEX_WEIGHT_MAX = 5.0
# optional: per interval group, the share (0 to 1) of the trees' log correction its rows get
# (pipelines.melting_offset.choose_tree_weight); a group not named gets all of it  # ten times the largest fitted so far (0.29): past it the index means nothing
_DOMAIN_KEYS = frozenset({"feature_min", "feature_max", "target_min_K", "target_max_K", "substance_classes"})
# Bounds on what applying a model may cost. fit-melting writes 200 trees of at
# most 13 nodes (max_leaf_nodes=7), depth at most 6: 2,600 nodes. Walking the
# trees costs a few numpy operations per tree level reached, at most half the
# node count in all (a chain of d levels needs 2d + 1 nodes), so the node bound
# is a bound on the time a model adds to every batch.
_MAX_TREES = 1000
_MAX_NODES = 20_000  # in all the trees together: about 8 times what fit-melting writes
_MAX_DEPTH = 32
# a whole number past this cannot be a node index or a count, and past 2**1023 not even a float
_MAX_WHOLE = 2 ** 53

INTERVAL_GROUPS = ("ionic_liquid", "other")


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
    # Mondrian split-conformal: a half-width per interval group (INTERVAL_GROUPS), when the file has them
    group_log_halfwidths: tuple[tuple[str, float], ...] = ()
    target_min_K: float = math.nan
    target_max_K: float = math.nan
    # the offset (key 'offset'): position of its feature in ``features`` (-1: none) and its scale
    offset_position: int = -1
    offset_scale: float = 0.0
    # the key 'index_weights' as sorted (name, value) pairs; empty: the shipped TREND_WEIGHTS
    index_weights: tuple[tuple[str, float], ...] = ()
    # the key 'tree_weights' as sorted (interval group, share) pairs; empty: every group gets all the trees
    tree_weights: tuple[tuple[str, float], ...] = ()

    @property
    def feature_indices(self) -> np.ndarray:
        position = {name: i for i, name in enumerate(MODEL_FEATURES)}
        return np.array([position[name] for name in self.features], dtype=int)


def _need(condition: bool, message: str) -> None:
    if not condition:
        raise ModelFormatError(message)


def _finite(value) -> bool:
    """A JSON number that is finite and fits a float (an integer of 400 digits does not)."""
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return False
    return abs(value) <= _MAX_WHOLE if isinstance(value, int) else math.isfinite(value)


def _number_list(value, name: str, *, integer: bool = False, length: int | None = None) -> np.ndarray:
    _need(isinstance(value, list), f"'{name}' must be a list of numbers")
    _need(length is None or len(value) == length, f"'{name}' must have {length} entries, not {len(value)}")
    for item in value:
        _need(isinstance(item, (int, float)) and not isinstance(item, bool),
              f"'{name}' must hold only numbers (found {type(item).__name__})")
        _need(_finite(item), f"'{name}' must hold only finite numbers of at most {_MAX_WHOLE}")
        _need(not integer or float(item) == int(item), f"'{name}' must hold only whole numbers")
    return np.array(value, dtype=np.int64 if integer else float)


def _depth(left: np.ndarray, right: np.ndarray, inner: np.ndarray) -> int:
    """The longest path below the root, in levels (children point forward, checked before;
    a node two parents share counts by its deeper one)."""
    depth = np.zeros(len(left), dtype=np.int64)
    for i in np.flatnonzero(inner):
        depth[left[i]] = max(depth[left[i]], depth[i] + 1)
        depth[right[i]] = max(depth[right[i]], depth[i] + 1)
    return int(depth.max())


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
    ionicity.scorer.melting_model_format.ModelFormatError: not an ionicity melting model: 'format' is 'something-else', expected 'ionicity-melting-model'
    """
    _need(isinstance(document, dict), "a melting model must be a JSON object")
    fmt = document.get("format")
    _need(fmt == MODEL_FORMAT, f"not an ionicity melting model: 'format' is {fmt!r}, expected {MODEL_FORMAT!r}")
    version = document.get("format_version")
    _need(type(version) is int and version == MODEL_FORMAT_VERSION,
          f"unsupported format_version {version!r}; this ionicity reads {MODEL_FORMAT_VERSION}")
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
    _need(_finite(baseline), "'baseline' must be a finite number")
    trees_in = document["trees"]
    _need(isinstance(trees_in, list) and 0 < len(trees_in) <= _MAX_TREES, f"'trees' must be a list of 1 to {_MAX_TREES} trees")
    trees = []
    n_features = len(features)
    for k, tree in enumerate(trees_in):
        _need(isinstance(tree, dict) and set(tree) == _TREE_KEYS,
              f"tree {k} must have exactly the keys {sorted(_TREE_KEYS)}")
        _need(isinstance(tree["value"], list) and len(tree["value"]) > 0, f"tree {k}: at least one node expected")
    total_nodes = sum(len(tree["value"]) for tree in trees_in)
    _need(total_nodes <= _MAX_NODES, f"the trees hold {total_nodes} nodes in all; the limit is {_MAX_NODES}")
    for k, tree in enumerate(trees_in):
        n = len(tree["value"])
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
        depth = _depth(left, right, inner)
        _need(depth <= _MAX_DEPTH, f"tree {k} is {depth} levels deep; the limit is {_MAX_DEPTH}")
        trees.append((feature, threshold, left, right, missing_left.astype(bool), leaf.astype(bool), value))
    interval = document["interval"]
    _need(isinstance(interval, dict), "'interval' must be an object")
    unknown = sorted(set(interval) - _INTERVAL_KEYS)
    _need(not unknown, f"unexpected keys in 'interval': {unknown}; allowed: {sorted(_INTERVAL_KEYS)}")
    halfwidth = interval.get("log_halfwidth")
    coverage = interval.get("coverage", 0.9)
    _need(_finite(halfwidth) and halfwidth >= 0, "'interval.log_halfwidth' must be a finite number >= 0")
    _need(_finite(coverage) and 0 < coverage < 1, "'interval.coverage' must lie between 0 and 1")
    _need(isinstance(interval.get("method", ""), str), "'interval.method' must be text")
    rows = interval.get("calibration_rows", 0)
    _need(type(rows) is int and 0 <= rows <= _MAX_WHOLE, "'interval.calibration_rows' must be a whole number >= 0")
    domain = document["domain"]
    _need(isinstance(domain, dict), "'domain' must be an object")
    unknown = sorted(set(domain) - _DOMAIN_KEYS)
    _need(not unknown, f"unexpected keys in 'domain': {unknown}; allowed: {sorted(_DOMAIN_KEYS)}")
    fmin = _number_list(domain.get("feature_min"), "domain.feature_min", length=n_features)
    fmax = _number_list(domain.get("feature_max"), "domain.feature_max", length=n_features)
    groups = interval.get("group_log_halfwidths", {})
    _need(isinstance(groups, dict) and all(
        g in INTERVAL_GROUPS and _finite(v) and v >= 0 for g, v in groups.items()),
        f"'interval.group_log_halfwidths' must map {', '.join(INTERVAL_GROUPS)} to finite numbers >= 0")
    target = [domain.get("target_min_K", math.nan), domain.get("target_max_K", math.nan)]
    for key, value in zip(("target_min_K", "target_max_K"), target):
        _need(key not in domain or _finite(value),
              f"'domain.{key}' must be a finite number")
    classes = domain.get("substance_classes", [])
    _need(isinstance(classes, list) and all(isinstance(c, str) for c in classes),
          "'domain.substance_classes' must be a list of strings")
    offset_position, offset_scale = _offset(document.get("offset"), features)
    index_weights = _index_weights(document.get("index_weights"))
    tree_weights = document.get("tree_weights", {})
    _need(isinstance(tree_weights, dict) and all(
        g in INTERVAL_GROUPS and _finite(v) and 0 <= v <= 1 for g, v in tree_weights.items()),
        f"'tree_weights' must map some of {', '.join(INTERVAL_GROUPS)} to numbers from 0 to 1")
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
        group_log_halfwidths=tuple(sorted((g, float(v)) for g, v in groups.items())),
        target_min_K=float(target[0]),
        target_max_K=float(target[1]),
        offset_position=offset_position,
        offset_scale=offset_scale,
        index_weights=index_weights,
        tree_weights=tuple(sorted((g, float(v)) for g, v in tree_weights.items())),
    )


def _offset(offset, features) -> tuple[int, float]:
    """(position in ``features``, scale) of a document's ``offset`` object; (-1, 0.0) without one."""
    if offset is None:
        return -1, 0.0
    _need(isinstance(offset, dict), "'offset' must be an object")
    unknown = sorted(set(offset) - _OFFSET_KEYS)
    _need(not unknown, f"unexpected keys in 'offset': {unknown}; allowed: {sorted(_OFFSET_KEYS)}")
    _need(set(offset) == _OFFSET_KEYS, f"'offset' must have the keys {sorted(_OFFSET_KEYS)}")
    feature, scale = offset["feature"], offset["scale"]
    _need(feature in OFFSET_FEATURES and feature in features,
          f"'offset.feature' must be one of {', '.join(OFFSET_FEATURES)} and listed in 'features'")
    _need(_finite(scale) and 0 < scale <= 10, "'offset.scale' must be a number above 0 and at most 10")
    return features.index(feature), float(scale)


def _index_weights(weights) -> tuple[tuple[str, float], ...]:
    """Sorted (name, value) pairs of a document's ``index_weights`` object; () without one."""
    if weights is None:
        return ()
    _need(isinstance(weights, dict), "'index_weights' must be an object")
    unknown = sorted(set(weights) - set(INDEX_WEIGHT_KEYS))
    _need(not unknown, f"unexpected keys in 'index_weights': {unknown[:5]}; allowed: {list(INDEX_WEIGHT_KEYS)}")
    _need(set(weights) == set(INDEX_WEIGHT_KEYS), f"'index_weights' must have the keys {list(INDEX_WEIGHT_KEYS)}")
    for name, value in weights.items():
        _need(_finite(value) and 0 <= value <= _INDEX_WEIGHT_MAX,
              f"'index_weights.{name}' must be a number from 0 to {_INDEX_WEIGHT_MAX:g}")
    return tuple(sorted((name, float(value)) for name, value in weights.items()))


def model_to_dict(model: MeltingModel) -> dict:
    """The JSON document of a model (the inverse of :func:`model_from_dict`)."""
    return model.document
