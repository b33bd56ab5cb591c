"""Names against formulas over a batch (``--name-col``): :func:`name_columns`.

The check itself is :func:`ionicity.scorer.name_check.check_name`, cached per
(formula, name) pair. Here a batch's rows are grouped into their distinct
pairs with one sort of integer keys (formula code times the number of
names, plus the name code), the check runs once per pair, and its results go
back to every row with one ``take`` per column: no Python work per row, so
a million named rows cost about what their distinct pairs cost.

A ``mismatch`` adds its warning to the row's ``message`` and makes an ``ok``
row a ``warning`` (:func:`ionicity.scorer.verdict.with_warnings`, the one
verdict policy); the other outcomes leave the verdict alone.
"""
from __future__ import annotations

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc

from ionicity.pipelines.arrow_columns import int_numpy, string_array
from ionicity.scorer.name_check import COLUMNS as NAME_COLUMNS, check_name
from ionicity.scorer.verdict import Verdict, with_warnings

__all__ = ["NAME_COLUMNS", "name_columns"]


def _codes(array: pa.Array) -> tuple[np.ndarray, list]:
    """Dictionary codes (nulls as the last code) and the dictionary values."""
    if isinstance(array, pa.ChunkedArray):
        array = array.combine_chunks()
    if not pa.types.is_dictionary(array.type):
        if not pa.types.is_string(array.type) and not pa.types.is_large_string(array.type):
            array = pc.cast(array, pa.string())
        array = pc.dictionary_encode(array)
    values = array.dictionary.to_pylist()
    indices = array.indices
    if indices.null_count:
        indices = pc.fill_null(indices, len(values))
        values.append(None)
    return int_numpy(indices).astype(np.int64), values


def _plain(array: pa.Array) -> pa.Array:
    if isinstance(array, pa.ChunkedArray):
        array = array.combine_chunks()
    return array.dictionary_decode() if pa.types.is_dictionary(array.type) else array


def name_columns(formulas: pa.Array, names: pa.Array, status: pa.Array, message: pa.Array,
                 normalized: pa.Array) -> tuple[pa.Array, pa.Array, pa.Array, pa.Array]:
    """``name_formula``, ``name_check`` and the new ``status`` and
    ``message`` of one batch (text columns dictionary-encoded, as every
    generated text column is written).

    Parameters
    ----------
    formulas, names : pyarrow.Array
        The batch's formula and name columns (plain or dictionary-encoded).
    status, message, normalized : pyarrow.Array
        The rows' ``status``, ``message`` and ``formula_normalized``.
    """
    formula_codes, formula_values = _codes(formulas)
    name_codes, name_values = _codes(names)
    keys = formula_codes * len(name_values) + name_codes
    pairs, first, inverse = np.unique(keys, return_index=True, return_inverse=True)
    first_rows = pa.array(first, type=pa.int64())
    pair_status = _plain(status).take(first_rows).to_pylist()
    pair_message = _plain(message).take(first_rows).to_pylist()
    pair_normalized = _plain(normalized).take(first_rows).to_pylist()
    out_formula, out_check, out_status, out_message = [], [], [], []
    for k, pair in enumerate(pairs.tolist()):
        formula = formula_values[pair // len(name_values)]
        name = name_values[pair % len(name_values)]
        result = check_name(formula, name, pair_normalized[k])
        out_formula.append(result.name_formula)
        out_check.append(result.name_check)
        if result.warning:
            verdict = with_warnings(Verdict(pair_status[k], pair_message[k] or "", ""), [result.warning])
            out_status.append(verdict.status)
            out_message.append(verdict.message)
        else:
            out_status.append(pair_status[k])
            out_message.append(pair_message[k])
    rows = pa.array(inverse.reshape(-1), type=pa.int64())
    return tuple(pc.dictionary_encode(string_array(values).take(rows))
                 for values in (out_formula, out_check, out_status, out_message))
