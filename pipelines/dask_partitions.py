"""How the Dask engine cuts a table into partitions, and what each partition
task does: read its rows, score them, write its own part.

A partition is a :class:`Piece`: for Parquet, a row range of one row group
of one file (a row group larger than ``partition_rows`` is cut into row
ranges); for CSV, a block of lines that Dask's CSV reader hands over as a
pandas frame. Each task writes ``part-NNNNNN.parquet`` (its piece's number,
so the parts are in input order) straight into the run's temporary folder
and returns only its counts, so no scored data passes through the client
or the scheduler.

Two ways to score the distinct formulas (chosen by
:func:`share_distinct`, measured in DEVELOPERS.md "Dask engine"):

* each worker keeps a cache of the formulas its partitions met (the worker
  plugin's); a formula that recurs in partitions on both workers is scored
  on both;
* *shared*: a first pass reads only the formula column of every piece and
  collects the distinct formulas of the whole table; they are scored once,
  in chunks spread over the workers, and every worker loads all chunks into
  its cache before its first partition. This pays when formulas recur across
  partitions on several workers (a table with many distinct formulas spread
  over many partitions): the work is then split between workers instead of
  repeated on each.

Runs in Dask workers: no module-level Dask import (the local engine imports
this module's neighbours and must not pay for Dask).
"""
from __future__ import annotations

import os
from dataclasses import dataclass

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc
import pyarrow.parquet as pq

from ionicity.pipelines.batch_assembly import score_batch
from ionicity.pipelines.duplicates import first_positions
from ionicity.pipelines.formula_cache import FormulaCache
from ionicity.pipelines.pool import score_values
from ionicity.pipelines.arrow_columns import as_text, int_numpy
from ionicity.pipelines.scheduler import ADDUCT_PATTERN as _ADDUCT_PATTERN
from ionicity.pipelines.text_cells import BadRows, mark_rows, text_table
from ionicity.scorer.verdict import STATUSES

#: keys of :func:`score_piece`'s counts: the rows whose cells were not text, the first of them (1-based, 0: none)
BAD_TEXT_ROWS, BAD_TEXT_FIRST_ROW = "bad_text_rows", "bad_text_first_row"

__all__ = [
    "DEFAULT_PARTITION_ROWS",
    "Piece",
    "parquet_pieces",
    "csv_block_bytes",
    "distinct_chunks",
    "piece_batches",
    "piece_distinct",
    "score_distinct",
    "share_distinct",
    "score_piece",
    "part_name",
    "BAD_TEXT_ROWS",
    "BAD_TEXT_FIRST_ROW",
]

# rows per partition: a few hundred milliseconds of scoring per task (Dask's
# own overhead is about a millisecond a task), and a partition's memory a
# few tens of MB whatever the table's size
DEFAULT_PARTITION_ROWS = 100_000
_BATCH_ROWS = 65536
# chunks of the distinct formulas per worker in the shared first pass: enough
# to balance the workers, few enough that each chunk's transfer is worth it
_CHUNKS_PER_WORKER = 4
_MIN_CHUNK = 2000


@dataclass(frozen=True)
class Piece:
    """Rows ``start`` to ``start + rows`` of row group ``row_group`` of Parquet file ``path``."""

    path: str
    row_group: int
    start: int
    rows: int


def parquet_pieces(paths: list[str], partition_rows: int) -> list[Piece]:
    """The pieces of Parquet files, in input order, each at most ``partition_rows`` rows."""
    pieces = []
    for path in paths:
        metadata = pq.ParquetFile(path).metadata
        for group in range(metadata.num_row_groups):
            rows = metadata.row_group(group).num_rows
            for start in range(0, rows, partition_rows):
                pieces.append(Piece(path, group, start, min(partition_rows, rows - start)))
    return pieces


def csv_block_bytes(path: str, partition_rows: int, sample_bytes: int = 1 << 20) -> int:
    """A CSV block size that holds about ``partition_rows`` rows, from the
    line lengths of the file's first ``sample_bytes``; at least 1 MB."""
    with open(path, "rb") as f:
        sample = f.read(sample_bytes)
    lines = max(sample.count(b"\n"), 1)
    return max(int(len(sample) / lines * partition_rows), 1 << 20)


def part_name(number: int) -> str:
    return f"part-{number:06d}.parquet"


def piece_batches(piece: Piece, schema: pa.Schema | None, columns: list[str] | None = None,
                  read_dictionary: list[str] | None = None):
    """The rows of one piece in batches of at most ``_BATCH_ROWS``, read as a
    stream: a piece cut from a large row group holds only its own rows and one
    batch in memory, never the whole row group (peak worker memory then does
    not grow with the row group, which grows with the table: pyarrow writes
    row groups of up to 1 Mi rows). Rows before the piece are decoded and
    dropped. With ``schema``, batches are cast to it (metadata dropped)."""
    end = piece.start + piece.rows
    at = 0
    with pq.ParquetFile(piece.path, read_dictionary=read_dictionary) as f:
        for batch in f.iter_batches(batch_size=_BATCH_ROWS, row_groups=[piece.row_group], columns=columns,
                                    use_threads=False):
            lo, hi = max(piece.start - at, 0), min(end - at, batch.num_rows)
            at += batch.num_rows
            if hi <= lo:
                if at >= end:
                    break
                continue
            if lo or hi < batch.num_rows:
                batch = batch.slice(lo, hi - lo)
            if schema is not None:
                batch = batch.replace_schema_metadata(None)
                if not batch.schema.equals(schema):
                    batch = batch.cast(schema)
            yield batch
            if at >= end:
                break


def piece_distinct(piece: Piece, formula_col: str) -> tuple[pa.Array, np.ndarray]:
    """The first pass over one piece: its distinct formula texts and the
    0-based position in the piece of each one's first row
    (:func:`ionicity.pipelines.duplicates.first_positions`). The column is read
    dictionary-encoded, as stored, so the texts are not hashed per row."""
    chunks = [b.column(0) for b in piece_batches(piece, None, [formula_col], read_dictionary=[formula_col])]
    if not chunks:
        return pa.array([], pa.string()), np.zeros(0, dtype=np.int64)
    column = pa.chunked_array(chunks)
    if pa.types.is_dictionary(column.type):
        column = column.unify_dictionaries()
    column = column.combine_chunks()
    if pa.types.is_dictionary(column.type):
        if not pa.types.is_string(column.type.value_type):
            column = as_text(column.dictionary_decode())
    elif not pa.types.is_string(column.type):
        column = as_text(column)
    return first_positions(column)


def share_distinct(per_piece: list[int], distinct: int, workers: int) -> bool:
    """Whether scoring the table's distinct formulas once, shared, beats a
    cache per worker: with several workers, when a formula is met in more
    than 1.5 pieces on average (it would then be scored on several workers)."""
    return workers >= 2 and len(per_piece) >= 2 and sum(per_piece) >= 1.5 * max(distinct, 1)


def distinct_chunks(formulas: pa.Array, workers: int) -> list[np.ndarray]:
    """The distinct formulas cut into about ``_CHUNKS_PER_WORKER`` chunks a
    worker, as positions into ``formulas``, the spellings of one salt kept
    together: ordered by (salt part, text), as
    :func:`ionicity.pipelines.scheduler.locality_key` orders them (resolving a
    salt is most of a formula's cost, and its hydrates then meet it in one
    worker's caches). ``formulas.take`` of each gives a chunk of its own, so a
    task is sent only its formulas. Sorted by Arrow: sorting 2 x 10^5 texts by
    ``locality_key`` in Python held the client 0.55 s of CPU while the
    workers waited (0.10 s this way, same order; ``time.process_time``).

    >>> [o.tolist() for o in distinct_chunks(pa.array(["KCl", "NaCl·2H2O", "NaCl", "KBr"]), 1)]
    [[3, 0, 2, 1]]
    """
    if not len(formulas):
        return []
    salt = pc.utf8_trim_whitespace(pc.list_element(pc.split_pattern_regex(formulas, _ADDUCT_PATTERN, max_splits=1), 0))
    # UTF-8 byte order is code-point order, as Python compares str
    order = int_numpy(pc.sort_indices(pa.table({"salt": salt, "text": formulas}),
                                      sort_keys=[("salt", "ascending"), ("text", "ascending")]))
    size = max(-(-len(order) // max(workers * _CHUNKS_PER_WORKER, 1)), _MIN_CHUNK)
    return [order[i:i + size].astype(np.int64) for i in range(0, len(order), size)]


def score_distinct(formulas: pa.Array, full_precision: bool = False) -> tuple[pa.Array, list[pa.Array]]:
    """Score a chunk of distinct formulas: (formulas, one array per generated
    column, rounded and noted as the workers' caches are), ready for
    :meth:`FormulaCache.adopt`."""
    texts = formulas.to_pylist()
    cache = FormulaCache(max_entries=len(texts) + 1)
    if not full_precision:
        cache.set_output_digits()
        cache.set_short_notes()
    cache.add(texts, score_values(texts))
    return cache.keys(), cache.arrays()


def _status_counts(status: pa.Array) -> dict[str, int]:
    if pa.types.is_dictionary(status.type):
        status = status.dictionary_decode()
    counts = pc.value_counts(status)
    return {v.as_py(): c.as_py() for v, c in zip(counts.field("values"), counts.field("counts"))
            if v.as_py() in STATUSES}


def _formula_hashes(column: pa.Array) -> np.ndarray:
    # a stable 64-bit hash of each distinct non-empty formula (Python's own
    # hash differs between worker processes); pandas is loaded in a Dask worker
    import pandas as pd

    if pa.types.is_dictionary(column.type):
        column = column.dictionary_decode()
    if not pa.types.is_string(column.type):
        column = pc.cast(column, pa.string())
    distinct = pc.unique(column).drop_null()
    distinct = distinct.filter(pc.not_equal(pc.utf8_trim_whitespace(distinct), ""))
    return pd.util.hash_array(np.asarray(distinct.to_pylist(), dtype=object))


def score_piece(number: int, source, table_schema: pa.Schema, formula_col: str, name_col: str | None,
                schema: pa.Schema, model, folder: str, metadata: dict, cache: FormulaCache,
                count_distinct: bool, status_name: str, chosen=None,
                first_rows=None, row_offset: int = 0, encoding: str = "utf-8") -> tuple[dict[str, int], np.ndarray | None]:
    """Score one partition into ``folder/part-NNNNNN.parquet``.

    ``source`` is a :class:`Piece` (Parquet) or a pandas frame (a CSV block,
    read with ``encoding_errors="surrogateescape"``: its cells that were not
    text become their rows' errors, :mod:`ionicity.pipelines.text_cells`,
    numbered from ``row_offset``, the data rows before the block).
    ``first_rows`` fills ``first_row_same_compound`` (a
    :class:`~ionicity.pipelines.duplicates.KnownFirstRows` for this partition).
    Returns the status counts (with ``BAD_TEXT_ROWS`` and ``BAD_TEXT_FIRST_ROW``
    where some cells were not text) and, when ``count_distinct``, the hashes of the partition's
    distinct formulas (for the run's distinct count)."""
    bad_rows = BadRows(encoding)
    if isinstance(source, Piece):
        batches = piece_batches(source, table_schema)
        table = None
    else:
        table, found = text_table(source, table_schema)
        bad_rows.add(row_offset, found)
        batches = table.to_batches(max_chunksize=_BATCH_ROWS)
    out_schema = schema.with_metadata(metadata) if metadata else schema
    counts = dict.fromkeys(STATUSES, 0)
    status_at = schema.get_field_index(status_name)
    path = os.path.join(folder, part_name(number))
    message_name = status_name[:-len("status")] + "message"
    with pq.ParquetWriter(path, out_schema, write_statistics=True) as writer:
        written = done = 0
        for batch in batches:
            scored = score_batch(batch, formula_col, schema, cache, name_col=name_col, model=model, chosen=chosen,
                                 first_rows=first_rows)
            scored = mark_rows(scored, bad_rows.take(row_offset + done, batch.num_rows), status_name, message_name,
                               formula_col)
            done += batch.num_rows
            writer.write_batch(scored)
            written += 1
            for status, n in _status_counts(scored.column(status_at)).items():
                counts[status] += n
        if not written:
            writer.write_table(out_schema.empty_table())
    hashes = _formula_hashes(table.column(formula_col).combine_chunks()) if count_distinct and table is not None else None
    if bad_rows.count:
        counts[BAD_TEXT_ROWS], counts[BAD_TEXT_FIRST_ROW] = bad_rows.count, bad_rows.first_row
    return counts, hashes
