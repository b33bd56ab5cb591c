"""Attacks on the command line's paths: what ionicity may replace, read or open.

Each test names the attack case it answers (from the attack on the command
line). No scientific reference values: properties of our own file handling,
whose expectations (never replace unasked, swap atomically) are common practice.

1. an output that appears during a run, two runs on one output, a dangling
   symlink at the output path, --overwrite aimed at a symlink or a folder;
2. --engine dask --overwrite aimed at a folder it did not write, and a run
   killed while it swapped an old dataset for a new one;
3. an input path holding glob characters that exists as written;
4. --mp-model aimed at a device or a FIFO.
"""
from __future__ import annotations

import errno
import os
import subprocess
import sys

import pyarrow as pa
import pyarrow.parquet as pq
import pytest

from ionicity.pipelines import io as ionicity_io
from ionicity.pipelines import local_engine
from ionicity.pipelines.cli import main
from ionicity.pipelines.errors import InputError
from ionicity.pipelines.io import TableWriter, open_reader
from ionicity.pipelines.output_paths import (
    DATASET_MARKER,
    backup_path,
    clean_stale_partials,
    is_ionicity_dataset,
)

SCHEMA = pa.schema([("formula", pa.string())])


def _writer(path, **kwargs) -> TableWriter:
    writer = TableWriter(str(path), SCHEMA, **kwargs)
    writer.write(pa.record_batch([pa.array(["NaCl"])], schema=SCHEMA))
    return writer


def _kept(folder, stem="out"):
    return sorted(n for n in os.listdir(folder) if n.startswith(stem + ".new-"))


def _dead_pid() -> int:
    done = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"], capture_output=True, text=True)
    return int(done.stdout)


# ------------------------------------------------------------------ 1. local outputs


def test_attack_output_appearing_during_the_run_is_not_replaced(tmp_path):
    # attack 1a: the output did not exist at the start, a file appears there
    # before the run ends; without --overwrite it must survive
    out = tmp_path / "out.parquet"
    writer = _writer(out)
    out.write_text("the user's file")
    with pytest.raises(InputError, match="appeared while this run was writing it") as caught:
        writer.commit()
    assert out.read_text() == "the user's file"
    kept = _kept(tmp_path)
    assert len(kept) == 1 and kept[0] in str(caught.value) and str(out) in str(caught.value)
    assert pq.read_table(tmp_path / kept[0]).column("formula").to_pylist() == ["NaCl"]
    assert not [n for n in os.listdir(tmp_path) if n.startswith(".ionicity-")]


def test_attack_two_runs_on_one_output_lose_no_result(tmp_path):
    # attack 1b: two runs started together on one output; the second to
    # finish must not replace the first's result, nor exit as if it had written
    out = tmp_path / "out.csv"
    first, second = _writer(out), _writer(out)
    first.commit()
    first_text = out.read_text()
    with pytest.raises(InputError, match="appeared"):
        second.commit()
    assert out.read_text() == first_text
    assert (tmp_path / _kept(tmp_path)[0]).read_text() == first_text


def test_attack_dangling_symlink_at_the_output_counts_as_existing(tmp_path):
    # attack 1c: a dangling symlink at the output path was replaced without --overwrite
    out = tmp_path / "out.csv"
    os.symlink(tmp_path / "nowhere.csv", out)
    with pytest.raises(InputError, match="exists; pass --overwrite"):
        TableWriter(str(out), SCHEMA)
    with pytest.raises(InputError, match="not a regular file"):
        TableWriter(str(out), SCHEMA, overwrite=True)
    assert os.path.islink(out) and not (tmp_path / "nowhere.csv").exists()


def test_attack_overwrite_replaces_only_a_regular_file(tmp_path):
    # attack 1d: --overwrite aimed at a symlink (to a folder, or to a file) replaced the link
    folder = tmp_path / "folder"
    folder.mkdir()
    (folder / "keep.txt").write_text("keep")
    to_folder, to_file = tmp_path / "to_folder.csv", tmp_path / "to_file.csv"
    os.symlink(folder, to_folder)
    os.symlink(folder / "keep.txt", to_file)
    for link in (to_folder, to_file):
        with pytest.raises(InputError, match="directory|not a regular file"):
            TableWriter(str(link), SCHEMA, overwrite=True)
        assert os.path.islink(link)
    # a regular file that becomes a symlink during the run is not replaced either
    out = tmp_path / "out.csv"
    out.write_text("old")
    writer = _writer(out, overwrite=True)
    out.unlink()
    os.symlink(folder, out)
    with pytest.raises(InputError, match="not a regular file"):
        writer.commit()
    assert os.path.islink(out) and (folder / "keep.txt").read_text() == "keep"
    assert len(_kept(tmp_path)) == 1
    # and a regular file is replaced, as asked
    plain = tmp_path / "plain.csv"
    plain.write_text("old")
    _writer(plain, overwrite=True).commit()
    assert plain.read_text().splitlines() == ['"formula"', '"NaCl"']


def test_attack_without_hard_links_the_result_is_kept_with_a_clear_error(tmp_path, monkeypatch):
    # attack 1e: a file system without hard links cannot create without replacing; say so, keep the result
    out = tmp_path / "out.csv"
    writer = _writer(out)

    def no_links(src, dst):
        raise OSError(errno.EPERM, "Operation not permitted")

    monkeypatch.setattr(os, "link", no_links)
    with pytest.raises(InputError, match="no hard links"):
        writer.commit()
    assert not out.exists() and len(_kept(tmp_path)) == 1


def test_attack_output_appearing_during_a_cli_run_exits_2(tmp_path, capsys, monkeypatch):
    # attack 1a through the command line: exit 2, one line naming the output and the kept result
    src = tmp_path / "in.csv"
    src.write_text("formula\nNaCl\nKCl\n")
    out = tmp_path / "out.csv"
    real = local_engine.score_batch

    def score_then_appear(*args, **kwargs):
        if not out.exists():
            out.write_text("appeared")
        return real(*args, **kwargs)

    monkeypatch.setattr(local_engine, "score_batch", score_then_appear)
    assert main(["score", str(src), "-o", str(out), "--quiet", "--workers", "1"]) == 2
    err = capsys.readouterr().err.strip()
    kept = _kept(tmp_path)
    assert len(err.splitlines()) == 1 and str(out) in err and kept[0] in err and "Traceback" not in err
    assert out.read_text() == "appeared"
    assert (tmp_path / kept[0]).read_text().startswith('"formula","status"')


# ------------------------------------------------------------------ 2. dask dataset folders


def _dataset(folder, text="old") -> None:
    folder.mkdir()
    (folder / "part-000000.parquet").write_text(text)
    (folder / DATASET_MARKER).write_text("marker")


def test_attack_dask_overwrite_refuses_a_folder_it_did_not_write(tmp_path):
    # attack 2a: --engine dask --overwrite deleted any folder it was pointed at, recursively
    pytest.importorskip("dask.dataframe")
    pytest.importorskip("distributed")
    from ionicity.pipelines.config import ScoreConfig
    from ionicity.pipelines.run import score_file

    src = tmp_path / "in.csv"
    src.write_text("formula\nNaCl\n")
    home = tmp_path / "home"
    home.mkdir()
    (home / "thesis.tex").write_text("years of work")
    with pytest.raises(InputError, match=f"no {DATASET_MARKER} file"):
        score_file(ScoreConfig(input=str(src), output=str(home), engine="dask", overwrite=True, quiet=True,
                               workers=1))
    assert (home / "thesis.tex").read_text() == "years of work"
    assert sorted(os.listdir(tmp_path)) == ["home", "in.csv"]


def test_attack_dask_swap_keeps_old_or_new_at_the_path(tmp_path, monkeypatch):
    # attack 2b: the old dataset was moved to a partial name, which the next
    # run deleted as stale if this one was killed before the new one moved in;
    # build item 1: at every instant either the old or the new output is at the path
    pytest.importorskip("dask.dataframe")
    from ionicity.pipelines import dask_engine
    from ionicity.pipelines.output_paths import exchange_paths

    out, new = tmp_path / "out.parquet", tmp_path / "new"
    _dataset(out, "old")
    _dataset(new, "new")
    if not exchange_paths(str(new), str(new)):
        pytest.skip("no renameat2(RENAME_EXCHANGE) here; the two-rename fallback is tested below")
    seen = []

    def watching(src, dst):
        done = exchange_paths(src, dst)
        seen.append(((out / "part-000000.parquet").read_text(), os.path.lexists(out)))
        return done

    def no_rename(src, dst):
        raise AssertionError(f"renamed {src} -> {dst}: the path was empty in between")

    monkeypatch.setattr(dask_engine, "exchange_paths", watching)
    monkeypatch.setattr(os, "rename", no_rename)
    dask_engine._swap_into_place(str(new), str(out), overwrite=True)
    monkeypatch.undo()
    assert seen == [("new", True)]  # one step: new in, old out
    assert (out / "part-000000.parquet").read_text() == "new"
    assert sorted(os.listdir(tmp_path)) == ["out.parquet"]


def test_attack_dask_swap_without_exchange_renames_twice(tmp_path, monkeypatch):
    # where the system cannot exchange two paths, old aside then new in (a killed
    # run's old dataset is put back by the next, test below)
    pytest.importorskip("dask.dataframe")
    from ionicity.pipelines import dask_engine

    out, new = tmp_path / "out.parquet", tmp_path / "new"
    _dataset(out, "old")
    _dataset(new, "new")
    seen = []
    real_rename = os.rename

    def watching_rename(src, dst):
        real_rename(src, dst)
        seen.append(os.path.lexists(out))

    monkeypatch.setattr(dask_engine, "exchange_paths", lambda a, b: False)
    monkeypatch.setattr(os, "rename", watching_rename)
    dask_engine._swap_into_place(str(new), str(out), overwrite=True)
    monkeypatch.undo()
    assert (out / "part-000000.parquet").read_text() == "new"
    assert sorted(os.listdir(tmp_path)) == ["out.parquet"]
    assert seen == [False, True]  # empty only between the two renames of one process, never left so


def test_attack_dask_swap_does_not_exchange_with_a_stranger(tmp_path):
    # the path changed hands between the check and the exchange: put back, result kept beside
    pytest.importorskip("dask.dataframe")
    from ionicity.pipelines import dask_engine
    from ionicity.pipelines.output_paths import exchange_paths

    out, new = tmp_path / "out.parquet", tmp_path / "new"
    _dataset(new, "new")
    out.mkdir()
    (out / "thesis.tex").write_text("years of work")
    if not exchange_paths(str(new), str(new)):
        pytest.skip("no renameat2(RENAME_EXCHANGE) here")
    real_check = dask_engine.is_ionicity_dataset
    calls = []

    def passes_first_check(path):  # as if the stranger arrived just after the check
        calls.append(path)
        return True if len(calls) == 1 else real_check(path)

    dask_engine.is_ionicity_dataset = passes_first_check
    try:
        with pytest.raises(InputError, match="without _ionicity_dataset") as caught:
            dask_engine._swap_into_place(str(new), str(out), overwrite=True)
    finally:
        dask_engine.is_ionicity_dataset = real_check
    assert (out / "thesis.tex").read_text() == "years of work"
    kept = _kept(tmp_path)
    assert kept[0] in str(caught.value) and (tmp_path / kept[0] / "part-000000.parquet").read_text() == "new"


def test_attack_a_killed_swap_is_restored_not_deleted(tmp_path):
    # attack 2b, the run killed between its two renames: the next run puts the old dataset back
    out = tmp_path / "out.parquet"
    aside = backup_path(str(out)).replace(f"-{os.getpid()}@", f"-{_dead_pid()}@")
    _dataset(tmp_path / os.path.basename(aside), "old")
    clean_stale_partials(str(tmp_path))
    assert is_ionicity_dataset(str(out)) and (out / "part-000000.parquet").read_text() == "old"
    assert sorted(os.listdir(tmp_path)) == ["out.parquet"]
    # killed after the new one moved in: the old one is removed, the new one stays
    os.rename(out, aside)
    _dataset(out, "new")
    clean_stale_partials(str(tmp_path))
    assert sorted(os.listdir(tmp_path)) == ["out.parquet"] and (out / "part-000000.parquet").read_text() == "new"
    # something else took the path: the backup is neither restored nor deleted
    os.rename(out, aside)
    out.write_text("someone else's")
    clean_stale_partials(str(tmp_path))
    assert os.path.isdir(aside) and out.read_text() == "someone else's"


def test_attack_dask_dataset_appearing_during_the_run_is_kept_beside(tmp_path):
    # attack 1a on the dask engine: a folder that appears at the output is not replaced
    pytest.importorskip("dask.dataframe")
    from ionicity.pipelines.dask_engine import _swap_into_place

    out, new = tmp_path / "out.parquet", tmp_path / "new"
    _dataset(out, "appeared")
    _dataset(new, "new")
    with pytest.raises(InputError, match="appeared while this run") as caught:
        _swap_into_place(str(new), str(out), overwrite=False)
    kept = _kept(tmp_path)
    assert (out / "part-000000.parquet").read_text() == "appeared" and kept[0] in str(caught.value)
    assert (tmp_path / kept[0] / "part-000000.parquet").read_text() == "new"


# ------------------------------------------------------------------ 3. literal input paths


def test_attack_an_existing_path_with_glob_characters_is_read_as_written(tmp_path):
    # attack 3: score 'data[1].parquet' silently read data1.parquet
    pq.write_table(pa.table({"formula": ["NaCl"]}), tmp_path / "data[1].parquet")
    pq.write_table(pa.table({"formula": ["KCl"]}), tmp_path / "data1.parquet")
    reader = open_reader(str(tmp_path / "data[1].parquet"))
    assert reader.paths == (str(tmp_path / "data[1].parquet"),)
    assert pa.Table.from_batches(list(reader.batches)).column("formula").to_pylist() == ["NaCl"]
    # a path that does not exist is still a pattern
    globbed = open_reader(str(tmp_path / "data[0-9].parquet"))
    assert globbed.paths == (str(tmp_path / "data1.parquet"),)


# ------------------------------------------------------------------ 4. model files

_LOAD = "from ionicity.pipelines.melting_model_file import load_model; load_model({!r})"


def _load_in_a_child(path: str) -> subprocess.CompletedProcess:
    # a child process, so that the unfixed loader (reading /dev/zero without
    # end, or waiting on a FIFO) fails this test instead of hanging the suite
    try:
        return subprocess.run([sys.executable, "-c", _LOAD.format(path)], capture_output=True, text=True, timeout=60)
    except subprocess.TimeoutExpired:
        pytest.fail(f"load_model({path!r}) did not return")


@pytest.mark.skipif(not os.path.exists("/dev/zero"), reason="needs /dev/zero")
def test_attack_model_from_a_device_is_refused():
    # attack 4a: --mp-model /dev/zero read without limit (st_size is 0 for a device)
    done = _load_in_a_child("/dev/zero")
    assert done.returncode != 0 and "is not a regular file" in done.stderr


@pytest.mark.skipif(not hasattr(os, "mkfifo"), reason="needs FIFOs")
def test_attack_model_from_a_fifo_is_refused(tmp_path, capsys):
    # attack 4b: --mp-model on a FIFO waited for ever
    fifo = tmp_path / "model.json"
    os.mkfifo(fifo)
    done = _load_in_a_child(str(fifo))
    assert done.returncode != 0 and "is not a regular file" in done.stderr
    src = tmp_path / "in.csv"
    src.write_text("formula\nNaCl\n")
    assert main(["score", str(src), "-o", str(tmp_path / "out.csv"), "--mp-model", str(fifo), "--quiet"]) == 2
    err = capsys.readouterr().err.strip()
    assert len(err.splitlines()) == 1 and "is not a regular file" in err and str(fifo) in err


@pytest.mark.skipif(not os.path.isfile("/proc/self/status"), reason="needs procfs")
def test_attack_model_size_is_checked_on_what_is_read(monkeypatch):
    # attack 4c: the size check trusted st_size, which is 0 for procfs files
    # (and for a file still growing); what is read is what is checked now
    from ionicity.pipelines import melting_model_file
    from ionicity.scorer.melting_model import ModelFormatError

    assert os.stat("/proc/self/status").st_size == 0
    monkeypatch.setattr(melting_model_file, "_MAX_MODEL_BYTES", 10)
    with pytest.raises(ModelFormatError, match="more than 10 bytes is too large"):
        melting_model_file.load_model("/proc/self/status")
