"""Attacks through the cells of a table: bytes that are not text, characters
that grow when normalised, messages that grow without bound or start like a
spreadsheet formula. A bad cell is that row's error, never the whole file's.

No scientific reference values: the formulas are ordinary salts whose
reading (status ok) is checked elsewhere (tests/data/formula_cases.csv);
what a spreadsheet runs as a formula (a cell starting with =, +, - or @) is
common practice (OWASP, "CSV Injection").
"""
from __future__ import annotations

import unicodedata

import pyarrow as pa
import pyarrow.parquet as pq
import pytest

from ionicity import score_formula
from ionicity.pipelines.cli import main
from ionicity.scorer.grammar import MAX_FORMULA_LENGTH

BAD = b"K\xffCl"  # 0xFF never occurs in UTF-8


def _table_with_a_bad_cell(tmp_path, kind=pa.binary()):
    path = tmp_path / "bytes.parquet"
    pq.write_table(pa.table({"formula": pa.array([b"NaCl", BAD, None, b"KBr"], type=kind),
                             "label": ["salt", "typo", "empty", "bromide"]}), path)
    return path


def _check_rows(status, message):
    assert status == ["ok", "error", "error", "ok"]
    assert "not valid UTF-8" in message[1]


@pytest.mark.parametrize("kind", [pa.binary(), pa.large_binary()])
def test_attack_a_bytes_cell_that_is_not_utf8_is_that_rows_error(tmp_path, kind):
    # attack 8: a binary formula column with invalid UTF-8 was an internal error (exit 3), the whole file refused
    src = _table_with_a_bad_cell(tmp_path, kind)
    out = tmp_path / "out.parquet"
    assert main(["score", str(src), "-o", str(out), "--quiet", "--name-col", "label"]) == 0
    table = pq.read_table(out)
    assert table.column("formula").to_pylist() == [b"NaCl", BAD, None, b"KBr"]  # passed through unchanged
    _check_rows(table.column("status").to_pylist(), table.column("message").to_pylist())
    assert "(row named 'typo')" in table.column("message")[1].as_py()


def test_attack_a_bytes_cell_that_is_not_utf8_goes_to_a_csv_output_marked(tmp_path):
    # a text file cannot carry the bytes: the bad byte is written as U+FFFD, the row is an error
    out = tmp_path / "out.csv"
    assert main(["score", str(_table_with_a_bad_cell(tmp_path)), "-o", str(out), "--quiet"]) == 0
    lines = out.read_text(encoding="utf-8").splitlines()
    assert len(lines) == 5 and lines[2].startswith('"K\ufffdCl","typo","error"')


@pytest.mark.slow
def test_attack_a_bytes_cell_that_is_not_utf8_on_the_dask_engine(tmp_path):
    pytest.importorskip("distributed")
    out = tmp_path / "out.parquet"
    assert main(["score", str(_table_with_a_bad_cell(tmp_path)), "-o", str(out), "--quiet", "--engine", "dask",
                 "--workers", "1"]) == 0
    table = pq.read_table(out)
    _check_rows(table.column("status").to_pylist(), table.column("message").to_pylist())


def test_attack_the_length_limit_holds_after_normalisation():
    # attack 9: 200 characters of U+216B (ROMAN NUMERAL TWELVE) passed the length
    # check and became 600 characters of grammar input (NFKC: Unicode Standard Annex #15)
    twelve = "\u216b"
    assert unicodedata.normalize("NFKC", twelve) == "XII"
    record = score_formula(twelve * MAX_FORMULA_LENGTH)
    assert record["status"] == "error"
    assert "600 characters long once normalised" in record["message"]
    assert len(record["message"]) < 200
