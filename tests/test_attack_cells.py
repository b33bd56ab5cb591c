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

import pandas as pd
import pyarrow as pa
import pyarrow.parquet as pq
import pytest

from ionicity import score_formula, score_table
from ionicity.pipelines.batch_assembly import fitted_messages
from ionicity.pipelines.cli import main
from ionicity.scorer.grammar import MAX_FORMULA_LENGTH
from ionicity.scorer.verdict import FORMULA_STARTS, MESSAGE_MAX_CHARS, fit_message

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


# ------------------------------------------------------------------ messages

# a mixture whose three iodides each get a redox warning: a 719-character message
# (the warnings' potentials are the scorer's table's, scorer/data/redox_potentials.csv)
LONG_MESSAGE_MIXTURE = "CuI2-FeI3-NaCl-KCl-CuBr2-AgI-TlI3-AuI3-PbI4-MnI4-SnI4-CoI3"


def test_attack_messages_are_capped_and_explain_keeps_the_whole_text(tmp_path, capsys):
    # attack 9: messages reached 20 kB
    whole = score_formula(LONG_MESSAGE_MIXTURE)["message"]
    assert len(whole) > MESSAGE_MAX_CHARS
    src = tmp_path / "in.csv"
    src.write_text(f"formula,label\n{LONG_MESSAGE_MIXTURE},long\nXx2O,{'n' * 20000}\nNaCl,short\n")
    out = tmp_path / "out.parquet"
    assert main(["score", str(src), "-o", str(out), "--quiet", "--name-col", "label"]) == 0
    messages = pq.read_table(out).column("message").to_pylist()
    assert all(len(m) <= MESSAGE_MAX_CHARS for m in messages)
    assert messages[0].startswith(whole[:100]) and messages[0].endswith("ionicity explain shows the whole text)")
    assert messages[1].startswith("unknown element") and "cut: 200" in messages[1]
    assert messages[2] == ""
    assert main(["explain", LONG_MESSAGE_MIXTURE]) == 0
    assert whole in capsys.readouterr().out
    # the pandas API caps alike
    frame = score_table(pd.DataFrame({"formula": [LONG_MESSAGE_MIXTURE]}))
    assert frame["message"][0] == messages[0]


@pytest.mark.parametrize("start", ["=", "+", "-", "@", "\t", "\r"])
def test_attack_no_message_cell_starts_like_a_spreadsheet_formula(start):
    # attack 9: generated text must never start with =, +, - or @; the guard
    # sits where every engine writes the message column
    text = start + "1+1"
    fitted = fitted_messages(pa.array([text, "fine", text, None]).dictionary_encode()).to_pylist()
    assert fitted == ["'" + text, "fine", "'" + text, None]
    assert fit_message(text) == "'" + text


def test_no_message_of_the_reference_formulas_needs_the_guard():
    # the scorer's own messages start with words or a quote; the guard is for what is not ours
    import csv
    from pathlib import Path

    with open(Path(__file__).parent / "data" / "formula_cases.csv", encoding="utf-8") as f:
        texts = [row["formula"] for row in csv.DictReader(f)]
    assert len(texts) > 400
    for text in texts:
        message = score_formula(text)["message"]
        assert not message.startswith(FORMULA_STARTS) and len(message) <= MESSAGE_MAX_CHARS, (text, message)
