"""Typing slips in formula text: a reading people did not mean, and the one they did.

People typing an inventory make the same few slips: the digit ``0`` for the
letter O (``KN03``, ``Fe203``), ``1``, ``I`` and ``l`` swapped (``NaCI``,
``CaC12``, ``Kl``), the wrong case (``CUSO4``, ``nacl``), or an ionic-liquid
abbreviation the ion library does not know pasted in brackets
(``[N2224][TFSI]``, which the grammar would read as nitrogen times 2224).
Many of these still parse, as another compound (``KN03`` is KN3, potassium
azide), so a slip is found by *plausibility*, not by the grammar alone:

1. each kind of slip proposes corrected spellings of the text (every ``0``
   that could be an O, every ``I``/``1`` that could be an ``l``, every
   re-casing of the letters into element symbols);
2. the written text and each proposal are read by the parser and the
   charge-balance solver (:func:`scorer.ions.decompose_anhydrous`) and given
   a penalty (:func:`reading_penalty`: no charge-balanced reading, solver
   warnings, rare elements, absurd counts, covalent or metallic rather than
   a salt, number of elements);
3. a proposal is a slip's correction when it reads clearly better than what
   was written (by :data:`MARGIN`), or, where the text itself is evidence
   (a count starting with ``0``; text all in capitals or all in lower case),
   when it reads at all and better.

Valid element strings are therefore not flagged merely because another
reading exists: ``CO``, ``HF``, ``NO``, ``Co``, ``Hf``, ``No``, ``Cs``,
``Sn`` and ``COCl2`` read well as written, and no proposal beats them by the
margin. The check runs once per distinct text (:mod:`scorer.record` caches
the row) and only proposes where the text has a character that can be a slip.

>>> find_slip("KN03").suggested, find_slip("KN03").kind
('KNO3', 'leading_zero')
>>> find_slip("NaCI").suggested
'NaCl'
>>> find_slip("CUSO4").suggested
'CuSO4'
>>> find_slip("CO") is None and find_slip("Hf") is None
True
"""
from __future__ import annotations

import math
import re
from dataclasses import dataclass

from ionicity.scorer import ion_library
from ionicity.scorer.caching import once, per_input
from ionicity.scorer.elements import element_symbols, get_element
from ionicity.scorer.formula import FormulaError, parse_formula
from ionicity.scorer.ions import decompose_anhydrous

__all__ = ["Slip", "SLIP_KINDS", "MARGIN", "find_slip", "reading_penalty", "slip_kind_of"]

# what each kind of slip is called in messages and in the audit summary
SLIP_KINDS: dict[str, str] = {
    "leading_zero": "a count starting with 0 (the digit 0 typed for the letter O)",
    "zero_for_O": "the digit 0 typed for the letter O",
    "I_for_l": "a capital I typed for a lower-case l",
    "one_for_l": "the digit 1 typed for a lower-case l",
    "l_for_I": "a lower-case l typed for a capital I",
    "letter_case": "element symbols in the wrong case",
    "hydrate_dot_missing": "the hydrate dot left out before the water",
    "unknown_abbreviation": "a bracketed ion abbreviation the ion library does not know",
}

# how much better (in penalty points of reading_penalty) a proposal must read
# than the text as written when the text itself gives no evidence of a slip;
# set by hand so that COCl2 (phosgene) stays against CoCl2 and CO against Co
# (common practice: those pairs are both real compounds)
MARGIN = 2.0

# elements an inventory line almost never holds: noble gases, Tc, Pm, and
# everything after Bi (a reading that needs one is a worse reading)
_RARE_FROM_Z = 84
_RARE = frozenset({"He", "Ne", "Ar", "Kr", "Xe", "Tc", "Pm"})
_CLASS_PENALTY = {
    "ionic_salt": 0.0, "acid": 0.0, "base": 0.0, "ionic_liquid_pair": 0.0,
    "element": 0.5, "covalent_molecular": 1.0, "covalent_network": 1.0, "ion": 1.5,
}
_MAX_PROPOSALS = 256
_ZERO = re.compile(r"(?<![.\d])0(?!\.)|(?<=\d)0")
_LETTER_RUN = re.compile(r"[A-Za-z]+")
# digits run straight into a counted water at the end: "MgSO47H2O"
_RUN_INTO_WATER = re.compile(r"(?<=[A-Za-z)\]])(\d{2,})(H2O)$")
_BRACKETED = re.compile(r"\[([^\[\]]+)\]")
# a single element letter with three or more digits: the numeric code of a
# quaternary ammonium or phosphonium ion (N2224, P66614), not a count
_ION_CODE = re.compile(r"[A-Z]\d{3,}[A-Za-z0-9]*")


@dataclass(frozen=True)
class Slip:
    """A slip found in one text: its ``kind`` (a key of :data:`SLIP_KINDS`),
    the corrected spelling (``suggested``; empty when no reading is known)
    and the sentence for the row's message."""

    kind: str
    suggested: str
    message: str


@per_input(maxsize=65536)
def reading_penalty(text: str) -> float:
    """How implausible the reading of ``text`` is (lower is better; ``inf``
    when it does not parse or has no charge-balanced, molecular or metallic
    reading). Common practice, set by hand; see the module docstring.

    >>> reading_penalty("NaCl") < reading_penalty("NaC")
    True
    >>> reading_penalty("Xx")
    inf
    """
    try:
        comp = parse_formula(text)
    except FormulaError:
        return math.inf
    dec = decompose_anhydrous(comp)
    if dec.substance_class == "unknown":
        return math.inf
    penalty = _CLASS_PENALTY.get(dec.substance_class, 2.0)
    penalty += len(dec.notes) + len(comp.notes)
    penalty += 0.5 * len(comp.counts)
    has_carbon = any(s == "C" for s, _ in comp.counts)
    for symbol, count in comp.counts:
        if symbol in _RARE or get_element(symbol).atomic_number >= _RARE_FROM_Z:
            penalty += 3.0
        if count > 100 or (count > 24 and not has_carbon):
            penalty += 4.0
    return penalty


@once
def _symbols_folded() -> dict[str, str]:
    return {s.casefold(): s for s in element_symbols()}


def _recasings(run: str) -> list[str]:
    """Every way to write the letters of ``run`` as element symbols."""
    folded = _symbols_folded()
    out: list[str] = []

    def walk(i: int, parts: list[str]) -> None:
        if len(out) >= _MAX_PROPOSALS:
            return
        if i == len(run):
            out.append("".join(parts))
            return
        for width in (1, 2):
            symbol = folded.get(run[i:i + width].casefold()) if i + width <= len(run) else None
            if symbol:
                walk(i + width, parts + [symbol])

    walk(0, [])
    return out


def _case_proposals(text: str) -> list[str]:
    runs = list(_LETTER_RUN.finditer(text))
    proposals = [""]
    last = 0
    for m in runs:
        options = _recasings(m.group())
        if not options:
            return []
        proposals = [p + text[last:m.start()] + o for p in proposals for o in options][:_MAX_PROPOSALS]
        last = m.end()
    return [p + text[last:] for p in proposals if p + text[last:] != text]


def _replacements(text: str, positions: list[int], options) -> list[str]:
    """Each position replaced alone, and all of them at once, by each option
    that ``options(text, position)`` allows there."""
    proposals: list[str] = []
    for i in positions:
        for new in options(text, i):
            proposals.append(text[:i] + new + text[i + 1:])
    if len(positions) > 1:
        chars = list(text)
        for i in positions:
            allowed = options(text, i)
            if allowed:
                chars[i] = allowed[0]
        proposals.append("".join(chars))
    return proposals


def _zero_options(text: str, i: int) -> list[str]:
    out = ["O"]
    before = text[i - 1] if i else ""
    if before.isupper() and before + "o" in _symbols_folded().values():
        out.append("o")  # C0 -> Co, N0 -> No
    return out


def _ell_options(text: str, i: int) -> list[str]:
    before = text[i - 1] if i else ""
    return ["l"] if before.isupper() and before + "l" in _symbols_folded().values() else []


def _capital_i_options(text: str, i: int) -> list[str]:
    return ["I"]


@per_input(maxsize=65536)
def find_slip(text: str) -> Slip | None:
    """The typing slip in ``text``, or None when it reads as written.

    Parameters
    ----------
    text : str
        Formula text as typed.

    Returns
    -------
    Slip or None
    """
    if not isinstance(text, str) or not text or len(text) > 200:
        return None
    stripped = "".join(text.split())
    abbreviation = _unknown_abbreviation(stripped)
    if abbreviation is not None:
        return abbreviation
    written = reading_penalty(text)
    candidates: list[tuple[float, int, str, str, bool]] = []  # penalty, order, kind, text, evidence

    def consider(kind: str, proposals, evidence: bool) -> None:
        for proposal in dict.fromkeys(proposals):
            if proposal != stripped:
                candidates.append((reading_penalty(proposal), len(candidates), kind, proposal, evidence))

    zeros = [m.start() for m in _ZERO.finditer(stripped) if m.start() > 0 and not stripped[m.start() - 1] in "*+ "]
    if zeros:
        leading = any(not stripped[i - 1].isdigit() for i in zeros)
        consider("leading_zero" if leading else "zero_for_O", _replacements(stripped, zeros, _zero_options), leading)
    capital_i = [i for i, ch in enumerate(stripped) if ch == "I" and _ell_options(stripped, i)]
    if capital_i:
        consider("I_for_l", _replacements(stripped, capital_i, _ell_options), False)
    ones = [i for i, ch in enumerate(stripped) if ch == "1" and _ell_options(stripped, i)]
    if ones:
        consider("one_for_l", _replacements(stripped, ones, _ell_options), False)
    small_l = [i for i, ch in enumerate(stripped) if ch == "l" and not _ell_options(stripped, i)]
    if small_l:
        consider("l_for_I", _replacements(stripped, small_l, _capital_i_options), False)
    water = _RUN_INTO_WATER.search(stripped)
    if water:
        digits = water.group(1)
        consider("hydrate_dot_missing", [
            stripped[:water.start()] + digits[:k] + "·" + digits[k:] + "H2O" for k in range(1, len(digits))
        ], False)
    letters = "".join(ch for ch in stripped if ch.isalpha())
    all_caps = len(letters) > 1 and letters.isupper()
    all_lower = letters.islower()
    if all_caps or all_lower or math.isinf(written):
        consider("letter_case", _case_proposals(stripped), all_lower or math.isinf(written))
    if not candidates:
        return None
    penalty, _, kind, best, evidence = min(candidates)
    if math.isinf(penalty):
        if kind == "leading_zero" and evidence and not math.isinf(written):
            return Slip(kind, "", f"typing slip? {text!r} has {SLIP_KINDS[kind]}; no better reading found")
        return None
    if not (penalty < written - MARGIN or (evidence and penalty < written) or (kind == "leading_zero" and evidence)):
        return None
    others = [c[3] for c in sorted(candidates) if c[3] != best and c[0] <= penalty + 1.0][:2]
    also = f" (also possible: {', '.join(others)})" if others else ""
    return Slip(kind, best, f"typing slip? {text!r} looks like {best}{also}: {SLIP_KINDS[kind]}; values are for {best}")


def _unknown_abbreviation(text: str) -> Slip | None:
    """A bracketed ion code the library does not know (``[N2224]``): an error
    rather than a reading of nitrogen times 2224."""
    for m in _BRACKETED.finditer(text):
        content = m.group(1)
        if ion_library.find_alias(content) is not None:
            continue
        if _ION_CODE.fullmatch(content):
            return Slip(
                "unknown_abbreviation", "",
                f"{m.group()!r} in {text!r}: {SLIP_KINDS['unknown_abbreviation']} (scorer/data/ions.csv),"
                " not read as a formula; write the ion's formula or add the ion to the library",
            )
    return None


def slip_kind_of(message: str | None) -> str | None:
    """The slip kind a row's ``message`` names, or None (how the audit
    summary counts slips without a column of its own).

    >>> slip_kind_of(find_slip("NaCI").message)
    'I_for_l'
    """
    if not message:
        return None
    for kind, description in SLIP_KINDS.items():
        if description in message:
            return kind
    return None
