"""Worker side of multiprocess scoring: kept free of pyarrow and pandas so a
worker process only carries the scorer.

Workers come from a ``forkserver`` (``spawn`` where there is none) that has
imported this module once, so each worker starts with the scorer loaded and
its data tables read by :func:`warm_up`; a task is one list of formulas.
"""
from __future__ import annotations

import os
import signal

from scorer.columns import column_names
from scorer.record import score_formula, score_row

__all__ = ["score_values", "warm_up", "default_workers", "ready"]


def score_values(texts: list) -> list[tuple]:
    """Score formulas; one tuple of values per formula, in
    :func:`scorer.columns.column_names` order."""
    out = []
    for text in texts:
        try:
            out.append(score_row(text))
        except Exception as exc:  # a scorer bug must not sink the whole table
            record = _failed_record(text, exc)
            out.append(tuple(record[name] for name in column_names()))
    return out


def _failed_record(text, exc: Exception) -> dict:
    from scorer.record import empty_record

    record = empty_record()
    record["status"] = "error"
    record["message"] = (
        f"internal error while scoring {text!r}: {type(exc).__name__}: {exc}"
        " (a bug in ionicity; please report it)"
    )
    return record


def ready() -> None:
    """A task that does nothing: submitting one per worker starts them all."""


def warm_up() -> None:
    """Load the scorer's data tables now rather than inside the first task."""
    for text in ("NaCl", "CuSO4·5H2O", "[C4mim][BF4]"):
        score_formula(text)


def worker_init(parent_pid: int | None = None) -> None:
    """Run once in each worker: ignore Ctrl-C (it reaches the whole process
    group; the parent decides what to do), exit when the parent is gone, and
    load the data tables."""
    signal.signal(signal.SIGINT, signal.SIG_IGN)
    if parent_pid is not None:
        _exit_with(parent_pid)
    warm_up()


def _exit_with(parent_pid: int) -> None:
    # A parent killed outright (SIGKILL, out of memory) cannot stop its pool,
    # and a worker holds its own task pipe open, so it would wait forever.
    import threading
    import time

    def watch():
        while True:
            time.sleep(0.5)
            try:
                os.kill(parent_pid, 0)
            except ProcessLookupError:
                os._exit(0)
            except OSError:
                pass

    threading.Thread(target=watch, name="ionicity-parent-watch", daemon=True).start()


def default_workers() -> int:
    """The cores this process may use."""
    if hasattr(os, "process_cpu_count"):
        return os.process_cpu_count() or 1
    if hasattr(os, "sched_getaffinity"):
        return len(os.sched_getaffinity(0)) or 1
    return os.cpu_count() or 1
