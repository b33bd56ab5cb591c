"""Writing a scored table: batch by batch into a temporary file beside the
output, linked into place only when complete (CSV, TSV, Parquet, ``.xlsx``,
or CSV on standard output).

Where outputs go, what they may replace and what is kept beside them:
:mod:`ionicity.pipelines.output_paths`. The readers are in
:mod:`ionicity.pipelines.io`, which re-exports :class:`TableWriter`.
"""
from __future__ import annotations

import os
import queue
import stat
import sys
import threading

import pyarrow as pa
import pyarrow.csv as pacsv
import pyarrow.parquet as pq

from ionicity._entry import stop_if_interrupted
from ionicity.pipelines.arrow_columns import as_text
from ionicity.pipelines.errors import InputError
from ionicity.pipelines.output_paths import (_remove, check_output_path, clean_stale_partials, keep_beside, partial_path,
                                            write_failure)
from ionicity.pipelines.table_formats import format_of

__all__ = ["TableWriter"]

# batches waiting for the writer thread (see TableWriter.__init__)
_QUEUED_BATCHES = 1

def _share_dictionaries(batches: list[pa.RecordBatch]) -> list[pa.RecordBatch]:
    """The batches of one row group, each dictionary column given the last
    batch's dictionary where the earlier one is a prefix of it (a dictionary
    that only grew, as a scorer's cache does): the same codes then mean the
    same values, and the Parquet writer encodes the column chunk against one
    dictionary instead of decoding and hashing every row again."""
    if len(batches) < 2:
        return batches
    last = batches[-1]
    kinds = [pa.types.is_dictionary(f.type) for f in last.schema]
    if not any(kinds):
        return batches
    out = []
    for batch in batches[:-1]:
        columns = list(batch.columns)
        for i, column in enumerate(columns):
            if not kinds[i]:
                continue
            old, new = column.dictionary, last.column(i).dictionary
            if len(old) <= len(new) and new.slice(0, len(old)).equals(old):
                columns[i] = pa.DictionaryArray.from_arrays(column.indices, new)
        out.append(pa.RecordBatch.from_arrays(columns, schema=batch.schema))
    return out + [last]


def _check_flat(schema: pa.Schema, path: str) -> None:
    """Refuse, before anything is written, input columns of lists, structs or
    maps for a CSV or TSV output: a cell of text cannot hold them (Arrow's CSV
    writer fails on its first batch)."""
    nested = [f"{f.name!r} ({f.type})" for f in schema if pa.types.is_nested(f.type)]
    if nested:
        where = "standard output" if path == "-" else repr(path)
        raise InputError(f"column(s) {', '.join(nested)} hold nested values, which a CSV or TSV output ({where})"
                         " cannot hold; write Parquet (-o OUTPUT.parquet) or .xlsx instead")


def _valid_text_bytes(batch: pa.RecordBatch) -> pa.RecordBatch:
    """The batch with each bytes column's cells made valid UTF-8 (U+FFFD for
    a bad byte, :func:`~ionicity.pipelines.arrow_columns.as_text`): Arrow's
    CSV writer refuses the whole batch otherwise, and a text file cannot
    carry the bytes as they were. A batch without such cells is returned as it is."""
    columns = list(batch.columns)
    changed = False
    for i, column in enumerate(columns):
        if pa.types.is_binary(column.type) or pa.types.is_large_binary(column.type):
            try:
                column.cast(pa.string())
            except pa.ArrowInvalid:
                columns[i] = as_text(column).cast(column.type)
                changed = True
    return pa.RecordBatch.from_arrays(columns, schema=batch.schema) if changed else batch


class TableWriter:
    """Writes batches to a temporary file beside ``path``; :meth:`commit`
    renames it into place, :meth:`abort` removes it. ``-`` writes CSV to
    stdout.

    ``metadata`` (str to str) is stored as Parquet key-value metadata; CSV and
    TSV have nowhere to keep it. Parquet batches are gathered into row groups
    of at least ``row_group_rows`` rows. With ``background=True`` the
    encoding and writing happen in a thread of their own (Arrow releases the
    GIL while it encodes), so the caller can prepare the next batch
    meanwhile; an error there is raised by the next :meth:`write` or by
    :meth:`commit`. ``statistics`` names the Parquet columns that get
    min/max statistics (default: all).
    """

    def __init__(
        self,
        path: str,
        schema: pa.Schema,
        overwrite: bool = False,
        metadata: dict | None = None,
        inputs: tuple[str, ...] = (),
        background: bool = False,
        row_group_rows: int = 1 << 16,
        statistics: list[str] | None = None,
    ):
        self.path = path
        self.fmt = format_of(path) if path != "-" else "csv"
        self.row_group_rows = row_group_rows
        self._tmp: str | None = None
        self._file = None
        self._gathered: list[pa.RecordBatch] = []
        self._gathered_rows = 0
        self._thread = None
        self._error: BaseException | None = None
        self.overwrite = overwrite
        if self.fmt in ("csv", "tsv"):
            _check_flat(schema, path)
        if path != "-":
            # first settle what killed runs left: a dataset they moved aside goes back to its path
            clean_stale_partials(os.path.dirname(os.path.abspath(path)))
            directory = check_output_path(path, overwrite, inputs)
            self._tmp = partial_path(directory)
            try:
                # os.open honours the umask, unlike mkstemp's 0600
                fd = os.open(self._tmp, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o666)
            except OSError as exc:  # the output named, not the temporary file beside it
                self._tmp = None
                raise write_failure(exc, path) from None
            if self.fmt == "parquet":
                # a native file: Arrow writes it without taking the GIL
                os.close(fd)
                self._file = sink = pa.OSFile(self._tmp, mode="wb")
            elif self.fmt == "xlsx":
                os.close(fd)  # openpyxl saves the workbook by path at the end
                sink = None
            else:
                self._file = sink = os.fdopen(fd, "wb")
        else:
            sink = sys.stdout.buffer
        if metadata and self.fmt == "parquet":
            schema = schema.with_metadata({str(k): str(v) for k, v in metadata.items()})
        self.schema = schema
        try:
            if self.fmt == "parquet":
                self._writer = pq.ParquetWriter(sink, schema, write_statistics=True if statistics is None else statistics)
            elif self.fmt == "xlsx":
                if self._tmp is None:
                    raise InputError("an .xlsx workbook cannot be written to standard output; give -o a file name")
                # openpyxl (about 80 ms, python -X importtime) is an optional extra: only .xlsx output loads it
                from ionicity.pipelines.xlsx_io import XlsxSink

                self._writer = XlsxSink(self._tmp, schema)
            else:
                delimiter = "\t" if self.fmt == "tsv" else ","
                self._writer = pacsv.CSVWriter(sink, schema, write_options=pacsv.WriteOptions(delimiter=delimiter))
        except BaseException:
            self.abort()
            raise
        if background:
            # one batch waiting beside the one being encoded: enough to keep
            # the thread busy, and each waiting batch of 65,536 rows and 52
            # generated columns is some 25 MiB; 10^6-row bench, 5 alternating
            # pairs: peak RSS 340 -> 289 MiB against a queue of 4, time within noise
            self._queue = queue.Queue(maxsize=_QUEUED_BATCHES)
            self._thread = threading.Thread(target=self._drain, name="ionicity-writer", daemon=True)
            self._thread.start()

    def write(self, batch: pa.RecordBatch) -> None:
        try:
            if self._thread is None:
                self._write_now(batch)
                return
            if self._error is not None:
                raise self._error
        except OSError as exc:
            raise self._naming_the_output(exc) from None
        self._queue.put(batch)

    def _naming_the_output(self, exc: OSError) -> OSError:
        return write_failure(exc, self.path)

    def _drain(self) -> None:
        while True:
            batch = self._queue.get()
            if batch is None:
                return
            if self._error is None:
                try:
                    self._write_now(batch)
                except BaseException as exc:  # raised again in the caller's thread
                    self._error = exc

    def _stop_thread(self) -> None:
        thread, self._thread = self._thread, None
        if thread is not None:
            self._queue.put(None)
            thread.join()

    def _write_now(self, batch: pa.RecordBatch) -> None:
        if self.fmt != "parquet":
            self._writer.write(_valid_text_bytes(batch) if self.fmt in ("csv", "tsv") else batch)
            return
        self._gathered.append(batch)
        self._gathered_rows += batch.num_rows
        if self._gathered_rows >= self.row_group_rows:
            self._flush()

    def _flush(self) -> None:
        if self._gathered:
            table = pa.Table.from_batches(_share_dictionaries(self._gathered), schema=self.schema)
            self._gathered, self._gathered_rows = [], 0
            self._writer.write_table(table, row_group_size=max(table.num_rows, 1))

    def commit(self) -> None:
        try:
            self._finish()
        except OSError as exc:
            raise self._naming_the_output(exc) from None
        stop_if_interrupted()  # a Ctrl-C that a library swallowed: the run did not finish as asked
        if self._tmp is not None:
            self._move_into_place()
        else:
            sys.stdout.flush()

    def _finish(self) -> None:
        """Write what is left, close and sync the temporary file."""
        self._stop_thread()
        if self._error is not None:
            raise self._error
        if self.fmt == "parquet":
            self._flush()
        self._writer.close()
        if self._tmp is not None:
            if self._file is None or isinstance(self._file, pa.NativeFile):
                if self._file is not None:
                    self._file.close()
                fd = os.open(self._tmp, os.O_RDONLY)
                try:
                    os.fsync(fd)
                finally:
                    os.close(fd)
            else:
                self._file.flush()
                os.fsync(self._file.fileno())
                self._file.close()

    def _move_into_place(self) -> None:
        """Rename the finished file to the output path; without ``overwrite``
        only if nothing is there by now (a hard link cannot replace), else
        only over a regular file. A result that cannot go there is kept
        beside it and the error names both."""
        tmp, self._tmp = self._tmp, None
        if self.overwrite:
            if os.path.lexists(self.path) and not stat.S_ISREG(os.lstat(self.path).st_mode):
                raise keep_beside(tmp, self.path, "was replaced during the run by something that is not a regular"
                                                  " file, which was left as it is")
            os.replace(tmp, self.path)
            return
        try:
            os.link(tmp, self.path)
        except FileExistsError:
            raise keep_beside(tmp, self.path, "appeared while this run was writing it and was left as it is"
                                              " (pass --overwrite to replace it)") from None
        except OSError as exc:
            raise keep_beside(tmp, self.path, f"was not created: this file system has no hard links ({exc.strerror}),"
                              " which ionicity needs to create a file without replacing one that appeared meanwhile;"
                              " rename the result yourself, or pass --overwrite") from None
        os.unlink(tmp)

    def abort(self) -> None:
        try:
            self._stop_thread()
        except BaseException:  # the original error matters, not this one
            pass
        self._gathered = []
        for closable in (getattr(self, "_writer", None), self._file):
            if closable is not None:
                try:
                    closable.close()
                except Exception:
                    pass
        _remove(self._tmp)
        self._tmp = None
