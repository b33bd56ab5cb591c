"""Fajans' rules: cation polarising power, anion polarisability, and how far
a salt is pulled from ionic towards covalent bonding.

Fajans (Naturwissenschaften 1923, 11, 165; Z. Kristallogr. 1924, 61, 18)
stated that covalent character grows with (1) a small, highly charged cation,
(2) a large, highly charged, easily polarised anion, and (3) a cation without
a noble-gas shell, above all the 18-electron (``(n-1)s2 p6 d10``) and
18+2-electron (``... d10 ns2``) ions such as Cu+, Ag+, Zn2+, Hg2+, Tl+, Pb2+.
This module measures each of the three.

Radii and coordination
----------------------
Cation radii come from :func:`scorer.radii.ion_radius_pm`: Shannon's (1976)
effective ionic radius for monatomic ions, with the rule used when the input
does not say (coordination number VI when listed, else the nearest listed;
high spin when both states are listed); polyatomic and organic ions get the
thermochemical radius of Jenkins and co-workers or, failing that, the radius
of a sphere of the ion's volume, and ``explain`` says which.

Polarisabilities
----------------
In-crystal electronic polarisabilities of Tessman, Kahn and Shockley (Phys.
Rev. 1953, 92, 890, doi:10.1103/PhysRev.92.890), ``scorer/data/ion_polarisabilities.csv``;
for O2-, S2-, Se2-, Te2- they give a range and the midpoint is used. Ions they
do not list (polyatomic, organic, N3-, H-) get a Lorentz-Lorenz estimate from
the ion's volume (:func:`lorentz_lorenz_polarisability_A3`) with a refractive
index of 1.45, typical of oxo-salts and ionic liquids (n_D 1.40-1.50, common
practice); such values are flagged as estimates, good to perhaps a factor of 1.5.

Several ions
------------
Polarising power and polarisability are count-weighted means over the cations
(anions), with the maximum in a ``_max`` column; the contact index is averaged
over cation-anion pairs weighted by the product of stoichiometric fractions
(:func:`scorer.contact.contact_pairs`), and ``covalency_risk`` is that of the
worst pair, since one covalent contact is enough to change a salt's behaviour.
"""
from __future__ import annotations

import math

import numpy as np
from ionicity.scorer.contact import contact_pairs, weighted_mean
from ionicity.scorer.caching import once
from ionicity.scorer.descriptor import fmt, protocol, result_class, value_lines
from ionicity.scorer.elements import get_element
from ionicity.scorer.model import Column, Decomposition, Ion
from ionicity.scorer.radii import atomic_volumes_A3, ion_radius_pm, ion_volume_nm3, sphere_radius_pm
from ionicity.scorer.tables import table

__all__ = [
    "COLUMNS",
    "COVALENCY_RISK_LEVELS",
    "FajansValues",
    "analyse",
    "describe",
    "explain",
    "fajans_polarising_power_e_per_A2",
    "fajans_contact_index",
    "lorentz_lorenz_polarisability_A3",
    "covalency_risk_level",
    "outer_shell",
    "ion_polarisabilities",
    "anion_polarisability_A3",
]

COVALENCY_RISK_LEVELS = ("low", "moderate", "high")
# Contact-index thresholds (defined here, common practice in spirit): set so that
# alkali halides and fluorides fall low and AlCl3, FeCl3, Al2O3, SiO2 high.
MODERATE_INDEX = 0.25
HIGH_INDEX = 0.6
ASSUMED_REFRACTIVE_INDEX = 1.45

_SOURCE_TKS = "Tessman, Kahn & Shockley, Phys. Rev. 1953, 92, 890, doi:10.1103/PhysRev.92.890"
_SOURCE_FAJANS = "Fajans, Naturwissenschaften 1923, 11, 165; Z. Kristallogr. 1924, 61, 18"
_SOURCE_SHANNON = "Shannon, Acta Cryst. A 1976, 32, 751, doi:10.1107/S0567739476001551 (via scorer.radii)"

# Electron counts of the closed shells Fajans' third rule is about.
_NOBLE_GAS_ELECTRONS = (2, 10, 18, 36, 54, 86)
_EIGHTEEN_ELECTRONS = (28, 46, 78)          # [Ar]3d10, [Kr]4d10, [Xe]4f14 5d10
_EIGHTEEN_PLUS_TWO_ELECTRONS = (30, 48, 80)  # ... plus ns2
# Hg2(2+): each Hg is 5d10 6s1 and the two 6s electrons form the Hg-Hg bond,
# so each atom keeps a d10 s2 shell (Greenwood & Earnshaw 1997, ch. 29, from memory).
_CLUSTER_SHELLS = {"Hg2(2+)": "18+2"}

_PSEUDO_NOBLE_GAS_SHELLS = ("18", "18+2")

# Each equation's text, written once: the column declarations and the explain
# lines both quote it.
_POWER_EQUATION = "|z| / r^2"
_INDEX_EQUATION = "alpha / d^3 * |z|"
_RISK_RULE = (
    f"level from fajans_contact_index (< {MODERATE_INDEX} low, < {HIGH_INDEX} moderate, else high),"
    " raised one level for an 18 or 18+2 electron cation"
)

#: the --columns group of this module's COLUMNS
GROUP = "fajans"

COLUMNS: tuple[Column, ...] = (
    Column(
        "cation_polarising_power_e_per_A2", "float64", "e/angstrom^2",
        "Fajans polarising power of the cation: charge over radius squared",
        f"{_POWER_EQUATION} with r the Shannon ionic radius (CN VI when listed, else nearest; high spin when both"
        " listed) or, for polyatomic and organic cations, the thermochemical or volume-sphere radius",
        f"{_SOURCE_FAJANS}; {_SOURCE_SHANNON}",
        "several cations: mean weighted by count per formula unit",
    ),
    Column(
        "cation_polarising_power_max_e_per_A2", "float64", "e/angstrom^2",
        "polarising power of the most polarising cation", f"max over cations of {_POWER_EQUATION}",
        f"{_SOURCE_FAJANS}; {_SOURCE_SHANNON}", "extreme: maximum over cations",
    ),
    Column(
        "anion_polarisability_A3", "float64", "angstrom^3",
        "electronic polarisability (volume) of the anion in a crystal",
        "Tessman-Kahn-Shockley table (midpoint of their range for O2-, S2-, Se2-, Te2-); otherwise the"
        " Lorentz-Lorenz estimate (3/(4 pi)) V (n^2-1)/(n^2+2) from the ion volume with n = 1.45",
        _SOURCE_TKS, "several anions: mean weighted by count per formula unit",
    ),
    Column(
        "anion_polarisability_max_A3", "float64", "angstrom^3",
        "polarisability of the most polarisable anion", "max over anions", _SOURCE_TKS,
        "extreme: maximum over anions",
    ),
    Column(
        "anion_polarisability_basis", "string", "",
        "where anion_polarisability_A3 comes from: table (Tessman-Kahn-Shockley), volume_estimate"
        " (Lorentz-Lorenz from the ion volume, roughly +-50 %) or mixed",
        "table lookup first, else the estimate", _SOURCE_TKS, "several anions: mixed when they differ",
    ),
    Column(
        "cation_pseudo_noble_gas", "bool", "",
        "a cation has an 18-electron (d10: Cu+, Ag+, Zn2+, Cd2+, Hg2+, Ga3+) or 18+2-electron"
        " (d10 s2: Tl+, Pb2+, Sn2+, Bi3+, Hg2 2+) outer shell, which polarises more than its size and"
        " charge suggest (Fajans' third rule)",
        "electron count Z - z of the ion in (28, 46, 78) or (30, 48, 80)", _SOURCE_FAJANS,
        "several cations: true if any cation qualifies",
    ),
    Column(
        "fajans_contact_index", "float64", "",
        "dipole induced in the anion by the cation's field at the contact, as a fraction of"
        " (one electron x contact distance): alpha_anion * |z_cation| / d^3",
        f"{_INDEX_EQUATION} with d = r_cation + r_anion (angstrom); from mu = alpha * E, E = z e / d^2"
        " (Gaussian units); the combination is defined here",
        f"{_SOURCE_TKS}; {_SOURCE_SHANNON}",
        "several ions: mean over cation-anion pairs weighted by the product of stoichiometric fractions",
    ),
    Column(
        "covalency_risk", "string", "",
        "low, moderate or high: how far Fajans' rules pull the salt towards covalent bonding",
        f"{_RISK_RULE}; thresholds defined here",
        f"{_SOURCE_FAJANS}; thresholds common practice",
        "extreme: the worst cation-anion pair",
    ),
)


# ------------------------------------------------------------------ equations


def fajans_polarising_power_e_per_A2(charge, radius_pm):
    """Fajans polarising power of a cation, charge over radius squared.

    .. math:: P = |z| / r^2

    Parameters
    ----------
    charge : int or array-like
        Ion charge [e].
    radius_pm : float or array-like
        Ionic radius [pm].

    Returns
    -------
    float or numpy.ndarray
        Polarising power [e/angstrom^2].

    References
    ----------
    K. Fajans, Naturwissenschaften 1923, 11, 165; the z/r^2 measure is common
    practice in inorganic textbooks (e.g. Housecroft & Sharpe, Inorganic
    Chemistry).

    Examples
    --------
    Na+ and Al3+ with Shannon's (1976) CN VI radii, 102 and 53.5 pm:

    >>> round(fajans_polarising_power_e_per_A2(1, 102.0), 3), round(fajans_polarising_power_e_per_A2(3, 53.5), 2)
    (0.961, 10.48)
    """
    r = np.asarray(radius_pm, dtype=float) / 100.0
    value = np.abs(np.asarray(charge, dtype=float)) / (r * r)
    return float(value) if value.ndim == 0 else value


def fajans_contact_index(polarisability_A3, cation_charge, contact_distance_pm):
    """Dipole induced in an anion by its cation neighbour, as a fraction of e*d.

    A cation of charge ``z e`` at distance ``d`` sets up the field
    ``E = z e / d^2`` (Gaussian units) at the anion, which acquires the dipole
    ``mu = alpha E``. Dividing by ``e d`` gives the dimensionless index

    .. math:: F = \\alpha\\,|z| / d^3

    the fraction of an electron shifted across the whole contact distance, a
    measure of Fajans' polarisation that uses both ions' sizes.

    Parameters
    ----------
    polarisability_A3 : float or array-like
        Anion polarisability volume [angstrom^3].
    cation_charge : float or array-like
        Cation charge [e].
    contact_distance_pm : float or array-like
        Cation-anion distance, usually r_cation + r_anion [pm].

    Returns
    -------
    float or numpy.ndarray
        The index (dimensionless).

    References
    ----------
    The induced dipole mu = alpha E is textbook electrostatics (C. J. F.
    Boettcher, Theory of Electric Polarization, vol. 1, Elsevier, 1973); the
    index itself is defined here.

    Examples
    --------
    NaCl with the Tessman-Kahn-Shockley Cl- polarisability 2.96 angstrom^3
    and Shannon radii 102 + 181 pm:

    >>> round(fajans_contact_index(2.96, 1, 283.0), 3)
    0.131
    """
    d = np.asarray(contact_distance_pm, dtype=float) / 100.0
    value = np.asarray(polarisability_A3, dtype=float) * np.abs(np.asarray(cation_charge, dtype=float)) / d**3
    return float(value) if value.ndim == 0 else value


def lorentz_lorenz_polarisability_A3(volume_A3, refractive_index):
    """Mean electronic polarisability of a body of given volume and refractive index.

    .. math:: \\alpha = \\frac{3}{4\\pi} V \\frac{n^2 - 1}{n^2 + 2}

    Parameters
    ----------
    volume_A3 : float or array-like
        Volume per formula unit (or per ion) [angstrom^3].
    refractive_index : float or array-like
        Refractive index n (sodium D line for the Tessman-Kahn-Shockley scale).

    Returns
    -------
    float or numpy.ndarray
        Polarisability volume [angstrom^3].

    References
    ----------
    H. A. Lorentz, Ann. Phys. 1880, 9, 641; L. Lorenz, Ann. Phys. 1880, 11,
    70; in this form as used by R. D. Shannon and R. X. Fischer, Phys. Rev. B
    2006, 73, 235111.

    Examples
    --------
    NaCl: n_D = 1.544 and 44.86 angstrom^3 per formula unit (a = 5.640
    angstrom, four formula units per cell; CRC Handbook, from memory) give
    3.38 angstrom^3, the sum Na+ 0.41 + Cl- 2.96 = 3.37 of Tessman, Kahn and
    Shockley (1953):

    >>> round(lorentz_lorenz_polarisability_A3(44.86, 1.544), 2)
    3.38
    """
    n2 = np.asarray(refractive_index, dtype=float) ** 2
    value = 3.0 / (4.0 * np.pi) * np.asarray(volume_A3, dtype=float) * (n2 - 1.0) / (n2 + 2.0)
    return float(value) if value.ndim == 0 else value


def covalency_risk_level(contact_index: float, pseudo_noble_gas: bool | None) -> str | None:
    """Combine the contact index and Fajans' third rule into low/moderate/high.

    ``contact_index`` below 0.25 is low, below 0.6 moderate, otherwise high;
    an 18- or 18+2-electron cation raises the level by one (up to high).
    Thresholds are defined here (common practice in spirit): alkali halides
    (NaCl 0.13, LiI 0.25) sit low or at the edge, MgCl2 (0.37) and CaO (0.27)
    moderate, AlCl3 (0.69) and Al2O3 high.

    Parameters
    ----------
    contact_index : float
        :func:`fajans_contact_index` of the pair.
    pseudo_noble_gas : bool or None
        Whether the cation has an 18 or 18+2 electron outer shell.

    Returns
    -------
    str or None
        One of :data:`COVALENCY_RISK_LEVELS`; None for a NaN index.

    Examples
    --------
    >>> covalency_risk_level(0.13, False), covalency_risk_level(0.11, True), covalency_risk_level(0.7, True)
    ('low', 'moderate', 'high')
    """
    if contact_index is None or math.isnan(contact_index):
        return None
    level = 0 if contact_index < MODERATE_INDEX else (1 if contact_index < HIGH_INDEX else 2)
    if pseudo_noble_gas:
        level = min(level + 1, 2)
    return COVALENCY_RISK_LEVELS[level]


def outer_shell(ion: Ion) -> tuple[str, str]:
    """Outer electron shell of a cation, as Fajans' third rule sorts them.

    Returns one of ``"noble_gas"`` (2 or 8 outer electrons), ``"18"`` (d10),
    ``"18+2"`` (d10 s2), ``"open_shell"`` (partly filled d or f),
    ``"bare_proton"`` (H+) or ``"molecular"`` (polyatomic ions), with a reason.
    Counts electrons, Z - z, against the closed shells: 28/46/78 are
    [Ar]3d10, [Kr]4d10, [Xe]4f14 5d10; add 2 for the ns2 pair.

    Examples
    --------
    >>> from ionicity.scorer.model import Ion
    >>> outer_shell(Ion("Ag(+)", "Ag", 1, (("Ag", 1),), "monatomic", element="Ag"))[0]
    '18'
    >>> outer_shell(Ion("Pb(2+)", "Pb", 2, (("Pb", 1),), "monatomic", element="Pb"))[0]
    '18+2'
    >>> outer_shell(Ion("Na(+)", "Na", 1, (("Na", 1),), "monatomic", element="Na"))[0]
    'noble_gas'
    """
    if ion.ion_id in _CLUSTER_SHELLS:
        return _CLUSTER_SHELLS[ion.ion_id], "Hg2(2+): each Hg keeps 5d10 and shares its 6s electron in the Hg-Hg bond"
    if ion.element is None:
        return "molecular", "polyatomic ion: no single-atom electron shell"
    try:
        z_nuclear = get_element(ion.element).atomic_number
    except KeyError:
        return "molecular", f"unknown element {ion.element!r}"
    electrons = z_nuclear - ion.charge
    if electrons == 0:
        return "bare_proton", "H+ has no electrons"
    if electrons in _NOBLE_GAS_ELECTRONS:
        return "noble_gas", f"{electrons} electrons: noble-gas shell"
    if electrons in _EIGHTEEN_ELECTRONS:
        return "18", f"{electrons} electrons: 18-electron (n-1)d10 outer shell"
    if electrons in _EIGHTEEN_PLUS_TWO_ELECTRONS:
        return "18+2", f"{electrons} electrons: 18+2 (n-1)d10 ns2 outer shell"
    return "open_shell", f"{electrons} electrons: partly filled d or f shell"


# ------------------------------------------------------------------ data


@once
def ion_polarisabilities() -> dict[str, dict]:
    """ion_id -> row of ``scorer/data/ion_polarisabilities.csv`` (read once)."""
    by_id = {}
    for row in table("ion_polarisabilities.csv"):
        by_id[row["ion_id"]] = dict(
            polarisability_A3=float(row["polarisability_A3"]),
            range_low_A3=float(row["range_low_A3"]) if row["range_low_A3"] else math.nan,
            range_high_A3=float(row["range_high_A3"]) if row["range_high_A3"] else math.nan,
            source=row["source"],
            note=row["note"],
        )
    return by_id


def anion_polarisability_A3(ion: Ion) -> tuple[float, str, bool]:
    """Polarisability of an ion: (value in angstrom^3, where it came from, is_estimate).

    Tabulated (Tessman, Kahn & Shockley 1953) when listed, otherwise the
    Lorentz-Lorenz estimate from :func:`scorer.radii.ion_volume_nm3` with
    n = 1.45; NaN when the ion has no volume either.

    Examples
    --------
    >>> from ionicity.scorer.model import Ion
    >>> anion_polarisability_A3(Ion("Cl(-)", "Cl", -1, (("Cl", 1),), "monatomic", element="Cl"))[0]
    2.96
    """
    row = ion_polarisabilities().get(ion.ion_id)
    if row is not None:
        why = f"{ion.ion_id}: {row['polarisability_A3']:g} A^3, Tessman, Kahn & Shockley (1953)"
        if not math.isnan(row["range_low_A3"]):
            why += f", midpoint of their range {row['range_low_A3']:g}-{row['range_high_A3']:g}"
        return row["polarisability_A3"], why, False
    volume_nm3, vwhy = _anion_volume_nm3(ion)
    if math.isnan(volume_nm3):
        return math.nan, f"{ion.ion_id}: not in the Tessman-Kahn-Shockley table and no volume ({vwhy})", True
    value = lorentz_lorenz_polarisability_A3(volume_nm3 * 1000.0, ASSUMED_REFRACTIVE_INDEX)
    return value, (
        f"{ion.ion_id}: estimate (3/(4 pi)) V (n^2-1)/(n^2+2) with V = {volume_nm3 * 1000:.1f} A^3"
        f" ({vwhy}) and n = {ASSUMED_REFRACTIVE_INDEX} = {value:.2f} A^3; not in the Tessman-Kahn-Shockley table"
    ), True


def _radius(ion: Ion) -> tuple[float, str]:
    """Radius from scorer.radii (which falls back to ``fallback_radii.csv``
    for cations Shannon lacks, Sn(2+)); where it has none, for an anion (H-,
    As3-, Si4-), the sphere of the ion's volume."""
    radius, why = ion_radius_pm(ion)
    if radius is not None and not math.isnan(radius) and radius > 0:
        return float(radius), why
    if ion.charge > 0:
        return math.nan, why
    volume_nm3, vwhy = _anion_volume_nm3(ion)
    if math.isnan(volume_nm3):
        return math.nan, why
    return float(sphere_radius_pm(volume_nm3)), f"radius of a sphere of volume {volume_nm3 * 1000:.1f} A^3 ({vwhy}); {why}"


def _anion_volume_nm3(ion: Ion) -> tuple[float, str]:
    volume_nm3, vwhy = ion_volume_nm3(ion)
    if (volume_nm3 is None or math.isnan(volume_nm3)) and len(ion.composition) == 1:
        # Shannon lists no radius for H-, As3-, Sb3-, Si4-: fall back on the
        # element's mean volume in crystals, a lower bound for the anion.
        symbol, count = ion.composition[0]
        atom = atomic_volumes_A3().get(symbol)
        if atom is not None:
            volume_nm3 = atom[0] * count * 1e-3
            vwhy = f"Hofmann's mean atomic volume of {symbol} in crystals ({atom[1]}), a lower bound for the anion"
    if volume_nm3 is None or math.isnan(volume_nm3):
        return math.nan, vwhy
    return float(volume_nm3), vwhy


# ------------------------------------------------------------------ per compound


FajansValues = result_class(
    "FajansValues", COLUMNS, "Fajans' measures of one compound (fields named as the columns).",
)


_EXPLAINED = {
    "cation_polarising_power_e_per_A2": (".3g", "count-weighted mean over cations"),
    "cation_polarising_power_max_e_per_A2": (".3g", "max over cations"),
    "anion_polarisability_A3": (".3g", "count-weighted mean over anions"),
    "anion_polarisability_max_A3": (".3g", "max over anions"),
    "anion_polarisability_basis": ("", ""),
    "cation_pseudo_noble_gas": ("", "18 or 18+2 electron cation present"),
    "fajans_contact_index": (".3g", f"{_INDEX_EQUATION}, pair-weighted mean"),
    "covalency_risk": ("", f"{_RISK_RULE}; worst pair"),
}


@protocol(
    title=f"Fajans' rules (polarising power {_POWER_EQUATION}, Shannon radii; polarisabilities of Tessman, Kahn & Shockley 1953):",
    columns=COLUMNS, result=FajansValues, failure="Fajans values not computed",
    summary=value_lines(_EXPLAINED),
)
def analyse(dec: Decomposition) -> FajansValues:
    """Fajans' measures of one compound, with notes and explain steps.

    Never raises (see :mod:`scorer.descriptor`); odd input gives NaN/None and a note.
    """
    notes: list[str] = []
    steps: list[str] = []
    if not dec.is_ionic:
        steps.append(f"no ions ({dec.substance_class}): Fajans' rules apply to cation-anion contacts; values left empty")
        return FajansValues(steps=tuple(steps))

    cations = {}
    for term in dec.cations:
        ion = term.ion
        radius, rwhy = _radius(ion)
        power = fajans_polarising_power_e_per_A2(ion.charge, radius) if not math.isnan(radius) else math.nan
        shell, swhy = outer_shell(ion)
        cations[ion.ion_id] = dict(ion=ion, count=term.count, radius=radius, rwhy=rwhy, power=power, shell=shell, swhy=swhy)
        if math.isnan(power):
            notes.append(f"no radius for {ion.ion_id} ({rwhy}): its polarising power is left out")
        steps.append(
            f"cation {ion.ion_id} x{term.count:g}: r = {fmt(radius, '.3g')} pm [{rwhy}]; polarising power {_POWER_EQUATION} ="
            f" {abs(ion.charge)}/({fmt(radius, '.3g')}/100)^2 = {fmt(power, '.3g')} e/A^2; outer shell {shell} ({swhy})"
        )
    anions = {}
    for term in dec.anions:
        ion = term.ion
        alpha, awhy, estimate = anion_polarisability_A3(ion)
        radius, rwhy = _radius(ion)
        anions[ion.ion_id] = dict(ion=ion, count=term.count, alpha=alpha, estimate=estimate, radius=radius, rwhy=rwhy)
        if math.isnan(alpha):
            notes.append(f"no polarisability for {ion.ion_id}: {awhy}")
        steps.append(f"anion {ion.ion_id} x{term.count:g}: alpha = {fmt(alpha, '.3g')} A^3 [{awhy}]; r = {fmt(radius, '.3g')} pm [{rwhy}]")

    powers = [c["power"] for c in cations.values() if not math.isnan(c["power"])]
    alphas = [a["alpha"] for a in anions.values() if not math.isnan(a["alpha"])]
    bases = {("volume_estimate" if a["estimate"] else "table") for a in anions.values() if not math.isnan(a["alpha"])}

    index_terms, risks = [], []
    for cation, anion, weight in contact_pairs(dec):
        c, a = cations[cation.ion.ion_id], anions[anion.ion.ion_id]
        distance = c["radius"] + a["radius"]
        index = fajans_contact_index(a["alpha"], cation.ion.charge, distance) if not math.isnan(distance) else math.nan
        flag = c["shell"] in _PSEUDO_NOBLE_GAS_SHELLS
        risk = covalency_risk_level(index, flag)
        index_terms.append((index, weight))
        if risk is not None:
            risks.append(risk)
        steps.append(
            f"pair {cation.ion.ion_id} / {anion.ion.ion_id} (weight {weight:.3g}): d = {fmt(c['radius'], '.3g')} + {fmt(a['radius'], '.3g')}"
            f" = {fmt(distance, '.3g')} pm; index {_INDEX_EQUATION} = {fmt(a['alpha'], '.3g')}*{abs(cation.ion.charge)}/({fmt(distance, '.3g')}/100)^3"
            f" = {fmt(index, '.3g')}; 18/18+2 cation: {flag}; risk {risk}"
        )
    if not risks:
        notes.append("fajans_contact_index and covalency_risk not assessed: no cation-anion pair has both radii and an anion polarisability")
    found = FajansValues(
        cation_polarising_power_e_per_A2=weighted_mean([(c["power"], c["count"]) for c in cations.values()]),
        cation_polarising_power_max_e_per_A2=max(powers) if powers else math.nan,
        anion_polarisability_A3=weighted_mean([(a["alpha"], a["count"]) for a in anions.values()]),
        anion_polarisability_max_A3=max(alphas) if alphas else math.nan,
        anion_polarisability_basis=(bases.pop() if len(bases) == 1 else "mixed") if bases else None,
        cation_pseudo_noble_gas=any(c["shell"] in _PSEUDO_NOBLE_GAS_SHELLS for c in cations.values()),
        fajans_contact_index=weighted_mean(index_terms),
        covalency_risk=max(risks, key=COVALENCY_RISK_LEVELS.index) if risks else None,
        notes=tuple(notes),
        steps=tuple(steps),
    )
    return found


describe = analyse.describe
explain = analyse.explain
