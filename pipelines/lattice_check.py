"""Lattice energies against Born-Haber values: the table of errors, calibration apart from validation.

usage: python -m ionicity.pipelines.lattice_check [--reference CSV] [--all-rows]

Reads ``tests/data/lattice_reference.csv`` (compound, ions, Born-Haber ``U_POT``,
``set`` = calibration or validation, a source per row), scores every row with
:func:`ionicity.scorer.lattice.describe` on the ions as written there, and prints:

* per compound (validation rows, or every row with ``--all-rows``): the
  reference value and the signed error in % of every lattice column, the best
  method and its error;
* the summary figures of the validation set: the share of rows whose best
  value is within 5 %, the same share for rows whose best value is a model
  (not the thermochemical cycle), the median absolute error of the best
  method on the validation alkali halides, and the error of each method for
  AgCl, AgBr and CuCl;
* the same summary on the calibration set, labelled as such (those rows set
  BMH_RHO_PM, the VBT 2:2 choice and the order of BEST_METHOD_RULE, so they
  are not a check).

An empty cell means the method gave no value (withheld with a note, or not
applicable).
"""
from __future__ import annotations

import argparse
import csv
import math
import statistics
import sys
from pathlib import Path

from ionicity.scorer.ions import get_ion
from ionicity.scorer.lattice import describe
from ionicity.scorer.model import Decomposition, IonTerm

DEFAULT_REFERENCE = Path(__file__).resolve().parents[1] / "tests" / "data" / "lattice_reference.csv"

METHODS = (
    ("kapustinskii", "lattice_energy_kapustinskii_kJ_mol"),
    ("vbt", "lattice_energy_vbt_kJ_mol"),
    ("born_mayer", "lattice_energy_born_mayer_kJ_mol"),
    ("born_lande", "lattice_energy_born_lande_kJ_mol"),
    ("bmh", "lattice_energy_born_mayer_huggins_kJ_mol"),
    ("cycle", "lattice_energy_cycle_kJ_mol"),
    ("best", "lattice_energy_best_kJ_mol"),
)
ALKALI_METALS = frozenset({"Li", "Na", "K", "Rb", "Cs"})
HALOGENS = frozenset({"F", "Cl", "Br", "I"})
COINAGE_CHECK = ("AgCl", "AgBr", "CuCl")


def _terms(text: str) -> tuple[IonTerm, ...]:
    out = []
    for part in text.split(";"):
        ion_id, count = part.split("*")
        out.append(IonTerm(get_ion(ion_id), float(count)))
    return tuple(out)


def reference_rows(path: Path = DEFAULT_REFERENCE) -> list[dict]:
    """The reference table's rows, as read."""
    with Path(path).open(encoding="utf-8", newline="") as handle:
        return list(csv.DictReader(handle))


def scored(row: dict) -> tuple[dict, tuple[str, ...]]:
    """The lattice values and notes of one reference row (ions as written in the table)."""
    dec = Decomposition(cations=_terms(row["cations"]), anions=_terms(row["anions"]), substance_class="ionic_salt")
    return describe(dec)


def error_pct(value, reference: float) -> float:
    """Signed error of ``value`` against ``reference`` in %, NaN for a missing value."""
    if value is None or (isinstance(value, float) and math.isnan(value)):
        return math.nan
    return (float(value) - reference) / reference * 100.0


def is_alkali_halide(row: dict) -> bool:
    return row["cations"].split("(")[0] in ALKALI_METALS and row["anions"].split("(")[0] in HALOGENS


def summary(rows: list[dict]) -> dict:
    """The headline figures of one set of reference rows."""
    best_err = []
    model_err = []
    alkali = []
    per_method: dict[str, dict[str, float]] = {}
    for row in rows:
        values, _ = scored(row)
        ref = float(row["u_kJ_mol"])
        err = abs(error_pct(values.get("lattice_energy_best_kJ_mol"), ref))
        best_err.append(err)
        if values.get("lattice_energy_best_method") != "thermochemical_cycle":
            model_err.append(err)
        if is_alkali_halide(row):
            alkali.append(err)
        if row["compound"] in COINAGE_CHECK:
            per_method[row["compound"]] = {
                name: error_pct(values.get(column), ref) for name, column in METHODS
            }

    def share(errs):
        finite = [e <= 5.0 for e in errs if not math.isnan(e)]
        return (sum(finite), len(errs))

    by_method = {}
    for name, column in METHODS:
        errs = [abs(error_pct(scored(r)[0].get(column), float(r["u_kJ_mol"]))) for r in rows]
        errs = [e for e in errs if not math.isnan(e)]
        by_method[name] = (len(errs), statistics.median(errs) if errs else math.nan, sum(e <= 5.0 for e in errs))
    models = [e for e in model_err if not math.isnan(e)]
    return {
        "rows": len(rows),
        "by_method": by_method,
        "best_median_abs_pct": statistics.median([e for e in best_err if not math.isnan(e)]),
        "best_models_median_abs_pct": statistics.median(models) if models else math.nan,
        "within_5pct": share(best_err),
        "within_5pct_models": share(model_err),
        "alkali_halide_median_abs_pct": statistics.median(alkali) if alkali else math.nan,
        "alkali_halides": len(alkali),
        "coinage": per_method,
    }


def _fmt(x: float) -> str:
    return "" if math.isnan(x) else f"{x:+.1f}"


def print_table(rows: list[dict], out=None) -> None:
    names = [n for n, _ in METHODS]
    print("compound,set,u_ref_kJ_mol," + ",".join(f"err_{n}_pct" for n in names) + ",best_method", file=out)
    for row in rows:
        values, _ = scored(row)
        ref = float(row["u_kJ_mol"])
        errs = [_fmt(error_pct(values.get(column), ref)) for _, column in METHODS]
        print(f"{row['compound']},{row['set']},{ref:g}," + ",".join(errs) + f",{values.get('lattice_energy_best_method') or ''}", file=out)


def print_summary(label: str, rows: list[dict], out=None) -> None:
    s = summary(rows)
    n, total = s["within_5pct"]
    m, mtotal = s["within_5pct_models"]
    print(f"[{label}] rows: {s['rows']}", file=out)
    print(f"[{label}] best value within 5 %: {n}/{total} ({100.0 * n / total:.0f} %)", file=out)
    if mtotal:
        print(f"[{label}] best value within 5 %, model rows only (not the cycle): {m}/{mtotal} ({100.0 * m / mtotal:.0f} %)", file=out)
    print(f"[{label}] median |error| of the best value: {s['best_median_abs_pct']:.1f} %;"
          f" model rows only: {s['best_models_median_abs_pct']:.1f} %", file=out)
    for name, (count, median, within) in s["by_method"].items():
        if count:
            print(f"[{label}] {name}: {count} rows with a value, median |error| {median:.1f} %, within 5 %: {within}", file=out)
    print(
        f"[{label}] alkali halides ({s['alkali_halides']}): median |error| of the best method"
        f" {s['alkali_halide_median_abs_pct']:.2f} %",
        file=out,
    )
    for compound, errs in s["coinage"].items():
        text = ", ".join(f"{name} {_fmt(e) or 'withheld'}" for name, e in errs.items())
        print(f"[{label}] {compound} error % per method: {text}", file=out)


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m ionicity.pipelines.lattice_check", description=__doc__.split("\n")[0])
    parser.add_argument("--reference", type=Path, default=DEFAULT_REFERENCE, help="reference CSV (default: %(default)s)")
    parser.add_argument("--all-rows", action="store_true", help="print calibration rows in the table too")
    args = parser.parse_args(argv)
    if not args.reference.is_file():
        print(f"error: reference table {args.reference} not found; pass --reference CSV", file=sys.stderr)
        return 2
    rows = reference_rows(args.reference)
    validation = [r for r in rows if r["set"] == "validation"]
    calibration = [r for r in rows if r["set"] == "calibration"]
    print_table(rows if args.all_rows else validation)
    print()
    print_summary("validation", validation)
    print_summary("calibration (coefficients and the rule were set on these: not a check)", calibration)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
