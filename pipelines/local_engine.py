"""The local engine's file driver: :func:`score_file_local` streams one input
file into one output file on this machine.

Per slice of the input: hand its formula column to the run's
:class:`~ionicity.pipelines.scheduler.BatchScorer` (new formulas go to the
workers at once), and, in input order, write every slice whose formulas are
in (:func:`~ionicity.pipelines.batch_assembly.score_batch`, then the writer
thread of :class:`~ionicity.pipelines.io.TableWriter`). The first rows come
in small slices, doubling up to ``--batch-rows``, so that results flow while
the workers start; up to :data:`_READ_AHEAD_BATCHES` slices are read ahead of
the one being written. :func:`prepare` (open the input, check the options
against it) is shared with the Dask engine.
"""
from __future__ import annotations

import os
import time
from collections import deque

import pyarrow as pa
import pyarrow.compute as pc

from ionicity._entry import stop_if_interrupted
from ionicity.pipelines.batch_assembly import score_batch
from ionicity.pipelines.duplicates import FirstRows
from ionicity.pipelines.config import ScoreConfig, Summary
from ionicity.pipelines.errors import InputError
from ionicity.pipelines.column_types import ColumnTyper, TypeFallback
from ionicity.pipelines.io import TableWriter, format_of, open_reader
from ionicity.pipelines.model_step import load_model_applier
from ionicity.pipelines.progress import Progress
from ionicity.pipelines.provenance import provenance_metadata
from ionicity.pipelines.scheduler import PARALLEL_MIN_NEW, BatchScorer, formula_array
from ionicity.pipelines.text_cells import BadRows, bytes_cells, mark_rows
from ionicity.pipelines.schema import (
    check_formula_type,
    check_name_column,
    chosen_columns,
    find_formula_column,
    output_schema,
)
from ionicity.scorer.verdict import STATUSES

# rows of one Excel sheet (Excel specifications and limits); the .xlsx writer
# checks the same figure as rows arrive
MAX_XLSX_ROWS = 1_048_576

__all__ = ["score_file_local", "prepare", "count_status", "input_typer"]

# batches read and sent for scoring before the oldest is written
_READ_AHEAD_BATCHES = 8
_FIRST_SLICE_ROWS = 4096


def prepare(config: ScoreConfig):
    """Open the input and check the options against it: returns the reader,
    the formula column and the output schema. Raises :class:`InputError`."""
    config.validate()
    reader = open_reader(config.input, config.batch_rows, sep=config.sep, encoding=config.encoding, sheet=config.sheet)
    names = reader.schema.names
    formula_col = find_formula_column(names, config.formula_col)
    check_formula_type(reader.schema, formula_col)
    check_name_column(names, config.name_col)
    chosen = chosen_columns(config.columns, config.mp_model is not None)
    return reader, formula_col, output_schema(reader.schema, config.prefix, with_model=config.mp_model is not None,
                                              chosen=chosen, with_names=config.name_col is not None)


def input_typer(config: ScoreConfig, reader, formula_col: str, text_columns=frozenset()) -> ColumnTyper:
    """The typing of a text input's columns for this run: the reader's
    inferred types for a Parquet or .xlsx output, without ``--keep-text``;
    the formula and name columns and ``text_columns`` stay text. A CSV or TSV
    output keeps every cell as it was read."""
    typed_output = config.output != "-" and format_of(config.output) in ("parquet", "xlsx")
    if config.keep_text or not typed_output:
        return ColumnTyper(reader.schema, {})
    keep = {formula_col, config.name_col, *text_columns}
    return ColumnTyper(reader.schema, {n: t for n, t in reader.column_types.items() if n not in keep})


def score_file_local(config: ScoreConfig, tally=None) -> Summary:
    """Score ``config.input`` into ``config.output`` on this machine, batch
    by batch; see the module docstring. Raises :class:`InputError` for
    unusable input or options; nothing is written at the output path then.
    The run's scorer, its cache and its workers go when it returns.

    A text input's column whose later rows do not fit the type inferred from
    its first rows is kept as text: the run starts again so (no row is lost,
    the output's schema is one), and the summary says which column.
    ``tally`` (an :class:`~ionicity.pipelines.audit_summary.AuditTally`), when
    given, counts every scored batch for ``--summary``.
    """
    started = time.perf_counter()
    text_columns: set[str] = set()
    notes: list[str] = []
    while True:
        try:
            summary = _score_once(config, text_columns, tally)
        except TypeFallback as fallback:
            text_columns.add(fallback.column)
            notes.append(fallback.note)
            if tally is not None:  # the run starts again: so do its counts
                tally.__init__(tally.formula_col, tally.prefix, tally.name_col, tally.id_col, tally.examples)
            continue
        summary.notes = notes + summary.notes
        summary.seconds = time.perf_counter() - started
        return summary


def _score_once(config: ScoreConfig, text_columns: set, tally=None) -> Summary:
    model = load_model_applier(config)
    reader, formula_col, _ = prepare(config)
    typer = input_typer(config, reader, formula_col, text_columns)
    chosen = chosen_columns(config.columns, config.mp_model is not None)
    schema = output_schema(typer.schema, config.prefix, with_model=config.mp_model is not None, chosen=chosen,
                           with_names=config.name_col is not None)
    if config.output != "-" and format_of(config.output) == "xlsx" and (reader.total_rows or 0) >= MAX_XLSX_ROWS:
        raise InputError(f"an .xlsx sheet holds at most {MAX_XLSX_ROWS:,} rows including the header, and"
                         f" {config.input!r} has {reader.total_rows:,}; write .csv or .parquet instead")
    # the formulas' distinct values straight from the Parquet dictionary
    # pages: hashing every row's text cost more than a fifth of this process's time
    reader.read_dictionary = (formula_col,) + ((config.name_col,) if config.name_col else ())
    metadata = provenance_metadata(config, formula_col) if config.output != "-" and config.output.lower().endswith((".parquet", ".pq")) else None
    # Parquet min/max statistics for the input and the numeric columns only:
    # on generated text (free text, or a few labels found in every row group)
    # no reader could skip a row group by them, and they cost a fifth of the write
    statistics = [f.name for f in schema if not pa.types.is_dictionary(f.type)]
    writer = TableWriter(config.output, schema, overwrite=config.overwrite, metadata=metadata, inputs=reader.paths,
                         background=True, statistics=statistics)
    summary = Summary(output=config.output)
    progress = Progress(not config.quiet, reader.total_rows, reader.fraction_done)
    status_name = config.prefix + "status"
    scorer = BatchScorer(config.workers)
    if not config.full_precision:
        scorer.cache.set_output_digits()
        scorer.cache.set_short_notes()
    first_rows = FirstRows()
    # bytes columns (Parquet) into a CSV or TSV, which cannot hold a cell that is not UTF-8 as it was
    bytes_to_text = [f.name for f in reader.schema if pa.types.is_binary(f.type) or pa.types.is_large_binary(f.type)
                     ] if config.output == "-" or format_of(config.output) in ("csv", "tsv") else []
    bad_rows = reader.bad_rows if reader.bad_rows is not None or not bytes_to_text else BadRows()
    waiting: deque = deque()  # (batch, ticket): submitted, not written yet

    def finish() -> None:
        batch, ticket = waiting.popleft()
        scored = score_batch(batch, formula_col, schema, scorer, name_col=config.name_col, model=model, ticket=ticket,
                             chosen=chosen, first_rows=first_rows)
        if bytes_to_text:
            bad_rows.add(summary.rows, bytes_cells(batch, bytes_to_text))
        if bad_rows is not None:  # cells that were not text: their rows are errors
            scored = mark_rows(scored, bad_rows.take(summary.rows, batch.num_rows), status_name,
                               config.prefix + "message", formula_col)
        writer.write(scored)
        if tally is not None:
            tally.add(scored)
        summary.rows += batch.num_rows
        count_status(summary, scored, status_name)
        progress.update(summary.rows)

    try:
        if _worth_a_pool(reader):
            scorer.start()
        # Read ahead: while the workers score the new formulas of later
        # batches, earlier ones are taken from the cache and written.
        for batch in _slices(reader.batches, config.batch_rows):
            stop_if_interrupted()  # a Ctrl-C raised where a library dropped it (ionicity._entry)
            batch = typer.convert(batch)
            waiting.append((batch, scorer.submit(formula_array(batch, formula_col))))
            while waiting and (len(waiting) > _READ_AHEAD_BATCHES or scorer.ready(waiting[0][1])):
                finish()
        while waiting:
            finish()
        if summary.rows == 0:
            raise InputError(f"input {config.input!r} has a header but no data rows")
        writer.commit()
    except BaseException:
        writer.abort()
        scorer.close(cancel=True)
        raise
    finally:
        progress.close()
    scorer.close()
    summary.distinct_formulas = scorer.distinct_formulas
    if bad_rows is not None and bad_rows.note(config.input):
        summary.notes.append(bad_rows.note(config.input))
    return summary


def _slices(batches, batch_rows: int):
    """The input's first rows in small slices, doubling up to ``batch_rows``:
    the first results are ready (and written) while the workers score the
    rest."""
    size = min(_FIRST_SLICE_ROWS, batch_rows)
    for batch in batches:
        offset = 0
        while offset < batch.num_rows:
            n = min(size, batch.num_rows - offset)
            yield batch.slice(offset, n) if n < batch.num_rows else batch
            offset += n
            size = min(size * 2, batch_rows)


def _worth_a_pool(reader) -> bool:
    """Whether the input is large enough that starting the worker pool
    before the first batch arrives is worth it (it usually is needed then)."""
    if reader.total_rows is not None:
        return reader.total_rows >= 16 * PARALLEL_MIN_NEW
    try:
        return os.path.getsize(reader.source) >= 1 << 18
    except (OSError, TypeError, ValueError):
        return False


def count_status(summary: Summary, batch: pa.RecordBatch, status_name: str) -> None:
    """Add a scored batch's rows per status to ``summary``."""
    counts = pc.value_counts(batch.column(batch.schema.get_field_index(status_name))).to_pylist()
    for item in counts:
        if item["values"] in STATUSES:
            setattr(summary, item["values"], getattr(summary, item["values"]) + item["counts"])
