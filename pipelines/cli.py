"""The ``ionicity`` command line: turns options into a config and calls the
:mod:`pipelines` API.

Exit codes (one place, also in ``--help``):
  0  done; rows that could not be scored are marked in the table
  1  with --strict, when any row has status error
  2  bad usage or unreadable input, with a one-line reason
  3  an internal error (a bug: please report it with --verbose output)
  130  interrupted (Ctrl-C or SIGTERM); no output file was left behind
"""
from __future__ import annotations

import argparse
import errno
import os
import signal
import sys
import threading

from ionicity._entry import INTERRUPTED_NOTHING_WRITTEN, interrupt_on
from ionicity.pipelines.aliases import load_aliases
from ionicity.pipelines.config import ScoreConfig
from ionicity.pipelines.errors import InputError
from ionicity.pipelines.eutectic_cli import add_eutectic_parser, run_eutectic
from ionicity.pipelines.explain import columns_table, explain_formula
from ionicity.pipelines.table_options import add_table_options, table_options
from ionicity.pipelines.melting_cli import CAUTION, add_fit_melting_parser
from ionicity.pipelines.report_cli import add_report_option, add_report_parser, check_report_option, report_after_score, run_report
from ionicity.pipelines.pool import default_workers, discard_prestarted, leave_process, prestart

EXIT_OK = 0
EXIT_STRICT_ERRORS = 1
EXIT_USAGE = 2
EXIT_INTERNAL = 3

_EPILOG = """exit codes:
  0  done; rows that could not be scored are marked in the table
  1  with --strict, when any row has status error
  2  bad usage or unreadable input, with a one-line reason
  3  an internal error
  130  interrupted (Ctrl-C or SIGTERM); no output file was left behind

Descriptors are estimates for screening and data work. They are not safety
data: check the safety data sheet, local codes and a qualified person before
storing, mixing, heating or wetting any chemical."""


class _Parser(argparse.ArgumentParser):
    def error(self, message: str):  # argparse's own exit code is already 2
        self.print_usage(sys.stderr)
        self.exit(EXIT_USAGE, f"ionicity: error: {message}\n")


def build_parser() -> argparse.ArgumentParser:
    parser = _Parser(
        prog="ionicity",
        description="Annotate tables of chemical formulas with ions, oxidation states and ionic-bonding descriptors.",
        epilog=_EPILOG,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    parser.add_argument("--verbose", action="store_true", help="show tracebacks for internal errors")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND")
    sub.required = True

    score = sub.add_parser("score", help="score a CSV, TSV or Parquet table", epilog=_EPILOG,
                           formatter_class=argparse.RawDescriptionHelpFormatter)
    score.add_argument("input", metavar="INPUT", help="input table (.csv, .tsv, .parquet, .xlsx, a folder or glob of Parquet parts, or - for CSV on"
                            " stdin); a path that exists is read as written, and *, ? and [ make a glob only when"
                            " it does not")
    score.add_argument("-o", "--output", default="-", help="output table; its extension sets the format (default: CSV on stdout)")
    score.add_argument("--formula-col", metavar="COL", help="column holding the formulas (default: the column named 'formula', any case)")
    score.add_argument("--name-col", metavar="COL", help="column naming each row; quoted in the message of rows that fail")
    score.add_argument("--prefix", default="", metavar="TEXT", help="prefix for every generated column name")
    score.add_argument("--strict", action="store_true", help="exit 1 when any row has status error")
    score.add_argument("--overwrite", action="store_true", help="replace an existing output: a regular file, or (--engine dask) a folder an earlier"
                            " run wrote; never a symlink, device or other folder")
    score.add_argument("--quiet", action="store_true", help="no progress and no summary on stderr")
    score.add_argument("--batch-rows", type=int, default=65536, metavar="N", help="rows per batch (default: 65536)")
    score.add_argument("--engine", choices=("local", "dask"), default="local",
                       help="local: this machine, batch by batch (default); dask: dask.dataframe on a local"
                            " cluster or on --scheduler, writing a folder of Parquet parts")
    score.add_argument("--workers", type=int, metavar="N",
                       help="processes scoring distinct formulas (dask: workers of the local cluster);"
                            " default: every core")
    score.add_argument("--scheduler", metavar="ADDRESS",
                       help="address of a running Dask scheduler, e.g. tcp://10.0.0.5:8786 (with --engine dask)")
    score.add_argument("--partition-rows", type=int, metavar="N",
                       help="with --engine dask: rows per partition, one task each (default: 100,000); Parquet row"
                            " groups larger than N are cut into row ranges")
    score.add_argument("--mp-model", metavar="PATH",
                       help="a melting-point model written by 'ionicity fit-melting': adds mp_predicted_K and its"
                            " 90%% interval (screening estimates, not safety data)")
    add_table_options(score)
    score.add_argument("--summary", metavar="FILE.json",
                       help="also write the audit summary (counts by status, class, slip, duplicates; rows to check) as JSON")
    add_report_option(score)
    score.add_argument("--aliases", metavar="FILE.csv",
                       help="your own blend names for mixtures: a CSV with columns name, mixture (e.g. 'LiCl-KCl"
                            " (58.8-41.2 mol%%)') and optionally source")
    score.add_argument("--verbose", action="store_true", help=argparse.SUPPRESS)

    explain = sub.add_parser("explain", help="every score of one compound, with the method and numbers behind it")
    explain.add_argument("formula", metavar="FORMULA")
    explain.add_argument("--verbose", action="store_true", help=argparse.SUPPRESS)

    columns = sub.add_parser("columns", help="every output column with its type, unit, method and source")
    columns.add_argument("--format", choices=("text", "markdown", "csv"), default="text")
    columns.add_argument("--groups", action="store_true", help="list the column groups that --columns takes")
    columns.add_argument("--notes", action="store_true", help="list the short codes written in value_notes")
    columns.add_argument("--verbose", action="store_true", help=argparse.SUPPRESS)

    add_fit_melting_parser(sub)
    add_report_parser(sub)
    add_eutectic_parser(sub)
    return parser


def _choose_memory_pool() -> None:
    """Arrow's jemalloc pool for this process, unless the user chose one
    (``ARROW_DEFAULT_MEMORY_POOL``) or this build of pyarrow has none.

    A run allocates and frees the same few hundred MB batch after batch. On
    the 2-core development machine the default pool (mimalloc, which asks for
    transparent huge pages) spent much of its time zeroing freshly faulted
    pages; with jemalloc the benchmark run was faster in 13 of 14 paired runs
    and its peak memory fell from about 410 to 310 MiB (DEVELOPERS.md,
    "Benchmarks"). Only the command line does this: the Python API leaves the
    caller's process alone."""
    if os.environ.get("ARROW_DEFAULT_MEMORY_POOL"):
        return
    # loaded by the engine's import in _run_score already (pyarrow alone: about 60 ms, python -X importtime)
    import pyarrow as pa

    try:
        pa.set_memory_pool(pa.jemalloc_memory_pool())
    except NotImplementedError:  # pyarrow built without jemalloc (Windows)
        pass


def _run_score(args) -> int:
    # the engine and pyarrow cost about 0.17 s (python -X importtime): the prestart must not wait for them
    from ionicity.pipelines.run import score_file

    check_report_option(args)
    if args.aliases:
        load_aliases(args.aliases)
    if args.engine == "local":
        _choose_memory_pool()
    config = ScoreConfig(
        input=args.input,
        output=args.output,
        formula_col=args.formula_col,
        name_col=args.name_col,
        prefix=args.prefix,
        overwrite=args.overwrite,
        strict=args.strict,
        quiet=args.quiet,
        batch_rows=args.batch_rows,
        engine=args.engine,
        workers=args.workers,
        scheduler=args.scheduler,
        mp_model=args.mp_model,
        partition_rows=args.partition_rows,
        **table_options(args),
        summary=args.summary,
    )
    summary = score_file(config)
    if args.mp_model and not args.quiet:
        print(CAUTION, file=sys.stderr)
    if not args.quiet:
        print(summary, file=sys.stderr)
    report_after_score(args, summary)
    if args.strict and summary.error:
        return EXIT_STRICT_ERRORS
    return EXIT_OK


def _run_explain(args) -> int:
    print(explain_formula(args.formula))
    return EXIT_OK


def _run_columns(args) -> int:
    print(columns_table(args.format, groups=args.groups, notes=args.notes))
    return EXIT_OK


def _interrupt_on_sigterm() -> None:
    """Turn SIGTERM into KeyboardInterrupt so a terminated run cleans up as Ctrl-C does."""
    if threading.current_thread() is not threading.main_thread():
        return
    try:
        interrupt_on(signal.SIGTERM)
    except (ValueError, OSError):
        pass


# an input file at least this large almost surely brings enough new
# formulas to need the worker processes: start them before the heavy imports
_PRESTART_BYTES = 1 << 20


def _prestart_workers(args) -> None:
    if args.command != "score" or args.engine != "local" or args.workers == 1 or args.aliases:
        # with --aliases the workers start after the names are loaded (pipelines/aliases.py)
        return
    try:
        large = os.path.isfile(args.input) and os.path.getsize(args.input) >= _PRESTART_BYTES
    except (OSError, ValueError, TypeError):
        large = False
    if large:
        workers = args.workers or default_workers()
        if workers >= 2:
            prestart(workers)


def main(argv: list[str] | None = None) -> int:
    try:
        args = build_parser().parse_args(argv)
    except KeyboardInterrupt:  # before the command is known: nothing was written
        print(INTERRUPTED_NOTHING_WRITTEN, file=sys.stderr)
        return 130
    if _stdout_closed(args):
        print("ionicity: error: standard output is closed; give an output file with -o", file=sys.stderr)
        return EXIT_USAGE
    try:
        _prestart_workers(args)
        return _dispatch(args)
    except KeyboardInterrupt:  # outside the command itself (workers starting, imports)
        return _interrupted(args)
    finally:
        _stop_prestarted_workers()


def _stop_prestarted_workers() -> None:
    try:
        discard_prestarted()
    except KeyboardInterrupt:  # a second Ctrl-C: leave now
        pass


def _interrupted(args) -> int:
    if getattr(args, "output", None) == "-":
        print("ionicity: interrupted; the table on stdout is incomplete", file=sys.stderr)
    else:
        print(INTERRUPTED_NOTHING_WRITTEN, file=sys.stderr)
    return 130


def _dispatch(args) -> int:
    try:
        if args.command == "score":
            return _run_score(args)
        if args.command == "report":
            return run_report(args)
        if args.command == "explain":
            return _run_explain(args)
        if args.command == "eutectic":
            return run_eutectic(args)
        if args.command == "fit-melting":
            # about 12 ms (python -X importtime) that a scoring run need not pay
            from ionicity.pipelines.melting_fit import run_fit_melting

            return run_fit_melting(args)
        return _run_columns(args)
    except InputError as exc:
        print(f"ionicity: error: {exc}", file=sys.stderr)
        return EXIT_USAGE
    except KeyboardInterrupt:
        return _interrupted(args)
    except BrokenPipeError:
        return EXIT_OK
    except OSError as exc:  # the machine, not ionicity: a full disk, a read-only or vanished folder, a device
        print(f"ionicity: error: {_os_problem(exc)}", file=sys.stderr)
        return EXIT_USAGE
    except Exception as exc:  # a bug: say so in one line unless --verbose
        if args.verbose:
            raise
        print(f"ionicity: internal error: {type(exc).__name__}: {exc} (rerun with --verbose for details)", file=sys.stderr)
        return EXIT_INTERNAL


def _os_problem(exc: OSError) -> str:
    """One line for an operating-system error: what failed and on which path."""
    what = exc.strerror or str(exc) or type(exc).__name__
    if exc.errno == errno.ENOSPC:
        what += " (free some space, or write the output elsewhere with -o)"
    if exc.errno == errno.EFBIG:
        what += " (a limit on file size: see ulimit -f, or the file system's largest file)"
    if exc.filename is not None:
        return f"{what}: {os.fsdecode(exc.filename)!r}"
    return what


def _stdout_closed(args) -> bool:
    """Python sets a standard stream to None when its descriptor was closed at
    start-up; a table or text for standard output then has nowhere to go."""
    if sys.stdout is not None:
        return False
    sys.stdout = open(os.devnull, "w")
    return args.command != "score" or args.output == "-"


def entry_point() -> None:
    if sys.stderr is None:  # closed at start-up: messages go nowhere, the exit code still tells
        sys.stderr = open(os.devnull, "w")
    _interrupt_on_sigterm()
    # the output is written, synced and closed, and the workers have stopped
    leave_process(main())
