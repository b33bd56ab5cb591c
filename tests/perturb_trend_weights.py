"""Which test catches a wrong weight of the melting trend index?

Changes each weight of :data:`ionicity.scorer.melting.TREND_WEIGHTS` by +50 % and
by -50 % of its value, one at a time, each in a fresh process, and runs the
melting tests there (``pytest -x -q -p no:cacheprovider``). A change that leaves
every test green means no test can tell that weight from a wrong one.

usage: python tests/perturb_trend_weights.py [--jobs N] [--tests PATH ...]

Prints one line per weight: the first failing test for +50 % and for -50 %, or
``NOT CAUGHT``. Exit codes: 0 every change is caught; 1 some change left all
tests green (listed at the end, one per line, as ``NOT CAUGHT key +50 %``);
2 the tests fail with the weights unchanged, so the run tells nothing.
Run from anywhere; it runs pytest in the repository root.
"""
from __future__ import annotations

import argparse
import os
import subprocess
import sys
from concurrent.futures import ThreadPoolExecutor
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
# the tests that check the index and its weights; the rest of the suite never
# reads TREND_WEIGHTS except through these modules' functions
MELTING_TESTS = (
    "tests/test_melting.py", "tests/test_trend_weights.py", "tests/test_melting_routes.py",
    "tests/test_trend_weights_routes.py",
)
FACTORS = (1.5, 0.5)

_CHILD = """
import sys
from ionicity.scorer import melting
key, factor = sys.argv[1], float(sys.argv[2])
if key:
    melting.TREND_WEIGHTS[key] = melting.TREND_WEIGHTS[key] * factor
import pytest
# known misses (strict xfails) fail when the index gets better, so they cannot catch a wrong weight
sys.exit(pytest.main(["-x", "-q", "-p", "no:cacheprovider", "-rf", "-k", "not known_miss", *sys.argv[3:]]))
"""


def weight_names() -> list[str]:
    """The keys of TREND_WEIGHTS, read in a child process so this script imports nothing of ionicity."""
    code = "from ionicity.scorer.melting import TREND_WEIGHTS; print('\\n'.join(TREND_WEIGHTS))"
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT, check=True)
    return out.stdout.split()


def run_once(key: str, factor: float, tests) -> tuple[int, str]:
    """(pytest exit code, first failing test or '') with one weight scaled by ``factor``."""
    result = subprocess.run([sys.executable, "-c", _CHILD, key, str(factor), *tests],
                            capture_output=True, text=True, cwd=ROOT)
    failed = [line.split()[1] for line in result.stdout.splitlines() if line.startswith("FAILED ")]
    if result.returncode not in (0, 1):
        return result.returncode, f"pytest exit {result.returncode}: {result.stdout[-300:]}{result.stderr[-300:]}"
    return result.returncode, (failed[0] if failed else "")


def _label(factor: float) -> str:
    return f"{(factor - 1) * 100:+.0f} %"


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--jobs", type=int, default=os.cpu_count() or 1, help="processes at once (default: CPUs)")
    parser.add_argument("--tests", nargs="+", default=list(MELTING_TESTS), help="test files to run")
    args = parser.parse_args(argv)

    code, first = run_once("", 1.0, args.tests)
    if code != 0:
        print(f"the tests fail with the weights unchanged ({first}); fix them first", file=sys.stderr)
        return 2
    keys = weight_names()
    cases = [(key, factor) for key in keys for factor in FACTORS]
    with ThreadPoolExecutor(max_workers=max(1, args.jobs)) as pool:
        results = list(pool.map(lambda case: run_once(*case, args.tests), cases))
    caught = {case: result for case, result in zip(cases, results)}
    width = max(len(k) for k in keys)
    print(f"{'weight':<{width}}  {'+50 %':<60}  -50 %")
    missed = []
    for key in keys:
        cells = []
        for factor in FACTORS:
            code, test = caught[(key, factor)]
            if code == 0:
                missed.append(f"NOT CAUGHT {key} {_label(factor)}")
                cells.append("NOT CAUGHT")
            else:
                cells.append(test or f"exit {code}")
        print(f"{key:<{width}}  {cells[0]:<60}  {cells[1]}")
    for line in missed:
        print(line)
    return 1 if missed else 0


if __name__ == "__main__":
    sys.exit(main())
