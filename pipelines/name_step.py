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

from ionicity.pipelines.arrow_columns import int_array, int_numpy, string_array
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


def _codes(array) -> tuple[np.ndarray, pa.Array]:
    """Dictionary codes and the dictionary (a string array whose last value
    is "", the code of null cells)."""
    if isinstance(array, pa.ChunkedArray):
        array = array.combine_chunks()
    if not pa.types.is_dictionary(array.type):
        if not pa.types.is_string(array.type) and not pa.types.is_large_string(array.type):
            array = pc.cast(array, pa.string())
        array = pc.dictionary_encode(array)
    dictionary = array.dictionary
    if not pa.types.is_string(dictionary.type):
        dictionary = pc.cast(dictionary, pa.string())
    indices = pc.fill_null(array.indices, len(dictionary)) if array.indices.null_count else array.indices
    dictionary = pa.concat_arrays([pc.fill_null(dictionary, ""), string_array([""])])
    return int_numpy(indices).astype(np.int64), dictionary


def _plain(array):
    if isinstance(array, pa.ChunkedArray):
        array = array.combine_chunks()
    return array.dictionary_decode() if pa.types.is_dictionary(array.type) else array


class _Numbering:
    """Run-wide numbers of text values, looked up a whole dictionary at a time
    (``pyarrow.compute.index_in``); only values never seen cost Python work."""

    def __init__(self):
        self.values: list[str] = []
        self._known = string_array([])
        self._numbers: dict[str, int] = {}

    def ids(self, dictionary: pa.Array) -> np.ndarray:
        found = pc.index_in(dictionary, value_set=self._known)
        if found.null_count:
            for value in pc.filter(dictionary, pc.is_null(found)).to_pylist():
                if value not in self._numbers:
                    self._numbers[value] = len(self.values)
                    self.values.append(value)
            self._known = string_array(self.values)
            found = pc.index_in(dictionary, value_set=self._known)
        return int_numpy(found).astype(np.int64)


class NameStep:
    """The name check of one run (see the module docstring)."""

    def __init__(self):
        self._formula_ids = _Numbering()
        self._name_ids = _Numbering()
        self._keys = np.zeros(0, dtype=np.int64)  # sorted pair keys
        self._slots = np.zeros(0, dtype=np.int64)  # result slot of each key
        self._formula: list = []
        self._check: list = []
        self._warning: list = []
        self._arrays: tuple | None = None

    def columns(self, normalized, names, status, message) -> tuple[pa.Array, pa.Array, pa.Array, pa.Array]:
        """``name_formula``, ``name_check``, ``status`` and ``message`` of one
        batch, from its rows' ``formula_normalized``, names, ``status`` and
        ``message`` (text columns dictionary-encoded, as every generated text
        column is written)."""
        formula_codes, formula_values = _codes(normalized)
        name_codes, name_values = _codes(names)
        keys = (self._formula_ids.ids(formula_values)[formula_codes] << 32) | self._name_ids.ids(name_values)[name_codes]
        # the batch's distinct pairs by Arrow's hash kernel (a sort of every row's key cost more)
        encoded = pc.dictionary_encode(int_array(keys))
        pairs = int_numpy(encoded.dictionary)
        at = np.searchsorted(self._keys, pairs)
        known = np.zeros(len(pairs), dtype=bool)
        inside = at < len(self._keys)
        known[inside] = self._keys[at[inside]] == pairs[inside]
        if not known.all():
            self._add(pairs[~known])
            at = np.searchsorted(self._keys, pairs)
        slots = int_array(self._slots[at]).take(encoded.indices)
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

    def _add(self, pairs: np.ndarray) -> None:
        base = len(self._formula)
        formulas, names = self._formula_ids.values, self._name_ids.values
        for pair in pairs.tolist():
            result = check_name(formulas[pair >> 32] or None, names[pair & 0xFFFFFFFF])
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
