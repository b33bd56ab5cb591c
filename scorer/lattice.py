"""Lattice energies: Born-Lande, Born-Mayer, Kapustinskii, volume-based
(Glasser-Jenkins) estimates and the Born-Haber cycle.

Every energy here is the lattice potential energy ``U_POT`` of Jenkins's
usage: the energy, in kJ/mol, needed to take one mole of formula units of the
crystal apart into gaseous ions, reported positive.

Two families of estimate:

structure-based (Born-Lande, Born-Mayer)
    need the Madelung constant of the crystal's structure type, computed by
    Ewald summation in :mod:`scorer.madelung`, and the cation-anion distance
    ``r0``, taken as the sum of Shannon ionic radii at the coordination
    numbers of that structure. They apply to binary salts (one cation, one
    anion). The structure type comes from ``scorer/data/structure_prototypes.csv``
    (``structure_type_origin = "known"``), else from the radius-ratio rule
    (``"guessed"``, with a warning), else there is none (``"none"``).
structure-free (Kapustinskii, Glasser-Jenkins volume-based)
    need only charges and ionic radii (Kapustinskii) or the formula-unit
    volume (volume-based thermodynamics, VBT); they apply to any salt, and
    through the ionic strength ``I = 1/2 sum n_i z_i**2`` to salts of several
    ions. VBT also covers organic ionic-liquid ions through their volumes.

Hydrates are scored as the anhydrous salt, which the notes say; lattice
water is not counted in any estimate.

Experimental values come from the Born-Haber cycle; with measured
thermochemical data, :func:`born_haber_lattice_energy_kJ_mol` builds it.
"""
from __future__ import annotations

import csv
import math
from dataclasses import dataclass
from importlib import resources

import numpy as np
from ionicity.scorer.caching import once, per_input
from ionicity.scorer.madelung import madelung_details, prototype_structure
from ionicity.scorer.model import Column, Decomposition, Ion, IonTerm, RowWarning
from ionicity.scorer.radii import ion_radius_pm, ion_volume_nm3, shannon_radius_pm

__all__ = [
    "COLUMNS",
    "describe",
    "explain",
    "COULOMB_KJ_PM_MOL",
    "BORN_MAYER_RHO_PM",
    "KAPUSTINSKII_CONSTANT_KJ_NM_MOL",
    "VBT_COEFFICIENTS",
    "born_lande_lattice_energy_kJ_mol",
    "born_mayer_lattice_energy_kJ_mol",
    "kapustinskii_lattice_energy_kJ_mol",
    "glasser_kapustinskii_lattice_energy_kJ_mol",
    "glasser_jenkins_vbt_lattice_energy_kJ_mol",
    "born_haber_lattice_energy_kJ_mol",
    "born_exponent",
    "assign_structure_type",
    "StructureAssignment",
    "structure_prototypes",
    "formula_unit_volume_nm3",
]

# N_A e^2 / (4 pi eps0), CODATA 2018 exact e and N_A, eps0 = 8.8541878128e-12 F/m.
_E = 1.602176634e-19
_NA = 6.02214076e23
_EPS0 = 8.8541878128e-12
COULOMB_KJ_PM_MOL = _NA * _E**2 / (4.0 * math.pi * _EPS0) * 1e12 / 1e3  # 138935.46 kJ pm / mol

BORN_MAYER_RHO_PM = 34.5
"""Born-Mayer repulsion range rho = 0.345 angstrom (Born and Mayer, Z. Phys.
1932, 75, 1, doi:10.1007/BF01340511), the value Kapustinskii kept."""

KAPUSTINSKII_CONSTANT_KJ_NM_MOL = 121.4
"""Kapustinskii's constant in the form of the CRC Handbook 'Lattice energies'
section (Jenkins and Roobottom): 121.4 kJ mol^-1 nm, which is
N_A e^2/(4 pi eps0) times half the rock-salt Madelung constant. Kapustinskii's
own 1956 value, 1.2025e-4 J m mol^-1 (120.25 kJ mol^-1 nm), used older
constants."""

KAPUSTINSKII_D_PM = 34.5

VBT_COEFFICIENTS: dict[str, tuple[float, float]] = {
    "1:1": (117.3, 51.9),
    "2:1": (133.5, 60.9),
    "1:2": (165.3, -29.8),
    "general": (138.7, 27.6),
}
"""alpha (kJ mol^-1 nm) and beta (kJ mol^-1) of U = 2I(alpha/Vm^(1/3) + beta).
"1:1" MX, "2:1" MX2 (cation charge 2, anion 1), "1:2" M2X: Jenkins,
Roobottom, Passmore, Glasser, Inorg. Chem. 1999, 38, 3609,
doi:10.1021/ic9812961; "general": Glasser and Jenkins, J. Am. Chem. Soc.
2000, 122, 632, doi:10.1021/ja992375u. Values from memory."""

VBT_LIMITING_A_KJ_NM_MOL = 121.39
"""A of the Glasser-Jenkins limiting equation U = A I (2I/Vm)^(1/3), for
U > 5000 kJ/mol (Glasser and Jenkins 2000, abstract)."""

VBT_SALT_TYPES = ("1:1", "2:1", "1:2", "general", "limiting")

_R_KJ_MOL_K = 8.314462618e-3


# --- Equations -----------------------------------------------------------------


def born_lande_lattice_energy_kJ_mol(madelung_constant, charge_factor, r0_pm, born_exponent):
    """Born-Lande lattice energy.

    .. math:: U = \\frac{N_A A z^2 e^2}{4\\pi\\varepsilon_0 r_0}\\left(1 - \\frac1n\\right)

    Parameters
    ----------
    madelung_constant : float or array-like
        ``A`` in the convention of :func:`scorer.madelung.madelung_constant`
        (``"common_factor"``): 1.74756 for rock salt.
    charge_factor : float or array-like
        ``z``, the highest common factor of the ion charges (1 for NaCl and
        CaF2, 2 for MgO).
    r0_pm : float or array-like
        Cation-anion distance in pm.
    born_exponent : float or array-like
        ``n`` of the repulsion ``B/r**n`` (Pauling: 5 to 12).

    Returns
    -------
    float or ndarray
        U in kJ/mol (positive).

    References
    ----------
    M. Born and A. Lande, Verh. Dtsch. Phys. Ges. 1918, 20, 210.

    Examples
    --------
    NaCl with A = 1.74756, r0 = 281 pm, n = 8 (Huheey, Keiter and Keiter,
    Inorganic Chemistry, 4th ed., 1993, worked example for eq. 4.13, which
    quotes -755 kJ/mol with rounded constants; from memory):

    >>> round(born_lande_lattice_energy_kJ_mol(1.74756, 1, 281.0, 8))
    756
    """
    a = np.asarray(madelung_constant, dtype=float)
    z = np.asarray(charge_factor, dtype=float)
    r0 = np.asarray(r0_pm, dtype=float)
    n = np.asarray(born_exponent, dtype=float)
    u = COULOMB_KJ_PM_MOL * a * z**2 / r0 * (1.0 - 1.0 / n)
    return float(u) if u.ndim == 0 else u


def born_mayer_lattice_energy_kJ_mol(madelung_constant, charge_factor, r0_pm, rho_pm=BORN_MAYER_RHO_PM):
    """Born-Mayer lattice energy.

    .. math:: U = \\frac{N_A A z^2 e^2}{4\\pi\\varepsilon_0 r_0}\\left(1 - \\frac{\\rho}{r_0}\\right)

    Parameters
    ----------
    madelung_constant : float or array-like
        ``A`` in the ``"common_factor"`` convention.
    charge_factor : float or array-like
        Highest common factor of the ion charges.
    r0_pm : float or array-like
        Cation-anion distance in pm.
    rho_pm : float or array-like, default=34.5
        Range of the exponential repulsion, pm (Born and Mayer 1932).

    Returns
    -------
    float or ndarray
        U in kJ/mol.

    References
    ----------
    M. Born and J. E. Mayer, Z. Phys. 1932, 75, 1, doi:10.1007/BF01340511.

    Examples
    --------
    The NaCl numbers of the Born-Lande example (A 1.74756, r0 281 pm) with
    rho = 34.5 pm:

    >>> round(born_mayer_lattice_energy_kJ_mol(1.74756, 1, 281.0))
    758
    """
    a = np.asarray(madelung_constant, dtype=float)
    z = np.asarray(charge_factor, dtype=float)
    r0 = np.asarray(r0_pm, dtype=float)
    rho = np.asarray(rho_pm, dtype=float)
    u = COULOMB_KJ_PM_MOL * a * z**2 / r0 * (1.0 - rho / r0)
    return float(u) if u.ndim == 0 else u


def kapustinskii_lattice_energy_kJ_mol(
    ions_per_formula_unit,
    cation_charge,
    anion_charge,
    cation_radius_pm,
    anion_radius_pm,
    *,
    constant_kJ_nm_mol=KAPUSTINSKII_CONSTANT_KJ_NM_MOL,
    d_pm=KAPUSTINSKII_D_PM,
):
    """Kapustinskii's structure-free lattice energy of a binary salt.

    .. math:: U = \\frac{K \\nu |z_+ z_-|}{r_+ + r_-}\\left(1 - \\frac{d}{r_+ + r_-}\\right)

    with K = 121.4 kJ mol^-1 nm and d = 0.0345 nm.

    Parameters
    ----------
    ions_per_formula_unit : float or array-like
        ``nu`` (2 for NaCl, 3 for CaF2).
    cation_charge, anion_charge : float or array-like
        Charges in units of e (the sign is ignored).
    cation_radius_pm, anion_radius_pm : float or array-like
        Radii in pm: Shannon CN VI radii for monatomic ions, thermochemical
        radii for polyatomic ones.
    constant_kJ_nm_mol : float, default=121.4
    d_pm : float, default=34.5

    Returns
    -------
    float or ndarray
        U in kJ/mol.

    See Also
    --------
    glasser_kapustinskii_lattice_energy_kJ_mol : the form for several ions.

    References
    ----------
    A. F. Kapustinskii, Q. Rev. Chem. Soc. 1956, 10, 283,
    doi:10.1039/QR9561000283; the constants as in the CRC Handbook of
    Chemistry and Physics, 'Lattice energies' (H. D. B. Jenkins,
    H. K. Roobottom).

    Examples
    --------
    The CRC section's worked example, NH4HF2 with thermochemical radii
    0.136 nm (NH4+) and 0.172 nm (HF2-):

    >>> round(kapustinskii_lattice_energy_kJ_mol(2, 1, -1, 136.0, 172.0))
    700
    """
    nu = np.asarray(ions_per_formula_unit, dtype=float)
    zz = np.abs(np.asarray(cation_charge, dtype=float) * np.asarray(anion_charge, dtype=float))
    r_nm = (np.asarray(cation_radius_pm, dtype=float) + np.asarray(anion_radius_pm, dtype=float)) * 1e-3
    d_nm = np.asarray(d_pm, dtype=float) * 1e-3
    u = constant_kJ_nm_mol * nu * zz / r_nm * (1.0 - d_nm / r_nm)
    return float(u) if u.ndim == 0 else u


def glasser_kapustinskii_lattice_energy_kJ_mol(
    ionic_strength,
    mean_cation_radius_pm,
    mean_anion_radius_pm,
    *,
    constant_kJ_nm_mol=KAPUSTINSKII_CONSTANT_KJ_NM_MOL,
    d_pm=KAPUSTINSKII_D_PM,
):
    """Kapustinskii's equation generalised to several ions (Glasser 1995).

    .. math:: U = \\frac{2 I K}{\\langle r\\rangle}\\left(1 - \\frac{d}{\\langle r\\rangle}\\right),
              \\quad I = \\tfrac12 \\sum_i n_i z_i^2

    For a binary salt ``2I = nu |z+ z-|`` and this is Kapustinskii's equation.
    ``<r>`` is the count-weighted mean cation radius plus the count-weighted
    mean anion radius.

    Parameters
    ----------
    ionic_strength : float or array-like
        ``I`` of one formula unit.
    mean_cation_radius_pm, mean_anion_radius_pm : float or array-like

    Returns
    -------
    float or ndarray
        U in kJ/mol.

    References
    ----------
    L. Glasser, Inorg. Chem. 1995, 34, 4935, doi:10.1021/ic00124a003.

    Examples
    --------
    The CRC worked example again (NH4HF2: I = 1), same result as the binary form:

    >>> round(glasser_kapustinskii_lattice_energy_kJ_mol(1, 136.0, 172.0))
    700
    """
    i = np.asarray(ionic_strength, dtype=float)
    r_nm = (np.asarray(mean_cation_radius_pm, dtype=float) + np.asarray(mean_anion_radius_pm, dtype=float)) * 1e-3
    d_nm = np.asarray(d_pm, dtype=float) * 1e-3
    u = constant_kJ_nm_mol * 2.0 * i / r_nm * (1.0 - d_nm / r_nm)
    return float(u) if u.ndim == 0 else u


def glasser_jenkins_vbt_lattice_energy_kJ_mol(ionic_strength, formula_unit_volume_nm3, *, salt_type="general"):
    """Volume-based lattice energy (Jenkins, Glasser and co-workers).

    .. math::

        U = 2I\\left(\\frac{\\alpha}{V_m^{1/3}} + \\beta\\right)
        \\qquad\\text{or, for } U > 5000\\ \\mathrm{kJ/mol},\\qquad
        U = A I \\left(\\frac{2I}{V_m}\\right)^{1/3}

    Parameters
    ----------
    ionic_strength : float or array-like
        ``I = 1/2 sum n_i z_i**2`` over one formula unit (1 for MX, 3 for MX2
        and M2X).
    formula_unit_volume_nm3 : float or array-like
        ``Vm``, volume of one formula unit in nm^3.
    salt_type : {"1:1", "2:1", "1:2", "general", "limiting"}, default="general"
        Which coefficients: ``"1:1"`` (alpha 117.3 kJ mol^-1 nm, beta 51.9
        kJ/mol), ``"2:1"`` MX2 (133.5, 60.9), ``"1:2"`` M2X (165.3, -29.8)
        from Jenkins et al. 1999; ``"general"`` (138.7, 27.6) from Glasser and
        Jenkins 2000; ``"limiting"`` the coefficient-free form with
        A = 121.39 kJ mol^-1 nm, for lattice energies above 5000 kJ/mol.

    Returns
    -------
    float or ndarray
        U in kJ/mol. Glasser and Jenkins (2000) state the limiting form within
        7 %.

    Raises
    ------
    ValueError
        For an unknown ``salt_type``.

    References
    ----------
    H. D. B. Jenkins, H. K. Roobottom, J. Passmore, L. Glasser, Inorg. Chem.
    1999, 38, 3609, doi:10.1021/ic9812961; L. Glasser and H. D. B. Jenkins,
    J. Am. Chem. Soc. 2000, 122, 632, doi:10.1021/ja992375u.

    Examples
    --------
    KCl from Jenkins's ion volumes, Vm = 0.00986 + 0.047 nm^3 (1999 table,
    from memory), with the 1:1 coefficients:

    >>> round(glasser_jenkins_vbt_lattice_energy_kJ_mol(1, 0.00986 + 0.047, salt_type="1:1"))
    714
    """
    i = np.asarray(ionic_strength, dtype=float)
    v = np.asarray(formula_unit_volume_nm3, dtype=float)
    if salt_type == "limiting":
        u = VBT_LIMITING_A_KJ_NM_MOL * i * np.cbrt(2.0 * i / v)
    elif salt_type in VBT_COEFFICIENTS:
        alpha, beta = VBT_COEFFICIENTS[salt_type]
        u = 2.0 * i * (alpha / np.cbrt(v) + beta)
    else:
        raise ValueError(f"unknown salt_type {salt_type!r}; allowed: {', '.join(VBT_SALT_TYPES)}")
    return float(u) if u.ndim == 0 else u


def born_haber_lattice_energy_kJ_mol(
    enthalpy_of_formation_kJ_mol,
    cation_atomisation_kJ_mol,
    cation_ionisation_kJ_mol,
    anion_atomisation_kJ_mol,
    anion_electron_gain_kJ_mol,
    cations_per_formula_unit=1,
    anions_per_formula_unit=1,
    *,
    kind="enthalpy",
    temperature_K=298.15,
):
    """Lattice energy of a binary salt M_aX_b from the Born-Haber cycle.

    .. math::

        \\Delta H_L = a\\,[\\Delta_{at}H(M) + \\textstyle\\sum I(M)]
                    + b\\,[\\Delta_{at}H(X) + \\textstyle\\sum \\Delta_{eg}H(X)]
                    - \\Delta_f H(M_aX_b, s)

    and, for ``kind="potential_energy"``, Jenkins's conversion to ``U_POT``
    for monatomic ions: ``U_POT = Delta H_L + (a + b) R T / 2`` (from
    ``Delta H_L = U_POT + [a(n_M/2 - 2) + b(n_X/2 - 2)] R T`` with n = 3).

    Parameters
    ----------
    enthalpy_of_formation_kJ_mol : float or array-like
        Standard enthalpy of formation of the solid salt (negative for stable salts).
    cation_atomisation_kJ_mol : float or array-like
        Enthalpy to make one gaseous M atom from the element (sublimation).
    cation_ionisation_kJ_mol : float or array-like
        Sum of the successive ionisation enthalpies of M to its charge
        (ionisation energies in eV times 96.485 are close enough at 298 K).
    anion_atomisation_kJ_mol : float or array-like
        Enthalpy to make one gaseous X atom (half the bond enthalpy of Cl2).
    anion_electron_gain_kJ_mol : float or array-like
        Sum of the electron-gain enthalpies of X to its charge, negative when
        exothermic (Cl: -349; O: -141 + 798 for O(2-)).
    cations_per_formula_unit, anions_per_formula_unit : float or array-like, default=1
        ``a`` and ``b``.
    kind : {"enthalpy", "potential_energy"}, default="enthalpy"
    temperature_K : float, default=298.15

    Returns
    -------
    float or ndarray
        The lattice enthalpy (or potential energy), kJ/mol, positive.

    Raises
    ------
    ValueError
        For an unknown ``kind``.

    References
    ----------
    M. Born, Verh. Dtsch. Phys. Ges. 1919, 21, 13; F. Haber, ibid. 750;
    the U_POT relation: CRC Handbook of Chemistry and Physics, 'Lattice
    energies' (H. D. B. Jenkins, H. K. Roobottom).

    Examples
    --------
    NaCl with NBS values (Wagman et al., J. Phys. Chem. Ref. Data 1982, 11,
    suppl. 2, from memory): formation -411.15, Na(g) 107.32, IE 495.8,
    Cl(g) 121.3, electron gain -348.6 kJ/mol; the CRC table lists
    U_POT = 790 kJ/mol (from memory):

    >>> round(born_haber_lattice_energy_kJ_mol(-411.15, 107.32, 495.8, 121.3, -348.6))
    787
    >>> round(born_haber_lattice_energy_kJ_mol(-411.15, 107.32, 495.8, 121.3, -348.6, kind="potential_energy"))
    789
    """
    a = np.asarray(cations_per_formula_unit, dtype=float)
    b = np.asarray(anions_per_formula_unit, dtype=float)
    h = (
        a * (np.asarray(cation_atomisation_kJ_mol, dtype=float) + np.asarray(cation_ionisation_kJ_mol, dtype=float))
        + b * (np.asarray(anion_atomisation_kJ_mol, dtype=float) + np.asarray(anion_electron_gain_kJ_mol, dtype=float))
        - np.asarray(enthalpy_of_formation_kJ_mol, dtype=float)
    )
    if kind == "potential_energy":
        h = h + (a + b) * _R_KJ_MOL_K * temperature_K / 2.0
    elif kind != "enthalpy":
        raise ValueError(f"unknown kind {kind!r}; allowed: 'enthalpy', 'potential_energy'")
    return float(h) if h.ndim == 0 else h


# --- Data tables ------------------------------------------------------------------


def _read_csv(name: str) -> list[dict[str, str]]:
    text = resources.files("ionicity.scorer.data").joinpath(name).read_text(encoding="utf-8")
    return list(csv.DictReader(text.splitlines()))


@once
def structure_prototypes() -> dict[tuple[str, str], tuple[str, str]]:
    """(cation_id, anion_id) -> (structure_type, source), read once."""
    return {
        (row["cation_id"], row["anion_id"]): (row["structure_type"], row["source"])
        for row in _read_csv("structure_prototypes.csv")
    }


@once
def _born_exponent_table() -> dict[int, tuple[str, int, str]]:
    return {
        int(row["electrons"]): (row["configuration"], int(row["born_exponent"]), row["source"])
        for row in _read_csv("born_exponents.csv")
    }


_NOBLE_CORES = (2, 10, 18, 36, 54)


@per_input(maxsize=1024)
def born_exponent(symbol: str, charge: int) -> tuple[float, str]:
    """Pauling's Born exponent of a monatomic ion, with the reason.

    Closed-shell ions take the value of their configuration (He 5, Ne 7,
    Ar and Cu(+) type 9, Kr and Ag(+) type 10, Xe and Au(+) type 12). Other
    ions (partly filled d shells, inert pairs) take the value of the largest
    noble-gas core they contain, which the reason says (common practice).

    Examples
    --------
    >>> born_exponent("Na", 1)
    (7.0, 'n = 7 for Na(+), a Ne configuration')
    >>> born_exponent("Fe", 2)[0]
    9.0
    """
    from ionicity.scorer.elements import get_element

    try:
        element = get_element(symbol)
    except KeyError as exc:
        return math.nan, str(exc.args[0])
    electrons = element.atomic_number - int(charge)
    name = f"{symbol}({_charge_text(charge)})"
    table = _born_exponent_table()
    if electrons in table:
        config, n, _ = table[electrons]
        return float(n), f"n = {n} for {name}, a {config} configuration"
    cores = [c for c in _NOBLE_CORES if c <= electrons]
    if not cores or electrons > 86:
        return math.nan, f"no Born exponent for {name} ({electrons} electrons)"
    config, n, _ = table[cores[-1]]
    return float(n), f"n = {n} for {name}: not closed-shell, value of its {config} core (common practice)"


def _charge_text(charge: int) -> str:
    from ionicity.scorer.model import format_charge

    return format_charge(int(charge))


# --- Structure type -------------------------------------------------------------------


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


def _charges_fit_prototype(cation: Ion, anion: Ion, structure_type: str) -> bool:
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
        if rho >= lower and _charges_fit_prototype(cation, anion, structure_type):
            return StructureAssignment(
                structure_type,
                "guessed",
                f"structure type {structure_type} guessed from the radius ratio r+/r- = {rho:.3f} "
                "(Shannon CN VI radii; Pauling's limiting ratios, common practice): not a known structure",
            )
    return StructureAssignment(
        None, "none", f"radius ratio r+/r- = {rho:.3f} fits none of the built-in prototypes for this formula type"
    )


# --- Per-compound work ------------------------------------------------------------------


@dataclass(frozen=True)
class _StructureTerms:
    assignment: StructureAssignment
    madelung_constant: float = math.nan
    charge_factor: float = math.nan
    r0_pm: float = math.nan
    r0_text: str = ""
    born_exponent: float = math.nan
    born_exponent_text: str = ""
    volume_nm3: float = math.nan


def _structure_terms(cation: Ion, anion: Ion, n_cation: float, n_anion: float) -> _StructureTerms:
    assignment = assign_structure_type(cation, anion, n_cation, n_anion)
    if assignment.structure_type is None:
        return _StructureTerms(assignment)
    if not _charges_fit_prototype(cation, anion, assignment.structure_type):
        return _StructureTerms(
            StructureAssignment(None, "none", f"the charges do not fit the {assignment.structure_type} prototype")
        )
    structure = prototype_structure(assignment.structure_type)
    details = madelung_details(assignment.structure_type)
    # Radii sums estimate a mean bond length, so the constant is referred to
    # the mean first-shell distance (identical to r0 for the regular prototypes).
    a = details.constant("common_factor", "mean_first_shell")
    z = float(math.gcd(abs(cation.charge), abs(anion.charge)))
    r_c, why_c = ion_radius_pm(cation, structure.cation_coordination)
    r_a, why_a = ion_radius_pm(anion, structure.anion_coordination)
    r0 = r_c + r_a
    volume = math.nan
    if not math.isnan(r0):
        scale = r0 / 100.0 / details.r_mean_first_shell
        volume = _cell_volume(assignment.structure_type) / details.formula_units * scale**3 * 1e-3
    n = math.nan
    n_text = "Born exponents by configuration are defined for monatomic ions only"
    if cation.element is not None and anion.element is not None:
        n_c, t_c = born_exponent(cation.element, cation.charge)
        n_a, t_a = born_exponent(anion.element, anion.charge)
        n = (n_c + n_a) / 2.0
        n_text = f"{t_c}; {t_a}; mean n = {n:g} (Pauling's average over the two ions)"
    return _StructureTerms(
        assignment=assignment,
        madelung_constant=a,
        charge_factor=z,
        r0_pm=r0,
        r0_text=f"r+ = {r_c:.4g} pm ({why_c}); r- = {r_a:.4g} pm ({why_a})",
        born_exponent=n,
        born_exponent_text=n_text,
        volume_nm3=volume,
    )


@once
def _cell_volume(structure_type: str) -> float:
    """Volume of a prototype's cell, in its own length unit cubed (computed
    once per prototype, not once per salt)."""
    return abs(float(np.linalg.det(np.asarray(prototype_structure(structure_type).lattice))))


def formula_unit_volume_nm3(dec: Decomposition) -> tuple[float, str]:
    """Formula-unit volume Vm for the volume-based equation, with its origin.

    1. A binary salt of monatomic ions with a known or guessed structure
       type: the prototype cell per formula unit, scaled so its mean
       first-shell cation-anion distance equals the sum of Shannon radii at
       that structure's coordination numbers (this reproduces measured
       volumes: NaCl 0.0453 nm^3 against 0.0449 from a = 564 pm).
    2. Otherwise the sum of the ion volumes of :func:`scorer.radii.ion_volume_nm3`
       (Jenkins's additivity), ions counted per formula unit; lattice water is
       not counted.
    """
    return _formula_unit_volume(dec.cations, dec.anions)


@per_input(maxsize=65536)
def _formula_unit_volume(cations: tuple[IonTerm, ...], anions: tuple[IonTerm, ...]) -> tuple[float, str]:
    if len(cations) == 1 and len(anions) == 1 and cations[0].ion.element and anions[0].ion.element:
        terms = _structure_terms(cations[0].ion, anions[0].ion, cations[0].count, anions[0].count)
        if not math.isnan(terms.volume_nm3):
            return terms.volume_nm3, (
                f"{terms.assignment.structure_type} cell per formula unit scaled to r+ + r- = {terms.r0_pm:.4g} pm"
            )
    total = 0.0
    parts = []
    for term in cations + anions:
        v, why = ion_volume_nm3(term.ion)
        if math.isnan(v):
            return math.nan, why
        total += term.count * v
        parts.append(f"{term.ion.ion_id} {v:.5f} nm^3 ({why})")
    return total, "sum of ion volumes: " + "; ".join(parts)


def _ionic_strength(cations, anions) -> float:
    return 0.5 * sum(t.count * t.ion.charge**2 for t in cations + anions)


def _vbt_salt_type(cations, anions) -> str:
    if len(cations) == 1 and len(anions) == 1:
        key = (abs(cations[0].ion.charge), abs(anions[0].ion.charge))
        return {(1, 1): "1:1", (2, 1): "2:1", (1, 2): "1:2"}.get(key, "general")
    return "general"


def _mean_radius(terms) -> tuple[float, list[str]]:
    total_count = sum(t.count for t in terms)
    acc = 0.0
    texts = []
    for t in terms:
        r, why = ion_radius_pm(t.ion)
        if math.isnan(r):
            return math.nan, [why]
        acc += t.count * r
        texts.append(f"r({t.ion.ion_id}) = {r:.4g} pm ({why})")
    return acc / total_count, texts


@dataclass(frozen=True)
class _Result:
    values: dict
    notes: tuple[str, ...]
    explain: tuple[str, ...]


def _nan_values() -> dict:
    return {
        "lattice_energy_kapustinskii_kJ_mol": math.nan,
        "lattice_energy_vbt_kJ_mol": math.nan,
        "lattice_energy_born_mayer_kJ_mol": math.nan,
        "lattice_energy_born_lande_kJ_mol": math.nan,
        "structure_type": None,
        "structure_type_origin": None,
    }


@per_input(maxsize=65536)
def _compute(cations: tuple[IonTerm, ...], anions: tuple[IonTerm, ...], hydrate_water: float) -> _Result:
    values = _nan_values()
    notes: list[str] = []
    lines: list[str] = []
    if hydrate_water:
        notes.append(f"lattice energies are for the anhydrous salt ({hydrate_water:g} H2O per formula unit not counted)")
        lines.append(notes[-1])
    ionic_strength = _ionic_strength(cations, anions)

    # Kapustinskii (Glasser's form covers several ions; for a binary salt it is Kapustinskii's).
    r_cat, why_cat = _mean_radius(cations)
    r_an, why_an = _mean_radius(anions)
    if math.isnan(r_cat) or math.isnan(r_an):
        missing = why_cat if math.isnan(r_cat) else why_an
        notes.append("Kapustinskii: " + "; ".join(missing))
    else:
        u = glasser_kapustinskii_lattice_energy_kJ_mol(ionic_strength, r_cat, r_an)
        values["lattice_energy_kapustinskii_kJ_mol"] = u
        r_sum = (r_cat + r_an) / 1000.0
        lines.append(
            f"Kapustinskii: U = 121.4 kJ mol^-1 nm x 2I/<r> x (1 - 0.0345 nm/<r>) = 121.4 x {2 * ionic_strength:g}"
            f" / {r_sum:.4f} x (1 - 0.0345/{r_sum:.4f}) = {u:.0f} kJ/mol"
            + (" (Glasser's generalisation, count-weighted mean radii)" if len(cations) + len(anions) > 2 else "")
        )
        lines.extend("  " + t for t in why_cat + why_an)

    # Volume-based thermodynamics.
    volume, why_volume = _formula_unit_volume(cations, anions)
    if math.isnan(volume):
        notes.append(f"VBT: no formula-unit volume ({why_volume})")
    else:
        salt_type = _vbt_salt_type(cations, anions)
        u = glasser_jenkins_vbt_lattice_energy_kJ_mol(ionic_strength, volume, salt_type=salt_type)
        if salt_type == "general":
            limiting = glasser_jenkins_vbt_lattice_energy_kJ_mol(ionic_strength, volume, salt_type="limiting")
            if limiting > 5000.0:
                salt_type, u = "limiting", limiting
        values["lattice_energy_vbt_kJ_mol"] = u
        if salt_type == "limiting":
            eq = f"U = 121.39 x I x (2I/Vm)^(1/3) = 121.39 x {ionic_strength:g} x ({2 * ionic_strength:g}/{volume:.5f})^(1/3)"
        else:
            alpha, beta = VBT_COEFFICIENTS[salt_type]
            eq = (
                f"U = 2I (alpha/Vm^(1/3) + beta), {salt_type} coefficients alpha = {alpha} kJ mol^-1 nm,"
                f" beta = {beta} kJ/mol: 2 x {ionic_strength:g} x ({alpha}/{volume:.5f}^(1/3) + {beta})"
            )
        lines.append(f"Glasser-Jenkins VBT: {eq} = {u:.0f} kJ/mol")
        lines.append(f"  Vm = {volume:.5f} nm^3: {why_volume}")

    # Structure-based equations.
    if len(cations) == 1 and len(anions) == 1:
        cation, anion = cations[0], anions[0]
        terms = _structure_terms(cation.ion, anion.ion, cation.count, anion.count)
        assignment = terms.assignment
        values["structure_type"] = assignment.structure_type
        values["structure_type_origin"] = assignment.origin
        lines.append(assignment.note)
        if assignment.origin == "guessed":
            # A guessed structure is something to check, so it sets the row's status to warning.
            notes.append(RowWarning(assignment.note))
        if assignment.structure_type is None:
            notes.append(f"Born-Lande/Born-Mayer: {assignment.note}")
        elif math.isnan(terms.r0_pm):
            notes.append(f"Born-Lande/Born-Mayer: no cation-anion distance ({terms.r0_text})")
        else:
            prefix = (
                f"A = {terms.madelung_constant:.5f} ({assignment.structure_type}, Ewald sum; z = {terms.charge_factor:g}),"
                f" r0 = {terms.r0_pm:.4g} pm"
            )
            u_bm = born_mayer_lattice_energy_kJ_mol(terms.madelung_constant, terms.charge_factor, terms.r0_pm)
            values["lattice_energy_born_mayer_kJ_mol"] = u_bm
            lines.append(
                f"Born-Mayer: U = N_A A z^2 e^2/(4 pi eps0 r0) (1 - rho/r0), rho = 34.5 pm; {prefix} -> {u_bm:.0f} kJ/mol"
            )
            lines.append("  " + terms.r0_text)
            if math.isnan(terms.born_exponent):
                notes.append(f"Born-Lande: {terms.born_exponent_text}")
            else:
                u_bl = born_lande_lattice_energy_kJ_mol(
                    terms.madelung_constant, terms.charge_factor, terms.r0_pm, terms.born_exponent
                )
                values["lattice_energy_born_lande_kJ_mol"] = u_bl
                lines.append(
                    f"Born-Lande: U = N_A A z^2 e^2/(4 pi eps0 r0) (1 - 1/n); {prefix}, n = {terms.born_exponent:g}"
                    f" -> {u_bl:.0f} kJ/mol"
                )
                lines.append("  " + terms.born_exponent_text)
    else:
        values["structure_type_origin"] = "none"
        notes.append("Born-Lande/Born-Mayer: need a binary salt (one cation and one anion)")
    return _Result(values, tuple(notes), tuple(lines))


# --- Descriptor-module protocol ------------------------------------------------------

_SOURCE_KAP = "Kapustinskii, Q. Rev. Chem. Soc. 1956, 10, 283; Glasser, Inorg. Chem. 1995, 34, 4935"
_SOURCE_VBT = "Jenkins, Roobottom, Passmore, Glasser, Inorg. Chem. 1999, 38, 3609; Glasser & Jenkins, J. Am. Chem. Soc. 2000, 122, 632"

COLUMNS: tuple[Column, ...] = (
    Column(
        "lattice_energy_kapustinskii_kJ_mol", "float64", "kJ/mol",
        "Kapustinskii lattice potential energy; several ions through the ionic strength (Glasser);"
        " Shannon CN VI radii for monatomic ions, thermochemical radii for polyatomic ones; anhydrous salt",
        "kapustinskii_lattice_energy_kJ_mol / glasser_kapustinskii_lattice_energy_kJ_mol", _SOURCE_KAP,
        "count-weighted mean cation radius plus count-weighted mean anion radius",
    ),
    Column(
        "lattice_energy_vbt_kJ_mol", "float64", "kJ/mol",
        "volume-based (Glasser-Jenkins) lattice potential energy from the formula-unit volume; anhydrous salt",
        "glasser_jenkins_vbt_lattice_energy_kJ_mol", _SOURCE_VBT,
        "ionic strength I = 1/2 sum n_i z_i^2 and the summed formula-unit volume",
    ),
    Column(
        "lattice_energy_born_mayer_kJ_mol", "float64", "kJ/mol",
        "Born-Mayer lattice energy with the Ewald-summed Madelung constant of the structure type"
        " (binary salts with a known or guessed structure type)",
        "born_mayer_lattice_energy_kJ_mol", "Born & Mayer, Z. Phys. 1932, 75, 1",
    ),
    Column(
        "lattice_energy_born_lande_kJ_mol", "float64", "kJ/mol",
        "Born-Lande lattice energy with the Ewald-summed Madelung constant and Pauling's Born exponents"
        " (binary salts of monatomic ions with a known or guessed structure type)",
        "born_lande_lattice_energy_kJ_mol", "Born & Lande, Verh. Dtsch. Phys. Ges. 1918, 20, 210; Pauling 1960",
    ),
    Column(
        "structure_type", "string", "",
        "structure-type prototype used by the Born equations: rock-salt, caesium-chloride, zinc-blende,"
        " wurtzite, fluorite, anti-fluorite, rutile or corundum; empty when none",
        "assign_structure_type", "scorer/data/structure_prototypes.csv (sources per row); Pauling radius-ratio rule",
    ),
    Column(
        "structure_type_origin", "string", "",
        "known (prototype table), guessed (radius-ratio rule, common practice) or none; empty for non-ionic entries",
        "assign_structure_type", "common practice",
    ),
)


def describe(dec: Decomposition) -> tuple[dict[str, object], list[str]]:
    """Lattice-energy columns for one compound, and notes for what is missing.

    Never raises: odd input gives NaN and a note.
    """
    try:
        if not dec.is_ionic:
            return _nan_values(), []
        if dec.substance_class == "acid":
            return _nan_values(), ["lattice energies: not estimated for an acid (a molecular substance, not an ionic crystal)"]
        result = _compute(tuple(dec.cations), tuple(dec.anions), float(dec.hydrate_water or 0.0))
        return dict(result.values), list(result.notes)
    except Exception as exc:  # noqa: BLE001 - the protocol promises no exceptions
        return _nan_values(), [f"lattice energies not computed: {type(exc).__name__}: {exc}"]


def explain(dec: Decomposition) -> list[str]:
    """Lines for ``ionicity explain``: each lattice energy with its equation and inputs."""
    if not dec.is_ionic:
        return ["lattice energies: not an ionic compound"]
    if dec.substance_class == "acid":
        return ["lattice energies: not estimated for an acid (a molecular substance, not an ionic crystal)"]
    try:
        result = _compute(tuple(dec.cations), tuple(dec.anions), float(dec.hydrate_water or 0.0))
    except Exception as exc:  # noqa: BLE001
        return [f"lattice energies not computed: {type(exc).__name__}: {exc}"]
    return list(result.explain) + [f"note: {n}" for n in result.notes if n not in result.explain]
