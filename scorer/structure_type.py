"""Structure types of salts: the measured structure of a compound, else
Pauling's radius-ratio guess for a binary salt, and the measured cell.

Measured structures come from ``scorer/data/structure_prototypes.csv``: per
compound its structure type, lattice parameters and the cation-anion
first-shell distance, each row with its source (``origin = "measured"``).
A binary salt not listed gets the radius-ratio rule on Shannon CN VI radii
(``"guessed"``: a value note, and the best-estimate column does not use it);
anything else has none (``"none"``). The prototypes themselves (geometry,
Ewald sums) are :mod:`scorer.crystal`'s and :mod:`scorer.madelung`'s.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from ionicity.scorer.caching import once, per_input
from ionicity.scorer.crystal import prototype_structure, with_cell
from ionicity.scorer.madelung import madelung_details
from ionicity.scorer.model import Ion
from ionicity.scorer.radii import shannon_radius_pm
from ionicity.scorer.tables import table

__all__ = [
    "MeasuredStructure",
    "StructureAssignment",
    "structure_prototypes",
    "measured_structure",
    "assign_structure_type",
    "charges_fit_prototype",
    "cell_volume",
    "measured_cell_volume_A3",
]


@dataclass(frozen=True)
class MeasuredStructure:
    """One row of the measured-structure table (lengths in pm)."""

    compound: str
    structure_type: str
    a_pm: float
    b_pm: float | None
    c_pm: float | None
    beta_deg: float | None
    nn_distance_pm: float
    source: str

    @property
    def volume_per_formula_unit_nm3(self) -> float:
        """Cell volume from the lattice parameters over the prototype's formula units per cell."""
        return measured_cell_volume_A3(self) / madelung_details(self.structure_type).formula_units * 1e-3


def _ids(text: str) -> tuple[str, ...]:
    return tuple(sorted(part for part in text.split(";") if part))


def _optional(text: str) -> float | None:
    return float(text) if text else None


@once
def structure_prototypes() -> dict[tuple[tuple[str, ...], tuple[str, ...]], MeasuredStructure]:
    """(cation ids, anion ids) -> measured structure, read once.

    Ion ids are sorted tuples (``("Al(3+)", "Mg(2+)")`` for spinel MgAl2O4).
    """
    out = {}
    for row in table("structure_prototypes.csv"):
        out[(_ids(row["cation_id"]), _ids(row["anion_id"]))] = MeasuredStructure(
            compound=row["compound"],
            structure_type=row["structure_type"],
            a_pm=float(row["a_pm"]),
            b_pm=_optional(row["b_pm"]),
            c_pm=_optional(row["c_pm"]),
            beta_deg=_optional(row["beta_deg"]),
            nn_distance_pm=float(row["nn_distance_pm"]),
            source=row["source"],
        )
    return out


def measured_structure(cation_ids, anion_ids) -> MeasuredStructure | None:
    """The measured structure of the salt of these ions, or None."""
    return structure_prototypes().get((tuple(sorted(cation_ids)), tuple(sorted(anion_ids))))


def measured_cell_volume_A3(row: MeasuredStructure) -> float:
    """Volume of the measured cell in angstrom^3 (lattice parameters in pm)."""
    def angstrom(x):
        return None if x is None else x / 100.0
    cell = with_cell(row.structure_type, row.a_pm / 100.0, angstrom(row.b_pm), angstrom(row.c_pm), row.beta_deg)
    return abs(float(np.linalg.det(np.asarray(cell.lattice))))


@dataclass(frozen=True)
class StructureAssignment:
    """The structure type of a salt and how it was found."""

    structure_type: str | None
    origin: str  # "measured", "guessed" or "none"
    note: str
    measured: MeasuredStructure | None = None


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
    """Whether a binary salt's charges are the prototype's, scaled as a whole."""
    s = prototype_structure(structure_type)
    qc = max(s.charges)
    qa = -min(s.charges)
    return abs(cation.charge * qa - (-anion.charge) * qc) < 1e-9


@per_input(maxsize=4096)
def assign_structure_type(cation: Ion, anion: Ion, n_cation: float, n_anion: float) -> StructureAssignment:
    """Structure type of the binary salt (cation)n_cation (anion)n_anion.

    Measured structures first (``scorer/data/structure_prototypes.csv``), then
    Pauling's radius-ratio rule on Shannon CN VI radii (common practice):
    for MX, r+/r- >= 0.732 caesium chloride, >= 0.414 rock salt, >= 0.225
    zinc blende; for MX2 >= 0.732 fluorite, >= 0.414 rutile; M2X anti-fluorite
    when r+/r- >= 0.225; M2X3 corundum when >= 0.414. Anything else: none.
    """
    known = measured_structure((cation.ion_id,), (anion.ion_id,))
    if known is not None:
        return StructureAssignment(
            known.structure_type, "measured",
            f"structure type {known.structure_type} (measured, {known.compound}): {known.source}", known,
        )
    ratio = _reduced_ratio(n_cation, n_anion)
    if ratio not in _RADIUS_RATIO_RULES:
        return StructureAssignment(None, "none", "no measured structure and no radius-ratio rule for this formula type")
    if cation.element is None or anion.element is None:
        return StructureAssignment(None, "none", "no measured structure; the radius-ratio rule needs monatomic ions")
    r_cation, _ = shannon_radius_pm(cation.element, cation.charge, 6)
    r_anion, _ = shannon_radius_pm(anion.element, anion.charge, 6)
    if math.isnan(r_cation) or math.isnan(r_anion):
        return StructureAssignment(None, "none", "no measured structure and no Shannon radius for the radius ratio")
    rho = r_cation / r_anion
    for lower, structure_type in _RADIUS_RATIO_RULES[ratio]:
        if rho >= lower and charges_fit_prototype(cation, anion, structure_type):
            return StructureAssignment(
                structure_type,
                "guessed",
                f"structure type {structure_type} guessed from the radius ratio r+/r- = {rho:.3f} "
                "(Shannon CN VI radii; Pauling's limiting ratios, common practice): not a measured structure",
            )
    return StructureAssignment(
        None, "none", f"radius ratio r+/r- = {rho:.3f} fits none of the built-in prototypes for this formula type"
    )


@once
def cell_volume(structure_type: str) -> float:
    """Volume of a prototype's cell, in its own length unit cubed (computed
    once per prototype, not once per salt)."""
    return abs(float(np.linalg.det(np.asarray(prototype_structure(structure_type).lattice))))
