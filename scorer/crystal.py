"""Crystal structures as periodic point charges, and the built-in structure prototypes.

:class:`CrystalStructure` is what :mod:`scorer.madelung` sums; the
prototypes (rock salt, caesium chloride, zinc blende, wurtzite, fluorite,
anti-fluorite, rutile, corundum) are built here from their published
geometries, each with its source.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from ionicity.scorer.caching import once

__all__ = ["CrystalStructure", "PROTOTYPES", "prototype_structure", "canonical_prototype_name"]


@dataclass(frozen=True)
class CrystalStructure:
    """A periodic arrangement of point charges.

    Parameters
    ----------
    name : str
        A label; prototypes use the structure-type name (``"rock-salt"``).
    lattice : tuple of 3 tuples of 3 floats
        The lattice vectors as rows, in angstrom (any length unit works; the
        Madelung constant does not depend on it).
    species : tuple of str
        One label per site (``"Na"``, ``"Cl"``); sites with the same label
        count as one kind of ion when the formula unit is found.
    fractional_positions : tuple of tuples of 3 floats
        Site positions in fractions of the lattice vectors.
    charges : tuple of float
        Charge of each site in units of e; they must sum to zero.
    cation_coordination, anion_coordination : int or None
        Coordination numbers, used to pick ionic radii for ``r0``.
    source : str
        Where the geometry comes from.
    """

    name: str
    lattice: tuple[tuple[float, float, float], ...]
    species: tuple[str, ...]
    fractional_positions: tuple[tuple[float, float, float], ...]
    charges: tuple[float, ...]
    cation_coordination: int | None = None
    anion_coordination: int | None = None
    source: str = ""

    def __post_init__(self) -> None:
        # Lists and arrays are accepted but stored as tuples, so structures
        # stay hashable (the Ewald results are cached per structure).
        object.__setattr__(self, "lattice", tuple(tuple(float(x) for x in v) for v in self.lattice))
        object.__setattr__(self, "species", tuple(str(s) for s in self.species))
        object.__setattr__(
            self, "fractional_positions", tuple(tuple(float(x) for x in p) for p in self.fractional_positions)
        )
        object.__setattr__(self, "charges", tuple(float(q) for q in self.charges))
        n = len(self.species)
        if len(self.lattice) != 3 or any(len(v) != 3 for v in self.lattice):
            raise ValueError("lattice must be three vectors of three components (rows)")
        if len(self.fractional_positions) != n or len(self.charges) != n:
            raise ValueError(
                f"species ({n}), fractional_positions ({len(self.fractional_positions)}) and "
                f"charges ({len(self.charges)}) must have the same length"
            )
        if n == 0:
            raise ValueError("a structure needs at least one cation and one anion")
        if abs(sum(self.charges)) > 1e-9 * max(1.0, sum(abs(q) for q in self.charges)):
            raise ValueError(f"the cell is not charge-neutral (net charge {sum(self.charges):+g}); Ewald sums need a neutral cell")
        if not any(q > 0 for q in self.charges) or not any(q < 0 for q in self.charges):
            raise ValueError("a structure needs at least one positive and one negative site")
        if abs(np.linalg.det(np.asarray(self.lattice, dtype=float))) < 1e-12:
            raise ValueError("the lattice vectors are linearly dependent (zero cell volume)")


_FCC = ((0.0, 0.0, 0.0), (0.0, 0.5, 0.5), (0.5, 0.0, 0.5), (0.5, 0.5, 0.0))


def _shift(points, by):
    return tuple(tuple((p[i] + by[i]) % 1.0 for i in range(3)) for p in points)


def _cubic(a: float):
    return ((a, 0.0, 0.0), (0.0, a, 0.0), (0.0, 0.0, a))


def _hexagonal(a: float, c: float):
    return ((a, 0.0, 0.0), (-a / 2.0, a * math.sqrt(3.0) / 2.0, 0.0), (0.0, 0.0, c))


def _tetragonal(a: float, c: float):
    return ((a, 0.0, 0.0), (0.0, a, 0.0), (0.0, 0.0, c))


def _rock_salt() -> CrystalStructure:
    cations = _FCC
    anions = _shift(_FCC, (0.5, 0.0, 0.0))
    return CrystalStructure(
        "rock-salt", _cubic(5.6402), ("Na",) * 4 + ("Cl",) * 4, cations + anions, (1.0,) * 4 + (-1.0,) * 4,
        6, 6, "Fm-3m, Na 4a (0,0,0), Cl 4b (1/2,1/2,1/2); no free parameter. a = 5.6402 A for NaCl (Wyckoff, Crystal Structures, 1963)",
    )


def _caesium_chloride() -> CrystalStructure:
    return CrystalStructure(
        "caesium-chloride", _cubic(4.123), ("Cs", "Cl"), ((0.0, 0.0, 0.0), (0.5, 0.5, 0.5)), (1.0, -1.0),
        8, 8, "Pm-3m, Cs 1a (0,0,0), Cl 1b (1/2,1/2,1/2); no free parameter. a = 4.123 A for CsCl (Wyckoff 1963)",
    )


def _zinc_blende() -> CrystalStructure:
    cations = _FCC
    anions = _shift(_FCC, (0.25, 0.25, 0.25))
    return CrystalStructure(
        "zinc-blende", _cubic(5.409), ("Zn",) * 4 + ("S",) * 4, cations + anions, (2.0,) * 4 + (-2.0,) * 4,
        4, 4, "F-43m, Zn 4a (0,0,0), S 4c (1/4,1/4,1/4); no free parameter. a = 5.409 A for ZnS (Wyckoff 1963)",
    )


def _wurtzite() -> CrystalStructure:
    # Ideal wurtzite: c/a = sqrt(8/3) and u = 3/8 make every tetrahedron
    # regular, the geometry that the published constant 1.64132 refers to.
    a = 3.8227
    c = a * math.sqrt(8.0 / 3.0)
    u = 3.0 / 8.0
    positions = ((1 / 3, 2 / 3, 0.0), (2 / 3, 1 / 3, 0.5), (1 / 3, 2 / 3, u), (2 / 3, 1 / 3, 0.5 + u))
    return CrystalStructure(
        "wurtzite", _hexagonal(a, c), ("Zn", "Zn", "S", "S"), positions, (2.0, 2.0, -2.0, -2.0),
        4, 4, "P6_3mc, Zn 2b (1/3,2/3,0), S 2b (1/3,2/3,u); ideal geometry c/a = sqrt(8/3), u = 3/8 "
        "(a = 3.8227 A, ZnS; Wyckoff 1963)",
    )


def _fluorite(anti: bool = False) -> CrystalStructure:
    cations = _FCC
    anions = _shift(_FCC, (0.25, 0.25, 0.25)) + _shift(_FCC, (0.75, 0.75, 0.75))
    if not anti:
        return CrystalStructure(
            "fluorite", _cubic(5.4626), ("Ca",) * 4 + ("F",) * 8, cations + anions, (2.0,) * 4 + (-1.0,) * 8,
            8, 4, "Fm-3m, Ca 4a (0,0,0), F 8c (1/4,1/4,1/4); no free parameter. a = 5.4626 A for CaF2 (Wyckoff 1963)",
        )
    return CrystalStructure(
        "anti-fluorite", _cubic(4.611), ("O",) * 4 + ("Li",) * 8, cations + anions, (-2.0,) * 4 + (1.0,) * 8,
        4, 8, "Fm-3m, O 4a (0,0,0), Li 8c (1/4,1/4,1/4): fluorite with cation and anion sites exchanged; "
        "no free parameter. a = 4.611 A for Li2O (Wyckoff 1963)",
    )


def _rutile() -> CrystalStructure:
    a, c, u = 4.5937, 2.9587, 0.30478
    ti = ((0.0, 0.0, 0.0), (0.5, 0.5, 0.5))
    o = ((u, u, 0.0), (1 - u, 1 - u, 0.0), (0.5 + u, 0.5 - u, 0.5), (0.5 - u, 0.5 + u, 0.5))
    return CrystalStructure(
        "rutile", _tetragonal(a, c), ("Ti", "Ti", "O", "O", "O", "O"), ti + o, (4.0, 4.0, -2.0, -2.0, -2.0, -2.0),
        6, 3, "P4_2/mnm, Ti 2a (0,0,0), O 4f (u,u,0); TiO2 at 295 K: a = 4.5937 A, c = 2.9587 A, u = 0.30478 "
        "(Burdett, Hughbanks, Miller, Richardson, Smith, J. Am. Chem. Soc. 1987, 109, 3639, from memory)",
    )


def _corundum() -> CrystalStructure:
    a, c = 4.7589, 12.991
    z, x = 0.35216, 0.30624
    centring = ((0.0, 0.0, 0.0), (2 / 3, 1 / 3, 1 / 3), (1 / 3, 2 / 3, 2 / 3))
    # International Tables, space group 167 (R-3c), hexagonal axes:
    # 12c (0,0,z), (0,0,-z+1/2), (0,0,-z), (0,0,z+1/2);
    # 18e (x,0,1/4), (0,x,1/4), (-x,-x,1/4), (-x,0,3/4), (0,-x,3/4), (x,x,3/4).
    al_orbit = ((0, 0, z), (0, 0, 0.5 - z), (0, 0, -z), (0, 0, 0.5 + z))
    o_orbit = ((x, 0, 0.25), (0, x, 0.25), (-x, -x, 0.25), (-x, 0, 0.75), (0, -x, 0.75), (x, x, 0.75))
    al = tuple(p for t in centring for p in _shift(al_orbit, t))
    o = tuple(p for t in centring for p in _shift(o_orbit, t))
    return CrystalStructure(
        "corundum", _hexagonal(a, c), ("Al",) * len(al) + ("O",) * len(o), al + o, (3.0,) * len(al) + (-2.0,) * len(o),
        6, 4, "R-3c (hexagonal axes), Al 12c (0,0,z), O 18e (x,0,1/4); Al2O3: a = 4.7589 A, c = 12.991 A, "
        "z = 0.35216, x = 0.30624 (Lewis, Schwarzenbach, Flack, Acta Cryst. A 1982, 38, 733, from memory)",
    )


_BUILDERS = {
    "rock-salt": _rock_salt,
    "caesium-chloride": _caesium_chloride,
    "zinc-blende": _zinc_blende,
    "wurtzite": _wurtzite,
    "fluorite": _fluorite,
    "anti-fluorite": lambda: _fluorite(anti=True),
    "rutile": _rutile,
    "corundum": _corundum,
}

PROTOTYPES: tuple[str, ...] = tuple(_BUILDERS)


@once
def prototype_structure(name: str) -> CrystalStructure:
    """A built-in structure prototype by name.

    Parameters
    ----------
    name : str
        One of :data:`PROTOTYPES`; ``"sodium-chloride"``, ``"cesium-chloride"``,
        ``"sphalerite"``, ``"antifluorite"`` and underscores are accepted too.

    Returns
    -------
    CrystalStructure
        With its geometry source in ``source``.

    Raises
    ------
    ValueError
        Listing the prototypes, for an unknown name.

    Examples
    --------
    >>> prototype_structure("rutile").cation_coordination
    6
    """
    key = canonical_prototype_name(name)
    if key is None:
        raise ValueError(f"unknown structure prototype {name!r}; allowed: {', '.join(PROTOTYPES)}")
    return _BUILDERS[key]()


_ALIASES = {
    "sodium-chloride": "rock-salt",
    "halite": "rock-salt",
    "nacl": "rock-salt",
    "cesium-chloride": "caesium-chloride",
    "cscl": "caesium-chloride",
    "sphalerite": "zinc-blende",
    "zincblende": "zinc-blende",
    "antifluorite": "anti-fluorite",
}


def canonical_prototype_name(name: str) -> str | None:
    if not isinstance(name, str):
        return None
    key = name.strip().lower().replace("_", "-").replace(" ", "-")
    key = _ALIASES.get(key, key)
    return key if key in _BUILDERS else None
