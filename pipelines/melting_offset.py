"""The regression's offset: the trend index's organic weights, refitted on a model's own training rows,
and how far the trees may move ionic liquids off the index.

The regression reads ``mp_trend_index`` as a feature and as its offset
(:class:`pipelines.melting_regressor.IndexOffsetRegressor`). Three of the index's
weights (``flexibility``, ``delocalised``, ``protic``:
:data:`scorer.melting_model_format.INDEX_WEIGHT_KEYS`) are fitted in
:data:`scorer.melting_index.TREND_WEIGHTS` on the calibration rows of
``datasets/melting/ionic_liquids.csv``, which belong to the cation families
that cross-validation holds out. So ``fit-melting`` refits them on the rows
each model is fitted on (:func:`fit_index_weights`: the same Nelder-Mead as
:func:`pipelines.melting_weights.fit_organic_weights`, on those rows instead),
rebuilds the index column with them (:func:`with_index_weights`) and writes
them into the model file (key ``index_weights``), where
:func:`scorer.melting_model.model_trend_index` reads them back at prediction.
Inside a cross-validation fold the held-out family never sets a weight.

Only the salt route's index depends on these weights, and only through the
:class:`scorer.melting.MeltingTerms` of a compound, so the column is rebuilt
from the cached terms in milliseconds: nothing is scored again.

The trees fit what the index leaves over. Across cation families their
correction does not always carry over: held out by cation family (chemicals
1.5.2 open set plus ``ionic_liquids.csv``, 61 organic salts, seed 0), the index
with per-fold weights alone scored 59.5 K on the ionic liquids against 67.4 K
for index plus trees. :func:`choose_tree_weight` picks, by an inner grouped
cross-validation on the rows a model is fitted on (never the held-out fold),
the share of the trees' log correction the ``ionic_liquid`` group gets; the
model file stores it (``tree_weights``). :func:`fit_offset_model` does both
steps and fits the regressor.
"""
from __future__ import annotations

import math
import zlib

import numpy as np

from ionicity.scorer import melting
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose
from ionicity.scorer.melting_model import MODEL_FEATURES
from ionicity.scorer.melting_model_format import INDEX_WEIGHT_KEYS

__all__ = ["stable_group_splits", "index_terms", "organic_rows_of", "fit_index_weights", "with_index_weights", "MIN_ORGANIC_ROWS",
           "TREE_WEIGHT_CANDIDATES", "inner_predictions", "choose_tree_weight", "inner_log_residuals",
           "fit_offset_model"]

# fewer organic rows than this and the three weights are not refitted: the shipped ones stay
# (three parameters by Nelder-Mead need a few rows each; common practice)
MIN_ORGANIC_ROWS = 8
_COLUMN = MODEL_FEATURES.index("mp_trend_index")
# shares of the trees' log correction tried for the ionic-liquid group, fixed beforehand (1: the full
# model, 0: the index alone); the first of equal scores wins, so ties keep the fuller correction
TREE_WEIGHT_CANDIDATES = (1.0, 0.75, 0.5, 0.25, 0.0)
INNER_FOLDS = 4


def stable_group_splits(groups, n_splits: int, seed: int = 0) -> list[tuple[np.ndarray, np.ndarray]]:
    """Grouped K-fold splits whose fold of a group depends on that group's name and ``seed`` alone.

    A group goes to fold ``crc32(f"{seed}:{name}") mod n_splits``. scikit-learn's
    ``GroupKFold`` balances folds by group size, so one row more or less in any
    group, or one new group, can move every other group to another fold and
    change which families are held out together (the held-out ionic-liquid
    figure moved by 5 K for one inorganic row, DEVELOPERS.md "Stable folds").
    Here adding rows or groups never moves an existing group; ``seed``
    draws another assignment, for repeated cross-validation. Folds are not
    balanced by rows. Empty folds are left out; when the names fall into
    fewer than two folds, the groups are dealt round-robin in the order of
    their hashes instead.

    Returns
    -------
    list of (train_rows, test_rows)
        Index arrays, one pair per non-empty fold, in fold order.

    >>> splits = stable_group_splits(["a", "a", "b", "c", "d", "e"], 3)
    >>> sorted(int(i) for _, test in splits for i in test)
    [0, 1, 2, 3, 4, 5]
    >>> def held_out_together(groups):
    ...     return [set(np.asarray(groups)[test].tolist()) for _, test in stable_group_splits(groups, 3)]
    >>> before = held_out_together(["a", "a", "b", "c", "d", "e"])
    >>> after = held_out_together(["a", "b", "c", "d", "e", "f", "a", "b"])
    >>> all(any(old <= new for new in after) for old in before)
    True
    """
    groups = np.asarray(groups)
    names = sorted(set(groups.tolist()), key=str)
    if n_splits < 2 or len(names) < 2:
        raise ValueError(f"grouped splits need at least 2 folds and 2 groups, not {n_splits} and {len(names)}")
    code = {name: zlib.crc32(f"{seed}:{name}".encode("utf-8")) for name in names}
    fold_of = {name: code[name] % n_splits for name in names}
    if len(set(fold_of.values())) < 2:
        fold_of = {name: i % n_splits for i, name in enumerate(sorted(names, key=lambda n: (code[n], str(n))))}
    row_fold = np.array([fold_of[g] for g in groups.tolist()])
    everything = np.arange(len(groups))
    return [(everything[row_fold != k], everything[row_fold == k]) for k in range(n_splits) if np.any(row_fold == k)]


def index_terms(rows, records) -> list:
    """The :class:`scorer.melting.MeltingTerms` behind each training row's salt index, or None.

    None where the row's index does not come from the salt route (``mp_route``)
    or has no lattice energy: the organic weights cannot move it.
    """
    out = []
    for row, record in zip(rows, records):
        terms = None
        if record.get("mp_route") == "salt":
            terms = melting.melting_terms(decompose(parse_formula(row["formula_normalized"])))
            if terms is not None and not math.isfinite(terms.lattice_energy_kJ_mol):
                terms = None
        out.append(terms)
    return out


def organic_rows_of(terms) -> np.ndarray:
    """Indices of the rows whose index the organic weights move (flexibility entropy,
    delocalised charge or a protic cation present)."""
    return np.array([i for i, t in enumerate(terms) if t is not None and (
        t.flexibility_entropy_J_mol_K or t.chain_packing_entropy_J_mol_K or t.delocalised_fraction
        or t.protic_fraction)], dtype=int)


def fit_index_weights(terms, y_K, fit_rows, progress=None) -> dict[str, float]:
    """The organic weights fitted on the rows ``fit_rows`` (indices) only.

    Least squares on log10 T_m by Nelder-Mead, inorganic weights held
    (:func:`pipelines.melting_weights.fit_organic_weights`), over the rows of
    ``fit_rows`` that the weights move; with fewer than :data:`MIN_ORGANIC_ROWS`
    such rows the shipped weights are returned.

    Parameters
    ----------
    terms : list of MeltingTerms or None
        :func:`index_terms` of every row.
    y_K : ndarray of shape (n_rows,)
        Measured melting points [K].
    fit_rows : array-like of int
        The rows the model is fitted on (never the held-out or calibration rows).
    progress : callable, optional

    Returns
    -------
    dict
        One value per name of :data:`scorer.melting_model_format.INDEX_WEIGHT_KEYS`.
    """
    from ionicity.pipelines import melting_weights  # needs scipy (the melting extra), checked by the callers

    chosen = np.intersect1d(organic_rows_of(terms), np.asarray(fit_rows, dtype=int))
    if len(chosen) < MIN_ORGANIC_ROWS:
        weights = {k: float(melting.TREND_WEIGHTS[k]) for k in INDEX_WEIGHT_KEYS}
        how = f"shipped (only {len(chosen)} organic rows to fit on)"
    else:
        weights = melting_weights.fit_organic_weights(
            [("calibration", terms[i], float(y_K[i]), "") for i in chosen.tolist()])
        weights = {k: round(float(weights[k]), 4) for k in INDEX_WEIGHT_KEYS}
        how = f"fitted on {len(chosen)} organic rows"
    if progress:
        progress(f"  index weights {how}: " + ", ".join(f"{k} {v:.3f}" for k, v in weights.items()))
    return weights


def with_index_weights(x: np.ndarray, terms, weights) -> np.ndarray:
    """A copy of the feature matrix ``x`` (columns :data:`MODEL_FEATURES`) whose ``mp_trend_index``
    is computed with ``weights`` wherever the salt route gave it (:func:`index_terms`)."""
    out = np.array(x, dtype=float, copy=True)
    for i, t in enumerate(terms):
        if t is not None:
            out[i, _COLUMN] = round(float(t.trend_index(weights)), 4)
    return out


def _index_matrix(x, y_K, fit_rows, terms, progress=None):
    """(weights or None, x with the index rebuilt from weights fitted on ``fit_rows``)."""
    if terms is None:
        return None, x
    weights = fit_index_weights(terms, y_K, fit_rows, progress)
    return weights, with_index_weights(x, terms, weights)


def inner_predictions(x, y_K, fit_rows, labels, groups, terms, fit, *,
                      folds: int = INNER_FOLDS, seed: int = 0) -> tuple[np.ndarray, np.ndarray]:
    """Out-of-fold log predictions of an inner grouped cross-validation on the rows ``fit_rows``.

    The rows ``fit_rows`` are split by ``groups`` into ``folds``
    (:func:`stable_group_splits` with ``seed``); in each inner fold the index weights (when ``terms`` is
    given) and the trees are fitted on the inner training rows and predict the
    inner held-out rows. Returns two arrays aligned with ``fit_rows``: ln of
    the index's temperature (ln 10 times ``mp_trend_index``) and the trees'
    log correction, so that ``ln T = ln_index + share * ln_trees``; NaN where
    a row was not predicted (fewer than two groups: no split).
    """
    fit_rows = np.asarray(fit_rows, dtype=int)
    inner_groups = np.asarray(groups)[fit_rows]
    ln_index = np.full(len(fit_rows), np.nan)
    ln_trees = np.full(len(fit_rows), np.nan)
    n_splits = min(folds, len(set(inner_groups.tolist())))
    if n_splits < 2:
        return ln_index, ln_trees
    for train, test in stable_group_splits(inner_groups, n_splits, seed):
        _, xw = _index_matrix(x, y_K, fit_rows[train], terms)
        regressor, used = fit(xw[fit_rows[train]], y_K[fit_rows[train]], np.asarray(labels)[fit_rows[train]])
        rows = fit_rows[test]
        ln_index[test] = math.log(10.0) * xw[rows, used[regressor.column]]
        ln_trees[test] = np.log(regressor.pipe.predict(xw[rows][:, used]))
    return ln_index, ln_trees


def choose_tree_weight(x, y_K, fit_rows, labels, groups, terms, fit, *, group: str = "ionic_liquid",
                       folds: int = INNER_FOLDS, inner=None, seed: int = 0) -> tuple[float, dict]:
    """The share of the trees' correction for ``group``'s rows, by inner grouped cross-validation.

    Only the rows ``fit_rows`` take part (:func:`inner_predictions`, or
    ``inner``, its result computed already); the inner held-out rows of
    ``group`` are predicted with every share of :data:`TREE_WEIGHT_CANDIDATES`.
    The share with the lowest mean absolute error [K] wins.

    Parameters
    ----------
    x : ndarray of shape (n_rows, len(MODEL_FEATURES))
    y_K : ndarray of shape (n_rows,)
    fit_rows : ndarray of int
        The rows the model will be fitted on.
    labels, groups : ndarray of shape (n_rows,)
        Interval group and cross-validation group of every row.
    terms : list or None
        :func:`index_terms` (None: the index as it comes in ``x``).
    fit : callable
        ``fit(x, y_K, labels) -> (IndexOffsetRegressor, used columns)``
        (:func:`pipelines.melting_regressor._fit_pipeline`).

    Returns
    -------
    (float, dict)
        The share, and the inner MAE [K] of every candidate (empty when the
        rows hold too few groups or no row of ``group``: the share is then 1).
    """
    fit_rows = np.asarray(fit_rows, dtype=int)
    inner_groups = np.asarray(groups)[fit_rows]
    mine = np.asarray(labels)[fit_rows] == group
    n_groups = len(set(inner_groups[mine].tolist()))
    if n_groups < 2:
        return 1.0, {}
    ln_index, ln_trees = inner if inner is not None else inner_predictions(
        x, y_K, fit_rows, labels, groups, terms, fit, folds=folds, seed=seed)
    scored = mine & np.isfinite(ln_trees)
    truth = y_K[fit_rows[scored]]
    errors = {share: round(float(np.mean(np.abs(np.exp(ln_index[scored] + share * ln_trees[scored]) - truth))), 2)
              for share in TREE_WEIGHT_CANDIDATES}
    best = min(TREE_WEIGHT_CANDIDATES, key=lambda share: errors[share])
    return best, errors


def inner_log_residuals(y_K, fit_rows, labels, inner, tree_weights) -> np.ndarray:
    """ln(measured) minus ln(inner out-of-fold prediction) of every row of ``fit_rows`` (NaN where not predicted).

    ``inner`` is :func:`inner_predictions`; each row's trees' correction is
    scaled by the share its interval group gets in ``tree_weights`` (1 where
    not named), as :meth:`IndexOffsetRegressor.predict` does. These are the
    residuals of rows predicted by models that never saw their group: what
    the interval half-widths are set from (cross-validation residuals).
    """
    ln_index, ln_trees = inner
    fit_rows = np.asarray(fit_rows, dtype=int)
    share = np.array([tree_weights.get(g, 1.0) for g in np.asarray(labels)[fit_rows].tolist()], dtype=float)
    return np.log(y_K[fit_rows]) - (ln_index + share * ln_trees)


def fit_offset_model(x, y_K, fit_rows, labels, groups, terms, fit, progress=None, seed: int = 0):
    """Index weights, tree share and regressor, each fitted on the rows ``fit_rows`` only.

    Returns
    -------
    (regressor, used, index_weights, x_rebuilt)
        ``regressor`` an :class:`pipelines.melting_regressor.IndexOffsetRegressor`
        whose ``tree_weights`` name the ``ionic_liquid`` share
        (:func:`choose_tree_weight`; skipped when ``groups`` is None) and
        whose ``inner_log_residuals`` (:func:`inner_log_residuals`, aligned
        with ``fit_rows``; None when ``groups`` is None) are the inner
        cross-validation's residuals at that share; ``index_weights`` None
        when ``terms`` is None; ``x_rebuilt`` is ``x`` with the index rebuilt
        from those weights (every row, so the caller predicts held-out rows
        with it).
    """
    fit_rows = np.asarray(fit_rows, dtype=int)
    weights, xw = _index_matrix(x, y_K, fit_rows, terms, progress)
    regressor, used = fit(xw[fit_rows], y_K[fit_rows], np.asarray(labels)[fit_rows])
    regressor.inner_log_residuals = None
    if groups is not None:
        inner = inner_predictions(x, y_K, fit_rows, labels, groups, terms, fit, seed=seed)
        share, errors = choose_tree_weight(x, y_K, fit_rows, labels, groups, terms, fit, inner=inner)
        regressor.tree_weights = {"ionic_liquid": share}
        regressor.inner_log_residuals = inner_log_residuals(y_K, fit_rows, labels, inner, regressor.tree_weights)
        if progress and errors:
            progress("  ionic-liquid share of the trees' correction, inner MAE by share: "
                     + ", ".join(f"{k:g}: {v:.1f} K" for k, v in errors.items()) + f"; chosen {share:g}")
    return regressor, used, weights, xw
