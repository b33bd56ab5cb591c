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

from ionicity.pipelines.melting_cli import require_extra
from ionicity.pipelines.melting_fit import CV_SCHEMES, _lattice_energy, grouped_cross_validation, prepare_training

__all__ = ["read_training_table", "held_out_report", "report_text", "main"]


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


def held_out_report(rows, *, scheme: str = "cation_family", folds: int = 5, coverage: float = 0.9,
                    seed: int = 0, progress=None) -> dict:
    """The grouped cross-validation of the melting regression on ``rows``, grouped by ``scheme``.

    Returns the dict of :func:`pipelines.melting_fit.grouped_cross_validation`
    (without the out-of-fold predictions).
    """
    if scheme not in CV_SCHEMES:
        raise ValueError(f"scheme {scheme!r} is not one of {', '.join(CV_SCHEMES)}")
    require_extra("sklearn")
    rows, records, x, y, labels = prepare_training(rows, progress=progress)
    result = grouped_cross_validation(x, y, [row[scheme] for row in rows], _lattice_energy(records), folds=folds,
                                      coverage=coverage, seed=seed, interval_groups=labels, progress=progress)
    result.pop("oof_predictions_K")
    return result


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
    lines.append(f"ionic-liquid MAE held out by {name}: {il.get('mae_K')} K (n={il.get('n')})")
    return "\n".join(lines)


def main(argv=None) -> int:
    """Command line: 0 done, 2 bad input or missing extra."""
    parser = argparse.ArgumentParser(prog="python -m ionicity.pipelines.melting_cv", description=__doc__.split("\n")[0])
    parser.add_argument("table", help="training_set.csv written by ionicity fit-melting, or a table like it")
    parser.add_argument("--scheme", default="cation_family", choices=CV_SCHEMES, help="grouping (default: cation_family)")
    parser.add_argument("--folds", type=int, default=5, help="grouped folds (default: 5)")
    parser.add_argument("--coverage", type=float, default=0.9, help="interval coverage (default: 0.9)")
    parser.add_argument("--seed", type=int, default=0)
    args = parser.parse_args(argv)
    say = lambda text: print(f"melting_cv: {text}", file=sys.stderr)  # noqa: E731
    try:
        rows = read_training_table(args.table)
        result = held_out_report(rows, scheme=args.scheme, folds=args.folds, coverage=args.coverage,
                                 seed=args.seed, progress=say)
    except (OSError, ValueError) as exc:
        print(f"melting_cv: error: {exc}", file=sys.stderr)
        return 2
    print(report_text(result, args.scheme))
    return 0


if __name__ == "__main__":
    sys.exit(main())
