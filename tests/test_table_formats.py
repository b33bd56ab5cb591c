"""Tables as people keep them: typed CSV, delimiters and encodings, .xlsx in
and out, chosen columns, significant digits, formula order."""
from __future__ import annotations

import csv
import re

import pyarrow as pa
import pyarrow.parquet as pq
import pytest

from ionicity.pipelines.cli import main
from ionicity.pipelines.column_types import ColumnTyper, TypeFallback, infer_types
from ionicity.pipelines.config import ScoreConfig
from ionicity.pipelines.errors import InputError, install_hint
from ionicity.pipelines.run import score_file
from ionicity.scorer.columns import column_groups, output_columns
from ionicity.scorer.record import score_formula


def _score(tmp_path, text: bytes, out: str, name="in.csv", **options):
    src = tmp_path / name
    src.write_bytes(text)
    dest = tmp_path / out
    summary = score_file(ScoreConfig(input=str(src), output=str(dest), quiet=True, workers=1, **options))
    return dest, summary


def test_csv_to_parquet_keeps_integer_float_boolean_and_text_types(tmp_path):
    text = b"formula,qty,mp_K,dry,code,label\nNaCl,3,1074.0,true,007,a\nKBr,,1007.5,FALSE,12,b\nMgO,-2,3098,,x,c\n"
    dest, _ = _score(tmp_path, text, "out.parquet")
    table = pq.read_table(dest)
    types = {n: table.schema.field(n).type for n in ("formula", "qty", "mp_K", "dry", "code", "label")}
    assert types == {"formula": pa.string(), "qty": pa.int64(), "mp_K": pa.float64(), "dry": pa.bool_(),
                     "code": pa.string(), "label": pa.string()}
    assert table.column("qty").to_pylist() == [3, None, -2]
    assert table.column("dry").to_pylist() == [True, False, None]
    assert table.column("code").to_pylist() == ["007", "12", "x"]  # a code with a leading zero stays text
    # and back: Parquet -> CSV writes the typed values
    back = tmp_path / "back.csv"
    score_file(ScoreConfig(input=str(dest), output=str(back), quiet=True, workers=1, prefix="again_"))
    rows = list(csv.DictReader(back.open()))
    assert [r["qty"] for r in rows] == ["3", "", "-2"] and rows[0]["mp_K"] == "1074"


def test_keep_text_and_csv_output_keep_cells_as_written(tmp_path):
    text = b"formula,qty\nNaCl,3.50\nKBr,1e3\n"
    dest, _ = _score(tmp_path, text, "out.parquet", keep_text=True)
    assert pq.read_table(dest).column("qty").to_pylist() == ["3.50", "1e3"]
    dest, _ = _score(tmp_path, text, "out.csv")
    assert [r["qty"] for r in csv.DictReader(dest.open())] == ["3.50", "1e3"]


def test_column_turning_non_numeric_after_the_sample_loses_no_row(tmp_path):
    rows = 150_000  # past the 1 MiB head, whose first 256 KiB are the sample types are inferred from
    text = "formula,qty\n" + "".join(f"NaCl,{i}\n" for i in range(rows)) + "KCl,n/a\n"
    dest, summary = _score(tmp_path, text.encode(), "out.parquet")
    table = pq.read_table(dest)
    assert table.num_rows == rows + 1
    assert table.schema.field("qty").type == pa.string()
    assert table.column("qty")[-1].as_py() == "n/a" and table.column("qty")[5].as_py() == "5"
    assert any("'qty' kept as text" in n and "n/a" in n for n in summary.notes)
    assert "note: column 'qty' kept as text" in str(summary)


def test_typer_refuses_a_misfit_and_names_its_row():
    types = infer_types(pa.record_batch({"n": ["1", "2"]}))
    typer = ColumnTyper(pa.schema([("n", pa.string())]), types)
    typer.convert(pa.record_batch({"n": ["3", ""]}))
    with pytest.raises(TypeFallback) as caught:
        typer.convert(pa.record_batch({"n": ["4", "four"]}))
    assert "row 4" in caught.value.note and "'four'" in caught.value.note


def test_semicolon_csv_is_read_without_options(tmp_path):
    dest, summary = _score(tmp_path, b'name;formula;amount\n"a;b";NaCl;1,5\nc;KBr;2\n', "out.csv")
    rows = list(csv.DictReader(dest.open()))
    assert [r["formula"] for r in rows] == ["NaCl", "KBr"] and rows[0]["name"] == "a;b"
    assert rows[0]["amount"] == "1,5" and summary.ok == 2


def test_tab_separated_csv_and_sep_option(tmp_path):
    dest, _ = _score(tmp_path, b"formula\tname\nNaCl\tx\n", "out.csv")
    assert next(csv.DictReader(dest.open()))["name"] == "x"
    dest, _ = _score(tmp_path, b"formula|name\nNaCl|x\n", "out2.csv", sep="|")
    assert next(csv.DictReader(dest.open()))["name"] == "x"


def test_latin1_needs_encoding_and_the_error_names_it(tmp_path, capsys):
    src = tmp_path / "latin.csv"
    src.write_bytes("formula,name\nNaCl,sel de cuisine caf\xe9\n".encode("latin-1"))
    # read as UTF-8, the cell is not text: that row's error, whose message names the option
    assert main(["score", str(src), "-o", str(tmp_path / "o.csv"), "--quiet", "--workers", "1"]) == 0
    row = next(csv.DictReader((tmp_path / "o.csv").open(encoding="utf-8")))
    assert row["status"] == "error" and "--encoding latin-1" in row["message"]
    assert main(["score", str(src), "-o", str(tmp_path / "l.csv"), "--quiet", "--workers", "1", "--encoding", "latin-1"]) == 0
    assert next(csv.DictReader((tmp_path / "l.csv").open(encoding="utf-8")))["name"] == "sel de cuisine café"
    win = tmp_path / "win.csv"
    win.write_bytes("formula,name\nNaCl,\u201cquoted\u201d\n".encode("cp1252"))
    assert main(["score", str(win), "-o", str(tmp_path / "w.csv"), "--quiet", "--workers", "1", "--encoding", "cp1252"]) == 0
    assert "\u201cquoted\u201d" in (tmp_path / "w.csv").read_text(encoding="utf-8")
    assert main(["score", str(win), "--encoding", "ebcdic"]) == 2
    assert "--encoding must be one of" in capsys.readouterr().err


def test_xlsx_in_and_out(tmp_path):
    openpyxl = pytest.importorskip("openpyxl")
    pd = pytest.importorskip("pandas")
    wb = openpyxl.Workbook()
    ws = wb.active
    ws.append(["formula", "qty", "price", "flag", "note"])
    ws.append(["NaCl", 3, 2.5, True, "a"])
    ws.append(["TiCl4", 4, 1.0, False, None])
    other = wb.create_sheet("second")
    other.append(["formula"])
    other.append(["KBr"])
    src = tmp_path / "stock.xlsx"
    wb.save(src)
    out = tmp_path / "scored.xlsx"
    score_file(ScoreConfig(input=str(src), output=str(out), quiet=True, workers=1))
    frame = pd.read_excel(out)
    assert frame["formula"].tolist() == ["NaCl", "TiCl4"]
    assert frame["qty"].tolist() == [3, 4] and frame["flag"].tolist() == [True, False]
    assert frame["formula_normalized"].tolist() == ["NaCl", "TiCl4"]
    parquet = tmp_path / "second.parquet"
    score_file(ScoreConfig(input=str(src), output=str(parquet), quiet=True, workers=1, sheet="second"))
    assert pq.read_table(parquet).column("formula").to_pylist() == ["KBr"]
    score_file(ScoreConfig(input=str(src), output=str(tmp_path / "p.parquet"), quiet=True, workers=1, sheet="2"))
    with pytest.raises(InputError, match="numbered from 1"):
        score_file(ScoreConfig(input=str(src), output=str(tmp_path / "q.csv"), quiet=True, workers=1, sheet="3"))


def test_xlsx_cells_never_become_formulas(tmp_path):
    openpyxl = pytest.importorskip("openpyxl")
    dest, _ = _score(tmp_path, b"formula,note\nNaCl,=1+2\nKCl,@SUM(A1)\nKBr,+x\nLiF,-y\n", "out.xlsx")
    sheet = openpyxl.load_workbook(dest).active
    notes = [sheet.cell(row=r, column=2) for r in range(2, 6)]
    assert [c.value for c in notes] == ["=1+2", "@SUM(A1)", "+x", "-y"]
    assert all(c.data_type == "s" for c in notes)


def test_xlsx_row_limit_is_a_clear_error(tmp_path, monkeypatch, capsys):
    pytest.importorskip("openpyxl")
    from ionicity.pipelines import xlsx_io

    monkeypatch.setattr(xlsx_io, "MAX_ROWS", 3)
    src = tmp_path / "in.csv"
    src.write_text("formula\nNaCl\nKCl\nKBr\n")
    out = tmp_path / "out.xlsx"
    assert main(["score", str(src), "-o", str(out), "--quiet", "--workers", "1"]) == 2
    assert "at most" in capsys.readouterr().err and not out.exists()


def test_chosen_columns_write_only_those(tmp_path, capsys):
    dest, _ = _score(tmp_path, b"formula,label\nNaCl,a\nTiCl4,b\n", "out.parquet", columns=["melting", "cations"])
    names = pq.read_schema(dest).names
    assert names == ["formula", "label", "status", "message", "cations", *column_groups()["melting"]]
    full = score_formula("NaCl")
    table = pq.read_table(dest)
    assert table.column("melting_class")[0].as_py() == full["melting_class"]
    with pytest.raises(InputError, match="neither a column nor a group"):
        _score(tmp_path, b"formula\nNaCl\n", "x.csv", columns=["no_such"])
    assert main(["columns", "--groups"]) == 0
    listing = capsys.readouterr().out
    assert all(g in listing for g in ("composition", "character", "fajans", "hsab", "lattice", "melting", "water"))


def test_every_descriptor_module_names_its_group():
    from ionicity.scorer.columns import descriptor_modules

    assert all(isinstance(getattr(m, "GROUP", None), str) for m in descriptor_modules())
    grouped = [n for names in column_groups().values() for n in names]
    assert sorted(grouped) == sorted(c.name for c in output_columns())


def _significant(cell: str) -> int:
    mantissa = cell.lstrip("-").split("e")[0].split("E")[0].replace(".", "").lstrip("0")
    return len(mantissa.rstrip("0")) if "." not in cell else len(mantissa)


def test_demo_output_carries_no_float_noise(tmp_path):
    src = "datasets/demo/inventory.csv"
    dest = tmp_path / "demo.csv"
    score_file(ScoreConfig(input=src, output=str(dest), quiet=True, workers=1))
    digits = {c.name: c.digits for c in output_columns() if c.dtype == "float64"}
    noise = re.compile(r"(0000|9999)\d$")
    checked = 0
    for row in csv.DictReader(dest.open(encoding="utf-8")):
        for name, d in digits.items():
            cell = row[name]
            if cell:
                checked += 1
                assert not noise.search(cell.split("e")[0]), (name, cell)
                assert _significant(cell) <= d, (name, cell)
    assert checked > 100


def test_full_precision_keeps_every_digit(tmp_path):
    dest, _ = _score(tmp_path, b"formula\nNaCl\n", "out.parquet", full_precision=True)
    value = pq.read_table(dest).column("lattice_energy_vbt_kJ_mol")[0].as_py()
    assert value == score_formula("NaCl")["lattice_energy_vbt_kJ_mol"]
    dest, _ = _score(tmp_path, b"formula\nNaCl\n", "round.parquet")
    rounded = pq.read_table(dest).column("lattice_energy_vbt_kJ_mol")[0].as_py()
    assert rounded == float(f"{value:.4g}")


# IUPAC Red Book 2005 (Nomenclature of Inorganic Chemistry), IR-4.4.2.1 and
# Table VI (the element sequence): the electropositive constituent first;
# Hill order (Hill, J. Am. Chem. Soc. 1900, 22, 478) for carbon compounds.
# The written forms are the usual handbook spellings (from memory).
@pytest.mark.parametrize("text, expected", [
    ("TiCl4", "TiCl4"), ("Cl4Ti", "TiCl4"), ("SiO2", "SiO2"), ("O2Si", "SiO2"), ("SF6", "SF6"), ("F6S", "SF6"),
    ("CCl4", "CCl4"), ("C6H12O6", "C6H12O6"), ("NH3", "NH3"), ("H2O", "H2O"), ("XeF4", "XeF4"),
    ("OF2", "OF2"), ("Cl2O7", "Cl2O7"), ("P4O10", "P4O10"),
])
def test_formula_order(text, expected):
    assert score_formula(text)["formula_normalized"] == expected


def test_install_hint_works_from_a_clone_and_from_the_index():
    hint = install_hint("dask", "dask distributed")
    assert 'pip install "ionicity[dask]"' in hint and 'pip install -e ".[dask]"' in hint


def test_value_notes_are_short_codes_in_output_files_and_long_with_full_precision(tmp_path, capsys):
    from ionicity.scorer.note_codes import NOTE_CODES, short_notes

    long_text = score_formula("Na2SO4")["value_notes"]
    assert "no HSAB hardness for SO4(2-)" in long_text  # the API keeps the long text
    dest, _ = _score(tmp_path, b"formula\nNa2SO4\n", "out.csv")
    cell = next(csv.DictReader(dest.open()))["value_notes"]
    assert cell == short_notes(long_text) and "hsab_no_IA(SO4(2-))" in cell and len(cell) < len(long_text) / 2
    dest, _ = _score(tmp_path, b"formula\nNa2SO4\n", "full.csv", full_precision=True)
    assert next(csv.DictReader(dest.open()))["value_notes"] == long_text
    # a note no entry knows passes through unchanged, its neighbours coded
    assert short_notes("something new; Born-Lande/Born-Mayer: need a binary salt (one cation and one anion) or a measured structure") == (
        "something new; born_not_binary")
    codes = [c for c, _, _ in NOTE_CODES]
    assert len(codes) == len(set(codes))
    assert main(["columns", "--notes"]) == 0
    listing = capsys.readouterr().out
    assert all(c in listing for c in codes)


def test_demo_value_notes_are_short():
    from ionicity.scorer.note_codes import short_notes

    rows = list(csv.DictReader(open("datasets/demo/inventory.csv", encoding="utf-8")))
    notes = [score_formula(r["formula"])["value_notes"] or "" for r in rows]
    before = sum(map(len, notes))
    after = sum(len(short_notes(n)) for n in notes)
    assert after < before / 3
