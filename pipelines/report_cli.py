"""The command line of the report: ``ionicity report SCORED -o report.html``
and ``ionicity score ... --report report.html``.

Light on purpose (argparse only): the command line builds its parser before
it knows which command runs, so pyarrow loads only when a report is
written.
"""
from __future__ import annotations

import argparse
import os
import sys

from ionicity.pipelines.errors import InputError

__all__ = ["add_report_parser", "add_report_option", "check_report_option", "run_report", "report_after_score"]


def add_report_parser(sub) -> argparse.ArgumentParser:
    """The ``report`` subcommand."""
    report = sub.add_parser(
        "report", help="one self-contained HTML page summarising a scored table",
        description="Write one HTML page (figures inline, no network needed, printable) from a table written by"
                    " 'ionicity score': run summary, rows that need a person, bond-type map, melting, hard and"
                    " soft pairing, mixtures.",
    )
    report.add_argument("scored", metavar="SCORED", help="a table written by ionicity score (.parquet, .csv, .tsv,"
                        " or a folder of Parquet parts)")
    report.add_argument("-o", "--output", required=True, metavar="REPORT.html", help="the page to write")
    report.add_argument("--id-col", metavar="COL", help="input column identifying rows in the lists"
                        " (default: the first input column other than the formula and name)")
    report.add_argument("--name-col", metavar="COL", help="input column naming rows (default: the run's --name-col,"
                        " else a column called 'name')")
    report.add_argument("--overwrite", action="store_true", help="replace an existing page (a regular file only)")
    report.add_argument("--verbose", action="store_true", help=argparse.SUPPRESS)
    return report


def add_report_option(score: argparse.ArgumentParser) -> None:
    """``score --report REPORT.html``: the page of the table just written."""
    score.add_argument("--report", metavar="REPORT.html", help="also write the HTML report of the output table"
                       " (needs an output file, not stdout; replaced with --overwrite)")


def run_report(args) -> int:
    from ionicity.pipelines.report_html import report_file  # pyarrow: only when a report is written

    report_file(args.scored, args.output, overwrite=args.overwrite, id_col=args.id_col, name_col=args.name_col)
    print(f"ionicity: report written to {args.output}", file=sys.stderr)
    return 0


def check_report_option(args) -> None:
    """Refuse ``--report`` before scoring when it cannot be honoured."""
    if getattr(args, "report", None) and args.output == "-":
        raise InputError("--report needs the scored table in a file: give -o OUTPUT as well")
    if getattr(args, "report", None) and not args.report.lower().endswith((".html", ".htm")):
        raise InputError(f"--report {args.report!r} must end in .html or .htm")
    if getattr(args, "report", None) and os.path.lexists(args.report) and not args.overwrite:
        raise InputError(f"--report {args.report!r} exists; pass --overwrite to replace it")


def report_after_score(args, summary) -> None:
    """Write the report of the table a score run has just written."""
    if not getattr(args, "report", None):
        return
    from ionicity.pipelines.report_html import report_file  # only when asked for

    report_file(summary.output or args.output, args.report, overwrite=args.overwrite, name_col=args.name_col,
                run_seconds=summary.seconds)
    if not args.quiet:
        print(f"ionicity: report written to {args.report}", file=sys.stderr)
