"""The melting regression itself: the scikit-learn pipeline, its sample weights and the index offset.

:func:`make_melting_pipeline` builds the estimator (histogram gradient
boosting on log melting point); :class:`IndexOffsetRegressor` wraps a fitted
one so that its trees correct ``10**mp_trend_index`` rather than predict the
temperature from nothing; :func:`_fit_pipeline` fits it on the columns that
hold values. Cross-validation lives in :mod:`pipelines.melting_validation`,
the offset's weights in :mod:`pipelines.melting_offset`, the command in
:mod:`pipelines.melting_fit` (which re-exports these names).
scikit-learn (the ``melting`` extra) is imported where it is used, so the
module imports without it.
"""
from __future__ import annotations

import math

import numpy as np

from ionicity.scorer import melting_model

__all__ = ["make_melting_pipeline", "balanced_weights", "OFFSET_FEATURE", "OFFSET_SCALE", "IndexOffsetRegressor"]


def make_melting_pipeline(seed: int = 0, features=None):
    """The regression: gradient-boosted trees on ln(melting point), as a scikit-learn pipeline.

    ``HistGradientBoostingRegressor`` takes NaN features as they come (an ion
    without a radius, a salt without an HSAB pairing), so no imputation step
    is needed; the target is fitted on a log scale because errors grow with
    the melting point. The hyperparameters were picked among four candidates
    by their grouped cross-validation figures on the open set (chemicals 1.5.2).

    Parameters
    ----------
    seed : int, default=0
    features : sequence of str, optional
        Names of the input columns, in order (default
        :data:`scorer.melting_model.MODEL_FEATURES`); the trend index, when present,
        gets a monotonic (increasing) constraint.
    """
    # optional extra (melting): imported where used, so that without it fit-melting
    # ends with an install hint (require_extra), not a traceback
    from sklearn.compose import TransformedTargetRegressor
    from sklearn.ensemble import HistGradientBoostingRegressor
    from sklearn.pipeline import Pipeline

    names = list(melting_model.MODEL_FEATURES if features is None else features)
    # the trees fit what the trend index leaves over (IndexOffsetRegressor): the offset carries the
    # rise of the melting point with the index, so no monotonic constraint (on the remainder it would
    # forbid the trees to temper a slope steeper than the data's); small trees and a floor on leaf
    # size because groups of similar salts are few
    trees = HistGradientBoostingRegressor(
        max_iter=200, learning_rate=0.05, max_leaf_nodes=7, min_samples_leaf=15, l2_regularization=1.0,
        early_stopping=False, random_state=seed,
    )
    return Pipeline([("regressor", TransformedTargetRegressor(regressor=trees, func=np.log, inverse_func=np.exp,
                                                              check_inverse=False))])


def balanced_weights(labels) -> np.ndarray:
    """Sample weights that give every interval group the same total weight.

    n / (k * n_g) for a row of group g (n rows, k groups): the "balanced"
    weighting of scikit-learn's ``compute_sample_weight`` (common practice).
    Without it the 50-odd organic-cation salts are a few per cent of the rows
    and the trees barely split on them.

    >>> balanced_weights(["ionic_liquid", "other", "other", "other"]).tolist()
    [2.0, 0.6666666666666666, 0.6666666666666666, 0.6666666666666666]
    """
    labels = np.asarray(labels)
    kinds, counts = np.unique(labels, return_counts=True)
    per = {k: len(labels) / (len(kinds) * c) for k, c in zip(kinds.tolist(), counts.tolist())}
    return np.array([per[g] for g in labels.tolist()], dtype=float)


# the trees fit ln T minus ln(10) * mp_trend_index (the index is log10 of a temperature): what the
# index leaves over, so a held-out family starts from the index's physics (T = dH/dS, with the
# organic ions' flexibility, symmetry and charge delocalisation), not from the median of the
# families the trees have seen. Ionic liquids held out by cation family, melting_cv (chemicals
# 1.5.2, 52 organic salts): MAE 77.4 K with ln T as the target, 57.8 K with the offset.
OFFSET_FEATURE = "mp_trend_index"
OFFSET_SCALE = math.log(10.0)


class IndexOffsetRegressor:
    """A fitted :func:`make_melting_pipeline` whose predictions are multiplied by ``10**index``.

    ``pipe`` was fitted on ``T / 10**index`` (so its log target is ``ln T - ln 10 * index``);
    ``column`` is the position of ``mp_trend_index`` among the columns it was fitted on.
    ``tree_weights`` maps an interval group to the share of the trees' log correction its rows
    get (1 where a group is not named: the full correction; 0: the index alone), chosen by
    :func:`pipelines.melting_offset.choose_tree_weight`. ``inner_log_residuals``: the residuals
    of the inner grouped cross-validation that chose it (:func:`pipelines.melting_offset.fit_offset_model`
    sets them; None otherwise), from which the interval half-widths are set.
    """

    def __init__(self, pipe, column: int, tree_weights=None):
        self.pipe, self.column = pipe, column
        self.tree_weights = dict(tree_weights or {})
        self.inner_log_residuals = None

    def predict(self, x: np.ndarray, groups=None) -> np.ndarray:
        """Predicted T [K] for rows of ``x``; ``groups`` (interval group per row) apply ``tree_weights``."""
        correction = self.pipe.predict(x)
        if groups is not None and self.tree_weights:
            share = np.array([self.tree_weights.get(g, 1.0) for g in groups], dtype=float)
            correction = np.power(correction, share)
        return correction * np.power(10.0, x[:, self.column])


def _fit_pipeline(x: np.ndarray, y_K: np.ndarray, seed: int, labels=None):
    """Fit on the columns that hold at least one value; returns the regressor and those column indices.

    ``labels`` (interval group per row) turn on :func:`balanced_weights`. The
    regressor is an :class:`IndexOffsetRegressor`: rows need a trend index
    (:func:`prepare_training` keeps only those).
    """
    used = np.array([j for j in range(x.shape[1]) if np.isfinite(x[:, j]).any()], dtype=int)
    if len(used) == 0:
        raise ValueError("no feature holds a value in the training rows")
    names = [melting_model.MODEL_FEATURES[j] for j in used]
    if OFFSET_FEATURE not in names:
        raise ValueError(f"no training row has {OFFSET_FEATURE}, the offset of the regression")
    column = names.index(OFFSET_FEATURE)
    weights = {} if labels is None else {"regressor__sample_weight": balanced_weights(labels)}
    pipe = make_melting_pipeline(seed, names).fit(x[:, used], y_K / np.power(10.0, x[:, used[column]]), **weights)
    return IndexOffsetRegressor(pipe, column), used

