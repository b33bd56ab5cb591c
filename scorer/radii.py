"""Ionic radii and ion volumes shared by the scoring modules.

Three questions, one function each; every answer comes with a short text
saying which entry was used and why, so ``ionicity explain`` can show it.

:func:`shannon_radius_pm`
    Shannon's effective **ionic** radius (not the crystal radius) of a
    monatomic ion (R. D. Shannon, Acta Cryst. A 1976, 32, 751,
    doi:10.1107/S0567739476001551), from the element snapshot.
    Default rule when the caller does not say:

    1. coordination number VI when Shannon lists it, else the nearest listed
       coordination number (a tie goes to the larger one);
    2. high spin when both spin states are listed;
    3. the plain polyhedron when a number is listed with and without a
       geometry suffix (``IV`` before ``IVSQ`` square planar or ``IVPY``).

:func:`ion_radius_pm`
    Monatomic ions: the Shannon radius. Polyatomic ions: the thermochemical
    radius of Jenkins and co-workers (``scorer/data/thermochemical_radii.csv``)
    where tabulated, else the radius of a sphere with the ion's volume (from
    :func:`ion_volume_nm3`), which the text says.

:func:`ion_volume_nm3`
    The ion volumes of Jenkins, Roobottom, Passmore and Glasser (Inorg.
    Chem. 1999, 38, 3609) and Slattery et al. for ionic-liquid ions
    (``scorer/data/ion_volumes.csv``) where tabulated; else, for a monatomic
    ion, the sphere of its Shannon radius; else an additive estimate, the sum
    of Hofmann's mean atomic volumes in crystals over the ion's composition
    (D. W. M. Hofmann, Acta Cryst. B 2002, 58, 489,
    doi:10.1107/S0108768101021814; ``scorer/data/atomic_volumes.csv``).
    Hofmann's volumes include each atom's share of the packing space, which
    is what a formula-unit volume needs; for large organic ions they land
    within about 10 % of the Slattery volumes, for small oxoanions they run
    10-30 % below Jenkins's (whose anion volumes also carry the space left by
    the small cation volumes of that scheme).

Examples
--------
>>> shannon_radius_pm("Na", 1)
(102.0, 'Shannon (1976) ionic radius of Na(+), CN VI (default: CN VI)')
>>> shannon_radius_pm("Fe", 2)[0], shannon_radius_pm("Fe", 2, spin="LS")[0]
(78.0, 61.0)
"""
from __future__ import annotations

import math

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.elements import get_element
from ionicity.scorer.model import Ion, format_charge
from ionicity.scorer.tables import table

__all__ = [
    "shannon_radius_pm",
    "ion_radius_pm",
    "kapustinskii_radius_pm",
    "goldschmidt_radii",
    "ion_volume_nm3",
    "sphere_volume_nm3",
    "sphere_radius_pm",
    "thermochemical_radii",
    "tabulated_ion_volumes",
    "atomic_volumes_A3",
    "SPINS",
]

SPINS = ("HS", "LS")
_DEFAULT_CN = 6
_ROMAN = {1: "I", 2: "II", 3: "III", 4: "IV", 5: "V", 6: "VI", 7: "VII", 8: "VIII", 9: "IX", 10: "X", 11: "XI", 12: "XII", 14: "XIV"}


def _roman(n: int) -> str:
    return _ROMAN.get(n, str(n))


def sphere_volume_nm3(radius_pm):
    """Volume of a sphere of the given radius, pm -> nm^3 (numpy arrays work).

    >>> round(sphere_volume_nm3(100.0), 6)
    0.004189
    """
    return 4.0 / 3.0 * math.pi * (radius_pm * 1e-3) ** 3


def sphere_radius_pm(volume_nm3):
    """Radius of a sphere of the given volume, nm^3 -> pm (numpy arrays work).

    >>> round(sphere_radius_pm(0.004189), 1)
    100.0
    """
    return (3.0 * volume_nm3 / (4.0 * math.pi)) ** (1.0 / 3.0) * 1e3


@once
def thermochemical_radii() -> dict[str, tuple[float, str]]:
    """ion_id -> (thermochemical radius in pm, source), read once."""
    return {row["ion_id"]: (float(row["radius_pm"]), row["source"]) for row in table("thermochemical_radii.csv")}


@once
def fallback_radii() -> dict[str, tuple[float, str]]:
    """Radii of ions Shannon (1976) does not list, from older tables
    (``scorer/data/fallback_radii.csv``, a source per row): Ahrens's Sn(2+) and
    Ge(2+), Pauling's crystal radii of P(3-), As(3-), Sb(3-)."""
    return {row["ion_id"]: (float(row["radius_pm"]), row["source"]) for row in table("fallback_radii.csv")}


@once
def goldschmidt_radii() -> dict[str, tuple[float, str]]:
    """ion_id -> (Goldschmidt's ionic radius in pm, source), read once."""
    return {row["ion_id"]: (float(row["radius_pm"]), row["source"]) for row in table("goldschmidt_radii.csv")}


@once
def tabulated_ion_volumes() -> dict[str, tuple[float, str]]:
    """ion_id -> (ion volume in nm^3, source), read once."""
    return {row["ion_id"]: (float(row["volume_nm3"]), row["source"]) for row in table("ion_volumes.csv")}


@once
def atomic_volumes_A3() -> dict[str, tuple[float, str]]:
    """element symbol -> (Hofmann's mean atomic volume in angstrom^3, source), read once."""
    return {row["symbol"]: (float(row["volume_A3"]), row["source"]) for row in table("atomic_volumes.csv")}


def _ion_name(symbol: str, charge: int) -> str:
    return f"{symbol}({format_charge(int(charge))})"


@per_input(maxsize=4096)
def shannon_radius_pm(
    symbol: str,
    charge: int,
    coordination_number: int | None = None,
    spin: str | None = None,
) -> tuple[float, str]:
    """Shannon's effective ionic radius of a monatomic ion, with the reason.

    Parameters
    ----------
    symbol : str
        Element symbol (``"Fe"``).
    charge : int
        Ion charge in units of e (``2``, ``-1``).
    coordination_number : int, optional
        Wanted coordination number. Default: VI when listed, else the
        nearest listed number (ties to the larger).
    spin : {"HS", "LS"}, optional
        Wanted spin state. Default: high spin where both are listed.

    Returns
    -------
    radius_pm : float
        The ionic radius in pm, or NaN.
    reason : str
        Which entry was used and why (a fallback says so), or why there is
        no value.

    Raises
    ------
    ValueError
        For a spin other than ``"HS"``/``"LS"``/``None`` or a coordination
        number that is not a positive integer.

    References
    ----------
    R. D. Shannon, Acta Cryst. A 1976, 32, 751, doi:10.1107/S0567739476001551.

    Examples
    --------
    Values of Shannon (1976), Table 1:

    >>> shannon_radius_pm("Cl", -1)[0]
    181.0
    >>> shannon_radius_pm("Zn", 2, 4)
    (60.0, 'Shannon (1976) ionic radius of Zn(2+), CN IV')
    >>> shannon_radius_pm("Cl", -1, 8)
    (181.0, 'Shannon (1976) ionic radius of Cl(-), CN VI (no CN VIII entry; nearest listed CN)')
    """
    if spin is not None:
        if not isinstance(spin, str) or spin.upper() not in SPINS:
            raise ValueError(f"unknown spin {spin!r}; allowed: 'HS', 'LS' or None")
        spin = spin.upper()
    if coordination_number is not None:
        if isinstance(coordination_number, bool) or not float(coordination_number).is_integer() or coordination_number < 1:
            raise ValueError(f"coordination_number must be a positive integer or None, got {coordination_number!r}")
        coordination_number = int(coordination_number)
    try:
        element = get_element(symbol)
    except KeyError as exc:
        return math.nan, str(exc.args[0])
    try:
        charge = int(charge)
    except (TypeError, ValueError):
        return math.nan, f"charge {charge!r} is not an integer"
    name = _ion_name(symbol, charge)
    entries = [
        r for r in element.shannon_radii
        if r.charge == charge and not math.isnan(r.ionic_radius_pm) and r.ionic_radius_pm > 0
    ]
    if not entries:
        return math.nan, f"Shannon (1976) lists no (positive) ionic radius for {name}"

    target = _DEFAULT_CN if coordination_number is None else coordination_number
    numbers = sorted({r.coordination_number for r in entries}, key=lambda n: (abs(n - target), -n))
    chosen_cn = numbers[0]
    notes = []
    if coordination_number is None:
        notes.append("default: CN VI" if chosen_cn == _DEFAULT_CN else "no CN VI entry; nearest listed CN")
    elif chosen_cn != coordination_number:
        notes.append(f"no CN {_roman(coordination_number)} entry; nearest listed CN")

    at_cn = [r for r in entries if r.coordination_number == chosen_cn]
    plain = [r for r in at_cn if r.coordination == _roman(chosen_cn)]
    if plain:
        at_cn = plain
    spins = {r.spin for r in at_cn}
    if spin is not None:
        matching = [r for r in at_cn if r.spin == spin]
        if matching:
            at_cn = matching
        else:
            notes.append(f"no {spin} entry at this CN")
    elif {"HS", "LS"} <= spins:
        at_cn = [r for r in at_cn if r.spin == "HS"]
        notes.append("high spin: both states listed")
    entry = at_cn[0]
    label = f"CN {entry.coordination}" + {"HS": ", high spin", "LS": ", low spin"}.get(entry.spin, "")
    text = f"Shannon (1976) ionic radius of {name}, {label}"
    if notes:
        text += " (" + "; ".join(notes) + ")"
    return float(entry.ionic_radius_pm), text


@per_input(maxsize=4096)
def ion_radius_pm(ion: Ion, coordination_number: int | None = None) -> tuple[float, str]:
    """Radius of any ion, with where it came from.

    Parameters
    ----------
    ion : Ion
    coordination_number : int, optional
        Passed to :func:`shannon_radius_pm` for monatomic ions.

    Returns
    -------
    radius_pm : float
        NaN when no radius can be given.
    reason : str

    Examples
    --------
    >>> from ionicity.scorer.model import Ion
    >>> no3 = Ion("NO3(-)", "NO3", -1, (("N", 1), ("O", 3)), "oxoanion")
    >>> ion_radius_pm(no3)[0]
    179.0
    """
    table = thermochemical_radii()
    if ion.element is not None:
        radius, why = shannon_radius_pm(ion.element, ion.charge, coordination_number)
        if math.isnan(radius) and ion.ion_id in table:
            # Shannon lists no hydride radius; the thermochemical table does.
            radius, source = table[ion.ion_id]
            return radius, f"thermochemical radius of {ion.ion_id}: {source}"
        if math.isnan(radius) and ion.ion_id in fallback_radii():
            # Shannon lists no Sn(2+): an older table's value, said in the reason
            radius, source = fallback_radii()[ion.ion_id]
            return radius, f"{ion.ion_id}: {radius:g} pm, fallback radius ({source})"
        return radius, why
    if ion.ion_id in table:
        radius, source = table[ion.ion_id]
        return radius, f"thermochemical radius of {ion.ion_id}: {source}"
    if len(ion.composition) == 1 and ion.composition[0][1] == 1:
        symbol = ion.composition[0][0]
        return shannon_radius_pm(symbol, ion.charge, coordination_number)
    volume, why = ion_volume_nm3(ion)
    if math.isnan(volume):
        return math.nan, f"no thermochemical radius for {ion.ion_id} and no volume ({why})"
    return float(sphere_radius_pm(volume)), f"radius of a sphere of the ion's volume {volume:.4f} nm^3 ({why}); {ion.ion_id} has no tabulated thermochemical radius"


@per_input(maxsize=4096)
def kapustinskii_radius_pm(ion: Ion) -> tuple[float, str]:
    """The radius Kapustinskii's equation takes, with where it came from.

    Kapustinskii (Q. Rev. Chem. Soc. 1956, 10, 283) used Goldschmidt's radii
    for monatomic ions (``scorer/data/goldschmidt_radii.csv``) and
    thermochemical radii for polyatomic ones. A monatomic ion Goldschmidt did
    not list takes :func:`ion_radius_pm` (Shannon CN VI), which the text says.

    Examples
    --------
    >>> from ionicity.scorer.model import Ion
    >>> na = Ion("Na(+)", "Na", 1, (("Na", 1),), "monatomic", element="Na")
    >>> kapustinskii_radius_pm(na)[0]
    98.0
    """
    table = goldschmidt_radii()
    if ion.ion_id in table:
        radius, _ = table[ion.ion_id]
        return radius, f"Goldschmidt radius of {ion.ion_id} (Kapustinskii's choice)"
    radius, why = ion_radius_pm(ion)
    if ion.element is not None and not math.isnan(radius):
        why += f"; Goldschmidt lists no {ion.ion_id}"
    return radius, why


def ion_volume_nm3(ion: Ion) -> tuple[float, str]:
    """Volume of an ion in a crystal, nm^3, with where it came from.

    Parameters
    ----------
    ion : Ion

    Returns
    -------
    volume_nm3 : float
        NaN when no estimate is possible (an element without Hofmann volume).
    reason : str

    Examples
    --------
    Jenkins et al. (1999) give Cl(-) 0.047 nm^3; [C6mim](+) is not tabulated
    and is estimated from Hofmann's atomic volumes (C 13.87, H 5.08, N 11.8
    angstrom^3): 10 C + 19 H + 2 N = 258.82 angstrom^3.

    >>> from ionicity.scorer.model import Ion
    >>> cl = Ion("Cl(-)", "Cl", -1, (("Cl", 1),), "monatomic", element="Cl")
    >>> ion_volume_nm3(cl)[0]
    0.047
    >>> c6 = Ion("[C6mim](+)", "[C6mim]", 1, (("C", 10), ("H", 19), ("N", 2)), "imidazolium", organic=True)
    >>> round(ion_volume_nm3(c6)[0], 5)
    0.25882
    """
    table = tabulated_ion_volumes()
    if ion.ion_id in table:
        volume, source = table[ion.ion_id]
        return volume, f"tabulated volume of {ion.ion_id}: {source}"
    if ion.element is not None:
        radius, why = ion_radius_pm(ion)
        if math.isnan(radius):
            return math.nan, why
        return float(sphere_volume_nm3(radius)), f"sphere of the {why}"
    volumes = atomic_volumes_A3()
    total = 0.0
    missing = []
    for symbol, count in ion.composition:
        if symbol not in volumes:
            missing.append(symbol)
            continue
        total += volumes[symbol][0] * count
    if missing:
        return math.nan, f"no tabulated volume for {ion.ion_id} and no Hofmann atomic volume for {', '.join(missing)}"
    return total * 1e-3, (
        f"additive estimate for {ion.ion_id}: sum of Hofmann's mean atomic volumes in crystals "
        "(Hofmann, Acta Cryst. B 2002, 58, 489)"
    )
