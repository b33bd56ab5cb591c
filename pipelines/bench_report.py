"""Benchmark of ``ionicity report`` on large scored tables.

    python -m ionicity.pipelines.bench_report [--rows 100000 1000000] [--distinct 20000] [--repeat 3]

For each size it writes the invented inventory table of
:mod:`ionicity.pipelines.bench`, scores it with ``ionicity score`` into
Parquet, then times, each in a fresh process and alternating ``--repeat``
times (medians printed):

* ``read_s``: reading the columns the report uses, batch by batch, exactly as
  the report reads them (:func:`ionicity.pipelines.report._batches`), and
  nothing else: the floor the report cannot go below;
* ``aggregate_s``: the report's one streaming pass (:func:`aggregate`), same
  process kind, timed inside it;
* ``report_s``: the whole command ``ionicity report SCORED -o page.html``
  (start-up, matplotlib, figures and page included), wall time;

and prints ``aggregate_over_read`` and ``report_over_read`` (the issue asks
for at most 2 on 10^6 rows) and the report process's peak RSS. The machine is
shared: compare medians, not single runs.
"""
from __future__ import annotations

import argparse
import os
import statistics
import sys
import tempfile

from ionicity.pipelines.bench import _env, _print, _run, write_table

__all__ = ["main"]

_READ_CODE = """
import sys, time
from ionicity.pipelines.report import _batches, plan
t = time.perf_counter()
data, read, text = plan(sys.argv[1])
rows = sum(b.num_rows for b in _batches(sys.argv[1], data.fmt, read, 65536, text))
print(time.perf_counter() - t, rows)
"""

_AGG_CODE = """
import sys, time
from ionicity.pipelines.report import aggregate
t = time.perf_counter()
d = aggregate(sys.argv[1])
print(time.perf_counter() - t, d.rows)
"""


def _timed(code: str, path: str) -> tuple[float, float]:
    import subprocess

    done = subprocess.run([sys.executable, "-c", code, path], capture_output=True, text=True, env=_env(), check=True)
    return float(done.stdout.split()[0]), 0.0


def measure(rows: int, distinct: int, repeat: int, workdir: str) -> dict:
    source = os.path.join(workdir, f"inventory_{rows}.parquet")
    scored = os.path.join(workdir, f"scored_{rows}.parquet")
    page = os.path.join(workdir, f"report_{rows}.html")
    write_table(source, rows, min(distinct, rows))
    _run([sys.executable, "-m", "ionicity", "score", source, "-o", scored, "--quiet", "--overwrite"], env=_env())
    read, agg, whole, rss = [], [], [], []
    for _ in range(repeat):
        read.append(_timed(_READ_CODE, scored)[0])
        agg.append(_timed(_AGG_CODE, scored)[0])
        seconds, peak = _run([sys.executable, "-m", "ionicity", "report", scored, "-o", page, "--overwrite"], env=_env())
        whole.append(seconds)
        rss.append(peak)
    r, a, w = statistics.median(read), statistics.median(agg), statistics.median(whole)
    return {"rows": rows, "scored_file_mib": round(os.path.getsize(scored) / 2**20, 1), "read_s": round(r, 3),
            "aggregate_s": round(a, 3), "report_s": round(w, 3), "aggregate_over_read": round(a / r, 2),
            "report_over_read": round(w / r, 2), "report_peak_rss_mib": round(max(rss), 1)}


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m ionicity.pipelines.bench_report", description=__doc__.split("\n\n")[0])
    parser.add_argument("--rows", type=int, nargs="+", default=[100_000, 1_000_000])
    parser.add_argument("--distinct", type=int, default=20_000)
    parser.add_argument("--repeat", type=int, default=3)
    parser.add_argument("--workdir", help="folder for the generated tables (default: a temporary one)")
    args = parser.parse_args(argv)
    with tempfile.TemporaryDirectory(prefix="ionicity-bench-report-") as tmp:
        for rows in args.rows:
            for key, value in measure(rows, args.distinct, args.repeat, args.workdir or tmp).items():
                _print(key, value)
    return 0


if __name__ == "__main__":
    sys.exit(main())
