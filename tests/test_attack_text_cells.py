"""Attack 8 on text tables: a CSV or TSV cell whose bytes are not UTF-8
refused the whole file (exit 2). Now it is that row's error: status
``error``, a message naming the data row, the column and the byte, the
other columns kept (bad bytes written as U+FFFD), the rest of the file
scored, on the local engine (files and standard input) and the Dask engine
alike. A whole file in another encoding gets the same per-row messages and a
summary line that name ``--encoding``.

Reference facts: which byte sequences are valid UTF-8 follows RFC 3629 (Yergeau 2003,
"UTF-8, a transformation format of ISO 10646", section 4), as Python's codec implements it;
U+FFFD is the Unicode replacement character (The Unicode Standard, chapter 3, "U+FFFD
Substitution"). The five bytes Windows-1252 leaves undefined (0x81, 0x8D, 0x8F, 0x90, 0x9D)
are those of its code table as Python's cp1252 codec implements it (source: the codec's
decoding table, Lib/encodings/cp1252.py). No chemistry value is checked here.

No scientific reference values: the formulas are ordinary salts whose
reading (status ok) is checked elsewhere (tests/data/formula_cases.csv);
that 0xFF never occurs in UTF-8 and 0xE9 is "é" in Latin-1 is from the
standards (RFC 3629, section 1; ISO/IEC 8859-1 code table).
"""
from __future__ import annotations

import csv
import io
import os
import subprocess
import sys
from pathlib import Path

import pyarrow.parquet as pq
import pytest

from ionicity.pipelines.cli import main

ROOT = Path(__file__).resolve().parents[1]

# row 2: a formula cell that is not UTF-8; row 3: a name cell in Latin-1; row 4: both
BAD_CSV = b"formula,name\nNaCl,salt\nK\xffCl,typo\nKBr,bromure de potassium \xe9\nCa\xffF2,fluorure \xe9\nMgO,ok\n"
STATUSES = ["ok", "error", "error", "error", "ok"]


def _rows(path: Path, delimiter: str = ",") -> list[dict]:
    return list(csv.DictReader(io.StringIO(path.read_text(encoding="utf-8")), delimiter=delimiter))


def _check(rows: list[dict]) -> None:
    assert [r["status"] for r in rows] == STATUSES
    assert [r["formula"] for r in rows] == ["NaCl", "K\ufffdCl", "KBr", "Ca\ufffdF2", "MgO"]
    assert rows[2]["name"] == "bromure de potassium \ufffd"
    assert rows[1]["message"].startswith("data row 2: column 'formula' held bytes that are not valid UTF-8 text"
                                         " (byte 0xFF), written here as U+FFFD")
    assert rows[2]["message"].startswith("data row 3: column 'name' held bytes that are not valid UTF-8 text (byte 0xE9)")
    assert rows[3]["message"].startswith("data row 4: columns 'formula', 'name' held bytes")
    assert all("--encoding latin-1" in r["message"] for r in rows[1:4])
    # the row whose name was bad keeps its scores: the formula was text
    assert rows[2]["formula_normalized"] == "KBr" and rows[2]["cations"] == "K(+)*1"
    assert rows[1]["formula_normalized"] == ""


def test_attack_a_csv_cell_that_is_not_utf8_is_that_rows_error(tmp_path, capsys):
    src = tmp_path / "in.csv"
    src.write_bytes(BAD_CSV)
    out = tmp_path / "out.csv"
    assert main(["score", str(src), "-o", str(out), "--workers", "1"]) == 0
    _check(_rows(out))
    err = capsys.readouterr().err
    assert "note: 3 rows of" in err and "(first: data row 2)" in err and "--encoding latin-1" in err
    assert main(["score", str(src), "-o", str(tmp_path / "strict.csv"), "--quiet", "--strict"]) == 1


def test_attack_a_tsv_cell_that_is_not_utf8_into_parquet(tmp_path):
    src = tmp_path / "in.tsv"
    src.write_bytes(BAD_CSV.replace(b",", b"\t"))
    out = tmp_path / "out.parquet"
    assert main(["score", str(src), "-o", str(out), "--quiet", "--workers", "1"]) == 0
    table = pq.read_table(out)
    assert table.column("status").to_pylist() == STATUSES
    assert table.column("name")[2].as_py() == "bromure de potassium \ufffd"


def test_attack_a_cell_that_is_not_utf8_on_standard_input(tmp_path):
    done = subprocess.run([sys.executable, "-m", "ionicity", "score", "-", "--workers", "1"], input=BAD_CSV,
                          capture_output=True, cwd=ROOT, timeout=120)
    assert done.returncode == 0, done.stderr
    out = tmp_path / "stdout.csv"
    out.write_bytes(done.stdout)
    _check(_rows(out))
    assert b"rows of standard input held bytes" in done.stderr


def test_attack_bad_bytes_far_into_a_file_name_their_row(tmp_path):
    # past the first MiB (the head read before streaming) and past the first 4 MiB block
    src = tmp_path / "in.csv"
    src.write_bytes(b"formula\n" + b"NaCl\n" * 1_000_000 + b"K\xffCl\n" + b"KBr\n")
    out = tmp_path / "out.parquet"
    assert main(["score", str(src), "-o", str(out), "--quiet"]) == 0
    status = pq.read_table(out, columns=["status", "message"])
    assert status.num_rows == 1_000_002
    assert status.column("status")[1_000_000].as_py() == "error"
    assert status.column("message")[1_000_000].as_py().startswith("data row 1000001: column 'formula'")
    assert status.column("status")[1_000_001].as_py() == "ok"


def test_attack_a_whole_latin1_file_is_marked_and_named(tmp_path, capsys):
    # as Excel on Windows exports: every accented cell is a row error naming --encoding, until it is given
    src = tmp_path / "latin.csv"
    src.write_bytes("formula,name\nNaCl,sel\nKCl,chlorure de potassium é\nKBr,bromure é\n".encode("latin-1"))
    assert main(["score", str(src), "-o", str(tmp_path / "a.csv"), "--workers", "1"]) == 0
    assert [r["status"] for r in _rows(tmp_path / "a.csv")] == ["ok", "error", "error"]
    assert "note: 2 rows" in capsys.readouterr().err
    assert main(["score", str(src), "-o", str(tmp_path / "b.csv"), "--quiet", "--encoding", "latin-1"]) == 0
    rows = _rows(tmp_path / "b.csv")
    assert [r["status"] for r in rows] == ["ok"] * 3 and rows[2]["name"] == "bromure é"


# bytes Windows-1252 leaves undefined: 0x81, 0x8D, 0x8F, 0x90, 0x9D (the Unicode Consortium's mapping
# file CP1252.TXT marks them UNDEFINED; Python's cp1252 codec follows it); 0x80 is the euro sign there
CP1252_CSV = b"formula,name\nNaCl,caf\xe9 \x80\nK\x81Cl,a\nKBr,b\x8d\x8f\nCa\x90F2,c\x9d\nMgO,d\n"


def test_attack_an_undefined_cp1252_byte_is_that_rows_error(tmp_path, capsys):
    # before: --encoding cp1252 refused the whole file (exit 2) for one such byte
    src = tmp_path / "win.csv"
    src.write_bytes(CP1252_CSV)
    assert main(["score", str(src), "-o", str(tmp_path / "out.csv"), "--encoding", "cp1252", "--workers", "1"]) == 0
    rows = _rows(tmp_path / "out.csv")
    assert [r["status"] for r in rows] == ["ok", "error", "error", "error", "ok"]
    assert rows[0]["name"] == "caf\u00e9 \u20ac"  # the defined bytes read as Windows-1252
    assert rows[1]["formula"] == "K\ufffdCl" and rows[1]["formula_normalized"] == ""
    assert rows[1]["message"].startswith("data row 2: column 'formula' held bytes that are not valid Windows-1252"
                                         " text (byte 0x81), written here as U+FFFD")
    # the first undefined byte of the cell is named; the formula was text, so the scores stay
    assert rows[2]["name"] == "b\ufffd\ufffd" and "(byte 0x8D)" in rows[2]["message"]
    assert rows[2]["cations"] == "K(+)*1"
    assert rows[3]["message"].startswith("data row 4: columns 'formula', 'name' held bytes") and "0x90" in rows[3]["message"]
    assert all("--encoding latin-1" in r["message"] for r in rows[1:4])
    assert "note: 3 rows of" in capsys.readouterr().err


def test_attack_an_undefined_cp1252_byte_in_the_header_is_exit_2(tmp_path, capsys):
    src = tmp_path / "win.csv"
    src.write_bytes(b"formula,nom\x81\nNaCl,x\n")
    assert main(["score", str(src), "-o", str(tmp_path / "out.csv"), "--encoding", "cp1252"]) == 2
    err = capsys.readouterr().err.strip()
    assert len(err.splitlines()) == 1 and "not valid Windows-1252" in err
    assert sorted(os.listdir(tmp_path)) == ["win.csv"]


def test_attack_column_names_that_are_not_utf8_are_exit_2(tmp_path, capsys):
    src = tmp_path / "in.csv"
    src.write_bytes(b"formula,nom \xe9\nNaCl,x\n")
    assert main(["score", str(src), "-o", str(tmp_path / "out.csv")]) == 2
    err = capsys.readouterr().err.strip()
    assert len(err.splitlines()) == 1 and "not valid UTF-8" in err and "--encoding latin-1" in err
    assert sorted(os.listdir(tmp_path)) == ["in.csv"]


@pytest.mark.slow
def test_attack_a_csv_cell_that_is_not_utf8_on_the_dask_engine(tmp_path, monkeypatch, capsys):
    pytest.importorskip("distributed")
    src = tmp_path / "in.csv"
    # with blocks of 30 kB (forced below; at least 1 MB otherwise): several partitions
    src.write_bytes(BAD_CSV + b"NaCl,x\n" * 20_000 + BAD_CSV.split(b"\n", 1)[1])
    local = tmp_path / "local.parquet"
    assert main(["score", str(src), "-o", str(local), "--quiet", "--workers", "1", "--keep-text"]) == 0
    monkeypatch.setattr("ionicity.pipelines.dask_engine.csv_block_bytes", lambda path, rows: 30_000)
    for columns in ([], ["--columns", "character"]):  # with and without first_row_same_compound's first pass
        out = tmp_path / f"dask{len(columns)}.parquet"
        assert main(["score", str(src), "-o", str(out), "--engine", "dask", "--workers", "1", *columns]) == 0
        assert "partitions: 1," not in capsys.readouterr().err
        dask = pq.read_table(out, columns=["formula", "name", "status", "message"])
        expected = pq.read_table(local, columns=["formula", "name", "status", "message"])
        assert dask.to_pylist() == expected.to_pylist()
        last = dask.column("message")[20_006].as_py()
        assert last.startswith("data row 20007: column 'formula'"), last


def test_attack_a_parquet_bytes_cell_into_a_csv_output_is_marked(tmp_path):
    # a bytes column other than the formula: into CSV its bad cell was written as U+FFFD with status ok
    import pyarrow as pa

    src = tmp_path / "in.parquet"
    pq.write_table(pa.table({"formula": ["NaCl", "KBr"], "label": pa.array([b"sel", b"bromure \xe9"], pa.binary())}), src)
    out = tmp_path / "out.csv"
    assert main(["score", str(src), "-o", str(out), "--quiet", "--workers", "1"]) == 0
    rows = _rows(out)
    assert [r["status"] for r in rows] == ["ok", "error"] and rows[1]["label"] == "bromure \ufffd"
    assert rows[1]["message"].startswith("data row 2: column 'label' held bytes that are not valid UTF-8 text (byte 0xE9)")
    # into Parquet the bytes pass as they were: nothing to mark
    assert main(["score", str(src), "-o", str(tmp_path / "out.parquet"), "--quiet", "--workers", "1"]) == 0
    table = pq.read_table(tmp_path / "out.parquet")
    assert table.column("status").to_pylist() == ["ok", "ok"]
    assert table.column("label").to_pylist() == [b"sel", b"bromure \xe9"]
