"""Attacks through the shape of a CSV: long fields, long first rows, long
header lines, very wide tables. Every row is read, or the error names the
limit and what to do (pipelines/csv_blocks.py). No scientific reference
values: the cells are ordinary salts (common practice: any salt the scorer reads
would do, their scores are not checked here); the block sizes are Arrow's reader's
(pyarrow.csv.ReadOptions.block_size) and ours.
"""
from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pyarrow.parquet as pq
import pytest

from ionicity.pipelines.cli import main
from ionicity.pipelines.schema import MAX_INPUT_COLUMNS

ROOT = Path(__file__).resolve().parents[1]


def _write(path: Path, before: int, field: int, after: int) -> None:
    with open(path, "w", encoding="utf-8") as f:
        f.write("formula,note\n")
        f.write("KCl,abc\n" * before)
        f.write("NaCl," + "x" * field + "\n")
        f.write("KBr,abc\n" * after)


def _scored(tmp_path, src) -> tuple[list, list]:
    out = tmp_path / "out.parquet"
    assert main(["score", str(src), "-o", str(out), "--quiet", "--workers", "1"]) == 0
    table = pq.read_table(out, columns=["formula", "note", "status"])
    return table.column("formula").to_pylist(), [len(n) for n in table.column("note").to_pylist()]


@pytest.mark.parametrize("before, field", [
    (25_000, 600_000),  # attack 9: a field over 256 kB near the start of a large CSV, across the head's first block
    (0, 3_000_000),     # a first row longer than the 1 MiB head read to find the header
    (200_000, 10_000_000),  # a field across two 4 MiB streaming blocks, after rows already given
])
def test_attack_long_fields_are_read_whole(tmp_path, before, field):
    src = tmp_path / "long.csv"
    _write(src, before, field, 150_000)
    formulas, notes = _scored(tmp_path, src)
    assert len(formulas) == before + 1 + 150_000
    assert formulas[before] == "NaCl" and notes[before] == field
    assert formulas[before + 1] == "KBr" and formulas[-1] == "KBr"


def test_attack_a_long_row_on_standard_input_names_the_limit(tmp_path):
    # standard input cannot be read again with a larger block: one line saying what to do
    src = tmp_path / "long.csv"
    _write(src, 200_000, 10_000_000, 10)
    with open(src, "rb") as stdin:
        done = subprocess.run([sys.executable, "-m", "ionicity", "score", "-", "-o", str(tmp_path / "out.csv")],
                              stdin=stdin, capture_output=True, text=True, cwd=ROOT, timeout=300)
    assert done.returncode == 2
    lines = done.stderr.strip().splitlines()
    assert len(lines) == 1 and "longer than the 4 MiB block" in lines[0] and "save the table to a file" in lines[0]
    assert not (tmp_path / "out.csv").exists()


def test_attack_a_very_wide_csv_is_refused_clearly(tmp_path, capsys):
    # attack 9: a 100,000-column CSV was "Empty CSV file" (its header longer than the head read);
    # read whole, it took over 15 minutes and 2 GB, so past MAX_INPUT_COLUMNS it is refused
    n = MAX_INPUT_COLUMNS + 1
    src = tmp_path / "wide.csv"
    src.write_text("formula," + ",".join(f"column_number_{i:06d}_" + "w" * 100 for i in range(n)) + "\n"
                   + "NaCl," + ",".join("1" for _ in range(n)) + "\n")
    assert len(src.read_text().splitlines()[0]) > 1 << 20  # the header alone is longer than the head read first
    assert main(["score", str(src), "-o", str(tmp_path / "out.csv")]) == 2
    err = capsys.readouterr().err.strip()
    assert len(err.splitlines()) == 1 and f"has {n + 1} columns" in err and "Empty CSV" not in err


def test_a_header_longer_than_the_head_is_read(tmp_path):
    # 5,000 long column names: a 1.3 MB header line, read whole
    n = 5_000
    src = tmp_path / "wide.csv"
    src.write_text("formula," + ",".join(f"a_rather_long_column_name_{i:06d}_" + "z" * 230 for i in range(n)) + "\n"
                   + "NaCl," + ",".join("1" for _ in range(n)) + "\n")
    assert len(src.read_text().splitlines()[0]) > 1 << 20
    out = tmp_path / "out.parquet"
    assert main(["score", str(src), "-o", str(out), "--quiet", "--columns", "composition"]) == 0
    table = pq.read_table(out, columns=["formula", "status"])
    assert table.column("status").to_pylist() == ["ok"]
