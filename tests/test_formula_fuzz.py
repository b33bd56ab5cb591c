"""Fuzz test of the whole record: random formulas (grammar-aware: many elements,
large and decimal counts, deep nesting, hydrates, charges, written ions) never
raise and never cost more than a fixed bound.

No clock: a test that times formulas flakes on a busy machine. The cost of one
new formula is counted instead (:func:`ionicity.pipelines.bench_formulas.record_cost`,
every per-input cache empty): the Python function calls it makes and the
solver's work units (search nodes plus knapsack transitions). Both counts are
deterministic. The time figures come from the benchmark, ``python -m
ionicity.pipelines.bench_formulas --count 100000 --cost 1000`` (DEVELOPERS.md,
"The cost of one formula"), which also prints what 1,000 counted calls cost
in CPU (1.1 ms cold on the 2-core machine at a load average of 8-9).
``RECORD_WORK_BOUND`` follows from the design: the solver's limit per
composition twice (a hydrate may be read dry and again as its aqua salt) plus
the slip search's allowance and the allowance of an error row's suggestion of
the formula one count away. ``RECORD_CALL_BOUND`` is set by hand (common
practice) a little above the dearest formula of the slow part (51,895 calls,
S10000Gd10000O9999), so that a change that makes any formula much dearer
fails here. A loop inside one call is not counted (a generator counts once):
the melting module's molecular route writes one polarisability per peripheral
atom into its explain line (65,000 for a formula of 65,000 atoms), a cost
only the benchmark's timings see.
"""
from __future__ import annotations

import pytest

from ionicity.pipelines.bench_formulas import extreme_formulas, random_formulas, record_cost
from ionicity.scorer import ions, slips
from ionicity.scorer.record import score_formula

RECORD_CALL_BOUND = 60_000
RECORD_WORK_BOUND = 2 * ions._SEARCH_BUDGET + slips.SLIP_WORK_LIMIT + slips.COUNT_WORK_LIMIT


def _check(texts):
    worst = (0, 0, "")
    for text in texts:
        record = score_formula(text)  # an exception here fails the test: bad text is an error row
        assert record["status"] in {"ok", "warning", "error"}, text
        calls, work = record_cost(text)
        assert calls <= RECORD_CALL_BOUND, (text, calls)
        assert work <= RECORD_WORK_BOUND, (text, work)
        worst = max(worst, (calls, work, text))
    return worst


def test_random_and_extreme_formulas_stay_within_the_cost_bound():
    worst = _check(random_formulas(150, seed=41) + extreme_formulas(50, seed=41))
    # the counters count real work: the dearest of these costs thousands of calls
    assert worst[0] > 1_000, worst


def test_the_cost_counts_tell_a_dear_formula_from_a_cheap_one():
    # a bound that cannot fail is no test: a salt of one cation and one anion
    # costs far less than a double salt of polyatomic ions, which costs solver work
    cheap_calls, _ = record_cost("NaCl")
    dear_calls, dear_work = record_cost("(NH4)2Mn(SO4)2·6H2O")
    assert dear_calls > cheap_calls
    assert dear_work > 1_000


def test_the_slip_search_keeps_its_allowance_for_the_right_correction():
    # Tutton's salt typed with 0 for O twice: the right reading is the dearest
    # correction of the reference lists (an ammonium manganese(II) sulfate,
    # Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, from memory)
    assert slips.find_slip("(NH4)2Mn(S04)2·6H20").suggested == "(NH4)2Mn(SO4)2·6H2O"


def test_a_long_text_is_not_searched_for_slips():
    # beyond _SLIP_MAX_LENGTH characters a text is read as written (no proposals); the same
    # slip in a short text is found (KNO3 typed with a zero; common practice)
    text = "KN03" + "(H2O)" * 13
    assert len(text) > slips._SLIP_MAX_LENGTH
    assert slips.find_slip(text) is None
    assert slips.find_slip("KN03(H2O)").suggested == "KNO3(H2O)"


@pytest.mark.slow
def test_many_random_and_extreme_formulas_stay_within_the_cost_bound():
    _check(random_formulas(3000, seed=42) + extreme_formulas(600, seed=42))
