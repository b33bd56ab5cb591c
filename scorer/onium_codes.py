"""Organic cations built by rule from the codes ionic-liquid papers write them in.

The ion library (``scorer/data/ions.csv``) lists the common onium cations with their sources; the codes of
the trade name many more by the same pattern, one per alkyl chain length (common practice in the
ionic-liquid literature, e.g. Wasserscheid & Welton, Ionic Liquids in Synthesis, 2nd ed., 2008, and the
notation of Armand et al., Nat. Mater. 8 (2009) 621; from memory):

* ``[Cnmim]`` (also ``CnC1im``): 1-alkyl-3-methylimidazolium, C(n+4) H(2n+7) N2;
* ``[Cnpy]``: 1-alkylpyridinium, C(n+5) H(2n+6) N;
* ``[Cnmpyr]`` (also ``CnC1pyr``, ``CnC1pyrr``, ``Cnmpyrr``): 1-alkyl-1-methylpyrrolidinium, C(n+5) H(2n+12) N;
* ``[Cnmpip]`` (also ``CnC1pip``): 1-alkyl-1-methylpiperidinium, C(n+6) H(2n+14) N;
* ``[Nabcd]`` and ``[Pabcd]``: tetraalkylammonium and -phosphonium with chains of a, b, c and d carbons
  (four digits, one chain each; five digits, three one-digit chains and a two-digit last one, as in
  P66614 and N11116), C(a+b+c+d) H(2(a+b+c+d)+4) N or P.

Chains run from 1 to :data:`MAX_CHAIN` carbons. A code the library lists is always read from the library
(:func:`scorer.ion_library.find_alias` asks here only when it finds nothing); a built ion says so in its
``source``. Its shape (torsions, symmetry) and volume are estimated like any organic ion the shape table
does not list.

>>> onium_from_code("C16mim").ion_id, dict(onium_from_code("C16mim").composition)
('[C16mim](+)', {'C': 20.0, 'H': 39.0, 'N': 2.0})
>>> onium_from_code("P4441").ion_id, onium_from_code("P4441").family
('[P1444](+)', 'phosphonium')
>>> onium_from_code("DBUH") is None
True
"""
from __future__ import annotations

import re

from ionicity.scorer.caching import per_input
from ionicity.scorer.model import Ion

__all__ = ["MAX_CHAIN", "ALKYL_NAMES", "onium_from_code", "canonical_quaternary_code"]

#: the longest alkyl chain a code may name (icosyl)
MAX_CHAIN = 20

#: the n-alkyl groups by chain length (ALKYL_NAMES[n - 1] has n carbons)
ALKYL_NAMES = ("methyl", "ethyl", "propyl", "butyl", "pentyl", "hexyl", "heptyl", "octyl", "nonyl", "decyl",
          "undecyl", "dodecyl", "tridecyl", "tetradecyl", "pentadecyl", "hexadecyl", "heptadecyl", "octadecyl",
          "nonadecyl", "icosyl")
_SOURCE = ("built by rule from the code (scorer.onium_codes: the alkyl-chain notation of the ionic-liquid"
           " literature, Wasserscheid & Welton, Ionic Liquids in Synthesis, 2nd ed., 2008; from memory)")

# ring cations: (pattern, label template, family, name template, C offset, H offset, N count)
_RINGS = (
    (re.compile(r"C(\d{1,2})(?:mim|C1im)", re.I), "[C{n}mim]", "imidazolium", "1-{alkyl}-3-methylimidazolium",
     4, 7, 2),
    (re.compile(r"C(\d{1,2})py", re.I), "[C{n}py]", "pyridinium", "1-{alkyl}pyridinium", 5, 6, 1),
    (re.compile(r"C(\d{1,2})(?:mpyrr?|C1pyrr?)", re.I), "[C{n}mpyr]", "pyrrolidinium",
     "1-{alkyl}-1-methylpyrrolidinium", 5, 12, 1),
    (re.compile(r"C(\d{1,2})(?:mpip|C1pip)", re.I), "[C{n}mpip]", "piperidinium", "1-{alkyl}-1-methylpiperidinium",
     6, 14, 1),
)
_QUATERNARY = re.compile(r"([NP])(\d{4,5})")
# the same with the chains apart, as papers write a two-digit chain anywhere: P14,6,6,6, N1,1,1,16, N4,4,4,4
_QUATERNARY_SPLIT = re.compile(r"\[?\s*([NP])(\d{1,2})\s*,\s*(\d{1,2})\s*,\s*(\d{1,2})\s*,\s*(\d{1,2})\s*\]?")


def canonical_quaternary_code(code: str) -> str | None:
    """A quaternary code with its chains apart, as the library writes such codes (three one-digit chains in
    ascending order, then the longest: ``P14,6,6,6`` -> ``P66614``; four one-digit chains ascending:
    ``N4,1,1,1`` -> ``N1114``); None for any other text or where no such code exists (two chains over 9).

    >>> canonical_quaternary_code("P14,6,6,6"), canonical_quaternary_code("[N1,1,1,16]"), canonical_quaternary_code("C4mim")
    ('P66614', 'N11116', None)
    """
    m = _QUATERNARY_SPLIT.fullmatch(code) if isinstance(code, str) else None
    if m is None:
        return None
    chains = sorted(int(g) for g in m.groups()[1:])
    if not all(1 <= c <= MAX_CHAIN for c in chains) or any(c > 9 for c in chains[:3]):
        return None
    return m.group(1) + "".join(str(c) for c in chains)


def _chains(digits: str) -> tuple[int, ...] | None:
    """Chain lengths of a quaternary code: four digits one each, five digits three and a two-digit last."""
    chains = tuple(int(d) for d in digits) if len(digits) == 4 else (
        tuple(int(d) for d in digits[:3]) + (int(digits[3:]),))
    return chains if all(1 <= c <= MAX_CHAIN for c in chains) else None


@per_input(maxsize=1024)
def onium_from_code(code: str) -> Ion | None:
    """The onium cation a code names by the rules of the module docstring, or None.

    Parameters
    ----------
    code : str
        The code without brackets, as written (``C16mim``, ``P4441``, ``C6mpyr``).

    Returns
    -------
    Ion or None
        A cation of charge +1 whose ``source`` says it was built by rule.
    """
    if not isinstance(code, str):
        return None
    code = code.strip().strip("[]")
    for pattern, label, family, name, c_offset, h_offset, nitrogens in _RINGS:
        m = pattern.fullmatch(code)
        if m:
            n = int(m.group(1))
            if not 1 <= n <= MAX_CHAIN:
                return None
            composition = (("C", float(n + c_offset)), ("H", float(2 * n + h_offset)), ("N", float(nitrogens)))
            text = label.format(n=n)
            return Ion(ion_id=text + "(+)", label=text, charge=1, composition=composition, family=family,
                       name=name.format(alkyl=ALKYL_NAMES[n - 1]), organic=True, source=_SOURCE)
    m = _QUATERNARY.fullmatch(code)
    if m:
        centre, chains = m.group(1), _chains(m.group(2))
        if chains is None:
            return None
        chains = tuple(sorted(chains))
        carbons = sum(chains)
        text = f"[{centre}" + "".join(str(c) for c in chains) + "]"
        counts = {"C": float(carbons), "H": float(2 * carbons + 4), centre: 1.0}
        composition = tuple((s, counts[s]) for s in ("C", "H", "N", "P") if s in counts)
        names = ", ".join(ALKYL_NAMES[c - 1] for c in chains)
        family = "ammonium-quaternary" if centre == "N" else "phosphonium"
        kind = "ammonium" if centre == "N" else "phosphonium"
        return Ion(ion_id=text + "(+)", label=text, charge=1, composition=composition, family=family,
                   name=f"tetraalkyl{kind} ({names})", organic=True, source=_SOURCE)
    return None
