"""Stand-in ions for the lattice energy of the salt melting index when a cation has no radius.

The salt index (:mod:`scorer.melting`) needs a lattice energy, and the
lattice energy needs a radius for every monatomic ion. Some cations the ion
solver gives have none in Shannon's table (Zr(3+) in ZrCl3, Ho(2+) in HoO,
Hf(3+) in HfN). Their compound then takes the lattice energy of the same
formula with that ion replaced by a *stand-in* of the same charge, said in the
row's notes; every other term of the index (electronegativity, Fajans
covalency, entropy) keeps the real ion. Two rules, first match wins:

1. :data:`RADIUS_ANALOGUES`: lone-pair (ns2) cations and the heavier lone-pair
   cation of their group and charge (Sn2+ takes Pb2+).
2. :func:`estimated_radius_pm`: the element's radius at its nearest listed
   charge, scaled by the median ratio of Shannon radii one charge apart
   (measured on Shannon's own table), and the cation of the same charge whose
   Shannon radius is nearest that estimate stands in (:func:`nearest_stand_in`).
"""
from __future__ import annotations

import math
from dataclasses import replace

import numpy as np

from ionicity.scorer.caching import once
from ionicity.scorer.elements import element_symbols, get_element
from ionicity.scorer.ion_library import get_ion
from ionicity.scorer.model import Decomposition, Ion
from ionicity.scorer.radii import shannon_radius_pm

__all__ = ["RADIUS_ANALOGUES", "charge_step_ratio", "estimated_radius_pm", "nearest_stand_in", "radius_analogue"]

# Lone-pair (ns2) cations with no Shannon radius, and the heavier lone-pair cation of
# their group and charge whose radius stands in for theirs in the lattice energy (a
# documented fallback, said in the row's notes): Sn2+ and In+ are not in Shannon's table
# (Acta Cryst. 1976, A32, 751; from memory), Pb2+ (119 pm) and Tl+ (150 pm) are.
RADIUS_ANALOGUES: dict[str, str] = {"Sn(2+)": "Pb(2+)", "In(+)": "Tl(+)", "Ga(+)": "Tl(+)"}


@once
def _cation_radii() -> dict[tuple[str, int], float]:
    """(symbol, charge) -> Shannon radius at CN VI (or the nearest listed CN) of every listed cation."""
    out = {}
    for symbol in element_symbols():
        for charge in sorted({r.charge for r in get_element(symbol).shannon_radii if r.charge > 0}):
            radius, _ = shannon_radius_pm(symbol, charge)
            if math.isfinite(radius):
                out[(symbol, charge)] = radius
    return out


@once
def charge_step_ratio() -> float:
    """Median of ``r(z) / r(z + 1)`` over the elements Shannon lists at two neighbouring cation charges.

    Measured on Shannon's table (R. D. Shannon, Acta Cryst. A 1976, 32, 751)
    as the element data of :mod:`scorer.elements` hold it: the radius of a
    cation grows by about this factor for each unit of charge it loses
    (Ti: 86, 67, 60.5 pm for 2+, 3+, 4+).

    >>> 1.1 < charge_step_ratio() < 1.3
    True
    """
    radii = _cation_radii()
    ratios = [radii[(s, z)] / radii[(s, z + 1)] for (s, z) in radii if (s, z + 1) in radii]
    return float(np.median(ratios))


def estimated_radius_pm(symbol: str, charge: int) -> tuple[float, str]:
    """A cation's radius from the same element's nearest listed charge, scaled by :func:`charge_step_ratio`.

    ``r(z) = r(z') * q**(z' - z)`` with ``z'`` the listed charge nearest
    ``z`` (the higher one on a tie: the oxidation state the compound's
    electrons are nearest to in a metallic monoxide or nitride).

    Returns
    -------
    (float, str)
        Radius in pm (NaN when the element has no listed cation) and how it was estimated.

    Examples
    --------
    Ti: Shannon lists Ti(2+) 86 pm and Ti(4+) 60.5 pm; Zr lists only Zr(4+), 72 pm:

    >>> radius, how = estimated_radius_pm("Zr", 3)
    >>> round(radius / 72.0, 3) == round(charge_step_ratio(), 3)
    True
    """
    listed = sorted((abs(z - charge), -z) for (s, z) in _cation_radii() if s == symbol)
    if not listed:
        return math.nan, f"Shannon (1976) lists no cation of {symbol}"
    nearest = -listed[0][1]
    radius = _cation_radii()[(symbol, nearest)] * charge_step_ratio() ** (nearest - charge)
    return radius, (f"{symbol}({charge}+) estimated at {radius:.0f} pm from {symbol}({nearest}+) times"
                    f" {charge_step_ratio():.3f} per unit of charge (median ratio of Shannon radii one charge apart)")


def nearest_stand_in(ion: Ion) -> tuple[Ion, str] | None:
    """The listed cation of the same charge whose radius is nearest this one's estimate, and why; None if none."""
    if not ion.monatomic or ion.charge <= 0 or ion.element is None:
        return None
    radius, how = estimated_radius_pm(ion.element, ion.charge)
    if not math.isfinite(radius):
        return None
    candidates = sorted((abs(r - radius), s) for (s, z), r in _cation_radii().items() if z == ion.charge)
    for _, symbol in candidates:
        try:
            stand_in = get_ion(f"{symbol}({'' if ion.charge == 1 else ion.charge}+)")
        except KeyError:
            continue
        return stand_in, f"{how}, {stand_in.ion_id} ({_cation_radii()[(symbol, ion.charge)]:.0f} pm) stands in"
    return None


def _has_radius(ion: Ion) -> bool:
    return not ion.monatomic or ion.charge < 0 or math.isfinite(shannon_radius_pm(ion.element, ion.charge)[0])


def _stand_in(ion: Ion) -> tuple[Ion, str] | None:
    if ion.ion_id in RADIUS_ANALOGUES:
        stand_in = get_ion(RADIUS_ANALOGUES[ion.ion_id])
        return stand_in, f"{ion.ion_id} has no Shannon radius: lattice energy with the radius of {stand_in.ion_id}"
    found = nearest_stand_in(ion)
    if found is None:
        return None
    return found[0], f"{ion.ion_id} has no Shannon radius: lattice energy with {found[1]}"


def radius_analogue(dec: Decomposition) -> tuple[Decomposition, str] | None:
    """The decomposition with each cation that has no Shannon radius replaced by its stand-in, and the note.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> swapped, note = radius_analogue(decompose(parse_formula("SnCl2")))
    >>> swapped.cations[0].ion.ion_id
    'Pb(2+)'
    """
    used = []

    def swap(terms):
        out = []
        for t in terms:
            found = None if _has_radius(t.ion) else _stand_in(t.ion)
            if found is None:
                out.append(t)
                continue
            out.append(replace(t, ion=found[0]))
            used.append(found[1])
        return tuple(out)

    swapped = replace(dec, cations=swap(dec.cations))
    return (swapped, "; ".join(used)) if used else None
