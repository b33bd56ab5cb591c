"""Re-measure the melting regression's held-out figures on a training table, without refitting a model file.

``python -m ionicity.pipelines.melting_cv TRAINING_SET.csv`` reads the
``training_set.csv`` that ``ionicity fit-melting`` wrote (or any table with
``formula_normalized`` or ``formula``, ``mp_K``, ``anion_family`` and
``cation_element``), scores every formula again with the current code, runs
the grouped cross-validation of :func:`pipelines.melting_fit.grouped_cross_validation`
with one grouping (default: cation family, which holds out whole ionic-liquid
families: imidazolium, pyrrolidinium, ammonium-quaternary...) and prints:

* the model's MAE on the ionic liquids (organic-cation salts, interval group
  ``ionic_liquid``) over their held-out folds: the validation figure the README
  quotes;
* that MAE per held-out family;
* conformal coverage and mean width per interval group.

The three organic weights of the trend index (``flexibility``,
``delocalised``, ``protic``) are fitted in ``TREND_WEIGHTS`` on the
``calibration`` rows of ``datasets/melting/ionic_liquids.csv``, which belong
to the cation families held out here. ``--index-weights`` says which weights
the index feature is computed with:

* ``fold`` (default): each fold refits them on the rows its trees are fitted
  on (:func:`pipelines.melting_offset.fit_index_weights`), as
  ``fit-melting`` does for the model file, which carries them: the held-out
  family sets no weight, so the figure is clean of the index's calibration;
* ``shipped``: ``TREND_WEIGHTS`` as they are (the figure leaks a little);
* ``calibration_rows`` (also ``--refit-organic-weights``): each fold refits
  them on the calibration rows of ``ionic_liquids.csv`` outside the held-out
  families and scores every row again (slow; only with ``--scheme cation_family``).

It skips the minute spent rebuilding the open data set, so it is the command
to rerun after a change to the trend index or to the features (the trend index
is one of the regression's features). Progress goes to stderr. Nothing here is
tuned on the held-out rows: the hyperparameters are fixed in
:func:`pipelines.melting_fit.make_melting_pipeline`.
"""
from __future__ import annotations

import argparse
import csv
import sys
from contextlib import contextmanager

import numpy as np

from ionicity.pipelines.melting_cli import require_extra
from ionicity.pipelines.melting_fit import (
    CV_SCHEMES,
    _lattice_energy,
    feature_matrix,
    grouped_cross_validation,
    prepare_training,
)
from ionicity.pipelines.melting_offset import index_terms
from ionicity.pipelines.melting_screen import cation_family
from ionicity.scorer import melting
from ionicity.scorer.caching import clear_all
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose

__all__ = ["INDEX_WEIGHT_MODES", "DECOMPOSITION_ONSET_K", "suspect_melting_point", "read_training_table", "trend_weights", "organic_weights_without", "held_out_report", "repeated_held_out_report", "report_text", "repeated_report_text", "main"]


def read_training_table(path) -> list[dict]:
    """Rows of a training table: ``formula_normalized`` (or ``formula``), ``mp_K`` as float, the group columns."""
    rows = []
    with open(path, newline="", encoding="utf-8") as handle:
        for line, row in enumerate(csv.DictReader(handle), start=2):
            formula = row.get("formula_normalized") or row.get("formula")
            try:
                mp = float(row["mp_K"])
            except (KeyError, TypeError, ValueError):
                raise ValueError(f"{path} line {line}: mp_K {row.get('mp_K')!r} is not a number") from None
            if not formula:
                raise ValueError(f"{path} line {line}: no formula_normalized or formula")
            rows.append({"formula_normalized": formula, "mp_K": mp,
                         "anion_family": row.get("anion_family") or "unknown",
                         "cation_element": row.get("cation_element") or "unknown"})
    return rows


@contextmanager
def trend_weights(weights: dict):
    """Score with some entries of ``TREND_WEIGHTS`` replaced; every per-input cache is emptied
    on the way in and out (as ``tests/perturb_trend_weights.py`` does), so no record of the
    other weights survives."""
    saved = dict(melting.TREND_WEIGHTS)
    try:
        melting.TREND_WEIGHTS.update(weights)
        clear_all()
        yield
    finally:
        melting.TREND_WEIGHTS.clear()
        melting.TREND_WEIGHTS.update(saved)
        clear_all()


def organic_weights_without(families, progress=None) -> dict:
    """The organic weights refitted on the calibration rows of ``ionic_liquids.csv`` outside ``families``."""
    from ionicity.pipelines import melting_weights  # needs scipy (the melting extra), checked by the caller

    rows = melting_weights.organic_rows([])
    kept = [r for r in rows if not (r[0] == "calibration" and cation_family(decompose(parse_formula(r[3]))) in families)]
    weights = melting_weights.fit_organic_weights(kept)
    if progress:
        progress(f"  organic weights without {', '.join(sorted(families)) or 'no family'}"
                 f" ({len(rows) - len(kept)} calibration rows left out): "
                 + ", ".join(f"{k} {v:.3f}" for k, v in weights.items()))
    return weights


INDEX_WEIGHT_MODES = ("fold", "shipped", "calibration_rows")
# quaternary onium cations: their salts with F- or OH- are made and measured as hydrates (Bu4NF as the
# trihydrate, Bu4NOH as a clathrate hydrate; the anhydrous salts decompose by Hofmann elimination: Sharma &
# Fry, J. Org. Chem. 1983, 48, 2112, from memory), and above about 550 K tetraalkylammonium salts
# dealkylate or eliminate, so a higher "melting point" is usually one with decomposition (common practice)
_ONIUM_FAMILIES = ("ammonium-quaternary", "phosphonium")
_HYDRATE_PRONE_ANIONS = ("F(-)", "OH(-)")
DECOMPOSITION_ONSET_K = 550.0


def suspect_melting_point(formula: str, mp_K: float) -> str:
    """Why a measured value of an onium salt may not be the melting point of the anhydrous salt ('' if no reason).

    A stated rule on the formula and the measured value only, never on a
    prediction: a quaternary ammonium or phosphonium cation with fluoride or
    hydroxide (``hydrate``), or such a salt measured above
    :data:`DECOMPOSITION_ONSET_K` (``decomposition``). Flagged rows stay in the
    training set; :func:`held_out_report` gives the ionic-liquid MAE with and
    without them.

    >>> suspect_melting_point("[N4444]F", 304.1), suspect_melting_point("[N1111]Cl", 642.15)
    ('hydrate', 'decomposition')
    >>> suspect_melting_point("[N4444]Br", 376.0), suspect_melting_point("[C2mim]Cl", 600.0)
    ('', '')
    """
    dec = decompose(parse_formula(formula))
    if not dec.cations or cation_family(dec) not in _ONIUM_FAMILIES:
        return ""
    if any(t.ion.ion_id in _HYDRATE_PRONE_ANIONS for t in dec.anions):
        return "hydrate"
    return "decomposition" if mp_K > DECOMPOSITION_ONSET_K else ""


def held_out_report(rows, *, scheme: str = "cation_family", folds: int = 5, coverage: float = 0.9,
                    seed: int = 0, progress=None, index_weights: str = "fold") -> dict:
    """The grouped cross-validation of the melting regression on ``rows``, grouped by ``scheme``.

    ``index_weights`` (one of :data:`INDEX_WEIGHT_MODES`) says how the trend
    index's organic weights are set in each fold: ``fold`` refits them on the
    fold's fitted rows, as ``fit-melting`` does; ``shipped`` keeps
    ``TREND_WEIGHTS``; ``calibration_rows`` (scheme ``cation_family`` only)
    refits them without the calibration rows of the families the fold holds
    out (:func:`organic_weights_without`) and scores every row again.

    Returns the dict of :func:`pipelines.melting_fit.grouped_cross_validation`
    (without the out-of-fold predictions).
    """
    return repeated_held_out_report(rows, scheme=scheme, folds=folds, coverage=coverage, seeds=(seed,),
                                    progress=progress, index_weights=index_weights)["repeats"][0]


def repeated_held_out_report(rows, *, scheme: str = "cation_family", folds: int = 5, coverage: float = 0.9,
                             seeds=(0, 1, 2, 3, 4), progress=None, index_weights: str = "fold") -> dict:
    """:func:`held_out_report` once per seed (another assignment of groups to folds each), rows scored once.

    One grouped split is one draw: which families share a fold decides part of
    the held-out figure (DEVELOPERS.md, "Stable folds"). Returns ``repeats``
    (one :func:`held_out_report` dict per seed, in order) and
    ``ionic_liquid_mae_K``: the ionic liquids' held-out MAE per seed, its mean,
    minimum and maximum.
    """
    if scheme not in CV_SCHEMES:
        raise ValueError(f"scheme {scheme!r} is not one of {', '.join(CV_SCHEMES)}")
    if index_weights not in INDEX_WEIGHT_MODES:
        raise ValueError(f"index_weights {index_weights!r} is not one of {', '.join(INDEX_WEIGHT_MODES)}")
    if index_weights == "calibration_rows" and scheme != "cation_family":
        raise ValueError("refitting the organic weights per fold needs the scheme cation_family")
    seeds = list(seeds)
    if not seeds:
        raise ValueError("at least one seed is needed")
    require_extra("sklearn")
    require_extra("scipy")
    rows, records, x, y, labels = prepare_training(rows, progress=progress)
    terms = index_terms(rows, records) if index_weights == "fold" else None
    flags = np.array([suspect_melting_point(row["formula_normalized"], row["mp_K"]) for row in rows])

    def fold_features(held_out):
        with trend_weights(organic_weights_without(held_out, progress)):
            return feature_matrix(rows)[0]

    repeats = []
    for seed in seeds:
        if progress and len(seeds) > 1:
            progress(f"repetition with seed {seed}")
        result = grouped_cross_validation(
            x, y, [row[scheme] for row in rows], _lattice_energy(records), folds=folds, coverage=coverage,
            seed=seed, interval_groups=labels, progress=progress,
            features_for_fold=fold_features if index_weights == "calibration_rows" else None, index_terms=terms)
        oof = np.array(result.pop("oof_predictions_K"))
        il = (labels == "ionic_liquid") & np.isfinite(oof)
        result["seed"] = seed
        result["ionic_liquid_flagged"] = {flag: int(np.sum(il & (flags == flag))) for flag in ("hydrate", "decomposition")}
        kept = il & (flags == "")
        result["ionic_liquid_unflagged_mae_K"] = round(float(np.mean(np.abs(oof[kept] - y[kept]))), 1) if kept.any() else None
        result["ionic_liquid_unflagged_rows"] = int(kept.sum())
        repeats.append(result)
    maes = [r["per_group"].get("ionic_liquid", {}).get("model", {}).get("mae_K") for r in repeats]
    known = [m for m in maes if m is not None]
    summary = {"per_seed": dict(zip(seeds, maes))}
    if known:
        summary.update(mean=round(float(np.mean(known)), 1), min=min(known), max=max(known))
    return {"repeats": repeats, "ionic_liquid_mae_K": summary}


def repeated_report_text(report: dict, scheme: str) -> str:
    """Every repetition's figures, then the ionic liquids' MAE over the seeds."""
    parts = [f"seed {r['seed']}: " + report_text(r, scheme) for r in report["repeats"]]
    mae = report["ionic_liquid_mae_K"]
    if len(report["repeats"]) > 1 and "mean" in mae:
        per_seed = ", ".join(f"{seed}: {value} K" for seed, value in mae["per_seed"].items())
        parts.append(f"ionic-liquid MAE held out by {scheme.replace('_', ' ')} over {len(report['repeats'])}"
                     f" fold assignments: mean {mae['mean']} K, range {mae['min']}-{mae['max']} K ({per_seed})")
    return "\n".join(parts)


def report_text(result: dict, scheme: str) -> str:
    """The figures of :func:`held_out_report` for people."""
    name = scheme.replace("_", " ")
    lines = [f"grouped {result['folds']}-fold CV by {name} ({result['groups']} groups):"]
    for group, entry in result["per_group"].items():
        m = entry["model"]
        lines.append(f"  {group:<13} rows {entry['rows']:>4}: MAE {m.get('mae_K')} K, Spearman {m.get('spearman_rho')},"
                     f" {int(result['interval_target'] * 100)} % interval coverage {entry['interval_coverage']:.3f},"
                     f" mean width {entry['interval_mean_width_K']} K")
    lines.append(f"ionic liquids, MAE per held-out {name}:")
    for group, entry in result["ionic_liquid_by_held_out_group"].items():
        lines.append(f"  {group:<22} rows {entry['rows']:>3}: MAE {entry['mae_K']} K")
    il = result["per_group"].get("ionic_liquid", {}).get("model", {})
    if "ionic_liquid_flagged" in result:
        flagged = ", ".join(f"{k} {v}" for k, v in result["ionic_liquid_flagged"].items())
        lines.append(f"  without the onium rows flagged by suspect_melting_point ({flagged}):"
                     f" MAE {result['ionic_liquid_unflagged_mae_K']} K (n={result['ionic_liquid_unflagged_rows']})")
    lines.append(f"ionic-liquid MAE held out by {name}: {il.get('mae_K')} K (n={il.get('n')})")
    return "\n".join(lines)


def main(argv=None) -> int:
    """Command line: 0 done, 2 bad input or missing extra."""
    parser = argparse.ArgumentParser(prog="python -m ionicity.pipelines.melting_cv", description=__doc__.split("\n")[0])
    parser.add_argument("table", help="training_set.csv written by ionicity fit-melting, or a table like it")
    parser.add_argument("--scheme", default="cation_family", choices=CV_SCHEMES, help="grouping (default: cation_family)")
    parser.add_argument("--folds", type=int, default=5, help="grouped folds (default: 5)")
    parser.add_argument("--coverage", type=float, default=0.9, help="interval coverage (default: 0.9)")
    parser.add_argument("--seed", type=int, default=0, help="first seed: the groups' fold assignment and the trees")
    parser.add_argument("--repeats", type=int, default=1,
                        help="repeat with seeds SEED, SEED+1, ...: each another assignment of groups to folds"
                             " (default: 1); prints every repetition and the ionic liquids' MAE over them")
    parser.add_argument("--index-weights", choices=INDEX_WEIGHT_MODES, default="fold",
                        help="the trend index's organic weights: refitted on each fold's fitted rows (fold, the"
                             " default, as fit-melting does), as shipped, or refitted on the calibration rows of"
                             " ionic_liquids.csv outside the held-out families (calibration_rows)")
    parser.add_argument("--refit-organic-weights", dest="index_weights", action="store_const",
                        const="calibration_rows", help="the same as --index-weights calibration_rows")
    args = parser.parse_args(argv)
    say = lambda text: print(f"melting_cv: {text}", file=sys.stderr)  # noqa: E731
    try:
        if args.repeats < 1:
            raise ValueError(f"--repeats must be at least 1, not {args.repeats}")
        rows = read_training_table(args.table)
        report = repeated_held_out_report(rows, scheme=args.scheme, folds=args.folds, coverage=args.coverage,
                                          seeds=range(args.seed, args.seed + args.repeats), progress=say,
                                          index_weights=args.index_weights)
    except (OSError, ValueError) as exc:
        print(f"melting_cv: error: {exc}", file=sys.stderr)
        return 2
    print(repeated_report_text(report, args.scheme))
    return 0


if __name__ == "__main__":
    sys.exit(main())
