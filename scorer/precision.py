"""How many significant digits each float output column's method supports.

Output files round every float column to its ``Column.digits`` (unless
``--full-precision``), so no cell carries float noise such as
``2.3400000000000003`` and no figure claims more than its inputs know. A
column may declare ``digits`` itself; for those that do not, this table
decides (:func:`digits_for`), and :data:`DEFAULT_DIGITS` covers float
columns it does not list. Each figure follows the precision of the data its
method starts from.
"""
from __future__ import annotations

import math

import numpy as np

__all__ = ["DIGITS", "DEFAULT_DIGITS", "digits_for", "round_significant", "round_significant_array"]

#: for a float column not listed: enough for any of our inputs, none of the noise
DEFAULT_DIGITS = 6

#: column name -> (significant digits, why)
DIGITS: dict[str, tuple[int, str]] = {
    "hydrate_water": (6, "counts as written, fractions to 6 places as formula_normalized writes them"),
    "molar_mass_g_mol": (7, "standard atomic weights carry 5 to 7 significant figures"),
    "delta_chi_pauling": (3, "Pauling electronegativities are tabulated to two decimals"),
    "mean_chi_pauling": (3, "Pauling electronegativities are tabulated to two decimals"),
    "ionic_character_pauling_pct": (3, "from delta_chi_pauling, known to about 0.01"),
    "ionic_character_hannay_smyth_pct": (3, "from delta_chi_pauling, known to about 0.01"),
    "ionic_character_pauling_min_pct": (3, "from delta_chi_pauling, known to about 0.01"),
    "cation_polarising_power_e_per_A2": (3, "Shannon radii are given to three figures (1.02 angstrom)"),
    "cation_polarising_power_max_e_per_A2": (3, "Shannon radii are given to three figures (1.02 angstrom)"),
    "anion_polarisability_A3": (3, "the Tessman-Kahn-Shockley values have two or three figures"),
    "anion_polarisability_max_A3": (3, "the Tessman-Kahn-Shockley values have two or three figures"),
    "fajans_contact_index": (3, "polarisability and radii of three figures"),
    "cation_hardness_eV": (4, "ionization energies to 0.01 eV"),
    "anion_hardness_eV": (4, "ionization energies and electron affinities to 0.01 eV"),
    "hsab_pairing_score": (3, "a score from three softness classes"),
    "lattice_energy_kapustinskii_kJ_mol": (4, "thermochemical radii of three to four figures; the equation itself is good to a few %"),
    "lattice_energy_vbt_kJ_mol": (4, "ion volumes of three to four figures; the fit is good to a few %"),
    "lattice_energy_born_mayer_kJ_mol": (4, "Madelung constants exact, radii and the Born-Mayer rho to three or four figures"),
    "lattice_energy_born_lande_kJ_mol": (4, "Madelung constants exact, radii and Born exponents to three or four figures"),
    "mp_trend_index": (4, "a log10-kelvin index from four-figure lattice energies"),
}


def digits_for(name: str) -> int:
    """The significant digits of a float column not declaring its own.

    >>> digits_for("delta_chi_pauling"), digits_for("some_new_column")
    (3, 6)
    """
    return DIGITS.get(name, (DEFAULT_DIGITS, ""))[0]


def round_significant(value: float, digits: int) -> float:
    """``value`` to ``digits`` significant digits, as the nearest float to
    the decimal it stands for (so it prints without noise); the same
    arithmetic as :func:`round_significant_array`, which output files use.

    >>> round_significant(2.3400000000000003, 3), round_significant(49.959149999999994, 4), round_significant(123456.0, 3)
    (2.34, 49.96, 123000.0)
    """
    return float(round_significant_array(np.array([value]), digits)[0])


def round_significant_array(values: np.ndarray, digits: int) -> np.ndarray:
    """:func:`round_significant` over a float array (NaN stays NaN), one
    ``numpy.round`` per decimal exponent present.

    >>> round_significant_array(np.array([2.3400000000000003, 787.2631, np.nan, 0.0]), 3).tolist()
    [2.34, 787.0, nan, 0.0]
    """
    out = np.array(values, dtype=np.float64)
    finite = np.isfinite(out) & (out != 0)
    if not finite.any():
        return out
    places = np.zeros(len(out), dtype=np.int64)
    places[finite] = digits - 1 - np.floor(np.log10(np.abs(out[finite]))).astype(np.int64)
    for p in np.unique(places[finite]):
        at = finite & (places == p)
        out[at] = np.round(out[at], int(p))
    return out
