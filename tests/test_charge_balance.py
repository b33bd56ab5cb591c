"""The fast monatomic knapsack (scorer/charge_balance.py) against its plain form.

The knapsack keeps the charge as a whole number in units of the counts'
common power of ten, writes the choices out only for the last table, ranks
only the states at or under the 64th penalty when it trims a table, and
prepares each leftover once. None of that may change a reading, the order of
tied readings, or the work counted (which decides where a walk stops). The
plain form (tests/_plain_charge_balance.py) is the code before those changes.
One change is allowed in the work: the reach test (``_within_reach``, issue 14)
counts one unit per element and builds no table where no assignment within the
cap can carry the charge; there the plain knapsack must find nothing.

The corpus: every formula of tests/data/formula_cases.csv (readings with their
sources there) and seeded grammar-aware random formulas (decimal counts, many
elements: :func:`ionicity.pipelines.bench_formulas.random_formulas`). No
chemistry value is asserted here: the property is an identity of two
implementations of one algorithm.
"""
from __future__ import annotations

import csv
from pathlib import Path

import pytest

from _plain_charge_balance import plain_assign_monatomic
from ionicity.pipelines.bench_formulas import random_formulas
from ionicity.scorer import charge_balance, ion_search, ions
from ionicity.scorer.caching import clear_all
from ionicity.scorer.formula import FormulaError, parse_formula

CASES = Path(__file__).parent / "data" / "formula_cases.csv"


def _knapsack_questions(texts: list[str], monkeypatch, refused=None) -> list[tuple]:
    """Every question the solver puts to the knapsack while reading ``texts``; with
    ``refused``, the questions the walk's leaves left unasked because the reach test
    failed are appended to it as the knapsack would have been asked them."""
    asked = []
    solved = charge_balance._assign_monatomic_solved
    reach = ion_search._within_reach

    def recording(*args):
        asked.append(args)
        return solved(*args)

    def reaching(remaining, needed, cap):
        remaining = list(remaining)
        answer = reach(remaining, needed, cap)
        if not answer and refused is not None:
            key = tuple(sorted((s, round(n, 9)) for s, n in remaining if n > charge_balance._TOL))
            refused.append((key, needed, cap, frozenset()))
        return answer

    monkeypatch.setattr(charge_balance, "_assign_monatomic_solved", recording)
    monkeypatch.setattr(ion_search, "_within_reach", reaching)
    clear_all()
    for text in texts:
        try:
            comp = parse_formula(text)
        except FormulaError:
            continue
        ions.decompose(comp)
    monkeypatch.undo()
    clear_all()
    return asked


def _answers_and_work(solve, question):
    before = charge_balance.solver_work()
    answer = solve(*question)
    return answer, charge_balance.solver_work() - before


def _compare(texts: list[str], monkeypatch) -> tuple[int, int]:
    """(questions compared, questions the reach test answered without a table)."""
    refused: list = []
    questions = _knapsack_questions(texts, monkeypatch, refused)
    for question in refused:
        # a leaf the reach test spares the knapsack: the plain knapsack, with no state
        # ruled out by redox, finds nothing there either
        assert plain_assign_monatomic(*question) == (), question
    skipped = len(refused)
    for question in questions:
        fast = _answers_and_work(charge_balance._assign_monatomic_solved, question)
        plain = _answers_and_work(plain_assign_monatomic, question)
        # repr as well: 2 == 2.0, but a count written 2.0 where it was 2 would show
        assert fast[0] == plain[0] and repr(fast[0]) == repr(plain[0]), question
        # the reach test counts one unit per element, then the tables count as before
        reach = len(question[0])
        if fast[1] != plain[1] + reach:
            # the reach test built no table: only where the plain knapsack finds nothing
            assert fast[1] == reach and plain[0] == () and plain[1] > 0, question
            skipped += 1
    return len(questions), skipped


def test_reference_formulas_balance_as_the_plain_knapsack(monkeypatch):
    with CASES.open(encoding="utf-8") as f:
        texts = sorted({row["formula"] for row in csv.DictReader(f) if row.get("formula")})
    compared, _ = _compare(texts, monkeypatch)
    assert compared > 250


def test_random_formulas_balance_as_the_plain_knapsack(monkeypatch):
    compared, skipped = _compare(random_formulas(300, seed=5), monkeypatch)
    assert compared > 50
    # the reach test is exercised (and each of its answers checked above)
    assert skipped > 0


@pytest.mark.slow
def test_more_random_formulas_balance_as_the_plain_knapsack(monkeypatch):
    compared, skipped = _compare(random_formulas(3000, seed=1), monkeypatch)
    assert compared > 2500 and skipped > 100


@pytest.mark.parametrize("count", [1.0, 7.0, 0.1, 0.7, 2.81, 3.643, 0.000000001, 1234.123456789, 6455.0, 1.5e-05])
def test_a_count_is_made_whole_exactly(count):
    # the whole count over 10**decimals is the count itself, exactly as Python compares
    _, _, _, decimals, whole, moves = charge_balance._element_choices("Fe", count)
    assert whole / 10 ** decimals == count
    assert all(move == state * whole for move, state, _ in moves)


@pytest.mark.parametrize("scale", [1, 10, 1000, 10 ** 9])
def test_the_scaled_bounds_are_those_of_the_float_comparison(scale):
    # the least c with c / scale >= x and the greatest with c / scale <= x, checked
    # against the comparisons themselves around each bound
    for x in (-3.000001, -0.5, 0.0, 1e-06, 2.81 - 1e-06, 7.0, 12.3456789 + 1e-06, 1e4 + 0.1):
        least = charge_balance._least_scaled(x, scale)
        most = charge_balance._most_scaled(x, scale)
        assert least / scale >= x > (least - 1) / scale
        assert most / scale <= x < (most + 1) / scale
