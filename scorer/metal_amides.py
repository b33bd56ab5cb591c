"""Alkali-metal amides of secondary amines written by their groups: LiN(C3H7)2 (LDA), NaN(Si(CH3)3)2 (NaHMDS).

The strong bases of organic synthesis, lithium diisopropylamide and the
bis(trimethylsilyl)amides of lithium, sodium and potassium, are written as
the metal, the nitrogen and its two groups. They hold polar M-N bonds and
form aggregates (dimers to tetramers) in the solid and in solution, like the
organolithiums, and they take a proton from water and any protic solvent at
once, giving the amine and the metal hydroxide, with heat (Clayden et al.,
Organic Chemistry, 2nd ed., 2012, ch. 20 and 25; Elschenbroich,
Organometallics, 3rd ed., 2006, ch. 5; from memory). They had read as
organometallics "with metal-carbon bonds", with no word on water.

Rule (stated, not fitted): a formula written as an alkali metal, then N, then
its two groups in round brackets (``N(C3H7)2``, ``N(Si(CH3)3)2``; the
abbreviations iPr and SiMe3 expanded first), each a saturated alkyl
CmH(2m+1) or trimethylsilyl Si(CH3)3, is that metal's amide: a molecule
(aggregate) of the metal at +1 and nitrogen at -3. Lithium and sodium amide
(LiNH2, NaNH2) are salts of NH2(-) and read as such.
"""
from __future__ import annotations

import re

from ionicity.scorer.grammar import FormulaError, parse_element_groups, hill_formula
from ionicity.scorer.model import Decomposition

__all__ = ["METAL_AMIDE_HINT", "METAL_AMIDE_NOTE", "written_metal_amide", "metal_amide_decomposition", "amine_of",
           "metal_amide_name_formula"]

#: the structure hint (scorer.formula) and written group (Decomposition.written_groups) of such an amide
METAL_AMIDE_HINT = "metal_amide"
METAL_AMIDE_NOTE = (
    "an alkali-metal amide of a secondary amine (LDA, the HMDS salts): polar M-N bonds in aggregates, no"
    " metal-carbon bond; a strong base that reacts violently with water and protic solvents, giving the amine"
    " and the metal hydroxide, some forms pyrophoric: handle it dry under inert gas as the safety data sheet says"
)
_WRITTEN = re.compile(r"(?P<metal>Li|Na|K|Rb|Cs)N(?P<groups>\(.+\)\d?)")
_ALKALI_STATES = {"Li": 1.0, "Na": 1.0, "K": 1.0, "Rb": 1.0, "Cs": 1.0}


def written_metal_amide(text: str) -> str | None:
    """The alkali metal of a formula written as its amide of a secondary amine (module docstring), or None.

    >>> written_metal_amide("LiN(C3H7)2"), written_metal_amide("LiN((C3H7))2"), written_metal_amide("NaN(Si(CH3)3)2")
    ('Li', 'Li', 'Na')
    >>> written_metal_amide("NaNH2"), written_metal_amide("LiN(C6H5)2"), written_metal_amide("LiNO3")
    (None, None, None)
    """
    m = _WRITTEN.fullmatch(text) if isinstance(text, str) else None
    if m is None:
        return None
    try:
        counts, parser = parse_element_groups(m.group("groups"))
    except FormulaError:
        return None
    if parser.ion_refs:
        return None
    c, h, si = counts.get("C", 0.0), counts.get("H", 0.0), counts.get("Si", 0.0)
    if set(counts) - {"C", "H", "Si"} or c < 2:
        return None
    if si:
        # two trimethylsilyl groups, Si2C6H18
        return m.group("metal") if (si, c, h) == (2.0, 6.0, 18.0) else None
    # two saturated alkyl groups: 2m+1 hydrogens each, 2C + 2 in all
    return m.group("metal") if h == 2 * c + 2 else None


def metal_amide_decomposition(counts: dict[str, float], water: float, neutral: tuple[str, ...]) -> Decomposition:
    """The covalent molecular reading of a written alkali-metal amide: the metal +1, N -3, Si +4, H +1, carbon
    what balances."""
    states = {s: _ALKALI_STATES[s] for s in counts if s in _ALKALI_STATES}
    states.update({"N": -3.0, "H": 1.0})
    if "Si" in counts:
        states["Si"] = 4.0
    known = sum(states[s] * counts[s] for s in states)
    states["C"] = round(-known / counts["C"], 4)
    return Decomposition(
        composition=tuple(counts.items()), hydrate_water=water, neutral_parts=neutral,
        oxidation_states=tuple((s, states[s]) for s in counts), substance_class="covalent_molecular",
        notes=(METAL_AMIDE_NOTE,), written_groups=(METAL_AMIDE_HINT,),
    )


def amine_of(counts: dict[str, float]) -> str:
    """The amine HNR2 a metal amide gives with water, as a Hill formula (``C6H15N`` for LDA)."""
    amine = {s: n for s, n in counts.items() if s not in _ALKALI_STATES}
    amine["H"] = amine.get("H", 0.0) + 1.0
    return hill_formula(amine)


# the amide words of the trade's names, each the amine's groups written as a formula (common practice)
_AMIDE_WORDS = {
    "dimethylamide": "(CH3)2", "diethylamide": "(C2H5)2", "diisopropylamide": "(CH(CH3)2)2",
    "dipropylamide": "(C3H7)2", "dibutylamide": "(C4H9)2", "bis(trimethylsilyl)amide": "(Si(CH3)3)2",
    "hexamethyldisilazide": "(Si(CH3)3)2",
}
_METAL_WORDS = {"lithium": "Li", "sodium": "Na", "potassium": "K", "rubidium": "Rb", "caesium": "Cs", "cesium": "Cs"}
_AMIDE_NAME = re.compile(r"^\s*(?P<metal>[a-z]+)\s+(?P<word>[a-z()]+)\s*$", re.I)


def metal_amide_name_formula(name: str) -> str | None:
    """The formula, written by its groups, of an alkali-metal amide named so (``lithium diisopropylamide``,
    ``sodium bis(trimethylsilyl)amide``, ``potassium hexamethyldisilazide``); None for any other name.

    >>> metal_amide_name_formula("lithium diisopropylamide"), metal_amide_name_formula("sodium hexamethyldisilazide")
    ('LiN(CH(CH3)2)2', 'NaN(Si(CH3)3)2')
    >>> metal_amide_name_formula("sodium amide"), metal_amide_name_formula("lithium chloride")
    (None, None)
    """
    m = _AMIDE_NAME.match(name) if isinstance(name, str) else None
    if m is None:
        return None
    metal, groups = _METAL_WORDS.get(m.group("metal").lower()), _AMIDE_WORDS.get(m.group("word").lower())
    return f"{metal}N{groups}" if metal and groups else None
