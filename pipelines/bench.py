"""Benchmark: ionicity ``score`` against the I/O floor and a per-row baseline.

``python -m ionicity.pipelines.bench --rows N --distinct D`` generates a synthetic
table of N rows holding D distinct realistic formulas (salts, hydrates in
several spellings, double salts, ionic liquids and a few typos, every one of
the D present, the rest drawn uniformly), then measures in one run:

* ``io_floor_seconds``: a fresh Python process that reads the table with
  pyarrow and writes it back in the same format, nothing else;
* ``score_seconds``: ``python -m ionicity score IN -o OUT --quiet``, end to
  end in a fresh process (start-up included, as for the floor);

  both run ``--repeat`` times (default 5), alternating, and the medians are
  the figures (each run is printed too);
* ``per_row_seconds``: what a hand-written pandas ``apply`` costs: read with
  pandas, ``df[formula].apply(score_row)`` where ``score_row`` first clears
  every formula-level cache of the scorer (so each row is scored from
  scratch, as an uncached per-row function would), then write. The apply is
  timed on a random sample of rows and scaled to N (its cost is linear in
  rows: nothing is shared between rows); read and write are taken as the
  floor's.

It prints ``name: value`` lines, among them ``ratio_vs_io_floor``
(score / floor), ``speedup_vs_per_row`` (per-row / score),
``distinct_per_second`` (D / score seconds) and ``peak_rss_mib`` (the largest
resident set of the score process or any of its workers, from ``wait4``).

``--name-col`` adds a ``label`` column of names (each formula's generated
``systematic_name`` in two spellings, 3 % of them on the wrong formula) and
times ``score --name-col label`` alternating with the runs without it:
``name_col_ratio_vs_score`` is the median of the pairs' ratios (with
``--memory-scaling``, both sizes are scored with the names).

``--against PYTHON`` times another install's ``python -m ionicity score`` on the
same table, alternating with this one's (fresh process each, as above):
``paired_ratio_vs_against`` is the median of the pairs' ratios (this tree's
seconds over the other's), so load that comes and goes on a shared machine
hits both sides of a pair alike. The issue that asked "no slower than before"
is answered with a virtual environment of the earlier checkout (DEVELOPERS.md,
"The cost of one formula").

``--memory-scaling`` instead scores a table of N and one of 10 N rows (same
D) and prints both peak RSS figures and their ratio; with ``--engine dask``,
each worker's peak for N and 10 N rows, with D and with 10 D distinct
formulas (:func:`ionicity.pipelines.bench_dask.run_dask_memory`). ``--calibrate`` times
in-process against pooled scoring of fresh distinct formulas, to set
:data:`ionicity.pipelines.scheduler.PARALLEL_MIN_NEW`.
"""
from __future__ import annotations

import argparse
import compileall
import os
import random
import statistics
import subprocess
import sys
import tempfile
import time
from math import gcd

import numpy as np
import pandas as pd
import pyarrow as pa
import pyarrow.csv as pacsv
import pyarrow.parquet as pq

from ionicity.pipelines.formula_cache import FormulaCache
from ionicity.pipelines.scheduler import BatchScorer
from ionicity.scorer.caching import clear_all, registered
from ionicity.scorer.record import score_formula

__all__ = ["realistic_formulas", "write_table", "main"]

# Invented lab inventory: formulas as people type them. Charges are the
# textbook ones (common practice).
_CATIONS = [
    ("Li", 1), ("Na", 1), ("K", 1), ("Rb", 1), ("Cs", 1), ("Ag", 1), ("Tl", 1), ("NH4", 1),
    ("Mg", 2), ("Ca", 2), ("Sr", 2), ("Ba", 2), ("Fe", 2), ("Co", 2), ("Ni", 2), ("Cu", 2), ("Zn", 2),
    ("Mn", 2), ("Cd", 2), ("Pb", 2), ("Sn", 2), ("Al", 3), ("Fe", 3), ("Cr", 3), ("Ga", 3), ("In", 3),
    ("La", 3), ("Ce", 3), ("Nd", 3), ("Y", 3), ("Bi", 3),
]
_ANIONS = [
    ("F", 1), ("Cl", 1), ("Br", 1), ("I", 1), ("OH", 1), ("NO3", 1), ("NO2", 1), ("ClO4", 1), ("ClO3", 1),
    ("BrO3", 1), ("IO3", 1), ("MnO4", 1), ("HCO3", 1), ("HSO4", 1), ("H2PO4", 1), ("CN", 1), ("SCN", 1),
    ("BF4", 1), ("PF6", 1), ("CH3COO", 1), ("HCOO", 1), ("O", 2), ("S", 2), ("SO4", 2), ("SO3", 2),
    ("CO3", 2), ("CrO4", 2), ("Cr2O7", 2), ("MoO4", 2), ("WO4", 2), ("SeO4", 2), ("HPO4", 2), ("S2O3", 2),
    ("C2O4", 2), ("PO4", 3), ("AsO4", 3),
]
_IL_CATIONS = [
    "[C2mim]", "[C3mim]", "[C4mim]", "[C5mim]", "[C6mim]", "[C8mim]", "[C10mim]", "[C4C1mim]", "[C2py]",
    "[C4py]", "[C4mpy]", "[C3mpyr]", "[C4mpyr]", "[C4mpip]", "[N1111]", "[N2222]", "[N4444]", "[P4444]",
    "[P66614]", "[Ch]", "[EtNH3]", "[Et3NH]", "[bmim]", "[emim]", "[hmim]", "[omim]",
]
_IL_ANIONS = [
    "[BF4]", "[PF6]", "[NTf2]", "[OTf]", "[OAc]", "Cl", "Br", "I", "[NO3]", "[SCN]", "[HSO4]", "[BETI]",
    "[N(CN)2]", "[MeSO4]", "[EtSO4]", "[FSI]",
]
_WATERS = ("0.5", "1", "1.5", "2", "3", "4", "5", "6", "7", "8", "9", "10", "12")
_SEPARATORS = ("·", ".", "*")


def _group(symbol: str, n: int) -> str:
    if n == 1:
        return symbol
    multi = sum(ch.isupper() for ch in symbol) > 1 or any(ch.isdigit() for ch in symbol)
    return f"({symbol}){n}" if multi else f"{symbol}{n}"


def _salt(cation: tuple[str, int], anion: tuple[str, int]) -> str:
    (c, qc), (a, qa) = cation, anion
    g = gcd(qc, qa)
    return _group(c, qa // g) + _group(a, qc // g)


def _double_cation_salt(first: tuple[str, int], second: tuple[str, int], anion: tuple[str, int]) -> str:
    return _group(first[0], 1) + _group(second[0], 1) + _group(anion[0], (first[1] + second[1]) // anion[1])


def realistic_formulas(distinct: int, seed: int = 7) -> list[str]:
    """``distinct`` different formula texts as an inventory would hold them.

    Mix (while each pool lasts): anhydrous salts 15 %, ionic liquids 10 %,
    double salts and alums 5 %, typos 2 %, hydrates in three spellings of the
    water dot for the rest.

    >>> f = realistic_formulas(500)
    >>> len(f), len(set(f))
    (500, 500)
    """
    rng = random.Random(seed)
    salts = sorted({_salt(c, a) for c in _CATIONS for a in _ANIONS})
    ils = sorted({c + a for c in _IL_CATIONS for a in _IL_ANIONS})
    doubles = sorted(
        {f"{m}{t}(SO4)2·12H2O" for m in ("K", "Na", "NH4", "Rb", "Cs") for t in ("Al", "Cr", "Fe", "Ga", "In")}
        | {f"{_group(m, 2)}{d}(SO4)2·6H2O" for m in ("K", "NH4", "Rb") for d in ("Fe", "Co", "Ni", "Cu", "Zn", "Mg", "Mn")}
    )
    hydrates = [
        f"{s}{sep}{'' if w == '1' else w}H2O" for s in salts for w in _WATERS for sep in _SEPARATORS
    ]
    for pool in (salts, ils, doubles, hydrates):
        rng.shuffle(pool)
    typos = [s[:-1] + "x" + s[-1] if i % 2 else s.lower() for i, s in enumerate(salts[: max(distinct // 50, 1)])]
    wanted = [
        (salts, int(distinct * 0.15)), (ils, int(distinct * 0.10)), (doubles, int(distinct * 0.05)),
        (typos, int(distinct * 0.02)),
    ]
    chosen: list[str] = []
    seen: set[str] = set()
    for pool, n in wanted:
        for text in pool[:n]:
            if text not in seen:
                seen.add(text)
                chosen.append(text)
    # tables of more distinct formulas than the pools above hold (a Dask
    # benchmark wants 2 x 10^5) go on to salts of two cations and their hydrates
    mixed = [_double_cation_salt(c1, c2, a) for i, c1 in enumerate(_CATIONS) for c2 in _CATIONS[i + 1:]
             for a in _ANIONS if c1[0] != c2[0] and (c1[1] + c2[1]) % a[1] == 0]
    mixed_hydrates = [f"{m}{sep}{'' if w == '1' else w}H2O" for m in mixed for w in _WATERS for sep in _SEPARATORS]
    extra = random.Random(seed + 1)  # its own stream: the tables of fewer formulas stay as they were
    extra.shuffle(mixed)
    extra.shuffle(mixed_hydrates)
    for pool in (hydrates, salts, ils, doubles, mixed, mixed_hydrates):
        for text in pool:
            if len(chosen) >= distinct:
                break
            if text not in seen:
                seen.add(text)
                chosen.append(text)
    if len(chosen) < distinct:
        raise ValueError(f"--distinct {distinct} is more than the {len(chosen)} realistic formulas generated")
    rng.shuffle(chosen)
    return chosen[:distinct]


def inventory_names(formulas: list[str], seed: int = 7) -> tuple[list[str], list[str]]:
    """Two name spellings per formula, as labels of an inventory: the
    generated systematic name (or "unlabelled sample" where there is none)
    and the same name in capitals; 3 % of the formulas carry the name of
    another formula (a label on the wrong bottle)."""
    rng = random.Random(seed)
    names = [score_formula(f)["systematic_name"] or "unlabelled sample" for f in formulas]
    wrong = rng.sample(range(len(formulas)), k=len(formulas) * 3 // 100)
    for i in wrong:
        names[i] = names[(i + 1) % len(names)]
    return names, [n.upper() for n in names]


def write_table(path: str, rows: int, distinct: int, seed: int = 7, chunk_rows: int = 1_000_000,
                names: bool = False) -> None:
    """Write an invented inventory table of ``rows`` rows to ``path``
    (.parquet, .csv or .tsv): ``sample_id`` (int64), ``formula`` (every one of
    ``distinct`` formulas at least once), ``lot`` (text with Unicode, some
    empty) and ``mass_g`` (float64, some null); with ``names``, a ``label``
    column too (:func:`inventory_names`, one of two spellings per row)."""

    if distinct > rows:
        raise ValueError("--distinct cannot exceed --rows")
    texts = realistic_formulas(distinct, seed)
    formulas = pa.array(texts)
    labels = pa.array([n for pair in zip(*inventory_names(texts, seed)) for n in pair]) if names else None
    rng = np.random.default_rng(seed)
    picks = rng.integers(0, distinct, size=rows, dtype=np.int32)
    picks[rng.choice(rows, size=distinct, replace=False)] = np.arange(distinct, dtype=np.int32)
    lots = pa.array(["", "LOT-α-001", "LOT-β-017", "réf. 42", "batch 7, shelf B", "ロット9"])
    writer = None
    fmt = os.path.splitext(path)[1].lower()
    try:
        for start in range(0, rows, chunk_rows):
            n = min(chunk_rows, rows - start)
            mass = rng.gamma(2.0, 25.0, size=n)
            table = pa.table({
                "sample_id": pa.array(np.arange(start, start + n, dtype=np.int64)),
                "formula": formulas.take(pa.array(picks[start:start + n])),
                "lot": lots.take(pa.array(rng.integers(0, len(lots), size=n))),
                "mass_g": pa.array(np.round(mass, 3), mask=rng.random(n) < 0.05),
            })
            if labels is not None:
                spelling = rng.integers(0, 2, size=n, dtype=np.int32)
                table = table.append_column("label", labels.take(pa.array(picks[start:start + n] * 2 + spelling)))
            if writer is None:
                if fmt == ".parquet":
                    writer = pq.ParquetWriter(path, table.schema)
                else:
                    options = pacsv.WriteOptions(delimiter="\t" if fmt == ".tsv" else ",")
                    writer = pacsv.CSVWriter(path, table.schema, write_options=options)
            writer.write_table(table)
    finally:
        if writer is not None:
            writer.close()


# --------------------------------------------------------------------------- measuring

_FLOOR_CODE = """
import sys, pyarrow.parquet as pq, pyarrow.csv as pacsv
src, dst = sys.argv[1], sys.argv[2]
if src.endswith(".parquet"):
    pq.write_table(pq.read_table(src), dst)
else:
    pacsv.write_csv(pacsv.read_csv(src), dst)
"""


def _run(argv: list[str], env: dict | None = None) -> tuple[float, float]:
    """Wall seconds and peak RSS (MiB) of a child process and its descendants."""
    started = time.perf_counter()
    process = subprocess.Popen(argv, env=env, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE)
    stderr = process.stderr.read()
    _, status, usage = os.wait4(process.pid, 0)
    seconds = time.perf_counter() - started
    process.returncode = os.waitstatus_to_exitcode(status)
    if process.returncode != 0:
        raise RuntimeError(f"{' '.join(argv)} failed ({process.returncode}): {stderr.decode(errors='replace')}")
    return seconds, usage.ru_maxrss / 1024.0


def _env() -> dict:
    env = dict(os.environ)
    root = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
    env["PYTHONPATH"] = root + (os.pathsep + env["PYTHONPATH"] if env.get("PYTHONPATH") else "")
    return env


def measure_floor(path: str, workdir: str) -> tuple[float, float]:
    out = os.path.join(workdir, "floor" + os.path.splitext(path)[1])
    return _run([sys.executable, "-c", _FLOOR_CODE, path, out], env=_env())


def measure_score(path: str, workdir: str, workers: int | None = None, columns: str | None = None,
                  name_col: str | None = None, python: str | None = None) -> tuple[float, float]:
    """(wall seconds, peak RSS MiB) of ``python -m ionicity score`` on ``path``; ``python`` (default: this
    interpreter, with this tree first on its path) may be another install's interpreter, run with the
    environment as it is."""
    out = os.path.join(workdir, "scored" + os.path.splitext(path)[1])
    argv = [python or sys.executable, "-m", "ionicity", "score", path, "-o", out, "--quiet", "--overwrite"]
    if workers:
        argv += ["--workers", str(workers)]
    if columns:
        argv += ["--columns", columns]
    if name_col:
        argv += ["--name-col", name_col]
    return _run(argv, env=_env() if python is None else dict(os.environ))


def measure_per_row(path: str, rows: int, sample_rows: int, seed: int = 11) -> tuple[float, int, list[str]]:
    """Seconds per row of an uncached pandas apply, on a random sample."""

    table = pq.read_table(path, columns=["formula"]) if path.endswith(".parquet") else pacsv.read_csv(
        path, convert_options=pacsv.ConvertOptions(include_columns=["formula"], column_types={"formula": "string"}))
    rng = np.random.default_rng(seed)
    sample = table.take(rng.choice(table.num_rows, size=min(sample_rows, table.num_rows), replace=False))
    frame = sample.to_pandas()
    score_formula("NaCl")  # data tables load once, as in any user's session

    def score_row(text):
        clear_all()  # every per-input cache of the scorer (scorer.caching)
        return score_formula(text)

    started = time.perf_counter()
    records = frame["formula"].apply(score_row)
    scored = pd.concat([frame, pd.DataFrame(list(records), index=frame.index)], axis=1)
    seconds = time.perf_counter() - started
    assert len(scored) == len(frame)
    return seconds / len(frame), len(frame), registered()


def calibrate(sizes=(32, 64, 128, 256, 512, 1024, 2048), workers: int | None = None) -> list[tuple[int, float, float]]:
    """Seconds to score ``n`` fresh distinct formulas in-process and in a warm pool."""
    pool_formulas = realistic_formulas(sum(sizes) * 2, seed=3)
    results = []
    with BatchScorer(workers, cache=FormulaCache(), parallel_min_new=1) as pooled:
        pooled.columns(pool_formulas[-64:])  # start and warm the pool
        offset = 0
        for n in sizes:
            serial_texts = pool_formulas[offset:offset + n]
            pooled_texts = pool_formulas[offset + n:offset + 2 * n]
            offset += 2 * n
            started = time.perf_counter()
            BatchScorer(1, cache=FormulaCache()).columns(serial_texts)
            serial = time.perf_counter() - started
            started = time.perf_counter()
            pooled.columns(pooled_texts)
            results.append((n, serial, time.perf_counter() - started))
    return results


def byte_compile() -> bool:
    """Byte-compile ionicity's own modules, as ``pip install`` does for an
    installed package. Run from a source checkout where bytecode is not
    written (``PYTHONDONTWRITEBYTECODE``), every measured process would
    otherwise compile them again, which no installed copy does."""
    root = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
    return all(compileall.compile_dir(os.path.join(root, package), quiet=1) for package in ("scorer", "pipelines"))


def _version_of(python: str) -> str:
    """Where ``python`` imports ionicity's scorer from (and the commit there, when it is a git checkout).

    The scorer, not the ``ionicity`` package: run from inside a checkout, another install's interpreter finds that
    checkout's ``ionicity/__init__.py`` first on its path, while its editable install still maps the scorer and
    the pipelines to its own tree (what its ``score`` runs)."""
    code = ("import ionicity.scorer, os;"
            " print(os.path.dirname(os.path.dirname(os.path.abspath(ionicity.scorer.__file__))))")
    try:
        root = subprocess.run([python, "-c", code], capture_output=True, text=True, check=True).stdout.strip()
    except (OSError, subprocess.CalledProcessError) as error:
        raise SystemExit(f"--against {python}: cannot import ionicity there ({error})") from None
    commit = subprocess.run(["git", "-C", root, "rev-parse", "--short", "HEAD"], capture_output=True, text=True)
    return f"{root} ({commit.stdout.strip() or 'not a git checkout'})"


def _print(name: str, value) -> None:
    if isinstance(value, float):
        value = f"{value:.4g}"
    print(f"{name}: {value}", flush=True)


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m ionicity.pipelines.bench", description=__doc__.split("\n\n")[0])
    parser.add_argument("--rows", type=int, default=1_000_000, help="rows of the synthetic table (default: 10^6)")
    parser.add_argument("--distinct", type=int, default=20_000, help="distinct formulas among them (default: 20,000)")
    parser.add_argument("--format", choices=("parquet", "csv"), default="parquet", help="table format (default: parquet)")
    parser.add_argument("--workers", type=int, help="--workers passed to ionicity score (default: every core)")
    parser.add_argument("--repeat", type=int, default=5,
                        help="runs of the floor and of score, alternating; medians are reported (default: 5)")
    parser.add_argument("--baseline-rows", type=int, default=2000,
                        help="rows of the random sample the per-row baseline is timed on (default: 2000)")
    parser.add_argument("--memory-scaling", action="store_true",
                        help="score N and 10 N rows and print both peak RSS figures and their ratio")
    parser.add_argument("--calibrate", action="store_true", help="time in-process against pooled scoring, to set PARALLEL_MIN_NEW"
                             " in pipelines/scheduler.py")
    parser.add_argument("--engine", choices=("local", "dask"), default="local",
                        help="dask: time the local engine, Dask on one worker and on two (pipelines/bench_dask.py)")
    parser.add_argument("--partition-rows", type=int, help="with --engine dask: --partition-rows for the Dask runs")
    parser.add_argument("--name-col", action="store_true",
                        help="add a label column of names (two spellings per formula, 3 %% on the wrong formula) and"
                             " time score with --name-col label too, alternating with the runs without it")
    parser.add_argument("--workdir", help="folder for the generated tables (default: a temporary one)")
    parser.add_argument("--seed", type=int, default=7)
    parser.add_argument("--against", metavar="PYTHON",
                        help="the interpreter of another ionicity install (a virtual environment of an earlier"
                             " checkout): its 'python -m ionicity score' is timed on the same table, alternating with"
                             " this one's; prints score_against_seconds and paired_ratio_vs_against (the median of"
                             " this run's score time over the other's, pair by pair)")
    parser.add_argument("--columns", metavar="LIST",
                        help="also time 'ionicity score --columns LIST' (alternating with all columns) and print"
                             " score_columns_seconds and columns_vs_all_ratio")
    args = parser.parse_args(argv)
    if args.rows < 1 or args.distinct < 1 or args.distinct > args.rows:
        parser.error("need 1 <= --distinct <= --rows")
    if args.repeat < 1:
        parser.error("--repeat must be at least 1")

    # checked before any table is written: an interpreter that cannot import ionicity ends the run at once
    against_version = _version_of(args.against) if args.against else None
    if args.calibrate:
        for n, serial, pooled in calibrate(workers=args.workers):
            _print(f"calibrate_{n}_serial_seconds", serial)
            _print(f"calibrate_{n}_pool_seconds", pooled)
        return 0

    with tempfile.TemporaryDirectory(prefix="ionicity-bench-", dir=args.workdir) as workdir:
        table = os.path.join(workdir, f"table.{args.format}")
        _print("rows", args.rows)
        _print("distinct", args.distinct)
        _print("format", args.format)
        _print("cpu_count", os.cpu_count())
        _print("bytecode_compiled", "yes" if byte_compile() else "no")
        if args.engine == "dask":
            # imports distributed when asked for only
            from ionicity.pipelines.bench_dask import run_dask_bench, run_dask_memory

            if args.memory_scaling:
                run_dask_memory(lambda path, n, d: write_table(path, n, d, args.seed), args.rows, args.distinct,
                                workdir, _env(), args.partition_rows, _print)
                return 0
            write_table(table, args.rows, args.distinct, args.seed)
            run_dask_bench(table, workdir, args.repeat, _env(), args.partition_rows, _print)
            return 0
        if args.memory_scaling:
            figures = []
            for rows in (args.rows, args.rows * 10):
                write_table(table, rows, args.distinct, args.seed, names=args.name_col)
                seconds, rss = measure_score(table, workdir, args.workers, "label" if args.name_col else None)
                _print(f"score_seconds_{rows}_rows", seconds)
                _print(f"peak_rss_mib_{rows}_rows", rss)
                figures.append(rss)
                os.remove(table)
            _print("peak_rss_ratio_10x_rows", figures[1] / figures[0])
            return 0
        write_table(table, args.rows, args.distinct, args.seed, names=args.name_col)
        # floor and score alternate, --repeat times each: on a shared machine
        # one pair can be off by a third; the medians are the figures
        floors, scores, chosen, named, against = [], [], [], [], []
        if args.against:
            _print("against", args.against)
            _print("against_version", against_version)
        for _ in range(args.repeat):
            floors.append(measure_floor(table, workdir))
            scores.append(measure_score(table, workdir, args.workers))
            if args.against:
                against.append(measure_score(table, workdir, args.workers, python=args.against))
            if args.columns:
                chosen.append(measure_score(table, workdir, args.workers, args.columns))
            if args.name_col:
                named.append(measure_score(table, workdir, args.workers, name_col="label"))
        if args.name_col:
            _print("name_col_score_seconds_each", ", ".join(f"{s:.3f}" for s, _ in named))
            _print("name_col_score_seconds", statistics.median(s for s, _ in named))
            _print("name_col_ratio_vs_score", statistics.median(n / s for (n, _), (s, _) in zip(named, scores)))
            _print("name_col_peak_rss_mib", max(r for _, r in named))
        floor = statistics.median(f for f, _ in floors)
        seconds = statistics.median(s for s, _ in scores)
        floor_rss = max(r for _, r in floors)
        rss = max(r for _, r in scores)
        per_row, sampled, cleared = measure_per_row(table, args.rows, args.baseline_rows)
        _print("repeats", args.repeat)
        _print("io_floor_seconds_each", ", ".join(f"{f:.3f}" for f, _ in floors))
        _print("score_seconds_each", ", ".join(f"{s:.3f}" for s, _ in scores))
        baseline = floor + per_row * args.rows
        _print("io_floor_seconds", floor)
        _print("score_seconds", seconds)
        _print("per_row_seconds_per_row", per_row)
        _print("per_row_sample_rows", sampled)
        _print("per_row_caches_cleared", ", ".join(cleared))
        _print("per_row_seconds_estimated", baseline)
        _print("ratio_vs_io_floor", seconds / floor)
        _print("speedup_vs_per_row", baseline / seconds)
        _print("distinct_per_second", args.distinct / seconds)
        if against:
            _print("score_against_seconds_each", ", ".join(f"{a:.3f}" for a, _ in against))
            _print("score_against_seconds", statistics.median(a for a, _ in against))
            _print("paired_ratio_vs_against", statistics.median(s / a for (s, _), (a, _) in zip(scores, against)))
            _print("against_peak_rss_mib", max(r for _, r in against))
        if chosen:
            chosen_seconds = statistics.median(c for c, _ in chosen)
            _print("score_columns", args.columns)
            _print("score_columns_seconds_each", ", ".join(f"{c:.3f}" for c, _ in chosen))
            _print("score_columns_seconds", chosen_seconds)
            _print("columns_vs_all_ratio", chosen_seconds / seconds)
        _print("io_floor_peak_rss_mib", floor_rss)
        _print("peak_rss_mib", rss)
    return 0


if __name__ == "__main__":
    sys.exit(main())
