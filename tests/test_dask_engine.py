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
    # first_row_same_compound is the local engine's alone: Dask partitions are
    # scored apart and leave it empty (README, "Inventory audit")
    return pa.table({name: column.cast(pa.string()) if pa.types.is_dictionary(column.type) else column
                     for name, column in zip(table.column_names, table.columns) if name != FIRST_ROW_COLUMN})


def _local(input_path, out_path):
    score_file(ScoreConfig(input=str(input_path), output=str(out_path), quiet=True, workers=1))
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
    assert result.column(FIRST_ROW_COLUMN).null_count == result.num_rows
    assert local.column(FIRST_ROW_COLUMN).null_count < local.num_rows
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
    local = _local(src, tmp_path / "local.parquet")
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


def test_a_partition_outside_a_worker_gets_a_cache_of_its_own():
    import pandas as pd

    from ionicity.pipelines.dask_engine import score_partition
    from ionicity.pipelines.schema import output_schema

    input_schema = pa.schema([pa.field("formula", pa.string())])
    frame = pd.DataFrame({"formula": ["NaCl", None, "NaCl"]})
    out = score_partition(frame, "formula", None, input_schema, output_schema(input_schema))
    assert out["status"].tolist() == ["ok", "error", "ok"]
