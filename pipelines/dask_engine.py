"""The Dask engine: the local engine's :func:`pipelines.batch.score_batch` run
on every partition of a ``dask.dataframe``, on a local cluster (default) or on
a running scheduler (``--scheduler ADDRESS``).

Input: a Parquet file, folder or glob of parts, or CSV / TSV files (split in
blocks by Dask, so a cell holding a line break inside quotes cannot be read
this way: such a table is refused; convert it to Parquet or use the local
engine). Output: a folder of Parquet parts ``part-000000.parquet`` ... in
input order, written into a temporary folder beside the output and renamed
into place when complete, carrying the same provenance metadata as the local
engine. Each worker loads the scorer's data tables once, when it joins
(a worker plugin), and keeps its own cache of scored formulas for every
partition it handles.

Dask and distributed are imported only here, so the local engine never pays
for them; install them with ``pip install ionicity[dask]``.
"""
from __future__ import annotations

import os
import time

import pyarrow as pa

from ionicity.pipelines.batch import ScoreConfig, Summary, load_model_applier, prepare, provenance_metadata, score_batch
from ionicity.pipelines.io import InputError, _remove, check_output_path, clean_stale_partials, partial_path

__all__ = ["score_file_dask", "score_partition"]

_CSV_BLOCK = "64MB"
_CONNECT_TIMEOUT = "20s"


def score_partition(frame, formula_col: str, name_col: str | None, input_schema: pa.Schema, schema: pa.Schema,
                    model=None):
    """Score one pandas partition with :func:`pipelines.batch.score_batch`;
    returns a pandas frame of ``schema``'s columns, rows in order."""
    table = pa.Table.from_pandas(frame, schema=input_schema, preserve_index=False)
    batches = table.to_batches() or [pa.RecordBatch.from_pylist([], schema=input_schema)]
    scored = [score_batch(b, formula_col, schema, name_col=name_col, model=model) for b in batches]
    out = pa.Table.from_batches(scored, schema=schema).to_pandas()
    out.index = frame.index
    return out


def _partition_stats(frame, formula_col: str, status_name: str):
    """Status counts and the 64-bit hashes of the distinct non-empty formulas of
    one scored partition, as a small frame (no shuffle needed to combine them)."""
    import pandas as pd

    counts = frame[status_name].value_counts()
    formulas = frame[formula_col].dropna().astype(str)
    formulas = pd.Series(formulas[formulas.str.strip() != ""].unique(), dtype=object)
    hashes = pd.util.hash_pandas_object(formulas, index=False).to_numpy()
    rows = [("status", str(k), int(v)) for k, v in counts.items()]
    rows += [("formula", "", int(h)) for h in hashes]
    return pd.DataFrame(rows, columns=["kind", "key", "value"]).astype({"kind": object, "key": object, "value": "uint64"})


def _warm_up_plugin():
    from distributed.diagnostics.plugin import WorkerPlugin

    class WarmUp(WorkerPlugin):
        """Load the scorer's data tables once per worker, before any task."""

        name = "ionicity-warm-up"

        def setup(self, worker):
            from ionicity.pipelines._pool import warm_up

            warm_up()

    return WarmUp()


def _import_dask():
    try:
        import dask
        import dask.dataframe as dd
        import distributed
    except ImportError:
        raise InputError("--engine dask needs dask and distributed: pip install 'ionicity[dask]'") from None
    return dask, dd, distributed


def _read_frame(dd, reader, config: ScoreConfig):
    if reader.fmt == "parquet":
        return dd.read_parquet(list(reader.paths), index=False, dtype_backend="pyarrow")
    # Dask splits CSV at line ends, which would cut a quoted multi-line cell in two
    first = next(reader.batches, None)
    if first is not None:
        for column in first.columns:
            if pa.types.is_string(column.type):
                import pyarrow.compute as pc

                if pc.any(pc.match_substring_regex(column, "[\r\n]")).as_py():
                    raise InputError(
                        "this CSV has line breaks inside cells, which --engine dask cannot split;"
                        " convert it to Parquet or use --engine local"
                    )
    return dd.read_csv(
        reader.source,
        sep="\t" if reader.fmt == "tsv" else ",",
        dtype=str,
        keep_default_na=False,
        na_filter=False,
        blocksize=_CSV_BLOCK,
        encoding="utf-8",
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
    directory = check_output_path(config.output, config.overwrite, inputs, dataset=True)
    clean_stale_partials(directory)
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
                from ionicity.pipelines._workers import default_workers

                cluster = distributed.LocalCluster(
                    n_workers=config.workers or default_workers(), threads_per_worker=1, processes=True,
                    dashboard_address=":0",
                )
                client = distributed.Client(cluster)
            client.register_plugin(_warm_up_plugin(), name="ionicity-warm-up")
            meta = schema.empty_table().to_pandas()
            scored = frame.map_partitions(
                score_partition, formula_col, config.name_col, input_schema, schema, model, meta=meta,
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
            if kind == "status" and key in ("ok", "warning", "error"):
                setattr(summary, key, getattr(summary, key) + int(value))
        summary.rows = summary.ok + summary.warning + summary.error
        if summary.rows == 0:
            raise InputError(f"input {config.input!r} has a header but no data rows")
        summary.distinct_formulas = int(stats.loc[stats["kind"] == "formula", "value"].nunique())
        if os.path.exists(config.output):
            old = partial_path(directory)
            os.replace(config.output, old)
            os.replace(tmp, config.output)
            _remove(old)
        else:
            os.replace(tmp, config.output)
        tmp = None
    except Exception as exc:
        mapped = _user_error(exc)
        if mapped is not None:
            raise mapped from None
        raise
    finally:
        _remove(tmp)
        if client is not None:
            client.close()
        if cluster is not None:
            cluster.close()
    summary.seconds = time.perf_counter() - started
    return summary


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
