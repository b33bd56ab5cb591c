"""``first_row_same_compound``: for each row, the 1-based data-row number of the
first row holding the same compound (same ``formula_normalized``, lattice
water included), empty for that first row and for rows that failed.

Known as rows stream past: :class:`FirstRows` keeps one entry per distinct
compound (a dict from normalised formula to its first row, and a numpy array
aligned with the cache's ``formula_normalized`` dictionary), so memory grows
with distinct compounds, not rows, and each batch costs a few numpy passes
over its dictionary codes (no Python work per row).

The Dask engine leaves the column empty: its partitions are scored apart and
none knows how many rows come before it.
"""
from __future__ import annotations

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc

from ionicity.pipelines.arrow_columns import int_array, int_array_with_mask, int_numpy

__all__ = ["FirstRows"]


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
        if isinstance(formulas, pa.ChunkedArray):
            formulas = formulas.combine_chunks()
        if not pa.types.is_dictionary(formulas.type):
            formulas = pc.dictionary_encode(formulas)
        n = len(formulas)
        self._align(formulas.dictionary)
        indices = formulas.indices
        codes = int_numpy(indices).astype(np.int64)  # to_numpy and fill_null with a scalar import pandas
        if indices.null_count:
            validity = np.unpackbits(np.frombuffer(indices.buffers()[0], dtype=np.uint8), bitorder="little")
            valid = validity[indices.offset:indices.offset + n].astype(bool)
            codes[~valid] = -1
        else:
            valid = np.ones(n, dtype=bool)
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
