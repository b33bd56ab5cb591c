"""Typing slips in formula text: a reading people did not mean, and the one they did.

People typing an inventory make the same few slips: the digit ``0`` for the
letter O (``KN03``, ``Fe203``), ``1``, ``I`` and ``l`` swapped (``NaCI``,
``CaC12``, ``Kl``), the wrong case (``CUSO4``, ``nacl``), or an ionic-liquid
abbreviation the ion library does not know pasted in brackets
(``[N222][TFSI]``, which the grammar would read as nitrogen times 222; codes that follow the alkyl-chain
notation, such as ``[P4441]`` or ``[C16mim]``, are built by :mod:`scorer.onium_codes`).
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
from ionicity.scorer.abbreviations import SILYL_PREFIX
from ionicity.scorer.coordination import written_ligands
from ionicity.scorer.elements import element_symbols, get_element, is_element_symbol
from ionicity.scorer.formula import _RARE_FOR_SUGGESTIONS, FormulaError, laboratory_code, parse_formula
from ionicity.scorer.grammar import parse_element_groups
from ionicity.scorer.ions import ZWITTERION_NOTE, ZWITTERION_REGISTRY_NOTE, decompose_anhydrous, decompose_within
from ionicity.scorer.organic_cations import WRITTEN_ONIUM_NOTE_MARK
from ionicity.scorer.registry_formulas import inorganic_formula_listed, registry_knows
from ionicity.scorer.ion_penalties import _ion_penalty

__all__ = [
    "Slip", "SLIP_KINDS", "SLIP_WORK_LIMIT", "MARGIN", "BEST_PENALTY", "MAYBE_SLIP", "absurd_count", "find_slip",
    "RADICAL_MAX_ATOMS", "lone_element_count", "registry_count_neighbours", "odd_electron_molecule", "reading_penalty", "slip_kind_of", "unknown_abbreviation",
]

# what each kind of slip is called in messages and in the audit summary
SLIP_KINDS: dict[str, str] = {
    "leading_zero": "a count starting with 0 (the digit 0 typed for the letter O)",
    "zero_for_O": "the digit 0 typed for the letter O",
    "I_for_l": "a capital I typed for a lower-case l",
    "one_for_l": "the digit 1 typed for a lower-case l",
    "l_for_I": "a lower-case l typed for a capital I",
    "letter_case": "element symbols in the wrong case",
    "oxoanion_case": "a lower-case o typed in an oxoanion (Co for CO, No for NO, Po for PO)",
    "brackets_left_out": "the brackets around a group left out (CaOH2 for Ca(OH)2)",
    "hydrate_dot_missing": "the hydrate dot left out before the water",
    "unknown_abbreviation": "a bracketed ion abbreviation the ion library does not know",
    "stray_punctuation": "a stray quote or punctuation mark at the start or end (a spreadsheet's text mark, a list's comma)",
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
# tritium is as rare (a radioactive label): a T in a formula of capitals is thallium or thorium (TL, TH) far more
# often (THO2 read as tritiated hydrogen peroxide HTO2)
_RARE_ISOTOPES = frozenset({"T"})
# the radioactive elements from polonium on whose compounds a stock list does hold: thorium and uranium salts
# (thorium nitrate, uranyl acetate), not rare as the others from _RARE_FROM_Z on
_STOCKED_ACTINIDES = frozenset({"Th", "U"})
# elements no inventory holds a compound of (no long-lived isotope, or made a few atoms at a time): a reading
# that needs one is no reading ("KNO" as nobelium, "ATP" as astatine; common practice)
_NO_CHEMISTRY = frozenset({"At", "Rn", "Fr"})
_NO_CHEMISTRY_FROM_Z = 97
_CLASS_PENALTY = {
    "ionic_salt": 0.0, "acid": 0.0, "base": 0.0, "ionic_liquid_pair": 0.0,
    "element": 0.5, "covalent_molecular": 1.0, "covalent_network": 1.0, "ion": 1.5,
}
_MAX_PROPOSALS = 256
# proposals of one kind read by the ion solver at most (in2(co3)3 has dozens of re-casings)
_SOLVED_PROPOSALS = 8
# solver work (scorer.ions.solver_work units) the proposals of one text may spend together,
# both rounds of find_slip: above the dearest right correction of the demo and reference
# lists (Tutton's salt typed with 0 for O twice, 900 + 10,521 units), so that a text's slip search costs at
# most this much more than its own read (DEVELOPERS.md, "The cost of one formula")
SLIP_WORK_LIMIT = 12_000
# elements a proposal may hold to be read: an inventory line with a typing slip holds a few
# (the demo and reference lists at most 8); the solver's knapsack grows with the elements, so a
# long random string of symbols is read as written, not re-read per proposal (common practice)
_SLIP_MAX_ELEMENTS = 8
# the longest text searched for slips (after removing spaces): inventory formulas are short (the
# demo and reference lists at most 25 characters), and a text that does not parse costs the
# parser's own suggestion search, growing with the square of its length (common practice)
_SLIP_MAX_LENGTH = 64
# proposals parsed per text, every kind and both rounds together: each costs a parse
_PARSED_PROPOSALS = 32
# the lowest penalty any reading gets (a salt of one element... 0.5 per element, one element at least)
BEST_PENALTY = 0.5
# elements written with a count as the molecules they form (common practice)
_ELEMENT_MOLECULES = frozenset({
    ("H", 2.0), ("N", 2.0), ("O", 2.0), ("O", 3.0), ("F", 2.0), ("Cl", 2.0), ("Br", 2.0), ("I", 2.0),
    ("P", 4.0), ("As", 4.0), ("S", 8.0), ("Se", 8.0), ("C", 60.0), ("C", 70.0),
})
_ZERO = re.compile(r"(?<![.\d])0(?!\.)|(?<=\d)0")
_LETTER_RUN = re.compile(r"[A-Za-z]+")
# what str.isalpha() refuses (digits, underscore, punctuation): one substitution, not a loop per character
_NOT_A_LETTER = re.compile(r"[\W\d_]+")
# digits run straight into a counted water at the end: "MgSO47H2O"
_RUN_INTO_WATER = re.compile(r"(?<=[A-Za-z)\]])(\d{2,})(H2O)$")
# lattice water typed with the digit 0 for the letter O: "CaCl2·6H20", "CuSO4.5H20"
_WATER_WITH_ZERO = re.compile(r"[·•∙⋅.*\s+]\d*(?:\.\d+)?H20$")
# a character that some kind of slip below could have typed (a superset: each kind checks more)
MAYBE_SLIP = re.compile(r"(?<=[A-Za-z\d)\]])0|[A-Z][I1]|(?<![CATF])l|(?<![·.*\s\d])\d{2,}H2O$"
                       r"|(?<=[A-Za-z\d()\]])(?:Co3|No[23]|Po4)|(?:OH|NO[23]|[SC]O[34]|PO4|NH4|ClO[34])\d")
# polyatomic groups whose brackets a spreadsheet or a hurried hand leaves out: Ca(OH)2 typed CaOH2, (NH4)2SO4
# typed NH42SO4, Al2(SO4)3 typed Al2SO43 (common practice); CN is not among them (CaCN2 is calcium cyanamide)
_BRACKETLESS_GROUP = re.compile(
    r"(?<=[A-Za-z\d])(?P<group>HCO3|HSO4|H2PO4|HPO4|OH|NO3|NO2|SO4|SO3|PO4|CO3|ClO4|ClO3|ClO|CrO4|MnO4|IO3|BrO3|C2O4"
    r"|CH3COO)(?P<count>[2-9])(?![0-9])|^(?P<lead>NH4)(?P<lead_count>[2-9])(?=[A-Z(])")
# carbonate, nitrate, nitrite and phosphate typed with a lower-case o: CaCo3 (calcium cobalt), KNo3 (nobelium),
# Na3Po4 (polonium); only where an oxoanion's count follows (LiCoO2 and CoCl2 have none)
_OXOANION_CASE = re.compile(r"(?<=[A-Za-z\d()\]])(?:Co(?=3)|No(?=[23])|Po(?=4))(?![0-9][0-9])")
_BRACKETED = re.compile(r"\[([^\[\]]+)\]")
# a single element letter with three or more digits: the numeric code of a
# quaternary ammonium or phosphonium ion (N2224, P66614), not a count
_ION_CODE = re.compile(r"[A-Z]\d{3,}[A-Za-z0-9]*")
# four or more capitals in brackets and nothing else (DBUH, TMGH): an abbreviation, not a chain of one-letter
# element symbols (D, B, U, H would read as deuterium, boron, uranium and hydrogen)
_CAPITAL_CODE = re.compile(r"[A-Z]{4,}")


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
    if math.isinf(_parsed_penalty(text)):
        return math.inf
    return _penalty_of(text, decompose_anhydrous(_parsed(text)))


@per_input(maxsize=65536)
def _proposal_penalty(text: str, work_limit: int) -> tuple[float, int]:
    """(:func:`reading_penalty` of a proposed spelling, the solver work it cost) with
    the solver limited to ``work_limit`` units: a proposal whose read reaches the
    limit is no correction (``inf``)."""
    if math.isinf(_parsed_penalty(text)) or len(_parsed(text).counts) > _SLIP_MAX_ELEMENTS:
        return math.inf, 0
    dec, work = decompose_within(_parsed(text), work_limit)
    if work >= work_limit:
        return math.inf, work
    return _penalty_of(text, dec), work


def _penalty_of(text: str, dec) -> float:
    """The reading penalty of ``text`` read as ``dec`` (see :func:`reading_penalty`)."""
    penalty = _parsed_penalty(text)
    comp = _parsed(text)
    if dec.substance_class == "unknown":
        return math.inf
    penalty += _CLASS_PENALTY.get(dec.substance_class, 2.0)
    # every note counts against a reading but those that say what the registry knows of the molecule (a zwitterion)
    # and those that say which onium cation the written groups make ((CH3)3SI, trimethylsulfonium iodide, is no
    # slip for the trimethylsilyl radical (CH3)3Si)
    penalty += len([n for n in dec.notes if n != ZWITTERION_NOTE and not n.startswith(ZWITTERION_REGISTRY_NOTE)
                    and WRITTEN_ONIUM_NOTE_MARK not in n])
    penalty += len(comp.notes)
    for term in dec.cations + dec.anions:
        element = term.ion.element
        if element and term.ion.charge not in _usual_states(element):
            penalty += 2.0  # Fe(7+) beside a carbide: the solver's last resort
        if element == "C":
            penalty += 2.0  # a carbide ion in an inventory line is rarer than a slip
    if any(t.ion.ion_id == "H(-)" for t in dec.anions) and any(
            "O" in dict(t.ion.composition) for t in dec.anions):
        penalty += 2.0  # a hydride beside oxide or hydroxide (CaOH2 as Ca(2+) H(-) OH(-)): rarer than a slip
    if len(comp.counts) == 1 and comp.counts[0][1] != 1 and comp.counts[0] not in _ELEMENT_MOLECULES:
        penalty += 2.0  # Na20, Cl4: an element written with a count no molecule of it has
    if dec.substance_class == "covalent_molecular" and odd_electron_molecule(comp):
        penalty += 2.0  # CD, SN, SIO2 read as radicals: an inventory holds few (NO, NO2, ClO2 aside)
    return penalty


# stock salts of a state mendeleev's main oxidation states leave out (CuCl, CuI, CuCN, CuSCN; AuCl; MnF3, Mn2O3:
# Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 28 and 24; from memory); with the main
# states alone, 'cuscn' was re-cased into CNScU (a U-Sc carbonitride), which tied with CuSCN
_STOCK_STATES = {"Cu": frozenset({1}), "Au": frozenset({1}), "Mn": frozenset({3})}


@per_input(maxsize=4096)
def _usual_states(symbol: str) -> frozenset:
    """The oxidation states of ``symbol`` no reading is suspected for: mendeleev's main ones and
    :data:`_STOCK_STATES`. (The solver's zero-penalty states are too many here: Ti(+3) let 'TINO3' read as
    titanium oxide nitrite rather than TlNO3.)

    >>> sorted(_usual_states("Cu")), 3 in _usual_states("Ti")
    ([1, 2], False)
    """
    return frozenset(get_element(symbol).oxidation_states_main) | _STOCK_STATES.get(symbol, frozenset())


# the odd-electron molecules a shelf holds (common practice)
# only short texts are judged as radicals (CD, SN, BII3: capitals that lost their case); a longer
# formula with an odd electron count is an organic formula typed without its hydrogens, read as written
RADICAL_MAX_ATOMS = 5
_STABLE_RADICALS = frozenset({(("N", 1.0), ("O", 1.0)), (("N", 1.0), ("O", 2.0)), (("Cl", 1.0), ("O", 2.0))})


def odd_electron_molecule(comp) -> bool:
    """Whether a neutral molecule of at most :data:`RADICAL_MAX_ATOMS` atoms has an odd number of
    electrons (a radical), other than the few stable ones (:data:`_STABLE_RADICALS`).

    >>> odd_electron_molecule(_parsed("CD")), odd_electron_molecule(_parsed("NO")), odd_electron_molecule(_parsed("CO"))
    (True, False, False)
    """
    if comp.charge or tuple(comp.counts) in _STABLE_RADICALS or sum(n for _, n in comp.counts) > RADICAL_MAX_ATOMS:
        return False
    if any(abs(n - round(n)) > 1e-9 for _, n in comp.counts):
        return False
    return sum(get_element(s).atomic_number * int(round(n)) for s, n in comp.counts) % 2 == 1


@per_input(maxsize=65536)
def _parsed_penalty(text: str) -> float:
    """The part of :func:`reading_penalty` that needs no solver: rare elements,
    absurd counts, 0.5 per element (``inf`` when the text does not parse)."""
    comp = _parsed(text)
    if comp is None or _impossible_noble_gas_compound(dict(comp.counts)) or any(
            s in _NO_CHEMISTRY or get_element(s).atomic_number >= _NO_CHEMISTRY_FROM_Z for s, _ in comp.counts):
        return math.inf
    penalty = 0.5 * len(comp.counts)
    if comp.isotopes and not _CODE_SHAPED.fullmatch(text.strip()):
        # (three to six capitals alone that read only with D or T are an abbreviation: the record says so,
        # scorer.audit_rows.code_like_row; TBS is no terbium sulfide)
        penalty += 3.0 * sum(1 for symbol, _ in comp.isotopes if symbol in _RARE_ISOTOPES)
    for symbol, count in comp.counts:
        if symbol in _RARE or get_element(symbol).atomic_number >= _RARE_FROM_Z and symbol not in _STOCKED_ACTINIDES:
            penalty += 3.0
    return penalty + 4.0 * sum(map(_absurd_counts(comp.counts).__contains__, (s for s, _ in comp.counts)))


# He, Ne and Ar form no compounds; Kr and Xe only with the most electronegative partners (KrF2, XeF6,
# XeO3, XeOF4; Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 18.3; from memory)
_INERT_GASES = frozenset({"He", "Ne", "Ar"})
_HEAVY_NOBLE_GASES = frozenset({"Kr", "Xe"})
_NOBLE_GAS_PARTNERS = frozenset({"F", "O", "Cl"})


def _impossible_noble_gas_compound(counts: dict[str, float]) -> bool:
    """Whether a formula of several elements holds a noble gas in a compound none forms: a re-cased word
    ("brine" read as BrINe, with neon) is no correction.

    >>> _impossible_noble_gas_compound({"Br": 1, "I": 1, "Ne": 1}), _impossible_noble_gas_compound({"Xe": 1, "F": 2})
    (True, False)
    """
    if len(counts) < 2:
        return False
    if any(s in _INERT_GASES for s in counts):
        return True
    return any(s in _HEAVY_NOBLE_GASES for s in counts) and not all(
        s in _HEAVY_NOBLE_GASES or s in _NOBLE_GAS_PARTNERS for s in counts)


def _reads_as_elements(content: str) -> bool:
    try:
        parse_element_groups(content)
    except FormulaError:
        return False
    return True


def _balanced(text: str) -> bool:
    depth = 0
    for ch in text:
        if ch in "([{":
            depth += 1
        elif ch in ")]}":
            depth -= 1
            if depth < 0:
                return False
    return depth == 0


def _count_owner(text: str, i: int) -> str:
    """The element symbol whose count holds the digit at ``i`` ("" after a bracket or a dot)."""
    while i > 0 and text[i - 1].isdigit():
        i -= 1
    m = re.search(r"[A-Z][a-z]?$", text[:i])
    return m.group() if m and m.group() in _symbols_folded().values() else ""


@per_input(maxsize=65536)
def _parsed(text: str):
    """``parse_formula(text)``, or None where it raises (the parser caches
    only what it reads, so a failure is remembered here)."""
    try:
        return parse_formula(text)
    except FormulaError:
        return None


def absurd_count(text: str) -> bool:
    """Whether ``text`` does not parse or has a count no inventory formula has
    (over 100, or over 24 without carbon): where a 0 inside a count may be an O."""
    comp = _parsed(text)
    if comp is None:
        return True
    return bool(_absurd_counts(comp.counts))


def _absurd_counts(counts) -> frozenset[str]:
    """The elements of ``(symbol, count)`` pairs whose count no inventory formula has: over 24 without
    carbon; with carbon over 100, except carbon and hydrogen in a molecule whose hydrogens the carbons
    can hold (``H <= 2 C + N + 2``, degree of unsaturation at least 0; common practice): glyceryl
    tristearate C57H110O6 and a C110H220 wax are molecules, not slips for C57H11OO6.

    >>> sorted(_absurd_counts((("C", 57.0), ("H", 110.0), ("O", 6.0)))), sorted(_absurd_counts((("Fe", 2.0), ("O", 203.0))))
    ([], ['O'])
    """
    found = dict(counts)
    carbon = found.get("C", 0.0)
    if not carbon:
        return frozenset(s for s, n in counts if n > 24)
    saturated = found.get("H", 0.0) <= 2 * carbon + found.get("N", 0.0) + 2
    return frozenset(s for s, n in counts if n > 100 and not (saturated and s in ("C", "H")))


@once
def _symbols_folded() -> dict[str, str]:
    return {s.casefold(): s for s in element_symbols()}


def _recasings(run: str, rare: bool = True) -> list[str]:
    """Every way to write the letters of ``run`` as element symbols; with ``rare``
    False, a short-lived or synthetic element only where it is typed so: in
    mixed-case text a re-casing that brings one in reads an abbreviation as an
    element ("Cu(acac)2" -> Cu(AcAc)2, actinium; common practice)."""
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
            if symbol and (rare or symbol not in _RARE_FOR_SUGGESTIONS or run[i:i + width] == symbol):
                walk(i + width, parts + [symbol])

    walk(0, [])
    return out


# an oxoanion written in capitals with its usual count: the O of CO3, NO3, NO2, PO4 stays oxygen when the case of
# the rest is restored (KCO3 lost a count of K2CO3; it is no potassium-cobalt compound KCo3)
_CAPITAL_OXOANION = re.compile(r"(?:CO3|NO3|NO2|PO4)(?!\d)")


def _breaks_an_oxoanion(text: str, proposal: str) -> bool:
    """Whether a re-cased ``proposal`` turns an oxoanion the text writes in capitals into a metal symbol (CO3 into
    Co3, NO3 into No3).

    >>> _breaks_an_oxoanion("KCO3", "KCo3"), _breaks_an_oxoanion("SMCO5", "SmCo5")
    (True, False)
    """
    return any(proposal[m.start():m.end()] != m.group() for m in _CAPITAL_OXOANION.finditer(text.upper())
               if text[m.start():m.end()].upper() == m.group())


def _case_proposals(text: str, rare: bool = True) -> list[str]:
    runs = list(_LETTER_RUN.finditer(text))
    proposals = [""]
    last = 0
    for m in runs:
        options = _recasings(m.group(), rare)
        if not options:
            return []
        proposals = [p + text[last:m.start()] + o for p in proposals for o in options][:_MAX_PROPOSALS]
        last = m.end()
    return [p + text[last:] for p in proposals if p + text[last:] != text]


def _bracketed(text: str, groups: list[re.Match]) -> list[str]:
    """``text`` with brackets put around each group of ``groups`` (each alone, then all of them)."""
    def put(chosen):
        out, last = [], 0
        for m in chosen:
            name = "group" if m.group("group") else "lead"
            start, end = m.span(name)
            out.append(text[last:start] + "(" + text[start:end] + ")")
            last = end
        return "".join(out) + text[last:]
    proposals = [put([m]) for m in groups]
    return proposals + ([put(groups)] if len(groups) > 1 else [])


def _bracketless_evidence(text: str) -> bool:
    comp = _parsed(text)
    if comp is None:
        return True
    dec = decompose_anhydrous(comp)
    if dec.substance_class in ("unknown", "error") or not (dec.cations or dec.anions):
        return dec.substance_class != "covalent_molecular" or math.isinf(reading_penalty(text)) or any(
            n > 24 for _, n in comp.counts)
    listed = {ion.ion_id for ion in ion_library.ion_library()}
    symbols = {s for s, _ in comp.counts}
    return any(t.ion.ion_id == "H(-)" for t in dec.anions) and "O" in symbols or any(
        t.ion.ion_id not in listed for t in dec.anions)


def _recase_all(text: str, positions: list[int]) -> str:
    """``text`` with the ``o`` after every position in ``positions`` written ``O``."""
    chars = list(text)
    for i in positions:
        chars[i + 1] = "O"
    return "".join(chars)


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
        Two slips in one text (``Kl03``: l for I, then 0 for O) are found
        in two rounds; the kind is the first one's.
    """
    if text and (text[0] in _STRAY_FIRST or text[-1] in _STRAY_LAST):
        stray = _stray_punctuation(text)
        if stray is not None:
            return stray
    allowance = [SLIP_WORK_LIMIT, _PARSED_PROPOSALS]
    slip = _find_one(text, allowance)
    if slip is None or not slip.suggested:
        return slip
    second = _find_one(slip.suggested, allowance)
    if second is None or not second.suggested:
        return slip
    best = second.suggested
    kinds = f"{SLIP_KINDS[slip.kind]}; {SLIP_KINDS[second.kind]}"
    return Slip(slip.kind, best, f"typing slip? {text!r} looks like {best}: {kinds}; values are for {best}")


# quotes before or after a formula, and a comma, semicolon, colon or full stop after it: "'NaCl" (a spreadsheet's
# text mark), "NaCl," (a list pasted cell by cell), "KCl." (common practice)
_STRAY = re.compile(r"^\s*['\"`´‘’“”]+|['\"`´‘’“”,;:.]+\s*$")
_STRAY_FIRST = frozenset("'\"`´‘’“” \t")
_STRAY_LAST = frozenset("'\"`´‘’“”,;:. \t")


def _stray_punctuation(text: str) -> Slip | None:
    """The slip of a formula typed with stray quotes or punctuation around it, when the rest parses."""
    if not isinstance(text, str) or len(text) > 200 or not _STRAY.search(text):
        return None
    core = _STRAY.sub("", text).strip()
    if not core or core == text.strip():
        return None
    slip = find_slip(core)  # the rest may hold a slip of its own ("nacl,")
    if _parsed(core) is None and (slip is None or not slip.suggested):
        return None
    best = slip.suggested if slip is not None and slip.suggested else core
    kinds = SLIP_KINDS["stray_punctuation"] + (f"; {SLIP_KINDS[slip.kind]}" if best != core else "")
    return Slip("stray_punctuation", best, f"typing slip? {text!r} looks like {best}: {kinds}; values are for {best}")


def registry_case_evidence(text: str) -> bool:
    """Whether ``text``, which parses, reads as written into a composition the registry lists no compound of
    and that is no organic molecule (carbon with hydrogen, or two carbons or more): in capitals, the evidence
    that lets a re-casing the registry does list win without :data:`MARGIN` (PBSO4 as PbSO4).

    >>> registry_case_evidence("PBSO4"), registry_case_evidence("CO2"), registry_case_evidence("C6H5NO2")
    (True, False, False)
    """
    comp = _parsed(text)
    if comp is None:
        return False
    counts = dict(comp.counts)
    if counts.get("C", 0.0) > 0 and ("H" in counts or counts["C"] >= 2):
        return False
    return not registry_knows(counts)


def _find_one(text: str, allowance: list[int]) -> Slip | None:
    """One round of :func:`find_slip`: the best proposal of any kind. The
    proposals draw on ``allowance`` (solver work units, proposals parsed);
    once either is spent no more are read."""
    if not isinstance(text, str) or not text or len(text) > 200:
        return None
    stripped = "".join(text.split())
    if not _balanced(stripped):
        return None  # no slip of these kinds unbalances brackets: the grammar's error stands
    abbreviation = unknown_abbreviation(stripped)
    if abbreviation is not None:
        return abbreviation
    if SILYL_PREFIX.match(stripped) and _parsed(text) is not None:
        return None  # a silyl reagent (TMSN3, TBSCl): capitals by convention, not a formula that lost its case
    if stripped.isupper() and laboratory_code(stripped) is not None:
        return None  # a laboratory code of the table (TEOS is tetraethyl orthosilicate, not TeOS)
    if len(stripped) > _SLIP_MAX_LENGTH:
        return None  # longer than any inventory line: read as written
    letters = _NOT_A_LETTER.sub("", stripped)
    all_caps = len(letters) > 1 and letters.isupper()
    # a lower-case word of six letters or more without a digit is a word ("eutectic", "acetone", "niacin", which
    # had been re-cased into NiAcIn), not a formula that lost its case: the shelf's lower-case formulas are short
    # ("nacl", "naoh", "kscn", "naclo") or counted; a capitalised word of six letters or more likewise ("Unknown",
    # "Buffer", "Solution": they were re-cased into UNKNOWN, BUFFEr, SOLuTiON); a capitalised formula that lost its
    # case is short or counted ("Nacl", "Kscn")
    # and seven capitals or more without a digit are an acronym ("NASICON", "LISICON" had been re-cased into
    # CAsIN2O and the like): a formula typed in capitals is short or counted ("NACL", "KMNO4")
    word = letters == stripped and (len(letters) >= 6 and (letters.islower() or letters[0].isupper()
                                                           and letters[1:].islower())
                                    or len(letters) >= 7 and letters.isupper())
    all_lower = letters.islower() and not word
    # as written an element no shelf holds a compound of (Nh3 nihonium, No nobelium: NH3, NO typed with a lower-case
    # letter), or one metal with a count no substance has (Co2, Cs2: CO2, CS2): evidence of a lost case
    comp = _parsed(text)
    impossible = (comp is not None and not word and len(stripped) <= IMPOSSIBLE_MAX_LENGTH
                  and impossible_composition(comp.counts))
    if not (all_caps or all_lower or impossible or MAYBE_SLIP.search(stripped)) and comp is not None:
        return None  # the common case, in one regular-expression scan
    candidates: list[tuple[float, int, str, str, bool]] = []  # penalty, order, kind, text, evidence
    registry_listed: set[str] = set()  # re-casings the registry lists where the text as written is none
    written_box: list[float] = []

    def written_penalty() -> float:
        if not written_box:
            written_box.append(reading_penalty(text))
        return written_box[0]

    def consider(kind: str, make_proposals, evidence: bool) -> None:
        # without evidence a proposal must beat the written reading by MARGIN, and none
        # reads better than BEST_PENALTY: a text that reads well (KNO3, CO) costs no proposals
        if not evidence and written_penalty() - MARGIN <= BEST_PENALTY:
            return
        # the solver's work is the cost: proposals in order of the penalty they get
        # before it (a lower bound), solved until none left can beat the best
        proposals = [p for p in dict.fromkeys(make_proposals()) if p != stripped][:max(allowance[1], 0)]
        allowance[1] -= len(proposals)
        proposals.sort(key=_parsed_penalty)
        for proposal in proposals[:_SOLVED_PROPOSALS]:
            best = min((c[0] for c in candidates), default=math.inf)
            if _parsed_penalty(proposal) >= best or allowance[0] <= 0:
                break
            penalty, work = _proposal_penalty(proposal, allowance[0])
            allowance[0] -= work
            candidates.append((penalty, len(candidates), kind, proposal, evidence))

    zeros = [m.start() for m in _ZERO.finditer(stripped) if m.start() > 0 and not stripped[m.start() - 1] in "*+ "]
    leading = any(not stripped[i - 1].isdigit() for i in zeros)
    # a 0 inside a count may be a slip where the count is absurd or belongs to an element
    # other than C and H (Fe203, Na20) but not C10H8 (naphthalene); after a hydrate dot "H20" is water (CaCl2·6H20)
    water_zero = zeros and _WATER_WITH_ZERO.search(stripped) is not None
    # one element with a count no molecule of it has (H20 for H2O): the zero is the evidence
    lone_zero = zeros and lone_element_count(text)
    if zeros and (leading or absurd_count(text) or water_zero or lone_zero
                  or any(_count_owner(stripped, i) not in ("", "C", "H") for i in zeros)):
        consider("leading_zero" if leading else "zero_for_O", lambda: _replacements(stripped, zeros, _zero_options),
                 leading or water_zero or lone_zero)
    unreadable = _parsed(text) is None

    def lost_case() -> None:
        if (all_caps or all_lower or unreadable or impossible) and not word:
            # capitals that read as a radical (CD, SN) are evidence of lost case, as lower case is
            radical = all_caps and not unreadable and odd_electron_molecule(_parsed(text))
            # so is an I after a letter it makes a symbol with (TIO2, NIO, SI3N4: Ti, Ni, Si), where as written the
            # I stands for iodine beside tritium or nitrogen; the proposal must still read better than the text
            capital_of_i = all_caps and any(ch == "I" and i and is_element_symbol(stripped[i - 1] + "i")
                                            for i, ch in enumerate(stripped))
            if _CAPITAL_OXOANION.search(stripped.upper()):
                recased = lambda: [p for p in _case_proposals(stripped, all_caps or all_lower)  # noqa: E731
                                   if not _breaks_an_oxoanion(stripped, p)]
            else:
                recased = lambda: _case_proposals(stripped, all_caps or all_lower)  # noqa: E731
            if all_caps and registry_case_evidence(text):
                # capitals whose literal reading is no compound the registry lists, where a re-casing is one
                # (PBSO4 read as BPSO4, PB(NO3)2 as BPN2O6, CU(NO3)2 as a uranyl nitrate cyanate, SB2O3 as B2SO3:
                # PbSO4, Pb(NO3)2, Cu(NO3)2, Sb2O3): the registry's word is the evidence, for those proposals
                # (first, so that the same proposal is not cut as no better than itself below)
                def known():
                    found = [p for p in recased() if _parsed(p) is not None
                             and registry_knows(dict(_parsed(p).counts))]
                    registry_listed.update(found)
                    return found

                consider("letter_case", known, True)
            consider("letter_case", recased, all_lower or unreadable or radical or capital_of_i or impossible)

    if all_caps:
        lost_case()  # first, so that a re-cased reading as good as a re-lettered one is found (TIO2: TiO2, TlO2)
    capital_i = [i for i, ch in enumerate(stripped) if ch == "I" and _ell_options(stripped, i)]
    if capital_i:
        # "CI" is carbon beside iodine in few real formulas (CI4), chlorine mistyped in many;
        # "TI" tritium (IUPAC's T for 3H) beside iodine, thallium mistyped (TlCl, TlNO3)
        evidence = any(stripped[i - 1] in "CT" for i in capital_i)
        consider("I_for_l", lambda: _replacements(stripped, capital_i, _ell_options), evidence)
    ones = [i for i, ch in enumerate(stripped) if ch == "1" and _ell_options(stripped, i)]
    if ones:
        # a count of 1 written out (HC1) is itself unusual; C12 in C12H22O11 is not
        evidence = any(not stripped[i + 1:i + 2].isdigit() and stripped[i + 1:i + 2] != "." for i in ones)
        consider("one_for_l", lambda: _replacements(stripped, ones, _ell_options), evidence)
    small_l = [i for i, ch in enumerate(stripped) if ch == "l" and not _ell_options(stripped, i)]
    if small_l:
        consider("l_for_I", lambda: _replacements(stripped, small_l, _capital_i_options), False)
    oxo = [m.start() for m in _OXOANION_CASE.finditer(stripped)]
    if oxo:
        # evidence: as written the text holds no anion (CaCo3 an intermetallic, KNo3 nobelium) while the
        # proposal writes a whole oxoanion after a metal
        written_dec = None if _parsed(text) is None else decompose_anhydrous(_parsed(text))
        evidence = written_dec is not None and not written_dec.anions and any(
            get_element(symbol).is_metal for symbol, _ in _parsed(text).counts if symbol not in ("Co", "No", "Po"))
        consider("oxoanion_case", lambda: [stripped[:i + 1] + "O" + stripped[i + 2:] for i in oxo] + (
            [_recase_all(stripped, oxo)] if len(oxo) > 1 else []), evidence)
    groups = list(_BRACKETLESS_GROUP.finditer(stripped))
    if groups:
        # evidence: as written the text needs a hydride beside oxygen (CaOH2 as Ca(2+) H(-) OH(-)) or an anion
        # the library does not list (CaHCO32), or it does not read at all
        consider("brackets_left_out", lambda: _bracketed(stripped, groups), _bracketless_evidence(text))
    water = _RUN_INTO_WATER.search(stripped)
    if water:
        digits = water.group(1)
        consider("hydrate_dot_missing", lambda: [
            stripped[:water.start()] + digits[:k] + "·" + digits[k:] + "H2O" for k in range(1, len(digits))
        ], False)
    # mixed-case text that the grammar reads (BaSi2, Cu5Si) is as written even
    # where the solver finds no ions: only text that does not parse, or is all
    # capitals or all lower case, is re-cased
    if not all_caps:
        lost_case()
    if all_caps and _CODE_SHAPED.fullmatch(stripped):
        # a cell of three to six capitals is as often an abbreviation (PAN, propylammonium nitrate) as a formula that
        # lost its case: a re-casing that needs a radioactive element no shelf holds a compound of (PaN) is none
        candidates = [c for c in candidates if not _needs_radioactive_rarity(c[3])]
    if not candidates:
        return None  # most texts: no character that can be a slip, or a written reading no proposal could beat
    written = written_penalty()
    # in text all in capitals an I after T, N, L, S, B may be the capital of the i of Ti, Ni, Li, Si, Bi as well as
    # an l mistyped: where both read alike, the lost case wins (TIO2 is TiO2, not thallium superoxide; TINO3 stays
    # TlNO3, which TiNO3 cannot match)
    penalty, _, kind, best, evidence = min(candidates, key=lambda c: (
        round(c[0], 9), 0 if all_caps and c[2] == "letter_case" else 1, 0 if c[4] else 1, c[1]))
    if math.isinf(penalty):
        if kind == "leading_zero" and evidence and not math.isinf(written):
            return Slip(kind, "", f"typing slip? {text!r} has {SLIP_KINDS[kind]}; no better reading found")
        return None
    # a tie goes to a re-casing the registry lists over a text it does not (CO(NO3)2: Co(NO3)2, not nitronium
    # carbonate)
    if not (penalty < written - MARGIN or (evidence and penalty < written) or (kind == "leading_zero" and evidence)
            or (best in registry_listed and penalty <= written)):
        return None
    others = [c[3] for c in sorted(candidates) if c[3] != best and c[0] <= penalty + 1.0][:2]
    also = f" (also possible: {', '.join(others)})" if others else ""
    return Slip(kind, best, f"typing slip? {text!r} looks like {best}{also}: {SLIP_KINDS[kind]}; values are for {best}")


# three to six capitals alone (scorer.audit_rows.CAPITALS_CODE without the spaces)
_CODE_SHAPED = re.compile(r"[A-Z]{3,6}")


def _needs_radioactive_rarity(proposal: str) -> bool:
    """Whether a proposed spelling holds an element from :data:`_RARE_FROM_Z` on other than thorium and uranium.

    >>> _needs_radioactive_rarity("PaN"), _needs_radioactive_rarity("UO2"), _needs_radioactive_rarity("KCN")
    (True, False, False)
    """
    comp = _parsed(proposal)
    return comp is not None and any(get_element(s).atomic_number >= _RARE_FROM_Z and s not in _STOCKED_ACTINIDES
                                    for s, _ in comp.counts)


def _impossible_as_written(text: str) -> bool:
    """Whether ``text`` parses but holds an element no inventory holds a compound of (:data:`_NO_CHEMISTRY`,
    atomic number from :data:`_NO_CHEMISTRY_FROM_Z`) beside others or with a count, or is one metal with a count
    (``Co2``: metals are no molecules).

    >>> _impossible_as_written("Nh3"), _impossible_as_written("Co2"), _impossible_as_written("Co"), _impossible_as_written("I2")
    (True, True, False, False)
    >>> _impossible_as_written("Bk"), _impossible_as_written("Nh4Cl")
    (False, True)
    """
    comp = _parsed(text)
    return comp is not None and impossible_composition(comp.counts)


# the longest text whose impossible element or counted metal is taken for a lost case: a shelf's formula that lost
# its case is short (MgNh4PO4, (Nh4)2SO4); a long random string of symbols is read as written, at no extra cost
IMPOSSIBLE_MAX_LENGTH = 16


def impossible_composition(counts) -> bool:
    """:func:`_impossible_as_written` of parsed ``counts`` ((symbol, count) pairs): the prescan asks it of the
    texts it would pass as ordinary."""
    if len(counts) == 1:
        # an element's symbol alone (Bk, Es) is that element: BK is no likelier; with a count, a metal is no molecule
        symbol, count = counts[0]
        return count != 1 and (symbol in _no_chemistry_symbols()
                               or (symbol, count) not in _ELEMENT_MOLECULES and get_element(symbol).is_metal)
    no_chemistry = _no_chemistry_symbols()
    return any(s in no_chemistry for s, _ in counts)


@once
def _no_chemistry_symbols() -> frozenset[str]:
    """:data:`_NO_CHEMISTRY` and every element from :data:`_NO_CHEMISTRY_FROM_Z` on (one set: the prescan asks
    for every distinct text)."""
    return _NO_CHEMISTRY | frozenset(s for s in element_symbols() if get_element(s).atomic_number >= _NO_CHEMISTRY_FROM_Z)


def lone_element_count(text: str) -> bool:
    """Whether ``text`` reads as one element with a count no molecule of it has (``H20``, ``O20``)."""
    comp = _parsed(text)
    return comp is not None and len(comp.counts) == 1 and comp.counts[0][1] != 1 and \
        comp.counts[0] not in _ELEMENT_MOLECULES


def unknown_abbreviation(text: str) -> Slip | None:
    """A bracketed ion code the library does not know (``[N2224]``): an error
    rather than a reading of nitrogen times 2224."""
    for m in _BRACKETED.finditer(text):
        content = m.group(1)
        if ion_library.find_alias(content) is not None:
            continue
        if "(" in content:
            # a complex with its neutral ligands written ([Co(en)3], scorer.coordination): judge the rest
            core, ligands, _ = written_ligands(content)
            if ligands:
                content = core
        if _ION_CODE.fullmatch(content) or _CAPITAL_CODE.fullmatch(content) or not _reads_as_elements(content):
            return Slip(
                "unknown_abbreviation", "",
                f"{m.group()!r} in {text!r}: {SLIP_KINDS['unknown_abbreviation']} (scorer/data/ions.csv),"
                " not read as a formula; write the ion's formula or add the ion to the library",
            )
    return None


# an element symbol or a closing bracket and the count written after it (which may be none)
_COUNTED = re.compile(r"(?:[A-Z][a-z]?|\))(\d*)")
# anions a one-count change makes far more often than a shelf holds them
_UNLIKELY_SUGGESTED_IONS = frozenset({"C(4-)", "C2(2-)", "N3(-)", "N(3-)", "H(-)"})
# a hydrogen-oxoanion's small penalty (HSO4-, HCO3-) is common; uncommon, peroxo and formula-unit ions are not
_COMMON_ION_PENALTY = 0.05
# the counts tried where one seems missing or wrong (a formula of an inventory rarely counts more)
_TRIED_COUNTS = range(1, 7)
# proposals read for one text, the solver work each may spend and the work all of them may spend together:
# an error row's suggestion costs a few reads (tests/test_formula_fuzz.py counts it in a record's bound)
_COUNT_PROPOSALS = 32
_COUNT_WORK = 2_000
COUNT_WORK_LIMIT = 6_000
# the longest text searched: an inventory's salt formulas are short (Al2(SO4)3·18H2O is 16 characters before
# its water); a long random string of symbols is read as written (common practice)
_COUNT_MAX_LENGTH = 16


@per_input(maxsize=4096)
def missing_count_suggestions(text: str) -> tuple[str, ...]:
    """Formulas one count away from ``text`` that read as a salt, acid or base in their elements' usual states:
    what an error row suggests where no ions balance as written (``NaSO4`` -> Na2SO4, ``CaCO`` -> CaCO3;
    ``Na2SO`` -> Na2SO3, Na2SO4). The best three by :func:`reading_penalty`; () for none.

    >>> missing_count_suggestions("NaSO4"), missing_count_suggestions("CaCO")
    (('Na2SO4',), ('CaCO3',))
    """
    if not isinstance(text, str) or len(text) > _COUNT_MAX_LENGTH or _parsed(text) is None or _parsed(text).charge:
        return ()
    if any(s in _NO_CHEMISTRY or get_element(s).atomic_number >= _NO_CHEMISTRY_FROM_Z for s, _ in _parsed(text).counts):
        return ()  # every proposal keeps the element without chemistry, so reading_penalty is inf for each
    proposals = _count_proposals(text)
    scored = []
    allowance = COUNT_WORK_LIMIT
    for proposal, step in list(proposals.items())[:_COUNT_PROPOSALS]:
        comp = _parsed(proposal)
        if comp is None or allowance <= 0:
            continue
        limit = min(_COUNT_WORK, allowance)
        dec, work = decompose_within(comp, limit)
        allowance -= work
        if work >= limit or dec.substance_class not in ("ionic_salt", "acid", "base") or dec.notes:
            continue
        if any(t.ion.monatomic and t.ion.charge not in get_element(t.ion.element).oxidation_states_main
               or not t.ion.monatomic and _ion_penalty(t.ion) > _COMMON_ION_PENALTY for t in dec.cations + dec.anions):
            continue  # an uncommon state or ion (Na2SO5 as peroxymonosulfate, BaNO4)
        if any(t.ion.ion_id in _UNLIKELY_SUGGESTED_IONS for t in dec.anions):
            continue  # a carbide or an azide made by changing one count (NaCI2 as Na6CI2, BaNO3 as BaN4O3)
        if _multiple_of_simpler(comp):
            continue  # a multiple of a simpler formula (Na2Cl2, Fe2O2): the simpler one is proposed itself
        # fewest ion species first (Na2SO4, not Na4SO4 with oxide beside sulfate), then the smallest change
        scored.append(((round(_penalty_of(proposal, dec), 6), len(dec.cations) + len(dec.anions), step), proposal))
    scored.sort()
    best = [p for key, p in scored if key[:2] == scored[0][0][:2]] if scored else []
    return tuple(best[:3])


@per_input(maxsize=4096)
def registry_count_neighbours(text: str) -> tuple[str, ...]:
    """Spellings of ``text`` with one count changed (to 1-6) whose composition the registry's tables list
    (:func:`scorer.registry_formulas.inorganic_formula_listed`): what a molecule the tables do not know was most likely
    meant to be (``H2SO`` -> H2SO3, H2SO4; ``HClO5`` -> HClO3, HClO4). Nearest change first, at most three;
    no solver is run.

    >>> registry_count_neighbours("H2SO"), registry_count_neighbours("HClO5")
    (('H2SO3', 'H2SO4'), ('HClO4', 'HClO3', 'HClO2'))
    """
    if not isinstance(text, str) or len(text) > _COUNT_MAX_LENGTH or _parsed(text) is None or _parsed(text).charge:
        return ()
    found = {}
    for proposal, step in _count_proposals(text).items():
        comp = _parsed(proposal)
        if comp is not None and not _multiple_of_simpler(comp) and inorganic_formula_listed(dict(comp.counts)):
            found[proposal] = step
    return tuple(sorted(found, key=lambda p: (found[p], p))[:3])


def _count_proposals(text: str) -> dict[str, int]:
    """Spellings of ``text`` with one count (after an element symbol or a closing bracket) changed to another of
    :data:`_TRIED_COUNTS`, each with the size of the change, in the order of the text."""
    proposals: dict[str, int] = {}
    for m in _COUNTED.finditer(text):
        written = int(m.group(1)) if m.group(1) else 1
        for n in _TRIED_COUNTS:
            if n != written:
                proposal = text[:m.end() - len(m.group(1))] + (str(n) if n > 1 else "") + text[m.end():]
                proposals.setdefault(proposal, abs(n - written))
    return proposals


def _multiple_of_simpler(comp) -> bool:
    """Whether a composition's whole counts share a divisor (Na2Cl2, Fe2O2: a multiple of a simpler formula)."""
    counts = [n for _, n in comp.counts]
    return all(float(n).is_integer() for n in counts) and math.gcd(*(int(n) for n in counts)) > 1


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
