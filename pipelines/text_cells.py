"""Cells of a text table whose bytes are not text in the table's encoding.

One bad cell is its row's problem, never the whole file's: a CSV or TSV is
read with every column as bytes, and a column of a batch that is not valid
UTF-8 is decoded cell by cell, each bad byte becoming U+FFFD (Python's
``errors="replace"``), its rows remembered (:func:`text_batch`; the Dask
engine's pandas blocks come through :func:`text_table`). After scoring, each
such row gets status ``error`` and a message naming its data-row number,
the columns and the first bad byte, and the encoding option to try
(:func:`mark_rows`). The rows' other columns are kept; a text file cannot
hold the bytes as they were, so the cells are written with U+FFFD, and the
message says so. The same holds for a Parquet input's bytes columns written
to a CSV or TSV output (:func:`bytes_cells`); into Parquet they pass as they are.

Only a batch with a bad cell pays for the cell-by-cell pass: the rest is one
Arrow cast per column (validating UTF-8, as reading the column as text did).

Windows-1252 leaves five bytes undefined (0x81, 0x8D, 0x8F, 0x90, 0x9D; the
code chart of the Unicode Consortium's mapping file CP1252.TXT), so a file
read with ``--encoding cp1252`` can hold bytes that are not text in it
either. Arrow transcodes such a file to UTF-8 through a Python codec as it
reads; the one it is given (:data:`ARROW_CP1252`, registered here) is
Windows-1252 with each undefined byte decoded to a private-use character,
U+F700 plus the byte, which no Windows-1252 text can hold, and
:func:`marked_cells` finds those cells and treats them as above.
"""
from __future__ import annotations

import codecs
from dataclasses import dataclass, field

import pyarrow as pa
import pyarrow.compute as pc

from ionicity.pipelines.arrow_columns import bool_array, string_array
from ionicity.pipelines.text_dialect import ENCODING_HINT, SPELLED
from ionicity.scorer.verdict import fit_message

__all__ = ["ARROW_CP1252", "BadRows", "arrow_codec", "text_batch", "text_table", "bytes_cells", "mark_rows",
           "marked_cells", "decode_cells"]

#: the codec name Arrow reads ``--encoding cp1252`` files with (see the module's docstring)
ARROW_CP1252 = "ionicity-cp1252-marked"
_CP1252_UNDEFINED = (0x81, 0x8D, 0x8F, 0x90, 0x9D)
_MARK_BASE = 0xF700
_MARKS = "[" + "".join(chr(_MARK_BASE + b) for b in _CP1252_UNDEFINED) + "]"
_CP1252_MARKED = "".join(chr(_MARK_BASE + b) if b in _CP1252_UNDEFINED else bytes([b]).decode("cp1252")
                         for b in range(256))


class _MarkedDecoder(codecs.IncrementalDecoder):
    def decode(self, data, final=False):
        # one byte, one character: no state is carried between chunks
        return codecs.charmap_decode(data, self.errors, _CP1252_MARKED)[0]


def _marked_codec(name: str):
    if name.replace("_", "-") != ARROW_CP1252:
        return None
    table = codecs.charmap_build(_CP1252_MARKED)
    return codecs.CodecInfo(
        name=ARROW_CP1252,
        encode=lambda text, errors="strict": codecs.charmap_encode(text, errors, table),
        decode=lambda data, errors="strict": codecs.charmap_decode(data, errors, _CP1252_MARKED),
        incrementaldecoder=_MarkedDecoder,
    )


codecs.register(_marked_codec)


def arrow_codec(encoding: str) -> str:
    """The codec Arrow transcodes a text file of ``encoding`` with.

    >>> arrow_codec("cp1252") == ARROW_CP1252, arrow_codec("latin-1")
    (True, 'latin-1')
    >>> b"K\\x81Cl caf\\xe9".decode(arrow_codec("cp1252")) == "K\\uf781Cl caf\\u00e9"
    True
    """
    return ARROW_CP1252 if encoding == "cp1252" else encoding


def marked_cells(batch: pa.RecordBatch) -> tuple[pa.RecordBatch, dict[int, tuple[list[str], int]]]:
    """A text batch read through :data:`ARROW_CP1252` with each undefined
    byte's mark made U+FFFD, and those cells: position -> (column names,
    first undefined byte). One regular-expression scan per column; only a
    column with a mark is gone through cell by cell.

    >>> batch = pa.RecordBatch.from_pydict({"f": ["NaCl", "K\\uf781Cl"], "n": ["a", None]})
    >>> fixed, found = marked_cells(batch)
    >>> fixed.column(0).to_pylist() == ["NaCl", "K\\ufffdCl"], found
    (True, {1: (['f'], 129)})
    """
    columns, found = list(batch.columns), {}
    for i, name in enumerate(batch.schema.names):
        if not pc.any(pc.match_substring_regex(columns[i], _MARKS)).as_py():
            continue
        texts, bad = [], {}
        for position, value in enumerate(columns[i].to_pylist()):
            first = next((ch for ch in value or "" if _MARK_BASE < ord(ch) < _MARK_BASE + 256
                          and ord(ch) - _MARK_BASE in _CP1252_UNDEFINED), None)
            if first is not None:
                bad[position] = ord(first) - _MARK_BASE
                for b in _CP1252_UNDEFINED:
                    value = value.replace(chr(_MARK_BASE + b), "\ufffd")
            texts.append(value)
        columns[i] = string_array(texts)
        _merge(found, name, bad)
    if not found:
        return batch, {}
    return pa.RecordBatch.from_arrays(columns, schema=batch.schema), found


def decode_cells(values: list) -> tuple[pa.Array, dict[int, int]]:
    """Cells of bytes (or None) as a string array, each bad byte as U+FFFD;
    with {position: first bad byte} of the cells that were not UTF-8.

    >>> text, bad = decode_cells([b"NaCl", b"K\\xffCl", None])
    >>> text.to_pylist(), bad
    (['NaCl', 'K\\ufffdCl', None], {1: 255})
    """
    texts, bad = [], {}
    for i, value in enumerate(values):
        if value is None:
            texts.append(None)
            continue
        try:
            texts.append(value.decode("utf-8"))
        except UnicodeDecodeError as exc:
            bad[i] = value[exc.start]
            texts.append(value.decode("utf-8", errors="replace"))
    return string_array(texts), bad


@dataclass
class BadRows:
    """The rows of one input found so far with cells that were not text:
    0-based data row -> message, taken out by :meth:`take` as their batches are
    written; ``count`` and ``first_row`` (1-based) stay for the run's summary."""

    encoding: str = "utf-8"
    messages: dict = field(default_factory=dict)
    count: int = 0
    first_row: int = 0

    def add(self, offset: int, found: dict[int, tuple[list[str], int]]) -> None:
        """Record the bad cells of a batch starting at 0-based data row ``offset``
        (``found``: position in the batch -> (column names, first bad byte))."""
        for position, (columns, byte) in sorted(found.items()):
            row = offset + position + 1
            self.messages[offset + position] = (self.message(row, columns, byte), columns)
            self.count += 1
            self.first_row = self.first_row or row

    def message(self, row: int | None, columns: list[str], byte: int) -> str:
        where = f"data row {row}: " if row is not None else ""
        names = ", ".join(repr(c) for c in columns)
        return (f"{where}column{'s' if len(columns) > 1 else ''} {names} held bytes that are not valid"
                f" {SPELLED[self.encoding]} text (byte 0x{byte:02X}), written here as U+FFFD; if the whole file is"
                f" in another encoding, {ENCODING_HINT[self.encoding]}")

    def take(self, offset: int, rows: int) -> dict[int, tuple[str, list[str]]]:
        """The (message, column names) of data rows ``offset`` .. ``offset + rows``
        (0-based), by position in that range; they are forgotten here."""
        if not self.messages:
            return {}
        return {r - offset: self.messages.pop(r) for r in sorted(self.messages) if offset <= r < offset + rows}

    def note(self, source: str) -> str | None:
        """The line for the run's summary, or None when every cell was text."""
        if not self.count:
            return None
        source = "standard input" if source == "-" else repr(source)
        return (f"{self.count} row{'s' if self.count > 1 else ''} of {source} held bytes that are not valid"
                f" {SPELLED[self.encoding]} text (first: data row {self.first_row}); marked error, the bytes written"
                f" as U+FFFD; if the whole file is in another encoding, {ENCODING_HINT[self.encoding]}")


def text_batch(batch: pa.RecordBatch, schema: pa.Schema) -> tuple[pa.RecordBatch, dict[int, tuple[list[str], int]]]:
    """A batch read as bytes, cast to ``schema`` (every column text); cells
    that are not UTF-8 decoded with U+FFFD. Returns the batch and the bad
    cells found: position -> (column names, first bad byte)."""
    try:
        return batch.cast(schema), {}
    except pa.ArrowInvalid:
        pass
    columns, found = [], {}
    for name, column in zip(schema.names, batch.columns):
        try:
            columns.append(column.cast(pa.string()))
        except pa.ArrowInvalid:
            text, bad = decode_cells(column.to_pylist())
            columns.append(text)
            _merge(found, name, bad)
    return pa.RecordBatch.from_arrays(columns, schema=schema), found


def bytes_cells(batch: pa.RecordBatch, names: list[str]) -> dict[int, tuple[list[str], int]]:
    """The cells of the bytes columns ``names`` that are not UTF-8 (a text
    output writes them with U+FFFD): position -> (column names, first bad byte)."""
    found: dict = {}
    for name in names:
        column = batch.column(batch.schema.get_field_index(name))
        try:
            column.cast(pa.string())
        except pa.ArrowInvalid:
            _merge(found, name, decode_cells(column.to_pylist())[1])
    return found


def text_table(frame, schema: pa.Schema) -> tuple[pa.Table, dict[int, tuple[list[str], int]]]:
    """A pandas frame of text read with ``errors="surrogateescape"`` (a bad
    byte kept as a lone surrogate) as an Arrow table of ``schema``; its bad
    cells decoded as :func:`text_batch` decodes them, found the same way."""
    try:
        return pa.Table.from_pandas(frame, schema=schema, preserve_index=False), {}
    except (UnicodeEncodeError, pa.ArrowInvalid):
        pass
    columns, found = [], {}
    for name in schema.names:
        values = frame[name].tolist()
        try:
            columns.append(pa.array(values, type=pa.string(), from_pandas=True))
        except (UnicodeEncodeError, pa.ArrowInvalid):
            raw = [None if not isinstance(v, str) else v.encode("utf-8", "surrogateescape") for v in values]
            text, bad = decode_cells(raw)
            columns.append(text)
            _merge(found, name, bad)
    return pa.Table.from_arrays(columns, schema=schema), found


def _merge(found: dict, name: str, bad: dict[int, int]) -> None:
    for position, byte in bad.items():
        found.setdefault(position, ([], byte))[0].append(name)


def mark_rows(scored: pa.RecordBatch, messages: dict[int, tuple[str, list[str]]], status_name: str,
              message_name: str, formula_col: str) -> pa.RecordBatch:
    """``scored`` with each row of ``messages`` (position -> (text, bad
    columns)) made an error with that text; a message the row had already
    follows it, unless a bad cell was the formula's (the scorer's message then
    says the same: a formula holding U+FFFD)."""
    if not messages:
        return scored
    status_at, message_at = scored.schema.get_field_index(status_name), scored.schema.get_field_index(message_name)
    status, message = scored.column(status_at), scored.column(message_at)
    if pa.types.is_dictionary(status.type):
        status = status.dictionary_decode()
    if pa.types.is_dictionary(message.type):
        message = message.dictionary_decode()
    old = message.to_pylist()
    for position, (text, columns) in messages.items():
        if old[position] and formula_col not in columns:
            text = f"{text}; {old[position]}"
        old[position] = fit_message(text)
    mask = bool_array([i in messages for i in range(scored.num_rows)])
    status = pc.replace_with_mask(status, mask, string_array(["error"] * len(messages)))
    columns = list(scored.columns)
    columns[status_at] = status.cast(scored.schema.field(status_at).type)
    columns[message_at] = string_array(old).cast(scored.schema.field(message_at).type)
    return pa.RecordBatch.from_arrays(columns, schema=scored.schema)
