"""Streaming table I/O: read CSV, TSV, Parquet or ``.xlsx`` in row batches;
write batch by batch to a temporary file that is renamed into place only when
complete.

Input cells pass through unchanged: CSV and TSV columns are read as text
(so ``007`` stays ``007`` and an empty cell stays empty), Parquet columns
keep their types. The reader also infers, from the first rows, which text
columns hold numbers or booleans (``TableReader.column_types``); an engine
writing a typed output applies them (:mod:`ionicity.pipelines.column_types`).
A CSV's delimiter (comma, semicolon or tab) is found from its header line
unless given; ``encoding`` reads Latin-1 and Windows-1252 text.

The writer (a temporary file linked into place) is
:mod:`ionicity.pipelines.table_writer` and formats by extension
:mod:`ionicity.pipelines.table_formats`; both names are re-exported here.
Where outputs go, what they may replace and what is kept beside them:
:mod:`ionicity.pipelines.output_paths`.
"""
from __future__ import annotations

import glob
import io
import os
import sys
from dataclasses import dataclass, field
from typing import Callable, Iterator

import pyarrow as pa
import pyarrow.csv as pacsv
import pyarrow.parquet as pq

from ionicity.pipelines.column_types import infer_types
from ionicity.pipelines.csv_blocks import (block_for_header, growing_batches, head_with_header_line, header_line_end,
                                          is_block_too_small)
from ionicity.pipelines.errors import InputError
from ionicity.pipelines.schema import MAX_INPUT_COLUMNS, check_width
from ionicity.pipelines.text_cells import BadRows, arrow_codec, marked_cells, text_batch
from ionicity.pipelines.text_dialect import ENCODING_HINT, SPELLED, check_delimiter, check_encoding, encoding_problem, sniff_delimiter
from ionicity.pipelines.table_formats import FORMATS, format_of
# the writer lives in its own module; its name stays importable from here
from ionicity.pipelines.table_writer import TableWriter

__all__ = [
    "InputError",
    "TableReader",
    "TableWriter",
    "open_reader",
    "format_of",
    "FORMATS",
]

_BLOCK_SIZE = 1 << 22
# the header is read from this much of the input before the streaming reader
# starts, so that stdin can be replayed and bad encodings caught before any
# output exists
_HEAD_BYTES = 1 << 20
_HEADER_BLOCK = 1 << 18

# --------------------------------------------------------------------------- reading


@dataclass
class TableReader:
    """Row batches of one input table, with its schema known up front.

    ``total_rows`` is known for Parquet; for CSV and TSV files
    ``fraction_done()`` estimates progress from the bytes read so far.
    """

    schema: pa.Schema
    batches: Iterator[pa.RecordBatch]
    fmt: str
    source: str
    total_rows: int | None = None
    fraction_done: Callable[[], float | None] = field(default=lambda: None)
    paths: tuple[str, ...] = ()
    #: string columns a Parquet input hands over dictionary-encoded as they
    #: are stored (``dictionary<int32, string>`` in the batches), so that
    #: their distinct values are known without hashing every row; set before
    #: the first batch is taken. Other formats ignore it.
    read_dictionary: tuple[str, ...] = ()
    #: text columns whose first rows all hold numbers or booleans, with that
    #: type (CSV, TSV and .xlsx inputs; :func:`~ionicity.pipelines.column_types.infer_types`)
    column_types: dict = field(default_factory=dict)
    #: the CSV delimiter used (found or given)
    delimiter: str = ","
    #: rows read so far whose cells were not text in the encoding (CSV and TSV;
    #: :class:`~ionicity.pipelines.text_cells.BadRows`): the engine marks them error
    bad_rows: BadRows | None = None


class _CountingStream(io.RawIOBase):
    """A read-only stream that replays ``head`` then continues with ``raw``,
    counting the bytes handed out (for the progress estimate)."""

    def __init__(self, head: bytes, raw):
        self._head = memoryview(head)
        self._raw = raw
        self.consumed = 0

    def readable(self) -> bool:
        return True

    def close_input(self) -> None:
        self._raw.close()

    def readinto(self, buffer) -> int:
        if self._head.nbytes:
            n = min(len(buffer), self._head.nbytes)
            buffer[:n] = self._head[:n]
            self._head = self._head[n:]
        else:
            data = self._raw.read(len(buffer))
            n = len(data)
            buffer[:n] = data
        self.consumed += n
        return n

    def read(self, size: int = -1) -> bytes:
        if size is None or size < 0:
            chunks = [bytes(self._head), self._raw.read()]
            self._head = memoryview(b"")
            data = b"".join(chunks)
            self.consumed += len(data)
            return data
        buffer = bytearray(size)
        n = self.readinto(buffer)
        return bytes(buffer[:n])


def _read_head(raw) -> bytes:
    chunks, size = [], 0
    while size < _HEAD_BYTES:
        data = raw.read(_HEAD_BYTES - size)
        if not data:
            break
        chunks.append(data)
        size += len(data)
    return b"".join(chunks)


def _first_line(exc: BaseException) -> str:
    text = str(exc).strip()
    return text.splitlines()[0] if text else type(exc).__name__


def text_schema(names: list[str]) -> pa.Schema:
    """A text table's schema: every column text."""
    return pa.schema([(n, pa.string()) for n in names])


def _read_csv(path: str, delimiter: str | None, batch_rows: int, encoding: str = "utf-8") -> TableReader:
    if path == "-":
        if sys.stdin is None:  # Python's mark of a descriptor closed at start-up
            raise InputError("standard input is closed; give the input file's path instead of -")
        raw = sys.stdin.buffer
        total_bytes = None
        label = "standard input"
    else:
        if not os.path.exists(path):
            raise InputError(f"input file {path!r} does not exist")
        if os.path.isdir(path):
            raise InputError(f"input {path!r} is a folder; folders are read as Parquet parts only")
        try:
            raw = open(path, "rb")
        except OSError as exc:
            raise InputError(f"cannot open {path!r}: {exc.strerror or exc}") from None
        total_bytes = os.fstat(raw.fileno()).st_size
        label = repr(path)
    head = _read_head(raw)
    head, complete = head_with_header_line(raw, head, len(head) < _HEAD_BYTES, label)
    header_block = len(head) if complete else min(block_for_header(head, _HEADER_BLOCK), len(head))
    if not head.strip(b"\r\n\t \xef\xbb\xbf"):
        raise InputError(f"input {label} is empty: expected a header row and data rows")
    # a data cell that is not text is its row's error (text_cells); the column names must be text
    end = header_line_end(head) if encoding in ("utf-8", "cp1252") else len(head)
    problem = encoding_problem(head[:end], complete or end < len(head), encoding)
    if problem:
        raise InputError(f"input {label} {problem}")
    if delimiter is None:
        delimiter = sniff_delimiter(head[:_HEADER_BLOCK].decode(encoding, errors="replace"), ",")
    kind = "TSV" if delimiter == "\t" else "CSV"
    parse_options = pacsv.ParseOptions(delimiter=delimiter, newlines_in_values=True)
    # Arrow transcodes any other encoding to UTF-8 as it reads
    read_encoding = {} if encoding == "utf-8" else {"encoding": arrow_codec(encoding)}
    def header_names(text: bytes) -> list[str]:
        return pacsv.open_csv(
            io.BytesIO(text), read_options=pacsv.ReadOptions(block_size=max(len(text), 1) if text is not head
                                                             else header_block, **read_encoding),
            parse_options=parse_options,
            convert_options=pacsv.ConvertOptions(column_types={}, strings_can_be_null=False,
                                                 quoted_strings_can_be_null=False),
        ).schema.names

    try:
        if head[:header_line_end(head)].count(delimiter.encode()) >= MAX_INPUT_COLUMNS:
            # Arrow's type inference over tens of thousands of columns takes minutes: count them first
            check_width(header_names(head[:header_line_end(head)]))
        try:
            names = header_names(head)
        except pa.ArrowInvalid as exc:
            if not is_block_too_small(exc):
                raise
            # a first row longer than the head: the names from the header line alone
            names = header_names(head[:header_line_end(head)])
        bytes_options = pacsv.ConvertOptions(column_types={n: pa.binary() for n in names}, strings_can_be_null=False,
                                             quoted_strings_can_be_null=False)
        try:
            sample, _ = text_batch(pacsv.open_csv(
                io.BytesIO(head),
                read_options=pacsv.ReadOptions(block_size=header_block, **read_encoding),
                parse_options=parse_options, convert_options=bytes_options,
            ).read_next_batch(), text_schema(names))
        except pa.ArrowInvalid as exc:
            if not is_block_too_small(exc):
                raise
            sample = None  # a first row longer than the head: no types guessed, every column stays text
    except StopIteration:
        sample = None
    except (pa.ArrowInvalid, UnicodeDecodeError) as exc:
        raise InputError(f"cannot read {label} as {kind}: {_first_line(exc)}") from None
    if len(set(names)) != len(names):
        dupes = sorted({n for n in names if names.count(n) > 1})
        raise InputError(f"input {label} has duplicate column names {dupes}; rename them first")
    if any(n == "" for n in names):
        raise InputError(f"input {label} has a column with an empty name; give every column a name")
    if len(names) == 1:
        # one column: a blank line is an empty cell, and dropping it would lose a row
        parse_options = pacsv.ParseOptions(delimiter=delimiter, newlines_in_values=True, ignore_empty_lines=False)
    # read as bytes, made text batch by batch: a cell that is not UTF-8 is then its row's error, not the file's
    byte_types = pacsv.ConvertOptions(column_types={n: pa.binary() for n in names}, strings_can_be_null=False,
                                      quoted_strings_can_be_null=False)
    schema = text_schema(names)
    bad_rows = BadRows(encoding)
    streams = [_CountingStream(head, raw)]

    def open_stream(block: int, skip: int):
        if skip:  # a row did not fit the block: read the file again, past the rows already given
            streams[0].close_input()
            streams[0] = _CountingStream(b"", open(path, "rb"))
        return pacsv.open_csv(streams[0], read_options=pacsv.ReadOptions(block_size=block, skip_rows_after_names=skip,
                                                                         **read_encoding),
                              parse_options=parse_options, convert_options=byte_types)

    def batches() -> Iterator[pa.RecordBatch]:
        offset = 0
        try:
            for batch in growing_batches(open_stream, max(_BLOCK_SIZE, block_for_header(head, _HEADER_BLOCK)), label,
                                         can_restart=path != "-"):
                batch, found = text_batch(batch, schema)
                if encoding == "cp1252":
                    batch, undefined = marked_cells(batch)
                    found = {**undefined, **found}
                bad_rows.add(offset, found)
                offset += batch.num_rows
                for start in range(0, batch.num_rows, batch_rows):
                    yield batch.slice(start, batch_rows)
        except (pa.ArrowInvalid, UnicodeDecodeError) as exc:
            text = _first_line(exc)
            if "UTF8" in text or "utf8" in text or "utf-8" in text or "codec" in text:
                raise InputError(f"input {label} is not valid {SPELLED[encoding]} text; {ENCODING_HINT[encoding]}") from None
            raise InputError(f"cannot read {label} as {kind}: {text}") from None
        finally:
            if path != "-":
                streams[0].close_input()

    def fraction_done() -> float | None:
        if not total_bytes:
            return None
        return min(streams[0].consumed / total_bytes, 1.0)

    return TableReader(
        schema, batches(), "tsv" if delimiter == "\t" else "csv", path,
        fraction_done=fraction_done, paths=(path,), delimiter=delimiter, bad_rows=bad_rows,
        # standard input cannot be read again should a later row not fit: it stays text
        column_types=infer_types(sample) if path != "-" else {},
    )


def _parquet_paths(path: str) -> list[str]:
    if os.path.isdir(path):
        paths = sorted(
            p for p in glob.glob(os.path.join(path, "**", "*"), recursive=True)
            if os.path.isfile(p) and p.lower().endswith((".parquet", ".pq"))
            and not os.path.basename(p).startswith((".", "_"))
        )
    elif os.path.exists(path):
        # a path is literal: data[1].parquet is that file, never a pattern matching data1.parquet
        paths = [path]
    elif any(ch in path for ch in "*?["):
        paths = sorted(p for p in glob.glob(path, recursive=True) if os.path.isfile(p))
    else:
        raise InputError(f"input file {path!r} does not exist")
    if not paths:
        raise InputError(f"no Parquet files found at {path!r}")
    return paths


def _read_parquet(path: str, batch_rows: int) -> TableReader:
    paths = _parquet_paths(path)
    try:
        files = [pq.ParquetFile(p) for p in paths]
    except (pa.ArrowInvalid, OSError) as exc:
        raise InputError(f"cannot read {path!r} as Parquet: {_first_line(exc)}") from None
    schema = files[0].schema_arrow
    for p, f in zip(paths[1:], files[1:]):
        if not f.schema_arrow.equals(schema, check_metadata=False):
            raise InputError(f"Parquet part {p!r} has a different schema from {paths[0]!r}")
    schema = schema.remove_metadata()
    total = sum(f.metadata.num_rows for f in files)

    def batches() -> Iterator[pa.RecordBatch]:
        try:
            names = [n for n in reader.read_dictionary if n in schema.names and schema.field(n).type == pa.string()]
            dictionary_schema = schema
            for n in names:
                at = schema.get_field_index(n)
                dictionary_schema = dictionary_schema.set(at, schema.field(n).with_type(pa.dictionary(pa.int32(), pa.string())))
            for i in range(len(files)):
                for batch in _part_batches(files, i, paths[i], names, batch_rows):
                    encoded = names and pa.types.is_dictionary(batch.schema.field(names[0]).type)
                    yield pa.RecordBatch.from_arrays(batch.columns, schema=dictionary_schema if encoded else schema)
        except (pa.ArrowInvalid, OSError) as exc:
            raise InputError(f"cannot read {path!r} as Parquet: {_first_line(exc)}") from None
        finally:
            for f in files:
                f.close()

    reader = TableReader(schema, batches(), "parquet", path, total_rows=total, paths=tuple(paths))
    return reader


def _part_batches(files: list, i: int, path: str, names: list[str], batch_rows: int) -> Iterator[pa.RecordBatch]:
    """Batches of Parquet part ``i``, the columns ``names`` dictionary-encoded
    as stored when that is cheap. It is not when the part's values are
    mostly distinct: the writer then gave up its dictionary part-way, the
    reader rebuilds one that grows with every batch, and each batch carries
    a copy of it. A first batch whose dictionary outnumbers its rows shows
    that, and the part is read again plainly (``files[i]`` is replaced)."""
    if not names:
        yield from files[i].iter_batches(batch_size=batch_rows)
        return
    files[i].close()
    files[i] = pq.ParquetFile(path, read_dictionary=names)
    batches = files[i].iter_batches(batch_size=batch_rows)
    first = next(batches, None)
    if first is None:
        return
    if any(len(first.column(n).dictionary) > first.num_rows for n in names):
        files[i].close()
        files[i] = pq.ParquetFile(path)
        yield from files[i].iter_batches(batch_size=batch_rows)
        return
    yield first
    yield from batches


def open_reader(path: str, batch_rows: int = 65536, sep: str | None = None, encoding: str | None = None,
                sheet: str | int | None = None) -> TableReader:
    """Open an input table for batch reading; raises :class:`InputError`.

    ``path`` is a ``.csv``, ``.tsv``, ``.parquet`` or ``.xlsx`` file, a folder
    or glob of Parquet parts, or ``-`` for CSV on standard input. A path that
    exists is read as written; ``*``, ``?`` and ``[`` make a pattern only when
    it does not. ``sep`` is a CSV's delimiter (found from the header line when
    ``None``: comma, semicolon or tab), ``encoding`` its text encoding
    (``utf-8``, ``latin-1`` or ``cp1252``), ``sheet`` the sheet of an
    ``.xlsx`` file (a name, or a number from 1; default the first).
    """
    fmt = format_of(path)
    if fmt == "parquet":
        return _read_parquet(path, batch_rows)
    if fmt == "xlsx":
        # openpyxl (about 80 ms, python -X importtime) is an optional extra: only .xlsx input loads it
        from ionicity.pipelines.xlsx_io import read_xlsx

        schema, batches, column_types = read_xlsx(path, batch_rows, sheet)
        return TableReader(schema, batches, "xlsx", path, paths=(path,), column_types=column_types)
    # a .tsv is tab-separated by its name; a .csv (or standard input) is sniffed
    delimiter = check_delimiter(sep) or ("\t" if fmt == "tsv" else None)
    return _read_csv(path, delimiter, batch_rows, check_encoding(encoding))
