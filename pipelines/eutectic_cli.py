"""``ionicity eutectic``: the estimated lowest-melting composition of two or three salts.

``ionicity eutectic LiCl KCl`` prints the composition and temperature of the
estimated minimum of the liquidus (:func:`ionicity.scorer.liquidus.minimum_liquidus`)
and writes a liquidus plot (:mod:`ionicity.pipelines.eutectic_plot`, needs
matplotlib from the ``melting`` extra) with the components' melting points and,
where ``scorer/data/eutectics.csv`` has one, the published point.
``ionicity eutectic --table salts.csv -o pairs.csv`` ranks every pair of a
table's salts by estimated eutectic temperature.

Registered in :mod:`ionicity.pipelines.cli` by ``add_eutectic_parser(sub)``
and one dispatch line calling :func:`run_eutectic`.
"""
from __future__ import annotations

import argparse
import csv
import io
import itertools
import math
import sys
from pathlib import Path

from ionicity.pipelines.errors import InputError
from ionicity.pipelines.eutectic_plot import liquidus_plot
from ionicity.pipelines.melting_cli import MissingExtraError, require_extra
from ionicity.scorer.caution import caution_sentence
from ionicity.scorer.liquidus import liquidus_K, minimum_liquidus
from ionicity.scorer.mixture import (NETWORK_MELT_CLASSES, compound_note, network_melt_warning, published_point,
                                     system_components)
from ionicity.scorer.record import score_formula, score_row

__all__ = ["add_eutectic_parser", "run_eutectic", "rank_pairs", "CAUTION", "INSTALL_HINT", "PAIR_COLUMNS"]

INSTALL_HINT = 'pip install -e ".[melting]" (from a clone; or: pip install matplotlib)'
CAUTION = (
    caution_sentence() + " Liquidus estimates are for screening: decomposition, volatility, reactions with"
    " air or moisture and corrosion of containers are not modelled."
)
PAIR_COLUMNS = (
    "component_a", "component_b", "status", "message", "eutectic_fraction_a", "eutectic_fraction_b",
    "eutectic_estimate_K", "primary_phase", "liquidus_method", "published_K", "published_fraction_a",
    "value_notes",
)


def add_eutectic_parser(subparsers) -> argparse.ArgumentParser:
    """Register ``eutectic`` on the CLI's subparsers; returns the new parser."""
    parser = subparsers.add_parser(
        "eutectic",
        help="estimated minimum-liquidus composition of 2 or 3 salts, with a plot; or rank the pairs of a table",
        description=(
            "Estimate the composition and temperature of the lowest liquidus of two or three components"
            " (ideal Schroeder-van Laar line with Temkin ion fractions and a regular-solution correction"
            " for ionic melts) and plot the liquidus. Components are formulas or names of"
            " scorer/data/fusion.csv (LiCl, KNO3, ChCl, urea)."
        ),
        epilog="plot needs matplotlib: " + INSTALL_HINT + "\n\n" + CAUTION,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    parser.add_argument("components", nargs="*", metavar="COMPONENT", help="two or three components")
    parser.add_argument("--plot", metavar="FILE", help="liquidus plot, .png or .svg (default: eutectic_A-B.png)")
    parser.add_argument("--no-plot", action="store_true", help="print the estimate only")
    parser.add_argument("--table", metavar="PATH", help="a CSV of candidate salts: rank every pair by estimated eutectic")
    parser.add_argument("--formula-col", metavar="COL", help="formula column of --table (default: the column named 'formula')")
    parser.add_argument("-o", "--output", default="-", help="ranked pairs of --table as CSV (default: stdout)")
    parser.add_argument("--overwrite", action="store_true", help="replace an existing --output or --plot file")
    parser.add_argument("--verbose", action="store_true", help=argparse.SUPPRESS)
    return parser



def _components(texts):
    try:
        return system_components(texts, score_row)
    except ValueError as exc:
        raise InputError(str(exc)) from None


def _fmt_fractions(names, fractions) -> str:
    return " + ".join(f"{x:.3f} {n}" for n, x in zip(names, fractions))


def _estimate(texts):
    melts = _components(texts)
    fractions, result = minimum_liquidus(melts)
    names = [m.name for m in melts]
    return melts, names, fractions, result, published_point(names), compound_note(tuple(names))


def _check_new_file(path: str, overwrite: bool) -> None:
    if path != "-" and Path(path).exists() and not overwrite:
        raise InputError(f"{path} exists; pass --overwrite to replace it")


def _run_system(args) -> int:
    texts = args.components
    if len(texts) not in (2, 3):
        raise InputError(f"give two or three components, got {len(texts)}: e.g. 'ionicity eutectic LiCl KCl'")
    plot_path = None
    if not args.no_plot:
        plot_path = args.plot or "eutectic_" + "-".join("".join(ch for ch in t if ch.isalnum()) for t in texts) + ".png"
        if Path(plot_path).suffix.lower() not in (".png", ".svg"):
            raise InputError(f"--plot {plot_path!r}: the plot is written as .png or .svg")
        _check_new_file(plot_path, args.overwrite)
        try:
            require_extra("matplotlib")
        except MissingExtraError:
            raise InputError(f"the liquidus plot needs matplotlib, which is not installed: {INSTALL_HINT};"
                             " or pass --no-plot") from None
    melts, names, fractions, result, published, note = _estimate(texts)
    lines = [
        f"system: {'-'.join(names)}",
        f"estimated minimum liquidus: {result.temperature_K:.0f} K ({result.temperature_K - 273.15:.0f} C)"
        f" at {_fmt_fractions(names, fractions)} (mole fractions)",
        f"method: {result.method}",
        "components: " + "; ".join(f"{m.name} melts at {m.melting_point_K:.0f} K,"
                                    f" dHfus {m.enthalpy_fusion_J_mol / 1000:.3g} kJ/mol" for m in melts),
    ]
    if published is not None:
        lines.append(f"published: {published['liquidus_K']:.0f} K at {_fmt_fractions(names, published['fractions'])}"
                     f" ({published['source']}; {published['set']} set)")
    if published is not None and not all(m.ionic for m in melts):
        ideal = liquidus_K(melts, published["fractions"]).temperature_K
        lines.append(f"deep eutectic / molecular mixture: the ideal line is the reference; at the published composition"
                     f" it gives {ideal:.0f} K, and the published point lies {ideal - published['liquidus_K']:.0f} K below it")
    if note:
        lines.append(f"note: {note}")
    networks = [m.name for m, text in zip(melts, texts)
                if score_formula(text)["substance_class"] in NETWORK_MELT_CLASSES] if all(m.ionic for m in melts) else []
    if networks:
        lines.append(f"warning: {network_melt_warning(networks)}")
    if plot_path:
        liquidus_plot(melts, fractions, result, published, plot_path)
        lines.append(f"plot: {plot_path}")
    lines.append(CAUTION)
    print("\n".join(lines))
    return 0


def _read_salts(path: str, formula_col: str | None) -> list[str]:
    try:
        with open(path, newline="", encoding="utf-8") as handle:
            rows = list(csv.DictReader(handle))
            header = rows[0].keys() if rows else []
    except (OSError, UnicodeDecodeError, csv.Error) as exc:
        raise InputError(f"cannot read the table {path}: {exc}") from None
    if not rows:
        raise InputError(f"the table {path} has no rows")
    column = formula_col or next((c for c in header if c and c.strip().lower() == "formula"), None)
    if column is None or column not in header:
        raise InputError(f"no formula column {formula_col or 'formula'!r} in {path}; columns: {', '.join(header)}")
    salts = [(row.get(column) or "").strip() for row in rows]
    return list(dict.fromkeys(s for s in salts if s))


def rank_pairs(salts) -> list[dict]:
    """Every pair of ``salts`` with its estimated eutectic, lowest first; pairs
    that cannot be estimated follow, with status error and the reason."""
    rows = []
    for a, b in itertools.combinations(salts, 2):
        row = dict.fromkeys(PAIR_COLUMNS, "")
        row.update(component_a=a, component_b=b)
        try:
            melts = system_components([a, b], score_row)
        except ValueError as exc:
            row.update(status="error", message=str(exc))
            rows.append(row)
            continue
        fractions, result = minimum_liquidus(melts, step=0.01)
        names = [m.name for m in melts]
        published = published_point(names)
        row.update(
            component_a=names[0], component_b=names[1], status="ok",
            eutectic_fraction_a=f"{fractions[0]:.3f}", eutectic_fraction_b=f"{fractions[1]:.3f}",
            eutectic_estimate_K=f"{result.temperature_K:.1f}", primary_phase=result.primary_phase,
            liquidus_method=result.method, value_notes=compound_note(tuple(names)),
        )
        if published is not None:
            row.update(published_K=f"{published['liquidus_K']:.0f}", published_fraction_a=f"{published['fractions'][0]:.3f}")
        rows.append(row)
    rows.sort(key=lambda r: (r["status"] != "ok", float(r["eutectic_estimate_K"] or math.inf)))
    return rows


def _run_table(args) -> int:
    if args.components:
        raise InputError("give either components or --table, not both")
    salts = _read_salts(args.table, args.formula_col)
    if len(salts) < 2:
        raise InputError(f"the table {args.table} has {len(salts)} distinct salt(s); at least two are needed")
    _check_new_file(args.output, args.overwrite)
    rows = rank_pairs(salts)
    buffer = io.StringIO()
    writer = csv.DictWriter(buffer, fieldnames=PAIR_COLUMNS, lineterminator="\n")
    writer.writeheader()
    writer.writerows(rows)
    if args.output == "-":
        sys.stdout.write(buffer.getvalue())
    else:
        tmp = Path(args.output + ".tmp")
        tmp.write_text(buffer.getvalue(), encoding="utf-8")
        tmp.replace(args.output)
        ok = [r for r in rows if r["status"] == "ok"]
        print(f"ranked {len(rows)} pairs of {len(salts)} salts ({len(rows) - len(ok)} without an estimate) into {args.output}",
              file=sys.stderr)
    print(CAUTION, file=sys.stderr)
    return 0


def run_eutectic(args) -> int:
    """The ``eutectic`` command; :class:`InputError` for bad input (exit 2 in the CLI)."""
    if args.table:
        return _run_table(args)
    return _run_system(args)
