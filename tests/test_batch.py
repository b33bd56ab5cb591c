"""The local engine: ionicity.pipelines.scheduler, formula_cache, batch_assembly,
local_engine, table, config and pool.

Invariants checked against the input itself (an external reference for
"nothing changed"): every input column hashes the same before and after, row
count and order hold, and each distinct formula is scored exactly once. The
expected records come from scorer.record.score_formula called directly.
"""
from __future__ import annotations

import csv
import hashlib
import json
import os
import random
import subprocess
import sys

import ionicity.pipelines.pool as pool_module
import pandas as pd
import pyarrow as pa
import pyarrow.csv as pacsv
import pyarrow.parquet as pq

from ionicity.scorer.note_codes import short_notes
from ionicity.scorer.precision import round_significant_array
import pytest
from ionicity.pipelines.arrow_columns import values_array
from ionicity.pipelines.batch_assembly import score_batch
from ionicity.pipelines.bench import realistic_formulas, write_table
from ionicity.pipelines.config import ScoreConfig
from ionicity.pipelines.errors import InputError
from ionicity.pipelines.formula_cache import FormulaCache
from ionicity.pipelines.pool import WorkerPool
from ionicity.pipelines.run import score_file
from ionicity.pipelines.scheduler import BatchScorer
from ionicity.pipelines.schema import output_schema
from ionicity.pipelines.table import score_table
from ionicity.scorer.audit import FIRST_ROW_COLUMN
from ionicity.scorer.columns import column_names, output_columns
from ionicity.scorer.record import score_formula

FORMULAS = ["NaCl", "KCl", "CuSO4·5H2O", "[C4mim][BF4]", "Fe2(SO4)3", "Xx2O", "", "  ", "Na₂SO₄", "NaCl"]


def column_digest(column) -> str:
    """SHA-256 of a column's values, nulls and empty strings kept apart."""
    series = pd.Series(column.to_pylist(), dtype=object)
    hashed = pd.util.hash_pandas_object(series.fillna("\x00<null>"), index=False).to_numpy()
    return hashlib.sha256(hashed.tobytes()).hexdigest()


def digests(table: pa.Table, names) -> dict:
    return {n: column_digest(table.column(n)) for n in names}


def mixed_table(rows: int, seed: int = 1) -> pa.Table:
    import random

    rng = random.Random(seed)
    choices = FORMULAS + [None]
    return pa.table({
        "id": pa.array(range(rows), pa.int64()),
        "formula": [rng.choice(choices) for _ in range(rows)],
        "note": [rng.choice(["α", "β,γ", 'q"q', "", None, "line\nbreak", "ロット"]) for _ in range(rows)],
        "dup": ["same"] * rows,
        "mass": [rng.choice([1.5, None, float("nan"), -0.0]) for _ in range(rows)],
    })


def test_every_generated_column_follows_the_registry(tmp_path):
    src = tmp_path / "in.parquet"
    pq.write_table(mixed_table(50), src)
    score_file(str(src), str(tmp_path / "out.parquet"), quiet=True)
    names = pq.read_schema(tmp_path / "out.parquet").names
    assert names == ["id", "formula", "note", "dup", "mass"] + [c.name for c in output_columns()]


@pytest.mark.parametrize("fmt", ["parquet", "csv", "tsv"])
def test_rows_order_and_input_columns_survive(tmp_path, fmt):
    table = mixed_table(3000)
    src = tmp_path / f"in.{fmt}"
    out = tmp_path / f"out.{fmt}"
    if fmt == "parquet":
        pq.write_table(table, src, row_group_size=700)
    else:
        # text formats hold text: compare text with text
        table = table.drop_columns(["mass"]).set_column(0, "id", pa.array([str(i) for i in range(3000)]))
        table = table.set_column(1, "formula", pa.array([f or "" for f in table.column("formula").to_pylist()]))
        table = table.set_column(2, "note", pa.array([f or "" for f in table.column("note").to_pylist()]))
        pacsv.write_csv(table, src, pacsv.WriteOptions(delimiter="\t" if fmt == "tsv" else ","))
    summary = score_file(str(src), str(out), quiet=True, batch_rows=512)
    if fmt == "parquet":
        result = pq.read_table(out)
    else:
        opts = pacsv.ParseOptions(delimiter="\t" if fmt == "tsv" else ",", newlines_in_values=True)
        names = pacsv.open_csv(out, parse_options=opts).schema.names
        result = pacsv.read_csv(out, parse_options=opts, convert_options=pacsv.ConvertOptions(
            column_types={n: pa.string() for n in names}, strings_can_be_null=False))
    assert result.num_rows == table.num_rows == summary.rows
    assert digests(result, table.column_names) == digests(table, table.column_names)
    assert result.schema.field("formula").type == table.schema.field("formula").type
    texts = table.column("formula").to_pylist()
    assert summary.distinct_formulas == len({f for f in texts if f is not None and f.strip()})
    expected = [score_formula(f)["status"] for f in texts]
    assert result.column("status").to_pylist() == expected
    assert summary.ok + summary.warning + summary.error == summary.rows


def test_values_match_score_formula(tmp_path):
    src = tmp_path / "in.parquet"
    pq.write_table(pa.table({"formula": FORMULAS + [None]}), src)
    score_file(str(src), str(tmp_path / "out.parquet"), quiet=True)
    _assert_rows_are_score_formula(pq.read_table(tmp_path / "out.parquet").to_pylist(), FORMULAS + [None])


def _varied_formulas() -> list:
    """Some 3,000 distinct texts: the reference cases (tests/data/formula_cases.csv,
    sources per row there), the invented demo inventory and the benchmark's
    generator (salts, hydrates in three spellings, double salts, ionic liquids,
    typos), plus empty cells."""
    cases = [r["formula"] for r in csv.DictReader(open("tests/data/formula_cases.csv", encoding="utf-8"))]
    demo = [r["formula"] for r in csv.DictReader(open("datasets/demo/inventory.csv", encoding="utf-8"))]
    return list(dict.fromkeys(cases + demo + realistic_formulas(2500, seed=13) + ["", "  ", None]))


def test_a_varied_table_in_small_batches_matches_score_formula(tmp_path, monkeypatch):
    # The batch path's speed tricks all at once -- two worker processes, the
    # cache's numpy gather with shared validity bitmaps, its per-column text
    # codes, evictions (a cache of 700 entries), dictionaries shared across a
    # row group, the writer thread -- against the plain per-formula scorer
    # (the reference is score_formula itself: common practice for a
    # refactoring check).
    class Small(FormulaCache):
        def __init__(self, max_entries=700):
            super().__init__(max_entries=max_entries)

    monkeypatch.setattr("ionicity.pipelines.scheduler.FormulaCache", Small)
    distinct = _varied_formulas()
    rng = random.Random(4)
    texts = distinct + [rng.choice(distinct) for _ in range(3000)]
    rng.shuffle(texts)
    src = tmp_path / "in.parquet"
    pq.write_table(pa.table({"formula": texts}), src, row_group_size=1500)
    score_file(str(src), str(tmp_path / "out.parquet"), quiet=True, batch_rows=512, workers=2)
    out = pq.read_table(tmp_path / "out.parquet")
    assert out.num_rows == len(texts) and out.column("formula").to_pylist() == texts
    _assert_rows_are_score_formula(out.to_pylist(), texts)


def _assert_rows_are_score_formula(rows: list[dict], texts: list) -> None:
    for row, text in zip(rows, texts, strict=True):
        expected = score_formula(text)
        for column in output_columns():
            if column.name == FIRST_ROW_COLUMN:
                continue  # depends on the row's place in the table: tests/test_audit_pipelines.py
            value, want = row[column.name], expected[column.name]
            if column.dtype == "float64" and (want is None or want != want):
                assert value is None, (text, column.name)  # NaN is written as a null cell
            elif column.dtype == "float64":
                # output files carry each column's significant digits (scorer.precision)
                assert value == round_significant_array([want], column.digits)[0], (text, column.name)
            elif column.name == "value_notes":
                # and the notes' short codes (scorer.note_codes)
                assert value == short_notes(want), text
            else:
                assert value == want, (text, column.name)


def test_a_dictionary_column_scores_only_the_entries_its_rows_use(monkeypatch):
    # A Parquet batch read dictionary-encoded carries its row group's whole
    # dictionary; entries no row of the batch holds wait for their own batch.
    calls = []
    real = pool_module.score_values
    monkeypatch.setattr("ionicity.pipelines.scheduler.score_values", lambda texts: calls.extend(texts) or real(texts))
    dictionary = pa.array(["NaCl", "KCl", "MgO", "CaF2"])
    column = pa.DictionaryArray.from_arrays(pa.array([1, None, 1, 3], pa.int32()), dictionary)
    batch = pa.record_batch({"formula": column})
    schema = output_schema(pa.schema([pa.field("formula", pa.string())]))
    scorer = BatchScorer(1, cache=FormulaCache())
    out = score_batch(batch, "formula", schema, scorer)
    assert sorted(c for c in calls if c is not None) == ["CaF2", "KCl"]
    assert out.column(0).to_pylist() == ["KCl", None, "KCl", "CaF2"]
    assert out.column(0).type == pa.string()
    assert out.column(out.schema.get_field_index("formula_normalized")).to_pylist() == [
        score_formula(f)["formula_normalized"] for f in ["KCl", None, "KCl", "CaF2"]]
    assert scorer.distinct_formulas == 2


def test_each_distinct_formula_is_scored_once(monkeypatch):
    calls = []
    real = pool_module.score_values

    def counting(texts):
        calls.extend(texts)
        return real(texts)

    monkeypatch.setattr("ionicity.pipelines.scheduler.score_values", counting)
    table = pa.table({"formula": ["NaCl", "KCl", "NaCl", None, "KCl", "MgO"] * 50})
    schema = output_schema(table.schema)
    scorer = BatchScorer(1, cache=FormulaCache())
    for batch in table.to_batches(max_chunksize=40):
        score_batch(batch, "formula", schema, scorer)
    assert sorted(c for c in calls if c is not None) == ["KCl", "MgO", "NaCl"]
    assert scorer.distinct_formulas == 3


def test_pool_gives_the_same_records_as_in_process():
    texts = realistic_formulas(300, seed=5)
    serial = BatchScorer(1, cache=FormulaCache()).columns(texts)
    with BatchScorer(2, cache=FormulaCache(), parallel_min_new=1) as pooled:
        parallel = pooled.columns(texts)
        assert pooled.scored_in_pool == 300
    assert all(a.equals(b) for a, b in zip(parallel, serial))


def test_cache_stays_bounded_and_keeps_what_a_batch_needs():
    cache = FormulaCache(max_entries=100)
    scorer = BatchScorer(1, cache=cache)
    first = scorer.columns(["NaCl", "Xx2O"])
    for start in range(0, 1000, 30):
        texts = [f"Na{i}Cl" for i in range(start, start + 30)]
        columns = scorer.columns(texts + ["NaCl"])
        assert len(cache) <= 100
        assert columns[column_names().index("molar_mass_g_mol")][-1].as_py() == first[
            column_names().index("molar_mass_g_mol")][0].as_py()
    assert "Xx2O" not in cache.index  # the oldest went
    assert scorer.columns(["Xx2O"])[0].to_pylist() == ["error"]


def test_a_scorer_bug_marks_the_row_and_the_run_goes_on(monkeypatch):
    real = pool_module.score_row

    def flaky(text):
        if text == "KCl":
            raise RuntimeError("boom")
        return real(text)

    monkeypatch.setattr(pool_module, "score_row", flaky)
    out = score_table(pd.DataFrame({"formula": ["NaCl", "KCl"]}), workers=1)
    assert out["status"].tolist() == ["ok", "error"]
    assert "internal error" in out["message"][1] and "boom" in out["message"][1]


def test_name_col_is_quoted_in_failed_rows(tmp_path):
    src = tmp_path / "in.csv"
    src.write_text("formula,name\nXx2O,bottle 7\nNaCl,bottle 8\nQq,\n")
    score_file(str(src), str(tmp_path / "out.parquet"), name_col="name", quiet=True)
    messages = pq.read_table(tmp_path / "out.parquet").column("message").to_pylist()
    assert messages[0].endswith("(row named 'bottle 7')")
    assert "bottle" not in (messages[1] or "")
    assert "row named" not in messages[2]
    frame = score_table(pd.DataFrame({"formula": ["Xx2O", "NaCl"], "name": ["bottle 7", "bottle 8"]}), name_col="name")
    assert frame["message"][0] == messages[0]


def test_prefix_and_clash(tmp_path):
    src = tmp_path / "in.csv"
    src.write_text("formula,status\nNaCl,kept\n")
    with pytest.raises(InputError, match="--prefix"):
        score_file(str(src), str(tmp_path / "out.csv"), quiet=True)
    assert not (tmp_path / "out.csv").exists()
    score_file(str(src), str(tmp_path / "out.parquet"), prefix="ion_", quiet=True)
    row = pq.read_table(tmp_path / "out.parquet").to_pylist()[0]
    assert row["status"] == "kept" and row["ion_status"] == "ok"


def test_parquet_provenance(tmp_path):
    src = tmp_path / "in.csv"
    src.write_text("Formula\nNaCl\n")
    score_file(ScoreConfig(input=str(src), output=str(tmp_path / "out.parquet"), quiet=True, workers=1))
    meta = pq.read_schema(tmp_path / "out.parquet").metadata
    from ionicity.scorer import __version__

    assert meta[b"ionicity.version"].decode() == __version__
    data = json.loads(meta[b"ionicity.data_versions"])
    assert data["elements_snapshot"]["mendeleev_version"]
    assert "ions.csv" in data["tables"] and data["tables"]["ions.csv"].startswith("sha256:")
    options = json.loads(meta[b"ionicity.options"])
    assert options["formula_col"] == "Formula" and options["engine"] == "local" and options["workers"] == 1


def test_summary_counts(tmp_path):
    # one column: the blank line is an empty formula cell, still a row
    src = tmp_path / "in.csv"
    src.write_text("formula\nNaCl\nNaCl\nXx2O\n\nKCl\n")
    summary = score_file(str(src), str(tmp_path / "out.csv"), quiet=True)
    assert (summary.rows, summary.error, summary.distinct_formulas) == (5, 2, 3)
    assert str(summary).startswith("rows: 5, ok: ")


@pytest.mark.parametrize(
    "content, match",
    [("formula\n", "no data rows"), ("name\nx\n", "no column named 'formula'"), ("", "empty")],
)
def test_unusable_input_writes_nothing(tmp_path, content, match):
    src = tmp_path / "in.csv"
    src.write_text(content)
    with pytest.raises(InputError, match=match):
        score_file(str(src), str(tmp_path / "out.parquet"), quiet=True)
    assert sorted(os.listdir(tmp_path)) == ["in.csv"]


def test_bad_options():
    for options, match in (
        ({"engine": "spark"}, "local, dask"),
        ({"workers": 0}, "--workers"),
        ({"batch_rows": 0}, "--batch-rows"),
        ({"scheduler": "tcp://x:1"}, "--engine dask"),
    ):
        with pytest.raises(InputError, match=match):
            ScoreConfig(input="a.csv", output="b.csv", **options).validate()


def test_score_table_keeps_index_and_columns():
    frame = pd.DataFrame({"formula": ["NaCl", None, "KCl"], "x": [1, 2, 3]}, index=[10, 5, 7])
    out = score_table(frame)
    assert list(out.index) == [10, 5, 7] and out["x"].tolist() == [1, 2, 3]
    assert out["status"].tolist() == ["ok", "error", "ok"]
    assert list(out.columns) == ["formula", "x"] + list(column_names())


@pytest.mark.slow
def test_a_million_rows(tmp_path):
    # realistic table: nulls and Unicode in 'lot' and 'mass_g', duplicates everywhere
    src = tmp_path / "big.parquet"
    write_table(str(src), 1_000_000, 2000, seed=3)
    out = tmp_path / "big_out.parquet"
    summary = score_file(str(src), str(out), quiet=True)
    source = pq.read_table(src)
    result = pq.read_table(out, columns=source.column_names + ["status"])
    assert result.num_rows == 1_000_000 == summary.rows
    assert digests(result, source.column_names) == digests(source, source.column_names)
    assert summary.distinct_formulas == 2000


def test_batches_read_ahead_survive_a_full_cache():
    # Batches are submitted several at a time before the first is collected;
    # when the bounded cache evicts an earlier batch's formulas meanwhile,
    # collecting that batch scores them again: every row still gets the
    # record score_formula gives it.
    texts = realistic_formulas(400, seed=9)
    batches = [pa.array(texts[i:i + 80] + [None, texts[i]]) for i in range(0, 400, 80)]
    scorer = BatchScorer(1, cache=FormulaCache(max_entries=100))
    tickets = [scorer.submit(batch) for batch in batches]
    status_at = column_names().index("status")
    mass_at = column_names().index("molar_mass_g_mol")
    for batch, ticket in zip(batches, tickets):
        rows = scorer.rows_of(ticket)
        arrays = scorer.cache.arrays()
        got = list(zip(arrays[status_at].take(rows).to_pylist(), arrays[mass_at].take(rows).to_pylist()))
        expected = [(score_formula(t)["status"], score_formula(t)["molar_mass_g_mol"]) for t in batch.to_pylist()]
        expected = [(s, None if m != m else m) for s, m in expected]
        assert got == expected
    assert len(scorer.cache) <= 100
    assert scorer.distinct_formulas == 400


@pytest.mark.parametrize("values, arrow_type", [
    ([1.5, None, float("nan"), -0.0, 2e300] * 7, pa.float64()),
    ([1.0, 2.0], pa.float64()),
    ([True, None, False] * 5, pa.bool_()),
    ([False, True], pa.bool_()),
    (["α", None, "", "NaCl", "x" * 400] * 3, pa.string()),
])
def test_cache_arrays_match_pyarrow_conversion(values, arrow_type):
    # The cache builds its arrays without pa.array (which imports pandas);
    # pyarrow's own conversion, with NaN read as null, is the reference.
    expected = pa.array([None if v is None or v != v else v for v in values], type=arrow_type)
    got = values_array(values, arrow_type)
    got.validate(full=True)
    assert got.equals(expected)
    assert got.null_count == expected.null_count


def test_a_run_does_not_import_pandas(tmp_path):
    # pandas costs some 0.3 s of CPU to import; a command-line run never needs it
    import subprocess
    import sys

    src = tmp_path / "in.parquet"
    pq.write_table(mixed_table(300), src)
    code = (
        "import sys\n"
        "from ionicity.pipelines.cli import main\n"
        f"code = main(['score', {str(src)!r}, '-o', {str(tmp_path / 'out.parquet')!r}, '--quiet', '--workers', '1'])\n"
        "print(code, 'pandas' in sys.modules)\n"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True,
                         cwd=os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
    assert out.stdout.split() == ["0", "False"]


def test_workers_start_warm_with_one_blas_thread_and_a_settled_collector():
    import gc

    with WorkerPool(1) as workers:
        assert workers.submit(0, gc.get_threshold).result(timeout=120) == (10_000, 50, 50)
        assert workers.submit(0, gc.get_freeze_count).result(timeout=120) > 0
        assert workers.submit(0, os.getenv, "OPENBLAS_NUM_THREADS").result(timeout=120) is not None
        # numpy reads the variable when it loads: the pool it built must have one thread
        threadpoolctl = pytest.importorskip("threadpoolctl")
        pools = workers.submit(0, threadpoolctl.threadpool_info).result(timeout=120)
        blas = [p for p in pools if p.get("user_api") == "blas"]
        if os.environ.get("OPENBLAS_NUM_THREADS") is None and blas:
            assert {p["num_threads"] for p in blas} == {1}, blas


def test_importing_the_package_loads_neither_numpy_nor_pyarrow():
    # a worker's forkserver sets numpy's thread variables after these imports
    # and before numpy loads (pipelines/_warm.py)
    code = "import sys, ionicity, ionicity.pipelines; print(sorted({'numpy', 'pyarrow'} & set(sys.modules)))"
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout.strip() == "[]"


def test_an_empty_batch_scores_to_an_empty_batch():
    schema = output_schema(pa.schema([pa.field("formula", pa.string())]))
    scorer = BatchScorer(1, cache=FormulaCache())
    plain = pa.record_batch({"formula": pa.array([], pa.string())})
    encoded = pa.record_batch({"formula": pa.DictionaryArray.from_arrays(pa.array([], pa.int32()), pa.array(["NaCl"]))})
    for batch in (plain, encoded):
        out = score_batch(batch, "formula", schema, scorer)
        assert out.num_rows == 0 and out.schema == schema
    assert scorer.distinct_formulas == 0


def test_stopping_workers_that_left_half_a_result_does_not_hang():
    # A worker stopped (Ctrl-C, a closed stdout) while sending its results
    # leaves half a message in the result pipe; the executor's reader thread
    # must not wait for the rest for good. Half a message is written here by hand.
    import struct
    import threading

    workers = WorkerPool(1)
    workers.submit(0, int).result(timeout=120)
    processes, writer = pool_module._executor_internals(workers._executors[0])
    # on this CPython the shim finds the private parts it needs
    assert len(processes) == 1 and processes[0].is_alive() and writer is not None
    os.write(writer.fileno(), struct.pack("!i", 1000) + b"x" * 10)  # says 1000 bytes, sends 10
    done = threading.Event()
    threading.Thread(target=lambda: (workers.stop(cancel=True), done.set()), daemon=True).start()
    if not done.wait(60):
        writer.close()  # let the process end, then fail
        pytest.fail("WorkerPool.stop(cancel=True) hung on a half-sent result")


class _ExecutorWithoutPrivates:
    """An executor as a Python without CPython's private attributes would
    have it: only the public ``shutdown``."""

    def __init__(self):
        self.shutdowns = []

    def shutdown(self, wait=True, cancel_futures=False):
        self.shutdowns.append((wait, cancel_futures))


def test_the_private_attribute_shim_falls_back_when_they_are_missing():
    executor = _ExecutorWithoutPrivates()
    assert pool_module._executor_internals(executor) == ([], None)
    # half-built internals (no processes yet, a queue without a writer)
    executor._processes = None
    executor._result_queue = object()
    assert pool_module._executor_internals(executor) == ([], None)
    pool_module._stop_executors([executor], cancel=True)
    assert executor.shutdowns == [(True, True)]


# --------------------------------------------------------------------------- a run owns its cache


def _module_level_caches() -> list[str]:
    import sys

    found = []
    for name, module in list(sys.modules.items()):
        if name.startswith("ionicity") and module is not None:
            for attribute, value in vars(module).items():
                if isinstance(value, (FormulaCache, BatchScorer)):
                    found.append(f"{name}.{attribute}")
    return found


@pytest.fixture
def tracked_caches(monkeypatch):
    """Weak references to every FormulaCache the engine makes while the test runs."""
    import weakref

    made = []

    class Tracked(FormulaCache):
        def __init__(self, *args, **kwargs):
            super().__init__(*args, **kwargs)
            made.append(weakref.ref(self))

    monkeypatch.setattr("ionicity.pipelines.scheduler.FormulaCache", Tracked)
    return made


@pytest.mark.parametrize("api", ["score_file", "score_table"])
def test_a_run_owns_its_cache_and_drops_it_when_it_returns(tmp_path, tracked_caches, api):
    import gc

    if api == "score_file":
        src = tmp_path / "in.csv"
        src.write_text("formula\nNaCl\nKCl\nNaCl\n")
        score_file(str(src), str(tmp_path / "out.parquet"), quiet=True, workers=1)
    else:
        score_table(pd.DataFrame({"formula": ["NaCl", "KCl", "NaCl"]}))
    gc.collect()
    assert len(tracked_caches) == 1  # the run made its own cache...
    assert tracked_caches[0]() is None  # ...and nothing keeps it after the run
    assert _module_level_caches() == []


def test_two_runs_do_not_share_scores(tmp_path, tracked_caches):
    src = tmp_path / "in.csv"
    src.write_text("formula\nNaCl\n")
    first = score_file(str(src), str(tmp_path / "a.csv"), quiet=True, workers=1)
    second = score_file(str(src), str(tmp_path / "b.csv"), quiet=True, workers=1)
    assert len(tracked_caches) == 2 and first.distinct_formulas == second.distinct_formulas == 1


# --------------------------------------------------------------------------- one verdict policy


def test_failed_rows_are_named_by_the_verdict_policy_in_every_api(tmp_path, monkeypatch):
    # Change the policy's suffix: files and DataFrames must both follow it,
    # so neither engine keeps a copy of its own.
    monkeypatch.setattr("ionicity.scorer.verdict.row_name_suffix", lambda name: f" [named {name}]")
    src = tmp_path / "in.csv"
    src.write_text("formula,name\nXx2O,bottle 7\nNaCl,bottle 8\n")
    score_file(str(src), str(tmp_path / "out.parquet"), name_col="name", quiet=True, workers=1)
    from_file = pq.read_table(tmp_path / "out.parquet").column("message").to_pylist()
    frame = score_table(pd.DataFrame({"formula": ["Xx2O", "NaCl"], "name": ["bottle 7", "bottle 8"]}),
                        name_col="name")
    assert from_file[0].endswith(" [named bottle 7]") and "named" not in (from_file[1] or "")
    assert frame["message"].tolist() == from_file


# --------------------------------------------------------------------------- options


@pytest.mark.parametrize("options, message", [
    ({"engine": "spark"}, "--engine must be one of local, dask, not 'spark'"),
    ({"workers": 0}, "--workers must be a whole number of at least 1 (or none given, for every core), not 0"),
    ({"workers": 2.5}, "--workers must be a whole number of at least 1 (or none given, for every core), not 2.5"),
    ({"workers": True}, "--workers must be a whole number of at least 1 (or none given, for every core), not True"),
    ({"batch_rows": "100"}, "--batch-rows must be a positive whole number, not '100'"),
    ({"batch_rows": -5}, "--batch-rows must be a positive whole number, not -5"),
    ({"prefix": None}, "--prefix must be printable text (may be empty) not starting with =, +, - or @, which a"
                       " spreadsheet would run as a formula in the header, not None"),
    ({"prefix": "=cmd|x"}, "--prefix must be printable text (may be empty) not starting with =, +, - or @, which a"
                           " spreadsheet would run as a formula in the header, not '=cmd|x'"),
    ({"formula_col": 3}, "--formula-col must be a column name, not 3"),
    ({"scheduler": "tcp://x:1"}, "--scheduler 'tcp://x:1' needs --engine dask (the engine is 'local')"),
])
def test_config_validation_names_the_bad_value_and_what_is_allowed(options, message):
    with pytest.raises(InputError) as caught:
        ScoreConfig(input="a.csv", output="b.csv", **options).validate()
    assert str(caught.value) == message


def test_every_constraint_accepts_the_defaults_and_names_an_existing_option():
    from dataclasses import fields

    from ionicity.pipelines.config import CONSTRAINTS

    config = ScoreConfig(input="a.csv", output="b.csv")
    config.validate()
    assert set(CONSTRAINTS) <= {f.name for f in fields(config)}
    ScoreConfig(input="-", output="-", workers=3, batch_rows=1, engine="dask", scheduler="tcp://x:1").validate()
