"""Which atoms of two ions meet, and how the pairs of several ions are weighted:
the contacts across which :mod:`scorer.character` (and :mod:`scorer.fajans`,
:mod:`scorer.hsab`) take their differences.

Which two atoms
---------------
A salt's bond is the contact between a cation and an anion, so the
electronegativity difference is taken between the atom of each ion that
meets the other (:func:`contact_atom`):

* monatomic ions: the element itself;
* oxygen-bearing anions (oxoanions, carboxylates, sulfonates, alkylsulfates,
  hydroxide, [NTf2] and [FSI], whose cations sit at the sulfonyl oxygens): O;
* halo-complexes and polyhalides without oxygen (BF4, PF6, AlCl4, PtCl6,
  ICl2, [FAP]): the most electronegative halogen, which forms their surface;
* pseudohalides by their usual donor atom: C for cyanide and fulminate, N for
  thiocyanate, selenocyanate and cyanate; N for cyano-complexes and the
  all-nitrile ionic-liquid anions ([dca], [tcm], B(CN)4), whose terminal
  nitrogens face the cations;
* hydridic anions (BH4, AlH4, whose central atom is less electronegative than
  H): H; other one-element anions with H (OH, HS, NH2): the heavy atom;
* cations with a metal atom (UO2, VO, BiO, Hg2): the metal; ammine complexes
  and cations without a metal that carry H (NH4, H3O, every organic cation):
  H, the atom through which they hydrogen-bond to the anion; other cations
  without a metal (NO, NO2): the least electronegative atom.

No published group electronegativity is used; ``explain`` says which rule
picked each atom.

Several ions
------------
With several cations or anions every cation-anion pair is weighted by the
product of the two ions' stoichiometric fractions on their own side
(:func:`contact_pairs`); KAl(SO4)2 gives the pairs K-SO4 and Al-SO4 at 1/2 each.
Pair values are averaged with those weights; ``ionic_character_pauling_min_pct``
reports the least ionic pair.
"""
from __future__ import annotations

import math

from ionicity.scorer.elements import get_element, is_metal
from ionicity.scorer.model import Decomposition, Ion, IonTerm

__all__ = ["contact_atom", "contact_pairs", "pauling_electronegativity", "weighted_mean"]


def pauling_electronegativity(symbol: str) -> float:
    """Pauling electronegativity of an element; NaN when unknown (He, Ne, Eu...).

    >>> pauling_electronegativity("Cl")
    3.16
    """
    try:
        return float(get_element(symbol).electronegativity_pauling)
    except KeyError:
        return math.nan


_HALOGENS = ("F", "Cl", "Br", "I", "At")
# The donor atom usually met by the cation (Greenwood & Earnshaw, Chemistry of
# the Elements, 2nd ed., 1997, ch. 8 and 15, from memory): cyanide and
# fulminate bind through C; thiocyanate, selenocyanate and cyanate through N.
_PSEUDOHALIDE_CONTACT = {"CN": "C", "CNO": "C", "SCN": "N", "SeCN": "N", "OCN": "N"}
_NITRILE_FAMILIES = ("cyano-complex", "cyano-anion")


def contact_atom(ion: Ion) -> tuple[str | None, str]:
    """The atom of ``ion`` that meets the counter-ion, and why it was chosen.

    The rules are in the module docstring; they follow the ion's family and
    composition, never its name.

    Parameters
    ----------
    ion : scorer.model.Ion

    Returns
    -------
    (symbol, reason) : tuple of (str or None, str)

    Examples
    --------
    >>> from ionicity.scorer.model import Ion
    >>> so4 = Ion("SO4(2-)", "SO4", -2, (("S", 1), ("O", 4)), "oxoanion")
    >>> contact_atom(so4)[0]
    'O'
    """
    elements = [s for s, n in ion.composition if n > 0]
    if ion.element is not None or len(elements) == 1:
        symbol = ion.element or elements[0]
        return symbol, "monatomic ion" if ion.element else "one-element ion"
    if not elements:
        return None, "ion without a composition"
    heavy = [s for s in elements if s != "H"]
    chi = {s: pauling_electronegativity(s) for s in elements}
    known = [s for s in elements if not math.isnan(chi[s])]
    if ion.charge < 0:
        if ion.label in _PSEUDOHALIDE_CONTACT:
            return _PSEUDOHALIDE_CONTACT[ion.label], "pseudohalide: its usual donor atom"
        if ion.family in _NITRILE_FAMILIES and "N" in elements:
            return "N", "cyano anion: the terminal nitrile N faces the cations"
        if len(heavy) == 1 and "H" in elements:
            if chi[heavy[0]] < chi["H"]:
                return "H", f"hydridic anion: H is more electronegative than {heavy[0]}"
            return heavy[0], "hydrogen-bearing anion: the charge sits on the heavy atom"
        if "O" in elements:
            return "O", "oxygen-bearing anion: the cations meet its O atoms"
        halogens = [s for s in _HALOGENS if s in elements]
        if halogens:
            best = max(halogens, key=lambda s: chi[s])
            return best, "halo-complex: its surface halogen atoms meet the cations"
        if not known:
            return None, "no element of the anion has a Pauling electronegativity"
        candidates = [s for s in known if s != "H"] or known
        return max(candidates, key=lambda s: chi[s]), "most electronegative non-H atom of the anion"
    metals = [s for s in elements if is_metal(s)]
    if metals and ion.family != "ammine-complex":
        known_metals = [s for s in metals if not math.isnan(chi[s])] or metals
        best = min(known_metals, key=lambda s: chi[s] if not math.isnan(chi[s]) else 9.0)
        return best, "cation with a metal atom: the metal meets the anions"
    if "H" in elements:
        return "H", "molecular cation: it meets the anion through its H atoms (hydrogen bonds)"
    if not known:
        return None, "no element of the cation has a Pauling electronegativity"
    return min(known, key=lambda s: chi[s]), "cation without metal or H: its least electronegative atom"


def contact_pairs(dec: Decomposition) -> list[tuple[IonTerm, IonTerm, float]]:
    """Every cation-anion pair of a decomposition with its weight.

    The weight of a pair is (n_cation / total cations) * (n_anion / total
    anions), counts per formula unit; the weights sum to 1.

    Examples
    --------
    >>> from ionicity.scorer.model import Ion, IonTerm, Decomposition
    >>> k = IonTerm(Ion("K(+)", "K", 1, (("K", 1),), "monatomic", element="K"), 1)
    >>> al = IonTerm(Ion("Al(3+)", "Al", 3, (("Al", 1),), "monatomic", element="Al"), 1)
    >>> so4 = IonTerm(Ion("SO4(2-)", "SO4", -2, (("S", 1), ("O", 4)), "oxoanion"), 2)
    >>> [w for _, _, w in contact_pairs(Decomposition(cations=(k, al), anions=(so4,)))]
    [0.5, 0.5]
    """
    total_c = sum(t.count for t in dec.cations)
    total_a = sum(t.count for t in dec.anions)
    if total_c <= 0 or total_a <= 0:
        return []
    return [(c, a, (c.count / total_c) * (a.count / total_a)) for c in dec.cations for a in dec.anions]


def weighted_mean(values: list[tuple[float, float]]) -> float:
    """Mean of (value, weight) pairs, skipping NaN values and renormalising; NaN if none."""
    usable = [(v, w) for v, w in values if v is not None and not math.isnan(v) and w > 0]
    total = sum(w for _, w in usable)
    if total <= 0:
        return math.nan
    return sum(v * w for v, w in usable) / total
