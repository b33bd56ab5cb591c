"""The pre-scan of formula texts (scorer/prescan.py) changes no output.

An ordinary formula skips the mixture, solution and slip readers. That is
only allowed where each of them would have left the text alone, so every test
here compares the pre-scan with the readers themselves: on the benchmark's
invented inventory formulas, the reference cases of ``tests/data`` and
random text. The texts that must take the readers' path are spellings those
readers exist for (slips, solutions and mixtures as people type them: common
practice, the same kinds as ``tests/test_slips.py`` and ``tests/test_mixture.py``).
"""
from __future__ import annotations

import csv
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from ionicity.pipelines.bench import realistic_formulas
from ionicity.scorer import record
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.mixture import read_mixture
from ionicity.scorer.prescan import ordinary_formula
from ionicity.scorer.slips import find_slip
from ionicity.scorer.solutions import split_solution

DATA = Path(__file__).parent / "data"


def _column(path: Path, name: str) -> list[str]:
    with path.open(newline="", encoding="utf-8") as f:
        return [row[name] for row in csv.DictReader(f)]


def _corpus() -> list[str]:
    texts = realistic_formulas(3000, seed=5)
    texts += _column(DATA / "formula_cases.csv", "formula")
    texts += _column(Path(__file__).parents[1] / "datasets" / "demo" / "inventory.csv", "formula")
    return list(dict.fromkeys(texts))


def _readers_leave_alone(text: str) -> None:
    assert find_slip(text) is None, text
    assert split_solution(text) is None, text
    assert read_mixture(text, record.score_row) is None, text


def test_ordinary_texts_are_left_alone_by_every_reader_and_score_the_same():
    corpus = _corpus()
    ordinary = [t for t in corpus if ordinary_formula(t) is not None]
    # most inventory formulas are ordinary: the pre-scan is worth having
    assert len(ordinary) > 0.6 * len(corpus)
    for text in ordinary:
        _readers_leave_alone(text)
        assert ordinary_formula(text) == parse_formula(text)
        # the row through every reader is the row of the short path
        assert record._read_row(text) == record._score_text(text), text


# spellings the readers exist for (common practice: how inventories are typed)
NOT_ORDINARY = [
    "NaCI", "KN03", "Fe203", "MgC12", "Nal", "nacl", "CUSO4", "KBR", "FeSO47H2O",  # slips
    "[N222][TFSI]",  # an ion code the library does not know and no rule builds
    "HCl 37%", "NaOH 1 M", "NaOH(aq)1M", "H2SO4 conc.", "HCl (37%)", "K(2N)",  # solutions and grades
    "LiCl-KCl (58.8-41.2 mol%)", "ChCl:urea 1:2", "0.588LiCl·0.412KCl", "KNO3+NaNO3", "CaSO4+2H2O",  # mixtures
    "FLiNaK", "Solar salt",  # blend names (scorer/data/blends.csv)
    "sodium chloride", "Xx2O", "",  # a name, an unknown element, nothing
]


@pytest.mark.parametrize("text", NOT_ORDINARY)
def test_what_a_reader_may_change_takes_the_readers_path(text):
    assert ordinary_formula(text) is None


# capital-only salts and hydrates with a zero in the water count (how inventories are typed,
# common practice): the pre-scan takes them where no slip can be proposed, and must agree with the readers
SHORT_PATH = ["NH4BF4", "KNO3·7H2O", "NH4PF6.6H2O", "NH4F*9H2O", "MgCl2·10H2O", "BaCrO4.10H2O", "SrO.10H2O",
              "Na2SO4·10H2O", "Na2CO3·10H2O"]
# ...and what still takes the readers: a 0 typed for O, CI, a count 1 written out, an O-for-0
# in the salt part, re-cased symbols that read badly as written
STILL_READ = ["KN03·10H2O", "NACI", "KC1", "Fe203.10H2O", "CUSO4", "KBR", "NACL", "MgC12·10H2O", "K(NO3)"]


@pytest.mark.parametrize("text", SHORT_PATH)
def test_capital_salts_and_zero_water_counts_take_the_short_path_and_score_the_same(text):
    assert ordinary_formula(text) is not None
    _readers_leave_alone(text)
    assert ordinary_formula(text) == parse_formula(text)
    assert record._read_row(text) == record._score_text(text), text


@pytest.mark.parametrize("text", STILL_READ)
def test_capital_texts_a_slip_may_explain_still_take_the_readers_path(text):
    assert ordinary_formula(text) is None


# pieces of formulas and of the readers' spellings: symbols, counts, brackets,
# hydrate dots, slip characters, joiners, spaces, units and state words
_PIECES = [
    "Na", "Cl", "K", "S", "O", "H", "Fe", "Cu", "Mg", "Al", "Li", "Br", "I", "Tl", "C", "N", "Co", "Hf",
    "2", "3", "4", "0", "1", "10", "0.5", "(", ")", "[", "]", "·", ".", "*", "5H2O", "12H2O", "l", "q",
    " ", "-", ":", "+", "%", "M", "aq", "soln", "conc", "[C4mim]", "[BF4]", "[N2224]", "[TFSI]", "urea",
]
# the same in capitals, with water counts that hold a zero
_CAPITAL_PIECES = [
    "NA", "CL", "K", "S", "O", "H", "FE", "CU", "MG", "AL", "LI", "BR", "I", "C", "N", "CO", "HF", "NH4", "BF4",
    "NO3", "SO4", "2", "3", "4", "0", "1", "10", "0.5", "(", ")", "[", "]", "·", ".", "*", "10H2O", "20H2O",
    "100H2O", "H2O", "CI", " ", "+", "SOLN", "Cl", "Na",
]


def _accepted_text_is_left_alone(text):
    if ordinary_formula(text) is not None:
        _readers_leave_alone(text)
        assert record._read_row(text) == record._score_text(text)


@settings(max_examples=600, deadline=None)
@given(st.lists(st.sampled_from(_PIECES), min_size=1, max_size=8).map("".join))
def test_random_text_accepted_by_the_prescan_is_left_alone(text):
    _accepted_text_is_left_alone(text)


@settings(max_examples=400, deadline=None)
@given(st.lists(st.sampled_from(_CAPITAL_PIECES), min_size=1, max_size=7).map("".join))
def test_random_capital_text_accepted_by_the_prescan_is_left_alone(text):
    _accepted_text_is_left_alone(text)
