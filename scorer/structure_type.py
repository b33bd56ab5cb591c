"""Structure types of binary salts: the known prototype of a salt, else
Pauling's radius-ratio guess, and the prototype's cell scaled to a salt.

Known types come from ``scorer/data/structure_prototypes.csv``
(``origin = "known"``); a salt not listed gets the radius-ratio rule on
Shannon CN VI radii (``"guessed"``, which the lattice module turns into a
warning); anything else has none (``"none"``). The prototypes themselves
(geometry, Ewald sums) are :mod:`scorer.madelung`'s.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from ionicity.scorer.caching import once, per_input
from ionicity.scorer.crystal import prototype_structure
from ionicity.scorer.model import Ion
from ionicity.scorer.radii import shannon_radius_pm
from ionicity.scorer.tables import table

__all__ = [
    "StructureAssignment",
    "structure_prototypes",
    "assign_structure_type",
    "charges_fit_prototype",
    "cell_volume",
]


@once
def structure_prototypes() -> dict[tuple[str, str], tuple[str, str]]:
    """(cation_id, anion_id) -> (structure_type, source), read once."""
    return {
        (row["cation_id"], row["anion_id"]): (row["structure_type"], row["source"])
        for row in table("structure_prototypes.csv")
    }


@dataclass(frozen=True)
class StructureAssignment:
    """The structure type of a binary salt and how it was found."""

    structure_type: str | None
    origin: str  # "known", "guessed" or "none"
    note: str


# Pauling's limiting radius ratios (common practice): the lower bound of each
# cation coordination, with the prototype that coordination gives per formula type.
_RADIUS_RATIO_RULES: dict[tuple[int, int], tuple[tuple[float, str], ...]] = {
    (1, 1): ((0.732, "caesium-chloride"), (0.414, "rock-salt"), (0.225, "zinc-blende")),
    (1, 2): ((0.732, "fluorite"), (0.414, "rutile")),
    (2, 1): ((0.225, "anti-fluorite"),),
    (2, 3): ((0.414, "corundum"),),
}


def _reduced_ratio(n_cation: float, n_anion: float) -> tuple[int, int] | None:
    if n_cation <= 0 or n_anion <= 0 or not float(n_cation).is_integer() or not float(n_anion).is_integer():
        return None
    g = math.gcd(int(n_cation), int(n_anion))
    return int(n_cation) // g, int(n_anion) // g


def charges_fit_prototype(cation: Ion, anion: Ion, structure_type: str) -> bool:
    s = prototype_structure(structure_type)
    qc = max(s.charges)
    qa = -min(s.charges)
    return abs(cation.charge * qa - (-anion.charge) * qc) < 1e-9


@per_input(maxsize=4096)
def assign_structure_type(cation: Ion, anion: Ion, n_cation: float, n_anion: float) -> StructureAssignment:
    """Structure type of the binary salt (cation)n_cation (anion)n_anion.

    Known prototypes first (``scorer/data/structure_prototypes.csv``), then
    Pauling's radius-ratio rule on Shannon CN VI radii (common practice):
    for MX, r+/r- >= 0.732 caesium chloride, >= 0.414 rock salt, >= 0.225
    zinc blende; for MX2 >= 0.732 fluorite, >= 0.414 rutile; M2X anti-fluorite
    when r+/r- >= 0.225; M2X3 corundum when >= 0.414. Anything else: none.
    """
    known = structure_prototypes().get((cation.ion_id, anion.ion_id))
    if known is not None:
        structure_type, source = known
        return StructureAssignment(structure_type, "known", f"structure type {structure_type}: {source}")
    ratio = _reduced_ratio(n_cation, n_anion)
    if ratio not in _RADIUS_RATIO_RULES:
        return StructureAssignment(None, "none", "no known structure type and no radius-ratio rule for this formula type")
    if cation.element is None or anion.element is None:
        return StructureAssignment(None, "none", "no known structure type; the radius-ratio rule needs monatomic ions")
    r_cation, _ = shannon_radius_pm(cation.element, cation.charge, 6)
    r_anion, _ = shannon_radius_pm(anion.element, anion.charge, 6)
    if math.isnan(r_cation) or math.isnan(r_anion):
        return StructureAssignment(None, "none", "no known structure type and no Shannon radius for the radius ratio")
    rho = r_cation / r_anion
    for lower, structure_type in _RADIUS_RATIO_RULES[ratio]:
        if rho >= lower and charges_fit_prototype(cation, anion, structure_type):
            return StructureAssignment(
                structure_type,
                "guessed",
                f"structure type {structure_type} guessed from the radius ratio r+/r- = {rho:.3f} "
                "(Shannon CN VI radii; Pauling's limiting ratios, common practice): not a known structure",
            )
    return StructureAssignment(
        None, "none", f"radius ratio r+/r- = {rho:.3f} fits none of the built-in prototypes for this formula type"
    )



@once
def cell_volume(structure_type: str) -> float:
    """Volume of a prototype's cell, in its own length unit cubed (computed
    once per prototype, not once per salt)."""
    return abs(float(np.linalg.det(np.asarray(prototype_structure(structure_type).lattice))))
