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

import glob
import os
import time

import pyarrow as pa
import pyarrow.compute as pc
from ionicity.pipelines.batch_assembly import score_batch
from ionicity.pipelines.config import ScoreConfig, Summary
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
    is_ionicity_dataset,
    keep_beside,
    partial_path,
)
from ionicity.pipelines.pool import default_workers, warm_up
from ionicity.pipelines.provenance import provenance_metadata
from ionicity.pipelines.schema import chosen_columns
from ionicity.pipelines.text_dialect import check_encoding
from ionicity.scorer.verdict import STATUSES

__all__ = ["score_file_dask", "score_partition"]

_CSV_BLOCK = "64MB"
_CONNECT_TIMEOUT = "20s"
_PLUGIN = "ionicity-warm-up"


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


def score_partition(frame, formula_col: str, name_col: str | None, input_schema: pa.Schema, schema: pa.Schema,
                    model=None, chosen=None):
    """Score one pandas partition with :func:`ionicity.pipelines.batch_assembly.score_batch`;
    returns a pandas frame of ``schema``'s columns, rows in order."""
    table = pa.Table.from_pandas(frame, schema=input_schema, preserve_index=False)
    batches = table.to_batches() or [pa.RecordBatch.from_pylist([], schema=input_schema)]
    cache = _worker_cache()
    scored = [score_batch(b, formula_col, schema, cache, name_col=name_col, model=model, chosen=chosen)
              for b in batches]
    out = pa.Table.from_batches(scored, schema=schema).to_pandas()
    out.index = frame.index
    return out


def _partition_stats(frame, formula_col: str, status_name: str):
    """Status counts and the 64-bit hashes of the distinct non-empty formulas of
    one scored partition, as a small frame (no shuffle needed to combine them)."""
    # runs in a Dask worker, where pandas is loaded already; importing it with
    # this module would cost every local run 0.23 to 0.38 s (python -X importtime)
    import pandas as pd

    counts = frame[status_name].value_counts()
    formulas = frame[formula_col].dropna().astype(str)
    formulas = pd.Series(formulas[formulas.str.strip() != ""].unique(), dtype=object)
    hashes = pd.util.hash_pandas_object(formulas, index=False).to_numpy()
    rows = [("status", str(k), int(v)) for k, v in counts.items()]
    rows += [("formula", "", int(h)) for h in hashes]
    return pd.DataFrame(rows, columns=["kind", "key", "value"]).astype({"kind": object, "key": object, "value": "uint64"})


def _warm_up_plugin(distributed, full_precision: bool = False):
    class WarmUp(distributed.diagnostics.plugin.WorkerPlugin):
        """Load the scorer's data tables once per worker, before any task, and
        keep the run's cache of scored formulas on that worker until the run
        ends (the plugin is removed then)."""

        name = _PLUGIN

        def setup(self, worker):
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


def _read_frame(dd, reader, config: ScoreConfig):
    if reader.fmt == "parquet":
        # reader.paths are files as found; Dask would glob them again, reading data1.parquet for data[1].parquet
        return dd.read_parquet([glob.escape(p) for p in reader.paths], index=False, dtype_backend="pyarrow")
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
    return dd.read_csv(
        reader.source,
        sep=reader.delimiter,
        dtype=str,
        keep_default_na=False,
        na_filter=False,
        blocksize=_CSV_BLOCK,
        encoding=check_encoding(config.encoding),
        skip_blank_lines=len(reader.schema) > 1,  # as the local reader does
    )


def score_file_dask(config: ScoreConfig) -> Summary:
    """Score ``config.input`` into a Parquet dataset folder ``config.output``
    with dask.dataframe; see the module docstring. Raises :class:`InputError`
    for unusable input or options; nothing is left at the output path then.
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
    metadata = provenance_metadata(config, formula_col)
    status_name = config.prefix + "status"
    input_schema = reader.schema
    tmp = partial_path(directory)
    cluster = client = None
    try:
        frame = _read_frame(dd, reader, config)
        with dask.config.set({"logging.distributed": "error", "distributed.admin.system-monitor.gil.enabled": False}):
            if config.scheduler:
                try:
                    client = distributed.Client(config.scheduler, timeout=_CONNECT_TIMEOUT)
                except (OSError, TimeoutError) as exc:
                    raise InputError(f"cannot reach the Dask scheduler at {config.scheduler!r}: {exc}") from None
            else:
                cluster = distributed.LocalCluster(
                    n_workers=config.workers or default_workers(), threads_per_worker=1, processes=True,
                    dashboard_address=":0",
                )
                client = distributed.Client(cluster)
            client.register_plugin(_warm_up_plugin(distributed, config.full_precision), name=_PLUGIN)
            meta = schema.empty_table().to_pandas()
            scored = frame.map_partitions(
                score_partition, formula_col, config.name_col, input_schema, schema, model,
                chosen_columns(config.columns, config.mp_model is not None), meta=meta,
                enforce_metadata=False,
            )
            write = scored.to_parquet(
                tmp,
                engine="pyarrow",
                schema=schema,
                write_index=False,
                write_metadata_file=False,
                custom_metadata=metadata,
                name_function=lambda i: f"part-{i:06d}.parquet",
                compute=False,
            )
            stats_meta = {"kind": object, "key": object, "value": "uint64"}
            stats = scored.map_partitions(_partition_stats, formula_col, status_name, meta=stats_meta)
            _, stats = dask.compute(write, stats)
        summary = Summary(output=config.output)
        for kind, key, value in stats.itertuples(index=False):
            if kind == "status" and key in STATUSES:
                setattr(summary, key, getattr(summary, key) + int(value))
        summary.rows = summary.ok + summary.warning + summary.error
        if summary.rows == 0:
            raise InputError(f"input {config.input!r} has a header but no data rows")
        summary.distinct_formulas = int(stats.loc[stats["kind"] == "formula", "value"].nunique())
        with open(os.path.join(tmp, DATASET_MARKER), "w", encoding="utf-8") as marker:
            marker.write("a dataset folder written by ionicity score --engine dask;"
                         " --overwrite replaces only folders holding this file\n")
        _swap_into_place(tmp, config.output, config.overwrite)
        tmp = None
    except Exception as exc:
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
    summary.seconds = time.perf_counter() - started
    return summary


def _swap_into_place(tmp: str, output: str, overwrite: bool) -> None:
    """Rename the finished dataset folder ``tmp`` to ``output``: over an old
    dataset of ours only with ``overwrite`` (old aside, new in, old deleted,
    so one of them is at ``output`` at every instant). Whatever else is found
    at ``output`` by now stays, and the result is kept beside it
    (:class:`InputError` saying where). Nothing is left at ``tmp``."""
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
