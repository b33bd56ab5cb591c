"""Solution pH of a dissolved salt: the weak-acid, weak-base and amphiprotic
approximations, and the constants of ``scorer/data/water_acidity.csv``.

Used by :mod:`scorer.water` (the ``solution_ph`` column). ``acidic`` below pH
6, ``basic`` above 8, else ``neutral``, at 0.1 mol/L (thresholds set here).
A cation counts as an acid only where it alone makes its solution acidic
(Mg2+, Ca2+, Na+ are spectators); a 3+ cation without a row is taken as
acidic (pKa 4); the most basic anion decides.
"""
from __future__ import annotations

import math

from ionicity.scorer.caching import once
from ionicity.scorer.elements import get_element
from ionicity.scorer.tables import table

__all__ = [
    "ACIDIC_BELOW_PH", "BASIC_ABOVE_PH", "CONCENTRATION_MOL_L", "weak_acid_pH", "weak_base_pH", "weak_pair_pH",
    "amphiprotic_pH", "ph_class", "acidity_table", "salt_ph",
]

ACIDIC_BELOW_PH = 6.0
BASIC_ABOVE_PH = 8.0
CONCENTRATION_MOL_L = 0.1

def weak_acid_pH(pKa: float, concentration_mol_L: float = CONCENTRATION_MOL_L) -> float:
    """pH of a weak acid solution, pH = (pKa - log10 c)/2.

    Parameters
    ----------
    pKa : float
        Acid dissociation (or aqua-ion hydrolysis) constant.
    concentration_mol_L : float, default=0.1
        Formal concentration [mol/L].

    References
    ----------
    D. C. Harris, Quantitative Chemical Analysis, weak-acid approximation x = sqrt(Ka c) (common practice).

    Examples
    --------
    NH4Cl at 0.1 mol/L, pKa(NH4+) 9.25: pH 5.1 (Harris's worked example gives 5.13; from memory):

    >>> round(weak_acid_pH(9.25), 2)
    5.12
    """
    return (pKa - math.log10(concentration_mol_L)) / 2.0


def weak_base_pH(pKa_conjugate_acid: float, concentration_mol_L: float = CONCENTRATION_MOL_L,
                 pKw: float = 14.0) -> float:
    """pH of a solution of the anion of a weak acid, pH = pKw - (pKw - pKa - log10 c)/2.

    Examples
    --------
    Sodium acetate at 0.1 mol/L, pKa(acetic acid) 4.76: pH 8.88 (Harris; from memory):

    >>> round(weak_base_pH(4.76), 2)
    8.88
    """
    return pKw - weak_acid_pH(pKw - pKa_conjugate_acid, concentration_mol_L)


def weak_pair_pH(pKa_cation: float, pKa_conjugate_acid: float) -> float:
    """pH of a salt of a weak acid and a weak base, pH = (pKa(BH+) + pKa(HA))/2.

    Examples
    --------
    Ammonium acetate: (9.25 + 4.76)/2 = 7.0 (common practice):

    >>> round(weak_pair_pH(9.25, 4.76), 3)
    7.005
    """
    return (pKa_cation + pKa_conjugate_acid) / 2.0


def amphiprotic_pH(pKa1: float, pKa2: float) -> float:
    """pH of an intermediate (amphiprotic) form, pH = (pKa1 + pKa2)/2.

    Examples
    --------
    NaHCO3: (6.35 + 10.33)/2 = 8.34 (Harris; from memory):

    >>> round(amphiprotic_pH(6.35, 10.33), 2)
    8.34
    """
    return (pKa1 + pKa2) / 2.0


def ph_class(pH: float) -> str:
    """``acidic`` below pH 6, ``basic`` above 8, else ``neutral`` (thresholds set here).

    >>> ph_class(5.12), ph_class(8.88), ph_class(7.0)
    ('acidic', 'basic', 'neutral')
    """
    if pH < ACIDIC_BELOW_PH:
        return "acidic"
    if pH > BASIC_ABOVE_PH:
        return "basic"
    return "neutral"


# complex cations whose ligands are not water ([Co(NH3)6]3+, [Co(en)3]3+): no aqua ion to hydrolyse, so the
# salts of strong acids of the inert 3+ complexes (Co, Cr, Rh, Ir) dissolve about neutral (common practice;
# Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 26.3, from memory); the labile ammines of
# Cu2+, Ni2+, Zn2+, Ag+ give off some ammonia, so their pH is left unsaid as before
COMPLEX_CATION_FAMILIES = frozenset({"ammine-complex", "coordination-complex"})


@once
def acidity_table() -> dict[str, tuple[str, float, float]]:
    """ion_id -> (kind, pKa, pKa2) from ``scorer/data/water_acidity.csv``, read once."""
    nan = float("nan")
    return {
        row["ion_id"]: (row["kind"], float(row["pKa"]) if row["pKa"] else nan, float(row["pKa2"]) if row["pKa2"] else nan)
        for row in table("water_acidity.csv")
    }



def salt_ph(cations, anions) -> tuple[str | None, str]:
    """The pH class of a dissolved salt of ``cations`` and ``anions`` (IonTerm tuples) and the words saying how.

    >>> from ionicity.scorer.ion_library import monatomic_ion
    >>> from ionicity.scorer.model import IonTerm
    >>> salt_ph((IonTerm(monatomic_ion("Al", 3), 1),), (IonTerm(monatomic_ion("Cl", -1), 3),))[0]
    'acidic'
    """
    data = acidity_table()
    acid_pKa, base, unknown = None, None, []
    for term in cations:
        row = data.get(term.ion.ion_id)
        if term.ion.family in COMPLEX_CATION_FAMILIES and term.ion.charge >= 3:
            continue  # no aqua ion: its ligands hold no water to give up a proton (a spectator, as Na+ is)
        if row is not None:
            # a cation too weak to make its own solution acidic (Na+, Mg2+, Ca2+) is a spectator
            if weak_acid_pH(row[1]) < ACIDIC_BELOW_PH:
                acid_pKa = row[1] if acid_pKa is None else min(acid_pKa, row[1])
        elif term.ion.charge >= 3:
            unknown.append(f"{term.ion.ion_id} (no pKa tabulated here; a 3+ aqua ion is acidic)")
            acid_pKa = 4.0 if acid_pKa is None else min(acid_pKa, 4.0)
        elif not term.ion.organic and (term.ion.element is None or get_element(term.ion.element).group not in (1, 2)):
            unknown.append(term.ion.ion_id)
    for term in anions:
        row = data.get(term.ion.ion_id)
        if row is not None and (base is None or _anion_pH(row) > _anion_pH(base[1])):
            base = (term.ion.ion_id, row)
    if unknown and acid_pKa is None:
        return None, f"; pH not given: no hydrolysis constant for {', '.join(unknown)}"
    if base is not None and base[1][0] in {"strong_base", "anion_acid", "amphiprotic"}:
        pH = _anion_pH(base[1])
        if acid_pKa is not None and base[1][0] == "amphiprotic":
            # a weak acid cation beside an amphiprotic anion takes the proton the anion accepts: the pair's pH
            # where that is lower ((NH4+ 9.25 + H2CO3 6.35)/2 = 7.8 for NH4HCO3, measured about 7.8; common
            # practice), the anion's own where that is (NH4H2PO4, 4.7)
            pH = min(pH, weak_pair_pH(acid_pKa, base[1][1]))
        elif acid_pKa is not None and base[1][0] != "strong_base":
            pH = min(pH, weak_acid_pH(acid_pKa))
        how = f"{base[0]} ({base[1][0].replace('_', ' ')})"
    elif base is not None and acid_pKa is not None:
        pH, how = weak_pair_pH(acid_pKa, base[1][1]), f"weak acid cation pKa {acid_pKa:g} with {base[0]}"
    elif base is not None:
        pH, how = weak_base_pH(base[1][1]), f"{base[0]}, pKa(HA) {base[1][1]:g}"
    elif acid_pKa is not None:
        pH, how = weak_acid_pH(acid_pKa), f"aqua cation pKa {acid_pKa:g}"
    else:
        pH, how = 7.0, "ions of a strong acid and a strong base"
    if unknown:
        how += "; " + ", ".join(unknown)
    return ph_class(pH), f"; pH about {pH:.1f} at {CONCENTRATION_MOL_L:g} mol/L ({how}): {ph_class(pH)}"


def _anion_pH(row) -> float:
    kind, pKa, pKa2 = row
    if kind == "strong_base":
        return 13.0
    if kind == "anion_acid":
        return weak_acid_pH(pKa)
    if kind == "amphiprotic":
        return amphiprotic_pH(pKa, pKa2)
    return weak_base_pH(pKa)
