"""Exit codes as documented (pipelines/cli.py): 2 with one line naming the
cause for every input, output, environment and option problem; 3 only for a
bug. Common practice for command-line tools; no scientific reference values.
"""
from __future__ import annotations

import os
import socket
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


def _cli(*args, **kwargs):
    return subprocess.run([sys.executable, "-m", "ionicity", *args], capture_output=True, text=True, cwd=ROOT,
                          timeout=120, **kwargs)


def _one_line_error(stderr: str) -> str:
    lines = [line for line in stderr.splitlines() if line.strip()]
    assert len(lines) == 1 and lines[0].startswith("ionicity: error: "), stderr
    assert "Traceback" not in stderr and "internal error" not in stderr
    return lines[0]


@pytest.fixture
def small_csv(tmp_path):
    path = tmp_path / "in.csv"
    path.write_text("formula\nNaCl\nKCl\n", encoding="utf-8")
    return path


@pytest.mark.parametrize("address", ["nonsense", "tcp://127.0.0.1:99999", "tcp://host", "http://x:80", "tcp://a b:1"])
def test_a_malformed_scheduler_address_is_refused_before_anything_starts(small_csv, address):
    with pytest.raises(InputError, match="--scheduler must be an address"):
        ScoreConfig(input=str(small_csv), output="out.parquet", engine="dask", scheduler=address).validate()


@pytest.mark.parametrize("address", ["tcp://10.0.0.5:8786", "127.0.0.1:8786", "tls://sched.example:8786", "tcp://[::1]:8786"])
def test_well_formed_scheduler_addresses_pass(small_csv, address):
    ScoreConfig(input=str(small_csv), output="out.parquet", engine="dask", scheduler=address).validate()


@pytest.mark.slow
def test_an_unreachable_scheduler_on_loopback_is_exit_2(small_csv, tmp_path):
    pytest.importorskip("distributed")
    with socket.socket() as s:  # a port nothing listens on
        s.bind(("127.0.0.1", 0))
        port = s.getsockname()[1]
    done = _cli("score", str(small_csv), "-o", str(tmp_path / "out.parquet"), "--engine", "dask",
                "--scheduler", f"tcp://127.0.0.1:{port}")
    assert done.returncode == 2
    assert "cannot reach the Dask scheduler" in _one_line_error(done.stderr)


@pytest.mark.skipif(not os.path.exists("/dev/full"), reason="needs /dev/full (Linux)")
def test_no_space_left_on_standard_output_is_exit_2(small_csv):
    with open("/dev/full", "w") as full:
        done = subprocess.run([sys.executable, "-m", "ionicity", "score", str(small_csv)], stdout=full,
                              stderr=subprocess.PIPE, text=True, cwd=ROOT, timeout=120)
    assert done.returncode == 2
    assert "No space left on device" in _one_line_error(done.stderr)


@pytest.mark.parametrize("command", [["score", "{csv}"], ["explain", "NaCl"], ["columns"]])
def test_a_closed_standard_output_is_exit_2(small_csv, command):
    args = [a.format(csv=small_csv) for a in command]
    done = subprocess.run([sys.executable, "-m", "ionicity", *args], stdout=subprocess.DEVNULL, stderr=subprocess.PIPE,
                          text=True, cwd=ROOT, timeout=120, pass_fds=(), preexec_fn=lambda: os.close(1))
    assert done.returncode == 2
    assert "standard output is closed" in _one_line_error(done.stderr)


def test_a_closed_standard_output_does_not_matter_with_an_output_file(small_csv, tmp_path):
    out = tmp_path / "out.csv"
    done = subprocess.run([sys.executable, "-m", "ionicity", "score", str(small_csv), "-o", str(out), "--quiet"],
                          stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, text=True, cwd=ROOT, timeout=120,
                          preexec_fn=lambda: os.close(1))
    assert done.returncode == 0, done.stderr
    assert out.read_text().count("\n") == 3


def test_a_closed_standard_error_still_gives_the_exit_code(tmp_path):
    done = subprocess.run([sys.executable, "-m", "ionicity", "score", str(tmp_path / "missing.csv")],
                          stdout=subprocess.PIPE, cwd=ROOT, timeout=120, preexec_fn=lambda: os.close(2))
    assert done.returncode == 2


@pytest.mark.parametrize("values", [
    pa.array([{"a": 1}], type=pa.struct([("a", pa.int64())])),
    pa.array([[1, 2]]),
    pa.array([[("k", 1)]], type=pa.map_(pa.string(), pa.int64())),
])
def test_a_formula_column_of_nested_values_is_exit_2(tmp_path, capsys, values):
    path = tmp_path / "nested.parquet"
    pq.write_table(pa.table({"formula": values}), path)
    assert main(["score", str(path), "-o", str(tmp_path / "out.csv")]) == 2
    line = _one_line_error(capsys.readouterr().err)
    assert "'formula' holds" in line and "must hold text" in line
    assert not (tmp_path / "out.csv").exists()


@pytest.mark.skipif(not os.path.isdir("/proc/self"), reason="needs /proc (Linux) for a folder nothing may be created in")
def test_an_output_folder_nothing_can_be_written_in_is_exit_2(small_csv, capsys):
    assert main(["score", str(small_csv), "-o", "/proc/self/out.csv"]) == 2
    _one_line_error(capsys.readouterr().err)


# ------------------------------------------------------------------ names of columns


def test_an_input_with_a_repeated_column_name_is_refused(tmp_path, capsys):
    path = tmp_path / "twice.parquet"
    pq.write_table(pa.Table.from_arrays([pa.array(["NaCl"]), pa.array(["x"])], names=["formula", "formula"]), path)
    assert main(["score", str(path), "-o", str(tmp_path / "out.csv")]) == 2
    assert "more than one column named 'formula'" in _one_line_error(capsys.readouterr().err)


@pytest.mark.parametrize("name", ["STATUS", "Message", "Formula_Normalized"])
def test_a_generated_name_clashing_in_another_case_is_refused_with_the_prefix_hint(tmp_path, capsys, name):
    path = tmp_path / "case.parquet"
    pq.write_table(pa.table({"formula": ["NaCl"], name: ["x"]}), path)
    assert main(["score", str(path), "-o", str(tmp_path / "out.csv")]) == 2
    line = _one_line_error(capsys.readouterr().err)
    assert repr(name) in line and "--prefix" in line
    assert main(["score", str(path), "-o", str(tmp_path / "out.csv"), "--prefix", "ion_"]) == 0


# A Ctrl-C that lands while numpy's C extension is being imported reaches the
# entry point as an ImportError: the extension's own import of a module is cut
# short and reported as "PyCapsule_Import could not import module", the
# KeyboardInterrupt gone. The child below stands in for that moment
# deterministically: the import of the command line sends SIGINT to its own
# process and turns the interruption into an ImportError the same way. Exit 130 is 128 + SIGINT (common practice for shells).
_INTERRUPTED_IMPORT = r"""
import importlib.abc, os, signal, sys
# Ctrl-C as a terminal delivers it: a runner that starts the tests in the background has SIGINT ignored, and
# the child would inherit that and wait for ever below
signal.signal(signal.SIGINT, signal.default_int_handler)
class _Fail(importlib.abc.MetaPathFinder):
    def find_spec(self, name, path, target=None):
        if name == "ionicity.pipelines.cli":
            try:
                os.kill(os.getpid(), signal.SIGINT)
                signal.pause() if hasattr(signal, "pause") else None
            except BaseException:
                pass
            raise ImportError("PyCapsule_Import could not import module (stand-in)")
        return None
sys.meta_path.insert(0, _Fail())
from ionicity._entry import main
main()
"""


def test_ctrl_c_inside_an_extension_import_is_an_interruption():
    done = subprocess.run([sys.executable, "-c", _INTERRUPTED_IMPORT], capture_output=True, text=True,
                          timeout=60, cwd="/")
    assert done.returncode == 130, done.stderr
    assert "Traceback" not in done.stderr
    assert done.stderr.strip().splitlines() == ["ionicity: interrupted; no output was written"]


def test_an_import_error_without_a_signal_is_not_called_an_interruption():
    child = _INTERRUPTED_IMPORT.replace("os.kill(os.getpid(), signal.SIGINT)", "raise RuntimeError")
    done = subprocess.run([sys.executable, "-c", child], capture_output=True, text=True, timeout=60, cwd="/")
    assert done.returncode == 1 and "ImportError" in done.stderr


# A scoring run whose output's last step first meets a Ctrl-C in the way the
# child's {interrupt} says; the run is the command line's, from its entry point.
_CHILD_RUN = r"""
import os, signal, sys, weakref
from ionicity.pipelines import table_writer

finish = table_writer.TableWriter._finish

class Held:
    pass

def finish_after_an_interrupt(self):
{interrupt}
    finish(self)

table_writer.TableWriter._finish = finish_after_an_interrupt
from ionicity._entry import main
sys.argv = ["ionicity", "score", sys.argv[1], "-o", sys.argv[2]]
main()
"""
# a library that swallows the interrupt, as an optional import's `except ImportError` does to a converted one
_SWALLOWED = """
    try:
        os.kill(os.getpid(), signal.SIGINT)
        signal.pause() if hasattr(signal, "pause") else None
    except KeyboardInterrupt:
        pass"""
# where the import system's module locks took it: a callback's exception is "ignored" (printed and dropped)
_IN_A_CALLBACK = """
    held = Held()
    ref = weakref.ref(held, lambda _: (os.kill(os.getpid(), signal.SIGINT), signal.pause()))
    del held"""


def _run_child(interrupt: str, small_csv, out):
    return subprocess.run([sys.executable, "-c", _CHILD_RUN.replace("{interrupt}", interrupt), str(small_csv), str(out)],
                          capture_output=True, text=True, timeout=120, cwd="/")


@pytest.mark.parametrize("interrupt", [_SWALLOWED, _IN_A_CALLBACK], ids=["swallowed in a library", "in a weakref callback"])
def test_a_ctrl_c_that_never_reaches_the_run_still_stops_the_output(small_csv, tmp_path, interrupt):
    # 2 of 200 Ctrl-Cs sent in the first second of a large run on a loaded machine ended in exit 0 with the output
    # written, and one in 240 was raised inside the import system's module-lock callback: the entry point notes
    # every Ctrl-C, says nothing of one Python drops, and no output is put in place after one
    out = tmp_path / "out.csv"
    done = _run_child(interrupt, small_csv, out)
    assert done.returncode == 130, done.stderr
    assert done.stderr.strip().splitlines() == ["ionicity: interrupted; no output was written"]
    assert not out.exists()
    assert [n for n in os.listdir(tmp_path) if n.startswith(".ionicity-")] == []


def test_without_a_ctrl_c_the_same_run_writes_its_output(small_csv, tmp_path):
    out = tmp_path / "out.csv"
    done = _run_child(_SWALLOWED.replace("os.kill(os.getpid(), signal.SIGINT)", "raise KeyboardInterrupt"),
                      small_csv, out)
    assert done.returncode == 0, done.stderr
    assert out.exists()


def test_ctrl_c_while_the_command_line_is_read_is_an_interruption(monkeypatch, capsys):
    from ionicity.pipelines import cli

    def interrupted_parser():
        raise KeyboardInterrupt

    monkeypatch.setattr(cli, "build_parser", interrupted_parser)
    assert main(["score", "x.csv", "-o", "y.csv"]) == 130
    assert capsys.readouterr().err.strip() == "ionicity: interrupted; no output was written"
