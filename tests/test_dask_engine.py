"""ionicity.pipelines.dask_engine: the same per-batch function on a two-worker Dask
cluster must give exactly the local engine's table (the reference here is
the local engine's own output, checked against scorer.record in
test_batch.py). No scientific reference values: a property of our own code.
"""
from __future__ import annotations

import json
import os

import pyarrow as pa
import pyarrow.csv as pacsv
import pyarrow.parquet as pq
import pytest

if os.environ.get("CI"):
    # CI installs the dask extra: a missing Dask there is a failure, not a skip
    import dask.dataframe  # noqa: F401
    import distributed
else:
    pytest.importorskip("dask.dataframe")
    distributed = pytest.importorskip("distributed")

from ionicity.pipelines.config import ScoreConfig  # noqa: E402
from ionicity.pipelines.cli import main  # noqa: E402
from ionicity.pipelines.errors import InputError  # noqa: E402
from ionicity.pipelines.run import score_file  # noqa: E402
from ionicity.scorer.audit import FIRST_ROW_COLUMN  # noqa: E402

FORMULAS = ["NaCl", "KCl", "CuSO4·5H2O", "[C4mim][BF4]", "Fe2(SO4)3", "Xx2O", "", "Na₂SO₄", "ÅÅ", "MgO", None]


def _table(rows: int, offset: int = 0) -> pa.Table:
    return pa.table({
        "id": pa.array(range(offset, offset + rows), pa.int64()),
        "formula": [FORMULAS[(i * 7) % len(FORMULAS)] for i in range(offset, offset + rows)],
        "lot": [["α-1", "", None, "b,c", "ロット"][i % 5] for i in range(offset, offset + rows)],
        "mass_g": [[1.5, None, 2.25][i % 3] for i in range(offset, offset + rows)],
    })


@pytest.fixture(scope="module")
def cluster():
    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=True,
                                  dashboard_address=":0") as c:
        yield c


@pytest.fixture
def parts(tmp_path):
    folder = tmp_path / "parts"
    folder.mkdir()
    offset = 0
    for i, rows in enumerate((700, 1300, 500)):
        pq.write_table(_table(rows, offset), folder / f"part-{i}.parquet")
        offset += rows
    return folder


def _decoded(table: pa.Table) -> pa.Table:
    # every column, first_row_same_compound included: the Dask engine gives it
    # from the whole table's first rows (duplicates.KnownFirstRows)
    return pa.table({name: column.cast(pa.string()) if pa.types.is_dictionary(column.type) else column
                     for name, column in zip(table.column_names, table.columns)})


def _local(input_path, out_path, **options):
    score_file(ScoreConfig(input=str(input_path), output=str(out_path), quiet=True, workers=1, **options))
    return pq.read_table(out_path)


def test_parquet_parts_on_two_workers_match_the_local_engine(parts, tmp_path, cluster):
    assert len(cluster.scheduler_info["workers"]) == 2
    local = _local(parts, tmp_path / "local.parquet")
    out = tmp_path / "dask.parquet"
    summary = score_file(ScoreConfig(input=str(parts), output=str(out), engine="dask",
                                     scheduler=cluster.scheduler_address, quiet=True))
    assert out.is_dir() and sorted(os.listdir(out))[:2] == ["_ionicity_dataset", "part-000000.parquet"]
    result = pq.read_table(out)
    assert result.schema.equals(local.schema, check_metadata=False)
    # text columns are dictionary-encoded; each engine builds its own
    # dictionaries, so the values are compared, not the encodings
    assert _decoded(result).equals(_decoded(local))
    assert 0 < local.column(FIRST_ROW_COLUMN).null_count < local.num_rows
    assert summary.rows == 2500 and summary.rows == summary.ok + summary.warning + summary.error
    local_summary = score_file(str(parts), str(tmp_path / "again.csv"), quiet=True)
    assert (summary.ok, summary.warning, summary.error, summary.distinct_formulas) == (
        local_summary.ok, local_summary.warning, local_summary.error, local_summary.distinct_formulas)
    meta = pq.read_schema(out / "part-000000.parquet").metadata
    assert json.loads(meta[b"ionicity.options"])["engine"] == "dask"
    assert b"ionicity.data_versions" in meta and b"ionicity.version" in meta


def test_csv_on_the_default_local_cluster_matches_the_local_engine(tmp_path):
    # the default path: --engine dask with no scheduler starts its own two-worker cluster
    src = tmp_path / "in.csv"
    table = _table(3000)
    table = table.set_column(2, "lot", pa.array([x or "" for x in table.column("lot").to_pylist()]))
    pacsv.write_csv(table.select(["id", "formula", "lot"]), src)
    # the Dask engine reads CSV columns as text; the local engine types them unless --keep-text
    local = _local(src, tmp_path / "local.parquet", keep_text=True)
    out = tmp_path / "dask_out"
    assert main(["score", str(src), "-o", str(out), "--engine", "dask", "--workers", "2", "--quiet"]) == 0
    assert _decoded(pq.read_table(out)).equals(_decoded(local))


def test_overwrite_replaces_a_previous_dataset(parts, tmp_path, cluster):
    out = tmp_path / "dask.parquet"
    config = ScoreConfig(input=str(parts), output=str(out), engine="dask", scheduler=cluster.scheduler_address,
                         quiet=True)
    score_file(config)
    with pytest.raises(InputError, match="--overwrite"):
        score_file(config)
    config.overwrite = True
    score_file(config)
    assert pq.read_table(out).num_rows == 2500
    assert [n for n in os.listdir(tmp_path) if n.startswith(".ionicity-")] == []


def test_attack_an_existing_path_with_glob_characters_is_read_as_written(tmp_path, cluster):
    # attack 3 on the dask engine: Dask globbed the input paths again, so
    # 'data[1].parquet' was read as data1.parquet
    pq.write_table(pa.table({"formula": ["NaCl"]}), tmp_path / "data[1].parquet")
    pq.write_table(pa.table({"formula": ["KCl", "MgO"]}), tmp_path / "data1.parquet")
    out = tmp_path / "out.parquet"
    score_file(ScoreConfig(input=str(tmp_path / "data[1].parquet"), output=str(out), engine="dask",
                           scheduler=cluster.scheduler_address, quiet=True))
    assert pq.read_table(out).column("formula").to_pylist() == ["NaCl"]


@pytest.mark.parametrize(
    "content, output, match",
    [
        ("formula\nNaCl\n", "out.csv", "folder of Parquet parts"),
        ('formula,note\nNaCl,"two\nlines"\n', "out.parquet", "line breaks"),
        ("formula\n", "out.parquet", "no data rows"),
    ],
)
def test_refusals(tmp_path, cluster, content, output, match):
    src = tmp_path / "in.csv"
    src.write_text(content)
    with pytest.raises(InputError, match=match):
        score_file(ScoreConfig(input=str(src), output=str(tmp_path / output), engine="dask",
                               scheduler=cluster.scheduler_address, quiet=True))
    assert sorted(os.listdir(tmp_path)) == ["in.csv"]


def test_stdin_is_refused(capsys):
    assert main(["score", "-", "-o", "x.parquet", "--engine", "dask"]) == 2
    assert "standard input" in capsys.readouterr().err


def test_unreachable_scheduler_is_a_usage_error(parts, tmp_path, capsys, monkeypatch):
    monkeypatch.setattr("ionicity.pipelines.dask_engine._CONNECT_TIMEOUT", "2s")
    code = main(["score", str(parts), "-o", str(tmp_path / "o.parquet"), "--engine", "dask",
                 "--scheduler", "tcp://127.0.0.1:9", "--quiet"])
    assert code == 2 and "scheduler" in capsys.readouterr().err
    assert sorted(os.listdir(tmp_path)) == ["parts"]


def test_a_run_on_a_running_scheduler_leaves_no_cache_on_its_workers(parts, tmp_path, cluster):
    # the workers outlive the run: the plugin that holds the run's cache of
    # scored formulas on each of them must go when the run ends
    score_file(ScoreConfig(input=str(parts), output=str(tmp_path / "o.parquet"), engine="dask",
                           scheduler=cluster.scheduler_address, quiet=True))
    with distributed.Client(cluster) as client:
        plugins = client.run(lambda dask_worker: sorted(dask_worker.plugins))
    assert len(plugins) == 2
    assert all("ionicity-warm-up" not in names for names in plugins.values())


def test_a_partition_outside_a_worker_gets_a_cache_of_its_own(tmp_path):
    import pandas as pd

    from ionicity.pipelines.dask_engine import _score_on_worker
    from ionicity.pipelines.schema import output_schema

    input_schema = pa.schema([pa.field("formula", pa.string())])
    frame = pd.DataFrame({"formula": ["NaCl", None, "NaCl"]})
    counts, hashes = _score_on_worker(
        3, frame, table_schema=input_schema, formula_col="formula", name_col=None,
        schema=output_schema(input_schema), model=None, folder=str(tmp_path), metadata={}, count_distinct=True,
        status_name="status", shared=None,
    )
    assert counts == {"ok": 2, "warning": 0, "error": 1} and len(hashes) == 1
    assert pq.read_table(tmp_path / "part-000003.parquet").column("status").to_pylist() == ["ok", "error", "ok"]


# --------------------------------------------------------------------------- partitions


@pytest.mark.parametrize("row_groups, partition_rows, expected_parts", [
    (1, 1000, 5),    # one row group of 4,500 rows cut into row ranges
    (8, 1000, 8),    # eight row groups of 563 rows or fewer: one part each
    (8, 300, 16),    # and each of them cut in two
    (1, None, 1),    # the default (100,000 rows) keeps a small table whole
])
def test_a_table_is_cut_into_partitions_by_row_group_and_row_range(tmp_path, cluster, row_groups, partition_rows,
                                                                   expected_parts):
    src = tmp_path / "in.parquet"
    table = _table(4500)
    pq.write_table(table, src, row_group_size=-(-4500 // row_groups))
    assert pq.ParquetFile(src).metadata.num_row_groups == row_groups
    local = _local(src, tmp_path / "local.parquet")
    out = tmp_path / "out.parquet"
    summary = score_file(ScoreConfig(input=str(src), output=str(out), engine="dask", quiet=True,
                                     scheduler=cluster.scheduler_address, partition_rows=partition_rows))
    parts = sorted(n for n in os.listdir(out) if n.startswith("part-"))
    assert parts == [f"part-{i:06d}.parquet" for i in range(expected_parts)]
    assert summary.partitions == expected_parts and f"partitions: {expected_parts}" in str(summary)
    # parts in input order, each with the provenance metadata
    assert _decoded(pq.read_table(out)).equals(_decoded(local))
    assert all(b"ionicity.options" in pq.read_schema(out / p).metadata for p in parts)


def test_formulas_recurring_across_partitions_are_scored_once_for_the_cluster(tmp_path, cluster):
    from ionicity.pipelines.dask_partitions import parquet_pieces, share_distinct

    src = tmp_path / "in.parquet"
    rows = 6000
    pq.write_table(pa.table({"formula": [["NaCl", "KBr", "MgO", "CaF2", "Xx", "CuSO4·5H2O", None][i % 7]
                                          for i in range(rows)]}), src)
    pieces = parquet_pieces([str(src)], 500)
    assert len(pieces) == 12 and share_distinct([6] * 12, 6, workers=2)  # the shared first pass is taken
    local = _local(src, tmp_path / "local.parquet")
    out = tmp_path / "out.parquet"
    summary = score_file(ScoreConfig(input=str(src), output=str(out), engine="dask", quiet=True,
                                     scheduler=cluster.scheduler_address, partition_rows=500))
    assert _decoded(pq.read_table(out)).equals(_decoded(local))
    assert summary.distinct_formulas == 6 and summary.partitions == 12


# the same compound spelled several ways, repeating across partitions (from
# tests/test_audit_pipelines.py: a slip, a space for the dot, Unicode subscripts)
SPELLINGS = ["NaCl", "KN03", "CuSO4·5H2O", "KNO3", "Xx", "Na Cl", "CuSO4 5H2O", "CuSO4", None, "Na₂SO₄", "Na2SO4",
             "MgO", "", "[C4mim][BF4]"]


def _spread(rows: int) -> pa.Table:
    # a formula's first spelling appears late for some compounds, so that the
    # first row of a compound is in one partition and its repeats in others
    order = [(i * 5 + i // len(SPELLINGS)) % len(SPELLINGS) for i in range(rows)]
    return pa.table({"id": pa.array(range(rows), pa.int64()), "formula": [SPELLINGS[k] for k in order]})


@pytest.mark.parametrize("shared", ["always", "never"])
def test_first_row_same_compound_across_partitions_equals_the_local_engine(tmp_path, cluster, monkeypatch, shared):
    src = tmp_path / "in.parquet"
    table = _spread(3000)
    pq.write_table(table, src, row_group_size=1000)
    local = _local(src, tmp_path / "local.parquet")
    first = local.column(FIRST_ROW_COLUMN).to_pylist()
    # the reference is the local engine's streamed FirstRows; rows repeat a compound first seen in another partition
    assert any(v is not None and v <= 300 for v in first[300:])
    monkeypatch.setenv("IONICITY_DASK_SHARED", shared)
    out = tmp_path / "out.parquet"
    summary = score_file(ScoreConfig(input=str(src), output=str(out), engine="dask", quiet=True,
                                     scheduler=cluster.scheduler_address, partition_rows=300))
    assert summary.partitions == 12  # row groups of 1,000 rows cut in 300, 300, 300, 100
    result = pq.read_table(out)
    assert result.column(FIRST_ROW_COLUMN).to_pylist() == first
    assert _decoded(result).equals(_decoded(local))


def test_first_row_same_compound_of_csv_blocks_equals_the_local_engine(tmp_path, cluster):
    src = tmp_path / "in.csv"
    table = _spread(40000)
    table = table.set_column(1, "formula", pa.array([x or "" for x in table.column("formula").to_pylist()]))
    pacsv.write_csv(table, src)
    local = _local(src, tmp_path / "local.parquet", keep_text=True)
    out = tmp_path / "out.parquet"
    # blocks of at least 1 MB: a 40,000-row table is still one block, so the block size is forced
    monkeypatch = pytest.MonkeyPatch()
    monkeypatch.setattr("ionicity.pipelines.dask_engine.csv_block_bytes", lambda path, rows: 100_000)
    try:
        summary = score_file(ScoreConfig(input=str(src), output=str(out), engine="dask", quiet=True,
                                         scheduler=cluster.scheduler_address))
    finally:
        monkeypatch.undo()
    assert summary.partitions > 2
    result = pq.read_table(out)
    assert result.column(FIRST_ROW_COLUMN).to_pylist() == local.column(FIRST_ROW_COLUMN).to_pylist()
    assert _decoded(result).equals(_decoded(local))


def test_share_distinct_is_chosen_only_where_formulas_recur_on_several_workers():
    from ionicity.pipelines.dask_partitions import share_distinct

    assert not share_distinct([100, 100], 200, workers=2)      # every formula in one partition only
    assert not share_distinct([100] * 10, 100, workers=1)      # one worker: its own cache is the whole cluster's
    assert share_distinct([100] * 10, 100, workers=2)


def test_partition_rows_needs_the_dask_engine_and_a_positive_number():
    with pytest.raises(InputError, match="--partition-rows needs --engine dask"):
        ScoreConfig(input="a.parquet", output="b.parquet", partition_rows=10).validate()
    with pytest.raises(InputError, match="--partition-rows must be a positive whole number"):
        ScoreConfig(input="a.parquet", output="b.parquet", engine="dask", partition_rows=0).validate()


# --------------------------------------------------------------------------- a real cluster


def _free_port() -> int:
    import socket

    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


@pytest.mark.slow
def test_a_real_scheduler_and_two_worker_processes_give_the_local_engines_table(tmp_path):
    # what a cluster user runs: `dask scheduler` and `dask worker` as their own
    # processes, ionicity pointed at the scheduler's address
    import subprocess
    import sys
    import time

    port = _free_port()
    address = f"tcp://127.0.0.1:{port}"
    common = ["--no-dashboard"]
    processes = []
    try:
        processes.append(subprocess.Popen(
            [sys.executable, "-m", "distributed.cli.dask_scheduler", "--host", "127.0.0.1", "--port", str(port), *common],
            stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL))
        for _ in range(2):
            processes.append(subprocess.Popen(
                [sys.executable, "-m", "distributed.cli.dask_worker", address, "--nthreads", "1", "--nworkers", "1",
                 "--host", "127.0.0.1", *common],
                stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL))
        deadline = time.monotonic() + 120  # a liveness bound for slow machines, not a speed check
        workers = 0
        while time.monotonic() < deadline and workers < 2:
            try:
                with distributed.Client(address, timeout="5s") as client:
                    workers = len(client.scheduler_info()["workers"])
            except (OSError, TimeoutError):
                pass
            if workers < 2:
                time.sleep(0.5)
        assert workers == 2, "the scheduler and two workers did not come up"
        src = tmp_path / "in.parquet"
        pq.write_table(_table(5000), src, row_group_size=1000)
        local = _local(src, tmp_path / "local.parquet")
        out = tmp_path / "out.parquet"
        code = main(["score", str(src), "-o", str(out), "--engine", "dask", "--scheduler", address,
                     "--partition-rows", "700", "--quiet"])
        assert code == 0
        result = _decoded(pq.read_table(out))
        expected = _decoded(local)
        assert result.column_names == expected.column_names
        for name in expected.column_names:  # cell by cell, column by column
            assert result.column(name).to_pylist() == expected.column(name).to_pylist(), name
    finally:
        for process in processes:
            process.terminate()
        for process in processes:
            try:
                process.wait(timeout=30)
            except subprocess.TimeoutExpired:
                process.kill()
                process.wait()


def test_shared_chunks_keep_the_order_of_the_local_engines_locality_key():
    # the chunks are sorted by Arrow; the order must be scheduler.locality_key's,
    # which the local engine routes by (Unicode dots, spaces, a lone text)
    from ionicity.pipelines.bench import realistic_formulas
    from ionicity.pipelines.dask_partitions import distinct_chunks
    from ionicity.pipelines.scheduler import locality_key

    texts = realistic_formulas(3000) + [" NaCl . H2O", "ÅÅ", "", "x+y", "CuSO4∙5H2O", "CuSO4"]
    order = [int(i) for chunk in distinct_chunks(pa.array(texts), 2) for i in chunk]
    assert order == sorted(range(len(texts)), key=lambda i: locality_key(texts[i]))
