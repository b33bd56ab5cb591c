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
>>> check_name("CuSO4", "copper(II) sulfate pentahydrate")[:2]
('CuSO4·5H2O', 'hydrate_differs')
>>> check_name("K3[Fe(CN)6]", "potassium hexacyanoferrate(III)")[:2]
('K3[Fe(CN)6]', 'match')
"""
from __future__ import annotations

import re
from typing import NamedTuple

from ionicity.scorer.caching import per_input
from ionicity.scorer.formula import FormulaError, parse_formula
from ionicity.scorer.ions import decompose_anhydrous
from ionicity.scorer.model import Column
from ionicity.scorer.name_reader import read_name
from ionicity.scorer.record import _water_suffix, normalized_formula

__all__ = ["GROUP", "COLUMNS", "NAME_CHECKS", "CheckResult", "check_name", "name_formula", "split_water"]

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


_WATER_SUFFIX = re.compile(r"·(\d+(?:\.\d+)?)?H2O$")


def split_water(formula: str) -> tuple[str, float]:
    """A formula written as the scorer writes it (or as the name reader does)
    split into its anhydrous part and its lattice water.

    >>> split_water("CuSO4·5H2O"), split_water("NaCl"), split_water("CaSO4·0.5H2O")
    (('CuSO4', 5.0), ('NaCl', 0.0), ('CaSO4', 0.5))
    """
    match = _WATER_SUFFIX.search(formula)
    if not match:
        return formula, 0.0
    return formula[: match.start()], float(match.group(1) or 1)


@per_input(maxsize=65536)
def _composition(anhydrous: str) -> tuple | None:
    """Element counts and charge of an anhydrous formula text, ``None`` if it
    does not parse; cached, so each salt is parsed once for all its hydrates."""
    try:
        parsed = parse_formula(anhydrous)
    except FormulaError:
        return None
    counts = {s: round(n, 6) for s, n in parsed.total_counts.items()}
    return tuple(sorted(counts.items())), parsed.charge


def _with_water(composition: tuple, water: float) -> tuple:
    counts = dict(composition[0])
    counts["H"] = round(counts.get("H", 0.0) + 2 * water, 6)
    counts["O"] = round(counts.get("O", 0.0) + water, 6)
    return tuple(sorted(counts.items())), composition[1]


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
def check_name(formula_normalized, name) -> CheckResult:
    """Compare a row's formula, as the scorer wrote it, with its name.

    Parameters
    ----------
    formula_normalized : str or None
        The row's ``formula_normalized`` (``None`` for a row that could not
        be scored).
    name : str
        The row's name; empty or ``None`` gives an empty result.

    Returns
    -------
    CheckResult
        Lattice water is compared apart from the salt, and a formula whose
        water sits inside a complex (``[Fe(H2O)6]Cl3``) matches its hydrate
        spelling (``FeCl3·6H2O``).
    """
    if not isinstance(name, str) or not name.strip():
        return CheckResult(None, None, None)
    text = read_name(name)
    if text is None:
        return CheckResult(None, "name_unread", None)
    named_salt, named_water = split_water(text)
    named = _composition(named_salt)
    if named is None:
        return CheckResult(None, "name_unread", None)
    row = row_salt = None
    if isinstance(formula_normalized, str) and formula_normalized:
        row_salt, row_water = split_water(formula_normalized)
        row = _composition(row_salt)
    if row is not None:
        if row == named and row_water == named_water:
            return CheckResult(formula_normalized, "match", None)
        if _with_water(row, row_water) == _with_water(named, named_water):
            return CheckResult(formula_normalized, "match", None)
        if row == named:
            return CheckResult(row_salt + _water_suffix(named_water), "hydrate_differs", None)
    written = name_formula(name) or text
    warning = f"the name {name.strip()!r} means {written}"
    if row is not None:
        warning += f", not {formula_normalized}"
    return CheckResult(written, "mismatch", warning)
