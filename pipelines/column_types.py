"""Types of text input columns: inferred once, then held for the whole run.

A CSV, TSV or ``.xlsx`` input is read as text (so that CSV to CSV passes
every cell through unchanged). For a typed output (Parquet, ``.xlsx``)
:func:`infer_types` looks at the first rows and picks, per column,
``int64``, ``float64`` or ``bool`` where every non-empty cell there has that
form, else text; :class:`ColumnTyper` then converts every batch to that
schema, empty cells becoming nulls. The schema never changes within a run.
A later cell that does not fit raises :class:`TypeFallback`: the engine
starts the run again with that column kept as text, so no row is lost, and
says so in the run's summary.

Forms accepted (the same test for the sample and for every later batch):
numbers without leading zeros or a plus sign (``007`` and ``+5`` stay
text: they are codes more often than numbers): integers, and decimals with a point and
an optional exponent (``2.5``, ``.5``, ``1e-3``; not ``1,5``, ``nan`` or
``inf``); ``true`` / ``false`` in any case.
"""
from __future__ import annotations

import pyarrow as pa
import pyarrow.compute as pc

__all__ = ["infer_types", "ColumnTyper", "TypeFallback", "FORMS"]

#: the regular expression each inferred type's cells must match (whole cell)
FORMS: dict[str, tuple[pa.DataType, str]] = {
    "bool": (pa.bool_(), r"^(?i:true|false)$"),
    "int64": (pa.int64(), r"^-?(0|[1-9][0-9]{0,17})$"),
    "float64": (pa.float64(), r"^-?((0|[1-9][0-9]*)(\.[0-9]*)?|\.[0-9]+)([eE][-+]?[0-9]+)?$"),
}
_PATTERN = {str(t): pattern for t, pattern in FORMS.values()}


class TypeFallback(Exception):
    """A cell after the sample does not fit its column's inferred type."""

    def __init__(self, column: str, type_name: str, row: int, value: str):
        super().__init__(column)
        self.column = column
        self.note = (f"column {column!r} kept as text: row {row} holds {value[:40]!r}, which is not {type_name}"
                     " like the rows before it")


def _fits(values: pa.Array, pattern: str) -> pa.Array:
    """Per cell: empty, or matching ``pattern``."""
    return pc.or_(pc.equal(values, ""), pc.match_substring_regex(values, pattern))


def infer_types(sample: pa.RecordBatch | None) -> dict[str, pa.DataType]:
    """The inferred type of each text column of ``sample`` that is not text.

    A column with no non-empty cell in the sample stays text.

    >>> batch = pa.record_batch({"n": ["1", "", "-3"], "x": ["2.5", "1e3", "7"], "ok": ["TRUE", "false", ""],
    ...                          "code": ["007", "12", "3"], "blank": ["", "", ""]})
    >>> {k: str(v) for k, v in infer_types(batch).items()}
    {'n': 'int64', 'x': 'double', 'ok': 'bool'}
    """
    types: dict[str, pa.DataType] = {}
    if sample is None or sample.num_rows == 0:
        return types
    for name, column in zip(sample.schema.names, sample.columns):
        if not pa.types.is_string(column.type):
            continue
        if pc.all(pc.equal(column, "")).as_py():
            continue
        for arrow_type, pattern in FORMS.values():
            if pc.all(_fits(column, pattern)).as_py():
                types[name] = arrow_type
                break
    return types


class ColumnTyper:
    """Converts text batches of ``text_schema`` to the held ``types``.

    ``schema`` is the typed schema (text columns unchanged); :meth:`convert`
    raises :class:`TypeFallback` for the first cell that does not fit.
    """

    def __init__(self, text_schema: pa.Schema, types: dict[str, pa.DataType]):
        self.types = {n: t for n, t in types.items() if n in text_schema.names}
        self.schema = pa.schema([f.with_type(self.types[f.name]) if f.name in self.types else f for f in text_schema])
        self._at = [(text_schema.get_field_index(n), t) for n, t in self.types.items()]
        self.rows_seen = 0

    def convert(self, batch: pa.RecordBatch) -> pa.RecordBatch:
        if not self._at:
            return batch
        columns = list(batch.columns)
        for i, arrow_type in self._at:
            columns[i] = self._column(batch.schema.names[i], columns[i], arrow_type)
        self.rows_seen += batch.num_rows
        return pa.RecordBatch.from_arrays(columns, schema=self.schema)

    def _column(self, name: str, text: pa.Array, arrow_type: pa.DataType) -> pa.Array:
        if pa.types.is_dictionary(text.type):
            text = text.dictionary_decode()
        fits = _fits(text, _PATTERN[str(arrow_type)])
        if not pc.all(fits).as_py():
            bad = pc.indices_nonzero(pc.invert(fits))[0].as_py()
            raise TypeFallback(name, str(arrow_type).replace("double", "float64"), self.rows_seen + bad + 1,
                               text[bad].as_py())
        empty = pc.equal(text, "")
        if arrow_type == pa.bool_():
            return pc.if_else(empty, pa.scalar(None, pa.bool_()), pc.equal(pc.utf8_lower(text), "true"))
        nullable = pc.if_else(empty, pa.scalar(None, pa.string()), text)
        try:
            return pc.cast(nullable, arrow_type)
        except (pa.ArrowInvalid, pa.ArrowNotImplementedError):  # an integer past int64, say
            bad = next(k for k, v in enumerate(text.to_pylist()) if v and not _casts(v, arrow_type))
            raise TypeFallback(name, str(arrow_type), self.rows_seen + bad + 1, text[bad].as_py()) from None


def _casts(value: str, arrow_type: pa.DataType) -> bool:
    try:
        pc.cast(pa.array([value]), arrow_type)
        return True
    except (pa.ArrowInvalid, pa.ArrowNotImplementedError):
        return False
