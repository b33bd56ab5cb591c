"""Alkoxides: metal alkoxides written by their groups (Ti(OC3H7)4, Al(OiPr)3, Ta(OC2H5)5) and alkoxide salts.

A metal alkoxide M(OR)n of a metal outside groups 1 and 2, of boron or of
silicon is a molecule or a small oligomer held by M-O-C bonds (titanium
isopropoxide is a monomeric liquid, aluminium isopropoxide a tetramer), with
no metal-carbon bond: it had read as an organometallic "with metal-carbon
bonds" or as a metal-organic complex, with no word on water. Water
hydrolyses it to the metal's hydroxide or oxide and the alcohol (the
sol-gel route to TiO2 and SiO2), fast for the titanium, zirconium and
aluminium alkoxides and trimethyl borate, slowly for tetraethyl
orthosilicate (Bradley, Mehrotra, Rothwell & Singh, Alkoxo and Aryloxo
Derivatives of Metals, 2001, ch. 1 and 4; Brinker & Scherer, Sol-Gel
Science, 1990, ch. 2; from memory).

The alkoxide salts of groups 1 and 2 (sodium methoxide, potassium
tert-butoxide) are ionic and read as salts; in water the alkoxide ion takes
a proton (the alcohols, pKa 15.5-18, are weaker acids than water, pKa 15.7
on the same scale; Clayden et al., Organic Chemistry, 2nd ed., 2012, ch. 8;
from memory), giving the hydroxide and the alcohol with heat: a strongly
basic, corrosive solution, not the neutral one of a spectator salt.

Rule (stated, not fitted): a formula written as one element of a usual state
n (a metal outside groups 1 and 2, B, Si or Ge) and n bracketed groups O-R,
R a saturated alkyl CmH(2m+1) (``Ti(OC3H7)4``, ``Ti(OCH(CH3)2)4``,
``Zr(OC4H9)4``, ``Si(OC2H5)4``; the abbreviations OMe, OEt, OiPr, OtBu
expanded first), is that alkoxide. An anion CmH(2m+1)O(-) is an alkoxide
ion.
"""
from __future__ import annotations

import re

from ionicity.scorer.elements import get_element, is_metal
from ionicity.scorer.grammar import FormulaError, parse_element_groups
from ionicity.scorer.ion_penalties import _states
from ionicity.scorer.model import Decomposition, Ion

__all__ = ["ALKOXIDE_HINT", "ALKOXIDE_NOTE", "written_alkoxide", "alkoxide_decomposition", "is_alkoxide_ion",
           "alcohol_formula", "alkoxide_name_formula"]

#: the structure hint (scorer.formula) and written group (Decomposition.written_groups) of a metal alkoxide
ALKOXIDE_HINT = "alkoxide"
ALKOXIDE_NOTE = (
    "a metal alkoxide M(OR)n: M-O-C bonds, no metal-carbon bond; a molecule or small oligomer, not a salt"
    " (Bradley et al., Alkoxo and Aryloxo Derivatives of Metals, 2001; from memory). Water and moist air"
    " hydrolyse it to the metal hydroxide or oxide and the alcohol: keep it dry and follow the safety data sheet"
)
_WRITTEN = re.compile(r"(?P<centre>[A-Z][a-z]?)\((?:O(?P<r>[CH\d()]+)|(?P<r_first>C[CH\d]*)O)\)(?P<n>\d*)")
_ALKOXIDE_NONMETALS = frozenset({"B", "Si", "Ge"})


def _alkyl(r: str) -> tuple[int, int] | None:
    """(carbons, hydrogens) of a saturated alkyl group written ``r`` (``C3H7``, ``CH(CH3)2``, ``(C4H9)``)."""
    try:
        counts, parser = parse_element_groups(r)
    except FormulaError:
        return None
    if parser.ion_refs or set(counts) != {"C", "H"}:
        return None
    c, h = counts["C"], counts["H"]
    return (int(c), int(h)) if c >= 1 and h == 2 * c + 1 and c == int(c) else None


def written_alkoxide(text: str) -> tuple[str, int, tuple[int, int]] | None:
    """(element, number of OR groups, (carbons, hydrogens) of R) of a formula written as a metal alkoxide
    (module docstring), or None.

    >>> written_alkoxide("Ti(OC3H7)4"), written_alkoxide("Ti(O(C3H7))4"), written_alkoxide("Al(OCH(CH3)2)3")
    (('Ti', 4, (3, 7)), ('Ti', 4, (3, 7)), ('Al', 3, (3, 7)))
    >>> written_alkoxide("Ta(C2H5O)5")
    ('Ta', 5, (2, 5))
    >>> written_alkoxide("Na(OCH3)"), written_alkoxide("Ti(OC6H5)4"), written_alkoxide("Ti(OC3H7)7")
    (None, None, None)
    """
    m = _WRITTEN.fullmatch(text) if isinstance(text, str) else None
    if m is None:
        return None
    centre, n = m.group("centre"), int(m.group("n") or 1)
    if centre not in _ALKOXIDE_NONMETALS and not (is_metal(centre) and get_element(centre).group not in (1, 2)):
        return None
    r = m.group("r") or m.group("r_first")  # O-R, or the alkoxide ion's formula R-O (Ta(C2H5O)5, as names read)
    alkyl = _alkyl(r[1:-1] if r.startswith("(") and r.endswith(")") and r.count("(") == 1 else r)
    if alkyl is None:
        return None
    usual = any(state == n and penalty == 0.0 for state, penalty in _states(centre))  # a main state
    return (centre, n, alkyl) if usual else None


def alkoxide_decomposition(counts: dict[str, float], water: float, neutral: tuple[str, ...]) -> Decomposition:
    """The covalent molecular reading of a written metal alkoxide: the metal at +n (n its OR groups), oxygen
    -2, hydrogen +1, carbon what balances (-2 in every CmH(2m+1)O group)."""
    centre = next(s for s in counts if s not in ("C", "H", "O"))
    state = counts["O"] / counts[centre]
    carbon = (2 * counts["O"] - counts["H"] - state * counts[centre]) / counts["C"]
    states = {centre: state, "O": -2.0, "H": 1.0, "C": round(carbon, 4)}
    return Decomposition(
        composition=tuple(counts.items()), hydrate_water=water, neutral_parts=neutral,
        oxidation_states=tuple((s, states[s]) for s in counts), substance_class="covalent_molecular",
        notes=(ALKOXIDE_NOTE,), written_groups=(ALKOXIDE_HINT,),
    )


def is_alkoxide_ion(ion: Ion) -> bool:
    """Whether ``ion`` is an alkoxide anion CmH(2m+1)O(-) (methoxide, ethoxide, tert-butoxide).

    >>> from ionicity.scorer.ion_library import get_ion
    >>> is_alkoxide_ion(get_ion("CH3O(-)")), is_alkoxide_ion(get_ion("C6H5O(-)")), is_alkoxide_ion(get_ion("OH(-)"))
    (True, False, False)
    """
    counts = dict(ion.composition)
    c, h = counts.get("C", 0.0), counts.get("H", 0.0)
    return ion.charge == -1 and set(counts) == {"C", "H", "O"} and counts["O"] == 1 and c >= 1 and h == 2 * c + 1


def alcohol_formula(ion: Ion) -> str:
    """The alcohol of an alkoxide ion, written CmH(2m+1)OH (``CH3OH`` for methoxide)."""
    counts = dict(ion.composition)
    c, h = int(counts["C"]), int(counts["H"])
    return f"C{c if c > 1 else ''}H{h}OH"


# the alkoxide words of a name and the alkyl group each names, written as catalogues do (common practice)
_ALKOXIDE_WORDS = {
    "methoxide": "CH3", "ethoxide": "C2H5", "propoxide": "C3H7", "n-propoxide": "C3H7", "isopropoxide": "CH(CH3)2",
    "butoxide": "C4H9", "n-butoxide": "C4H9", "isobutoxide": "CH2CH(CH3)2", "sec-butoxide": "CH(CH3)C2H5",
    "tert-butoxide": "C(CH3)3", "t-butoxide": "C(CH3)3",
}
_ALKOXIDE_NAME = re.compile(
    r"^\s*(?P<metal>[a-z]+)\s*(?:\((?P<stock>[ivx]+)\))?\s+(?:(?:tetra|tri|penta|di)-?)?(?P<word>"
    + "|".join(sorted((re.escape(w) for w in _ALKOXIDE_WORDS), key=len, reverse=True)) + r")\s*$", re.I)
_STOCK = {"i": 1, "ii": 2, "iii": 3, "iv": 4, "v": 5, "vi": 6}
# the elements whose alkoxides of the trade are at one state, which a name may leave unsaid ("titanium
# isopropoxide" is Ti(OiPr)4; common practice); any other element needs the Stock number
_ALKOXIDE_STATE = {"B": 3, "Al": 3, "Ga": 3, "Si": 4, "Ge": 4, "Ti": 4, "Zr": 4, "Hf": 4, "Nb": 5, "Ta": 5}


def alkoxide_name_formula(name: str) -> str | None:
    """The formula, written by its groups, of a metal alkoxide named so (``titanium(IV) isopropoxide``,
    ``titanium isopropoxide``, ``aluminium tri-sec-butoxide``, ``tantalum(V) ethoxide``); None for any other name
    and for a metal of groups 1 and 2 (``sodium methoxide`` is a salt the name grammar reads).

    >>> alkoxide_name_formula("titanium(IV) isopropoxide"), alkoxide_name_formula("zirconium butoxide")
    ('Ti(OCH(CH3)2)4', 'Zr(OC4H9)4')
    >>> alkoxide_name_formula("iron ethoxide"), alkoxide_name_formula("sodium methoxide")
    (None, None)
    """
    from ionicity.scorer.name_vocabulary import compact, vocabulary  # the name words load only for names

    m = _ALKOXIDE_NAME.match(name) if isinstance(name, str) else None
    if m is None:
        return None
    word = vocabulary()[0].get(compact(m.group("metal")))
    symbol = next((w.symbol for w in word.meanings() if w.kind == "element"), None) if word is not None else None
    if symbol is None or (is_metal(symbol) and get_element(symbol).group in (1, 2)):
        return None
    state = _STOCK.get((m.group("stock") or "").lower()) or _ALKOXIDE_STATE.get(symbol)
    if state is None:
        return None
    formula = f"{symbol}(O{_ALKOXIDE_WORDS[m.group('word').lower()]}){state if state > 1 else ''}"
    return formula if written_alkoxide(formula) is not None else None
