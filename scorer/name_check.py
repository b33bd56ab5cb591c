"""Names against formulas: what a row's name means, and whether its formula says the same.

:func:`check_name` reads a name (:func:`scorer.name_reader.read_name`) and
compares the formula it means with the row's formula, atom by atom and
water apart, so that two spellings of one compound (``K3Fe(CN)6`` and
``K3[Fe(CN)6]``, ``[Ch]Cl`` and ``C5H14ClNO``) agree:

* ``match``: the same formula unit, lattice water included;
* ``hydrate_differs``: the same salt with a different lattice water
  (``copper(II) sulfate pentahydrate`` on a row of ``CuSO4``);
* ``mismatch``: another compound; the row becomes a warning whose message
  says what the name means;
* ``name_unread``: the name could not be read (a trade name, a typing slip
  in the name): no judgement, and the row keeps its status.

The columns are declared here (group ``audit``) and filled by the engines,
per distinct (formula, name) pair, only when a name column is given
(``--name-col``, ``score_table(name_col=...)``); without one they are not
written, so outputs without names stay as they were.

>>> check_name("KCl", "sodium chloride")
CheckResult(name_formula='NaCl', name_check='mismatch', warning="the name 'sodium chloride' means NaCl, not KCl")
>>> check_name("CuSO4", "copper(II) sulfate pentahydrate").name_check
'hydrate_differs'
>>> check_name("K3Fe(CN)6", "potassium hexacyanoferrate(III)")[:2]
('K3[Fe(CN)6]', 'match')
"""
from __future__ import annotations

from typing import NamedTuple

from ionicity.scorer.caching import per_input
from ionicity.scorer.formula import FormulaError, parse_formula
from ionicity.scorer.ions import decompose_anhydrous
from ionicity.scorer.model import Column
from ionicity.scorer.name_reader import parse_as_name, read_name
from ionicity.scorer.record import _water_suffix, normalized_formula

__all__ = ["GROUP", "COLUMNS", "NAME_CHECKS", "CheckResult", "check_name", "name_formula"]

GROUP = "audit"

NAME_CHECKS: tuple[str, ...] = ("match", "hydrate_differs", "mismatch", "name_unread")

_SOURCE = (
    "IUPAC Red Book 2005 (IR-5 compositional names, IR-9 coordination names); classical and trivial names"
    " from scorer/data/name_words.csv and trivial_names.csv (a source per row)"
)

COLUMNS: tuple[Column, ...] = (
    Column(
        "name_formula", "string", "",
        "the formula the row's name means (--name-col), written as formula_normalized is; empty when the"
        " name cannot be read or no name column is given",
        "scorer.name_reader: name words cut by dynamic programming, compositional-name grammar, charge balance",
        _SOURCE,
    ),
    Column(
        "name_check", "string", "",
        "match, hydrate_differs (same salt, other lattice water), mismatch (the row becomes a warning saying"
        " what the name means) or name_unread; only with a name column",
        "element counts of name_formula against the row's formula, lattice water apart",
        _SOURCE,
    ),
)


class CheckResult(NamedTuple):
    """One (formula, name) pair checked: the two columns and the warning
    (``None`` unless the name means another compound)."""

    name_formula: str | None
    name_check: str | None
    warning: str | None


def _total(parsed) -> tuple[tuple[tuple[str, float], ...], int]:
    return tuple(sorted((s, round(n, 6)) for s, n in parsed.total_counts.items())), parsed.charge


def _anhydrous(parsed) -> tuple:
    counts = dict(parsed.total_counts)
    water = parsed.hydrate_water
    counts["H"] = counts.get("H", 0.0) - 2 * water
    counts["O"] = counts.get("O", 0.0) - water
    return tuple(sorted((s, round(n, 6)) for s, n in counts.items() if abs(n) > 1e-9)), parsed.charge


@per_input(maxsize=65536)
def name_formula(name: str) -> str | None:
    """The normalised formula a name means (as ``formula_normalized`` writes
    it), or ``None`` when the name cannot be read.

    >>> name_formula("ammonium iron(II) sulfate hexahydrate")
    'Fe(NH4)2(SO4)2·6H2O'
    """
    text = read_name(name)
    if text is None:
        return None
    try:
        parsed = parse_formula(text)
    except FormulaError:
        return None
    try:
        dec = decompose_anhydrous(parsed.respelled("", hydrate_water=0.0))
        formula = normalized_formula(parsed, dec)
    except Exception:  # the solver never raises on parsed input; a name must not stop a batch
        return parsed.canonical
    return formula + _water_suffix(parsed.hydrate_water)


@per_input(maxsize=131072)
def check_name(formula, name, formula_normalized: str | None = None) -> CheckResult:
    """Compare a row's formula text with its name.

    Parameters
    ----------
    formula : str
        The row's formula as written.
    name : str
        The row's name; empty or ``None`` gives an empty result.
    formula_normalized : str, optional
        The row's ``formula_normalized`` (used as the name's formula when
        the two agree, saving a second solve).

    Returns
    -------
    CheckResult
    """
    if not isinstance(name, str) or not name.strip():
        return CheckResult(None, None, None)
    text = read_name(name)
    if text is None:
        return CheckResult(None, "name_unread", None)
    try:
        named = parse_formula(text)
    except FormulaError:
        return CheckResult(None, "name_unread", None)
    row = None
    if isinstance(formula, str):
        try:
            row = parse_formula(formula)
        except FormulaError:
            row = parse_as_name(formula)  # a name in the formula cell is scored as what it means
    if row is not None and _total(row) == _total(named):
        return CheckResult(formula_normalized or name_formula(name), "match", None)
    written = name_formula(name) or text
    if row is not None and _anhydrous(row) == _anhydrous(named):
        return CheckResult(written, "hydrate_differs", None)
    warning = f"the name {name.strip()!r} means {written}"
    if row is not None:
        warning += f", not {formula_normalized or formula}"
    return CheckResult(written, "mismatch", warning)
