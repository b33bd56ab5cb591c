"""Thermochemical (Born-Haber) cycles for the salts whose lattice energy the
ionic models cannot give: the silver, copper(I) and thallium(I) halides, and
the chlorides, bromides and iodides of zinc, cadmium and lead(II).

Their bonds are partly covalent (d10 and 6s2 cations, large polarisable
anions), so every point-charge estimate (Born-Mayer, Kapustinskii, VBT) runs
low against their cycle values (6-23 % on the calibration halides AgF, CuBr,
TlBr); :mod:`scorer.lattice` withholds those estimates where a cycle exists. What accounts for the covalency is the
measured thermochemistry itself: the lattice potential energy from the
enthalpy of formation of the solid (``scorer/data/formation_enthalpies.csv``),
the atomisation enthalpies of the elements (``atomisation_enthalpies.csv``),
and the ionisation energies and electron affinities of the element snapshot
(NIST and CRC values through mendeleev). It is a cycle, not a model: its
agreement with tabulated Born-Haber values checks the data, not a theory, and
the lattice tests report it apart from the models.

Salts of monatomic ions with a singly charged anion only: the second electron
affinity an oxide or sulfide needs is itself derived from cycles.
"""
from __future__ import annotations

import math

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.elements import get_element
from ionicity.scorer.lattice_energy import born_haber_lattice_energy_kJ_mol
from ionicity.scorer.model import Ion
from ionicity.scorer.tables import table

__all__ = ["formation_enthalpies", "atomisation_enthalpies", "cycle_lattice_energy_kJ_mol", "CYCLE_METHOD"]

EV_KJ_MOL = 96.485332
"""kJ/mol per eV (CODATA 2018: N_A e / 1000)."""

CYCLE_METHOD = (
    "thermochemical (Born-Haber) cycle from tabulated enthalpies (NBS 1982; CRC Handbook) and the element snapshot's"
    " ionisation energies and electron affinities; covalency included because nothing ionic is assumed"
)


@once
def formation_enthalpies() -> dict[tuple[str, str], tuple[str, float, str]]:
    """(cation_id, anion_id) -> (compound, enthalpy of formation of the solid in kJ/mol, source), read once."""
    return {
        (row["cation_id"], row["anion_id"]): (
            row["compound"], float(row["enthalpy_of_formation_kJ_mol"]), row["source"]
        )
        for row in table("formation_enthalpies.csv")
    }


@once
def atomisation_enthalpies() -> dict[str, tuple[float, str]]:
    """element symbol -> (enthalpy of formation of the gaseous atom, kJ/mol, source), read once."""
    return {row["symbol"]: (float(row["atomisation_enthalpy_kJ_mol"]), row["source"]) for row in table("atomisation_enthalpies.csv")}


@per_input(maxsize=1024)
def cycle_lattice_energy_kJ_mol(cation: Ion, anion: Ion, n_cation: float, n_anion: float) -> tuple[float, str]:
    """Lattice potential energy of a tabulated salt from its Born-Haber cycle.

    Returns
    -------
    u_kJ_mol : float
        ``U_POT`` (Jenkins's convention, positive), NaN when the salt or an
        input is not tabulated.
    text : str
        The cycle's terms, or why there is none.

    Examples
    --------
    AgCl: formation -127.07, Ag(g) 284.55, Cl(g) 121.68 kJ/mol (NBS 1982,
    from memory), IE(Ag) 7.576 eV, EA(Cl) 3.613 eV; the CRC Handbook lists
    U_POT = 918 kJ/mol (Jenkins & Roobottom, from memory):

    >>> from ionicity.scorer.ions import get_ion
    >>> round(cycle_lattice_energy_kJ_mol(get_ion("Ag(+)"), get_ion("Cl(-)"), 1, 1)[0])
    918
    """
    row = formation_enthalpies().get((cation.ion_id, anion.ion_id))
    if row is None:
        return math.nan, f"no tabulated enthalpy of formation for the salt of {cation.ion_id} and {anion.ion_id}"
    compound, formation, _ = row
    if anion.charge != -1 or cation.element is None or anion.element is None:
        return math.nan, "the cycle is built for salts of monatomic ions with a singly charged anion"
    atoms = atomisation_enthalpies()
    if cation.element not in atoms or anion.element not in atoms:
        return math.nan, f"no atomisation enthalpy for {cation.element} or {anion.element}"
    metal, nonmetal = get_element(cation.element), get_element(anion.element)
    ionisation = sum(metal.ionization_energies_eV[: cation.charge]) * EV_KJ_MOL
    electron_gain = -nonmetal.electron_affinity_eV * EV_KJ_MOL
    u = born_haber_lattice_energy_kJ_mol(
        formation, atoms[cation.element][0], ionisation, atoms[anion.element][0], electron_gain,
        n_cation, n_anion, kind="potential_energy",
    )
    text = (
        f"cycle for {compound}: -dHf {-formation:g} + {n_cation:g} x (atomisation {atoms[cation.element][0]:g}"
        f" + ionisation {ionisation:.1f}) + {n_anion:g} x (atomisation {atoms[anion.element][0]:g}"
        f" + electron gain {electron_gain:.1f}) + (a + b) RT/2 = {u:.0f} kJ/mol"
    )
    return u, text
