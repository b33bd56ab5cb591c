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

Two later rules are checked the same way: the set-cover floor of a branch (the least
its leftover elements can cost as species, ``ion_search._search``'s ``cover_floor``)
only drops branches no reading at or under the bound lies in; carbon beside hydrogen
is read in no carbide (``ion_search._CARBIDE_EXCLUSIONS``), readings the caller set
aside anyway (``organic_anions.suspect_organic_reading``) or turned into the
organometallic verdict, which now asks ``ion_search.carbide_balances``.

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
from ionicity.scorer import charge_balance, complex_anions, ion_search, ions
from ionicity.scorer.ion_penalties import _IONIC_THRESHOLD
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


def _walk(composition: dict[str, float], budget: int) -> tuple[set, bool, int]:
    """(readings as comparable keys, whether the walk stopped at its limit, work spent)."""
    clear_all()
    left = [budget]
    found, stopped = ion_search._search(composition, 0.0, frozenset(), left, _IONIC_THRESHOLD)
    readings = {(round(p, 9), tuple(sorted((ion.ion_id, n) for ion, n in terms))) for p, terms in found}
    return readings, stopped, budget - left[0]


def test_the_set_cover_floor_keeps_every_reading_and_cuts_the_walk(monkeypatch):
    # ammonium ferric oxalate in Hill form (chemicals' PubChem name of CAS 14221-47-7: triazanium;ethanedioate;
    # iron(3+)): the walk found Fe(3+) gluconate dinitramide hydroxide (4 species) first, and counting species
    # alone let every branch of one organic ion and two more zero-penalty ions run on
    composition = parse_formula("C6H12FeN3O12").as_dict()
    with_cover, stopped, work = _walk(composition, 10**7)
    monkeypatch.setattr(ion_search, "_COVER_ELEMENTS", 0)  # a floor of 0 for every leftover: no cover
    without_cover, stopped_without, work_without = _walk(composition, 10**7)
    assert not stopped and not stopped_without
    assert with_cover == without_cover
    assert any(dict(terms) == {"C2O4(2-)": 3.0, "Fe(3+)": 1.0, "NH4(+)": 3.0} for _, terms in with_cover)
    assert work < work_without / 2


def test_the_set_cover_floor_keeps_every_reading_of_random_formulas(monkeypatch):
    compositions = []
    for text in random_formulas(250, seed=31):
        try:
            compositions.append(parse_formula(text).as_dict())
        except FormulaError:
            continue
    with_cover = [_walk(c, 100_000) for c in compositions]
    monkeypatch.setattr(ion_search, "_COVER_ELEMENTS", 0)
    without_cover = [_walk(c, 100_000) for c in compositions]
    compared = [(a, b) for a, b in zip(with_cover, without_cover) if not a[1] and not b[1]]
    assert len(compared) > 200
    assert all(a[0] == b[0] for a, b in compared)
    # and it never costs more walks to finish: every walk that finished without it finishes with it
    assert not [a for a, b in zip(with_cover, without_cover) if a[1] and not b[1]]
