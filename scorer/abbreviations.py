"""Organic group and ligand abbreviations in formula text: ``PhLi``, ``PPh3``,
``Ti(OiPr)4``, ``Cp2ZrCl2``, ``AcOH`` written out as element groups.

Stock lists and reagent catalogues write metal-organic reagents with the
abbreviations of the trade (IUPAC Blue Book 2013, P-61 and P-68, for the
groups; common practice for the ligands). None of the abbreviations below is
an element symbol or starts one, so each is found by a plain scan: ``Me``,
``Et``, ``Bu``, ``Ph``, ``Bn``, ``Cy`` and ``Cp`` begin with a capital that
no element pairs with the following lower-case letter. ``Pr`` (praseodymium), ``Ac``
(actinium) and ``Ts`` (tennessine) are symbols and are read as elements
unless prefixed (``iPr``, ``nPr``; ``OAc`` and ``acac`` are ions of the library, read by the
formula grammar as written ions: ``Cu(acac)2``) or in
the whole words ``AcOH``, ``Ac2O`` and ``AcCl`` (AcCl3 is actinium's), or where ``Ac`` closes a formula
after its cation (``NaAc``, ``NH4Ac``, ``Pb(Ac)2``, ``HAc``: the acetate anion,
as buffer recipes and stock lists write it; an actinium compound names the
metal first, AcCl3, Ac2O3, and no alloy of actinium sits on a shelf).
The silyl groups of protecting-group reagents (``TMS``, ``TBS``, ``TBDMS``,
``TES``, ``TIPS``) are read only before another group (``TMSCl``, ``TBSOTf``):
``TMS`` alone is tetramethylsilane, a laboratory code, and ``TBS`` alone a
buffer's. Neutral ligands (py, en, bpy, phen, PPh3 in brackets) are read by
:mod:`scorer.coordination` before this expansion, as ligands of a complex.

>>> expand_abbreviations("Ti(OiPr)4")
('Ti(O(C3H7))4', ('iPr = C3H7 (isopropyl)',))
>>> expand_abbreviations("Cu(acac)2")
('Cu(acac)2', ())
>>> expand_abbreviations("[EtNH3][NO3]")
('[EtNH3][NO3]', ())
>>> expand_abbreviations("SnBu3Cl")[0]
'Sn(C4H9)3Cl'
>>> expand_abbreviations("n-BuLi")[0], expand_abbreviations("sec-BuLi")[0], expand_abbreviations("i-PrOH")[0]
('(C4H9)Li', '(C4H9)Li', '(C3H7)OH')
>>> expand_abbreviations("Zr(OPr)4")[0]
'Zr(O(C3H7))4'
>>> expand_abbreviations("NaAc")[0], expand_abbreviations("Pb(Ac)2")[0], expand_abbreviations("AcCl3")[0]
('Na(CH3COO)', 'Pb(CH3COO)2', 'AcCl3')
>>> expand_abbreviations("NaCl")
('NaCl', ())
"""
from __future__ import annotations

import re

from ionicity.scorer.elements import is_element_symbol

__all__ = ["ABBREVIATIONS", "expand_abbreviations"]

# abbreviation -> (element group, name); longer spellings first where one contains another
ABBREVIATIONS: dict[str, tuple[str, str]] = {
    # acetyl compounds as whole words: AcCl3 and Ac2O3 stay actinium's
    "AcOH": ("CH3COOH", "acetic acid"),
    "Ac2O": ("(CH3CO)2O", "acetic anhydride"),
    "AcCl": ("CH3COCl", "acetyl chloride"),
    # the A-site cations of hybrid perovskites, as that literature writes them (MAPbI3, FA0.8Cs0.2PbI3);
    # not GA (guanidinium), which in capitals is gallium (GAAS for GaAs)
    "MA": ("[MeNH3]", "methylammonium"),
    "FA": ("[FA]", "formamidinium"),
    # cholinium, as deep-eutectic-solvent recipes write it (ChCl:urea 1:2)
    "Ch": ("[Ch]", "cholinium"),
    "Cp*": ("C5(CH3)5", "pentamethylcyclopentadienyl"),
    # silyl groups of protecting-group reagents (TMSCl, TBSCl, TBDMSOTf, TIPSCl); TMS alone is tetramethylsilane,
    # a laboratory code (scorer/data/solvent_codes.csv), read before these
    "TBDMS": ("Si(CH3)2C4H9", "tert-butyldimethylsilyl"),
    "TBS": ("Si(CH3)2C4H9", "tert-butyldimethylsilyl"),
    "TIPS": ("Si(C3H7)3", "triisopropylsilyl"),
    "TMS": ("Si(CH3)3", "trimethylsilyl"),
    "TES": ("Si(C2H5)3", "triethylsilyl"),
    "tBu": ("C4H9", "tert-butyl"),
    "nBu": ("C4H9", "n-butyl"),
    "sBu": ("C4H9", "sec-butyl"),
    "iBu": ("C4H9", "isobutyl"),
    "Bu": ("C4H9", "butyl"),
    "iPr": ("C3H7", "isopropyl"),
    "nPr": ("C3H7", "n-propyl"),
    "Me": ("CH3", "methyl"),
    "Et": ("C2H5", "ethyl"),
    "Ph": ("C6H5", "phenyl"),
    "Bn": ("C7H7", "benzyl"),
    "Cy": ("C6H11", "cyclohexyl"),
    "Cp": ("C5H5", "cyclopentadienyl"),
}
# the silyl groups are read only before something (TMSCl, TBSOTf): alone, TBS is a buffer's code, not a radical
SILYL_GROUPS = ("TBDMS", "TBS", "TIPS", "TMS", "TES")
SILYL_PREFIX = re.compile(r"(?:TBDMS|TBS|TIPS|TMS|TES)(?=[A-Z(\[])")
_CAPITALISED = [a for a in ABBREVIATIONS if (a[0].isupper() or a[0] in "tnsi") and a not in SILYL_GROUPS]
_LOWER = [a for a in ABBREVIATIONS if a not in _CAPITALISED and a not in SILYL_GROUPS]
# a capitalised abbreviation is not followed by a lower-case letter (Bun is no Bu);
# a lower-case one stands between brackets, counts, dots or the text's edges
_WHOLE_WORDS = ("AcOH", "Ac2O", "AcCl")
_PATTERN = re.compile(
    "|".join(
        [rf"(?<![A-Za-z]){re.escape(a)}(?![a-z0-9])" for a in _WHOLE_WORDS]
        + [rf"{re.escape(a)}(?![a-z])" for a in _CAPITALISED if a not in _WHOLE_WORDS]
        + [rf"(?<![A-Za-z]){re.escape(a)}(?![a-z])" for a in _LOWER]
        + [rf"{re.escape(a)}(?=[A-Z(\[])" for a in SILYL_GROUPS]
    )
)
_HILL = {"[BuNH3]": "C4H12N", "[PEA]": "C8H12N", "[Ch]": "C5H14NO", "[MeNH3]": "CH3NH3", "[FA]": "CH(NH2)2", "[GA]": "C(NH2)3", "C5(CH3)5": "C10H15", "CH3COOH": "C2H4O2", "(CH3CO)2O": "C4H6O3", "CH3COCl": "C2H3ClO"}
# the trade's tetraalkylammonium shorthand (Bu4N, NBu4) is left to the ionic-liquid reader
_QUICK = frozenset("MEBPCAFatnsi")


def expand_abbreviations(text: str) -> tuple[str, tuple[str, ...]]:
    """(text with abbreviations written out, one note per abbreviation used).

    Parameters
    ----------
    text : str
        Formula text after Unicode normalisation.
    """
    if "-" in text and _HYPHEN_PREFIX.search(text):
        # the hyphenated prefixes of the trade: n-BuLi, t-BuOK, sec-BuLi, i-PrOH, Ti(O-i-Pr)4 are nBuLi, tBuOK,
        # sBuLi, iPrOH, Ti(OiPr)4
        text = _HYPHEN_PREFIX.sub(lambda m: _PREFIX_LETTER.get(m.group(1), m.group(1)), text)
        text = _ALKOXY_HYPHEN.sub("O", text)
    if "(OPr)" in text:
        # a propoxide written (OPr) after a metal (Zr(OPr)4): praseodymium is never bracketed alone with one
        # oxygen and counted, so the group is n-propoxide (common practice)
        text = text.replace("(OPr)", "(OnPr)")
    if _QUICK.isdisjoint(text):
        return text, ()
    used: dict[str, str] = {}
    if ("BA" in text or "PEA" in text) and _PEROVSKITE_HALIDE.search(text):
        # the spacer cations of layered hybrid perovskites, as that literature writes them ((BA)2PbI4,
        # PEA2PbI4, BA2MA2Pb3I10): only beside a lead, tin, germanium or bismuth halide, where "BA" cannot be
        # barium typed in capitals
        def spacer(m: re.Match) -> str:
            code, name = _PEROVSKITE_SPACERS[m.group(1)]
            used[m.group(1)] = f"{m.group(1)} = {_HILL.get(code, code)} ({name})"
            return code
        text = _PEROVSKITE_SPACER.sub(spacer, text)
    if "Ac" in text and _ACETATE.search(text) and "[" not in text:
        text = _ACETATE.sub(lambda m: "CH3COO" if text[m.start() - 1] == "(" else "(CH3COO)", text)
        used["Ac"] = "Ac = CH3COO (acetate, written after its cation), not the element actinium"
    if not _PATTERN.search(text):
        return text, tuple(used.values())

    def replace(m: re.Match) -> str:
        word = m.group()
        if text.count("[", 0, m.start()) > text.count("]", 0, m.start()):
            return word  # square brackets hold the ion library's codes ([EtNH3], [Me4N]): read there
        if word[0] in "tnsi" and m.start() and is_element_symbol(text[m.start() - 1] + word[0]):
            # the prefix letter ends an element symbol: SnBu3 is Sn(C4H9)3, LiPr2 stays praseodymium's
            rest = word[1:]
            if rest not in ABBREVIATIONS:
                return word
            group, name = ABBREVIATIONS[rest]
            used[rest] = f"{rest} = {_HILL.get(group, group)} ({name})"
            return f"{word[0]}({group})"
        group, name = ABBREVIATIONS[word]
        used[m.group()] = f"{m.group()} = {_HILL.get(group, group)} ({name})"
        # bracketed, so that a count after the abbreviation counts the group (PPh3)
        return group if group.startswith("[") else f"({group})"

    expanded = _PATTERN.sub(replace, text)
    if "([" in expanded:
        expanded = _CODE_IN_PARENTHESES.sub(r"\1", expanded)  # (MA)2PbI4: the code's own brackets suffice
    return expanded, tuple(used.values())


_HYPHEN_PREFIX = re.compile(r"(?<![A-Za-z])(n|t|s|i|sec|tert|iso)-(?=Bu(?![a-z])|(?<=[ni]-)Pr(?![a-z])|(?<=iso-)Pr(?![a-z]))")
_PREFIX_LETTER = {"sec": "s", "tert": "t", "iso": "i"}
_ALKOXY_HYPHEN = re.compile(r"O-(?=[ntsi](?:Bu|Pr)(?![a-z]))")
# "Ac" after a cation and closing the formula or a bracket (NaAc, NH4Ac, HAc, Pb(Ac)2, NaAc·3H2O): acetate; not
# after O (OAc is the ion library's acetate) nor before another element (K3AcF6 would be actinium's)
_ACETATE = re.compile(r"(?<=[A-Za-z0-9)])(?<!O)Ac(?=\d*(?:·|\*|\.|\s|$))|(?<=[A-Za-z0-9)]\()Ac(?=\))")
_PEROVSKITE_SPACERS = {"BA": ("[BuNH3]", "n-butylammonium"), "PEA": ("[PEA]", "phenethylammonium")}
_PEROVSKITE_SPACER = re.compile(r"(?<![A-Za-z])\(?(BA|PEA)\)?(?=\d|\[|\(|[A-Z])")
_PEROVSKITE_HALIDE = re.compile(r"(?:Pb|Sn|Ge|Bi)\d*(?:\.\d+)?(?:I|Br|Cl)")
_CODE_IN_PARENTHESES = re.compile(r"\((\[[A-Za-z0-9]+\])\)")
