"""The scores of the formulas a run has met, as Arrow columns (:class:`FormulaCache`).

A cache belongs to one run: :func:`ionicity.pipelines.score_file` and
:func:`ionicity.pipelines.score_table` each make one (through their
:class:`~ionicity.pipelines.scheduler.BatchScorer`) and drop it when they
return, so a library caller keeps no scores after the call. Within the run,
each distinct formula is scored once and every batch takes its rows from here.
"""
from __future__ import annotations

from itertools import islice, repeat

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc

from ionicity.pipelines.arrow_columns import (ARROW_TYPES, _validity, float_array, int_array, int_numpy, string_array,
                                             values_array)
from ionicity.scorer.columns import output_columns
from ionicity.scorer.caching import per_input
from ionicity.scorer.note_codes import short_notes
from ionicity.scorer.precision import round_significant_array

__all__ = ["FormulaCache"]

# one memo per process, not per cache: the Dask engine's shared pass fills a
# cache per chunk (8 on two workers), and a warm worker keeps it from run to
# run; measured on 4 x 10^4 bench formulas, warm: the regular expressions of
# short_notes were 1.2 s of the 4.4 s a chunk's conversion took, with a memo per cache
_short_note = per_input(maxsize=65536)(short_notes)


class FormulaCache:
    """Scores of the formulas already seen in this run, kept as one Arrow
    array per generated column (row ``index[formula]``), so a batch's
    columns are one ``take`` away, whatever its size.

    Text columns are held dictionary-encoded (:data:`TEXT_TYPE`: each
    distinct text once, an ``int32`` code per entry), so taking them for a
    batch copies 4-byte codes instead of the texts: ``value_notes`` alone
    averages some 350 characters a row. ``None`` is the key of the
    empty-cell record. Bounded so that a table of ever-new formulas keeps
    flat memory: when full, the oldest quarter of the entries not needed by
    the current batch is dropped, and the dictionaries are rebuilt from what
    is kept.
    """

    def __init__(self, max_entries: int = 200_000):
        self.max_entries = max_entries
        self.index: dict = {}
        columns = output_columns()
        self._text = [c.dtype == "string" for c in columns]
        self._arrays: list[pa.Array] = [
            pa.DictionaryArray.from_arrays(pa.nulls(0, pa.int32()), pa.nulls(0, pa.string())) if text
            else pa.nulls(0, ARROW_TYPES[c.dtype])
            for c, text in zip(columns, self._text)
        ]
        self._pending: list[tuple] = []
        # per text column, the code of each text of its dictionary (None: to
        # be made from the dictionary; dropped when dictionaries are rebuilt)
        self._codes: list = [None] * len(columns)
        # numpy views of the arrays for take() (None: to be made from the current arrays)
        self._views: list | None = None
        #: per column, the significant digits its float values are rounded to
        #: as they enter the cache (``set_output_digits``); None keeps every digit
        self._digits: list = [None] * len(columns)
        self._notes_at: int | None = None
        # empty arrays made without converting Python values: pyarrow imports
        # pandas on its first such conversion, which need not delay the
        # first batch (a large run converts later, while the workers score)
        self._keys = pa.nulls(0, pa.string())
        self._pending_keys: list = []
        # per row, the token of the last scorer that counted it (first_seen)
        self._marks = np.zeros(0, dtype=np.int64)
        #: how many times entries were dropped (rows renumbered); appending keeps rows
        self.evictions = 0

    def set_output_digits(self) -> None:
        """Round each float column to its declared ``Column.digits`` from now
        on (output files; rounding the cache costs once per distinct formula,
        not once per row). Call before the first record is added."""
        self._digits = [c.digits if c.dtype == "float64" else None for c in output_columns()]

    def set_short_notes(self) -> None:
        """Write ``value_notes`` with the registered short codes
        (:func:`ionicity.scorer.note_codes.short_notes`) from now on, once
        per distinct text. Call before the first record is added."""
        self._notes_at = [c.name for c in output_columns()].index("value_notes")

    def _short(self, values) -> list:
        return [_short_note(text) for text in values]

    def __len__(self) -> int:
        return len(self.index)

    def missing(self, formulas) -> list:
        index = self.index
        return [f for f in formulas if f not in index]

    def add(self, formulas: list, values: list[tuple], keep=()) -> None:
        """Store records; ``keep`` (a list or an Arrow array) holds formulas
        that must survive eviction."""
        if len(self.index) + len(formulas) > self.max_entries:
            self._evict(len(formulas), set(keep.to_pylist() if isinstance(keep, pa.Array) else keep) | {None})
        index = self.index
        if any(text in index for text in formulas) or len(set(formulas)) < len(formulas):
            # A formula already stored is not stored again: a second row would
            # leave the index one row short of the arrays from there on, and
            # the next eviction would give later formulas other formulas'
            # rows. It happens with read-ahead: a formula evicted while a
            # batch waited is scored again for it, and also sent to a worker
            # for a later batch, whose chunk then brings it a second time.
            fresh = {}
            for text, record in zip(formulas, values):
                if text not in index:
                    fresh.setdefault(text, record)
            formulas, values = list(fresh), list(fresh.values())
        base = len(index)
        for offset, text in enumerate(formulas):
            index[text] = base + offset
        self._pending.extend(values)
        self._pending_keys.extend(formulas)

    def adopt(self, scored: list[tuple[pa.Array, list[pa.Array]]]) -> None:
        """Take formulas scored elsewhere: ``(keys(), arrays())`` of other
        caches, whose formulas are new here and distinct from each other (the
        Dask engine's shared first pass). Room is made so that none is evicted."""
        keys = [k for k, _ in scored]
        incoming = sum(len(k) for k in keys)
        self.max_entries = max(self.max_entries, len(self.index) + incoming + 65536)
        arrays = self.arrays()
        self.keys()
        base = len(self.index)
        index = self.index
        for offset, text in enumerate(text for k in keys for text in k.to_pylist()):
            index[text] = base + offset
        self._keys = pa.concat_arrays([self._keys, *[k.cast(pa.string()) for k in keys]])
        self._marks = np.concatenate([self._marks, np.zeros(incoming, dtype=np.int64)])
        self._arrays = []
        self._views = None
        self._codes = [None] * len(arrays)
        for position, (old, text) in enumerate(zip(arrays, self._text)):
            parts = [old, *[columns[position] for _, columns in scored]]
            if text:  # one dictionary for all: unify, then concatenate the codes
                self._arrays.append(pa.chunked_array(parts).unify_dictionaries().combine_chunks())
            else:
                self._arrays.append(pa.concat_arrays(parts))

    def keys(self) -> pa.Array:
        """The cached formulas in row order (a string array; null is the
        empty-cell record), for ``pyarrow.compute.index_in``."""
        if self._pending_keys:
            self._keys = pa.concat_arrays([self._keys, string_array(self._pending_keys)])
            self._marks = np.concatenate([self._marks, np.zeros(len(self._pending_keys), dtype=np.int64)])
            self._pending_keys = []
        return self._keys

    def first_seen(self, rows: pa.Array, token: int) -> list:
        """The formulas at cache ``rows`` not yet marked with ``token``;
        marks them. A scorer counts the distinct formulas of its run this
        way without hashing every row's text again."""
        keys = self.keys()
        distinct = int_numpy(pc.unique(rows))
        fresh = distinct[self._marks[distinct] != token]
        if not len(fresh):
            return []
        self._marks[fresh] = token
        return keys.take(int_array(fresh)).to_pylist()

    def arrays(self) -> list[pa.Array]:
        """One array per generated column, one row per cached formula; text
        columns as ``DictionaryArray``."""
        if self._pending:
            by_column = list(zip(*self._pending))
            self._pending = []
            if self._notes_at is not None:
                by_column[self._notes_at] = self._short(by_column[self._notes_at])
            self._views = None
            self._arrays = [
                self._append_text(k, old, values) if text
                else pa.concat_arrays([old, values_array(values, old.type) if digits is None
                                       else float_array(round_significant_array(values, digits))])
                for k, (old, text, values, digits) in enumerate(zip(self._arrays, self._text, by_column, self._digits))
            ]
        return self._arrays

    def take(self, rows: pa.Array, positions) -> dict[int, pa.Array]:
        """The generated columns at ``positions`` (indices into
        :meth:`arrays`) at cache ``rows``: one array per position, equal to
        ``arrays()[k].take(rows)``.

        Float columns and the codes of text columns are gathered by numpy
        from views of the cache's buffers (made once per change of the
        cache), which took 0.6 of the time of Arrow's ``take`` per batch of
        65,536 rows and 50 columns (19 ms against 32 ms); any other column,
        or rows with nulls, go through ``take``. Columns whose cells are
        empty for the same cache rows (most columns: an empty or failed
        formula is empty everywhere) share one gathered validity bitmap, and
        a column empty for every cached formula (the mixture columns of a
        table without mixtures) is made without a gather.
        """
        arrays = self.arrays()
        if rows.null_count or not pa.types.is_integer(rows.type):
            return {k: arrays[k].take(rows) for k in positions}
        if self._views is None:
            self._views = _numpy_views(arrays)
        at = int_numpy(rows)
        masks: dict = {}
        out = {}
        for k in positions:
            view = self._views[k]
            if view is None:
                out[k] = arrays[k].take(rows)
                continue
            values, valid, group = view
            if group not in masks:
                masks[group] = _gathered_validity(valid, at)
            out[k] = _gathered(arrays[k], values, masks[group], at)
        return out

    def _append_text(self, k: int, old: pa.DictionaryArray, values) -> pa.DictionaryArray:
        """``old`` with ``values`` (str or None) appended: texts already in
        its dictionary take their codes, new ones are added to its end in
        the order met. The codes come from a dict kept per column, so a
        text is hashed once; ``index_in`` hashed the whole dictionary twice
        per append (2 x 10^4 bench formulas added in chunks of 1,000, all
        columns converted: 0.26 s -> 0.19 s of CPU, best of 7)."""
        codes_of = self._codes[k]
        if codes_of is None:
            # None maps to -1 (a null cell); every other key is a dictionary text
            codes_of = {None: -1}
            codes_of.update((text, i) for i, text in enumerate(old.dictionary.to_pylist()))
            self._codes[k] = codes_of
        known = len(codes_of)
        # every text looked up in C; only the texts not yet in the dictionary (-2) in Python
        codes = np.fromiter(map(codes_of.get, values, repeat(-2)), dtype=np.int32, count=len(values))
        for i in np.flatnonzero(codes == -2).tolist():
            # len() is read before setdefault inserts: a new text gets the next code
            codes[i] = codes_of.setdefault(values[i], len(codes_of) - 1)
        dictionary = old.dictionary
        if len(codes_of) > known:
            dictionary = pa.concat_arrays([dictionary, string_array(list(islice(codes_of, known, None)))])
        null = codes < 0
        bitmap, nulls = _validity(~null)
        codes[null] = 0
        new = pa.Array.from_buffers(pa.int32(), len(codes), [bitmap, pa.py_buffer(codes)], null_count=nulls)
        return pa.DictionaryArray.from_arrays(pa.concat_arrays([old.indices, new]), dictionary, safe=False)

    def ids(self, formulas) -> list[int]:
        index = self.index
        return [index[f] for f in formulas]

    def _evict(self, incoming: int, keep: set) -> None:
        self.evictions += 1
        arrays = self.arrays()
        budget = max(min(len(self.index) * 3 // 4, self.max_entries - incoming), 0)
        kept = [f for f in self.index if f in keep]
        others = [f for f in self.index if f not in keep]
        kept += others[max(len(others) - max(budget - len(kept), 0), 0):]
        kept.sort(key=self.index.__getitem__)
        rows = int_array([self.index[f] for f in kept])
        self.keys()
        self._keys = string_array(kept)
        self._marks = self._marks[int_numpy(rows)]
        self._arrays = []
        self._views = None
        self._codes = [None] * len(arrays)
        for k, array in enumerate(arrays):
            array = array.take(rows)
            if self._text[k]:
                # drop the texts no kept entry uses, so the dictionaries stay bounded too
                array = pc.dictionary_encode(array.dictionary_decode())
            self._arrays.append(array)
        self.index = {f: i for i, f in enumerate(kept)}


def _numpy_view(array: pa.Array):
    """(values, validity as bools or None) of a float64 array or of the
    int32 codes of a dictionary array, as numpy views; None for other types."""
    if pa.types.is_dictionary(array.type) and array.type.index_type == pa.int32():
        data, dtype = array.indices, np.int32
    elif array.type == pa.float64():
        data, dtype = array, np.float64
    else:
        return None
    n, offset = len(data), data.offset
    values = np.frombuffer(data.buffers()[1], dtype=dtype, count=n + offset)[offset:] if n else np.zeros(0, dtype)
    valid = None
    if data.null_count:
        bits = np.frombuffer(data.buffers()[0], dtype=np.uint8)
        valid = np.unpackbits(bits, count=n + offset, bitorder="little")[offset:].astype(bool)
    return values, valid


def _numpy_views(arrays: list[pa.Array]) -> list:
    """Per array, None (not gathered by numpy) or (values, validity, group):
    arrays whose validity is the same share a group number, so that a
    batch gathers each distinct validity once (:meth:`FormulaCache.take`)."""
    views: list = []
    groups: dict = {}  # validity bytes (b"" for no nulls) -> (group number, validity)
    for array in arrays:
        view = _numpy_view(array)
        if view is None:
            views.append(None)
            continue
        values, valid = view
        key = b"" if valid is None else valid.tobytes()
        group, valid = groups.setdefault(key, (len(groups), valid))
        views.append((values, valid, group))
    return views


def _gathered_validity(valid, at: np.ndarray) -> tuple:
    """(validity bitmap or None, null count, every cell null) of the rows ``at``
    of a cache validity (bools, or None for no nulls)."""
    if valid is None:
        return None, 0, False
    kept = valid[at]
    nulls = len(kept) - int(np.count_nonzero(kept))
    if not nulls:
        return None, 0, False
    return pa.py_buffer(np.packbits(kept, bitorder="little")), nulls, nulls == len(kept)


def _gathered(array: pa.Array, values, validity: tuple, at: np.ndarray) -> pa.Array:
    """``array.take(at)`` from its numpy ``values`` and the rows' gathered
    validity (:func:`_gathered_validity`; ``at`` in range)."""
    bitmap, nulls, empty = validity
    # a cell that is null is never read: an empty column needs no gather
    taken = np.zeros(len(at), dtype=values.dtype) if empty else values[at]
    if pa.types.is_dictionary(array.type):
        codes = pa.Array.from_buffers(pa.int32(), len(taken), [bitmap, pa.py_buffer(taken)], null_count=nulls)
        return pa.DictionaryArray.from_arrays(codes, array.dictionary, safe=False)
    return pa.Array.from_buffers(pa.float64(), len(taken), [bitmap, pa.py_buffer(taken)], null_count=nulls)
