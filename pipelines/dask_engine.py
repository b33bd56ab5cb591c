"""The Dask engine: the local engine's :func:`ionicity.pipelines.batch_assembly.score_batch` run
on every partition of a ``dask.dataframe``, on a local cluster (default) or on
a running scheduler (``--scheduler ADDRESS``).

Input: a Parquet file, folder or glob of parts, or CSV / TSV files (split in
blocks by Dask, so a cell holding a line break inside quotes cannot be read
this way: such a table is refused; convert it to Parquet or use the local
engine). Output: a folder of Parquet parts ``part-000000.parquet`` ... in
input order, written into a temporary folder beside the output and renamed
into place when complete, carrying the same provenance metadata as the local
engine, and a marker file (``_ionicity_dataset``,
:data:`~ionicity.pipelines.output_paths.DATASET_MARKER`): ``--overwrite`` replaces
only a folder that carries it. The old folder is first renamed aside, then
the new one into place, then the old one deleted, so one of them is at the
path at every instant; a run killed in between leaves the old one aside, and
the next run puts it back. Each worker loads the scorer's data tables once,
when it joins (a worker plugin), and keeps a cache of scored formulas for the partitions
of the run it handles; the plugin, and with it the cache, is removed when
the run ends.

Dask and distributed are imported only when this engine runs (0.9 to 1.8 s,
``python -X importtime``, on the shared machine), so the local engine never
pays for them; install them with ``pip install "ionicity[dask]"`` (from a clone: ``pip install -e ".[dask]"``).
"""
from __future__ import annotations

import errno
import logging
import os
import time

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc
import pyarrow.parquet as pq

from ionicity._entry import stop_if_interrupted
from ionicity.pipelines.config import ScoreConfig, Summary
from ionicity.pipelines.arrow_columns import int_array
from ionicity.pipelines.dask_partitions import (
    BAD_TEXT_FIRST_ROW,
    BAD_TEXT_ROWS,
    DEFAULT_PARTITION_ROWS,
    Piece,
    csv_block_bytes,
    distinct_chunks,
    parquet_pieces,
    part_name,
    piece_distinct,
    score_distinct,
    score_piece,
    share_distinct,
)
from ionicity.pipelines.duplicates import FirstRows, KnownFirstRows, compound_first_rows, first_positions
from ionicity.pipelines.errors import InputError, install_hint
from ionicity.pipelines.formula_cache import FormulaCache
from ionicity.pipelines.local_engine import prepare
from ionicity.pipelines.model_step import load_model_applier
from ionicity.pipelines.output_paths import (
    DATASET_MARKER,
    _remove,
    backup_path,
    check_output_path,
    clean_stale_partials,
    exchange_paths,
    is_ionicity_dataset,
    keep_beside,
    partial_path,
    write_failure,
)
from ionicity.pipelines.pool import default_workers, warm_up
from ionicity.pipelines.provenance import provenance_metadata
from ionicity.pipelines.scheduler import BatchScorer
from ionicity.pipelines.schema import chosen_columns
from ionicity.scorer.audit import FIRST_ROW_COLUMN
from ionicity.scorer.columns import column_names
from ionicity.pipelines.text_cells import BadRows, text_table
from ionicity.pipelines.text_dialect import check_encoding

__all__ = ["score_file_dask"]

# a scheduler on this machine answers at once; one across a network may be slow
_CONNECT_TIMEOUT = "20s"
_LOOPBACK_CONNECT_TIMEOUT = "5s"
_LOOPBACK_HOSTS = ("127.", "localhost", "[::1]")


def _connect_timeout(address: str) -> str:
    host = address.split("://", 1)[-1]
    return _LOOPBACK_CONNECT_TIMEOUT if host.startswith(_LOOPBACK_HOSTS) else _CONNECT_TIMEOUT
_PLUGIN = "ionicity-warm-up"
# a worker's failed write of its part: no space, over a quota, over the file-size limit
_WRITE_ERRNOS = (errno.ENOSPC, errno.EDQUOT, errno.EFBIG)
# benchmark knob: "always" or "never" overrides the choice of the shared
# first pass (pipelines/bench_dask.py measures both ways)
SHARE_ENV = "IONICITY_DASK_SHARED"


def _worker_cache() -> FormulaCache:
    """The cache of this run on this Dask worker (kept by the worker plugin);
    outside a worker of a run, a cache for this partition alone."""
    try:
        # loaded already inside a Dask task; at module level it would cost
        # every local run 0.9 to 1.8 s (python -X importtime)
        from distributed import get_worker

        plugin = get_worker().plugins.get(_PLUGIN)
    except (ImportError, ValueError):
        plugin = None
    cache = getattr(plugin, "cache", None)
    return cache if cache is not None else FormulaCache()


def _warm_up_plugin(distributed, full_precision: bool = False, own_cluster: bool = False):
    class WarmUp(distributed.diagnostics.plugin.WorkerPlugin):
        """Load the scorer's data tables once per worker, before any task, and
        keep the run's cache of scored formulas on that worker until the run
        ends (the plugin is removed then). On the run's own local cluster the
        workers log nothing below critical: a task's failure reaches the user
        once, as the command's one-line error (its traceback with --verbose),
        not also as the worker's "Compute Failed" log with a traceback. A
        running scheduler's workers are someone else's: their logs stay."""

        name = _PLUGIN

        def setup(self, worker):
            if own_cluster:
                # the worker process imported distributed, and set up its logging, before this run's config reached it
                logging.getLogger("distributed").setLevel(logging.CRITICAL)
            warm_up()
            self.cache = FormulaCache()
            if not full_precision:
                self.cache.set_output_digits()
                self.cache.set_short_notes()

        def teardown(self, worker):
            self.cache = None

    return WarmUp()


def _import_dask():
    # 0.9 to 1.8 s (python -X importtime): only when this engine runs
    try:
        import dask
        import dask.dataframe as dd
        import distributed
        import distributed.diagnostics.plugin  # noqa: F401 - for WorkerPlugin
    except ImportError:
        raise InputError("--engine dask needs dask and distributed: " + install_hint("dask", "dask distributed")) from None
    return dask, dd, distributed


def _csv_blocks(dask, dd, reader, config: ScoreConfig, partition_rows: int) -> list:
    """A CSV or TSV input as delayed pandas frames, blocks of about ``partition_rows`` rows."""
    if reader.fmt == "xlsx":
        raise InputError("--engine dask reads CSV, TSV or Parquet; score an .xlsx file with --engine local")
    # Dask splits CSV at line ends, which would cut a quoted multi-line cell in two
    first = next(reader.batches, None)
    if first is not None:
        for column in first.columns:
            if pa.types.is_string(column.type):
                if pc.any(pc.match_substring_regex(column, "[\r\n]")).as_py():
                    raise InputError(
                        "this CSV has line breaks inside cells, which --engine dask cannot split;"
                        " convert it to Parquet or use --engine local"
                    )
    # Dask would convert the object columns to pandas' Arrow-backed text, which cannot hold a surrogate
    with dask.config.set({"dataframe.convert-string": False}):
        return _read_csv_frame(dd, reader, config, partition_rows).to_delayed()


def _read_csv_frame(dd, reader, config: ScoreConfig, partition_rows: int):
    return dd.read_csv(
        reader.source,
        sep=reader.delimiter,
        # object, not str: pandas' Arrow-backed text cannot hold the surrogates that keep a bad byte
        # (surrogateescape), which the partition turns into its row's error (text_cells.text_table)
        dtype=object,
        encoding_errors="surrogateescape",
        keep_default_na=False,
        na_filter=False,
        blocksize=csv_block_bytes(reader.source, partition_rows),
        encoding=check_encoding(config.encoding),
        skip_blank_lines=len(reader.schema) > 1,  # as the local reader does
    )


def score_file_dask(config: ScoreConfig) -> Summary:
    """Score ``config.input`` into a Parquet dataset folder ``config.output``
    on a Dask cluster, one task per partition; see the module docstring.
    Raises :class:`InputError` for unusable input or options; nothing is
    left at the output path then.
    """
    started = time.perf_counter()
    if config.output == "-" or config.output.lower().endswith((".csv", ".tsv", ".tab", ".txt")):
        raise InputError("--engine dask writes a folder of Parquet parts; give -o a folder name (e.g. out.parquet)")
    if config.input == "-":
        raise InputError("--engine dask cannot read standard input; give a file, or use --engine local")
    model = load_model_applier(config)
    reader, formula_col, schema = prepare(config)
    dask, dd, distributed = _import_dask()
    inputs = reader.paths or (config.input,)
    # first settle what killed runs left: a dataset they moved aside goes back to its path
    clean_stale_partials(os.path.dirname(os.path.abspath(config.output)))
    check_output_path(config.output, config.overwrite, inputs, dataset=True)
    directory = os.path.dirname(os.path.abspath(config.output))
    partition_rows = config.partition_rows or DEFAULT_PARTITION_ROWS
    tmp = partial_path(directory)
    cluster = client = None
    try:
        if reader.fmt == "parquet":
            sources = parquet_pieces(list(reader.paths), partition_rows)
        else:
            sources = _csv_blocks(dask, dd, reader, config, partition_rows)
        try:
            os.mkdir(tmp)
        except OSError as exc:  # the output named, not the temporary folder beside it
            tmp = None
            raise write_failure(exc, config.output) from None
        with dask.config.set({"logging.distributed": "error", "distributed.admin.system-monitor.gil.enabled": False}):
            if config.scheduler:
                try:
                    client = distributed.Client(config.scheduler, timeout=_connect_timeout(config.scheduler))
                except (OSError, TimeoutError) as exc:
                    raise InputError(f"cannot reach the Dask scheduler at {config.scheduler!r}: {exc}") from None
            else:
                cluster = distributed.LocalCluster(
                    n_workers=config.workers or default_workers(), threads_per_worker=1, processes=True,
                    dashboard_address=":0",
                )
                client = distributed.Client(cluster)
            client.register_plugin(_warm_up_plugin(distributed, config.full_precision, own_cluster=cluster is not None),
                                   name=_PLUGIN)
            run = _Run(client, reader.schema, formula_col, config, schema, model, tmp,
                       provenance_metadata(config, formula_col))
            summary = run.score(sources)
        if summary.rows == 0:
            raise InputError(f"input {config.input!r} has a header but no data rows")
        if not sources:  # an empty Parquet file: one empty part, as the local engine writes one empty table
            pq.write_table(schema.empty_table().replace_schema_metadata(run.metadata), os.path.join(tmp, part_name(0)))
        with open(os.path.join(tmp, DATASET_MARKER), "w", encoding="utf-8") as marker:
            marker.write("a dataset folder written by ionicity score --engine dask;"
                         " --overwrite replaces only folders holding this file\n")
        _swap_into_place(tmp, config.output, config.overwrite)
        tmp = None
    except Exception as exc:
        if isinstance(exc, OSError) and (exc.errno in _WRITE_ERRNOS or "writing" in str(exc)):
            # a part a worker could not write (a full disk, ulimit -f): the output named, as the local engine does
            raise write_failure(exc, config.output) from None
        mapped = _user_error(exc)
        if mapped is not None:
            raise mapped from None
        raise
    finally:
        _remove(tmp)
        if client is not None:
            if cluster is None:
                _drop_plugin(client)
            client.close()
        if cluster is not None:
            cluster.close()
    summary.output = config.output
    summary.seconds = time.perf_counter() - started
    return summary


class _Run:
    """The tasks of one run on a connected client."""

    def __init__(self, client, table_schema, formula_col, config, schema, model, folder, metadata):
        self.client = client
        self.table_schema = table_schema
        self.formula_col = formula_col
        self.config = config
        self.schema = schema
        self.model = model
        self.folder = folder
        self.metadata = metadata
        self.chosen = chosen_columns(config.columns, config.mp_model is not None)
        # first_row_same_compound needs the whole table's first rows (duplicates.KnownFirstRows)
        self.wants_first_rows = self.chosen is None or FIRST_ROW_COLUMN in self.chosen

    def _workers(self) -> int:
        return max(len(self.client.scheduler_info().get("workers", {})), 1)

    def score(self, sources: list) -> Summary:
        client = self.client
        parquet = bool(sources) and isinstance(sources[0], Piece)
        shared = compounds = shared_first_rows = None
        distinct = None
        placement: dict[int, str] = {}
        offsets = np.zeros(len(sources), dtype=np.int64)
        several = len(sources) > 1 and self.wants_first_rows
        if parquet:
            offsets = np.cumsum([0] + [p.rows for p in sources[:-1]], dtype=np.int64)
            found = client.gather(client.map(piece_distinct, sources, formula_col=self.formula_col, pure=False))
            everything, first_rows = _table_first_rows([t for t, _ in found],
                                                       [offsets[k] + at for k, (_, at) in enumerate(found)])
            distinct = len(everything) - int(pc.sum(pc.equal(pc.utf8_trim_whitespace(everything), "")).as_py() or 0)
            workers = self._workers()
            mode = os.environ.get(SHARE_ENV, "auto")
            if mode == "always" or (mode == "auto" and share_distinct([len(t) for t, _ in found], len(everything), workers)):
                del found  # the client keeps the table's distinct texts once, not once per piece
                orders = distinct_chunks(everything, workers)
                shared = client.map(score_distinct, [everything.take(int_array(o)) for o in orders],
                                    full_precision=self.config.full_precision, pure=False)
                if several:
                    # each worker maps the adopted texts to compounds itself: no round trip through the client
                    shared_first_rows = client.scatter([np.concatenate([first_rows[o] for o in orders] or [first_rows])],
                                                       broadcast=True)[0]
            elif several:
                del found
                compounds, placement, _ = self._first_pass_scored(sources, offsets)
        elif len(sources) > 1:
            # CSV blocks: the first pass also counts each block's rows, so that a row's message can name its number
            compounds, placement, rows = self._first_pass_scored(sources, None)
            offsets = np.cumsum([0] + rows[:-1], dtype=np.int64)
            compounds = compounds if several else None
        common = dict(
            table_schema=self.table_schema, formula_col=self.formula_col, name_col=self.config.name_col,
            schema=self.schema, model=self.model, folder=self.folder, metadata=self.metadata,
            count_distinct=distinct is None, status_name=self.config.prefix + "status", shared=shared,
            shared_first_rows=shared_first_rows, chosen=self.chosen,
            compounds=client.scatter([compounds], broadcast=True)[0] if compounds is not None else None,
            alone=len(sources) == 1, encoding=check_encoding(self.config.encoding),
        )
        if parquet:
            futures = []
            for worker, numbers in _by_worker(placement, len(sources)).items():
                # a partition goes where its formulas were scored; elsewhere if that worker is busy or gone
                where = dict(workers=[worker], allow_other_workers=True) if worker is not None else {}
                futures += client.map(_score_on_worker, numbers, [sources[k] for k in numbers],
                                      [int(offsets[k]) for k in numbers], pure=False, **where, **common)
        else:
            futures = client.compute([dask_delayed(_score_on_worker)(i, frame, int(offsets[i]), **common)
                                      for i, frame in enumerate(sources)])
        results = client.gather(futures)
        summary = Summary(partitions=len(sources))
        hashes = []
        bad = BadRows(check_encoding(self.config.encoding))
        for counts, partition_hashes in results:
            bad.count += counts.pop(BAD_TEXT_ROWS, 0)
            first = counts.pop(BAD_TEXT_FIRST_ROW, 0)
            bad.first_row = min(bad.first_row or first, first or bad.first_row)
            for status, n in counts.items():
                setattr(summary, status, getattr(summary, status) + n)
            if partition_hashes is not None:
                hashes.append(partition_hashes)
        summary.rows = summary.ok + summary.warning + summary.error
        if bad.note(self.config.input):
            summary.notes.append(bad.note(self.config.input))
        summary.distinct_formulas = distinct if distinct is not None else len(np.unique(np.concatenate(hashes))) if hashes else 0
        return summary

    def _first_pass_scored(self, sources: list, offsets) -> tuple:
        """Without the shared pass: each partition's distinct formulas scored
        into its worker's cache, returning their compounds and first rows;
        the partition is later written on the same worker (its formulas are
        then cached there). Returns (compounds, placement, rows per partition)."""
        client = self.client
        kwargs = dict(table_schema=self.table_schema, formula_col=self.formula_col)
        if offsets is not None:
            futures = client.map(_partition_compounds, sources, pure=False, **kwargs)
        else:
            futures = client.compute([dask_delayed(_partition_compounds)(frame, **kwargs) for frame in sources])
        found = client.gather(futures)
        holders = client.who_has(futures)
        placement = {k: holders[f.key][0] for k, f in enumerate(futures) if holders.get(f.key)}
        rows = [n for _, _, n in found]
        if offsets is None:
            offsets = np.cumsum([0] + rows[:-1], dtype=np.int64)
        normalized = _concat_text([n for n, _, _ in found])
        first_rows = np.concatenate([offsets[k] + at + 1 for k, (_, at, _) in enumerate(found)])
        return compound_first_rows(normalized, first_rows), placement, rows


def _table_first_rows(texts: list[pa.Array], positions: list[np.ndarray]) -> tuple[pa.Array, np.ndarray]:
    """The table's distinct formula texts and the 1-based row of each one's
    first appearance, from each piece's (distinct texts, 0-based global rows),
    pieces in input order."""
    if not texts:
        return pa.array([], pa.string()), np.zeros(0, dtype=np.int64)
    every, at = first_positions(pa.concat_arrays(texts))
    return every, np.concatenate(positions)[at] + 1


def _concat_text(arrays: list[pa.Array]) -> pa.Array:
    arrays = [a.dictionary_decode() if pa.types.is_dictionary(a.type) else a for a in arrays]
    return pa.concat_arrays(arrays) if arrays else pa.array([], pa.string())


def _by_worker(placement: dict[int, str], n: int) -> dict:
    groups: dict = {}
    for k in range(n):
        groups.setdefault(placement.get(k), []).append(k)
    return groups


def dask_delayed(function):
    # loaded already when a run gets here (the engine imported dask)
    import dask

    return dask.delayed(function, pure=False)


def _partition_compounds(source, *, table_schema, formula_col) -> tuple[pa.Array, np.ndarray, int]:
    """A partition's distinct formulas scored into this worker's cache: their
    ``formula_normalized``, the 0-based position of each one's first row, and
    the partition's row count."""
    if isinstance(source, Piece):
        texts, at = piece_distinct(source, formula_col)
        rows = source.rows
    else:
        table, _ = text_table(source[[formula_col]], pa.schema([(formula_col, pa.string())]))
        texts, at = first_positions(table.column(0).combine_chunks())
        rows = table.num_rows
    scorer = BatchScorer(1, cache=_worker_cache())
    cache_rows = scorer.rows_of(scorer.submit(texts))
    normalized = scorer.cache.arrays()[column_names().index("formula_normalized")].take(cache_rows)
    return normalized.dictionary_decode(), at, rows


def _score_on_worker(number, source, row_offset=0, *, table_schema, formula_col, name_col, schema, model, folder,
                     metadata, count_distinct, status_name, shared, shared_first_rows=None, chosen=None, compounds=None,
                     alone=True, encoding="utf-8"):
    cache = _worker_cache()
    if shared is not None and not getattr(cache, "adopted_shared", False):
        before = len(cache.keys())
        cache.adopt(shared)
        cache.adopted_shared = True
        if shared_first_rows is not None:
            # the shared texts' compounds, in adoption order, with their first rows
            normalized = cache.arrays()[column_names().index("formula_normalized")].slice(before)
            cache.shared_compounds = compound_first_rows(normalized, shared_first_rows)
    if compounds is None:
        compounds = getattr(cache, "shared_compounds", None)
    if compounds is not None:
        first_rows = KnownFirstRows(*compounds, rows_before=row_offset)
    else:  # one partition: streamed in order, as the local engine does
        first_rows = FirstRows() if alone else None
    return score_piece(number, source, table_schema, formula_col, name_col, schema, model, folder, metadata, cache,
                       count_distinct, status_name, chosen, first_rows, row_offset, encoding)


def _swap_into_place(tmp: str, output: str, overwrite: bool) -> None:
    """Rename the finished dataset folder ``tmp`` to ``output``: over an old
    dataset of ours only with ``overwrite``, exchanged in one step where the
    system can (:func:`~ionicity.pipelines.output_paths.exchange_paths`), so
    the old or the new one is at ``output`` at every instant; elsewhere old
    aside, new in, old deleted (a killed run's old one is put back by the next). Whatever else is found
    at ``output`` by now stays, and the result is kept beside it
    (:class:`InputError` saying where). Nothing is left at ``tmp``."""
    stop_if_interrupted()  # a Ctrl-C that a library swallowed: the run did not finish as asked
    if not os.path.lexists(output):
        try:
            # fails if a file or a non-empty folder appeared since the check
            os.rename(tmp, output)
            return
        except OSError:
            raise keep_beside(tmp, output, "appeared while this run was writing it and was left as it is") from None
    if not overwrite:
        raise keep_beside(tmp, output, "appeared while this run was writing it and was left as it is"
                                       " (pass --overwrite to replace it)")
    if not is_ionicity_dataset(output):
        raise keep_beside(tmp, output, f"was replaced during the run by something without {DATASET_MARKER},"
                                       " which was left as it is")
    if exchange_paths(tmp, output):
        # one step: the new dataset at output, the old one at tmp (a partial name the next run cleans if this one dies)
        if not is_ionicity_dataset(tmp):  # something else took the path since the check: put it back
            exchange_paths(tmp, output)
            raise keep_beside(tmp, output, f"was replaced during the run by something without {DATASET_MARKER},"
                                           " which was left as it is")
        _remove(tmp)
        return
    backup = backup_path(output)
    os.rename(output, backup)
    try:
        os.rename(tmp, output)
    except OSError:
        os.rename(backup, output)
        raise keep_beside(tmp, output, "appeared while this run was replacing it and was left as it is") from None
    _remove(backup)


def _drop_plugin(client) -> None:
    # a running scheduler's workers outlive the run: the plugin's teardown
    # drops the run's cache there
    try:
        client.unregister_worker_plugin(_PLUGIN)
    except Exception:  # noqa: BLE001 - a scheduler gone or older: the cache goes with its workers
        pass


def _user_error(exc: BaseException) -> InputError | None:
    """Errors raised inside Dask tasks by unreadable input, as one-line InputErrors."""
    if isinstance(exc, InputError):
        return exc
    kind = type(exc).__name__
    text = str(exc).strip().splitlines()[0] if str(exc).strip() else kind
    if isinstance(exc, UnicodeDecodeError):
        return InputError("input is not valid UTF-8 text; re-save it as UTF-8")
    if kind in ("ParserError", "ArrowInvalid", "EmptyDataError"):
        return InputError(f"cannot read the input: {text}")
    return None
