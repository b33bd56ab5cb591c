"""``ionicity fit-melting``: an optional melting-point regression over ionicity's own columns.

What it does
------------
1. **Training data** (:mod:`pipelines.melting_data`): the open set built at
   run time from the ``chemicals`` package, screened by the rules of
   :mod:`pipelines.melting_screen`, and/or a user's own table.
2. **Features** (:func:`feature_matrix`): :func:`scorer.melting_model.model_features`
   of every training formula, the same function prediction and the
   scikit-learn transformer use.
3. **The regression** (:mod:`pipelines.melting_regressor`) is a scikit-learn pipeline (histogram gradient boosting
   on log melting point, :func:`make_melting_pipeline`) fitted on what the trend
   index leaves over (:class:`IndexOffsetRegressor`), the index's organic weights refitted on
   the fitted rows and the ionic liquids' share of the trees chosen inside them
   (:mod:`pipelines.melting_offset`). It is cross-validated with
   :class:`sklearn.model_selection.GroupKFold`, once grouped by anion family
   and once by cation element so near-duplicates (NaCl/NaBr, the K and Rb
   salts of one anion) never sit on both sides of a split, and compared with two
   baselines: predicting the mean, and a straight line on the lattice energy
   (:func:`grouped_cross_validation`, in :mod:`pipelines.melting_validation`).
4. **Prediction intervals**: the model is fitted on every training row, and
   the absolute log residuals of the inner grouped cross-validation that
   chooses the ionic liquids' tree share (rows predicted by models that never
   saw their group) set the interval half-width, one per interval group:
   cross-validation residuals in the sense of Barber, Candes, Ramdas &
   Tibshirani, Ann. Statist. 2021, 49, 486, doi:10.1214/20-AOS1965 (their CV+
   form has a finite-sample guarantee; this quantile of the residuals has
   none), after split conformal prediction (Vovk, Gammerman & Shafer,
   *Algorithmic Learning in a Random World*, 2005; Lei et al., J. Am. Stat.
   Assoc. 2018, 113, 1094, doi:10.1080/01621459.2017.1307116), which held a
   quarter of the rows (whole cation families) out of the fit. Their coverage
   is checked on the held-out folds.
5. **The outputs** (:func:`fit_melting`): the model as JSON, the trees as
   arrays of plain numbers, checked against a fixed schema on load
   (:func:`scorer.melting_model.model_from_dict`; written by
   :mod:`pipelines.melting_model_file`: no pickle is ever written or read),
   the training set and decision log, ``report.json`` and the parity plot
   (:mod:`pipelines.melting_plot`).

Predicted melting points are estimates for screening, not for process
safety: decomposition, hydration and pressure are not modelled. Check
measured data and the safety data sheet before heating anything.
scikit-learn and scipy (the ``melting`` extra) are imported where they are
used: the module imports without them, so ``fit-melting`` can name what to
install (:class:`pipelines.melting_cli.MissingExtraError`).
"""
from __future__ import annotations

import csv
import json
import math
import os
import sys
from dataclasses import dataclass
from pathlib import Path

import numpy as np

from ionicity.pipelines.io import InputError
from ionicity.pipelines.melting_cli import (
    _OUTPUTS,
    CAUTION,
    TOLERANCE_K,
    MissingExtraError,
    require_extra,
)
from ionicity.pipelines.melting_data import build_open_training_set, combine_training_sets, read_user_table
from ionicity.pipelines.melting_offset import fit_offset_model, index_terms
from ionicity.pipelines.melting_regressor import (  # re-exported: the public names of the regression
    OFFSET_FEATURE,
    OFFSET_SCALE,
    IndexOffsetRegressor,
    _fit_pipeline,
    balanced_weights,
    make_melting_pipeline,
)
from ionicity.pipelines.melting_validation import (  # re-exported, as above
    _conformal_halfwidth,
    _float,
    _group_halfwidths,
    _split_calibration,
    grouped_cross_validation,
    trend_index_report,
)
from ionicity.pipelines.melting_model_file import finite_minmax, save_model, trees_to_json
from ionicity.pipelines.melting_plot import parity_plot
from ionicity.pipelines.melting_screen import cation_family
from ionicity.scorer import melting_model
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose

__all__ = [
    "FitConfig",
    "FitReport",
    "feature_matrix",
    "make_melting_pipeline",
    "IndexOffsetRegressor",
    "balanced_weights",
    "prepare_training",
    "grouped_cross_validation",
    "trend_index_report",
    "fit_melting_model",
    "summary_text",
    "fit_melting",
    "run_fit_melting",
]


# grouped cross-validation schemes: the families of the main anion, the main cation's
# element, and the cation family (organic cations by their ion family: imidazolium,
# pyrrolidinium, ammonium-protic...), which holds out whole ionic-liquid families
CV_SCHEMES = ("anion_family", "cation_element", "cation_family")
# published ionic-liquid melting points, a source per row (datasets/melting/README.md); in a
# source checkout only, so an installed package trains without them (and says so)
IONIC_LIQUID_TABLE = Path(__file__).resolve().parents[1] / "datasets" / "melting" / "ionic_liquids.csv"


# ------------------------------------------------------------------- features


def feature_matrix(rows, progress=None) -> tuple[np.ndarray, list[dict]]:
    """:data:`scorer.melting_model.MODEL_FEATURES` for training rows, and their scored records.

    Each row's ``formula_normalized`` goes through
    :func:`scorer.melting_model.features_for_formula`, the features prediction uses.
    ``progress`` (a callable) hears about every 200 rows.
    """
    say = progress or (lambda text: None)
    scored = []
    for i, row in enumerate(rows):
        if i and i % 200 == 0:
            say(f"  scored {i}/{len(rows)} training rows")
        scored.append(melting_model.features_for_formula(row["formula_normalized"]))
    if not scored:
        return np.empty((0, len(melting_model.MODEL_FEATURES))), []
    return np.vstack([x for _, x in scored]), [record for record, _ in scored]


def _lattice_energy(records) -> np.ndarray:
    vbt = np.array([_float(r.get("lattice_energy_vbt_kJ_mol")) for r in records])
    kap = np.array([_float(r.get("lattice_energy_kapustinskii_kJ_mol")) for r in records])
    return np.where(np.isfinite(vbt), vbt, kap)


def _float(value) -> float:
    try:
        return float(value) if value is not None else math.nan
    except (TypeError, ValueError):
        return math.nan



def prepare_training(rows, progress=None):
    """Score training rows and keep those with a trend index: (rows, records, x, y_K, interval labels).

    Each kept row gains ``cation_family`` (:func:`pipelines.melting_screen.cation_family`)
    when it has none, the group of the cross-validation that holds out whole
    ionic-liquid families.
    """
    say = progress or (lambda text: None)
    say(f"scoring {len(rows)} training rows")
    x, records = feature_matrix(rows, progress=say)
    usable = [i for i, r in enumerate(records) if math.isfinite(_float(r.get("mp_trend_index")))]
    rows = [rows[i] for i in usable]
    records = [records[i] for i in usable]
    if len(rows) < 20:
        raise ValueError(f"only {len(rows)} training rows have a lattice energy; at least 20 are needed")
    y = np.array([row["mp_K"] for row in rows], dtype=float)
    labels = np.array([melting_model.interval_group(r.get("substance_class")) for r in records])
    for row in rows:
        row.setdefault("cation_family", cation_family(decompose(parse_formula(row["formula_normalized"]))))
    return rows, records, x[usable], y, labels


@dataclass
class FitReport:
    """What :func:`fit_melting_model` found: the model document, the metrics and the data used."""

    model: dict
    metrics: dict
    rows: list[dict]
    records: list[dict]
    oof_predictions_K: list[float]


def fit_melting_model(rows, *, folds: int = 5, coverage: float = 0.9, calibration_fraction: float = 0.25,
                      seed: int = 0, progress=None) -> FitReport:
    """Cross-validate and fit the melting-point model on training rows.

    Parameters
    ----------
    rows : list of dict
        Training rows (``formula_normalized``, ``mp_K``, ``anion_family``,
        ``cation_element``), e.g. :attr:`TrainingSet.rows`.
    folds : int, default=5
    coverage : float, default=0.9
        Target coverage of the split-conformal intervals (0 < coverage < 1).
    calibration_fraction : float, default=0.25
        Checked and passed on to :func:`grouped_cross_validation`, which uses
        it only without an inner cross-validation (``choose_tree_share=False``);
        the model and its cross-validation here always run one, so every row
        is fitted and the half-widths come from the inner residuals.
    seed : int, default=0
    progress : callable, optional

    Returns
    -------
    FitReport
        ``model`` is the JSON document :func:`save_model` writes.

    Raises
    ------
    ValueError
        Too few usable rows or groups, or a wrong option.
    """
    if not 0.0 < coverage < 1.0:
        raise ValueError(f"coverage must lie between 0 and 1, not {coverage}")
    if not 0.05 <= calibration_fraction <= 0.5:
        raise ValueError(f"calibration_fraction must lie between 0.05 and 0.5, not {calibration_fraction}")
    if folds < 2:
        raise ValueError(f"folds must be at least 2, not {folds}")
    require_extra("sklearn")
    require_extra("scipy")
    say = progress or (lambda text: None)
    rows, records, x, y, labels = prepare_training(rows, progress=say)
    lattice = _lattice_energy(records)
    terms = index_terms(rows, records)
    cv = {}
    for scheme in CV_SCHEMES:
        say(f"cross-validating on {len(rows)} salts, grouped by {scheme.replace('_', ' ')}")
        groups = [row[scheme] for row in rows]
        cv[scheme] = grouped_cross_validation(x, y, groups, lattice, folds=folds, coverage=coverage,
                                              calibration_fraction=calibration_fraction, seed=seed,
                                              interval_groups=labels, progress=say, index_terms=terms)
    oof = cv["anion_family"].pop("oof_predictions_K")
    for scheme in CV_SCHEMES[1:]:
        cv[scheme].pop("oof_predictions_K")
    say("fitting the final model")
    # every row fits the model: the index's organic weights, the ionic liquids' share of the trees
    # (inner grouped cross-validation by cation family) and the trees, as in every fold above; the
    # interval half-widths come from that inner cross-validation's residuals
    families = np.array([row["cation_family"] for row in rows])
    pipe, used, index_weights, x = fit_offset_model(
        x, y, np.arange(len(rows)), labels, families, terms,
        lambda xs, ys, ls: _fit_pipeline(xs, ys, seed, ls), say, seed=seed)
    residuals = pipe.inner_log_residuals
    ok = np.isfinite(residuals)
    q, per_group = _group_halfwidths(residuals[ok], labels[ok], coverage, families[ok])
    hgb = pipe.pipe.named_steps["regressor"].regressor_
    baseline, trees = trees_to_json(hgb)
    lo, hi = finite_minmax(x[:, used])
    metrics = {"cross_validation": cv, "trend_index": trend_index_report(rows, records)}
    document = {
        "format": melting_model.MODEL_FORMAT,
        "format_version": melting_model.MODEL_FORMAT_VERSION,
        "model_type": "gradient_boosted_trees",
        "target": "ln_mp_K",
        "features": [melting_model.MODEL_FEATURES[j] for j in used],
        "baseline": baseline,
        "trees": trees,
        "offset": {"feature": OFFSET_FEATURE, "scale": OFFSET_SCALE},
        "index_weights": index_weights,
        "tree_weights": pipe.tree_weights,
        "interval": {"method": "absolute ln residuals of an inner grouped cross-validation by cation family,"
                               " a half-width per group (Mondrian); for ionic liquids a conformal quantile"
                               " over the cation families' own quantiles",
                     "coverage": coverage, "log_halfwidth": q, "group_log_halfwidths": per_group,
                     "calibration_rows": int(ok.sum())},
        "domain": {"feature_min": lo, "feature_max": hi,
                   "target_min_K": float(np.min(y)), "target_max_K": float(np.max(y)),
                   "substance_classes": sorted({r.get("substance_class") or "" for r in records} - {""})},
        "training": {
            "rows": len(rows), "fitted_rows": len(rows), "seed": seed,
            "origins": sorted({row.get("origin", "") for row in rows}),
            "hyperparameters": {k: v for k, v in hgb.get_params().items() if isinstance(v, (int, float, str, bool)) or v is None},
        },
        "metrics": metrics,
        "caution": CAUTION,
    }
    melting_model.model_from_dict(json.loads(json.dumps(document)))  # what we write must load
    return FitReport(model=document, metrics=metrics, rows=rows, records=records, oof_predictions_K=oof)


# ------------------------------------------------------------------- the CLI


@dataclass
class FitConfig:
    """Options of ``ionicity fit-melting`` (the CLI fills one; a notebook can too)."""

    output_dir: str
    table: str | None = None
    formula_col: str = "formula"
    mp_col: str | None = None
    open_data: bool = True
    tolerance_K: float = TOLERANCE_K
    folds: int = 5
    coverage: float = 0.9
    seed: int = 0
    overwrite: bool = False
    quiet: bool = False
    ionic_liquids: bool = True




def _config_from_args(args) -> FitConfig:
    return FitConfig(
        output_dir=args.output_dir, table=args.table, formula_col=args.formula_col, mp_col=args.mp_col,
        open_data=not args.no_open_data, tolerance_K=args.tolerance_K, folds=args.folds, coverage=args.coverage,
        seed=args.seed, overwrite=args.overwrite, quiet=args.quiet,
        ionic_liquids=not getattr(args, "no_ionic_liquids", False),
    )


def _write_csv(rows: list[dict], path: Path, columns: list[str]) -> None:
    tmp = path.with_name(path.name + ".tmp")
    with tmp.open("w", newline="", encoding="utf-8") as handle:
        writer = csv.DictWriter(handle, fieldnames=columns, extrasaction="ignore")
        writer.writeheader()
        writer.writerows(rows)
    os.replace(tmp, path)


def summary_text(report: FitReport) -> str:
    """The closing summary for people: metrics against the baselines, coverage, trend index per family."""
    lines = []
    cv = report.metrics["cross_validation"]
    for scheme, result in cv.items():
        lines.append(f"grouped {result['folds']}-fold CV by {scheme.replace('_', ' ')} ({result['groups']} groups):")
        for name in ("model", "baseline_mean", "baseline_lattice_energy"):
            m = result[name]
            lines.append(f"  {name:<24} MAE {m.get('mae_K')} K  RMSE {m.get('rmse_K')} K  R^2 {m.get('r2')}"
                         f"  Spearman {m.get('spearman_rho')}  (n={m.get('n')})")
        lines.append(f"  {int(result['interval_target'] * 100)} % conformal intervals: held-out coverage"
                     f" {result['interval_coverage']:.3f}, mean width {result['interval_mean_width_K']} K")
        for group, entry in result.get("per_group", {}).items():
            lines.append(f"    {group:<14} rows {entry['rows']}: coverage {entry['interval_coverage']:.3f}, mean width"
                         f" {entry['interval_mean_width_K']} K, model MAE {entry['model'].get('mae_K')} K")
    trend = report.metrics["trend_index"]
    lines.append(f"mp_trend_index alone: Spearman {trend['overall']['spearman_rho']} (n={trend['overall']['n']})")
    for family, entry in trend["per_anion_family"].items():
        if "spearman_rho" in entry:
            lines.append(f"  {family:<24} Spearman {entry['spearman_rho']:+.3f}  (n={entry['n']})")
    ionic_liquids = sum(1 for r in report.records if r.get("substance_class") == "ionic_liquid_pair")
    held_out = cv.get("cation_family", {}).get("per_group", {}).get("ionic_liquid", {}).get("model", {})
    lines.append(f"ionic liquids (organic-cation salts) in the training set: {ionic_liquids}; held out by cation"
                 f" family: MAE {held_out.get('mae_K')} K (n={held_out.get('n')})")
    lines.append("caution: " + CAUTION)
    return "\n".join(lines)


def fit_melting(config: FitConfig) -> FitReport:
    """Run ``fit-melting``: build the data, cross-validate, fit, write every output; the Python API of the CLI."""
    say = (lambda text: None) if config.quiet else (lambda text: print(f"ionicity fit-melting: {text}", file=sys.stderr))
    out = Path(config.output_dir)
    if out.exists() and not out.is_dir():
        raise InputError(f"{out} exists and is not a folder")
    existing = [name for name in _OUTPUTS if (out / name).exists()]
    if existing and not config.overwrite:
        raise InputError(f"{out} already holds {', '.join(existing)}; pass --overwrite to replace them")
    if not config.open_data and not config.table:
        raise InputError("--no-open-data needs --table")
    require_extra("sklearn")
    require_extra("matplotlib")
    sets = []
    if config.open_data:
        sets.append(build_open_training_set(tolerance_K=config.tolerance_K, progress=say))
    if config.ionic_liquids:
        if IONIC_LIQUID_TABLE.is_file():
            say(f"adding the published ionic-liquid melting points of {IONIC_LIQUID_TABLE.name}")
            sets.append(read_user_table(IONIC_LIQUID_TABLE, formula_col="formula", mp_col="mp_K"))
        else:
            say(f"no {IONIC_LIQUID_TABLE} (not a source checkout): training without it")
    if config.table:
        sets.append(read_user_table(config.table, formula_col=config.formula_col, mp_col=config.mp_col))
    data = combine_training_sets(*sets)
    report = fit_melting_model(data.rows, folds=config.folds, coverage=config.coverage, seed=config.seed, progress=say)
    out.mkdir(parents=True, exist_ok=True)
    save_model(report.model, out / "melting_model.json")
    columns = ["formula", "formula_normalized", "mp_K", "name", "cas", "origin", "decision", "anion_family",
               "cation_element", "mp_trend_index", "melting_class", "mp_oof_predicted_K"]
    table = [{**row, "mp_trend_index": rec.get("mp_trend_index"), "melting_class": rec.get("melting_class"),
              "mp_oof_predicted_K": oof}
             for row, rec, oof in zip(report.rows, report.records, report.oof_predictions_K)]
    _write_csv(table, out / "training_set.csv", columns)
    _write_csv(data.decisions, out / "decisions.csv", ["cas", "name", "formula", "sources", "kept", "reason"])
    payload = {"data": data.info, "metrics": report.metrics, "caution": CAUTION}
    (out / "report.json").write_text(json.dumps(payload, indent=2, allow_nan=False, default=str), encoding="utf-8")
    parity_plot([r["mp_K"] for r in report.rows], report.oof_predictions_K, out / "parity.png",
                families=[r["anion_family"] for r in report.rows],
                title=f"{len(report.rows)} salts, held-out folds grouped by anion family")
    say("wrote " + ", ".join(str(out / name) for name in _OUTPUTS))
    return report


def run_fit_melting(args) -> int:
    """The ``fit-melting`` command: 0 done, 2 missing extra or bad input, 3 internal error."""
    config = _config_from_args(args)
    try:
        report = fit_melting(config)
    except MissingExtraError as exc:
        print(f"ionicity fit-melting: {exc}", file=sys.stderr)
        return 2
    except (InputError, ValueError) as exc:
        print(f"ionicity fit-melting: error: {exc}", file=sys.stderr)
        return 2
    print(summary_text(report))
    return 0
