"""One scan of a formula text before the readers that may change it.

Three readers look at a text before it is parsed as a compound: mixture
notation and blend names (:mod:`scorer.mixture`), a concentration or grade
written after a solute (:mod:`scorer.solutions`) and typing slips
(:mod:`scorer.slips`). Each returns nothing for an ordinary formula, but each
pays its own checks to find that out, once per distinct text: together about
10 us per text, most of the cost of a new hydrate spelling. :func:`ordinary_formula`
decides it for all three with one regular expression (:data:`_ORDINARY`) and
returns the parsed formula, so that an ordinary text goes straight to the
record; anything it does not accept takes the readers' full path, as before.
It accepts only what none of them would change, so no output depends on it
(``tests/test_prescan.py`` checks that against each reader on the benchmark's
formulas, the reference cases and random text).

>>> ordinary_formula("CuSO4·5H2O").canonical
'CuO4S·5H2O'
>>> ordinary_formula("NaCI") is None, ordinary_formula("LiCl-KCl") is None, ordinary_formula("HCl 37%") is None
(True, True, True)
"""
from __future__ import annotations

import re

from ionicity.scorer.formula import FormulaError, ParsedFormula, parse_formula
from ionicity.scorer.grammar import MAX_COUNT, MAX_FORMULA_LENGTH, MAX_TOTAL_ATOMS, hill_order
from ionicity.scorer.mixture import names_a_blend
from ionicity.scorer.organic import organic_molecule, organic_shortcut_enabled
from ionicity.scorer.onium_groups import written_onium
from ionicity.scorer.written_ions import written_ion_hints
from ionicity.scorer.slips import (
    BEST_PENALTY, IMPOSSIBLE_MAX_LENGTH, MARGIN, MAYBE_SLIP, absurd_count, impossible_composition, lone_element_count, odd_electron_molecule,
    reading_penalty, registry_case_evidence, unknown_abbreviation,
)

__all__ = ["ordinary_formula"]

# Why each part keeps a reader silent (each reader's own checks say the same):
# * characters: letters, digits, brackets and the hydrate dots only -- no
#   whitespace, so no concentration follows a space (scorer.solutions) and no
#   slip hides in spacing; none of the joiners - : + of mixture notation; no
#   q (every (aq) and aq is a state word to scorer.solutions, and no element
#   symbol has a q);
# * not starting with a digit: no leading amount (0.588LiCl·0.412KCl), and
#   a dot-joined text without one is no mixture (scorer.mixture_notation);
# * no "soln"/"solution" (state words) and no closing bracket at the end
#   (where "(2N)" or "(conc)" would be a bracketed concentration);
# * upper and lower case letters both (no all-capitals or all-lower-case
#   re-casing) and no character any slip kind proposes at (slips.MAYBE_SLIP).
_ORDINARY = re.compile(
    r"(?=[^a-z]*[a-z])(?=[^A-Z]*[A-Z])(?!\d)(?!.*(?i:soln|solution))"
    rf"(?!.*(?:{MAYBE_SLIP.pattern}))"
    r"[A-PR-Za-pr-z\d()\[\]·.*]+(?<!\))\Z",
    re.DOTALL,
)


# An organic formula written in capitals only (C6H5NO2, C8H10N4O2): the slip
# reader re-cases every such text (C6H5No2, C6H5NO2 with Ho...) and solves the
# proposals, 5-100 ms a formula. It cannot find a slip in one when:
# * no character gives it evidence of a slip (what the regular expression
#   refuses): no 0 right after a letter (a leading zero), no CI (chlorine
#   mistyped), no NI or SI (Ni and Si in lost case: slips' capital I after a letter it makes a symbol with), no count 1 written out (C1 for Cl), no count right after a group whose brackets may have
#   been left out (NH42CO3 for (NH4)2CO3: slips._BRACKETLESS_GROUP); with no evidence a proposal
#   must read better than the text by slips.MARGIN;
# * and no proposal can: every reading costs at least 1.0 in
#   slips.reading_penalty (0.5 per element; one element alone is an element,
#   a network or a metal, 0.5 or more for its class), so the text's own
#   penalty must be at most MARGIN + 1.0. A molecule of scorer.organic of at
#   most four elements (C, H, N, O, S, P, F, I: none rare) with no count over
#   100 has 0.5 per element + 1.0 (covalent molecular) <= 3.0 without the
#   solver; any other such text is asked (reading_penalty, which the record's
#   solver call then finds in its cache).
_CAPITALS = re.compile(
    r"(?!.*[A-Z]0)(?!.*[CNS]I)(?!.*[A-Z]1(?!\d))(?!.*(?:NH4|OH|NO[23]|[SC]O[34]|PO4)\d)[CHNOSPFI][CHNOSPFI\d]*\Z")
_LEAST_READING_PENALTY = 1.0
_MOLECULE_MAX_ELEMENTS = 4
_MOLECULE_MAX_COUNT = 100

# A hydrate whose lattice-water count holds a zero (MgCl2·10H2O): the slip
# reader proposes an O for a 0 inside a count only where the count is absurd
# (slips.absurd_count) or belongs to an element other than C and H, and a
# count after the hydrate dot belongs to none; the rest of the text must be
# ordinary with the count left out (no other character a slip could be).
# 12 % of the benchmark's distinct texts, about 15 us each through the readers.
_WATER_WITH_ZERO = re.compile(r"(?P<salt>[^0]+[·.*])(?=[1-9]\d*H2O\Z)\d*0")

# Any other text in capitals only (NH4BF4, KNO3·7H2O): every kind of slip
# but the evidence kinds ruled out here (a 0 not inside a count, CI, or an I after B, L, N, S, T: Bi, Li, Ni, Si,
# Ti in lost case, a count
# 1 written out) proposes only where the text reads worse than
# slips.MARGIN + slips.BEST_PENALTY (slips.find_slip), so a text that reads
# at least that well as written (slips.reading_penalty: the solver's reading,
# which the record then finds in its cache) has no slip. The characters are
# those of _ORDINARY in capitals: no space, joiner, state word, leading digit
# or closing bracket at the end, so no mixture or solution reader applies.
_CAPITAL_TEXT = re.compile(
    r"(?!\d)(?!.*(?:SOLN|SOLUTION))(?!.*(?<!\d)0)(?!.*[BCLNST]I)(?!.*[A-Z]1(?!\d))"
    r"[A-PR-Z\d()\[\]·.*]+(?<!\))\Z",
    re.DOTALL,
)


def ordinary_formula(text: str) -> ParsedFormula | None:
    """``text`` parsed, when it is an ordinary formula that no mixture,
    solution or slip reading would change; ``None`` otherwise (the text then
    takes the full path of :func:`scorer.record.score_row`).

    A bracketed ion the library does not know (``[N222]``), a blend name
    (``FLiNaK``) and a text that does not parse are not ordinary.
    """
    if not _ORDINARY.match(text):
        if _CAPITALS.match(text):
            return _capital_formula(text) if organic_shortcut_enabled() else None
        if _CAPITAL_TEXT.match(text):
            return _capital_salt(text)
        water = _WATER_WITH_ZERO.match(text)
        if water is None or not _ORDINARY.match(water.group("salt") + "H2O") or absurd_count(text):
            return None
    if "[" in text and unknown_abbreviation(text) is not None:
        return None
    if names_a_blend(text):
        return None
    try:
        comp = parse_formula(text)
    except FormulaError:
        return None
    # an element no shelf holds a compound of, or one metal with a count (Nh3, No2, Co2), in a short text: the slip
    # reader's
    return None if len(text) <= IMPOSSIBLE_MAX_LENGTH and impossible_composition(comp.counts) else comp


def _capital_formula(text: str) -> ParsedFormula | None:
    """``text`` parsed, when written in capitals only and no slip reading can
    beat it (see the comment on :data:`_CAPITALS`); ``None`` otherwise."""
    if names_a_blend(text):
        return None
    comp = _capital_parse(text)
    if comp is None:
        try:
            comp = parse_formula(text)
        except FormulaError:
            return None
    if comp.notes or ("0" in text and lone_element_count(text)) or odd_electron_molecule(comp):
        # one element with a count no molecule has (H20), or a short text that reads as a radical
        # (CD, SN: capitals that lost their case): the slip reader decides
        return None
    if (len(comp.counts) <= _MOLECULE_MAX_ELEMENTS and all(n <= _MOLECULE_MAX_COUNT for _, n in comp.counts)
            and organic_molecule(comp) is not None):
        return comp
    return comp if reading_penalty(text) <= MARGIN + _LEAST_READING_PENALTY and not registry_case_evidence(text) \
        else None


def _capital_salt(text: str) -> ParsedFormula | None:
    """``text`` parsed, when written in capitals only and reading well enough
    that no slip is proposed (see the comment on :data:`_CAPITAL_TEXT`)."""
    if names_a_blend(text) or ("[" in text and unknown_abbreviation(text) is not None):
        return None
    try:
        comp = parse_formula(text)
    except FormulaError:
        return None
    # a composition the registry lists no compound of is evidence for a re-casing it does list (PBSO4): the
    # slip reader's (slips.registry_case_evidence)
    return comp if reading_penalty(text) <= MARGIN + BEST_PENALTY and not registry_case_evidence(text) else None


_SYMBOL_COUNT = re.compile(r"([A-Z])(\d*)")


def _capital_parse(text: str) -> ParsedFormula | None:
    """:func:`scorer.formula.parse_formula` of a :data:`_CAPITALS` text (one-letter
    symbols, whole counts, nothing else), read by one regular expression:
    a fifth of the time a molecule's record took. The same ParsedFormula
    (``tests/test_organic.py`` compares them); None where the grammar has
    more to say (the length and count bounds, a C5H5 group, an NH4 ion, an isocyanate or an ester, which it
    marks; ions written run together, scorer.written_ions, and a protonated amine's group on its nitrogen,
    scorer.onium_groups, which it names)."""
    if (len(text) > MAX_FORMULA_LENGTH or "C5H5" in text or "NH4" in text or "COF" in text or "COI" in text
            or text.endswith("NCO") or "COOC" in text or "CO2C" in text):
        return None
    if written_ion_hints(text) or ("NH" in text and written_onium(text) is not None):
        # a salt written as its ions run together (CH3NH3HCOO) or a protonated amine by its group (C6H5NH3NO3):
        # the parser names them
        return None
    totals: dict[str, float] = {}
    for symbol, digits in _SYMBOL_COUNT.findall(text):
        n = int(digits) if digits else 1
        if n > MAX_COUNT:
            return None
        totals[symbol] = totals.get(symbol, 0.0) + n
    if sum(totals.values()) > MAX_TOTAL_ATOMS:
        return None
    return ParsedFormula(text=text, counts=tuple((s, totals[s]) for s in hill_order(totals)))
