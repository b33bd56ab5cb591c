"""The benchmark's output contract: ``python -m ionicity.pipelines.bench`` prints the
figures the scale issue asks for, one ``name: value`` per line.

No reference values, so no source to cite: these tests check no science, only
that the benchmark runs and reports; its figures are measured, not asserted.
"""
from __future__ import annotations

import os
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]


def _bench_figures(*args: str) -> dict[str, str]:
    """The ``name: value`` lines of a benchmark run with ``args``, this tree first on the path."""
    env = dict(os.environ)
    env["PYTHONPATH"] = str(ROOT) + (os.pathsep + env["PYTHONPATH"] if env.get("PYTHONPATH") else "")
    result = subprocess.run([sys.executable, "-m", "ionicity.pipelines.bench", *args],
                            capture_output=True, text=True, env=env, cwd=ROOT, timeout=300)
    assert result.returncode == 0, result.stderr
    return dict(line.split(": ", 1) for line in result.stdout.splitlines())


@pytest.mark.slow
def test_bench_prints_every_figure_as_name_value(tmp_path):
    figures = _bench_figures("--rows", "3000", "--distinct", "300", "--repeat", "2", "--baseline-rows", "40",
                             "--workdir", str(tmp_path))
    for name in ("ratio_vs_io_floor", "speedup_vs_per_row", "distinct_per_second", "peak_rss_mib"):
        assert float(figures[name]) > 0, name
    assert len(figures["score_seconds_each"].split(", ")) == 2
    assert figures["rows"] == "3000" and figures["distinct"] == "300"
    assert figures["bytecode_compiled"] == "yes"


def test_bench_table_holds_every_distinct_formula(tmp_path):
    import pyarrow.parquet as pq

    from ionicity.pipelines.bench import write_table

    path = tmp_path / "t.parquet"
    write_table(str(path), 5000, 700, seed=3)
    table = pq.read_table(path)
    assert table.num_rows == 5000
    assert len(set(table.column("formula").to_pylist())) == 700


@pytest.mark.parametrize("module", ["ionicity.pipelines.bench", "pipelines.bench"])
def test_the_bench_runs_under_both_names(module):
    # `python -m pipelines.bench` from the repository root, as DEVELOPERS.md
    # shows, and the installed name
    result = subprocess.run([sys.executable, "-m", module, "--help"], capture_output=True, text=True, cwd=ROOT,
                            timeout=120)
    assert result.returncode == 0, result.stderr
    assert "--calibrate" in result.stdout


@pytest.mark.slow
def test_bench_pairs_runs_against_another_install(tmp_path):
    # this interpreter stands in for an earlier checkout's: the pairs' ratio is printed, and where the other
    # install imports ionicity from
    figures = _bench_figures("--rows", "2000", "--distinct", "200", "--repeat", "2", "--baseline-rows", "20",
                             "--workdir", str(tmp_path), "--against", sys.executable)
    assert len(figures["score_against_seconds_each"].split(", ")) == 2
    assert float(figures["paired_ratio_vs_against"]) > 0
    assert figures["against"] == sys.executable
    # the tree whose scorer that interpreter runs: this checkout (an editable install), named with its commit
    assert figures["against_version"].startswith(str(ROOT) + " (")


def test_bench_refuses_an_interpreter_without_ionicity(tmp_path):
    missing = tmp_path / "python-missing"
    result = subprocess.run(
        [sys.executable, "-m", "ionicity.pipelines.bench", "--rows", "10", "--distinct", "5", "--repeat", "1",
         "--workdir", str(tmp_path), "--against", str(missing)],
        capture_output=True, text=True, cwd=ROOT, timeout=120,
    )
    assert result.returncode != 0
    assert f"--against {missing}: cannot import ionicity there" in result.stderr
    assert "Traceback" not in result.stderr
