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

from ionicity.scorer.caution import caution_sentence  # imports nothing: this module stays light

__all__ = ["add_eutectic_parser", "run_eutectic", "CAUTION", "INSTALL_HINT", "PAIR_COLUMNS"]

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


def run_eutectic(args) -> int:
    """The ``eutectic`` command; :class:`~ionicity.pipelines.errors.InputError` for bad input (exit 2)."""
    # the scorer and the liquidus model (about 60 ms, python -X importtime) load only when this command runs
    from ionicity.pipelines.eutectic import run_eutectic as run

    return run(args)
