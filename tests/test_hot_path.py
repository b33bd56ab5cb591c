"""The speed tricks of the batch path give what the plain path gives.

Each trick here has a plain counterpart written out in the test, and the two
are compared on varied inputs: the value_notes of the reference formulas
(tests/data/formula_cases.csv, sources per row there), of the invented demo
inventory (datasets/demo/inventory.csv) and of the benchmark's formulas; the
cache's numpy gather against pyarrow's own ``take``. No reference value is
asserted here: the reference is the plain computation itself (common practice
for a refactoring check).
"""
from __future__ import annotations

import csv
import random
import re

import numpy as np
import pyarrow as pa
import pytest

from ionicity.pipelines.bench import realistic_formulas
from ionicity.pipelines.formula_cache import FormulaCache
from ionicity.pipelines.pool import score_values
from ionicity.pipelines.scheduler import BatchScorer
from ionicity.scorer.note_codes import NOTE_CODES, _ION, _code, short_notes
from ionicity.scorer.record import score_formula


def _every_pattern(text: str | None) -> str | None:
    """short_notes without the literal-prefix filter: every pattern's substitution, in order."""
    if not text:
        return text
    for code, pattern, _ in NOTE_CODES:
        regex = re.compile(r"(?:^|(?<=; ))" + pattern.replace("{ion}", _ION) + r"(?=;|$)")
        text = regex.sub(_code(code), text)
    return text


def _sample_formulas() -> list[str]:
    cases = [r["formula"] for r in csv.DictReader(open("tests/data/formula_cases.csv", encoding="utf-8"))]
    demo = [r["formula"] for r in csv.DictReader(open("datasets/demo/inventory.csv", encoding="utf-8"))]
    return cases + demo + random.Random(3).sample(realistic_formulas(5000), 600)


def test_short_notes_filter_changes_no_cell():
    notes = {score_formula(f)["value_notes"] for f in _sample_formulas()}
    notes.discard(None)
    assert len(notes) > 100  # enough different cells to meet most of the registered notes
    coded = [short_notes(n) for n in sorted(notes)]
    assert coded == [_every_pattern(n) for n in sorted(notes)]
    # the filter skips patterns; a cell that holds every registered note still gets every code
    assert sum(c != n for c, n in zip(coded, sorted(notes))) > len(notes) // 2


def _filled_cache(formulas: list[str], max_entries: int = 200_000) -> FormulaCache:
    cache = FormulaCache(max_entries=max_entries)
    cache.set_output_digits()
    cache.set_short_notes()
    for start in range(0, len(formulas), 97):  # several appends: chunks as the workers return them
        chunk = formulas[start:start + 97]
        cache.add(chunk, score_values(chunk))
        cache.arrays()
    return cache


@pytest.mark.parametrize("index_type", [pa.int32(), pa.int64()])
def test_cache_take_equals_arrow_take(index_type):
    formulas = _sample_formulas()[:500] + ["", "Xx2O"]  # error rows: nulls in most columns
    cache = _filled_cache(list(dict.fromkeys(formulas)))
    arrays = cache.arrays()
    rng = np.random.default_rng(5)
    rows = pa.array(rng.integers(0, len(cache), 3000), type=index_type)
    taken = cache.take(rows, range(len(arrays)))
    for k, array in enumerate(arrays):
        assert taken[k].equals(array.take(rows)), k
    # a slice of rows (an offset into its buffer) and rows with a null go the same way
    part = rows.slice(17, 1000)
    assert all(cache.take(part, [k])[k].equals(a.take(part)) for k, a in enumerate(arrays))
    with_null = pa.array([0, None, 2], type=index_type)
    assert all(cache.take(with_null, [k])[k].equals(a.take(with_null)) for k, a in enumerate(arrays))


def test_cache_take_after_eviction_and_more_rows():
    formulas = list(dict.fromkeys(_sample_formulas()))[:400]
    cache = _filled_cache(formulas[:300], max_entries=320)
    rows = pa.array(np.arange(len(cache))[::-1].copy(), type=pa.int64())
    before = cache.take(rows, range(len(cache.arrays())))  # numpy views made here
    cache.add(formulas[300:], score_values(formulas[300:]))  # evicts: rows renumbered, views dropped
    assert cache.evictions == 1
    arrays = cache.arrays()
    rows = pa.array(np.arange(len(cache)), type=pa.int64())
    after = cache.take(rows, range(len(arrays)))
    assert all(after[k].equals(a.take(rows)) for k, a in enumerate(arrays))
    assert len(before[0]) == 300


def test_rows_found_after_submit_are_the_cache_rows():
    # a batch submitted before its formulas were scored (the engine reads ahead):
    # its rows are looked up among the keys stored since, and must be what
    # the cache's index says
    formulas = list(dict.fromkeys(_sample_formulas()))[:300]
    with BatchScorer(1) as scorer:
        scorer.columns(formulas[:50])  # some known before the ticket
        batch = pa.array(formulas[:200] * 2)
        ticket = scorer.submit(batch)
        rows = scorer.rows_of(ticket).to_pylist()
        assert rows == [scorer.cache.index[f] for f in formulas[:200] * 2]
