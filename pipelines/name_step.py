"""Names against formulas over a run (``--name-col``): :class:`NameStep`.

The check itself is :func:`ionicity.scorer.name_check.check_name`, one call
per distinct (``formula_normalized``, name) pair of the whole run. A run
keeps one :class:`NameStep` (:func:`name_step_for`, keyed by the run's
formula cache): it numbers the normalised formulas and the names it has seen
and keeps the results of every pair in arrays sorted by pair key. Per batch,
the rows' pairs become integer keys (one ``np.unique``), keys already known
are found by ``np.searchsorted``, only new pairs are checked in Python, and
the results go back to the rows with one ``take`` per column: no Python work
per row, and none per pair after its first batch.

A ``mismatch`` adds its warning to the row's ``message`` and makes an ``ok``
row a ``warning``, as :func:`ionicity.scorer.verdict.with_warnings` decides
(applied here to whole columns at once; ``tests/test_name_check.py`` holds
the two to the same result); the other outcomes leave the verdict alone.
"""
from __future__ import annotations

import weakref

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc

from ionicity.pipelines.arrow_columns import int_numpy, string_array
from ionicity.scorer.name_check import COLUMNS as NAME_COLUMNS, check_name

__all__ = ["NAME_COLUMNS", "NameStep", "name_step_for"]

_STEPS: "weakref.WeakKeyDictionary" = weakref.WeakKeyDictionary()


def name_step_for(owner) -> "NameStep":
    """The run's :class:`NameStep`, kept as long as ``owner`` (the run's
    formula cache) lives."""
    step = _STEPS.get(owner)
    if step is None:
        step = _STEPS[owner] = NameStep()
    return step


def _codes(array) -> tuple[np.ndarray, list]:
    """Dictionary codes and the dictionary's values; nulls read as ""."""
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


def _plain(array):
    if isinstance(array, pa.ChunkedArray):
        array = array.combine_chunks()
    return array.dictionary_decode() if pa.types.is_dictionary(array.type) else array


class NameStep:
    """The name check of one run (see the module docstring)."""

    def __init__(self):
        self._formula_ids: dict = {}
        self._name_ids: dict = {}
        self._keys = np.zeros(0, dtype=np.int64)  # sorted pair keys
        self._slots = np.zeros(0, dtype=np.int64)  # result slot of each key
        self._formula: list = []
        self._check: list = []
        self._warning: list = []
        self._arrays: tuple | None = None

    def _ids(self, values: list, table: dict) -> np.ndarray:
        ids = np.empty(len(values), dtype=np.int64)
        for i, value in enumerate(values):
            key = value or ""
            ids[i] = table.setdefault(key, len(table))
        return ids

    def columns(self, normalized, names, status, message) -> tuple[pa.Array, pa.Array, pa.Array, pa.Array]:
        """``name_formula``, ``name_check``, ``status`` and ``message`` of one
        batch, from its rows' ``formula_normalized``, names, ``status`` and
        ``message`` (text columns dictionary-encoded, as every generated text
        column is written)."""
        formula_codes, formula_values = _codes(normalized)
        name_codes, name_values = _codes(names)
        keys = (self._ids(formula_values, self._formula_ids)[formula_codes] << 32) | \
            self._ids(name_values, self._name_ids)[name_codes]
        pairs, first, inverse = np.unique(keys, return_index=True, return_inverse=True)
        at = np.searchsorted(self._keys, pairs)
        known = (at < len(self._keys)) & (self._keys[np.minimum(at, max(len(self._keys) - 1, 0))] == pairs) \
            if len(self._keys) else np.zeros(len(pairs), dtype=bool)
        if not known.all():
            self._add(pairs[~known], first[~known], formula_codes, formula_values, name_codes, name_values)
            at = np.searchsorted(self._keys, pairs)
        slots = pa.array(self._slots[at][inverse.reshape(-1)], type=pa.int64())
        formula_array, check_array, warning_array = self._result_arrays()
        warning = warning_array.take(slots)
        flagged = pc.is_valid(warning)
        status, message = _plain(status), pc.fill_null(_plain(message), "")
        if pc.any(flagged).as_py():
            # with_warnings over whole columns: an error stays an error, anything else becomes a
            # warning; the reason is appended to the message with "; "
            joined = pc.binary_join_element_wise(message, warning, "; ")
            message = pc.if_else(flagged, pc.if_else(pc.equal(message, ""), warning, joined), message)
            status = pc.if_else(pc.and_(flagged, pc.not_equal(status, "error")), "warning", status)
        return (formula_array.take(slots), check_array.take(slots), pc.dictionary_encode(status),
                pc.dictionary_encode(message))

    def _add(self, pairs, rows, formula_codes, formula_values, name_codes, name_values) -> None:
        base = len(self._formula)
        for row in rows.tolist():
            result = check_name(formula_values[formula_codes[row]], name_values[name_codes[row]])
            self._formula.append(result.name_formula)
            self._check.append(result.name_check)
            self._warning.append(result.warning)
        keys = np.concatenate([self._keys, pairs])
        slots = np.concatenate([self._slots, np.arange(base, base + len(pairs), dtype=np.int64)])
        order = np.argsort(keys, kind="stable")
        self._keys, self._slots = keys[order], slots[order]
        self._arrays = None

    def _result_arrays(self) -> tuple[pa.Array, pa.Array, pa.Array]:
        if self._arrays is None:
            self._arrays = (
                pc.dictionary_encode(string_array(self._formula)),
                pc.dictionary_encode(string_array(self._check)),
                string_array(self._warning),
            )
        return self._arrays
