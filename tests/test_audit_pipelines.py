"""first_row_same_compound across streamed batches, in score_table, and the
--summary JSON (pipelines/duplicates.py, pipelines/audit_summary.py). Properties of our own
bookkeeping (common practice: a duplicate is the same normalised formula); no scientific reference values."""
from __future__ import annotations

import json

import pandas as pd
import pyarrow as pa
import pyarrow.parquet as pq

from ionicity.pipelines.cli import main
from ionicity.pipelines.duplicates import FirstRows
from ionicity.pipelines.run import score_file
from ionicity.pipelines.table import score_table

# the same compound spelled several ways (a slip, a space for the dot, Unicode
# subscripts); row numbers 1-based, header not counted
FORMULAS = ["NaCl", "KN03", "CuSO4·5H2O", "KNO3", "Xx", "Na Cl", "CuSO4 5H2O", "CuSO4", None, "NaCl", "Na₂SO₄", "Na2SO4"]
FIRST = [None, None, None, 2, None, 1, 3, None, None, 1, None, 11]


def test_first_rows_across_small_batches(tmp_path):
    src, out = tmp_path / "in.parquet", tmp_path / "out.parquet"
    pq.write_table(pa.table({"formula": FORMULAS}), src)
    score_file(str(src), str(out), quiet=True, batch_rows=2, workers=1)
    assert pq.read_table(out).column("first_row_same_compound").to_pylist() == FIRST


def test_first_rows_in_score_table():
    out = score_table(pd.DataFrame({"formula": FORMULAS}))
    got = [None if pd.isna(v) else int(v) for v in out["first_row_same_compound"]]
    assert got == FIRST


def test_first_rows_survive_a_rebuilt_dictionary():
    # the cache rebuilds its dictionaries when it evicts: the codes change, the rows do not
    seen = FirstRows()
    seen.column(pa.array(["A", "B"]).dictionary_encode())
    again = pa.DictionaryArray.from_arrays(pa.array([0, 1, 0], pa.int32()), pa.array(["B", "C"]))
    assert seen.column(again).to_pylist() == [2, None, 2]
    assert len(seen) == 3


def test_summary_json(tmp_path, capsys):
    src = tmp_path / "in.csv"
    pd.DataFrame({
        "label": ["salt", "nitre", "nitre again", "mystery", "acid", "blue"],
        "formula": ["NaCl", "KN03", "KNO3", "Xx", "HCl 37%", "CUSO4"],
    }).to_csv(src, index=False)
    summary_path = tmp_path / "audit.json"
    assert main(["score", str(src), "-o", str(tmp_path / "out.csv"), "--name-col", "label",
                 "--summary", str(summary_path), "--quiet"]) == 0
    report = json.loads(summary_path.read_text())
    assert report["rows"] == 6
    assert report["status"] == {"ok": 3, "warning": 2, "error": 1}
    assert report["slip_kind"] == {"leading_zero": 1, "letter_case": 1}
    assert report["solutions"] == 1
    assert report["duplicates"]["rows_repeating_a_compound"] == 1
    assert report["needs_attention"]["error"][0] == {
        "row": 4, "formula": "Xx", "name": "mystery", "message": "unknown element 'Xx' at position 1 of 'Xx' (row named 'mystery')",
        # with --name-col the name is read against the formula too (scorer.name_check)
        "name_check": "name_unread",
    }
    assert report["needs_attention"]["duplicate"][0]["first_row_same_compound"] == 2
    # an existing summary is not replaced without --overwrite: exit 2, one line
    assert main(["score", str(src), "-o", str(tmp_path / "out2.csv"), "--summary", str(summary_path), "--quiet"]) == 2
    assert "exists" in capsys.readouterr().err
