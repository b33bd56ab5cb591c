"""The local engine: score a table batch by batch, each distinct formula once.

Per batch: dictionary-encode the formula column, look the distinct formulas
up in the process-wide :class:`FormulaCache`, score only the new ones (across
worker processes when there are enough of them to pay for it), build each
generated column for the distinct values and expand it to every row with one
``take``. Rows keep their order and input columns pass through untouched.

The same :func:`score_batch` runs inside each Dask worker
(:mod:`pipelines.dask_engine`).
"""
from __future__ import annotations

import itertools
import json
import zlib
import math
import os
import re
import sys
import time
from collections import deque
from concurrent.futures import CancelledError, ProcessPoolExecutor
from concurrent.futures.process import BrokenProcessPool
from dataclasses import asdict, dataclass

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc

from ionicity.scorer.columns import column_names, output_columns
from ionicity.scorer.melting_model import MODEL_COLUMNS, predict_for_formulas
from ionicity.scorer.verdict import Verdict, with_warnings

from ionicity.pipelines._pool import score_values
from ionicity.pipelines._workers import default_workers, new_workers, ready, stop_workers, take_prestarted
from ionicity.pipelines.io import InputError, TableWriter, open_reader

__all__ = [
    "ScoreConfig",
    "Summary",
    "FormulaCache",
    "BatchScorer",
    "score_batch",
    "score_table",
    "score_file",
    "find_formula_column",
    "output_schema",
    "provenance_metadata",
    "ENGINES",
    "PARALLEL_MIN_NEW",
    "TEXT_TYPE",
]

_ARROW_TYPES = {"string": pa.string(), "float64": pa.float64(), "int64": pa.int64(), "bool": pa.bool_()}
# Generated text columns are written dictionary-encoded: most hold a few
# distinct values (status, classes) or repeat per distinct formula, and a
# reader gets each text once (pandas: a categorical column).
TEXT_TYPE = pa.dictionary(pa.int32(), pa.string())
_OUTPUT_TYPES = dict(_ARROW_TYPES, string=TEXT_TYPE)
ENGINES = ("local", "dask")
# Below this many new distinct formulas in a batch, shipping them to worker
# processes costs more than scoring them here (measured: see pipelines.bench
# --calibrate and DEVELOPERS.md, "Benchmarks").
PARALLEL_MIN_NEW = 256
_CHUNKS_PER_WORKER = 4
# batches read and sent for scoring before the oldest is written
_READ_AHEAD_BATCHES = 8
_FIRST_SLICE_ROWS = 4096

_MIN_CHUNK = 32
_ADDUCT_MARKS = re.compile(r"[·•∙⋅.*+]")


def _locality_key(text: str) -> tuple[str, str]:
    # Hydrates and other spellings of one salt share the scorer's per-process
    # caches (the salt is decomposed once), so keep them in the same chunk.
    return (_ADDUCT_MARKS.split(text, 1)[0].strip(), text)


@dataclass
class ScoreConfig:
    """Options of one scoring run; the CLI builds one from its arguments.

    Parameters
    ----------
    input, output : str
        Paths (``-`` for CSV on stdin / stdout). The output format follows
        the output's extension; the Dask engine writes a folder of Parquet
        parts.
    formula_col, name_col : str or None
        Column holding the formulas (default: the one named ``formula`` in any
        case) and an optional column quoted in the message of failed rows.
    prefix : str, default=""
        Prefix for every generated column name.
    engine : {"local", "dask"}, default="local"
    workers : int or None, default=None
        Processes scoring distinct formulas (local engine) or Dask workers of
        the local cluster; ``None`` means every core.
    scheduler : str or None
        Address of a running Dask scheduler (``--engine dask`` only).
    mp_model : str or None
        A melting-point model written by ``ionicity fit-melting``; adds
        ``mp_predicted_K``, ``mp_interval_low_K`` and ``mp_interval_high_K``.
    """

    input: str
    output: str
    formula_col: str | None = None
    name_col: str | None = None
    prefix: str = ""
    overwrite: bool = False
    strict: bool = False
    quiet: bool = False
    batch_rows: int = 65536
    engine: str = "local"
    workers: int | None = None
    scheduler: str | None = None
    mp_model: str | None = None

    def validate(self) -> None:
        """Raise :class:`InputError` for options that cannot work together."""
        if self.engine not in ENGINES:
            raise InputError(f"unknown engine {self.engine!r}; choose one of {', '.join(ENGINES)}")
        if self.workers is not None and (not isinstance(self.workers, int) or self.workers < 1):
            raise InputError(f"--workers must be a whole number of at least 1, not {self.workers!r}")
        if not isinstance(self.batch_rows, int) or self.batch_rows < 1:
            raise InputError(f"--batch-rows must be a positive whole number, not {self.batch_rows!r}")
        if self.scheduler is not None and self.engine != "dask":
            raise InputError("--scheduler needs --engine dask")


@dataclass
class Summary:
    """What a run did; ``str()`` is the one-line summary printed at the end."""

    rows: int = 0
    ok: int = 0
    warning: int = 0
    error: int = 0
    distinct_formulas: int = 0
    seconds: float = 0.0
    output: str = ""

    def __str__(self) -> str:
        return (
            f"rows: {self.rows}, ok: {self.ok}, warning: {self.warning}, error: {self.error},"
            f" distinct formulas: {self.distinct_formulas}, seconds: {self.seconds:.2f}"
        )


# Arrays of Python values are built here without pa.array: on its first
# conversion pyarrow imports pandas (some 0.3 s of CPU), which a run of the
# command line never needs otherwise.
_StringBuilder = getattr(pa.lib, "StringBuilder", None)


def _validity(valid: np.ndarray) -> tuple:
    """(validity buffer or None, null count) of a boolean mask."""
    nulls = len(valid) - int(np.count_nonzero(valid))
    if not nulls:
        return None, 0
    return pa.py_buffer(np.packbits(valid, bitorder="little")), nulls


def _float_array(values) -> pa.Array:
    """float64 array of floats or None; a NaN score becomes a null cell, as
    for text columns."""
    data = np.array(values, dtype=np.float64)  # None -> NaN
    bitmap, nulls = _validity(~np.isnan(data))
    return pa.Array.from_buffers(pa.float64(), len(data), [bitmap, pa.py_buffer(data)], null_count=nulls)


def _int_array(values) -> pa.Array:
    """int64 array of a sequence of ints (no nulls)."""
    data = np.ascontiguousarray(values, dtype=np.int64)
    return pa.Array.from_buffers(pa.int64(), len(data), [None, pa.py_buffer(data)], null_count=0)


def _bool_array(values) -> pa.Array:
    """bool array of True, False or None."""
    valid = np.fromiter((v is not None for v in values), dtype=bool, count=len(values))
    data = np.fromiter((bool(v) for v in values), dtype=bool, count=len(values))
    bitmap, nulls = _validity(valid)
    bits = pa.py_buffer(np.packbits(data, bitorder="little"))
    return pa.Array.from_buffers(pa.bool_(), len(values), [bitmap, bits], null_count=nulls)


def _string_array(values) -> pa.Array:
    """string array of str or None."""
    if _StringBuilder is None:
        return pa.array(values, type=pa.string())
    builder = _StringBuilder()
    builder.append_values(values)
    return builder.finish()


def _int_numpy(array: pa.Array) -> np.ndarray:
    """A view of an integer array without nulls (``to_numpy`` imports pandas)."""
    width = array.type.bit_width // 8
    if not len(array):
        return np.zeros(0, dtype=f"<i{width}")
    return np.frombuffer(array.buffers()[1], dtype=f"<i{width}", count=len(array), offset=array.offset * width)


def _values_array(values, type: pa.DataType) -> pa.Array:
    if type == pa.float64():
        return _float_array(values)
    if type == pa.bool_():
        return _bool_array(values)
    if type == pa.string():
        return _string_array(values)
    return pa.array(values, type=type)


class FormulaCache:
    """Scores of the formulas already seen in this process, kept as one Arrow
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
            else pa.nulls(0, _ARROW_TYPES[c.dtype])
            for c, text in zip(columns, self._text)
        ]
        self._pending: list[tuple] = []
        # empty arrays made without converting Python values: pyarrow imports
        # pandas on its first such conversion, which need not delay the
        # first batch (a large run converts later, while the workers score)
        self._keys = pa.nulls(0, pa.string())
        self._pending_keys: list = []
        # per row, the token of the last scorer that counted it (first_seen)
        self._marks = np.zeros(0, dtype=np.int64)

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
        base = len(self.index)
        for offset, text in enumerate(formulas):
            self.index[text] = base + offset
        self._pending.extend(values)
        self._pending_keys.extend(formulas)

    def keys(self) -> pa.Array:
        """The cached formulas in row order (a string array; null is the
        empty-cell record), for ``pyarrow.compute.index_in``."""
        if self._pending_keys:
            self._keys = pa.concat_arrays([self._keys, _string_array(self._pending_keys)])
            self._marks = np.concatenate([self._marks, np.zeros(len(self._pending_keys), dtype=np.int64)])
            self._pending_keys = []
        return self._keys

    def first_seen(self, rows: pa.Array, token: int) -> list:
        """The formulas at cache ``rows`` not yet marked with ``token``;
        marks them. A scorer counts the distinct formulas of its run this
        way without hashing every row's text again."""
        keys = self.keys()
        distinct = _int_numpy(pc.unique(rows))
        fresh = distinct[self._marks[distinct] != token]
        if not len(fresh):
            return []
        self._marks[fresh] = token
        return keys.take(_int_array(fresh)).to_pylist()

    def arrays(self) -> list[pa.Array]:
        """One array per generated column, one row per cached formula; text
        columns as ``DictionaryArray``."""
        if self._pending:
            by_column = list(zip(*self._pending))
            self._pending = []
            self._arrays = [
                self._append_text(old, values) if text
                else pa.concat_arrays([old, _values_array(values, old.type)])
                for old, text, values in zip(self._arrays, self._text, by_column)
            ]
        return self._arrays

    def _append_text(self, old: pa.DictionaryArray, values) -> pa.DictionaryArray:
        texts = _string_array(values)
        dictionary = old.dictionary
        unseen = pc.unique(texts.filter(pc.is_null(pc.index_in(texts, value_set=dictionary)))).drop_null()
        if len(unseen):
            dictionary = pa.concat_arrays([dictionary, unseen])
        codes = pc.index_in(texts, value_set=dictionary)  # null stays null
        return pa.DictionaryArray.from_arrays(pa.concat_arrays([old.indices, codes]), dictionary, safe=False)

    def ids(self, formulas) -> list[int]:
        index = self.index
        return [index[f] for f in formulas]

    def _evict(self, incoming: int, keep: set) -> None:
        arrays = self.arrays()
        budget = max(min(len(self.index) * 3 // 4, self.max_entries - incoming), 0)
        kept = [f for f in self.index if f in keep]
        others = [f for f in self.index if f not in keep]
        kept += others[max(len(others) - max(budget - len(kept), 0), 0):]
        kept.sort(key=self.index.__getitem__)
        rows = _int_array([self.index[f] for f in kept])
        self.keys()
        self._keys = _string_array(kept)
        self._marks = self._marks[_int_numpy(rows)]
        self._arrays = []
        for k, array in enumerate(arrays):
            array = array.take(rows)
            if self._text[k]:
                # drop the texts no kept entry uses, so the dictionaries stay bounded too
                array = pc.dictionary_encode(array.dictionary_decode())
            self._arrays.append(array)
        self.index = {f: i for i, f in enumerate(kept)}


_PROCESS_CACHE = FormulaCache()
_TOKENS = itertools.count(1)


class BatchScorer:
    """Scores the distinct formulas of each batch, once each per process.

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
        self.cache = _PROCESS_CACHE if cache is None else cache
        self.parallel_min_new = PARALLEL_MIN_NEW if parallel_min_new is None else parallel_min_new
        # one single-process executor per worker, so that a task can be
        # sent to a chosen worker
        self._pools: list[ProcessPoolExecutor] = []
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
        pools, self._pools = self._pools, []
        self._chunks.clear()
        self._in_flight.clear()
        stop_workers(pools, cancel=cancel)

    def _start_pools(self) -> list[ProcessPoolExecutor]:
        if not self._pools:
            self._pools = take_prestarted(self.workers) or new_workers(self.workers)
        return self._pools

    def _use_pool(self, count: int) -> bool:
        # once the workers run, even a few formulas go there: they have the
        # data tables loaded, this process may not
        return self.workers >= 2 and (count >= self.parallel_min_new or bool(self._pools))

    def start(self) -> None:
        """Start the workers now (when a large input is sure to need them),
        so that they start while this process reads the first batch."""
        if self.workers < 2 or self._pools:
            return
        try:
            for pool in self._start_pools():
                pool.submit(ready)
        except (BrokenProcessPool, RuntimeError, OSError):
            self._fall_back()

    def _fall_back(self) -> None:
        # a worker died (out of memory, killed): carry on in this process
        # rather than lose the run
        self.close(cancel=True)
        self.workers = 1

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
            pools = self._start_pools()
            futures = [(pools[worker].submit(score_values, chunk), chunk) for worker, chunk in self._assign(new)]
            scored = {}
            for future, chunk in futures:
                scored.update(zip(chunk, future.result()))
        except (BrokenProcessPool, CancelledError, RuntimeError):
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
            distinct, indices = _used_entries(formulas)
        else:
            encoded = pc.dictionary_encode(formulas)
            distinct, indices = encoded.dictionary, encoded.indices
        if indices.null_count and None not in self.cache.index:
            self._store([None], score_values([None]), keep=distinct)
        missing = pc.is_null(pc.index_in(distinct, value_set=self.cache.keys()))
        if pc.any(missing).as_py():
            # (dict.fromkeys: a dictionary read from a file is not checked for repeats)
            texts = [f for f in dict.fromkeys(distinct.filter(missing).to_pylist()) if f not in self._in_flight]
            if texts and not self._use_pool(len(texts)):
                self._store(texts, score_values(texts), keep=distinct)
            elif texts:
                self._send(texts, distinct)
        return Ticket(distinct, indices, self._sequence)

    def _send(self, texts: list, keep: pa.Array) -> None:
        try:
            pools = self._start_pools()
            for worker, chunk in self._assign(texts):
                future = pools[worker].submit(score_values, chunk)
                self._sequence += 1
                self._chunks.append((self._sequence, future, chunk))
                self._in_flight.update(chunk)
        except (BrokenProcessPool, RuntimeError):
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
            except (BrokenProcessPool, CancelledError):
                self._fall_back()
                values = score_values(chunk)
            self._in_flight.difference_update(chunk)
            self._store(chunk, values, keep=ticket.distinct)
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
            rows = pc.fill_null(rows, _int_array([self.cache.index[None]]).cast(rows.type)[0])
        self._note_seen(self.cache.first_seen(found, self._token))
        return rows


@dataclass(frozen=True)
class Ticket:
    """A batch's formulas handed to :meth:`BatchScorer.submit`: their
    distinct non-null values and each row's index into them (null for an
    empty cell)."""

    distinct: pa.Array
    indices: pa.Array
    last_chunk: int


def formula_array(batch: pa.RecordBatch, formula_col: str) -> pa.Array:
    """The formula column of a batch as a string array, or as a dictionary
    array of strings when it was read that way."""
    formulas = batch.column(batch.schema.get_field_index(formula_col))
    if pa.types.is_dictionary(formulas.type) and pa.types.is_string(formulas.type.value_type):
        return formulas
    if not pa.types.is_string(formulas.type):
        formulas = pc.cast(formulas, pa.string())
    return formulas


def _used_entries(formulas: pa.DictionaryArray) -> tuple[pa.Array, pa.Array]:
    """(distinct, indices) of a dictionary array, keeping only the entries
    its rows use: a batch read from Parquet carries its row group's whole
    dictionary, and a formula none of its rows holds is not due yet."""
    indices = formulas.indices
    used = pc.unique(indices).drop_null()
    if len(used) == len(formulas.dictionary):
        return formulas.dictionary, indices
    return formulas.dictionary.take(used), pc.index_in(indices, value_set=used)


def find_formula_column(names: list[str], requested: str | None) -> str:
    """The formula column: ``requested``, else the one named ``formula`` in any case."""
    if requested is not None:
        if requested not in names:
            raise InputError(f"no column {requested!r} in the input; columns found: {', '.join(map(repr, names))}")
        return requested
    matches = [n for n in names if n.strip().lower() == "formula"]
    if len(matches) == 1:
        return matches[0]
    if len(matches) > 1:
        raise InputError(f"several columns could be the formula column: {matches}; choose one with --formula-col")
    raise InputError(
        "no column named 'formula'; choose one with --formula-col. Columns found: " + ", ".join(map(repr, names))
    )


def generated_names(input_names: list[str], prefix: str, with_model: bool = False) -> list[str]:
    """Generated column names (with ``prefix``); a clash with an input column is an error."""
    names = [prefix + c.name for c in _generated_columns(with_model)]
    clashes = [n for n in names if n in input_names]
    if clashes:
        raise InputError(
            f"generated column(s) {clashes} clash with input columns; pass --prefix TEXT (e.g. --prefix ion_)"
        )
    return names


def _generated_columns(with_model: bool) -> tuple:
    if not with_model:
        return output_columns()

    return output_columns() + tuple(MODEL_COLUMNS)


def output_schema(input_schema: pa.Schema, prefix: str = "", with_model: bool = False) -> pa.Schema:
    """Input fields, unchanged, followed by the generated columns (and the
    melting-model columns when a model is applied)."""
    columns = _generated_columns(with_model)
    names = generated_names(input_schema.names, prefix, with_model)
    fields = list(input_schema) + [pa.field(name, _OUTPUT_TYPES[c.dtype]) for name, c in zip(names, columns)]
    return pa.schema(fields)


class ModelApplier:
    """Applies a fitted melting model to the distinct formulas of each batch,
    once per formula: the three ``mp_*_K`` columns, and the verdict of rows
    outside the model's training domain (:func:`scorer.verdict.with_warnings`)."""

    def __init__(self, model):
        self.model = model
        self.done: dict = {}

    def columns(self, distinct: list, cache_rows: pa.Array, cache: FormulaCache) -> tuple[list[pa.Array], pa.Array, pa.Array]:
        """(model arrays, status, message) for ``distinct``, one row each."""
        new = [i for i, f in enumerate(distinct) if f not in self.done]
        if new:
            positions = column_names()
            arrays = cache.arrays()
            rows = pa.array([cache_rows[i].as_py() for i in new], type=pa.int64())
            status = arrays[positions.index("status")].take(rows).to_pylist()
            message = arrays[positions.index("message")].take(rows).to_pylist()
            value_notes = arrays[positions.index("value_notes")].take(rows).to_pylist()
            predictions = predict_for_formulas(self.model, [distinct[i] for i in new])
            for k, (i, prediction) in enumerate(zip(new, predictions)):
                verdict = Verdict(status[k], message[k], value_notes[k])
                if prediction.domain_warnings:
                    verdict = with_warnings(verdict, prediction.domain_warnings)
                self.done[distinct[i]] = prediction.values() + (verdict.status, verdict.message)
        rows = [self.done[f] for f in distinct]
        model_arrays = [
            pa.array([None if r[k] != r[k] else float(r[k]) for r in rows], type=pa.float64())
            for k in range(len(MODEL_COLUMNS))
        ]
        status = pc.dictionary_encode(pa.array([r[-2] for r in rows], type=pa.string()))
        message = pc.dictionary_encode(pa.array([r[-1] for r in rows], type=pa.string()))
        return model_arrays, status, message


def score_batch(
    batch: pa.RecordBatch,
    formula_col: str,
    schema: pa.Schema,
    scorer: BatchScorer | FormulaCache | None = None,
    name_col: str | None = None,
    model: ModelApplier | None = None,
    ticket: Ticket | None = None,
) -> pa.RecordBatch:
    """Append the generated columns to one batch, in row order.

    ``schema`` is :func:`output_schema` of the batch's schema (it names the
    generated columns, prefix included). ``ticket`` is what
    :meth:`BatchScorer.submit` returned for this batch, when its formulas
    were sent for scoring ahead of time.
    """
    if not isinstance(scorer, BatchScorer):
        scorer = BatchScorer(1, cache=scorer)
    if ticket is None:
        ticket = scorer.submit(formula_array(batch, formula_col))
    rows = scorer.rows_of(ticket)
    columns = [
        # a column read dictionary-encoded (the formulas, from Parquet) goes
        # out with its input type
        c.dictionary_decode() if pa.types.is_dictionary(c.type) and not pa.types.is_dictionary(f.type) else c
        for c, f in zip(batch.columns, schema)
    ] + [a.take(rows) for a in scorer.cache.arrays()]
    if model is not None:
        distinct = ticket.distinct.to_pylist()
        indices = ticket.indices
        if indices.null_count:
            distinct.append(None)
            indices = pc.fill_null(indices, len(distinct) - 1)
        cache_rows = pa.array(scorer.cache.ids(distinct), type=pa.int64())
        model_arrays, status, message = model.columns(distinct, cache_rows, scorer.cache)
        first = len(batch.columns)
        names = column_names()
        columns[first + names.index("status")] = status.take(indices)
        columns[first + names.index("message")] = message.take(indices)
        columns += [a.take(indices) for a in model_arrays]
    if name_col is not None:
        _name_failed_rows(columns, batch, name_col, len(batch.columns))
    return pa.RecordBatch.from_arrays(columns, schema=schema)


def _name_failed_rows(columns: list, batch: pa.RecordBatch, name_col: str, first: int) -> None:
    names = output_columns()
    status_at = first + [c.name for c in names].index("status")
    message_at = first + [c.name for c in names].index("message")
    row_names = batch.column(batch.schema.get_field_index(name_col))
    if not pa.types.is_string(row_names.type):
        row_names = pc.cast(row_names, pa.string())
    row_names = pc.fill_null(row_names, "")
    status = columns[status_at].dictionary_decode()
    message = columns[message_at].dictionary_decode()
    failed = pc.and_(pc.equal(status, "error"), pc.not_equal(row_names, ""))
    labelled = pc.binary_join_element_wise(pc.fill_null(message, ""), " (row named '", row_names, "')", "")
    columns[message_at] = pc.dictionary_encode(pc.if_else(failed, labelled, message))


def _count_status(summary: Summary, batch: pa.RecordBatch, status_name: str) -> None:
    counts = pc.value_counts(batch.column(batch.schema.get_field_index(status_name))).to_pylist()
    for item in counts:
        if item["values"] in ("ok", "warning", "error"):
            setattr(summary, item["values"], getattr(summary, item["values"]) + item["counts"])


class Progress:
    """Rows done, rows per second and time left on one stderr line, only when
    stderr is a terminal and the run is not ``--quiet``."""

    def __init__(self, enabled: bool, total_rows: int | None = None, fraction_done=None, stream=None):
        self.stream = stream or sys.stderr
        self.enabled = enabled and self.stream.isatty()
        self.total_rows = total_rows
        self.fraction_done = fraction_done
        self.start = time.perf_counter()
        self.last = 0.0

    def update(self, rows: int, force: bool = False) -> None:
        if not self.enabled:
            return
        now = time.perf_counter()
        if now - self.last < 0.25 and not force:
            return
        self.last = now
        elapsed = max(now - self.start, 1e-9)
        fraction = None
        if self.total_rows:
            fraction = rows / self.total_rows
        elif self.fraction_done is not None:
            fraction = self.fraction_done()
        left = ""
        if fraction and fraction > 0:
            seconds = max(elapsed * (1 - fraction) / fraction, 0.0)
            left = f"  {int(seconds // 60)}:{int(seconds % 60):02d} left"
        percent = f" ({100 * fraction:.0f}%)" if fraction is not None else ""
        self.stream.write(f"\r{rows:,} rows{percent}  {rows / elapsed:,.0f} rows/s{left}   ")
        self.stream.flush()

    def close(self) -> None:
        if self.enabled:
            self.stream.write("\r" + " " * 72 + "\r")
            self.stream.flush()


def _data_versions() -> dict:
    import hashlib
    from importlib import resources

    from ionicity.scorer.elements import snapshot_info

    info = snapshot_info()
    tables = {}
    for entry in sorted(resources.files("ionicity.scorer.data").iterdir(), key=lambda e: e.name):
        if entry.name.endswith((".csv", ".json")):
            tables[entry.name] = "sha256:" + hashlib.sha256(entry.read_bytes()).hexdigest()[:16]
    return {
        "elements_snapshot": {
            "mendeleev_version": info.get("mendeleev_version"),
            "format_version": info.get("format_version"),
        },
        "tables": tables,
    }


def provenance_metadata(config: ScoreConfig, formula_col: str) -> dict[str, str]:
    """Parquet key-value metadata: ionicity version, data snapshot versions
    (the element snapshot's mendeleev version and a digest of every packaged
    table) and the options of the run."""
    from ionicity.scorer import __version__

    options = {k: v for k, v in asdict(config).items() if k not in ("output", "quiet", "overwrite")}
    options["formula_col"] = formula_col
    return {
        "ionicity.version": __version__,
        "ionicity.data_versions": json.dumps(_data_versions(), sort_keys=True),
        "ionicity.options": json.dumps(options, sort_keys=True),
    }


def prepare(config: ScoreConfig):
    """Open the input and check the options against it: returns the reader,
    the formula column and the output schema. Raises :class:`InputError`."""
    config.validate()
    reader = open_reader(config.input, config.batch_rows)
    names = reader.schema.names
    formula_col = find_formula_column(names, config.formula_col)
    if config.name_col is not None and config.name_col not in names:
        raise InputError(f"no column {config.name_col!r} for --name-col; columns found: {', '.join(map(repr, names))}")
    return reader, formula_col, output_schema(reader.schema, config.prefix, with_model=config.mp_model is not None)


def load_model_applier(config: ScoreConfig) -> ModelApplier | None:
    """The ``--mp-model`` file, checked and loaded; InputError when unusable."""
    if config.mp_model is None:
        return None
    from ionicity.scorer.melting_model import ModelFormatError

    from ionicity.pipelines.melting_model_file import load_model

    try:
        return ModelApplier(load_model(config.mp_model))
    except ModelFormatError as exc:
        raise InputError(str(exc).splitlines()[0]) from None


def score_file(config: ScoreConfig | str, output: str | None = None, **options) -> Summary:
    """Score a CSV, TSV or Parquet file into another, streaming in batches.

    ``score_file("in.csv", "out.parquet", formula_col="smiles_free_formula")``
    or ``score_file(ScoreConfig(...))``. Raises :class:`InputError` for
    unusable input or options; nothing is written at the output path then.
    With ``engine="dask"`` the work goes to :func:`pipelines.dask_engine.score_file_dask`.
    """
    if not isinstance(config, ScoreConfig):
        config = ScoreConfig(input=config, output=output if output is not None else "-", **options)
    config.validate()
    if config.engine == "dask":
        from ionicity.pipelines.dask_engine import score_file_dask

        return score_file_dask(config)
    started = time.perf_counter()
    model = load_model_applier(config)
    reader, formula_col, schema = prepare(config)
    # the formulas' distinct values straight from the Parquet dictionary
    # pages: hashing every row's text cost more than a fifth of this process's time
    reader.read_dictionary = (formula_col,)
    metadata = provenance_metadata(config, formula_col) if config.output != "-" and config.output.lower().endswith((".parquet", ".pq")) else None
    # Parquet min/max statistics for the input and the numeric columns only:
    # on generated text (free text, or a few labels found in every row group)
    # no reader could skip a row group by them, and they cost a fifth of the write
    statistics = [f.name for f in schema if not pa.types.is_dictionary(f.type)]
    writer = TableWriter(config.output, schema, overwrite=config.overwrite, metadata=metadata, inputs=reader.paths,
                         background=True, statistics=statistics)
    summary = Summary(output=config.output)
    progress = Progress(not config.quiet, reader.total_rows, reader.fraction_done)
    status_name = config.prefix + "status"
    scorer = BatchScorer(config.workers)
    waiting: deque = deque()  # (batch, ticket): submitted, not written yet

    def finish() -> None:
        batch, ticket = waiting.popleft()
        scored = score_batch(batch, formula_col, schema, scorer, name_col=config.name_col, model=model, ticket=ticket)
        writer.write(scored)
        summary.rows += batch.num_rows
        _count_status(summary, scored, status_name)
        progress.update(summary.rows)

    try:
        if _worth_a_pool(reader):
            scorer.start()
        # Read ahead: while the workers score the new formulas of later
        # batches, earlier ones are taken from the cache and written.
        for batch in _slices(reader.batches, config.batch_rows):
            waiting.append((batch, scorer.submit(formula_array(batch, formula_col))))
            while waiting and (len(waiting) > _READ_AHEAD_BATCHES or scorer.ready(waiting[0][1])):
                finish()
        while waiting:
            finish()
        if summary.rows == 0:
            raise InputError(f"input {config.input!r} has a header but no data rows")
        writer.commit()
    except BaseException:
        writer.abort()
        scorer.close(cancel=True)
        raise
    finally:
        progress.close()
    scorer.close()
    summary.distinct_formulas = scorer.distinct_formulas
    summary.seconds = time.perf_counter() - started
    return summary


def _slices(batches, batch_rows: int):
    """The input's first rows in small slices, doubling up to ``batch_rows``:
    the first results are ready (and written) while the workers score the
    rest."""
    size = min(_FIRST_SLICE_ROWS, batch_rows)
    for batch in batches:
        offset = 0
        while offset < batch.num_rows:
            n = min(size, batch.num_rows - offset)
            yield batch.slice(offset, n) if n < batch.num_rows else batch
            offset += n
            size = min(size * 2, batch_rows)


def _worth_a_pool(reader) -> bool:
    """Whether the input is large enough that starting the worker pool
    before the first batch arrives is worth it (it usually is needed then)."""
    if reader.total_rows is not None:
        return reader.total_rows >= 16 * PARALLEL_MIN_NEW
    try:
        return os.path.getsize(reader.source) >= 1 << 18
    except (OSError, TypeError, ValueError):
        return False


def score_table(df, formula_col: str | None = None, *, name_col: str | None = None, prefix: str = "",
                workers: int | None = 1):
    """Score a pandas DataFrame; returns a new DataFrame with the generated
    columns appended (input columns, index and order unchanged).

    Each distinct formula is scored once; ``workers`` > 1 scores many new
    distinct formulas across processes, as :func:`score_file` does.

    >>> import pandas as pd
    >>> out = score_table(pd.DataFrame({"formula": ["NaCl", "Xx2O", "NaCl"]}))
    >>> out["status"].tolist()
    ['ok', 'error', 'ok']
    """
    import numpy as np
    import pandas as pd

    names = [str(c) for c in df.columns]
    formula_col = find_formula_column(names, formula_col)
    if name_col is not None and name_col not in names:
        raise InputError(f"no column {name_col!r} for name_col; columns found: {', '.join(map(repr, names))}")
    out_names = generated_names(names, prefix)
    formulas = df[formula_col]
    codes, uniques = pd.factorize(formulas, use_na_sentinel=True)
    texts = [u if isinstance(u, str) else str(u) for u in uniques]
    if (codes < 0).any():
        texts.append(None)
        codes = np.where(codes < 0, len(texts) - 1, codes)
    with BatchScorer(workers) as scorer:
        arrays = scorer.columns(texts)
    result = df.copy()
    for name, column, array in zip(out_names, output_columns(), arrays):
        if column.dtype == "float64":
            values = array.to_numpy(zero_copy_only=False).astype("float64")
        else:
            values = np.asarray(array.to_pylist(), dtype="object")
        result[name] = values[codes] if len(codes) else values[:0]
    if name_col is not None:
        row_names = df[name_col].astype("object").where(df[name_col].notna(), "").astype(str).to_numpy()
        failed = (result[prefix + "status"].to_numpy() == "error") & (row_names != "")
        messages = result[prefix + "message"].to_numpy(dtype="object").copy()
        messages[failed] = [f"{m or ''} (row named '{n}')" for m, n in zip(messages[failed], row_names[failed])]
        result[prefix + "message"] = messages
    return result
