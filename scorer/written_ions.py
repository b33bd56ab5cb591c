"""Salts written as their ions run together: N2H5HCOO, C2H5NH3NO3, CH3NH3CH3COO, KCH3COO.

A formula written with a bracketed library ion (``(CH3NH3)2SO4``, ``Ca(CH3COO)2``)
names that ion, and the parser passes it to the solver as written
(``ParsedFormula.ion_hints``). The same ions written without brackets
(``CH3NH3HCOO``, ``N2H5CH3COO``) had been read from the atoms alone, and
where an organic ion is among them the atoms say less than the text:
C2H7NO2 is methylammonium formate as written, but ammonium acetate by the
solver's ranking; N2H5HCOO read as methylammonium nitrite; ethylammonium
acetate, the protic ionic liquid written C2H5NH3CH3COO, as a molecule.

Rule (stated, not fitted): a formula whose salt part splits exactly into
library ions written by their formulas (each an alias of the ion library whose
atoms are the ion's, ``CH3COO``, ``C2H3O2``, ``HCOO``, ``N2H5``, ``CH3NH3``,
optionally in round brackets with a count) and at most one monatomic ion
(a metal, a halogen or a chalcogen, with a count), in one way only among the
splits into the fewest pieces, names those ions, as their bracketed spelling
would. The monatomic ion's charge is what balances the written ions, and must
be one of its element's usual states. The rule is applied only where one of
the written ions is organic: a salt of inorganic ions written so (``KNO3``,
``N2H5NO3``) reads the same from its atoms, and ammonium has its own
written-group rule (:mod:`scorer.formula`, ``AMMONIUM_HINT``); N2H5HSO4,
which the atoms read as hydrazinediium sulfate, is left to them. A formula
alias that two library ions of one charge share by their atoms (C4H12N:
tetramethylammonium and butylammonium) names neither, so a Hill formula of
isomers (C4H12NCl) stays the solver's, ambiguous.
"""
from __future__ import annotations

import re

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.elements import is_element_symbol, is_metal
from ionicity.scorer.grammar import FormulaError, parse_element_groups
from ionicity.scorer.ion_library import exact_aliases, ions_by_composition
from ionicity.scorer.ion_penalties import _IONIC_THRESHOLD, _monatomic_options
from ionicity.scorer.model import Ion

__all__ = ["written_ion_hints"]

# an alias written as a formula: element symbols with counts, nothing else
_FORMULA_LIKE = re.compile(r"(?:[A-Z][a-z]?\d*)+")
_SYMBOL_COUNT = re.compile(r"([A-Z][a-z]?)(\d*)")
_COUNT = re.compile(r"\d+")
# the non-metals that stand alone as monatomic anions in a salt (halides, chalcogenides); H, C, N, P, B and Si
# are left to the solver (acids, esters and amines are no salt of them)
_MONATOMIC_NONMETALS = frozenset({"F", "Cl", "Br", "I", "O", "S", "Se", "Te"})
_MAX_LENGTH = 60


@once
def _formula_aliases() -> dict[str, Ion]:
    """Aliases of polyatomic library ions that are written as the ion's own formula (``C2H3O2`` for acetate),
    exact case; an alias two ions share, or whose atoms two library ions of one charge hold (isomers), is left
    out."""
    out: dict[str, Ion] = {}
    shared: set[str] = set()
    for alias, ion in exact_aliases().items():
        if len(ion.composition) < 2 and sum(n for _, n in ion.composition) < 2:
            continue
        if not _FORMULA_LIKE.fullmatch(alias) or not all(is_element_symbol(s) for s, _ in _SYMBOL_COUNT.findall(alias)):
            continue
        try:
            counts, _ = parse_element_groups(alias)
        except FormulaError:
            continue  # a code that only looks like a formula (P66614)
        if sorted(counts.items()) != sorted(ion.composition):
            continue  # OAc is O and Ac by its letters, not acetate's atoms
        if len(ions_by_composition(counts, ion.charge)) > 1:
            continue  # a Hill formula of isomers (C4H12N: tetramethylammonium and butylammonium) names neither
        if alias in out and out[alias].ion_id != ion.ion_id:
            shared.add(alias)
        out.setdefault(alias, ion)
    for alias in shared:
        del out[alias]
    return out


@once
def _trigger_pattern() -> re.Pattern:
    """Any written formula of an organic ion (the ions the rule is applied for), longest first."""
    aliases = sorted((a for a, ion in _formula_aliases().items() if ion.organic),
                     key=len, reverse=True)
    return re.compile("|".join(re.escape(a) for a in aliases))


def _pieces(text: str, i: int):
    """(end, kind, payload, count) of every piece that may start at ``i``: a library ion by its formula (not run
    into a digit or a lower-case letter, which would change its last symbol), a bracketed one with its count, or
    one element with its count."""
    aliases = _formula_aliases()
    if text[i] == "(":
        close = text.find(")", i)
        if close > i + 1:
            ion = aliases.get(text[i + 1:close])
            if ion is not None:
                m = _COUNT.match(text, close + 1)
                yield (m.end() if m else close + 1), "ion", ion, (int(m.group()) if m else 1)
        return
    for j in range(i + 2, min(len(text), i + 16) + 1):
        ion = aliases.get(text[i:j])
        if ion is not None and (j == len(text) or not (text[j].isdigit() or text[j].islower())):
            yield j, "ion", ion, 1
    m = _SYMBOL_COUNT.match(text, i)
    if m and is_element_symbol(m.group(1)):
        yield m.end(), "element", m.group(1), int(m.group(2) or 1)


def _splits(text: str) -> list[tuple]:
    """Every split of ``text`` into the fewest pieces (each a tuple of pieces); [] when none covers it."""
    best: list[list[tuple] | None] = [None] * (len(text) + 1)
    best[len(text)] = [()]
    for i in range(len(text) - 1, -1, -1):
        found: list[tuple] = []
        for end, kind, payload, count in _pieces(text, i):
            rests = best[end]
            if rests:
                found.extend(((kind, payload, count),) + rest for rest in rests)
        if found:
            fewest = min(len(f) for f in found)
            best[i] = [f for f in found if len(f) == fewest][:8]
    return best[0] or []


@per_input(maxsize=16384)
def written_ion_hints(component: str) -> tuple[tuple[str, float], ...]:
    """The ions a salt part written as its ions run together names, as ``(ion_id, count)`` pairs sorted by
    ion_id (what :attr:`ParsedFormula.ion_hints` holds); () where the rule does not apply (module docstring).

    >>> written_ion_hints("N2H5HCOO"), written_ion_hints("CH3NH3CH3COO")
    ((('HCOO(-)', 1.0), ('N2H5(+)', 1.0)), (('CH3COO(-)', 1.0), ('[MeNH3](+)', 1.0)))
    >>> written_ion_hints("KNO3"), written_ion_hints("CH3COOH"), written_ion_hints("HCOOCH3")
    ((), (), ())
    """
    if not component or len(component) > _MAX_LENGTH or not component[0].isupper():
        return ()
    if not _trigger_pattern().search(component):
        return ()  # no organic ion written in it: the split is not tried (most formulas, 1 us)
    readings = set()
    for split in _splits(component):
        reading = _reading(split)
        if reading is None:
            return ()  # a split into as few pieces that no ions balance: the text is not plainly a salt
        readings.add(reading)
    if len(readings) != 1:
        return ()
    polyatomic, _ = next(iter(readings))
    ions = [ion for ion, _ in polyatomic]
    if not any(ion.organic for ion in ions):
        return ()
    return tuple(sorted((ion.ion_id, float(n)) for ion, n in polyatomic))


def _reading(split: tuple):
    """(polyatomic ions with counts, (element, charge, count) or None) of one split, when it is a salt: two pieces
    or more, a library ion among them, at most one monatomic element at a usual state that balances the
    written ions, cations and anions both; None otherwise."""
    if len(split) < 2:
        return None
    polyatomic: dict[Ion, int] = {}
    elements: dict[str, int] = {}
    for kind, payload, count in split:
        if kind == "ion":
            polyatomic[payload] = polyatomic.get(payload, 0) + count
        else:
            elements[payload] = elements.get(payload, 0) + count
    if not polyatomic or len(elements) > 1:
        return None
    charge = sum(ion.charge * n for ion, n in polyatomic.items())
    monatomic = None
    if elements:
        (symbol, n), = elements.items()
        if not is_metal(symbol) and symbol not in _MONATOMIC_NONMETALS:
            return None
        if charge % n:
            return None
        z = -charge // n
        if z == 0 or (z > 0) != is_metal(symbol) or not any(
                kind == "single" and state == z and penalty < _IONIC_THRESHOLD / 2
                for kind, state, penalty in _monatomic_options(symbol, float(n))):
            return None
        monatomic = (symbol, z, n)
    elif charge:
        return None
    signs = {ion.charge > 0 for ion in polyatomic} | ({monatomic[1] > 0} if monatomic else set())
    if signs != {True, False}:
        return None
    return tuple(sorted(polyatomic.items(), key=lambda item: item[0].ion_id)), monatomic
