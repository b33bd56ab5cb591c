"""The ``score`` options about tables as people keep them: delimiters,
encodings, Excel sheets, typed columns, chosen columns and precision.

Light (argparse only): the command line imports it at start-up.
"""
from __future__ import annotations

import argparse

__all__ = ["add_table_options", "table_options"]


def add_table_options(score: argparse.ArgumentParser) -> None:
    """Add the table options to the ``score`` parser."""
    score.add_argument("--sep", metavar="CHAR",
                       help="the CSV delimiter: , ; | or tab (default: found from the header line, comma, semicolon or tab)")
    score.add_argument("--encoding", metavar="NAME",
                       help="the input's text encoding: utf-8 (default), latin-1 or cp1252 (Windows)")
    score.add_argument("--sheet", metavar="NAME|NUMBER",
                       help="the sheet of an .xlsx input: its name, or its number from 1 (default: the first)")
    score.add_argument("--keep-text", action="store_true",
                       help="keep every CSV or .xlsx input column as text in a Parquet or .xlsx output"
                            " (default: columns of numbers or true/false get that type)")
    score.add_argument("--columns", metavar="LIST",
                       help="generated columns to write, names and groups joined by commas, e.g."
                            " 'melting,cations' (groups: 'ionicity columns --groups'); status and message always")
    score.add_argument("--full-precision", action="store_true",
                       help="write every float digit (default: each column's significant digits, 'ionicity columns')")


def table_options(args: argparse.Namespace) -> dict:
    """The :class:`~ionicity.pipelines.config.ScoreConfig` fields of the table options."""
    columns = None
    if args.columns is not None:
        columns = [c.strip() for c in args.columns.split(",") if c.strip()]
    return {
        "sep": args.sep, "encoding": args.encoding, "sheet": args.sheet, "keep_text": args.keep_text,
        "columns": columns, "full_precision": args.full_precision,
    }
