"""Properties of ``scorer.score_formula`` that hold for every input.

* Every ionic decomposition is charge-neutral (or carries exactly the charge
  of a lone ion): sum of charge x count over the ``cations`` and ``anions``
  columns (conservation of charge).
* For ``ok`` ionic rows whose oxidation states list every element, the
  states times the element counts add up to the net charge (IUPAC Red Book
  2005, IR-4.6.1: the oxidation numbers of a species sum to its charge).
* Equivalent spellings of the same salt (hydrate separators, ``(H2O)n``,
  Unicode subscripts, stray whitespace) give equal records.
* Arbitrary text never raises and always returns a status in
  {ok, warning, error}, with a message when it is an error.

Hypothesis runs derandomized (a fixed sequence of examples, no example
database), so the suite gives the same result on every machine.
"""
from __future__ import annotations

import csv
import math
import re
import unicodedata
from pathlib import Path

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from ionicity.scorer import parse_formula, score_formula
from ionicity.scorer.caching import clear_all

from _builders import formula_piece as _piece
from _calls import python_calls

DETERMINISTIC = settings(
    derandomize=True,
    database=None,
    deadline=None,
    max_examples=250,
    suppress_health_check=[HealthCheck.too_slow, HealthCheck.filter_too_much],
)

STATUSES = {"ok", "warning", "error"}
IONIC_CLASSES = {"ionic_salt", "acid", "base", "ion", "ionic_liquid_pair"}

CATIONS = [
    ("Li", 1), ("Na", 1), ("K", 1), ("Rb", 1), ("Cs", 1), ("Ag", 1), ("Tl", 1), ("NH4", 1),
    ("Mg", 2), ("Ca", 2), ("Sr", 2), ("Ba", 2), ("Mn", 2), ("Fe", 2), ("Co", 2), ("Ni", 2), ("Cu", 2),
    ("Zn", 2), ("Cd", 2), ("Pb", 2), ("Al", 3), ("Fe", 3), ("Cr", 3), ("Ga", 3), ("La", 3), ("Y", 3),
    ("Bi", 3), ("Zr", 4), ("Th", 4),
]
ANIONS = [
    ("F", -1), ("Cl", -1), ("Br", -1), ("I", -1), ("OH", -1), ("NO3", -1), ("NO2", -1), ("ClO4", -1),
    ("ClO3", -1), ("IO3", -1), ("MnO4", -1), ("HCO3", -1), ("HSO4", -1), ("H2PO4", -1), ("CN", -1),
    ("SCN", -1), ("BF4", -1), ("PF6", -1), ("CH3COO", -1), ("N3", -1),
    ("SO4", -2), ("SO3", -2), ("CO3", -2), ("CrO4", -2), ("Cr2O7", -2), ("C2O4", -2), ("S2O3", -2),
    ("HPO4", -2), ("SeO4", -2), ("MoO4", -2), ("WO4", -2), ("O", -2), ("S", -2),
    ("PO4", -3), ("AsO4", -3), ("N", -3), ("P2O7", -4),
]
WATER = [0, 0.5, 1, 2, 3, 4, 5, 6, 7, 10, 12]
METALS_FOR_OXIDES = ["Fe", "Co", "Mn", "Pb", "Cu", "Ni", "Cr", "V", "Ti", "Sn", "Ce", "Eu", "U", "Mo", "W"]

_SUBSCRIPTS = str.maketrans("0123456789", "₀₁₂₃₄₅₆₇₈₉")
_TERM = re.compile(r"^(?P<ion>.+)\((?P<digits>\d*)(?P<sign>[+-])\)\*(?P<count>\d+(?:\.\d+)?)$")


def salt_text(cation, anion) -> str:
    (c, qc), (a, qa) = cation, anion
    lcm = qc * -qa // math.gcd(qc, -qa)
    return _piece(c, lcm // qc) + _piece(a, lcm // -qa)


def double_salt_text(cation1, cation2, anion) -> str | None:
    """M1 M2 (A)n, with one of each cation (alum-like); None where it cannot balance."""
    (c1, q1), (c2, q2), (a, qa) = cation1, cation2, anion
    if c1 == c2 or (q1 + q2) % -qa:
        return None
    return _piece(c1, 1) + _piece(c2, 1) + _piece(a, (q1 + q2) // -qa)


def ion_net_charge(record) -> float:
    total = 0.0
    for part in filter(None, (record["cations"] or "").split(";") + (record["anions"] or "").split(";")):
        m = _TERM.match(part)
        assert m, f"not an ION(CHARGE)*COUNT term: {part!r}"
        charge = int(m.group("digits") or 1) * (1 if m.group("sign") == "+" else -1)
        total += charge * float(m.group("count"))
    return total


def oxidation_map(text) -> dict[str, float]:
    states = {}
    for part in filter(None, (text or "").split(";")):
        symbol, _, value = part.partition(":")
        states[symbol] = float(value)
    return states


def _csv_formulas() -> list[str]:
    path = Path(__file__).resolve().parent / "data" / "formula_cases.csv"
    with path.open(encoding="utf-8", newline="") as fh:
        return [row["formula"] for row in csv.DictReader(fh)]


cations = st.sampled_from(CATIONS)
anions = st.sampled_from(ANIONS)
salts = st.builds(salt_text, cations, anions)
double_salts = st.builds(double_salt_text, cations, cations, anions).filter(lambda t: t is not None)
oxides = st.builds(
    lambda metal, m, n: _piece(metal, m) + _piece("O", n),
    st.sampled_from(METALS_FOR_OXIDES), st.integers(1, 4), st.integers(1, 6),
)
compounds = st.one_of(salts, double_salts, oxides, st.sampled_from(_csv_formulas()))


# --------------------------------------------------------------------------- charge balance


@DETERMINISTIC
@given(compounds, st.sampled_from(WATER))
def test_ionic_decomposition_is_charge_neutral(text, water):
    if water:
        text = f"{text}·{water:g}H2O"
    record = score_formula(text)
    if record["status"] == "error" or not (record["cations"] or record["anions"]):
        return
    # counts are written with 6 significant digits (Mo(+)*2.66667), so the text balances to about 1e-5
    assert math.isclose(ion_net_charge(record), parse_formula(text).charge, abs_tol=1e-4), (text, record)


@DETERMINISTIC
@given(compounds)
def test_oxidation_states_sum_to_the_net_charge(text):
    record = score_formula(text)
    if record["status"] != "ok" or record["substance_class"] not in IONIC_CLASSES:
        return
    states = oxidation_map(record["oxidation_states"])
    comp = parse_formula(text)
    counts = comp.as_dict()
    if set(states) != set(counts):
        return  # organic ions and neutral adducts leave elements out
    total = sum(states[s] * n for s, n in counts.items())
    # states are written to 3 decimals (Fe3O4: +2.667), so allow that rounding per atom
    assert math.isclose(total, comp.charge, abs_tol=0.0006 * sum(counts.values()) + 1e-9), (text, record)


# --------------------------------------------------------------------------- equivalent spellings

SEPARATORS = ["·", ".", "*", "•", "∙", "⋅", "+", " · ", " x ", "・"]


@st.composite
def respelled(draw):
    """One salt and water count, written two independent ways."""
    salt = draw(st.one_of(salts, double_salts))
    water = draw(st.sampled_from(WATER))

    def spell() -> str:
        body = salt.translate(_SUBSCRIPTS) if draw(st.booleans()) else salt
        if water:
            n = "" if water == 1 else f"{water:g}"
            if draw(st.booleans()):
                body = f"{body}(H2O){n}"
            else:
                body = f"{body}{draw(st.sampled_from(SEPARATORS))}{n}H2O"
        pad = draw(st.sampled_from(["", " ", "  ", "\t"]))
        return pad + body + draw(st.sampled_from(["", " ", "\n"]))

    return spell(), spell()


@DETERMINISTIC
@given(respelled())
def test_equivalent_spellings_give_equal_records(pair):
    first, second = (score_formula(t) for t in pair)
    for column in ("status", "formula_normalized", "cations", "anions", "oxidation_states",
                   "substance_class", "hydrate_water"):
        assert first[column] == second[column], (pair, column)
    if first["status"] != "error":
        assert math.isclose(first["molar_mass_g_mol"], second["molar_mass_g_mol"], rel_tol=1e-12)


# --------------------------------------------------------------------------- arbitrary text

FORMULA_ALPHABET = "ABCFHIKLMNOPSTUVWZabdeghilnorsu0123456789()[]{}·.*+-^ ₂₃₄²³⁺⁻½•"
TOKENS = [
    "Na", "K", "Ca", "Fe", "Cu", "Al", "O", "H", "N", "C", "S", "Cl", "P", "Xx", "[C4mim]", "[BF4]", "bmim",
    "NTf2", "OAc", "SO4", "(", ")", "[", "]", "{", "}", "2", "3", "12", "0.5", "999999", "·", ".", "*", "+",
    "-", "^2-", "3+", "H2O", " ", "½", "₂", "²⁻", "(s)", "(aq)",
]
formula_soup = st.lists(st.sampled_from(TOKENS), max_size=25).map("".join)


def _without_foreign_capitals(text) -> bool:
    """Leave out text with a non-ASCII capital letter (À, Ω): that crash is pinned
    by the strict xfail ``test_formula.py::test_non_ascii_capital_letters_do_not_raise``;
    drop this filter once it passes."""
    return not any(ch.isupper() and not ch.isascii() for ch in unicodedata.normalize("NFKC", text))


def _check_record(text, record):
    assert isinstance(record, dict)
    assert record["status"] in STATUSES, (text, record["status"])
    assert isinstance(record["message"], str)
    if record["status"] == "error":
        assert record["message"].strip(), text
    if record["status"] == "ok":
        assert record["message"] == "", text


@DETERMINISTIC
@given(st.text(max_size=300).filter(_without_foreign_capitals))
def test_any_text_never_raises(text):
    _check_record(text, score_formula(text))


@DETERMINISTIC
@given(st.text(alphabet=FORMULA_ALPHABET, max_size=40))
def test_formula_like_text_never_raises(text):
    _check_record(text, score_formula(text))


@DETERMINISTIC
@given(formula_soup)
def test_formula_token_soup_never_raises_and_is_bounded(text):
    clear_all()  # the cost of a cell never seen, not of a cache hit
    record, calls = python_calls(score_formula, text)
    # the bounded grammar and the bounded ion search (5,000 nodes) cap one cell; the
    # worst of 400 soup examples made about 228,000 Python calls when this was written
    # (measured, this project). Calls, not seconds: the machine's speed does not matter.
    assert calls < 2_000_000, (text, calls)
    _check_record(text, record)


@DETERMINISTIC
@given(st.one_of(st.none(), st.floats(), st.integers(), st.binary(max_size=50), st.booleans()))
def test_non_text_cells_never_raise(cell):
    _check_record(cell, score_formula(cell))


# --------------------------------------------------------------------------- hydrate shortcut

_SALT_PARTS = st.one_of(
    st.builds(salt_text, st.sampled_from(CATIONS), st.sampled_from(ANIONS)),
    st.sampled_from(["CaCO3(H2O)6", "(H2O)2", "H2O", "Fe0.95O", "NH4+", "Fe3+", "2NaCl", "[C4mim][BF4]",
                     "KAl(SO4)2", "Na2CO3.H2O2", "Xx2O", "Cu(NH3)4SO4", "CO(NH2)2", "Fe(CO)5", "CH3OH"]),
)
_WATER_TEXT = st.sampled_from(["H2O", "0.5H2O", "1H2O", "2H2O", "12H2O", "0H2O", "1.5H2O", "99999H2O", "H2O2", "NH3"])


def _full_reading(cleaned):
    from ionicity.scorer import formula

    try:
        return formula._parse_cleaned(cleaned, cleaned, [])
    except formula.FormulaError as exc:
        return str(exc)


def _shortcut_reading(cleaned):
    from ionicity.scorer import formula

    formula._parse_normalised.cache_clear()
    try:
        return formula._parse_normalised(cleaned)
    except formula.FormulaError as exc:
        return str(exc)


def _fields(reading):
    if isinstance(reading, str):
        return reading
    return (reading.text, reading.counts, reading.hydrate_water, reading.charge, reading.ion_hints,
            reading.neutral_adducts, reading.structure_hint, reading.notes)


@DETERMINISTIC
@given(_SALT_PARTS, st.lists(_WATER_TEXT, min_size=1, max_size=3), st.sampled_from(["*", ".", "+"]))
def test_hydrates_read_through_the_cached_salt_read_as_in_full(salt, waters, separator):
    # The parser reads "salt*nH2O" as the cached salt plus water; that must be
    # exactly the composition the full grammar gives, errors included.
    cleaned = separator.join([salt] + waters)
    assert _fields(_shortcut_reading(cleaned)) == _fields(_full_reading(cleaned))


def test_hydrate_shortcut_matches_the_full_reading_on_the_benchmark_corpus():
    from ionicity.scorer.formula import _normalise_text

    from ionicity.pipelines.bench import realistic_formulas

    for text in realistic_formulas(3000, seed=2):
        cleaned = _normalise_text(text)
        assert _fields(_shortcut_reading(cleaned)) == _fields(_full_reading(cleaned)), text
