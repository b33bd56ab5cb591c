"""The walk over polyatomic ions with issue 14's cuts against the walk before them.

The cuts (scorer/ion_search.py, scorer/charge_balance.py): a ceiling at the ionic
threshold (a reading at or above it is never used, :func:`scorer.ions._best`), the
cheapest monatomic option of each element left alone added to a branch's floor,
the per-atom charge relaxation with each candidate's capacity, and the knapsack's
reach test. Each only drops branches or tables that hold no reading the caller
uses, so a read must be what the walk before them gave wherever that walk did not
reach its work limit; they let fewer reads reach it. The plain form
(tests/_plain_ion_search.py, the knapsack's reach test switched off) is the code
before them.

The corpus: every formula of tests/data/formula_cases.csv (readings with their
sources there) and seeded grammar-aware random formulas
(:func:`ionicity.pipelines.bench_formulas.random_formulas`). No chemistry value is
asserted here: the property is an identity of two implementations of one reading.
"""
from __future__ import annotations

import csv
from pathlib import Path

import pytest

from _plain_ion_search import plain_search
from ionicity.pipelines.bench_formulas import random_formulas
from ionicity.scorer import charge_balance, complex_anions, ions
from ionicity.scorer.caching import clear_all
from ionicity.scorer.formula import FormulaError, parse_formula

CASES = Path(__file__).parent / "data" / "formula_cases.csv"


def _reads(texts: list[str], search, monkeypatch) -> dict[str, tuple]:
    """text -> (decomposition, whether a walk of its read reached the work limit)."""
    reached = [False]

    def watched(remaining, needed, excluded, budget, *rest):
        found, stopped = search(remaining, needed, excluded, budget, *rest)
        # a walk whose last knapsack overshoots the limit stops the next one at its start
        reached[0] |= stopped or budget[0] <= 0
        return found, stopped

    monkeypatch.setattr(ions, "_search", watched)
    monkeypatch.setattr(complex_anions, "_search", watched)
    if search is plain_search:
        monkeypatch.setattr(charge_balance, "_within_reach", lambda *args: True)
    clear_all()
    out = {}
    for text in texts:
        try:
            comp = parse_formula(text)
        except FormulaError:
            continue
        reached[0] = False
        ions._decompose.cache_clear()
        out[text] = (ions.decompose(comp), reached[0])
    monkeypatch.undo()
    clear_all()
    return out


def _compare(texts: list[str], monkeypatch) -> tuple[int, int, int]:
    """(reads compared, reads of the plain walk at the limit, reads of the walk at it)."""
    plain = _reads(texts, plain_search, monkeypatch)
    now = _reads(texts, ions._search, monkeypatch)
    assert plain.keys() == now.keys()
    changed = [t for t in plain if not plain[t][1] and plain[t][0] != now[t][0]]
    assert not changed, changed[:5]
    # a read the plain walk finished is finished now as well
    assert not [t for t in plain if now[t][1] and not plain[t][1]]
    return len(plain), sum(r for _, r in plain.values()), sum(r for _, r in now.values())


def test_reference_formulas_read_as_with_the_plain_walk(monkeypatch):
    with CASES.open(encoding="utf-8") as f:
        texts = sorted({row["formula"] for row in csv.DictReader(f) if row.get("formula")})
    compared, plain_reached, reached = _compare(texts, monkeypatch)
    assert compared > 300
    assert plain_reached == reached == 0


def test_random_formulas_read_as_with_the_plain_walk(monkeypatch):
    compared, plain_reached, reached = _compare(random_formulas(400, seed=5), monkeypatch)
    assert compared > 300
    assert reached <= plain_reached


@pytest.mark.slow
def test_more_random_formulas_read_as_with_the_plain_walk_and_fewer_reach_the_limit(monkeypatch):
    compared, plain_reached, reached = _compare(random_formulas(3000, seed=1), monkeypatch)
    assert compared > 2500
    # the cuts are there to let reads finish: fewer reach the limit (measured: see
    # DEVELOPERS.md, "The charge-balance solver and its cost")
    assert reached < plain_reached
