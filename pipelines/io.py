"""Streaming table I/O: read CSV, TSV or Parquet in row batches; write batch by
batch to a temporary file that is renamed into place only when complete.

Input cells pass through unchanged: CSV and TSV columns are read as text
(nothing is inferred, so ``007`` stays ``007`` and an empty cell stays
empty), Parquet columns keep their types.
"""
from __future__ import annotations

import glob
import io
import os
import sys
import tempfile
from dataclasses import dataclass
from pathlib import Path
from typing import Iterator

import pyarrow as pa
import pyarrow.csv as pacsv
import pyarrow.parquet as pq

__all__ = ["InputError", "TableReader", "TableWriter", "open_reader", "format_of", "FORMATS"]

FORMATS = {".csv": "csv", ".tsv": "tsv", ".tab": "tsv", ".txt": "tsv", ".parquet": "parquet", ".pq": "parquet"}
_BLOCK_SIZE = 1 << 22


class InputError(ValueError):
    """Unusable input or options; the message is one line meant for a person."""


def format_of(path: str) -> str:
    """The table format named by a path's extension (``-`` is CSV)."""
    if path == "-":
        return "csv"
    p = Path(path)
    if p.is_dir():
        return "parquet"
    suffix = p.suffix.lower()
    if suffix in FORMATS:
        return FORMATS[suffix]
    if any(ch in path for ch in "*?["):
        return "parquet"
    raise InputError(
        f"cannot tell the format of {path!r} from its extension; use .csv, .tsv or .parquet"
    )


@dataclass
class TableReader:
    """Row batches of one input table, with its schema known up front."""

    schema: pa.Schema
    batches: Iterator[pa.RecordBatch]
    fmt: str
    source: str


def _parquet_paths(path: str) -> list[str]:
    if os.path.isdir(path):
        paths = sorted(glob.glob(os.path.join(path, "**", "*.parquet"), recursive=True))
    elif any(ch in path for ch in "*?["):
        paths = sorted(glob.glob(path, recursive=True))
    else:
        paths = [path]
    if not paths:
        raise InputError(f"no Parquet files found at {path!r}")
    return paths


def _read_csv(path: str, delimiter: str, batch_rows: int) -> TableReader:
    source = sys.stdin.buffer if path == "-" else path
    if path != "-" and not os.path.exists(path):
        raise InputError(f"input file {path!r} does not exist")
    if path == "-":
        source = io.BytesIO(sys.stdin.buffer.read())
    try:
        header_reader = pacsv.open_csv(
            source,
            read_options=pacsv.ReadOptions(block_size=_BLOCK_SIZE),
            parse_options=pacsv.ParseOptions(delimiter=delimiter, newlines_in_values=True),
            convert_options=pacsv.ConvertOptions(column_types={}, strings_can_be_null=False),
        )
        names = header_reader.schema.names
    except pa.ArrowInvalid as exc:
        text = str(exc)
        if "Empty CSV file" in text:
            raise InputError(f"input {path!r} is empty: expected a header row and data rows") from None
        if "UTF8" in text or "utf8" in text or "UTF-8" in text:
            raise InputError(f"input {path!r} is not valid UTF-8 text; re-save it as UTF-8") from None
        raise InputError(f"cannot read {path!r} as {'TSV' if delimiter == chr(9) else 'CSV'}: {text.splitlines()[0]}") from None
    if len(set(names)) != len(names):
        dupes = sorted({n for n in names if names.count(n) > 1})
        raise InputError(f"input {path!r} has duplicate column names {dupes}; rename them first")
    if isinstance(source, io.BytesIO):
        source.seek(0)
    reader = pacsv.open_csv(
        source,
        read_options=pacsv.ReadOptions(block_size=_BLOCK_SIZE),
        parse_options=pacsv.ParseOptions(delimiter=delimiter, newlines_in_values=True),
        convert_options=pacsv.ConvertOptions(
            column_types={n: pa.string() for n in names}, strings_can_be_null=False, quoted_strings_can_be_null=False
        ),
    )

    def batches() -> Iterator[pa.RecordBatch]:
        try:
            for batch in reader:
                for start in range(0, batch.num_rows, batch_rows):
                    yield batch.slice(start, batch_rows)
        except pa.ArrowInvalid as exc:
            text = str(exc).splitlines()[0]
            if "UTF8" in text or "utf8" in text:
                raise InputError(f"input {path!r} is not valid UTF-8 text; re-save it as UTF-8") from None
            raise InputError(f"cannot read {path!r}: {text}") from None

    return TableReader(reader.schema, batches(), "tsv" if delimiter == "\t" else "csv", path)


def _read_parquet(path: str, batch_rows: int) -> TableReader:
    paths = _parquet_paths(path)
    try:
        files = [pq.ParquetFile(p) for p in paths]
    except (pa.ArrowInvalid, OSError) as exc:
        raise InputError(f"cannot read {path!r} as Parquet: {str(exc).splitlines()[0]}") from None
    schema = files[0].schema_arrow
    for p, f in zip(paths[1:], files[1:]):
        if not f.schema_arrow.equals(schema, check_metadata=False):
            raise InputError(f"Parquet part {p!r} has a different schema from {paths[0]!r}")
    schema = schema.remove_metadata()

    def batches() -> Iterator[pa.RecordBatch]:
        for f in files:
            for batch in f.iter_batches(batch_size=batch_rows):
                yield pa.RecordBatch.from_arrays(batch.columns, schema=schema)

    return TableReader(schema, batches(), "parquet", path)


def open_reader(path: str, batch_rows: int = 65536) -> TableReader:
    """Open an input table for batch reading; raises :class:`InputError`."""
    fmt = format_of(path)
    if fmt == "parquet":
        return _read_parquet(path, batch_rows)
    return _read_csv(path, "\t" if fmt == "tsv" else ",", batch_rows)


class TableWriter:
    """Writes batches to a temporary file beside ``path``; :meth:`commit`
    renames it into place, :meth:`abort` removes it. ``-`` writes CSV to
    stdout."""

    def __init__(self, path: str, schema: pa.Schema, overwrite: bool = False, metadata: dict | None = None):
        self.path = path
        self.fmt = format_of(path) if path != "-" else "csv"
        self._tmp: str | None = None
        if path != "-":
            if os.path.isdir(path):
                raise InputError(f"output {path!r} is a directory; give a file name ending .csv, .tsv or .parquet")
            if os.path.exists(path) and not overwrite:
                raise InputError(f"output {path!r} exists; pass --overwrite to replace it")
            directory = os.path.dirname(os.path.abspath(path))
            if not os.path.isdir(directory):
                raise InputError(f"output folder {directory!r} does not exist")
            fd, self._tmp = tempfile.mkstemp(prefix=".ionicity-", suffix=".partial", dir=directory)
            os.close(fd)
            sink = self._tmp
        else:
            sink = sys.stdout.buffer
        if metadata and self.fmt == "parquet":
            schema = schema.with_metadata({k: str(v) for k, v in metadata.items()})
        self.schema = schema
        if self.fmt == "parquet":
            self._writer = pq.ParquetWriter(sink, schema)
        else:
            delimiter = "\t" if self.fmt == "tsv" else ","
            self._writer = pacsv.CSVWriter(sink, schema, write_options=pacsv.WriteOptions(delimiter=delimiter))

    def write(self, batch: pa.RecordBatch) -> None:
        self._writer.write(pa.Table.from_batches([batch], schema=self.schema) if self.fmt == "parquet" else batch)

    def commit(self) -> None:
        self._writer.close()
        if self._tmp is not None:
            os.replace(self._tmp, self.path)
            self._tmp = None
        else:
            sys.stdout.flush()

    def abort(self) -> None:
        try:
            self._writer.close()
        except Exception:  # the original error matters, not this one
            pass
        if self._tmp is not None and os.path.exists(self._tmp):
            os.remove(self._tmp)
        self._tmp = None
