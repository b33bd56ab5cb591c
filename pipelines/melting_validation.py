"""Validation of the melting regression: grouped cross-validation, interval half-widths, metrics.

:func:`grouped_cross_validation` holds out whole groups (anion family, cation
element or cation family) and fits everything a model carries inside each
fold: the index's organic weights and the ionic liquids' tree share
(:func:`pipelines.melting_offset.fit_offset_model`), the trees
(:func:`pipelines.melting_regressor._fit_pipeline`) and the interval
half-widths (from the inner cross-validation's residuals), on the fold's
training rows only. :func:`trend_index_report`
checks the trend index alone. :mod:`pipelines.melting_fit` re-exports these
names; ``python -m ionicity.pipelines.melting_cv`` runs them on a saved
training table. scikit-learn and scipy (the ``melting`` extra) are imported
where they are used.
"""
from __future__ import annotations

import math

import numpy as np

from ionicity.pipelines.melting_offset import fit_offset_model, stable_group_splits
from ionicity.pipelines.melting_regressor import _fit_pipeline
from ionicity.scorer import melting_model

__all__ = ["grouped_cross_validation", "trend_index_report"]


def _float(value) -> float:
    try:
        return float(value) if value is not None else math.nan
    except (TypeError, ValueError):
        return math.nan


def _conformal_halfwidth(residuals: np.ndarray, coverage: float) -> float:
    """Split-conformal quantile: the ceil((n+1) * coverage)-th smallest absolute residual."""
    r = np.sort(np.abs(residuals))
    n = len(r)
    if n == 0:
        return math.inf
    k = math.ceil((n + 1) * coverage)
    return float(r[min(k, n) - 1]) if k <= n else float(r[-1])


def _metrics(y_true: np.ndarray, y_pred: np.ndarray) -> dict:
    from scipy.stats import spearmanr  # optional extra (melting), as above

    ok = np.isfinite(y_pred) & np.isfinite(y_true)
    t, p = y_true[ok], y_pred[ok]
    if len(t) < 3:
        return {"n": int(len(t))}
    resid = t - p
    ss_tot = float(np.sum((t - t.mean()) ** 2))
    rho = spearmanr(t, p).statistic if np.ptp(p) > 0 else math.nan
    return {
        "n": int(len(t)),
        "mae_K": round(float(np.mean(np.abs(resid))), 1),
        "rmse_K": round(float(np.sqrt(np.mean(resid ** 2))), 1),
        "r2": round(1.0 - float(np.sum(resid ** 2)) / ss_tot, 3) if ss_tot > 0 else math.nan,
        "spearman_rho": round(float(rho), 3) if rho == rho else None,
    }


def _split_calibration(n: int, fraction: float, rng: np.random.Generator, groups=None) -> tuple[np.ndarray, np.ndarray]:
    """Indices of the proper training part and of the calibration part (about ``fraction`` of n).

    With ``groups``, whole groups go to the calibration part, so its residuals are
    those of groups the proper part never saw: the situation of a held-out cation
    family, where a random split would give intervals too narrow (split-conformal
    coverage assumes the new row is exchangeable with the calibration rows).
    """
    if groups is None:
        order = rng.permutation(n)
        n_cal = max(1, int(round(n * fraction)))
        return np.sort(order[n_cal:]), np.sort(order[:n_cal])
    groups = np.asarray(groups)
    target = max(1, int(round(n * fraction)))
    calib = np.zeros(n, dtype=bool)
    for g in rng.permutation(np.unique(groups)):
        if calib.sum() >= target:
            break
        calib |= groups == g
    if calib.all():  # one group only: nothing left to fit on
        return _split_calibration(n, fraction, rng)
    return np.flatnonzero(~calib), np.flatnonzero(calib)


# interval groups whose half-width is a quantile over held-out families, not over rows
# (:func:`_family_conformal_halfwidth`): the ionic liquids, whose residuals come in a handful of
# cation families (7 in the open set, one of them, the quaternary ammoniums, over half the rows)
FAMILY_LEVEL_GROUPS = ("ionic_liquid",)


def _family_conformal_halfwidth(residuals: np.ndarray, families: np.ndarray, coverage: float) -> float:
    """Split-conformal quantile over families: the ceil((K+1) * coverage)-th smallest of the K families'
    own quantiles (:func:`_conformal_halfwidth` of each family's residuals), the largest when that rank
    exceeds K.

    A held-out row comes with its whole family, so the unit that is exchangeable
    with the calibration data is a family, not a row: rows of one family share
    a bias (Dunn, Wasserman & Ramdas, Distribution-free prediction sets for
    two-layer hierarchical models, J. Am. Stat. Assoc. 2023, 118, 2491; their
    double-conformal set takes a within-group and then an across-group
    quantile). If the families are exchangeable, a new family's own quantile
    lies at or below this one with probability at least ceil((K+1) c)/(K+1)
    (at least K/(K+1) when the rank is capped, i.e. below 9 families for
    c = 0.9), and then at least ``coverage`` of its rows are covered.

    Parameters
    ----------
    residuals : ndarray
        Log residuals [ln K], each from a model that never saw its family.
    families : ndarray
        The family (cross-validation group) of each residual.
    coverage : float
        Target coverage, 0 to 1.

    Returns
    -------
    float
        The half-width [ln K]; ``inf`` without residuals.

    Examples
    --------
    Three families; their own 90 % quantiles are 0.3, 0.2 and 0.5 (each the
    largest of fewer than 9 values), and ceil(4 * 0.9) = 4 > 3 gives the largest:

    >>> float(_family_conformal_halfwidth(np.array([0.1, -0.3, 0.2, 0.05, -0.5]),
    ...                                   np.array(["a", "a", "b", "b", "c"]), 0.9))
    0.5
    """
    families = np.asarray(families)
    if len(residuals) == 0:
        return math.inf
    per_family = np.array([_conformal_halfwidth(residuals[families == f], coverage) for f in np.unique(families)])
    return _conformal_halfwidth(per_family, coverage)


def _group_halfwidths(log_residuals: np.ndarray, labels: np.ndarray, coverage: float,
                      families=None) -> tuple[float, dict]:
    """Pooled and per-group (Mondrian) split-conformal half-widths; a group with fewer
    than 10 calibration rows takes the pooled one.

    With ``families`` (the cross-validation group of each residual), the groups
    of :data:`FAMILY_LEVEL_GROUPS` take the quantile over families
    (:func:`_family_conformal_halfwidth`) instead of the one over rows.
    """
    pooled = _conformal_halfwidth(log_residuals, coverage)
    per_group = {}
    for g in melting_model.INTERVAL_GROUPS:
        mask = labels == g
        mine = log_residuals[mask]
        if len(mine) < 10:
            per_group[g] = pooled
        elif families is not None and g in FAMILY_LEVEL_GROUPS:
            per_group[g] = _family_conformal_halfwidth(mine, np.asarray(families)[mask], coverage)
        else:
            per_group[g] = _conformal_halfwidth(mine, coverage)
    return pooled, per_group


def grouped_cross_validation(x, y_K, groups, lattice_energy, *, folds: int = 5, coverage: float = 0.9,
                             calibration_fraction: float = 0.25, seed: int = 0, interval_groups=None,
                             progress=None, features_for_fold=None, index_terms=None,
                             choose_tree_share: bool = True) -> dict:
    """Grouped K-fold cross-validation of the model and the two baselines, with interval coverage.

    In every fold the model is fitted on all the fold's training rows, and the
    interval half-widths (one per interval group; for the groups of
    :data:`FAMILY_LEVEL_GROUPS` a quantile over the inner held-out groups,
    :func:`_family_conformal_halfwidth`) come from the absolute log
    residuals of the inner grouped cross-validation that chooses the ionic
    liquids' tree share (:func:`pipelines.melting_offset.fit_offset_model`):
    each of those rows was predicted by a model that never saw its group, as
    a held-out row will be (cross-validation residuals, Barber, Candes, Ramdas
    & Tibshirani, Ann. Statist. 2021, 49, 486, doi:10.1214/20-AOS1965, whose
    CV+ form guarantees at least 1 - 2 alpha; this simpler form, the quantile
    of the residuals, has no finite-sample guarantee, so coverage is counted on
    the held-out fold). With ``choose_tree_share=False`` there is no inner
    cross-validation and the training rows are split once more, by whole
    groups: the model is fitted on one part and its residuals on the other
    (the calibration part, ``calibration_fraction``) set the half-widths
    (split conformal).

    Parameters
    ----------
    x : ndarray of shape (n_samples, n_features)
    y_K : ndarray of shape (n_samples,)
        Melting points in K.
    groups : array-like of shape (n_samples,)
        Group label per row; rows of one group never straddle a split.
    lattice_energy : ndarray of shape (n_samples,)
        The single feature of the linear baseline [kJ/mol].
    folds : int, default=5
        Folds of :func:`pipelines.melting_offset.stable_group_splits`: a
        group's fold depends on its name and ``seed`` only, so a row added to
        one group never moves another group (fewer folds when there are fewer
        groups, or when a fold draws no group).
    coverage : float, default=0.9
        Target coverage of the intervals.
    calibration_fraction : float, default=0.25
        Share of the training rows held back for the half-widths when
        ``choose_tree_share`` is False (unused otherwise).
    seed : int, default=0
        Draws the fold of every group (:func:`stable_group_splits`) and seeds
        the trees; another seed is another repetition of the cross-validation.
    interval_groups : array-like of shape (n_samples,), optional
        :func:`scorer.melting_model.interval_group` per row: the intervals are
        Mondrian (a half-width per group) and coverage is counted per group.
    progress : callable, optional
        Hears about every fold.
    features_for_fold : callable, optional
        Called with the set of group labels a fold holds out; returns the
        feature matrix (same rows and columns as ``x``) to fit and predict that
        fold with, for measurements that refit part of the features without
        the held-out groups (``python -m ionicity.pipelines.melting_cv
        --refit-organic-weights``).
    index_terms : list, optional
        :func:`pipelines.melting_offset.index_terms` of every row: each
        fold then refits the trend index's organic weights on the rows its
        trees are fitted on (never the held-out fold)
        and rebuilds ``mp_trend_index`` with them, as :func:`fit_melting_model`
        does for the model file.
    choose_tree_share : bool, default=True
        Each fold picks the ionic liquids' share of the trees' correction by
        an inner grouped cross-validation on its fitted rows
        (:func:`pipelines.melting_offset.choose_tree_weight`), as
        :func:`fit_melting_model` does, and sets the half-widths from that
        inner cross-validation's residuals.

    Returns
    -------
    dict
        ``model``, ``baseline_mean``, ``baseline_lattice_energy``: MAE, RMSE,
        R^2, Spearman rho over the out-of-fold predictions;
        ``interval_coverage`` and ``interval_mean_width_K``, overall and
        ``per_group`` (coverage, width, rows, and the model's figures on the
        group's held-out rows); ``folds``; ``oof_predictions_K`` (list).
    """
    # optional extra (melting): imported where used, so that without it fit-melting
    # ends with an install hint (require_extra), not a traceback
    from sklearn.linear_model import LinearRegression

    groups = np.asarray(groups)
    n_groups = len(set(groups.tolist()))
    splits = min(folds, n_groups)
    if splits < 2:
        raise ValueError(f"grouped cross-validation needs at least 2 groups, found {n_groups}")
    say = progress or (lambda text: None)
    labels = np.asarray(interval_groups if interval_groups is not None else ["other"] * len(y_K))
    rng = np.random.default_rng(seed)
    oof = np.full(len(y_K), np.nan)
    oof_mean = np.full(len(y_K), np.nan)
    oof_lin = np.full(len(y_K), np.nan)
    inside = np.zeros(len(y_K), dtype=bool)
    width = np.full(len(y_K), np.nan)
    split_rows = stable_group_splits(groups, splits, seed)
    for fold, (train, test) in enumerate(split_rows):
        say(f"  fold {fold + 1}/{len(split_rows)}: fitting on {len(train)} rows, holding out {len(test)}")
        xf = x if features_for_fold is None else features_for_fold(set(groups[test].tolist()))
        fit = lambda xs, ys, ls: _fit_pipeline(xs, ys, seed, ls)  # noqa: E731
        if choose_tree_share:
            # every training row fits the model; the half-widths come from the residuals of the inner
            # grouped cross-validation that chose the tree share (rows predicted without their group)
            pipe, used, _, xf = fit_offset_model(xf, y_K, train, labels, groups, index_terms, fit, say, seed=seed)
            residuals, calib_labels, calib_families = pipe.inner_log_residuals, labels[train], groups[train]
        else:
            proper, calib = _split_calibration(len(train), calibration_fraction, rng, groups[train])
            proper, calib = train[proper], train[calib]
            pipe, used, _, xf = fit_offset_model(xf, y_K, proper, labels, None, index_terms, fit, say)
            residuals = np.log(y_K[calib]) - np.log(pipe.predict(xf[calib][:, used], labels[calib]))
            calib_labels, calib_families = labels[calib], groups[calib]
        ok = np.isfinite(residuals)
        _, per_group = _group_halfwidths(residuals[ok], calib_labels[ok], coverage, calib_families[ok])
        q = np.array([per_group.get(g, per_group["other"]) for g in labels[test]])
        pred = pipe.predict(xf[test][:, used], labels[test])
        oof[test] = pred
        inside[test] = np.abs(np.log(y_K[test]) - np.log(pred)) <= q
        width[test] = pred * (np.exp(q) - np.exp(-q))
        oof_mean[test] = float(np.mean(y_K[train]))
        ok = np.isfinite(lattice_energy[train])
        line = LinearRegression().fit(lattice_energy[train][ok].reshape(-1, 1), y_K[train][ok])
        lat = lattice_energy[test]
        oof_lin[test] = np.where(np.isfinite(lat), line.predict(np.nan_to_num(lat).reshape(-1, 1)), np.mean(y_K[train]))
    return {
        "folds": len(split_rows),
        "groups": n_groups,
        "model": _metrics(y_K, oof),
        "baseline_mean": _metrics(y_K, oof_mean),
        "baseline_lattice_energy": _metrics(y_K, oof_lin),
        "interval_coverage": round(float(np.mean(inside)), 3),
        "interval_target": coverage,
        "interval_mean_width_K": round(float(np.nanmean(width)), 1),
        "per_group": {
            g: {"rows": int(np.sum(labels == g)),
                "interval_coverage": round(float(np.mean(inside[labels == g])), 3),
                "interval_mean_width_K": round(float(np.nanmean(width[labels == g])), 1),
                "model": _metrics(y_K[labels == g], oof[labels == g])}
            for g in melting_model.INTERVAL_GROUPS if np.any(labels == g)
        },
        "ionic_liquid_by_held_out_group": _by_group(y_K, oof, groups, labels == "ionic_liquid"),
        "oof_predictions_K": [round(float(v), 2) for v in oof],
    }


def _by_group(y_K, oof, groups, mask) -> dict:
    """MAE [K] and rows of the masked rows per cross-validation group (each one held out whole)."""
    out = {}
    for g in sorted(set(groups[mask].tolist())):
        mine = mask & (groups == g)
        out[str(g)] = {"rows": int(mine.sum()), "mae_K": round(float(np.mean(np.abs(y_K[mine] - oof[mine]))), 1)}
    return out


def trend_index_report(rows, records) -> dict:
    """Spearman rho of ``mp_trend_index`` against measured melting points, overall and per anion family."""
    from scipy.stats import spearmanr  # optional extra (melting), as above

    index = np.array([_float(r.get("mp_trend_index")) for r in records])
    y = np.array([row["mp_K"] for row in rows])
    ok = np.isfinite(index)
    out = {"overall": {"n": int(ok.sum()), "spearman_rho": round(float(spearmanr(index[ok], y[ok]).statistic), 3)}}
    families: dict[str, list[int]] = {}
    for i, row in enumerate(rows):
        if ok[i]:
            families.setdefault(row["anion_family"], []).append(i)
    out["per_anion_family"] = {}
    for family, idx in sorted(families.items(), key=lambda kv: -len(kv[1])):
        entry = {"n": len(idx)}
        if len(idx) >= 5 and np.ptp(index[idx]) > 0:
            entry["spearman_rho"] = round(float(spearmanr(index[idx], y[idx]).statistic), 3)
        out["per_anion_family"][family] = entry
    return out
