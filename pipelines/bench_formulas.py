"""Attack benchmark of the scorer: random formulas, the slowest ones, and organic throughput.

``python -m ionicity.pipelines.bench_formulas --count 100000 --organic 100000 --seed 1``
generates grammar-aware random formulas (many elements, large and decimal
counts, nested brackets, hydrates, adducts, charges, ionic-liquid shorthand),
scores each one alone with :func:`ionicity.scorer.record.score_formula` under
a per-formula timer (CPU time, ``time.process_time``, and wall time), and
prints: how many took over the limit (50 ms by default), the ten slowest with
both times, every exception raised (there should be none: a formula the
scorer cannot read is an error row, not an exception), and the throughput of
N distinct C/H/N/O formulas (organic molecules) scored one after the other on
one core, from empty per-formula caches, with a baseline measured in the same
run: the first ``--organic-baseline`` of them scored again with the early
recognition of molecules (:mod:`ionicity.scorer.organic`) turned off, as
before it existed (``--organic-repeat`` alternates the two and prints medians). It also prints the solver's work (:func:`ionicity.scorer.ions.solver_work`)
of the worst formula against the bound the tests hold it to.

Timings on a shared machine are noisy: ``--repeat`` scores the slowest
formulas again in fresh caches and prints every repetition.

>>> formulas = random_formulas(5, seed=3)
>>> len(formulas), len(set(formulas)) == 5
(5, True)
>>> all(text.startswith("C") for text in organic_formulas(20, seed=1))
True
"""
from __future__ import annotations

import argparse
import gc
import inspect
import random
import statistics
import sys
import time

from ionicity.pipelines.pool import warm_forkserver, warm_up
from ionicity.scorer.caching import clear_all
from ionicity.scorer.elements import element_symbols, is_metal
from ionicity.scorer.ions import solver_work, work_bound
from ionicity.scorer.formula import MAX_FORMULA_LENGTH, FormulaError, parse_formula
from ionicity.scorer.grammar import MAX_COUNT, MAX_NESTING_DEPTH
from ionicity.scorer.ions import decompose
from ionicity.scorer.organic import set_organic_shortcut
from ionicity.scorer.record import score_formula

__all__ = ["random_formula", "random_formulas", "extreme_formula", "extreme_formulas", "record_cost", "organic_formulas",
           "time_formulas", "main"]

LIMIT_MS = 50.0
_GC_EVERY = 1000
# code flags of frames that are resumed (generators, coroutines): a resumption is no new call
_RESUMABLE = inspect.CO_GENERATOR | inspect.CO_COROUTINE | inspect.CO_ASYNC_GENERATOR
# elements of real inventories, drawn more often than the rest of the table
_COMMON = ("H", "C", "N", "O", "F", "Na", "Mg", "Al", "Si", "P", "S", "Cl", "K", "Ca", "Ti", "Cr", "Mn", "Fe",
           "Co", "Ni", "Cu", "Zn", "Br", "Ag", "Sn", "I", "Ba", "Pb", "La", "Ce", "Mo", "W", "Li", "B", "Se", "Te")
_IONS = ("[C4mim]", "[emim]", "[N4444]", "[P66614]", "[BF4]", "[PF6]", "[NTf2]", "[OAc]", "OAc", "[Fe(CN)6]")
_CHARGES = ("^2-", "^3+", "(2-)", "+", "-", "2+", "3-", "--")
_DOTS = ("·", ".", "*", "+")


def _count(rng: random.Random) -> str:
    r = rng.random()
    if r < 0.35:
        return ""
    if r < 0.75:
        return str(rng.randint(2, 12))
    if r < 0.9:
        return str(rng.randint(13, 999 if rng.random() < 0.7 else 10_000))
    return f"{rng.randint(0, 9)}.{rng.randint(1, 999)}"


def _element(rng: random.Random, symbols: tuple[str, ...]) -> str:
    return rng.choice(_COMMON) if rng.random() < 0.7 else rng.choice(symbols)


def _group(rng: random.Random, symbols: tuple[str, ...], depth: int) -> str:
    parts = []
    for _ in range(rng.randint(1, 6)):
        r = rng.random()
        if r < 0.12 and depth < 5:
            opening, closing = rng.choice((("(", ")"), ("[", "]"), ("{", "}")))
            parts.append(opening + _group(rng, symbols, depth + 1) + closing + _count(rng))
        elif r < 0.16:
            parts.append(rng.choice(_IONS))
        else:
            parts.append(_element(rng, symbols) + _count(rng))
    return "".join(parts)


def random_formula(rng: random.Random) -> str:
    """One random formula text in the shape the grammar reads (it may still be
    refused, for a count or length over the bounds, which is part of the test)."""
    symbols = element_symbols()
    text = _group(rng, symbols, 0)
    if rng.random() < 0.3:
        text += _group(rng, symbols, 0)
    r = rng.random()
    if r < 0.15:
        text += rng.choice(_DOTS) + rng.choice(("", "2", "5", "0.5", "12", "7.5")) + "H2O"
    elif r < 0.2:
        text += rng.choice(_DOTS) + rng.choice(("", "2")) + rng.choice(("NH3", "H2O2", "H2O"))
    elif r < 0.28:
        text += rng.choice(_CHARGES)
    return text


def random_formulas(count: int, seed: int = 1) -> list[str]:
    """``count`` distinct random formulas (:func:`random_formula`), reproducible from ``seed``."""
    rng = random.Random(seed)
    out: dict[str, None] = {}
    while len(out) < count:
        text = random_formula(rng)
        # mostly within the grammar's length bound, so that most are read;
        # a few longer ones check the refusal
        if len(text) <= MAX_FORMULA_LENGTH or rng.random() < 0.05:
            out.setdefault(text)
    return list(out)


def extreme_formula(rng: random.Random) -> str:
    """One formula at the grammar's edges: many different elements (up to 40),
    counts up to the grammar's largest, or brackets nested to its deepest."""
    symbols = element_symbols()
    shape = rng.randrange(3)
    if shape == 0:
        parts = [_element(rng, symbols) + _count(rng) for _ in range(rng.randint(12, 40))]
    elif shape == 1:
        parts = [_element(rng, symbols) + str(rng.choice((MAX_COUNT, MAX_COUNT - 1, rng.randint(100, MAX_COUNT))))
                 for _ in range(rng.randint(2, 8))]
    else:
        inner = _element(rng, symbols) + _count(rng)
        for _ in range(rng.randint(MAX_NESTING_DEPTH - 1, MAX_NESTING_DEPTH)):
            opening, closing = rng.choice((("(", ")"), ("[", "]"), ("{", "}")))
            inner = _element(rng, symbols) + _count(rng) + opening + inner + closing + str(rng.randint(2, 99))
        parts = [inner]
    return "".join(parts)[:MAX_FORMULA_LENGTH]


def extreme_formulas(count: int, seed: int = 1) -> list[str]:
    """``count`` distinct :func:`extreme_formula` texts, reproducible from ``seed``."""
    rng = random.Random(seed)
    out: dict[str, None] = {}
    while len(out) < count:
        out.setdefault(extreme_formula(rng))
    return list(out)


def record_cost(text: str) -> tuple[int, int]:
    """(Python function calls, solver work units) of scoring ``text`` with every
    per-input cache empty: a count of the work, not a clock, so a test can bound
    it without flaking on a busy machine (the cost of one new formula; warm
    caches only lower it). ``main`` prints how many milliseconds a call costs.

    A generator counts once, not once per item it yields: the count is of
    calls, so a loop inside one call (a generator over every atom) is not in
    it; the benchmark's timings are.
    """
    clear_all()
    calls = [0]
    started: set = set()

    def count(frame, event, arg):
        if event == "call":
            if frame.f_code.co_flags & _RESUMABLE:
                if frame in started:
                    return
                started.add(frame)
            calls[0] += 1

    before = solver_work()
    sys.setprofile(count)
    try:
        score_formula(text)
    finally:
        sys.setprofile(None)
    return calls[0], solver_work() - before


def organic_formulas(count: int, seed: int = 1) -> list[str]:
    """``count`` distinct C/H/N/O formulas of plausible molecules: C1-C40, hydrogen
    up to the saturated 2C + N + 2, up to 8 N and 16 O (Hill order); about
    280,000 such formulas exist, so 100,000 distinct ones come quickly."""
    rng = random.Random(seed)
    out: dict[str, None] = {}
    draws = 0
    while len(out) < count:
        draws += 1
        if draws > 20 * count + 1000:
            raise ValueError(f"could draw only {len(out):,} distinct organic formulas of the {count:,} asked")
        c = rng.randint(1, 40)
        n = rng.choice((0, 0, 0, 1, 1, 2, 3, 4, 5, 6, 7, 8))
        o = rng.choice((0, 0, 1, 1, 2, 2, 3, 4, 5, 6, 7, 8, 9, 10, 12, 14, 16))
        h = rng.randint(max(0, c // 2 - 2), 2 * c + n + 2)
        text = f"C{'' if c == 1 else c}" + (f"H{'' if h == 1 else h}" if h else "")
        text += (f"N{'' if n == 1 else n}" if n else "") + (f"O{'' if o == 1 else o}" if o else "")
        out.setdefault(text)
    return list(out)


def _formula_size(text: str) -> int:
    """Elements x total atoms of a formula (1 for one that does not parse):
    the size the solver's work bound is stated in."""
    try:
        comp = parse_formula(text)
    except ValueError:
        return 1
    return max(1, len(comp.counts)) * max(1, round(sum(n for _, n in comp.counts)))


def solve(text: str):
    """The solver stage alone: parse and decompose (None for a formula the grammar refuses)."""
    try:
        comp = parse_formula(text)
    except FormulaError:
        return None
    return decompose(comp)


STAGES = {"score": score_formula, "solve": solve}


def time_formulas(formulas: list[str], stage: str = "score", collect: bool = True,
                  ) -> tuple[list[tuple[float, float, str]], list[tuple[str, str]]]:
    """Score (or only solve) each formula once; ((cpu_ms, wall_ms, formula) per
    formula, (formula, exception) per raise). ``collect=False`` leaves the
    garbage collector as the process set it (a throughput, not per-formula costs)."""
    timings, raised = [], []
    run = STAGES[stage]
    # the cyclic garbage collector runs outside the timers (every _GC_EVERY formulas): a full
    # collection over the caches of tens of thousands of formulas took up to 2.5 s of CPU and
    # landed on whichever formula was being timed (a cost of the process, not of that formula;
    # the workers of a run freeze their heap and raise the thresholds, pipelines/pool.py)
    enabled = gc.isenabled()
    if collect:
        gc.disable()
    try:
        for i, text in enumerate(formulas):
            if collect and i % _GC_EVERY == 0:
                gc.collect()
            wall0, cpu0 = time.perf_counter(), time.process_time()
            try:
                run(text)
            except Exception as exc:  # the attack's point: report every one, do not stop
                raised.append((text, f"{type(exc).__name__}: {exc}"))
            cpu, wall = time.process_time() - cpu0, time.perf_counter() - wall0
            timings.append((cpu * 1000, wall * 1000, text))
    finally:
        if enabled:
            gc.enable()
    return timings, raised


def _organic_run(formulas: list[str], stage: str) -> tuple[float, float, list[float], list]:
    """Score ``formulas`` one after the other from empty per-formula caches:
    (CPU seconds, wall seconds, CPU ms of each, raised)."""
    clear_all()
    STAGES[stage]("NaCl")  # as a warm worker: tables loaded, nothing of these formulas cached
    wall0, cpu0 = time.perf_counter(), time.process_time()
    # a worker's collector (thresholds raised, main): the forced full collections of the
    # per-formula timings, 100 over the caches of 100,000 formulas, are no cost of a run
    timings, raised = time_formulas(formulas, stage, collect=False)
    cpu, wall = time.process_time() - cpu0, time.perf_counter() - wall0
    return cpu, wall, sorted(t[0] for t in timings), raised


def _organic_throughput(organic: list[str], stage: str, baseline: int, repeat: int) -> list:
    """Print the organic figures: N distinct formulas on one core with the
    early recognition of molecules (scorer.organic), and the first
    ``baseline`` of them with it off, alternating ``repeat`` times; medians."""
    fast, slow, raised = [], [], []
    for _ in range(repeat):
        cpu, wall, cpu_ms, run_raised = _organic_run(organic, stage)
        raised += run_raised
        fast.append((len(organic) / cpu, len(organic) / wall, cpu_ms))
        if baseline:
            set_organic_shortcut(False)
            try:
                sample = organic[:baseline]
                cpu, wall, base_ms, _ = _organic_run(sample, stage)
                slow.append((len(sample) / cpu, len(sample) / wall, base_ms))
            finally:
                set_organic_shortcut(True)
    runs = ", ".join(f"{f[0]:,.0f}" for f in fast)
    fast.sort(key=lambda f: f[0])
    slow.sort(key=lambda b: b[0])
    per_cpu = statistics.median(f[0] for f in fast)
    per_wall = statistics.median(f[1] for f in fast)
    cpu_ms = fast[len(fast) // 2][2]
    print(f"organic_formulas {len(organic)} distinct, whole record ({stage}), one core, {repeat} run(s):"
          f" {per_cpu:,.0f} per CPU second, {per_wall:,.0f} per wall second; raised {len(raised)}"
          f" (runs per CPU second: {runs})")
    print(f"organic cpu_ms median {cpu_ms[len(cpu_ms) // 2]:.3f} p99 {cpu_ms[int(len(cpu_ms) * 0.99)]:.3f}"
          f" max {cpu_ms[-1]:.3f}")
    if slow:
        base_cpu = statistics.median(b[0] for b in slow)
        base_ms = slow[len(slow) // 2][2]
        print(f"organic_baseline (shortcut off, as before it) first {min(baseline, len(organic))}:"
              f" {base_cpu:,.0f} per CPU second, {statistics.median(b[1] for b in slow):,.0f} per wall second;"
              f" cpu_ms median {base_ms[len(base_ms) // 2]:.3f} max {base_ms[-1]:.3f}"
              f" (runs: {', '.join(f'{b[0]:,.0f}' for b in slow)})")
        print(f"organic_speedup_vs_baseline {per_cpu / base_cpu:.1f}")
    return raised


def retime_alone(formulas: list[str], stage: str = "score", times: int = 3) -> list[tuple[float, str]]:
    """(lowest CPU ms of ``times`` cold runs, formula) for each formula, scored
    alone with every per-input cache empty: tells a formula that is dear from
    one that met a busy minute of the machine."""
    out = []
    for text in formulas:
        best = float("inf")
        for _ in range(times):
            clear_all()
            cpu0 = time.process_time()
            STAGES[stage](text)
            best = min(best, (time.process_time() - cpu0) * 1000)
        out.append((best, text))
    return out


def cost_figures(formulas: list[str]) -> dict[str, float]:
    """The counted cost of each formula (:func:`record_cost`) against its cold CPU
    time: the largest call and work counts, and the milliseconds one thousand
    calls cost on this machine (median over formulas of 5 ms or more), which
    turns the fuzz test's call bound into time."""
    worst_calls = worst_work = 0
    rates = []
    for text in formulas:
        clear_all()
        cpu0 = time.process_time()
        score_formula(text)
        cpu_ms = (time.process_time() - cpu0) * 1000
        calls, work = record_cost(text)
        worst_calls, worst_work = max(worst_calls, calls), max(worst_work, work)
        if cpu_ms >= 5 and calls:
            rates.append(cpu_ms / calls * 1000)
    rates.sort()
    return {"max_calls": worst_calls, "max_solver_work": worst_work,
            "ms_per_1000_calls": rates[len(rates) // 2] if rates else float("nan"), "timed": len(rates)}


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m ionicity.pipelines.bench_formulas", description=__doc__.split("\n\n")[0])
    parser.add_argument("--count", type=int, default=10_000, help="random formulas to score (default: 10,000)")
    parser.add_argument("--organic", type=int, default=20_000, help="distinct C/H/N/O formulas for the throughput (default: 20,000)")
    parser.add_argument("--seed", type=int, default=1)
    parser.add_argument("--limit-ms", type=float, default=LIMIT_MS, help="per-formula limit counted (default: 50)")
    parser.add_argument("--repeat", type=int, default=3, help="times the ten slowest are scored again, cold (default: 3)")
    parser.add_argument("--organic-baseline", type=int, default=2_000,
                        help="of those, how many to score again with the organic shortcut off, as before it existed"
                             " (the baseline of the same run; default: 2,000)")
    parser.add_argument("--organic-repeat", type=int, default=1,
                        help="times the organic figure and its baseline are measured, alternating (default: 1)")
    parser.add_argument("--cost", type=int, default=0, metavar="N",
                        help="also count calls and solver work of N random and N/4 extreme formulas, cold (default: 0)")
    parser.add_argument("--stage", choices=tuple(STAGES), default="score",
                        help="score: the whole record (default); solve: parsing and the ion solver alone")
    args = parser.parse_args(argv)
    if min(args.count, args.organic, args.repeat, args.organic_baseline) < 0 or args.organic_repeat < 1:
        parser.error("--count, --organic, --organic-baseline and --repeat must be 0 or more, --organic-repeat 1 or more")
    # tables loaded once, before any timer runs, as a worker loads them (pool.warm_up: a salt, a hydrate, an ionic
    # liquid, a molecule, a slip, the Madelung prototypes); with NaCl alone the run's first formula and first
    # molecule paid the rest (58-113 ms of CPU, "Hs3.183O12Ra6.563Se8W" and "C3HSe5Br5Si" with seed 1)
    warm_up()
    formulas = random_formulas(args.count, args.seed)
    timings, raised = time_formulas(formulas, args.stage)
    over = [t for t in timings if t[0] > args.limit_ms or t[1] > args.limit_ms]
    cpu_over = [t for t in timings if t[0] > args.limit_ms]
    print(f"random_formulas {len(formulas)} seed {args.seed} stage {args.stage}")
    print(f"over_{args.limit_ms:g}_ms_cpu {len(cpu_over)}")
    print(f"over_{args.limit_ms:g}_ms_wall_or_cpu {len(over)}")
    print(f"raised {len(raised)}")
    for text, message in raised[:20]:
        print(f"  raised {text!r}: {message}")
    if cpu_over:
        alone = retime_alone([text for _, _, text in cpu_over], args.stage)
        still = [t for t in alone if t[0] > args.limit_ms]
        print(f"over_{args.limit_ms:g}_ms_cpu re-timed alone (best of 3, fresh caches): {len(still)} still over;"
              f" worst {max(alone)[0]:.2f} ms")
        for cpu, text in sorted(still, reverse=True)[:10]:
            print(f"  still over: {cpu:8.2f}  {text}")
    worst = sorted(timings, reverse=True)[:10]
    print("slowest (cpu_ms wall_ms formula):")
    for cpu, wall, text in worst:
        print(f"  {cpu:8.2f} {wall:8.2f}  {text}")
    for r in range(args.repeat):
        clear_all()
        again, _ = time_formulas([text for _, _, text in worst], args.stage)
        print(f"slowest again, fresh caches, run {r + 1}: max cpu {max((t[0] for t in again), default=0):.2f} ms,"
              f" max wall {max((t[1] for t in again), default=0):.2f} ms")
    ratios = []
    for _, _, text in worst:
        clear_all()
        before = solver_work()
        STAGES[args.stage](text)
        ratios.append(((solver_work() - before) / work_bound(_formula_size(text)), text))
    if ratios:
        print(f"largest solver work / bound (cold): {max(ratios)[0]:.4f} ({max(ratios)[1]})")
    cpu_ms = sorted(t[0] for t in timings)
    if cpu_ms:
        print(f"random cpu_ms median {cpu_ms[len(cpu_ms) // 2]:.3f} p99 {cpu_ms[int(len(cpu_ms) * 0.99)]:.3f}"
              f" max {cpu_ms[-1]:.3f}")
    if args.cost:
        figures = cost_figures(random_formulas(args.cost, args.seed) + extreme_formulas(max(args.cost // 4, 1), args.seed))
        print("cost (cold, counted): " + ", ".join(f"{k} {v:,.3f}" if isinstance(v, float) else f"{k} {v:,}"
                                                   for k, v in figures.items()))
    organic = organic_formulas(args.organic, args.seed)
    if organic and args.stage == "score":
        # as in a worker process: tables warm, the collector's thresholds raised
        # (with the default ones gen-2 passes over the growing caches took a fifth of the time)
        warm_forkserver()
    org_raised = _organic_throughput(organic, args.stage, args.organic_baseline, args.organic_repeat) if organic else []
    return 1 if raised or org_raised else 0


if __name__ == "__main__":
    sys.exit(main())
