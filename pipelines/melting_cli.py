"""The ``fit-melting`` command's arguments and the check for its optional extra.

Kept apart from the trainer (:mod:`pipelines.melting_fit`,
:mod:`pipelines.melting_data`, :mod:`pipelines.melting_plot`) so that
building the command line imports nothing heavy (``ionicity score`` starts
its workers right after parsing).
"""
from __future__ import annotations

import argparse
import importlib

from ionicity.pipelines.errors import install_hint
from ionicity.scorer.caution import CAUTION as _CAUTION  # imports nothing: this module stays light

__all__ = ["add_fit_melting_parser", "CAUTION", "EXTRA_HINT", "TOLERANCE_K", "MissingExtraError", "require_extra"]

EXTRA_HINT = install_hint("melting", "chemicals matplotlib")
CAUTION = "Predicted melting points are " + _CAUTION + "."
# sources further apart than this disagree
TOLERANCE_K = 20.0
_OUTPUTS = ("melting_model.json", "training_set.csv", "decisions.csv", "report.json", "parity.png")


class MissingExtraError(RuntimeError):
    """The optional ``melting`` extra is not installed."""


def require_extra(module: str):
    """Import ``module`` of the ``melting`` extra, or raise :class:`MissingExtraError` saying what to install.

    >>> require_extra("no_such_package_here")
    Traceback (most recent call last):
    ...
    ionicity.pipelines.melting_cli.MissingExtraError: 'no_such_package_here' is needed for fit-melting and is not installed: pip install "ionicity[melting]" (from a clone: pip install -e ".[melting]"; or: pip install chemicals matplotlib)
    """
    try:
        return importlib.import_module(module)
    except ImportError as exc:
        raise MissingExtraError(
            f"'{module}' is needed for fit-melting and is not installed: {EXTRA_HINT}"
        ) from exc


def add_fit_melting_parser(subparsers) -> argparse.ArgumentParser:
    """Register ``fit-melting`` on the CLI's subparsers; returns the new parser.

    Wiring in :mod:`pipelines.cli`: ``add_fit_melting_parser(sub)`` inside
    ``build_parser`` and ``if args.command == "fit-melting": return run_fit_melting(args)``
    in ``main``.
    """
    parser = subparsers.add_parser(
        "fit-melting",
        help="fit a melting-point regression on open data (needs the 'melting' extra)",
        description=(
            "Build a training set of salt melting points from the 'chemicals' package at run time"
            " (and/or your own table), cross-validate a regression over ionicity's columns with groups"
            " by anion family and by cation element, and write a JSON model for 'ionicity score --mp-model'."
        ),
        epilog=(
            "writes into OUTPUT_DIR: " + ", ".join(_OUTPUTS) + "\n\n"
            "needs: " + EXTRA_HINT + "\n\n" + CAUTION
        ),
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    parser.add_argument("-o", "--output-dir", required=True, metavar="DIR", help="folder for the model, data and report")
    parser.add_argument("--table", metavar="PATH", help="your own melting points: a CSV/TSV/Parquet with a formula column and a melting point in K")
    parser.add_argument("--formula-col", default="formula", metavar="COL", help="formula column of --table (default: formula)")
    parser.add_argument("--mp-col", metavar="COL", help="melting-point column of --table, in K (default: mp_K, melting_point_K or tm_K)")
    parser.add_argument("--no-open-data", action="store_true", help="use only --table, not the chemicals package")
    parser.add_argument("--no-ionic-liquids", action="store_true",
                        help="leave out the published ionic-liquid melting points of datasets/melting/ionic_liquids.csv")
    parser.add_argument("--tolerance-K", type=float, default=TOLERANCE_K, metavar="K",
                        help=f"sources further apart than this disagree (default: {TOLERANCE_K:g})")
    parser.add_argument("--folds", type=int, default=5, metavar="N", help="grouped cross-validation folds (default: 5)")
    parser.add_argument("--coverage", type=float, default=0.9, metavar="P", help="prediction-interval coverage (default: 0.9)")
    parser.add_argument("--seed", type=int, default=0, help="random seed (default: 0)")
    parser.add_argument("--overwrite", action="store_true", help="replace existing outputs in OUTPUT_DIR")
    parser.add_argument("--quiet", action="store_true", help="no progress on stderr")
    parser.add_argument("--verbose", action="store_true", help=argparse.SUPPRESS)
    return parser
