"""``.xlsx`` workbooks in and out, through openpyxl (the optional ``xlsx`` extra).

Reading (:func:`read_xlsx`): one sheet (the first, or ``--sheet`` by name or
by number from 1), its first row the header, streamed row by row
(openpyxl's read-only mode). Cells become text as a CSV would hold them
(numbers as Python writes them, ``true``/``false``, dates in ISO 8601, an
empty cell as empty text), so the same column typing applies
(:mod:`ionicity.pipelines.column_types`); a row whose cells are all empty
is a sheet's unused formatting, not data, and is skipped.

Writing (:class:`XlsxSink`): openpyxl's write-only mode, one sheet named
``scored``; every text cell is written as a string, never as a formula,
whatever it starts with (``=``, ``+``, ``-``, ``@``), as the CSV output
writes it as plain text. A sheet holds at most 1,048,576 rows: a larger
result is refused with the formats that can hold it.
"""
from __future__ import annotations

import datetime
import math
from typing import Iterator

import pyarrow as pa

from ionicity.pipelines.column_types import infer_types
from ionicity.pipelines.errors import InputError, install_hint

__all__ = ["read_xlsx", "XlsxSink", "MAX_ROWS", "require_openpyxl"]

#: rows of one Excel sheet, the header included (Excel specifications and limits)
MAX_ROWS = 1_048_576


def require_openpyxl():
    """openpyxl, or :class:`InputError` saying how to install it."""
    try:
        # about 80 ms (python -X importtime): only .xlsx runs pay for it
        import openpyxl
    except ImportError:
        raise InputError(".xlsx files need openpyxl, which is not installed: "
                         + install_hint("xlsx", "openpyxl")) from None
    return openpyxl


def _text(value) -> str:
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, (datetime.datetime, datetime.date, datetime.time)):
        return value.isoformat()
    return str(value)


def _sheet(workbook, path: str, sheet):
    names = workbook.sheetnames
    if sheet is None:
        return workbook[names[0]]
    if isinstance(sheet, int) or (isinstance(sheet, str) and sheet.isdigit() and sheet not in names):
        number = int(sheet)
        if not 1 <= number <= len(names):
            raise InputError(f"--sheet {sheet!r}: {path!r} has {len(names)} sheet(s), numbered from 1: {names}")
        return workbook[names[number - 1]]
    if sheet not in names:
        raise InputError(f"--sheet {sheet!r}: no such sheet in {path!r}; sheets: {names}")
    return workbook[sheet]


def read_xlsx(path: str, batch_rows: int, sheet=None):
    """One sheet of ``path``: its text schema, its batches and the inferred
    column types (what :func:`ionicity.pipelines.io.open_reader` makes a
    ``TableReader`` of)."""
    openpyxl = require_openpyxl()
    try:
        workbook = openpyxl.load_workbook(path, read_only=True, data_only=True)
    except FileNotFoundError:
        raise InputError(f"input file {path!r} does not exist") from None
    except Exception as exc:  # zipfile, XML and openpyxl's own errors: all mean "not a workbook"
        raise InputError(f"cannot read {path!r} as an .xlsx workbook: {exc}") from None
    ws = _sheet(workbook, path, sheet)
    rows = ws.iter_rows(values_only=True)
    header = next(rows, None)
    if header is None:
        workbook.close()
        raise InputError(f"sheet {ws.title!r} of {path!r} is empty: expected a header row and data rows")
    header = list(header)
    while header and header[-1] is None:
        header.pop()
    names = [_text(v).strip() for v in header]
    if any(n == "" for n in names):
        workbook.close()
        raise InputError(f"sheet {ws.title!r} of {path!r} has a column with an empty name; give every column a name")
    if len(set(names)) != len(names):
        dupes = sorted({n for n in names if names.count(n) > 1})
        workbook.close()
        raise InputError(f"sheet {ws.title!r} of {path!r} has duplicate column names {dupes}; rename them first")
    schema = pa.schema([pa.field(n, pa.string()) for n in names])
    width = len(names)

    def text_batches() -> Iterator[pa.RecordBatch]:
        columns: list[list[str]] = [[] for _ in names]
        row_number = 1
        for row in rows:
            row_number += 1
            if all(v is None for v in row):
                continue
            if len(row) > width and any(v is not None for v in row[width:]):
                raise InputError(f"row {row_number} of sheet {ws.title!r} has cells beyond the header's {width} columns")
            for k in range(width):
                columns[k].append(_text(row[k]) if k < len(row) else "")
            if len(columns[0]) >= batch_rows:
                yield pa.RecordBatch.from_arrays([pa.array(c, pa.string()) for c in columns], schema=schema)
                columns = [[] for _ in names]
        if columns[0]:
            yield pa.RecordBatch.from_arrays([pa.array(c, pa.string()) for c in columns], schema=schema)

    batches = text_batches()
    first = next(batches, None)

    def all_batches() -> Iterator[pa.RecordBatch]:
        try:
            if first is not None:
                yield first
                yield from batches
        finally:
            workbook.close()

    return schema, all_batches(), infer_types(first.slice(0, 4096) if first is not None else None)


class XlsxSink:
    """Rows to one sheet of a new workbook, saved to ``path`` by :meth:`close`."""

    def __init__(self, path: str, schema: pa.Schema):
        openpyxl = require_openpyxl()
        from openpyxl.cell import WriteOnlyCell
        from openpyxl.cell.cell import ILLEGAL_CHARACTERS_RE

        self._cell, self._illegal = WriteOnlyCell, ILLEGAL_CHARACTERS_RE
        self.path = path
        self._workbook = openpyxl.Workbook(write_only=True)
        self._sheet = self._workbook.create_sheet("scored")
        self._sheet.append([self._string(n) for n in schema.names])
        self.rows = 1

    def _string(self, text: str):
        # a control character cannot be stored in the XML of a sheet
        cell = self._cell(self._sheet, value=self._illegal.sub("\ufffd", text))
        cell.data_type = "s"  # text, never a formula, whatever its first character
        return cell

    def write(self, batch: pa.RecordBatch) -> None:
        if self.rows + batch.num_rows > MAX_ROWS:
            raise InputError(
                f"an .xlsx sheet holds at most {MAX_ROWS:,} rows including the header, and this result has more;"
                " write .csv or .parquet instead"
            )
        columns = []
        for column in batch.columns:
            if pa.types.is_dictionary(column.type):
                column = column.dictionary_decode()
            values = column.to_pylist()
            if pa.types.is_string(column.type) or pa.types.is_large_string(column.type):
                values = [None if v is None or v == "" else self._string(v) for v in values]
            elif pa.types.is_floating(column.type):
                values = [None if v is None or math.isnan(v) else v for v in values]
            elif not (pa.types.is_integer(column.type) or pa.types.is_boolean(column.type)):
                values = [None if v is None else self._string(_text(v)) for v in values]
            columns.append(values)
        for row in zip(*columns):
            self._sheet.append(row)
        self.rows += batch.num_rows

    def close(self) -> None:
        self._workbook.save(self.path)
