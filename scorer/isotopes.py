"""The hydrogen isotopes D and T: their masses and their place in the text.

IUPAC allows the symbols D and T for deuterium (2H) and tritium (3H)
(Connelly et al., Nomenclature of Inorganic Chemistry, IUPAC
Recommendations 2005, IR-3.3.2). The grammar (:mod:`scorer.grammar`) reads
them as hydrogen, so D2O is scored as water, NaOD as a base and LiAlD4 as
Li+ [AlH4]- with the oxidation states of LiAlH4; it also counts how many of
the hydrogens were written D or T (``ParsedFormula.isotopes``). This module
turns that count back into what differs: the molar mass, and the text of the
columns that would otherwise say H (``D2O``, not ``H2O``).

Where D and T stand in a formula: in hydrogen's place, D after H and T after
D (``CHD3``, ``CDCl3``, ``NaOD``), the common practice of isotope suppliers'
catalogues; no Hill-system rule for isotopes was checked for this.
"""
from __future__ import annotations

import re

from ionicity.scorer.grammar import format_count

__all__ = ["ISOTOPE_MASS_G_MOL", "isotope_mass_shift_g_mol", "isotope_text"]

# Atomic masses of 2H and 3H in g/mol (numerically the relative atomic masses):
# the values periodictable 2.1 gives as periodictable.D.mass and
# periodictable.T.mass (tests/test_isotopes.py compares them).
ISOTOPE_MASS_G_MOL = {"D": 2.01410177784, "T": 3.01604928132}

# an H that is the symbol of hydrogen (not the H of Hg, He, Hf, Ho, Hs)
_HYDROGEN = re.compile(r"H(?![a-z])(\d+(?:\.\d+)?)?")


def isotope_mass_shift_g_mol(isotopes, hydrogen_weight_g_mol: float) -> float:
    """What writing some hydrogens as D or T adds to the molar mass [g/mol]:
    each one's isotope mass less the standard atomic weight of hydrogen.

    >>> round(isotope_mass_shift_g_mol((("D", 2.0),), 1.008), 5)
    2.0122
    """
    return sum(n * (ISOTOPE_MASS_G_MOL[s] - hydrogen_weight_g_mol) for s, n in isotopes)


def isotope_text(text: str, isotopes, hydrogen_count: float, *, whole_formula: bool = False) -> str:
    """``text`` (written with H for every hydrogen) with the hydrogens written
    as D or T again.

    When every hydrogen is of one isotope, every hydrogen symbol of ``text``
    becomes it (``Li[AlH4]`` -> ``Li[AlD4]``, ``·5H2O`` -> ``·5D2O``). A mix of
    isotopes is placed only where ``text`` is a formula (``whole_formula``)
    that writes hydrogen once: ``CH4`` with three D -> ``CHD3``; otherwise
    ``text`` is returned as it is (NaH2PO4·2D2O keeps H in the text, and its
    mass is still that of the isotopes).

    >>> isotope_text("Li[AlH4]", (("D", 4.0),), 4.0)
    'Li[AlD4]'
    >>> isotope_text("H2O", (("D", 1.0),), 2.0, whole_formula=True), isotope_text("HgH2", (("T", 2.0),), 2.0)
    ('HDO', 'HgT2')
    """
    written = dict(isotopes)
    heavy = sum(written.values())
    if not text or heavy <= 0:
        return text
    if len(written) == 1 and abs(heavy - hydrogen_count) < 1e-9:
        symbol = next(iter(written))
        return _HYDROGEN.sub(lambda m: symbol + (m.group(1) or ""), text)
    matches = list(_HYDROGEN.finditer(text))
    if not whole_formula or len(matches) != 1 or abs(float(matches[0].group(1) or 1) - hydrogen_count) > 1e-9:
        return text
    parts = [("H", hydrogen_count - heavy)] + [(s, written[s]) for s in ("D", "T") if s in written]
    spelled = "".join(s + ("" if abs(n - 1) < 1e-9 else format_count(n)) for s, n in parts if n > 1e-9)
    m = matches[0]
    return text[:m.start()] + spelled + text[m.end():]
