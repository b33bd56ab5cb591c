"""Which anions the anion terms of the salt melting index count (read through :mod:`scorer.melting`).

Rules on an ion's composition and charge, no weights: framework oxoanions
(chains and frameworks in the solid), anions that carry hydrogen (hydrogen
bonds between the anions) and anions that bind through O or F (hard donors,
beside which an 18/18+2-electron cation keeps part of its ionic cohesion).
The weights of the terms are in :data:`scorer.melting_index.TREND_WEIGHTS`.
"""
from __future__ import annotations

from ionicity.scorer.model import Ion

__all__ = ["NETWORK_FORMERS", "is_framework_oxoanion", "is_hydrogen_bonded_anion", "is_hard_donor_anion"]

NETWORK_FORMERS = frozenset({"B", "Al", "Ga", "Si", "Ge", "P", "As", "Ti", "Zr", "V", "Fe"})


def is_framework_oxoanion(ion: Ion) -> bool:
    """An oxoanion of one network-forming element with at most 3 O per central atom (chains, frameworks).

    Metaborate, aluminate, metasilicate, metaphosphate, ferrite, titanate,
    zirconate: in the solid they share oxygen corners (the O:X ratio below 4
    says so), unlike the discrete SO4 2-, NO3- or ClO4- ions (common practice).

    >>> from ionicity.scorer.ion_library import get_ion
    >>> is_framework_oxoanion(get_ion("AlO2(-)")), is_framework_oxoanion(get_ion("SO4(2-)"))
    (True, False)
    """
    comp = dict(ion.composition)
    others = [e for e in comp if e != "O"]
    return (len(others) == 1 and others[0] in NETWORK_FORMERS and comp.get("O", 0) > 0
            and comp["O"] / comp[others[0]] <= 3)


def is_hydrogen_bonded_anion(ion: Ion) -> bool:
    """An inorganic anion that carries hydrogen (HF2-, HSO4-, H2PO4-, OH-): it donates hydrogen bonds to its neighbours.

    Hydride (H-) and organic anions do not count (common practice).

    >>> from ionicity.scorer.ion_library import get_ion
    >>> is_hydrogen_bonded_anion(get_ion("HF2(-)")), is_hydrogen_bonded_anion(get_ion("SO4(2-)"))
    (True, False)
    """
    comp = dict(ion.composition)
    return not ion.organic and ion.charge < 0 and "H" in comp and len(comp) > 1


def is_hard_donor_anion(ion: Ion) -> bool:
    """An inorganic anion that binds through oxygen or fluorine: O2-, F- or an oxo/fluoro anion (SO4 2-, BF4-).

    Beside an 18 or 18+2 electron cation (Zn2+, Sn4+, Ag+) the covalency of
    Fajans' third rule goes with soft, polarisable anions (ZnI2, SnCl4 come
    apart low) and much less with hard O and F donors (ZnO, SnO2 are
    refractory): Pearson's hard and soft acids and bases, J. Am. Chem. Soc.
    1963, 85, 3533 (from memory).

    >>> from ionicity.scorer.ion_library import get_ion
    >>> [is_hard_donor_anion(get_ion(i)) for i in ("O(2-)", "SO4(2-)", "Cl(-)")]
    [True, True, False]
    """
    comp = dict(ion.composition)
    return not ion.organic and ion.charge < 0 and ("O" in comp or "F" in comp)
