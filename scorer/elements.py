"""Element properties from the packaged mendeleev snapshot.

The data come from ``scorer/data/elements.json``, written by
``python -m ionicity.scorer.data.build_elements`` from mendeleev (see
``scorer/data/README.md`` for its upstream sources and the choices made).
This module never imports mendeleev: the snapshot is read with
:mod:`importlib.resources` on first use, once per process, and every
:class:`Element` is built at that moment.

Units are part of the field names except where noted:

- ``atomic_weight``: relative atomic mass (dimensionless, numerically g/mol);
  radioactive elements carry the mass number of their most stable isotope.
- ``electronegativity_pauling``: Pauling units (dimensionless).
- ``electronegativity_allen``: **eV**, Allen's average valence-electron
  configuration energy as published (Mann, Meek and Allen 2000), not
  rescaled to Pauling units (sodium is 5.14, not about 0.87).
- ``electron_affinity_eV``: eV. mendeleev gives negative values for He, Be,
  N, Ar and Xe (metastable anions) and none for Ne, Mg, Mn, Zn, Kr, Cd, Hg,
  Rn, Pm, Sm, Gd, Ho, Er and every element from Th to Ts.
- ``dipole_polarizability_bohr3``: atomic units (bohr^3, 1 bohr^3 =
  0.148185 angstrom^3).
- Shannon radii in pm (Shannon 1976, Acta Cryst. A32, 751,
  doi:10.1107/S0567739476001551).

Examples
--------
>>> na = get_element("Na")
>>> na.atomic_number, na.electronegativity_pauling, na.is_metal
(11, 0.93, True)
>>> is_element_symbol("Co"), is_element_symbol("CO")
(True, False)
"""
from __future__ import annotations

import copy
import json
import math
import numbers
from dataclasses import dataclass

from ionicity.scorer.caching import once
from ionicity.scorer.tables import data_bytes

__all__ = [
    "ShannonRadius",
    "Element",
    "get_element",
    "is_element_symbol",
    "is_metal",
    "metal_symbols",
    "element_symbols",
    "snapshot_info",
]

_SNAPSHOT_FILE = "elements.json"

_METAL_SERIES = frozenset(
    {
        "Alkali metals",
        "Alkaline earth metals",
        "Transition metals",
        "Lanthanides",
        "Actinides",
        "Poor metals",
    }
)
_METALLOID_SERIES = frozenset({"Metalloids"})


@dataclass(frozen=True)
class ShannonRadius:
    """One row of Shannon's table of effective ionic radii.

    Parameters
    ----------
    charge : int
        Ion charge in units of e.
    coordination : str
        Shannon's label: a roman numeral, sometimes with the geometry
        (``"VI"``, ``"IVSQ"`` square planar, ``"IIIPY"`` pyramidal).
    coordination_number : int
        The numeral of ``coordination`` as an integer.
    spin : str
        ``""`` when not applicable, ``"HS"`` high spin, ``"LS"`` low spin.
    ionic_radius_pm : float
        Effective ionic radius (scale with r(O2-, VI) = 140 pm).
    crystal_radius_pm : float
        Crystal radius: ionic radius + 14 pm for cations, - 14 pm for anions.
    most_reliable : bool
        Shannon's mark for the most reliable values; False also when the
        source row has no mark (the 15 actinide(III) IX rows that
        mendeleev cites as Lundberg 2016).
    """

    charge: int
    coordination: str
    coordination_number: int
    spin: str
    ionic_radius_pm: float
    crystal_radius_pm: float
    most_reliable: bool


@dataclass(frozen=True)
class Element:
    """Properties of one chemical element; floats are NaN when unknown.

    See the module docstring for units and sources. Obtain instances with
    :func:`get_element`; they are shared, immutable and hashable.
    """

    symbol: str
    name: str
    atomic_number: int
    atomic_weight: float
    period: int
    group: int | None
    block: str
    series: str
    electronegativity_pauling: float
    electronegativity_allen: float
    ionization_energies_eV: tuple[float, ...]
    electron_affinity_eV: float
    dipole_polarizability_bohr3: float
    electron_configuration: str
    oxidation_states_main: tuple[int, ...]
    oxidation_states_extra: tuple[int, ...]
    shannon_radii: tuple[ShannonRadius, ...]

    @property
    def is_metal(self) -> bool:
        """True for alkali, alkaline-earth, transition, post-transition
        ("Poor metals"), lanthanide and actinide elements, by mendeleev's
        series; metalloids and nonmetals are False."""
        return self.series in _METAL_SERIES

    @property
    def is_metalloid(self) -> bool:
        """True for mendeleev's "Metalloids" series (B, Si, Ge, As, Sb, Te, Po)."""
        return self.series in _METALLOID_SERIES

    def ionization_energy_eV(self, n: int) -> float:
        """The n-th successive ionization energy in eV (n = 1 is the first).

        Parameters
        ----------
        n : int
            Which ionization, 1-based: removing the n-th electron from the
            ion of charge n - 1.

        Returns
        -------
        float
            The energy in eV, or NaN when the snapshot has no value.

        Raises
        ------
        ValueError
            If ``n`` is not a positive integer.

        Examples
        --------
        >>> round(get_element("Na").ionization_energy_eV(1), 3)
        5.139
        >>> math.isnan(get_element("Na").ionization_energy_eV(12))
        True
        """
        if isinstance(n, bool) or not isinstance(n, numbers.Integral) or n < 1:
            raise ValueError(f"n must be a positive integer (1 = first ionization), got {n!r}")
        if n > len(self.ionization_energies_eV):
            return math.nan
        return self.ionization_energies_eV[int(n) - 1]


def _nan_if_none(value) -> float:
    return math.nan if value is None else float(value)


def _shannon_radius(entry: dict) -> ShannonRadius:
    return ShannonRadius(
        charge=int(entry["charge"]),
        coordination=entry["coordination"],
        coordination_number=int(entry["coordination_number"]),
        spin=entry["spin"] or "",
        ionic_radius_pm=_nan_if_none(entry["ionic_radius_pm"]),
        crystal_radius_pm=_nan_if_none(entry["crystal_radius_pm"]),
        most_reliable=bool(entry["most_reliable"]),
    )


def _element(entry: dict) -> Element:
    return Element(
        symbol=entry["symbol"],
        name=entry["name"],
        atomic_number=int(entry["atomic_number"]),
        atomic_weight=_nan_if_none(entry["atomic_weight"]),
        period=int(entry["period"]),
        group=None if entry["group"] is None else int(entry["group"]),
        block=entry["block"] or "",
        series=entry["series"] or "",
        electronegativity_pauling=_nan_if_none(entry["electronegativity_pauling"]),
        electronegativity_allen=_nan_if_none(entry["electronegativity_allen"]),
        ionization_energies_eV=tuple(_nan_if_none(v) for v in entry["ionization_energies_eV"]),
        electron_affinity_eV=_nan_if_none(entry["electron_affinity_eV"]),
        dipole_polarizability_bohr3=_nan_if_none(entry["dipole_polarizability_bohr3"]),
        electron_configuration=entry["electron_configuration"] or "",
        oxidation_states_main=tuple(int(v) for v in entry["oxidation_states_main"]),
        oxidation_states_extra=tuple(int(v) for v in entry["oxidation_states_extra"]),
        shannon_radii=tuple(_shannon_radius(r) for r in entry["shannon_radii"]),
    )


@once
def _snapshot() -> tuple[dict, dict[str, Element], tuple[str, ...]]:
    raw = json.loads(data_bytes(_SNAPSHOT_FILE))
    elements = [_element(entry) for entry in raw["elements"]]
    elements.sort(key=lambda e: e.atomic_number)
    by_symbol = {e.symbol: e for e in elements}
    return raw["meta"], by_symbol, tuple(e.symbol for e in elements)


def get_element(symbol: str) -> Element:
    """The :class:`Element` for a symbol, matched case-sensitively.

    Parameters
    ----------
    symbol : str
        Chemical symbol as IUPAC writes it (``"Na"``, ``"Co"``).

    Returns
    -------
    Element

    Raises
    ------
    KeyError
        For anything that is not an element symbol; the message quotes it
        and suggests the correctly capitalised symbol when there is one.

    Examples
    --------
    >>> get_element("Fe").name
    'Iron'
    >>> get_element("FE")
    Traceback (most recent call last):
    ...
    KeyError: "unknown element symbol 'FE'; symbols are case-sensitive, did you mean 'Fe'?"
    """
    by_symbol = _snapshot()[1]
    try:
        return by_symbol[symbol]
    except (KeyError, TypeError):
        pass
    message = f"unknown element symbol {symbol!r}"
    if isinstance(symbol, str):
        fixed = symbol.strip().capitalize()
        if fixed != symbol and fixed in by_symbol:
            message += f"; symbols are case-sensitive, did you mean {fixed!r}?"
    raise KeyError(message)


def is_element_symbol(text: str) -> bool:
    """Whether ``text`` is exactly an element symbol (``"Co"`` yes, ``"CO"`` no).

    >>> is_element_symbol("Og"), is_element_symbol("Xx"), is_element_symbol("")
    (True, False, False)
    """
    return isinstance(text, str) and text in _snapshot()[1]


def is_metal(symbol: str) -> bool:
    """Whether ``symbol`` is a metal by mendeleev's series (:attr:`Element.is_metal`);
    False for anything that is not an element symbol. The one metal test of the scorer.

    >>> is_metal("Na"), is_metal("Si"), is_metal("Xx")
    (True, False, False)
    """
    # a set look-up: this runs about a dozen times for every molecule scored
    # (2.7 us a call through the Element record, an eighth of that here)
    try:
        return symbol in _metal_symbols()
    except TypeError:  # an unhashable value is no symbol either
        return False


@once
def _metal_symbols() -> frozenset[str]:
    return frozenset(e.symbol for e in _snapshot()[1].values() if e.is_metal)


def metal_symbols() -> frozenset[str]:
    """Every metal's symbol (:func:`is_metal`), for set tests over a whole composition.

    >>> {"C", "H", "Fe"} & metal_symbols()
    {'Fe'}
    """
    return _metal_symbols()


def element_symbols() -> tuple[str, ...]:
    """Every symbol in the snapshot, in order of atomic number.

    >>> element_symbols()[:4]
    ('H', 'He', 'Li', 'Be')
    """
    return _snapshot()[2]


def snapshot_info() -> dict:
    """The snapshot's ``meta`` block: mendeleev version, fields, units,
    sources, row counts and format version (a copy; editing it changes
    nothing).

    >>> snapshot_info()["counts"]["elements"]
    118
    """
    return copy.deepcopy(_snapshot()[0])
