"""Benchmark of ``ionicity report`` on large scored tables.

    python -m ionicity.pipelines.bench_report [--rows 100000 1000000] [--distinct 20000] [--repeat 5]

For each size it writes the invented inventory table of
:mod:`ionicity.pipelines.bench`, scores it with ``ionicity score`` into
Parquet, then times, each in a fresh process and alternating ``--repeat``
times (medians printed, with the spread of the command's time):

* ``read_s``: reading the columns the report uses, batch by batch, exactly as
  the report reads them (:func:`ionicity.pipelines.report._batches`), timed
  inside a process that has already imported everything: the floor of the pass;
* ``read_process_s``: a fresh Python process that imports pyarrow and reads
  the same columns the same way (wall time): what reading the columns costs
  someone who runs a program to do it;
* ``aggregate_s``: the report's one streaming pass (:func:`aggregate`), timed
  inside its process;
* ``report_s``: the whole command ``ionicity report SCORED -o page.html``
  (start-up, imports, pass, figures, page), wall time, and its peak RSS;
* ``startup_s``: ``ionicity --help`` (the command line's own start-up, which
  every command pays and the report cannot change).

Ratios: ``aggregate_over_read``, ``report_over_read_process`` (the issue's
"at most twice the time it takes to read the columns used") and
``report_over_read`` (against the in-process floor, start-up included in the
numerator only). Child processes write bytecode to a private cache (the
environment may set PYTHONDONTWRITEBYTECODE, which would make every run
compile ionicity from source, about 0.3 s that no installed copy pays), and
one untimed run warms it. The machine is shared: compare medians, not single
runs.
"""
from __future__ import annotations

import argparse
import json
import os
import statistics
import subprocess
import sys
import tempfile

from ionicity.pipelines.bench import _env, _print, _run, write_table
from ionicity.pipelines.report import plan

__all__ = ["main", "measure"]

_READ_CODE = """
import sys, time
from ionicity.pipelines.report import _batches, plan
t = time.perf_counter()
data, read, text = plan(sys.argv[1])
rows = sum(b.num_rows for b in _batches(sys.argv[1], data.fmt, read, 65536, text))
print(time.perf_counter() - t, rows)
"""

# no ionicity import: pyarrow alone, the columns and dictionary choices the report makes (passed as JSON)
_READ_PROCESS_CODE = """
import json, sys
import pyarrow.parquet as pq
columns, dictionary = json.loads(sys.argv[2])
f = pq.ParquetFile(sys.argv[1], read_dictionary=dictionary)
rows = sum(b.num_rows for b in f.iter_batches(batch_size=65536, columns=columns))
"""

_AGG_CODE = """
import sys, time
from ionicity.pipelines.report import aggregate
t = time.perf_counter()
d = aggregate(sys.argv[1])
print(time.perf_counter() - t, d.rows)
"""


def _bench_env(cache: str) -> dict:
    env = _env()
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    env["PYTHONPYCACHEPREFIX"] = cache
    return env


def _timed(code: str, path: str, env: dict) -> float:
    done = subprocess.run([sys.executable, "-c", code, path], capture_output=True, text=True, env=env, check=True)
    return float(done.stdout.split()[0])


def measure(rows: int, distinct: int, repeat: int, workdir: str) -> dict:
    """Generate, score and time one size (see the module docstring)."""
    source = os.path.join(workdir, f"inventory_{rows}.parquet")
    scored = os.path.join(workdir, f"scored_{rows}.parquet")
    page = os.path.join(workdir, f"report_{rows}.html")
    env = _bench_env(os.path.join(workdir, "pycache"))
    if not os.path.exists(scored):
        write_table(source, rows, min(distinct, rows))
        _run([sys.executable, "-m", "ionicity", "score", source, "-o", scored, "--quiet", "--overwrite"], env=env)
    data, read_cols, text = plan(scored)
    spec = json.dumps([read_cols, [c for c in read_cols if c in text]])
    report = [sys.executable, "-m", "ionicity", "report", scored, "-o", page, "--overwrite"]
    _run(report, env=env)  # warms the bytecode cache and the file cache; not timed
    read, read_proc, agg, whole, rss, start = [], [], [], [], [], []
    for _ in range(repeat):
        read.append(_timed(_READ_CODE, scored, env))
        read_proc.append(_run([sys.executable, "-c", _READ_PROCESS_CODE, scored, spec], env=env)[0])
        agg.append(_timed(_AGG_CODE, scored, env))
        seconds, peak = _run(report, env=env)
        whole.append(seconds)
        rss.append(peak)
        start.append(_run([sys.executable, "-m", "ionicity", "--help"], env=env)[0])
    r, rp, a, w = (statistics.median(v) for v in (read, read_proc, agg, whole))
    return {"rows": rows, "scored_file_mib": round(os.path.getsize(scored) / 2**20, 1), "columns_read": len(read_cols),
            "read_s": round(r, 3), "read_process_s": round(rp, 3), "aggregate_s": round(a, 3),
            "report_s": round(w, 3), "report_s_min_max": f"{min(whole):.3f}-{max(whole):.3f}",
            "startup_s": round(statistics.median(start), 3),
            "aggregate_over_read": round(a / r, 2), "report_over_read_process": round(w / rp, 2),
            "report_over_read": round(w / r, 2), "report_peak_rss_mib": round(max(rss), 1)}


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m ionicity.pipelines.bench_report", description=__doc__.split("\n\n")[0])
    parser.add_argument("--rows", type=int, nargs="+", default=[100_000, 1_000_000])
    parser.add_argument("--distinct", type=int, default=20_000)
    parser.add_argument("--repeat", type=int, default=5)
    parser.add_argument("--workdir", help="folder for the generated tables, kept and reused (default: a temporary one)")
    args = parser.parse_args(argv)
    with tempfile.TemporaryDirectory(prefix="ionicity-bench-report-") as tmp:
        for rows in args.rows:
            for key, value in measure(rows, args.distinct, args.repeat, args.workdir or tmp).items():
                _print(key, value)
    return 0


if __name__ == "__main__":
    sys.exit(main())
