"""Benchmark of the Dask engine: the local engine, Dask with one worker and
Dask with two workers on the same table (``python -m ionicity.pipelines.bench
--engine dask``).

A scheduler and its workers are started once per configuration as their own
processes (``dask scheduler``, ``dask worker --nthreads 1``), as a cluster
user runs them, and every timed run is a fresh ``ionicity score --engine dask
--scheduler ADDRESS`` process: what is timed is the run, not the cluster's
start. The configurations alternate, ``--repeat`` times, and the medians are
the figures (after one untimed run per cluster, in which each worker
loads the scorer); the speed-up is the one-worker median over the two-worker
median. The shared first pass of distinct formulas
(:mod:`ionicity.pipelines.dask_partitions`) is timed on and off
(``IONICITY_DASK_SHARED``), so the rule that chooses it can be checked.
``peak_worker_rss_mib``: the largest peak resident set of any worker (from
``/proc/PID/status`` VmHWM). The speed-up is printed twice: the ratio of the
medians, and the median of the ratios of the pairs (a one-worker run and the
two-worker run right after it), which a drifting load on a shared machine
disturbs less.

:func:`run_dask_memory` (``--engine dask --memory-scaling``) scores tables of
N and 10 N rows, with the same distinct count D and with the same distinct
ratio (10 D), each on a fresh two-worker cluster, and prints every worker's
peak resident set and the ratios of the largest.
"""
from __future__ import annotations

import os
import signal
import socket
import statistics
import subprocess
import sys
import time

__all__ = ["Cluster", "run_dask_bench"]


def _free_port() -> int:
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


class Cluster:
    """A scheduler and ``workers`` single-threaded worker processes on 127.0.0.1."""

    def __init__(self, workers: int, env: dict):
        self.port = _free_port()
        self.address = f"tcp://127.0.0.1:{self.port}"
        quiet = dict(stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL, env=env)
        self.processes = [subprocess.Popen(
            [sys.executable, "-m", "distributed.cli.dask_scheduler", "--host", "127.0.0.1", "--port", str(self.port),
             "--no-dashboard"], **quiet)]
        for _ in range(workers):
            self.processes.append(subprocess.Popen(
                [sys.executable, "-m", "distributed.cli.dask_worker", self.address, "--nthreads", "1",
                 "--nworkers", "1", "--host", "127.0.0.1", "--no-dashboard", "--no-nanny"], **quiet))
        self._wait_for(workers)

    def _wait_for(self, workers: int) -> None:
        import distributed

        deadline = time.monotonic() + 120
        while time.monotonic() < deadline:
            try:
                with distributed.Client(self.address, timeout="5s") as client:
                    if len(client.scheduler_info()["workers"]) >= workers:
                        return
            except (OSError, TimeoutError):
                pass
            time.sleep(0.3)
        self.stop()
        raise RuntimeError(f"the scheduler at {self.address} did not get {workers} workers")

    def peak_worker_rss_mib(self) -> float:
        return max(self.worker_peaks_mib(), default=float("nan"))

    def worker_peaks_mib(self) -> list[float]:
        """Each worker's peak resident set so far (VmHWM), MiB."""
        peaks = []
        for process in self.processes[1:]:
            try:
                with open(f"/proc/{process.pid}/status") as f:
                    for line in f:
                        if line.startswith("VmHWM:"):
                            peaks.append(int(line.split()[1]) / 1024.0)
            except OSError:
                pass
        return peaks

    def stop(self) -> None:
        for process in self.processes:
            process.terminate()
        for process in self.processes:
            try:
                process.wait(timeout=30)
            except subprocess.TimeoutExpired:
                process.kill()
                process.wait()


def _time_run(argv: list[str], env: dict) -> float:
    started = time.perf_counter()
    done = subprocess.run(argv, env=env, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE)
    if done.returncode != 0:
        raise RuntimeError(f"{' '.join(argv)} failed ({done.returncode}): {done.stderr.decode(errors='replace')}")
    return time.perf_counter() - started


def run_dask_bench(table: str, workdir: str, repeat: int, env: dict, partition_rows: int | None, emit) -> None:
    """Time the local engine and Dask on one and two workers; ``emit(name, value)`` prints a figure."""
    out = os.path.join(workdir, "dask_out.parquet")
    base = [sys.executable, "-m", "ionicity", "score", table, "--quiet", "--overwrite"]
    local_argv = base + ["-o", os.path.join(workdir, "local_out.parquet")]
    extra = ["--partition-rows", str(partition_rows)] if partition_rows else []
    # a terminated benchmark still stops the clusters it started (finally below)
    signal.signal(signal.SIGTERM, lambda signum, frame: sys.exit(128 + signum))
    clusters = {}
    try:
        for workers in (1, 2):
            clusters[workers] = Cluster(workers, env)
        for cluster in clusters.values():  # untimed: each worker's first task loads the scorer
            _time_run(base + ["-o", out, "--engine", "dask", "--scheduler", cluster.address, *extra], env)
        times: dict[str, list[float]] = {}
        for _ in range(repeat):  # alternating, so drift on a shared machine hits every configuration alike
            times.setdefault("local", []).append(_time_run(local_argv, env))
            for workers, cluster in clusters.items():
                for mode in ("auto", "never", "always"):
                    if workers == 1 and mode == "always":
                        continue
                    argv = base + ["-o", out, "--engine", "dask", "--scheduler", cluster.address, *extra]
                    run_env = dict(env, IONICITY_DASK_SHARED=mode)
                    times.setdefault(f"dask_{workers}w_{mode}", []).append(_time_run(argv, run_env))
        medians = {name: statistics.median(values) for name, values in times.items()}
        for name, values in times.items():
            emit(f"{name}_seconds_each", ", ".join(f"{v:.3f}" for v in values))
            emit(f"{name}_seconds", medians[name])
        # pairs: the one-worker run and the two-worker run of the same round
        pairs = [one / two for one, two in zip(times["dask_1w_auto"], times["dask_2w_auto"])]
        emit("speedup_1_to_2_workers_pairs", ", ".join(f"{r:.3f}" for r in pairs))
        emit("speedup_1_to_2_workers_paired_median", statistics.median(pairs))
        emit("speedup_1_to_2_workers", medians["dask_1w_auto"] / medians["dask_2w_auto"])
        emit("speedup_1_to_2_workers_shared_always", medians["dask_1w_auto"] / medians["dask_2w_always"])
        emit("speedup_1_to_2_workers_shared_never", medians["dask_1w_never"] / medians["dask_2w_never"])
        emit("dask_2w_vs_local", medians["dask_2w_auto"] / medians["local"])
        for workers, cluster in clusters.items():
            emit(f"peak_worker_rss_mib_{workers}w", cluster.peak_worker_rss_mib())
    finally:
        for cluster in clusters.values():
            cluster.stop()


def run_dask_memory(write_table, rows: int, distinct: int, workdir: str, env: dict, partition_rows: int | None,
                    emit) -> None:
    """Peak resident set of each of two workers scoring N and 10 N rows
    (``write_table(path, rows, distinct)`` makes the tables), with D and with
    10 D distinct formulas; each size on a fresh cluster, so a worker's peak
    is that run's."""
    table = os.path.join(workdir, "memory.parquet")
    out = os.path.join(workdir, "dask_out.parquet")
    extra = ["--partition-rows", str(partition_rows)] if partition_rows else []
    signal.signal(signal.SIGTERM, lambda signum, frame: sys.exit(128 + signum))
    peaks = {}
    for n, d in ((rows, distinct), (10 * rows, distinct), (10 * rows, 10 * distinct)):
        write_table(table, n, d)
        cluster = Cluster(2, env)
        try:
            seconds = _time_run([sys.executable, "-m", "ionicity", "score", table, "-o", out, "--quiet", "--overwrite",
                                 "--engine", "dask", "--scheduler", cluster.address, *extra], env)
            each = cluster.worker_peaks_mib()
        finally:
            cluster.stop()
        os.remove(table)
        name = f"{n}_rows_{d}_distinct"
        emit(f"dask_2w_seconds_{name}", seconds)
        emit(f"peak_worker_rss_mib_each_{name}", ", ".join(f"{p:.0f}" for p in each))
        peaks[(n, d)] = max(each)
    base = peaks[(rows, distinct)]
    emit("peak_worker_rss_ratio_10x_rows_same_distinct", peaks[(10 * rows, distinct)] / base)
    emit("peak_worker_rss_ratio_10x_rows_same_distinct_ratio", peaks[(10 * rows, 10 * distinct)] / base)
