"""Starting the scoring workers. Kept light (no pyarrow, no scorer) so that
the command line can start them before its own heavy imports.

Each worker is a single-process executor, so that a task can be sent to a
chosen worker (see :class:`pipelines.batch.BatchScorer`). Workers come from a
``forkserver`` (``spawn`` where there is none) that imported
:mod:`pipelines._warm` once: every worker starts with the scorer loaded and
its caches warm. :func:`prestart` starts them early; the first
:class:`~pipelines.batch.BatchScorer` that needs as many workers takes them
(:func:`take_prestarted`).
"""
from __future__ import annotations

import os
import signal
from concurrent.futures import ProcessPoolExecutor

__all__ = ["default_workers", "new_workers", "prestart", "take_prestarted", "discard_prestarted", "stop_workers", "ready"]

_PRESTARTED: list[ProcessPoolExecutor] = []
_STARTING: list = []


def default_workers() -> int:
    """The cores this process may use."""
    if hasattr(os, "process_cpu_count"):
        return os.process_cpu_count() or 1
    if hasattr(os, "sched_getaffinity"):
        return len(os.sched_getaffinity(0)) or 1
    return os.cpu_count() or 1


def new_workers(count: int) -> list[ProcessPoolExecutor]:
    """``count`` single-process executors; their processes start on the first task."""
    import multiprocessing

    methods = multiprocessing.get_all_start_methods()
    context = multiprocessing.get_context("forkserver" if "forkserver" in methods else "spawn")
    if context.get_start_method() == "forkserver":
        context.set_forkserver_preload(["ionicity.pipelines._warm"])
    return [
        ProcessPoolExecutor(max_workers=1, mp_context=context, initializer=worker_init, initargs=(os.getpid(),))
        for _ in range(count)
    ]


def prestart(count: int) -> None:
    """Start ``count`` workers in a background thread: starting the
    forkserver waits for it to load and warm the scorer, which this process
    does not need to wait for."""
    import threading

    discard_prestarted()

    def start() -> None:
        try:
            _PRESTARTED[:] = new_workers(count)
            for worker in _PRESTARTED:
                worker.submit(ready)
        except Exception:  # noqa: BLE001 - the scorer starts (or falls back from) its own workers then
            pass

    thread = threading.Thread(target=start, name="ionicity-prestart", daemon=True)
    _STARTING.append(thread)
    thread.start()


def _wait_for_prestart() -> None:
    while _STARTING:
        _STARTING[-1].join()
        _STARTING.pop()


def take_prestarted(count: int) -> list[ProcessPoolExecutor] | None:
    """The prestarted workers if there are ``count`` of them (else none)."""
    _wait_for_prestart()
    if len(_PRESTARTED) != count:
        discard_prestarted()
        return None
    workers = list(_PRESTARTED)
    _PRESTARTED.clear()
    return workers


def discard_prestarted() -> None:
    """Stop prestarted workers nobody took (the run failed, or needed none)."""
    _wait_for_prestart()
    workers = list(_PRESTARTED)
    _PRESTARTED.clear()
    stop_workers(workers, cancel=True)


def stop_workers(workers: list[ProcessPoolExecutor], cancel: bool = False) -> None:
    """Shut executors down; ``cancel`` (after an error or Ctrl-C) stops their
    processes at once rather than letting them finish their task."""
    if cancel:
        # a worker still starting up when the parent exits would print a
        # traceback about its vanished semaphores; stop them first
        processes = [p for worker in workers for p in list((getattr(worker, "_processes", None) or {}).values())]
        for process in processes:
            process.terminate()
        for process in processes:
            process.join(timeout=10)
        for worker in workers:
            # A worker stopped while sending its results leaves half a message
            # in the pipe, and the executor's reader thread then waits for the
            # rest for good: this process holds the pipe's write end too.
            # Closing it turns the wait into end-of-file (a broken pool), so
            # shutdown below can join that thread.
            writer = getattr(getattr(worker, "_result_queue", None), "_writer", None)
            if writer is not None and not any(p.is_alive() for p in processes):
                try:
                    writer.close()
                except OSError:
                    pass
    for worker in workers:
        worker.shutdown(wait=True, cancel_futures=True)


def ready() -> None:
    """A task that does nothing: submitting one to a worker starts it."""


def one_blas_thread() -> None:
    """Ask numpy's BLAS for one thread in this process (unless the user set
    the count): each worker scores one formula at a time, and a thread pool
    per worker would only spin beside it on the cores the other workers
    need. Has effect only before numpy is first imported."""
    for name in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
        os.environ.setdefault(name, "1")


def settle_gc() -> None:
    """After the warm-up: move what the process holds to the collector's
    permanent generation, and collect young objects less often. A worker
    builds many short-lived tuples while its caches grow; with the default
    thresholds the collector walked those caches again and again (about a
    tenth of the scoring time, measured with gc.callbacks)."""
    import gc

    gc.collect()
    gc.freeze()
    gc.set_threshold(10_000, 50, 50)


def worker_init(parent_pid: int | None = None) -> None:
    """Run once in each worker: ignore Ctrl-C (it reaches the whole process
    group; the parent decides what to do), exit when the parent is gone, and
    warm the scorer's caches (already done when forked from the forkserver)."""
    signal.signal(signal.SIGINT, signal.SIG_IGN)
    if parent_pid is not None:
        _exit_with(parent_pid)
    one_blas_thread()
    from ionicity.pipelines._pool import warm_up

    if not warm_up():
        return  # forked from the warm forkserver: settled there
    settle_gc()


def _exit_with(parent_pid: int) -> None:
    # A parent killed outright (SIGKILL, out of memory) cannot stop its
    # workers, and a worker holds its own task pipe open, so it would wait forever.
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
