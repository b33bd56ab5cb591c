"""The shape of an ion as the melting index reads it: torsions, symmetry number, charge delocalisation.

Tabulated ions come from ``scorer/data/ion_shape.csv`` (a source per row);
organic ions missing there get an estimate from their composition, other
inorganic ions the VSEPR shape of :func:`scorer.melting_routes.ion_symmetry_number`.
The terms that use them (Dannenfelser-Yalkowsky flexibility, Carnelley's
symmetry) are in :mod:`scorer.melting` and :mod:`scorer.melting_index`.
"""
from __future__ import annotations

from ionicity.scorer import melting_routes as routes
from ionicity.scorer.caching import once
from ionicity.scorer.model import Ion
from ionicity.scorer.onium_groups import onium_shape
from ionicity.scorer.tables import table

__all__ = ["ONIUM_FAMILIES", "ion_shape", "anion_symmetry_number"]


@once
def _shape_table() -> dict[str, tuple[float, float, bool, str]]:
    """ion_id -> (tau, sigma, charge delocalised, source) from ``scorer/data/ion_shape.csv``."""
    shapes = {}
    for row in table("ion_shape.csv"):
        shapes[row["ion_id"]] = (
            float(row["torsions_tau"]),
            float(row["symmetry_number"]),
            row["charge_delocalised"].strip().lower() == "true",
            row["source"],
        )
    return shapes


def ion_shape(ion: Ion) -> tuple[float, float, bool, str]:
    """(tau, sigma, charge delocalised, basis) of an ion.

    Tabulated ions come from ``scorer/data/ion_shape.csv``. An organic ion
    missing there gets an estimate from its composition: every carbon, nitrogen,
    oxygen, sulfur or phosphorus atom beyond the fifth counted as half a
    torsion, sigma 1, charge localised (common practice, said in the basis).
    Inorganic ions not in the table are rigid: tau 0, sigma 1.

    >>> from ionicity.scorer.ion_library import get_ion
    >>> ion_shape(get_ion("[C4mim](+)"))[:3]
    (2.5, 1.0, True)
    """
    shapes = _shape_table()
    if ion.ion_id in shapes:
        tau, sigma, deloc, _ = shapes[ion.ion_id]
        return tau, sigma, deloc, "scorer/data/ion_shape.csv"
    if ion.organic and ion.label.startswith("[("):
        # an onium cation built from its written groups (scorer.onium_groups): the torsions of those groups
        shape = onium_shape(ion.label)
        if shape is not None:
            return shape[0], shape[1], False, "counted from the written groups (scorer.onium_groups.onium_shape)"
    if ion.organic:
        heavy = sum(n for s, n in ion.composition if s in ("C", "N", "O", "S", "P"))
        return max(0.0, (heavy - 5) * 0.5), 1.0, False, "estimated from the composition (no ion_shape.csv entry)"
    return 0.0, 1.0, False, "rigid inorganic ion"


# onium cations (one N or P centre with four chains): unequal chains do not pack like polyethylene
ONIUM_FAMILIES = frozenset({"ammonium-quaternary", "phosphonium"})


def anion_symmetry_number(ion: Ion) -> float:
    """Rotational symmetry number of a polyatomic anion: ``scorer/data/ion_shape.csv`` for organic
    and tabulated ions, else the VSEPR shape of :func:`scorer.melting_routes.ion_symmetry_number`.

    >>> from ionicity.scorer.ion_library import get_ion
    >>> anion_symmetry_number(get_ion("SO4(2-)")), anion_symmetry_number(get_ion("SCN(-)"))
    (12.0, 1.0)
    """
    if ion.organic or ion.ion_id in _shape_table():
        return ion_shape(ion)[1]
    return routes.ion_symmetry_number(ion)
