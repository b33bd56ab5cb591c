"""The worker pool: every process trick of multiprocess scoring, behind one facade.

The rest of the engine knows :class:`WorkerPool` (start, submit a task to a
chosen worker, stop), :func:`score_values` (the task), :func:`prestart`,
:func:`discard_prestarted`, :func:`warm_up` and :func:`leave_process`, and
:data:`WORKER_LOST`, the errors that mean "a worker is gone, carry on here".
What follows is this module's alone; each trick carries its measured gain.

* One single-process executor per worker, so that a task goes to a chosen
  worker: the scheduler sends all spellings of one salt to the same worker's
  caches, where the salt is resolved once, not once per worker.
* Workers fork from a ``forkserver`` (``spawn`` where there is none) that
  imported :mod:`ionicity.pipelines._warm`: the data tables load and the
  scorer warms once, and every worker starts warm, sharing those pages,
  instead of each paying for it in its first tasks.
* In that forkserver numpy's BLAS is asked for one thread before numpy
  loads (in :mod:`ionicity.pipelines._warm`), and the garbage collector freezes what the warm-up
  built and collects young objects less often: with the default thresholds
  it walked the growing caches again and again, about a tenth of the
  scoring time (measured with ``gc.callbacks``).
* :func:`prestart` starts the workers in a background thread while the
  command line imports pyarrow; the first :class:`WorkerPool` of as many
  workers takes them. Start-up until the workers take the first formulas
  is about 0.3 s on the 2-core machine (DEVELOPERS.md, "How a large run is
  laid out").
* Teardown: a cancelled pool terminates its processes and closes the write
  end of their result pipe (through :func:`_executor_internals`, the one
  place that reads CPython-private executor attributes), so that stopping
  never hangs on half a message; each worker exits when its parent is gone
  (it watches a pipe whose only write end the parent holds, so a killed
  parent is noticed at once, even while it waits unreaped as a zombie).
* :func:`leave_process`: the command line leaves with ``os._exit`` once its
  output is synced and renamed and the workers have stopped, skipping an
  interpreter teardown that frees a large run's objects one by one (about
  0.1 s) and has nothing left to save.

Workers import the scorer, never pyarrow or pandas.
"""
from __future__ import annotations

import gc
import multiprocessing
import os
import signal
import sys
import threading
import time
from concurrent.futures import CancelledError, Future, ProcessPoolExecutor
from concurrent.futures.process import BrokenProcessPool

from ionicity.pipelines.aliases import load_aliases_from_environment
from ionicity.scorer.columns import column_names
from ionicity.scorer.madelung import PROTOTYPES, madelung_details
from ionicity.scorer.record import empty_record, score_formula, score_row

__all__ = [
    "WORKER_LOST",
    "WorkerPool",
    "default_workers",
    "discard_prestarted",
    "leave_process",
    "prestart",
    "score_values",
    "warm_forkserver",
    "warm_up",
]

# What a lost or stopped worker raises (killed, out of memory, pool shut
# down): the caller scores in-process instead of losing the run.
WORKER_LOST = (BrokenProcessPool, CancelledError, RuntimeError, OSError)

_FORKSERVER_PRELOAD = "ionicity.pipelines._warm"


# ----------------------------------------------------------------------------- the task


def score_values(texts: list) -> list[tuple]:
    """Score formulas; one tuple of values per formula, in
    :func:`ionicity.scorer.columns.column_names` order. Runs in a worker, or
    in-process for a few formulas."""
    out = []
    for text in texts:
        try:
            out.append(score_row(text))
        except Exception as exc:  # a scorer bug must not sink the whole table
            record = _failed_record(text, exc)
            out.append(tuple(record[name] for name in column_names()))
    return out


def _failed_record(text, exc: Exception) -> dict:
    record = empty_record()
    record["status"] = "error"
    record["message"] = (
        f"internal error while scoring {text!r}: {type(exc).__name__}: {exc}"
        " (a bug in ionicity; please report it)"
    )
    return record


def ready() -> None:
    """A task that does nothing: submitting one to a worker starts it."""


# ----------------------------------------------------------------------------- a warm process

_WARM: list = []

# What the first formulas of a table build once per process, built here, in the
# forkserver, rather than in each worker: the data tables and the solver's
# first readings (the salts), and the organic ion-pair table
# (scorer.organic._pairs_by_ratio, 60-85 ms of CPU, which every worker built
# again at its first formula before C6H12O6 was warmed here; a typo (NaCI)
# warms the slip reader's symbol table, a formula in capitals only (KNO3) the
# registry's compositions (80-150 ms) and a name only the registry holds (acetone)
# the registry's names (40 ms), which each worker had loaded at its first such
# formula.
_WARM_TEXTS = ("NaCl", "CuSO4·5H2O", "[C4mim][BF4]", "Al2O3", "TiO2", "CaF2", "ZnS", "CsCl", "C6H12O6", "NaCI",
               "KNO3", "acetone")


def warm_up() -> bool:
    """Load the scorer's data tables and the Madelung constants of every
    prototype now, rather than inside the first tasks; once per process (the
    forkserver does it once for all workers; a Dask worker when it joins).
    Returns whether this call did the work."""
    if _WARM:
        return False
    load_aliases_from_environment()  # a user's --aliases, before anything is cached
    for text in _WARM_TEXTS:
        score_formula(text)
    for name in PROTOTYPES:
        madelung_details(name)
    _WARM.append(True)
    return True


def _settle_gc() -> None:
    # What the warm-up built moves to the collector's permanent generation,
    # and young objects are collected less often: with the default thresholds
    # the collector walked the growing caches again and again, about a tenth
    # of the scoring time (measured with gc.callbacks).
    gc.collect()
    gc.freeze()
    gc.set_threshold(10_000, 50, 50)


def warm_forkserver() -> None:
    """What the forkserver does once for all the workers it forks
    (:mod:`ionicity.pipelines._warm` calls it, after asking numpy's BLAS for
    one thread)."""
    warm_up()
    _settle_gc()  # inherited by every worker forked from here


def _worker_init(parent_pid: int | None = None, lifeline=None) -> None:
    # Once in each worker: ignore Ctrl-C (it reaches the whole process group;
    # the parent decides), exit when the parent is gone, and warm up unless
    # forked from the warm forkserver.
    signal.signal(signal.SIGINT, signal.SIG_IGN)
    if lifeline is not None:
        _exit_at_end_of(lifeline)
    elif parent_pid is not None:
        _exit_with(parent_pid)
    if warm_up():
        _settle_gc()


def _exit_at_end_of(lifeline) -> None:
    # A parent killed outright (SIGKILL, out of memory) cannot stop its
    # workers, and a worker holds its own task pipe open, so it would wait
    # forever. The parent alone holds the write end of the lifeline; the
    # kernel closes it when the parent dies, reaped or not (a parent whose
    # own parent never waits for it stays a zombie, which os.kill(pid, 0)
    # still finds), and the read below returns at once.
    def watch():
        try:
            while True:
                lifeline.recv_bytes()
        except (EOFError, OSError):
            os._exit(0)

    threading.Thread(target=watch, name="ionicity-parent-watch", daemon=True).start()


def _exit_with(parent_pid: int) -> None:
    # Where no lifeline could be made: poll for the parent's pid.
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


_LIFELINE: list = []


def _lifeline(context):
    """The read end of this process's lifeline pipe (made once; the write end
    stays in this process only and is never written to). ``None`` where a
    pipe cannot be made."""
    if not _LIFELINE:
        try:
            read_end, write_end = context.Pipe(duplex=False)
        except OSError:
            return None
        _LIFELINE.extend((read_end, write_end))
    return _LIFELINE[0]


# ----------------------------------------------------------------------------- executors


def default_workers() -> int:
    """The cores this process may use."""
    if hasattr(os, "process_cpu_count"):
        return os.process_cpu_count() or 1
    if hasattr(os, "sched_getaffinity"):
        return len(os.sched_getaffinity(0)) or 1
    return os.cpu_count() or 1


def _new_executors(count: int) -> list[ProcessPoolExecutor]:
    """``count`` single-process executors; their processes start on the first task."""
    methods = multiprocessing.get_all_start_methods()
    context = multiprocessing.get_context("forkserver" if "forkserver" in methods else "spawn")
    if context.get_start_method() == "forkserver":
        context.set_forkserver_preload([_FORKSERVER_PRELOAD])
    return [
        ProcessPoolExecutor(
            max_workers=1, mp_context=context, initializer=_worker_init, initargs=(os.getpid(), _lifeline(context))
        )
        for _ in range(count)
    ]


def _executor_internals(executor) -> tuple[list, object | None]:
    """(worker processes, write end of the result pipe) of a
    ``ProcessPoolExecutor``, read from CPython-private attributes
    (``_processes``, ``_result_queue._writer``; CPython 3.11 to 3.13). Where
    a Python lacks them: ``([], None)``, and teardown relies on
    ``shutdown`` alone."""
    processes = getattr(executor, "_processes", None)
    try:
        processes = list(processes.values()) if processes else []
    except AttributeError:
        processes = []
    writer = getattr(getattr(executor, "_result_queue", None), "_writer", None)
    return processes, writer


def _stop_executors(executors: list, cancel: bool = False) -> None:
    """Shut executors down; ``cancel`` (after an error or Ctrl-C) stops their
    processes at once rather than letting them finish their task."""
    if cancel:
        internals = [_executor_internals(executor) for executor in executors]
        # a worker still starting up when the parent exits would print a
        # traceback about its vanished semaphores; stop them first
        processes = [p for found, _ in internals for p in found]
        for process in processes:
            process.terminate()
        for process in processes:
            process.join(timeout=10)
        for _, writer in internals:
            # A worker stopped while sending its results leaves half a message
            # in the pipe, and the executor's reader thread then waits for the
            # rest for good: this process holds the pipe's write end too.
            # Closing it turns the wait into end-of-file (a broken pool), so
            # shutdown below can join that thread.
            if writer is not None and not any(p.is_alive() for p in processes):
                try:
                    writer.close()
                except OSError:
                    pass
    for executor in executors:
        executor.shutdown(wait=True, cancel_futures=True)


class WorkerPool:
    """``count`` worker processes, each taking tasks sent to it by number.

    Nothing starts until :meth:`start` or the first :meth:`submit`; prestarted
    workers (:func:`prestart`) are taken when there are ``count`` of them.
    Use as a context manager, or call :meth:`stop`.
    """

    def __init__(self, count: int):
        self.count = count
        self._executors: list[ProcessPoolExecutor] = []

    def __enter__(self) -> "WorkerPool":
        return self

    def __exit__(self, exc_type, exc, tb) -> None:
        self.stop(cancel=exc_type is not None)

    @property
    def running(self) -> bool:
        """Whether the workers were started (and not stopped since)."""
        return bool(self._executors)

    def _executors_now(self) -> list[ProcessPoolExecutor]:
        if not self._executors:
            self._executors = _PRESTART.take(self.count) or _new_executors(self.count)
        return self._executors

    def start(self) -> None:
        """Start every worker now, so that they start while the caller reads
        its input. Raises one of :data:`WORKER_LOST` when they cannot."""
        for executor in self._executors_now():
            executor.submit(ready)

    def submit(self, worker: int, function, *args) -> Future:
        """Run ``function(*args)`` in worker number ``worker`` (0 to count - 1)."""
        return self._executors_now()[worker].submit(function, *args)

    def stop(self, cancel: bool = False) -> None:
        """Stop the workers; ``cancel`` (after an error or Ctrl-C) stops them
        at once rather than letting them finish their task."""
        executors, self._executors = self._executors, []
        _stop_executors(executors, cancel=cancel)


# ----------------------------------------------------------------------------- prestart


class _Prestart:
    """Workers started in a background thread before anyone asked for them."""

    def __init__(self):
        self.executors: list[ProcessPoolExecutor] = []
        self.threads: list[threading.Thread] = []

    def begin(self, count: int) -> None:
        self.discard()

        def start() -> None:
            try:
                self.executors[:] = _new_executors(count)
                for executor in self.executors:
                    executor.submit(ready)
            except Exception:  # noqa: BLE001 - the pool starts (or falls back from) its own workers then
                pass

        thread = threading.Thread(target=start, name="ionicity-prestart", daemon=True)
        self.threads.append(thread)
        thread.start()

    def _wait(self) -> None:
        while self.threads:
            self.threads[-1].join()
            self.threads.pop()

    def take(self, count: int) -> list[ProcessPoolExecutor] | None:
        self._wait()
        if len(self.executors) != count:
            self.discard()
            return None
        executors = list(self.executors)
        self.executors.clear()
        return executors

    def discard(self) -> None:
        self._wait()
        executors = list(self.executors)
        self.executors.clear()
        _stop_executors(executors, cancel=True)


_PRESTART = _Prestart()


def prestart(count: int) -> None:
    """Start ``count`` workers in a background thread: starting the
    forkserver waits for it to load and warm the scorer, which this process
    does not need to wait for. The next :class:`WorkerPool` of ``count``
    workers takes them."""
    _PRESTART.begin(count)


def discard_prestarted() -> None:
    """Stop prestarted workers nobody took (the run failed, or needed none)."""
    _PRESTART.discard()


# ----------------------------------------------------------------------------- leaving


def leave_process(code: int) -> None:
    """End the command line's process with exit status ``code``, without the
    interpreter's teardown (see the module docstring); its output is written,
    synced and closed, and its workers have stopped. Where the standard
    streams cannot be flushed, exit the ordinary way."""
    try:
        for stream in (sys.stdout, sys.stderr):
            if stream is not None:
                stream.flush()
    except (OSError, ValueError):
        sys.exit(code)
    os._exit(code)
