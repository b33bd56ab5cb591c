"""``first_row_same_compound``: for each row, the 1-based data-row number of the
first row holding the same compound (same ``formula_normalized``, lattice
water included), empty for that first row and for rows that failed.

Known as rows stream past: :class:`FirstRows` keeps one entry per distinct
compound (a dict from normalised formula to its first row, and a numpy array
aligned with the cache's ``formula_normalized`` dictionary), so memory grows
with distinct compounds, not rows, and each batch costs a few numpy passes
over its dictionary codes (no Python work per row).

The Dask engine scores its partitions apart, in any order: a first pass
finds each distinct formula text's first row (:func:`first_positions`, per
partition, offset by the rows before it), the scored texts map to compounds
(:func:`compound_first_rows`, one entry per compound, built once per run) and
each partition's :class:`KnownFirstRows` reads its rows' values from that.
"""
from __future__ import annotations

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc

from ionicity.pipelines.arrow_columns import int_array, int_array_with_mask, int_numpy

__all__ = ["FirstRows", "KnownFirstRows", "first_positions", "compound_first_rows"]


class FirstRows:
    """The first row of each compound seen so far in one run.

    >>> import pyarrow as pa
    >>> seen = FirstRows()
    >>> seen.column(pa.array(["NaCl", "KCl", "NaCl", None]).dictionary_encode()).to_pylist()
    [None, None, 1, None]
    >>> seen.column(pa.array(["KCl", "LiF"]).dictionary_encode()).to_pylist()
    [2, None]
    """

    def __init__(self) -> None:
        self.rows_seen = 0
        self._by_formula: dict[str, int] = {}
        self._dictionary: pa.Array | None = None
        self._first = np.zeros(0, dtype=np.int64)  # per dictionary entry; 0 = not seen yet

    def __len__(self) -> int:
        return len(self._by_formula)

    def _align(self, dictionary: pa.Array) -> None:
        """Make ``_first`` follow ``dictionary``: the cache's dictionaries only
        grow, except when it evicts, which rebuilds them."""
        old = self._dictionary
        if old is not None and dictionary is old:
            return
        start = 0
        if old is not None and len(dictionary) >= len(old) and dictionary.slice(0, len(old)).equals(old):
            start = len(old)
        else:
            self._first = np.zeros(0, dtype=np.int64)
        if len(dictionary) > start:
            by_formula = self._by_formula
            added = np.fromiter(
                (by_formula.get(t, 0) for t in dictionary.slice(start).to_pylist()),
                dtype=np.int64, count=len(dictionary) - start,
            )
            self._first = np.concatenate([self._first, added])
        self._dictionary = dictionary

    def column(self, formulas: pa.Array) -> pa.Array:
        """The ``first_row_same_compound`` values of the next batch, given its
        ``formula_normalized`` column (dictionary-encoded, null for failed rows)."""
        formulas, codes, valid = _codes(formulas)
        n = len(formulas)
        self._align(formulas.dictionary)
        safe = np.where(valid, codes, 0)
        first = self._first[safe] if len(self._first) else np.zeros(n, dtype=np.int64)
        new = valid & (first == 0)
        if new.any():
            new_codes, at = np.unique(codes[new], return_index=True)
            positions = np.flatnonzero(new)[at]
            row_numbers = self.rows_seen + positions + 1
            self._first[new_codes] = row_numbers
            texts = formulas.dictionary.take(int_array(new_codes)).to_pylist()
            self._by_formula.update(zip(texts, row_numbers.tolist()))
            first = self._first[safe]
        own = self.rows_seen + np.arange(1, n + 1, dtype=np.int64)
        mask = ~valid | (first == own)
        self.rows_seen += n
        return int_array_with_mask(first, mask)


def _codes(formulas: pa.Array) -> tuple[pa.DictionaryArray, np.ndarray, np.ndarray]:
    """(dictionary array, int64 codes with -1 for null, validity) of a text column."""
    if isinstance(formulas, pa.ChunkedArray):
        formulas = formulas.combine_chunks()
    if not pa.types.is_dictionary(formulas.type):
        formulas = pc.dictionary_encode(formulas)
    n = len(formulas)
    indices = formulas.indices
    codes = int_numpy(indices).astype(np.int64)  # to_numpy and fill_null with a scalar import pandas
    if indices.null_count:
        validity = np.unpackbits(np.frombuffer(indices.buffers()[0], dtype=np.uint8), bitorder="little")
        valid = validity[indices.offset:indices.offset + n].astype(bool)
        codes[~valid] = -1
    else:
        valid = np.ones(n, dtype=bool)
    return formulas, codes, valid


def first_positions(formulas: pa.Array) -> tuple[pa.Array, np.ndarray]:
    """The distinct non-null texts of a column and the 0-based position of
    each one's first row, in order of first appearance.

    >>> texts, at = first_positions(pa.array(["KCl", None, "NaCl", "KCl", "LiF"]))
    >>> texts.to_pylist(), at.tolist()
    (['KCl', 'NaCl', 'LiF'], [0, 2, 4])
    """
    formulas, codes, valid = _codes(formulas)
    used, at = np.unique(codes[valid], return_index=True)
    at = np.flatnonzero(valid)[at]
    order = np.argsort(at, kind="stable")
    texts = formulas.dictionary.take(int_array(used[order]))
    if pa.types.is_dictionary(texts.type):
        texts = texts.dictionary_decode()
    return texts, at[order]


def compound_first_rows(normalized: pa.Array, first_rows: np.ndarray) -> tuple[pa.Array, np.ndarray]:
    """Each compound's first row: ``normalized`` holds the compound
    (``formula_normalized``, null for a text that failed) of each distinct
    formula text, ``first_rows`` that text's first row; a compound's first
    row is the smallest over its texts. One entry per compound.

    >>> compounds, first = compound_first_rows(pa.array(["NaCl", "KCl", None, "NaCl"]), np.array([9, 3, 1, 4]))
    >>> dict(zip(compounds.to_pylist(), first.tolist()))
    {'NaCl': 4, 'KCl': 3}
    """
    normalized, codes, valid = _codes(normalized)
    first = np.full(len(normalized.dictionary), np.iinfo(np.int64).max, dtype=np.int64)
    np.minimum.at(first, codes[valid], np.asarray(first_rows, dtype=np.int64)[valid])
    seen = first != np.iinfo(np.int64).max
    compounds = normalized.dictionary.filter(pa.array(seen))
    return compounds, first[seen]


class KnownFirstRows:
    """``first_row_same_compound`` of one partition, given every compound's
    first row in the whole table (:func:`compound_first_rows`) and the number
    of rows before the partition; the same values as :class:`FirstRows`
    gives streaming the whole table in order.

    >>> compounds, first = pa.array(["NaCl", "KCl"]), np.array([1, 3])
    >>> KnownFirstRows(compounds, first, rows_before=2).column(pa.array(["KCl", "NaCl", None])).to_pylist()
    [None, 1, None]
    """

    def __init__(self, compounds: pa.Array, first_rows: np.ndarray, rows_before: int) -> None:
        self.compounds = compounds
        self.first_rows = np.asarray(first_rows, dtype=np.int64)
        self.rows_seen = rows_before
        self._dictionary: pa.Array | None = None
        self._first = np.zeros(0, dtype=np.int64)  # per dictionary entry; 0 = a compound not in the table

    def column(self, formulas: pa.Array) -> pa.Array:
        """The values of the partition's next batch, given its
        ``formula_normalized`` column (null for failed rows)."""
        formulas, codes, valid = _codes(formulas)
        n = len(formulas)
        if formulas.dictionary is not self._dictionary:
            # vectorised: the run's cache holds one dictionary for every batch until it grows
            at = pc.index_in(formulas.dictionary, value_set=self.compounds)
            found = pc.is_valid(at).to_numpy(zero_copy_only=False)
            self._first = np.zeros(len(at), dtype=np.int64)
            self._first[found] = self.first_rows[int_numpy(at.drop_null())]
            self._dictionary = formulas.dictionary
        first = self._first[np.where(valid, codes, 0)] if len(self._first) else np.zeros(n, dtype=np.int64)
        own = self.rows_seen + np.arange(1, n + 1, dtype=np.int64)
        self.rows_seen += n
        return int_array_with_mask(first, ~valid | (first == own) | (first == 0))
