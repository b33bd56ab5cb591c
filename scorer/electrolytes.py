"""Salts dissolved in an ionic solvent, as electrolyte recipes write them: amounts to mole fractions.

A formulator writes ``0.5 M LiTFSI in [C4mpyr][TFSI]``, ``1 mol/kg LiBF4 in [C2mim][BF4]`` or
``10 wt% LiFSI in [C3mpyr][FSI]``. In a molecular solvent such a row stays a solution whose values are those of
the pure solute (:mod:`scorer.solutions`); in an ionic liquid or a molten salt the solution is itself an ionic
melt, a mixture of two salts, and :mod:`scorer.mixture` gives it a liquidus. What it needs are the mole
fractions, from the amount as written:

* molality ``b`` (mol per kg of solvent): :func:`molality_to_mole_fraction`, exact with the solvent's molar mass;
* mass fraction ``w`` (``wt%``, ``% w/w``, a bare ``%``): :func:`mass_fraction_to_mole_fraction`, exact with both
  molar masses;
* amount concentration ``c`` (``M``, ``mol/L``, ``mM``): :func:`molarity_to_mole_fraction`, with the molar volumes
  of both salts taken from their ions' volumes (Glasser and Jenkins' formula-unit volumes, as the lattice
  columns use them; Glasser & Jenkins, J. Am. Chem. Soc. 2000, 122, 632): an estimate. Those are crystal
  volumes and a liquid is less dense: [C4mim][BF4] comes out at 1.40 g/mL against about 1.20 measured,
  [C4mpyr][NTf2] at 1.49 against about 1.40 (from memory), so the solvent's amount is 7-16 % high and the
  solute's mole fraction as much low.

Volume fractions, mass per volume and ranges are not converted: such a row stays a solution.
"""
from __future__ import annotations

import re

__all__ = [
    "AVOGADRO_L_PER_NM3_MOL",
    "mass_fraction_to_mole_fraction",
    "molality_to_mole_fraction",
    "molarity_to_mole_fraction",
    "solute_mole_fraction",
]

#: litres per mole of one cubic nanometre per particle: N_A * 1e-24 L/nm^3 (CODATA 2018 N_A)
AVOGADRO_L_PER_NM3_MOL = 6.02214076e23 * 1e-24

_AMOUNT = re.compile(r"(?P<value>\d+(?:\.\d+)?)\s+(?P<unit>mol/kg|mol kg-1|m|mol/L|mol/l|M|mmol/L|mmol/l|mM|%|% w/w)")


def molality_to_mole_fraction(molality_mol_kg: float, solvent_molar_mass_g_mol: float) -> float:
    """Amount fraction of a solute from its molality in a solvent: ``x = b M / (1 + b M)`` with ``M`` in kg/mol.

    IUPAC Green Book (Cohen et al., Quantities, Units and Symbols in Physical Chemistry, 3rd ed., 2007,
    section 2.10: amount fraction and molality; from memory): ``b = n_solute / m_solvent``, so per kilogram of
    solvent ``n_solvent = 1 / M``.

    Examples
    --------
    1 mol/kg in a solvent of 422.4 g/mol ([C4mpyr][NTf2]): 0.4224 / 1.4224

    >>> round(molality_to_mole_fraction(1.0, 422.4), 4)
    0.297
    """
    bm = molality_mol_kg * solvent_molar_mass_g_mol / 1000.0
    return bm / (1.0 + bm)


def mass_fraction_to_mole_fraction(mass_fraction: float, solute_molar_mass_g_mol: float,
                                   solvent_molar_mass_g_mol: float) -> float:
    """Amount fraction of a solute from its mass fraction ``w``: ``x = (w / M_1) / (w / M_1 + (1 - w) / M_2)``.

    IUPAC Green Book (Cohen et al., 2007, section 2.10: mass fraction and amount fraction; from memory).

    Examples
    --------
    10 % w/w LiFSI (187.1 g/mol) in [C3mpyr][FSI] (308.4 g/mol): 0.0534 / (0.0534 + 0.2918)

    >>> round(mass_fraction_to_mole_fraction(0.10, 187.1, 308.4), 4)
    0.1548
    """
    solute = mass_fraction / solute_molar_mass_g_mol
    return solute / (solute + (1.0 - mass_fraction) / solvent_molar_mass_g_mol)


def molarity_to_mole_fraction(concentration_mol_L: float, solute_molar_volume_L_mol: float,
                              solvent_molar_volume_L_mol: float) -> float:
    """Amount fraction of a solute from its amount concentration, with ideal mixing of molar volumes.

    One litre of solution holds ``c`` mol of solute filling ``c V_1``; the rest, ``1 - c V_1`` litres, is
    solvent, ``(1 - c V_1) / V_2`` mol; ``x = c / (c + (1 - c V_1) / V_2)`` (IUPAC Green Book, Cohen et al.,
    2007, section 2.10: amount concentration; ideal volumes additive, common practice).

    Examples
    --------
    0.5 mol/L of a salt of 0.070 L/mol in a solvent of 0.300 L/mol: 0.5 / (0.5 + 0.965 / 0.300)

    >>> round(molarity_to_mole_fraction(0.5, 0.070, 0.300), 4)
    0.1345
    """
    solvent = (1.0 - concentration_mol_L * solute_molar_volume_L_mol) / solvent_molar_volume_L_mol
    return concentration_mol_L / (concentration_mol_L + solvent)


def solute_mole_fraction(concentration: str, solute_mass_g_mol: float, solvent_mass_g_mol: float,
                         solute_volume_nm3: float, solvent_volume_nm3: float) -> tuple[float, str] | None:
    """(amount fraction of the solute, how it was found) from a concentration as :mod:`scorer.solutions` writes
    it (``0.5 M``, ``1 mol/kg``, ``21 m``, ``10 % w/w``, ``500 mM``); None where it cannot be converted (volume
    fractions, mass per volume, ranges, a molar volume unknown, or a result outside 0 to 1).

    >>> x, how = solute_mole_fraction("1 mol/kg", 286.9, 422.4, 0.0, 0.0)
    >>> round(x, 4), how.split(":")[0]
    (0.297, 'molality')
    """
    m = _AMOUNT.fullmatch(concentration.strip())
    if m is None:
        return None
    value, unit = float(m.group("value")), m.group("unit")
    if unit in ("mol/kg", "mol kg-1", "m"):
        x = molality_to_mole_fraction(value, solvent_mass_g_mol)
        how = f"molality: {value:g} mol/kg with the solvent's {solvent_mass_g_mol:.1f} g/mol"
    elif unit in ("%", "% w/w"):
        if not 0.0 < value < 100.0:
            return None
        x = mass_fraction_to_mole_fraction(value / 100.0, solute_mass_g_mol, solvent_mass_g_mol)
        how = f"mass fraction: {value:g} % with {solute_mass_g_mol:.1f} and {solvent_mass_g_mol:.1f} g/mol"
    else:
        c = value / 1000.0 if unit.startswith("m") and unit != "mol/L" and unit != "mol/l" else value
        if not (solute_volume_nm3 > 0.0 and solvent_volume_nm3 > 0.0):
            return None
        v1, v2 = solute_volume_nm3 * AVOGADRO_L_PER_NM3_MOL, solvent_volume_nm3 * AVOGADRO_L_PER_NM3_MOL
        if c * v1 >= 1.0:
            return None
        x = molarity_to_mole_fraction(c, v1, v2)
        how = (f"amount concentration: {c:g} mol/L with molar volumes {v1 * 1000:.0f} and {v2 * 1000:.0f} mL/mol"
               " from the ions' volumes (crystal volumes: an estimate, the solute's fraction up to about 15 % low)")
    return (x, how) if 0.0 < x < 1.0 else None
