"""Worker processes of a killed run exit by themselves, even while the killed
parent waits unreaped as a zombie (its own parent never called wait). A property of our
own process handling (common practice for worker pools); no scientific reference values."""
from __future__ import annotations

import os
import signal
import subprocess
import sys
import time

import pytest

pytestmark = pytest.mark.skipif(not os.path.isdir("/proc"), reason="reads process states from /proc (Linux)")

_PARENT = r"""
import sys, time
from ionicity.pipelines.pool import WorkerPool, _executor_internals
pool = WorkerPool(2)
pool.start()
for worker in range(2):
    pool.submit(worker, sum, [1, 2]).result(timeout=120)
pids = [p.pid for ex in pool._executors for p in _executor_internals(ex)[0]]
print(" ".join(map(str, pids)), flush=True)
time.sleep(600)
"""


def _state(pid: int) -> str:
    try:
        with open(f"/proc/{pid}/stat") as f:
            return f.read().rsplit(")", 1)[1].split()[0]
    except OSError:
        return "gone"


def test_workers_exit_when_their_parent_is_killed_and_left_unreaped():
    parent = subprocess.Popen([sys.executable, "-c", _PARENT], stdout=subprocess.PIPE, text=True)
    try:
        pids = [int(p) for p in parent.stdout.readline().split()]
        assert len(pids) == 2 and all(_state(p) not in ("Z", "gone") for p in pids)
        os.kill(parent.pid, signal.SIGKILL)
        # not reaped on purpose: the parent stays a zombie, and os.kill(pid, 0)
        # still succeeds on it, which is what a pid poll would look at
        deadline = time.monotonic() + 20  # a liveness bound, not a speed check
        while time.monotonic() < deadline and _state(parent.pid) != "Z":
            time.sleep(0.05)
        assert _state(parent.pid) == "Z"
        while time.monotonic() < deadline:
            alive = [p for p in pids if _state(p) not in ("Z", "gone")]
            if not alive:
                break
            time.sleep(0.1)
        assert not alive, f"workers {alive} outlived their killed parent"
        assert _state(parent.pid) == "Z"  # still unreaped when they noticed
    finally:
        parent.kill()
        parent.wait()
