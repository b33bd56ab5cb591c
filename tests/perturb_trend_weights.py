"""Which test catches a wrong weight of the melting trend index?

Changes each weight of :data:`ionicity.scorer.melting.TREND_WEIGHTS` by +50 % and
by -50 % of its value, one at a time, and runs the melting tests with it
(``pytest -x -q -p no:cacheprovider``); a few child processes share the cases,
emptying every per-input cache between two. A change that leaves
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
import json
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
    "tests/test_trend_weights_routes.py", "tests/test_melting_index_terms.py", "tests/test_melting_second_stage.py",
    "tests/test_melting_audit_rules.py", "tests/test_melting_organic_molecules.py",
    "tests/test_melting_hydrogen_bonds.py", "tests/test_melting_lone_pairs.py", "tests/test_zwitterions.py",
    "tests/test_organic_acids.py", "tests/test_onium_groups.py", "tests/test_melting_ammonium_salts.py",
)
FACTORS = (1.5, 0.5)
# the file that checks a weight family, run first for its weights (pytest -x stops at the first
# failure, so the order changes the run time and which failing test is named, never whether a
# change is caught); the longest prefix wins
FIRST_FILE = {
    "organic_": "tests/test_melting_organic_molecules.py",
    "organic_zwitterion": "tests/test_zwitterions.py",
    "organic_acid": "tests/test_organic_acids.py",
    "molecular_": "tests/test_melting_routes.py",
    "molecular_hydrogen_bond": "tests/test_melting_hydrogen_bonds.py",
    "molecular_lone_pair": "tests/test_melting_lone_pairs.py",
    "intermetallic_": "tests/test_melting_audit_rules.py",
    "ammonium_decomposition_K": "tests/test_melting_ammonium_salts.py",
    "ammonium_lattice_share": "tests/test_melting_ammonium_salts.py",
    "decomposing_anion": "tests/test_melting_ammonium_salts.py",
}


def ordered_tests(key: str, tests) -> list[str]:
    """``tests`` with the file of ``key``'s family (:data:`FIRST_FILE`) first, when it is among them.

    >>> ordered_tests("organic_heavy_atom_kJ_mol", ["tests/test_melting.py", "tests/test_melting_organic_molecules.py"])
    ['tests/test_melting_organic_molecules.py', 'tests/test_melting.py']
    """
    prefixes = [p for p in FIRST_FILE if key.startswith(p)]
    first = FIRST_FILE[max(prefixes, key=len)] if prefixes else None
    return sorted(tests, key=lambda t: t != first)

# One child process runs many cases: importing ionicity, scipy and chemicals costs
# seconds, a melting test run about as much. Between cases every per-input cache is
# emptied (scorer.caching.clear_all), so each case scores afresh with its weights.
_CHILD = """
import io, json, sys, contextlib
from ionicity.scorer import melting
from ionicity.scorer.caching import clear_all
import pytest
cases = json.loads(sys.argv[1])
original = dict(melting.TREND_WEIGHTS)
for key, factor, tests in cases:
    melting.TREND_WEIGHTS.clear()
    melting.TREND_WEIGHTS.update(original)
    if key:
        melting.TREND_WEIGHTS[key] = original[key] * factor
    clear_all()
    out = io.StringIO()
    with contextlib.redirect_stdout(out):
        # known misses (strict xfails) fail when the index gets better, so they cannot catch a wrong weight
        code = pytest.main(["-x", "-q", "-p", "no:cacheprovider", "-rf", "-k", "not known_miss", *tests])
    failed = [line.split()[1] for line in out.getvalue().splitlines() if line.startswith("FAILED ")]
    print("CASE " + json.dumps([key, factor, int(code), failed[0] if failed else ""]), flush=True)
"""


def weight_names() -> list[str]:
    """The keys of TREND_WEIGHTS, read in a child process so this script imports nothing of ionicity."""
    code = "from ionicity.scorer.melting import TREND_WEIGHTS; print('\\n'.join(TREND_WEIGHTS))"
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT, check=True)
    return out.stdout.split()


def run_cases(cases, tests) -> dict:
    """{(key, factor): (pytest exit code, first failing test or '')} for cases run in one child process."""
    payload = [[key, factor, ordered_tests(key, tests)] for key, factor in cases]
    result = subprocess.run([sys.executable, "-c", _CHILD, json.dumps(payload)],
                            capture_output=True, text=True, cwd=ROOT)
    found = {}
    for line in result.stdout.splitlines():
        if line.startswith("CASE "):
            key, factor, code, first = json.loads(line[5:])
            found[(key, factor)] = (code, first)
    for key, factor in cases:
        if (key, factor) not in found:
            found[(key, factor)] = (99, f"child failed: {result.stdout[-300:]}{result.stderr[-300:]}")
    return found


def run_once(key: str, factor: float, tests) -> tuple[int, str]:
    """(pytest exit code, first failing test or '') with one weight scaled by ``factor``."""
    return run_cases([[key, factor]], tests)[(key, factor)]


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
    cases = [[key, factor] for key in keys for factor in FACTORS]
    jobs = max(1, args.jobs)
    shares = [cases[i::jobs] for i in range(jobs)]
    caught = {}
    with ThreadPoolExecutor(max_workers=jobs) as pool:
        for found in pool.map(lambda share: run_cases(share, args.tests), shares):
            caught.update(found)
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
