"""Attacks on the exit codes: every input, output, environment and option
problem is exit 2 with one line naming the cause (pipelines/cli.py); 3 only
for a bug. Companion of tests/test_exit_codes.py, which holds the cases
fixed first (closed stdout, /dev/full, nested formula columns, scheduler
addresses). No scientific reference values: these are properties of the
command line, and the exit-code convention is common practice.
"""
from __future__ import annotations

import os
import subprocess
import sys
from pathlib import Path

import pyarrow as pa
import pyarrow.parquet as pq
import pytest

from ionicity.pipelines.cli import main
from ionicity.pipelines.config import ScoreConfig
from ionicity.pipelines.errors import InputError

ROOT = Path(__file__).resolve().parents[1]


def _one_line_error(stderr: str) -> str:
    lines = [line for line in stderr.splitlines() if line.strip()]
    assert len(lines) == 1 and lines[0].startswith("ionicity: error: "), stderr
    assert "Traceback" not in stderr and "internal error" not in stderr
    return lines[0]


def _leftovers(folder: Path) -> list[str]:
    return sorted(n for n in os.listdir(folder) if n.startswith(".ionicity-") or ".new-" in n)


@pytest.fixture
def table(tmp_path):
    # enough rows that every output format passes a 20 kB file-size limit
    path = tmp_path / "in.csv"
    path.write_text("formula\n" + "NaCl\nKBr\nCaF2\n" * 2000, encoding="utf-8")
    return path


def test_attack_closed_standard_input_is_exit_2(tmp_path):
    # attack 8: `score -` with standard input closed was an internal error (AttributeError, exit 3)
    done = subprocess.run([sys.executable, "-m", "ionicity", "score", "-", "-o", str(tmp_path / "out.csv")],
                          capture_output=True, text=True, cwd=ROOT, timeout=120, stdin=subprocess.DEVNULL,
                          preexec_fn=lambda: os.close(0))
    assert done.returncode == 2
    assert "standard input is closed" in _one_line_error(done.stderr)
    assert not (tmp_path / "out.csv").exists()


def _limit_file_size():
    import resource

    resource.setrlimit(resource.RLIMIT_FSIZE, (20_000, 20_000))


@pytest.mark.skipif(not hasattr(os, "fork") or sys.platform == "darwin", reason="RLIMIT_FSIZE in a forked child")
@pytest.mark.parametrize("name", ["out.csv", "out.parquet", "-"])
def test_attack_a_file_size_limit_is_exit_2_naming_the_output(table, tmp_path, name):
    # attack 8: a full disk or a file-size limit (ulimit -f) was exit 3, or an anonymous
    # "File too large"; the limit stands in for a full disk, which cannot be made here
    out = tmp_path / "stdout.csv" if name == "-" else tmp_path / name
    with open(out if name == "-" else os.devnull, "wb") as stdout:
        done = subprocess.run([sys.executable, "-m", "ionicity", "score", str(table), "-o", name if name == "-" else str(out),
                               "--quiet", "--workers", "1"], stdout=stdout, stderr=subprocess.PIPE, text=True, cwd=ROOT,
                              timeout=120, preexec_fn=_limit_file_size)
    assert done.returncode == 2
    line = _one_line_error(done.stderr)
    assert "File too large" in line and "ulimit -f" in line
    assert ("standard output" if name == "-" else str(out)) in line
    if name != "-":
        assert not out.exists()
    assert _leftovers(tmp_path) == []


@pytest.mark.slow
@pytest.mark.skipif(not hasattr(os, "fork") or sys.platform == "darwin", reason="RLIMIT_FSIZE in a forked child")
def test_attack_a_file_size_limit_on_the_dask_engine_is_exit_2_in_one_line(table, tmp_path):
    # a worker's part over the limit printed the worker's "Compute Failed" log and traceback before the
    # error line, which did not name the output; the local cluster inherits the limit from the command
    pytest.importorskip("distributed")
    out = tmp_path / "out.parquet"
    done = subprocess.run([sys.executable, "-m", "ionicity", "score", str(table), "-o", str(out), "--quiet",
                           "--engine", "dask", "--workers", "1"], capture_output=True, text=True, cwd=ROOT,
                          timeout=300, preexec_fn=_limit_file_size)
    assert done.returncode == 2
    line = _one_line_error(done.stderr)
    assert "cannot write the output: File too large" in line and "ulimit -f" in line and str(out) in line
    assert not out.exists() and _leftovers(tmp_path) == []


@pytest.mark.skipif(not os.path.isdir("/proc/self"), reason="needs /proc (Linux) for a folder nothing may be created in")
@pytest.mark.parametrize("engine", ["local", pytest.param("dask", marks=pytest.mark.slow)])
def test_attack_an_output_folder_nothing_can_be_created_in_names_the_output(table, capsys, engine):
    # the one line named the temporary file beside the output (.ionicity-PID@HOST...partial), not the output
    if engine == "dask":
        pytest.importorskip("distributed")
    out = "/proc/self/out.parquet"
    assert main(["score", str(table), "-o", out, "--engine", engine, "--workers", "1"]) == 2
    line = _one_line_error(capsys.readouterr().err)
    assert f"cannot write the output: No such file or directory: {out!r}" in line and ".partial" not in line


@pytest.mark.parametrize("output", ["out.csv", "out.tsv", "-"])
def test_attack_nested_input_columns_to_a_csv_output_are_exit_2(tmp_path, capsys, output):
    # found beside attack 8: a list or map column (not the formula column) failed
    # Arrow's CSV writer at the first batch, an internal error (exit 3)
    path = tmp_path / "nested.parquet"
    pq.write_table(pa.table({"formula": ["NaCl"], "tags": pa.array([[1, 2]])}), path)
    target = output if output == "-" else str(tmp_path / output)
    assert main(["score", str(path), "-o", target, "--quiet"]) == 2
    line = _one_line_error(capsys.readouterr().err)
    assert "'tags'" in line and "Parquet" in line
    assert main(["score", str(path), "-o", str(tmp_path / "out.parquet"), "--quiet"]) == 0
    assert pq.read_table(tmp_path / "out.parquet").column("tags").to_pylist() == [[1, 2]]


def test_attack_an_empty_scheduler_address_is_refused(table):
    # attack 9: --scheduler '' silently started a local cluster
    with pytest.raises(InputError, match="--scheduler must be an address .* not ''"):
        ScoreConfig(input=str(table), output="out.parquet", engine="dask", scheduler="").validate()


def test_attack_an_empty_scheduler_address_is_exit_2_on_the_command_line(table, tmp_path, capsys):
    assert main(["score", str(table), "-o", str(tmp_path / "out"), "--engine", "dask", "--scheduler", ""]) == 2
    assert "--scheduler must be an address" in _one_line_error(capsys.readouterr().err)
    assert not (tmp_path / "out").exists()


def test_attack_a_spreadsheet_formula_prefix_is_refused(table, tmp_path, capsys):
    # attack 9: --prefix '=cmd|...' wrote headers that a spreadsheet runs as formulas
    for prefix in ("=cmd|' /C calc'!A0", "+x", "-x", "@x", "a\nb"):
        assert main(["score", str(table), "-o", str(tmp_path / "out.csv"), f"--prefix={prefix}"]) == 2
        assert "--prefix must be printable text" in _one_line_error(capsys.readouterr().err)
    assert not (tmp_path / "out.csv").exists()
