"""Arrow arrays built from Python values by hand, and the Arrow types of the
generated columns.

``pyarrow.array`` imports pandas on its first conversion of Python values
(about 0.3 s of CPU), which a run of the command line never needs otherwise;
the builders here go through buffers instead. ``tests/test_batch.py`` checks
each against pyarrow's own conversion.
"""
from __future__ import annotations

import numpy as np
import pyarrow as pa

__all__ = [
    "ARROW_TYPES",
    "TEXT_TYPE",
    "OUTPUT_TYPES",
    "float_array",
    "int_array",
    "bool_array",
    "string_array",
    "as_text",
    "int_numpy",
    "values_array",
]

ARROW_TYPES = {"string": pa.string(), "float64": pa.float64(), "int64": pa.int64(), "bool": pa.bool_()}
# Generated text columns are written dictionary-encoded: most hold a few
# distinct values (status, classes) or repeat per distinct formula, and a
# reader gets each text once (pandas: a categorical column).
TEXT_TYPE = pa.dictionary(pa.int32(), pa.string())
OUTPUT_TYPES = dict(ARROW_TYPES, string=TEXT_TYPE)

# pyarrow's own builder where this version has it (no pandas import)
_StringBuilder = getattr(pa.lib, "StringBuilder", None)


def _validity(valid: np.ndarray) -> tuple:
    """(validity buffer or None, null count) of a boolean mask."""
    nulls = len(valid) - int(np.count_nonzero(valid))
    if not nulls:
        return None, 0
    return pa.py_buffer(np.packbits(valid, bitorder="little")), nulls


def float_array(values) -> pa.Array:
    """float64 array of floats or None; a NaN score becomes a null cell, as
    for text columns."""
    data = np.array(values, dtype=np.float64)  # None -> NaN
    bitmap, nulls = _validity(~np.isnan(data))
    return pa.Array.from_buffers(pa.float64(), len(data), [bitmap, pa.py_buffer(data)], null_count=nulls)


def int_array(values) -> pa.Array:
    """int64 array of a sequence of ints (no nulls)."""
    data = np.ascontiguousarray(values, dtype=np.int64)
    return pa.Array.from_buffers(pa.int64(), len(data), [None, pa.py_buffer(data)], null_count=0)


def nullable_int_array(values) -> pa.Array:
    """int64 array of ints or None."""
    valid = np.fromiter((v is not None for v in values), dtype=bool, count=len(values))
    data = np.fromiter((v or 0 for v in values), dtype=np.int64, count=len(values))
    return int_array_with_mask(data, ~valid)


def int_array_with_mask(data: np.ndarray, null: np.ndarray) -> pa.Array:
    """int64 array of ``data`` with nulls where ``null`` is true."""
    data = np.ascontiguousarray(data, dtype=np.int64)
    bitmap, nulls = _validity(~null)
    return pa.Array.from_buffers(pa.int64(), len(data), [bitmap, pa.py_buffer(data)], null_count=nulls)


def bool_array(values) -> pa.Array:
    """bool array of True, False or None."""
    valid = np.fromiter((v is not None for v in values), dtype=bool, count=len(values))
    data = np.fromiter((bool(v) for v in values), dtype=bool, count=len(values))
    bitmap, nulls = _validity(valid)
    bits = pa.py_buffer(np.packbits(data, bitorder="little"))
    return pa.Array.from_buffers(pa.bool_(), len(values), [bitmap, bits], null_count=nulls)


def string_array(values) -> pa.Array:
    """string array of str or None."""
    if _StringBuilder is None:
        return pa.array(values, type=pa.string())
    builder = _StringBuilder()
    builder.append_values(values)
    return builder.finish()


def as_text(values: pa.Array) -> pa.Array:
    """A flat column of any type as text. A bytes cell that is not UTF-8 is
    decoded with U+FFFD for each bad byte (the scorer then makes such a
    formula that row's error, :func:`ionicity.scorer.formula.parse_formula`),
    instead of the whole column failing its cast: one bad cell is one row's
    problem. Only a column that fails the cast pays for the cell-by-cell pass."""
    if pa.types.is_dictionary(values.type):
        return pa.DictionaryArray.from_arrays(values.indices, as_text(values.dictionary))
    try:
        return values.cast(pa.string())
    except pa.ArrowInvalid:
        if not (pa.types.is_binary(values.type) or pa.types.is_large_binary(values.type)
                or pa.types.is_fixed_size_binary(values.type)):
            raise
        return string_array([None if v is None else v.decode("utf-8", errors="replace") for v in values.to_pylist()])


def int_numpy(array: pa.Array) -> np.ndarray:
    """A view of an integer array without nulls (``to_numpy`` imports pandas)."""
    width = array.type.bit_width // 8
    if not len(array):
        return np.zeros(0, dtype=f"<i{width}")
    return np.frombuffer(array.buffers()[1], dtype=f"<i{width}", count=len(array), offset=array.offset * width)


def values_array(values, type: pa.DataType) -> pa.Array:
    """An array of ``type`` (one of :data:`ARROW_TYPES`) from Python values."""
    if type == pa.float64():
        return float_array(values)
    if type == pa.bool_():
        return bool_array(values)
    if type == pa.string():
        return string_array(values)
    if type == pa.int64():
        return nullable_int_array(values)
    return pa.array(values, type=type)
