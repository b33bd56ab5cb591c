"""ionicity.pipelines.io: streaming readers, the temp-then-rename writer, stale partials.

The reference for what a CSV cell holds is RFC 4180 (Shafranovich, "Common
Format and MIME Type for Comma-Separated Values (CSV) Files", IETF, 2005):
quoted cells may hold commas, doubled quotes and line breaks. That is the
only outside source; the rest checks properties of our own code (no row
lost, nothing half-written).
"""
from __future__ import annotations

import io
import os
import stat
import subprocess
import sys

import pyarrow as pa
import pyarrow.parquet as pq
import pytest

from ionicity.pipelines.errors import InputError
from ionicity.pipelines.io import TableWriter, format_of, open_reader
from ionicity.pipelines.output_paths import clean_stale_partials, partial_path


def _read_all(path, batch_rows=65536):
    reader = open_reader(str(path), batch_rows)
    return pa.Table.from_batches(list(reader.batches), schema=reader.schema)


def test_format_of():
    assert format_of("a.csv") == "csv"
    assert format_of("a.TSV") == "tsv"
    assert format_of("a.parquet") == "parquet"
    assert format_of("-") == "csv"
    assert format_of("parts/*.parquet") == "parquet"
    assert format_of("a.xlsx") == "xlsx"
    with pytest.raises(InputError, match="extension"):
        format_of("a.ods")


def test_csv_cells_pass_through_as_text(tmp_path):
    # RFC 4180 section 2: quoted commas, doubled quotes and line breaks
    path = tmp_path / "in.csv"
    path.write_bytes(
        'formula,code,note\n'
        'NaCl,007,"a, b"\n'
        'KCl,,"say ""hi"""\n'
        'CuSO4·5H2O,1e3,"two\nlines"\n'
        '[C4mim][BF4], 12 ,ünïcödé ✓\n'.encode()
    )
    table = _read_all(path)
    assert table.schema.types == [pa.string()] * 3
    assert table.column("code").to_pylist() == ["007", "", "1e3", " 12 "]
    assert table.column("note").to_pylist() == ["a, b", 'say "hi"', "two\nlines", "ünïcödé ✓"]
    assert table.column("formula").to_pylist()[2] == "CuSO4·5H2O"


def test_batches_are_bounded(tmp_path):
    path = tmp_path / "in.csv"
    path.write_text("formula\n" + "NaCl\n" * 1000)
    reader = open_reader(str(path), batch_rows=128)
    sizes = [b.num_rows for b in reader.batches]
    assert max(sizes) <= 128 and sum(sizes) == 1000


def test_utf8_bom_is_not_part_of_the_header(tmp_path):
    path = tmp_path / "in.csv"
    path.write_bytes(b"\xef\xbb\xbfformula,x\nNaCl,1\n")
    assert open_reader(str(path)).schema.names == ["formula", "x"]


@pytest.mark.parametrize(
    "content, match",
    [
        (b"", "empty"),
        (b"\n\n  \n", "empty"),
        ("formul\xe9,x\nNaCl,1\n".encode("latin-1"), "UTF-8"),
        ("formula,x\nNaCl,1\n".encode("utf-16"), "UTF-16"),
        (b"formula,formula\nNaCl,KCl\n", "duplicate column"),
        (b"formula,\nNaCl,KCl\n", "empty name"),
    ],
)
def test_unreadable_csv_is_an_input_error(tmp_path, content, match):
    path = tmp_path / "in.csv"
    path.write_bytes(content)
    with pytest.raises(InputError, match=match):
        list(_read_all(path).column(0))


def test_bad_bytes_after_the_first_megabyte_are_that_rows_problem(tmp_path):
    # a cell that is not UTF-8 is its row's error (tests/test_attack_text_cells.py), wherever it is in the file
    path = tmp_path / "in.csv"
    path.write_bytes(b"formula\n" + b"NaCl\n" * 400_000 + "café\n".encode("latin-1"))
    reader = open_reader(str(path))
    assert sum(b.num_rows for b in reader.batches) == 400_001
    assert reader.bad_rows.count == 1 and reader.bad_rows.first_row == 400_001


def test_ragged_row_is_an_input_error(tmp_path):
    path = tmp_path / "in.csv"
    path.write_bytes(b"formula,x\nNaCl,1\nKCl,2,3\n")
    with pytest.raises(InputError, match="columns"):
        _read_all(path)


def test_missing_input(tmp_path):
    with pytest.raises(InputError, match="does not exist"):
        open_reader(str(tmp_path / "nope.csv"))
    with pytest.raises(InputError, match="does not exist"):
        open_reader(str(tmp_path / "nope.parquet"))


def test_stdin_is_streamed_and_replayed(monkeypatch):
    # more than the 1 MiB head, so the head and the rest must be stitched back together
    rows = [f"F{i},{'é' * (i % 5)}" for i in range(300_000)]
    data = ("formula,x\n" + "\n".join(rows) + "\n").encode()
    assert len(data) > (1 << 20)
    monkeypatch.setattr(sys, "stdin", io.TextIOWrapper(io.BytesIO(data), encoding="utf-8"))
    reader = open_reader("-")
    table = pa.Table.from_batches(list(reader.batches), schema=reader.schema)
    assert table.num_rows == 300_000
    assert table.column("formula").to_pylist()[-1] == "F299999"
    assert table.column("x").to_pylist()[:6] == ["", "é", "éé", "ééé", "éééé", ""]


def test_parquet_folder_and_glob(tmp_path):
    folder = tmp_path / "parts"
    folder.mkdir()
    for i in range(3):
        pq.write_table(pa.table({"formula": [f"F{i}a", f"F{i}b"], "n": [i, i]}), folder / f"part-{i}.parquet")
    (folder / "_SUCCESS").write_text("")
    assert _read_all(folder).column("formula").to_pylist() == ["F0a", "F0b", "F1a", "F1b", "F2a", "F2b"]
    reader = open_reader(str(folder / "part-*.parquet"))
    assert reader.total_rows == 6
    assert reader.schema.field("n").type == pa.int64()


def test_parquet_parts_must_share_a_schema(tmp_path):
    pq.write_table(pa.table({"formula": ["a"]}), tmp_path / "a.parquet")
    pq.write_table(pa.table({"formula": [1]}), tmp_path / "b.parquet")
    with pytest.raises(InputError, match="different schema"):
        open_reader(str(tmp_path))


def test_not_parquet(tmp_path):
    path = tmp_path / "x.parquet"
    path.write_text("formula\nNaCl\n")
    with pytest.raises(InputError, match="Parquet"):
        open_reader(str(path))


def _partials(folder):
    return [n for n in os.listdir(folder) if n.startswith(".ionicity-")]


def test_writer_commits_by_rename(tmp_path):
    schema = pa.schema([("formula", pa.string())])
    out = tmp_path / "out.parquet"
    writer = TableWriter(str(out), schema, metadata={"k": "v"})
    writer.write(pa.record_batch([pa.array(["NaCl"])], schema=schema))
    assert not out.exists() and len(_partials(tmp_path)) == 1
    writer.commit()
    assert _partials(tmp_path) == []
    assert pq.read_table(out).column("formula").to_pylist() == ["NaCl"]
    assert pq.read_schema(out).metadata[b"k"] == b"v"


def test_writer_abort_leaves_nothing(tmp_path):
    schema = pa.schema([("formula", pa.string())])
    writer = TableWriter(str(tmp_path / "out.csv"), schema)
    writer.write(pa.record_batch([pa.array(["NaCl"])], schema=schema))
    writer.abort()
    assert os.listdir(tmp_path) == []


def test_output_file_follows_the_umask(tmp_path):
    # a temp file is created 0600; the committed output must not keep that
    old = os.umask(0o022)
    try:
        schema = pa.schema([("formula", pa.string())])
        writer = TableWriter(str(tmp_path / "out.csv"), schema)
        writer.commit()
    finally:
        os.umask(old)
    assert stat.S_IMODE(os.stat(tmp_path / "out.csv").st_mode) == 0o644


def test_writer_refusals(tmp_path):
    schema = pa.schema([("formula", pa.string())])
    existing = tmp_path / "out.csv"
    existing.write_text("keep me")
    with pytest.raises(InputError, match="--overwrite"):
        TableWriter(str(existing), schema)
    with pytest.raises(InputError, match="is .*the input"):
        TableWriter(str(existing), schema, overwrite=True, inputs=(str(existing),))
    with pytest.raises(InputError, match="does not exist"):
        TableWriter(str(tmp_path / "no" / "out.csv"), schema)
    with pytest.raises(InputError, match="directory"):
        TableWriter(str(tmp_path), schema)
    assert existing.read_text() == "keep me"


def test_stale_partials_of_dead_processes_are_removed(tmp_path):
    dead = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"], capture_output=True, text=True)
    dead_pid = int(dead.stdout)
    mine = partial_path(str(tmp_path))
    stale = mine.replace(f"-{os.getpid()}@", f"-{dead_pid}@")
    other_host = os.path.join(tmp_path, f".ionicity-{dead_pid}@elsewhere-host.0123abcd.partial")
    unrelated = os.path.join(tmp_path, ".ionicity-notes.partial")
    for path in (mine, stale, other_host, unrelated):
        open(path, "w").close()
    os.mkdir(stale + "dir")  # not our pattern: left alone
    removed = clean_stale_partials(str(tmp_path))
    assert removed == [stale]
    assert os.path.exists(mine) and os.path.exists(other_host) and os.path.exists(unrelated)


def test_a_grown_dictionary_is_shared_across_a_row_group(tmp_path):
    # A scorer's cache only appends to its dictionaries, so an earlier
    # batch's dictionary is a prefix of a later one's; the writer then gives
    # the row group one dictionary. A dictionary that is not a prefix (here
    # reordered) is left as it is. Either way every cell reads back unchanged.
    kind = pa.dictionary(pa.int32(), pa.string())
    schema = pa.schema([pa.field("label", kind)])
    grown = pa.array(["ok", "warning", "error"])
    batches = [
        pa.record_batch([pa.DictionaryArray.from_arrays(pa.array([0, 0, None], pa.int32()), grown.slice(0, 1))], schema=schema),
        pa.record_batch([pa.DictionaryArray.from_arrays(pa.array([1, 0], pa.int32()), pa.array(["warning", "ok"]))], schema=schema),
        pa.record_batch([pa.DictionaryArray.from_arrays(pa.array([2, 1], pa.int32()), grown)], schema=schema),
    ]
    from ionicity.pipelines.table_writer import _share_dictionaries

    shared = _share_dictionaries(batches)
    assert shared[0].column(0).dictionary.equals(grown)
    assert shared[1].column(0).dictionary.to_pylist() == ["warning", "ok"]
    for before, after in zip(batches, shared):
        assert after.column(0).to_pylist() == before.column(0).to_pylist()
    out = tmp_path / "out.parquet"
    writer = TableWriter(str(out), schema, row_group_rows=100)
    for batch in batches:
        writer.write(batch)
    writer.commit()
    assert pq.read_table(out).column("label").to_pylist() == [v for b in batches for v in b.column(0).to_pylist()]


def test_parquet_formulas_come_dictionary_encoded_unless_mostly_distinct(tmp_path):
    # Few distinct values: the stored dictionary is handed over as it is.
    # Mostly distinct ones (the writer gave up its dictionary part-way): the
    # part is read plainly. The values are the file's either way.
    few = tmp_path / "few.parquet"
    many = tmp_path / "many.parquet"
    repeated = [f"Na{i % 7}Cl" for i in range(5000)]
    distinct = [f"Na{i}Cl" for i in range(5000)]
    pq.write_table(pa.table({"formula": repeated}), few)
    pq.write_table(pa.table({"formula": distinct}), many, dictionary_pagesize_limit=2000)
    for path, values, kind in ((few, repeated, pa.types.is_dictionary), (many, distinct, pa.types.is_string)):
        reader = open_reader(str(path), 1000)
        reader.read_dictionary = ("formula",)
        batches = list(reader.batches)
        assert all(kind(b.schema.field("formula").type) for b in batches)
        got = [v for b in batches for v in b.column(0).cast(pa.string()).to_pylist()]
        assert got == values


def test_io_still_names_the_one_input_error():
    # melting_fit and user code catch ionicity.pipelines.io.InputError; it must
    # be the class every reader, the config and the command line raise
    import ionicity
    import ionicity.pipelines.io as io_module

    assert io_module.InputError is InputError is ionicity.InputError
    with pytest.raises(io_module.InputError):
        open_reader("no-such-file.csv")
