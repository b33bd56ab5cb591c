"""Which formulas are scored, where and when: :class:`BatchScorer`.

Per batch, the scheduler finds the distinct formulas the run's
:class:`~ionicity.pipelines.formula_cache.FormulaCache` lacks, scores a few
in-process and sends many to the workers (:class:`~ionicity.pipelines.pool.WorkerPool`),
each to the worker of its salt part, and hands back each row's cache row
once its formulas are in. :class:`Ticket` is a batch handed in ahead of time.
"""
from __future__ import annotations

import itertools
import math
import re
import zlib
from collections import deque
from dataclasses import dataclass

import pyarrow as pa
import pyarrow.compute as pc

from ionicity.pipelines.arrow_columns import as_text, int_array
from ionicity.pipelines.formula_cache import FormulaCache
from ionicity.pipelines.pool import WORKER_LOST, WorkerPool, default_workers, score_values

__all__ = ["locality_key", "BatchScorer", "Ticket", "PARALLEL_MIN_NEW", "formula_array", "used_entries"]

# Below this many new distinct formulas in a batch, shipping them to worker
# processes costs more than scoring them here (measured: see
# ``python -m ionicity.pipelines.bench --calibrate`` and DEVELOPERS.md, "Benchmarks").
PARALLEL_MIN_NEW = 256
_CHUNKS_PER_WORKER = 4
_MIN_CHUNK = 32
# the marks that end a salt part; the Dask engine sorts by it in Arrow (RE2 reads the same class)
ADDUCT_PATTERN = r"[·•∙⋅.*+]"
_ADDUCT_MARKS = re.compile(ADDUCT_PATTERN)
# each scorer marks the cache rows it has counted with its own token
_TOKENS = itertools.count(1)


def locality_key(text: str) -> tuple[str, str]:
    """(salt part, text): hydrates and other spellings of one salt share the
    scorer's per-process caches (the salt is decomposed once), so whoever
    splits formulas between processes keeps them together by this key."""
    return (_ADDUCT_MARKS.split(text, 1)[0].strip(), text)


_locality_key = locality_key


class BatchScorer:
    """Scores the distinct formulas of each batch, once each per run.

    New formulas go to ``workers`` worker processes when a batch brings at
    least :data:`PARALLEL_MIN_NEW` of them (or when the workers run
    already); fewer are scored in-process. Each formula goes to the worker
    chosen by its salt part (the text before any hydrate dot), so that the
    hydrates and spellings of one salt meet that worker's caches and the
    salt is resolved once, not once per worker. The workers start on first
    need (or :meth:`start`) and serve every later batch; use the scorer as a
    context manager (or call :meth:`close`) to stop them.
    """

    def __init__(self, workers: int | None = None, cache: FormulaCache | None = None,
                 parallel_min_new: int | None = None):
        self.workers = default_workers() if workers is None else max(int(workers), 1)
        # a cache of its own unless given one: it goes when the scorer goes
        self.cache = FormulaCache() if cache is None else cache
        self.parallel_min_new = PARALLEL_MIN_NEW if parallel_min_new is None else parallel_min_new
        self._pool = WorkerPool(self.workers)
        self._seen: set[int] = set()
        self._token = next(_TOKENS)
        self.scored_in_pool = 0
        # chunks sent to the workers and not collected yet: (sequence number, future, formulas)
        self._chunks: deque = deque()
        self._sequence = 0
        self._in_flight: set = set()

    def __enter__(self) -> "BatchScorer":
        return self

    def __exit__(self, exc_type, exc, tb) -> None:
        self.close(cancel=exc_type is not None)

    @property
    def distinct_formulas(self) -> int:
        """Distinct non-blank formulas met so far by this scorer."""
        return len(self._seen)

    def close(self, cancel: bool = False) -> None:
        """Stop the workers; ``cancel`` (after an error or Ctrl-C) stops them
        at once rather than letting them finish their chunk."""
        self._chunks.clear()
        self._in_flight.clear()
        self._pool.stop(cancel=cancel)

    def _use_pool(self, count: int) -> bool:
        # once the workers run, even a few formulas go there: they have the
        # data tables loaded, this process may not
        return self.workers >= 2 and (count >= self.parallel_min_new or self._pool.running)

    def start(self) -> None:
        """Start the workers now (when a large input is sure to need them),
        so that they start while this process reads the first batch."""
        if self.workers < 2 or self._pool.running:
            return
        try:
            self._pool.start()
        except WORKER_LOST:
            self._fall_back()

    def _fall_back(self) -> None:
        # a worker died (out of memory, killed): carry on in this process
        # rather than lose the run
        self.close(cancel=True)
        self.workers = 1
        self._pool = WorkerPool(1)

    def _assign(self, texts: list) -> list[tuple[int, list]]:
        """(worker, chunk) pairs: each text to the worker of its salt part,
        in chunks small enough that results flow back while others run."""
        groups: list[list] = [[] for _ in range(self.workers)]
        for salt, text in sorted(map(_locality_key, texts)):
            groups[zlib.crc32(salt.encode("utf-8", "surrogatepass")) % self.workers].append(text)
        size = max(_MIN_CHUNK, math.ceil(len(texts) / (self.workers * _CHUNKS_PER_WORKER)))
        return [(worker, group[i:i + size]) for worker, group in enumerate(groups) for i in range(0, len(group), size)]

    def _score_new(self, new: list) -> list[tuple]:
        """Score ``new`` (strings) now: in the workers when there are enough."""
        if not self._use_pool(len(new)):
            return score_values(new)
        try:
            futures = [(self._pool.submit(worker, score_values, chunk), chunk) for worker, chunk in self._assign(new)]
            scored = {}
            for future, chunk in futures:
                scored.update(zip(chunk, future.result()))
        except WORKER_LOST:
            self._fall_back()
            return score_values(new)
        self.scored_in_pool += len(new)
        return [scored[text] for text in new]

    def _note_seen(self, formulas) -> None:
        self._seen.update(hash(f) for f in formulas if f is not None and f.strip())

    def _store(self, texts: list, values: list[tuple], keep) -> None:
        self.cache.add(texts, values, keep=keep)

    def ids(self, formulas: list) -> list[int]:
        """Cache rows for ``formulas`` (distinct; strings, or ``None`` for an
        empty cell), scoring those not seen yet."""
        cache = self.cache
        self._note_seen(formulas)
        new = cache.missing(formulas)
        if new:
            texts = [f for f in new if f is not None]
            values = self._score_new(texts) if texts else []
            if len(texts) < len(new):
                texts.append(None)
                values.append(score_values([None])[0])
            cache.add(texts, values, keep=formulas)
        return cache.ids(formulas)

    def columns(self, formulas: list) -> list[pa.Array]:
        """One array per generated column, one row per entry of ``formulas``."""
        rows = pa.array(self.ids(formulas), type=pa.int64())
        return [a.take(rows) for a in self.cache.arrays()]

    # -- one batch at a time, scoring ahead ----------------------------------------

    def submit(self, formulas: pa.Array) -> "Ticket":
        """Start scoring the new distinct formulas of one batch (a string
        array; nulls are empty cells) and return at once; :meth:`rows_of`
        collects them. Batches must be collected in the order they were
        submitted. A few new formulas are scored here and now; many go to
        the worker pool, so that the caller can read and write other batches
        meanwhile."""
        # each text is hashed once, here; the cache is then searched for the
        # batch's distinct formulas only
        if pa.types.is_dictionary(formulas.type):
            distinct, indices = used_entries(formulas)
        else:
            encoded = pc.dictionary_encode(formulas)
            distinct, indices = encoded.dictionary, encoded.indices
        if indices.null_count and None not in self.cache.index:
            self._store([None], score_values([None]), keep=distinct)
        evictions = self.cache.evictions  # before any store below, which may evict
        size = len(self.cache)  # rows stored from here on come after it (until an eviction)
        found = pc.index_in(distinct, value_set=self.cache.keys())
        missing = pc.is_null(found)
        if found.null_count:
            # (dict.fromkeys: a dictionary read from a file is not checked for repeats)
            texts = [f for f in dict.fromkeys(distinct.filter(missing).to_pylist()) if f not in self._in_flight]
            if texts and not self._use_pool(len(texts)):
                self._store(texts, score_values(texts), keep=distinct)
            elif texts:
                self._send(texts, distinct)
        return Ticket(distinct, indices, self._sequence, found, evictions, size)

    def _send(self, texts: list, keep: pa.Array) -> None:
        try:
            for worker, chunk in self._assign(texts):
                future = self._pool.submit(worker, score_values, chunk)
                self._sequence += 1
                self._chunks.append((self._sequence, future, chunk))
                self._in_flight.update(chunk)
        except WORKER_LOST:
            self._fall_back()
            # what was sent is dropped with the workers; score it all here
            self._store(texts, score_values(texts), keep=keep)

    def ready(self, ticket: "Ticket") -> bool:
        """Whether :meth:`rows_of` would return without waiting for the pool."""
        return all(future.done() for sequence, future, _ in self._chunks if sequence <= ticket.last_chunk)

    def rows_of(self, ticket: "Ticket") -> pa.Array:
        """Cache row of every entry of a submitted batch, waiting for its
        formulas (and those of earlier batches) to be scored."""
        while self._chunks and self._chunks[0][0] <= ticket.last_chunk:
            _, future, chunk = self._chunks.popleft()
            try:
                values = future.result()
                self.scored_in_pool += len(chunk)
            except WORKER_LOST:
                self._fall_back()
                values = score_values(chunk)
            self._in_flight.difference_update(chunk)
            self._store(chunk, values, keep=ticket.distinct)
        found = self._rows_known(ticket)
        if found is None:
            found = pc.index_in(ticket.distinct, value_set=self.cache.keys())
        if found.null_count:
            # evicted from a full cache while the batch waited: score again
            texts = ticket.distinct.filter(pc.is_null(found)).to_pylist()
            self._store(texts, self._score_new(texts), keep=ticket.distinct)
            found = pc.index_in(ticket.distinct, value_set=self.cache.keys())
        rows = found.take(ticket.indices)
        if ticket.indices.null_count:
            if None not in self.cache.index:
                self._store([None], score_values([None]), keep=ticket.distinct)
                found = pc.index_in(ticket.distinct, value_set=self.cache.keys())
                rows = found.take(ticket.indices)
            rows = pc.fill_null(rows, int_array([self.cache.index[None]]).cast(rows.type)[0])
        self._note_seen(self.cache.first_seen(found, self._token))
        return rows

    def _rows_known(self, ticket: "Ticket") -> pa.Array | None:
        """The batch's cache rows from its lookup at :meth:`submit`, when no
        entry was evicted since (the rows then still hold; new entries were
        only appended): the rows of the formulas scored since are looked up
        among the keys stored since (rows from ``ticket.size`` on). Hashing
        the cache's keys again for every batch cost as much as the first
        lookup, and grows with the cache (every formula of the table, on a
        Dask worker after the shared pass); looking each missing text up in
        the index from Python took 7.5 ms for a slice that missed 14,000
        formulas, against 1.2 ms now (the first slices, read ahead before
        the workers return, miss nearly all their formulas)."""
        found = ticket.found
        if found is None or ticket.evictions != self.cache.evictions:
            return None
        if not found.null_count:
            return found
        was_missing = pc.is_null(found)
        since = pc.index_in(ticket.distinct.filter(was_missing), value_set=self.cache.keys().slice(ticket.size))
        # (the offset as an Arrow scalar taken from an array: a Python int goes through pa.scalar, which imports pandas)
        rows = pc.add(since.cast(pa.int64()), int_array([ticket.size])[0])
        return pc.replace_with_mask(found, was_missing, rows.cast(found.type))


@dataclass(frozen=True)
class Ticket:
    """A batch's formulas handed to :meth:`BatchScorer.submit`: their
    distinct non-null values and each row's index into them (null for an
    empty cell)."""

    distinct: pa.Array
    indices: pa.Array
    last_chunk: int
    #: each distinct formula's cache row at submit (null: not cached then), and the
    #: cache's eviction count then
    found: pa.Array | None = None
    evictions: int = -1
    #: the cache's length at submit: what is stored later comes after it
    size: int = 0


def formula_array(batch: pa.RecordBatch, formula_col: str) -> pa.Array:
    """The formula column of a batch as a string array, or as a dictionary
    array of strings when it was read that way."""
    formulas = batch.column(batch.schema.get_field_index(formula_col))
    if pa.types.is_dictionary(formulas.type) and pa.types.is_string(formulas.type.value_type):
        return formulas
    if not pa.types.is_string(formulas.type):
        formulas = as_text(formulas)
    return formulas



def used_entries(formulas: pa.DictionaryArray) -> tuple[pa.Array, pa.Array]:
    """(distinct, indices) of a dictionary array, keeping only the entries
    its rows use: a batch read from Parquet carries its row group's whole
    dictionary, and a formula none of its rows holds is not due yet."""
    indices = formulas.indices
    used = pc.unique(indices).drop_null()
    if len(used) == len(formulas.dictionary):
        return formulas.dictionary, indices
    return formulas.dictionary.take(used), pc.index_in(indices, value_set=used)
