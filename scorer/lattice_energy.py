"""Lattice-energy equations: Born-Lande, Born-Mayer, Kapustinskii (and
Glasser's form for several ions), volume-based thermodynamics (Glasser and
Jenkins) and the Born-Haber cycle, one function per published equation.

Every energy is the lattice potential energy ``U_POT`` of Jenkins's usage:
the energy, in kJ/mol, needed to take one mole of formula units of the
crystal apart into gaseous ions, reported positive. The functions take plain
numbers or arrays; which inputs a compound gets (radii, volumes, Madelung
constants, structure types) is decided in :mod:`scorer.lattice`.
"""
from __future__ import annotations

import math

import numpy as np

__all__ = [
    "COULOMB_KJ_PM_MOL",
    "BORN_MAYER_RHO_PM",
    "KAPUSTINSKII_CONSTANT_KJ_NM_MOL",
    "KAPUSTINSKII_CRC_CONSTANT_KJ_NM_MOL",
    "KAPUSTINSKII_D_PM",
    "BMH_RHO_PM",
    "born_mayer_huggins_lattice_energy_kJ_mol",
    "VBT_COEFFICIENTS",
    "VBT_LIMITING_A_KJ_NM_MOL",
    "VBT_LIMITING_ABOVE_KJ_MOL",
    "VBT_SALT_TYPES",
    "born_lande_lattice_energy_kJ_mol",
    "born_mayer_lattice_energy_kJ_mol",
    "kapustinskii_lattice_energy_kJ_mol",
    "glasser_kapustinskii_lattice_energy_kJ_mol",
    "glasser_jenkins_vbt_lattice_energy_kJ_mol",
    "born_haber_lattice_energy_kJ_mol",
]

# N_A e^2 / (4 pi eps0), CODATA 2018 exact e and N_A, eps0 = 8.8541878128e-12 F/m.
_E = 1.602176634e-19
_NA = 6.02214076e23
_EPS0 = 8.8541878128e-12
COULOMB_KJ_PM_MOL = _NA * _E**2 / (4.0 * math.pi * _EPS0) * 1e12 / 1e3  # 138935.46 kJ pm / mol

BORN_MAYER_RHO_PM = 34.5
"""Born-Mayer repulsion range rho = 0.345 angstrom (Born and Mayer, Z. Phys.
1932, 75, 1, doi:10.1007/BF01340511), the value Kapustinskii kept."""

KAPUSTINSKII_CONSTANT_KJ_NM_MOL = 120.25
"""Kapustinskii's own constant, 1.2025e-4 J m mol^-1 = 120.25 kJ mol^-1 nm
(287.2 kcal mol^-1 angstrom; A. F. Kapustinskii, Q. Rev. Chem. Soc. 1956, 10,
283, from memory), used with his Goldschmidt radii. The equation as
published, so that it is not Born-Mayer in disguise: with 121.4 (below) and
Shannon radii it equals the rock-salt Born-Mayer value for every rock-salt
salt, and their agreement would confirm nothing."""

KAPUSTINSKII_CRC_CONSTANT_KJ_NM_MOL = 121.4
"""The constant in the form of the CRC Handbook 'Lattice energies' section
(Jenkins and Roobottom): N_A e^2/(4 pi eps0) times half the rock-salt
Madelung constant, with CODATA constants; kept for that section's worked
example."""

KAPUSTINSKII_D_PM = 34.5

VBT_COEFFICIENTS: dict[str, tuple[float, float]] = {
    "1:1": (117.3, 51.9),
    "2:1": (133.5, 60.9),
    "1:2": (165.3, -29.8),
    "2:2": (119.0, 60.0),
    "general": (138.7, 27.6),
}
"""alpha (kJ mol^-1 nm) and beta (kJ mol^-1) of U = 2I(alpha/Vm^(1/3) + beta).
"1:1" MX, "2:1" MX2 (cation charge 2, anion 1), "1:2" M2X, "2:2" MX of
doubly charged ions (MgO, CaS): Jenkins, Roobottom, Passmore, Glasser,
Inorg. Chem. 1999, 38, 3609, doi:10.1021/ic9812961, table of alpha and beta
per charge type; "general": Glasser and Jenkins, J. Am. Chem. Soc. 2000,
122, 632, doi:10.1021/ja992375u. Values from memory: the papers' tables
could not be read through an open copy (the 2000 paper's abstract, read at
studylib.net, confirms only A = 121.39 and the 5000 kJ/mol limit); the 2:2
pair is the one least sure. None of them was fitted here."""

VBT_LIMITING_A_KJ_NM_MOL = 121.39
"""A of the Glasser-Jenkins limiting equation U = A I (2I/Vm)^(1/3), for
U > 5000 kJ/mol (Glasser and Jenkins 2000, abstract)."""

VBT_LIMITING_ABOVE_KJ_MOL = 5000.0
"""The limiting equation applies above this lattice energy (Glasser and Jenkins 2000)."""

VBT_SALT_TYPES = ("1:1", "2:1", "1:2", "2:2", "general", "limiting")

_R_KJ_MOL_K = 8.314462618e-3

BMH_RHO_PM = 26.2
"""Repulsion range of :func:`born_mayer_huggins_lattice_energy_kJ_mol` as
scored: one value for every alkali halide, set on the calibration alkali
halides only (the Li, K and Cs halides of tests/data/lattice_reference.csv:
the 0.1 pm grid value that minimises their median absolute error against the
Born-Haber values, 0.7 %) and checked on the Na and Rb halides (validation).
Tosi and Fumi's compressibility fits give 31.7-34.2 pm (1964, from memory);
the smaller value here also absorbs the zero-point and thermal terms that
separate a static lattice energy from a 298 K cycle value, so it is a fitted
parameter, not a measured range."""

# N_A x 1e-60 erg cm^6 / pm^6 and N_A x 1e-76 erg cm^8 / pm^8 in kJ/mol:
# 1e-60 erg cm^6 = 1e-79 J m^6 = 1e-7 J pm^6; 1e-76 erg cm^8 = 1e-99 J m^8 = 1e-3 J pm^8.
_C6_UNIT_KJ_PM6_MOL = _NA * 1e-7 * 1e-3
_D8_UNIT_KJ_PM8_MOL = _NA * 1e-3 * 1e-3




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



def born_mayer_huggins_lattice_energy_kJ_mol(
    madelung_constant, charge_factor, r0_pm, c_1e60_erg_cm6, d_1e76_erg_cm8, rho_pm=BMH_RHO_PM
):
    """Born-Mayer-Huggins lattice energy: Born-Mayer with the van der Waals
    (dipole-dipole C/r^6 and dipole-quadrupole D/r^8) attraction.

    .. math::

        U(r) = -\\frac{N_A A z^2 e^2}{4\\pi\\varepsilon_0 r} - \\frac{C}{r^6} - \\frac{D}{r^8}
               + B e^{-r/\\rho}

    with B fixed by dU/dr = 0 at the measured r0, which gives

    .. math::

        U_0 = \\frac{N_A A z^2 e^2}{4\\pi\\varepsilon_0 r_0}\\left(1 - \\frac{\\rho}{r_0}\\right)
              + \\frac{C}{r_0^6}\\left(1 - \\frac{6\\rho}{r_0}\\right)
              + \\frac{D}{r_0^8}\\left(1 - \\frac{8\\rho}{r_0}\\right)

    Parameters
    ----------
    madelung_constant : float or array-like
        ``A``, common-factor convention.
    charge_factor : float or array-like
        ``z``, highest common factor of the charges.
    r0_pm : float or array-like
        Measured cation-anion distance, pm.
    c_1e60_erg_cm6 : float or array-like
        Lattice-summed dipole-dipole coefficient C per formula unit, in Mayer's
        unit 1e-60 erg cm^6 (NaCl 180).
    d_1e76_erg_cm8 : float or array-like
        Lattice-summed dipole-quadrupole coefficient D, 1e-76 erg cm^8 (NaCl 200).
    rho_pm : float or array-like, default=BMH_RHO_PM
        Range of the exponential repulsion, pm.

    Returns
    -------
    float or ndarray
        U in kJ/mol, positive.

    References
    ----------
    J. E. Mayer, J. Chem. Phys. 1933, 1, 270, doi:10.1063/1.1749283 (C and D);
    M. L. Huggins, J. Chem. Phys. 1937, 5, 143; M. P. Tosi and F. G. Fumi,
    J. Phys. Chem. Solids 1964, 25, 45, doi:10.1016/0022-3697(64)90160-X.

    Examples
    --------
    NaCl, r0 = 282.0 pm, Mayer's C = 180 and D = 200 (from memory), with the
    Born-Mayer range 34.5 pm: the van der Waals terms add about 6 kJ/mol to
    the Born-Mayer value (758 kJ/mol in :func:`born_mayer_lattice_energy_kJ_mol`):

    >>> round(born_mayer_huggins_lattice_energy_kJ_mol(1.74756, 1, 282.0, 180, 200, rho_pm=34.5))
    761
    """
    a = np.asarray(madelung_constant, dtype=float)
    z = np.asarray(charge_factor, dtype=float)
    r0 = np.asarray(r0_pm, dtype=float)
    rho = np.asarray(rho_pm, dtype=float)
    c6 = np.asarray(c_1e60_erg_cm6, dtype=float) * _C6_UNIT_KJ_PM6_MOL / r0**6
    d8 = np.asarray(d_1e76_erg_cm8, dtype=float) * _D8_UNIT_KJ_PM8_MOL / r0**8
    u = COULOMB_KJ_PM_MOL * a * z**2 / r0 * (1.0 - rho / r0) + c6 * (1.0 - 6.0 * rho / r0) + d8 * (1.0 - 8.0 * rho / r0)
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

    with Kapustinskii's K = 120.25 kJ mol^-1 nm and d = 0.0345 nm.

    Parameters
    ----------
    ions_per_formula_unit : float or array-like
        ``nu`` (2 for NaCl, 3 for CaF2).
    cation_charge, anion_charge : float or array-like
        Charges in units of e (the sign is ignored).
    cation_radius_pm, anion_radius_pm : float or array-like
        Radii in pm: Kapustinskii used Goldschmidt radii for monatomic ions
        and thermochemical radii for polyatomic ones.
    constant_kJ_nm_mol : float, default=120.25
        Kapustinskii's; the CRC section uses 121.4.
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
    0.136 nm (NH4+) and 0.172 nm (HF2-), in that section's form of the
    constant:

    >>> round(kapustinskii_lattice_energy_kJ_mol(2, 1, -1, 136.0, 172.0, constant_kJ_nm_mol=121.4))
    700

    NaCl with Goldschmidt's radii 98 and 181 pm (from memory) and
    Kapustinskii's constant (the Born-Haber value is about 787 kJ/mol):

    >>> round(kapustinskii_lattice_energy_kJ_mol(2, 1, -1, 98.0, 181.0))
    755
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

    >>> round(glasser_kapustinskii_lattice_energy_kJ_mol(1, 136.0, 172.0, constant_kJ_nm_mol=121.4))
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
    salt_type : {"1:1", "2:1", "1:2", "2:2", "general", "limiting"}, default="general"
        Which coefficients: ``"1:1"`` (alpha 117.3 kJ mol^-1 nm, beta 51.9
        kJ/mol), ``"2:1"`` MX2 (133.5, 60.9), ``"1:2"`` M2X (165.3, -29.8),
        ``"2:2"`` MX of doubly charged ions (119, 60) from Jenkins et al. 1999; ``"general"`` (138.7, 27.6) from Glasser and
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

