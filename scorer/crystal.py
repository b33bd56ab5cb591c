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

__all__ = [
    "CrystalStructure", "PROTOTYPES", "CRYSTAL_SYSTEMS", "prototype_structure", "canonical_prototype_name",
    "with_cell",
]


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


def _monoclinic(a: float, b: float, c: float, beta_deg: float):
    beta = math.radians(beta_deg)
    return ((a, 0.0, 0.0), (0.0, b, 0.0), (c * math.cos(beta), 0.0, c * math.sin(beta)))


def _orthorhombic(a: float, b: float, c: float):
    return ((a, 0.0, 0.0), (0.0, b, 0.0), (0.0, 0.0, c))


def _centred(orbit, translations):
    return tuple(p for t in translations for p in _shift(orbit, t))


def _cuprite() -> CrystalStructure:
    o = ((0.0, 0.0, 0.0), (0.5, 0.5, 0.5))
    cu = ((0.25, 0.25, 0.25), (0.75, 0.75, 0.25), (0.75, 0.25, 0.75), (0.25, 0.75, 0.75))
    return CrystalStructure(
        "cuprite", _cubic(4.2696), ("Cu",) * 4 + ("O",) * 2, cu + o, (1.0,) * 4 + (-2.0,) * 2,
        2, 4, "Pn-3m, O 2a (0,0,0), Cu 4b (1/4,1/4,1/4); no free parameter. a = 4.2696 A for Cu2O "
        "(Wyckoff, Crystal Structures, 1963, from memory)",
    )


def _cadmium_iodide() -> CrystalStructure:
    a, c, z = 4.24, 6.84, 0.25
    return CrystalStructure(
        "cadmium-iodide", _hexagonal(a, c), ("Cd", "I", "I"),
        ((0.0, 0.0, 0.0), (1 / 3, 2 / 3, z), (2 / 3, 1 / 3, -z % 1.0)), (2.0, -1.0, -1.0),
        6, 3, "P-3m1, Cd 1a (0,0,0), I 2d (1/3,2/3,z); CdI2: a = 4.24 A, c = 6.84 A, z = 1/4 "
        "(Wyckoff 1963, from memory)",
    )


def _cadmium_chloride() -> CrystalStructure:
    a, c, z = 3.846, 17.49, 0.25
    centring = ((0.0, 0.0, 0.0), (2 / 3, 1 / 3, 1 / 3), (1 / 3, 2 / 3, 2 / 3))
    cd = _centred(((0.0, 0.0, 0.0),), centring)
    cl = _centred(((0.0, 0.0, z), (0.0, 0.0, -z)), centring)
    return CrystalStructure(
        "cadmium-chloride", _hexagonal(a, c), ("Cd",) * 3 + ("Cl",) * 6, cd + cl, (2.0,) * 3 + (-1.0,) * 6,
        6, 3, "R-3m (hexagonal axes), Cd 3a (0,0,0), Cl 6c (0,0,z); CdCl2: a = 3.846 A, c = 17.49 A, "
        "z = 1/4 (Wyckoff 1963, from memory)",
    )


def _perovskite() -> CrystalStructure:
    return CrystalStructure(
        "perovskite", _cubic(3.905), ("Sr", "Ti", "O", "O", "O"),
        ((0.5, 0.5, 0.5), (0.0, 0.0, 0.0), (0.5, 0.0, 0.0), (0.0, 0.5, 0.0), (0.0, 0.0, 0.5)),
        (2.0, 4.0, -2.0, -2.0, -2.0),
        None, 6, "Pm-3m, Sr 1b (1/2,1/2,1/2), Ti 1a (0,0,0), O 3d (1/2,0,0); no free parameter. "
        "a = 3.905 A for SrTiO3 (Wyckoff 1963, from memory); CaTiO3 is an orthorhombic distortion of it",
    )


def _spinel() -> CrystalStructure:
    # Origin choice 1 of Fd-3m (origin at -43m on the tetrahedral site).
    a, u = 8.0832, 0.3872
    fcc = _FCC
    mg = _centred(((0.0, 0.0, 0.0), (0.25, 0.25, 0.25)), fcc)
    al = _centred(((0.625, 0.625, 0.625), (0.625, 0.875, 0.875), (0.875, 0.625, 0.875), (0.875, 0.875, 0.625)), fcc)
    v = 0.25 - u
    o_orbit = (
        (u, u, u), (u, -u, -u), (-u, u, -u), (-u, -u, u),
        (v, v, v), (v, 0.25 + u, 0.25 + u), (0.25 + u, v, 0.25 + u), (0.25 + u, 0.25 + u, v),
    )
    o = _centred(o_orbit, fcc)
    return CrystalStructure(
        "spinel", _cubic(a), ("Mg",) * len(mg) + ("Al",) * len(al) + ("O",) * len(o), mg + al + o,
        (2.0,) * len(mg) + (3.0,) * len(al) + (-2.0,) * len(o),
        None, 4, "Fd-3m (origin choice 1), Mg 8a (0,0,0), Al 16d (5/8,5/8,5/8), O 32e (u,u,u); MgAl2O4: "
        "a = 8.0832 A, u = 0.3872 (Wyckoff 1963, from memory)",
    )


def _tenorite() -> CrystalStructure:
    a, b, c, beta, y = 4.6837, 3.4226, 5.1288, 99.54, 0.4184
    centring = ((0.0, 0.0, 0.0), (0.5, 0.5, 0.0))
    cu = _centred(((0.25, 0.25, 0.0), (0.75, 0.25, 0.5)), centring)
    o = _centred(((0.0, y, 0.25), (0.0, -y % 1.0, 0.75)), centring)
    return CrystalStructure(
        "tenorite", _monoclinic(a, b, c, beta), ("Cu",) * 4 + ("O",) * 4, cu + o, (2.0,) * 4 + (-2.0,) * 4,
        4, 4, "C2/c, Cu 4c (1/4,1/4,0), O 4e (0,y,1/4); CuO: a = 4.6837 A, b = 3.4226 A, c = 5.1288 A, "
        "beta = 99.54 deg, y = 0.4184 (Asbrink and Norrby, Acta Cryst. B 1970, 26, 8, from memory)",
    )


def _litharge() -> CrystalStructure:
    a, c, z = 3.9744, 5.0220, 0.2385
    o = ((0.75, 0.25, 0.0), (0.25, 0.75, 0.0))
    pb = ((0.25, 0.25, z), (0.75, 0.75, -z % 1.0))
    return CrystalStructure(
        "litharge", _tetragonal(a, c), ("Pb", "Pb", "O", "O"), pb + o, (2.0, 2.0, -2.0, -2.0),
        4, 4, "P4/nmm (origin choice 2), O 2a (3/4,1/4,0), Pb 2c (1/4,1/4,z); alpha-PbO: a = 3.9744 A, "
        "c = 5.0220 A, z = 0.2385 (Leciejewicz, Acta Cryst. 1961, 14, 1304, from memory)",
    )


def _cotunnite() -> CrystalStructure:
    a, b, c = 7.6222, 4.5348, 9.0448
    sites = (("Pb", 2.0, 0.2621, 0.0954), ("Cl", -1.0, 0.8615, 0.0741), ("Cl", -1.0, 0.9760, 0.6627))
    species, positions, charges = [], [], []
    for label, q, x, z in sites:
        # Pnma, Wyckoff 4c: (x,1/4,z), (-x+1/2,3/4,z+1/2), (-x,3/4,-z), (x+1/2,1/4,-z+1/2).
        for p in ((x, 0.25, z), (0.5 - x, 0.75, z + 0.5), (-x, 0.75, -z), (x + 0.5, 0.25, 0.5 - z)):
            species.append(label)
            positions.append(tuple(t % 1.0 for t in p))
            charges.append(q)
    return CrystalStructure(
        "cotunnite", _orthorhombic(a, b, c), tuple(species), tuple(positions), tuple(charges),
        9, None, "Pnma, Pb, Cl1, Cl2 on 4c (x,1/4,z); PbCl2: a = 7.6222 A, b = 4.5348 A, c = 9.0448 A, "
        "Pb (0.2621, 0.0954), Cl1 (0.8615, 0.0741), Cl2 (0.9760, 0.6627) (Sass, Brackett, Brackett, "
        "J. Phys. Chem. 1963, 67, 2863, from memory)",
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
    "cuprite": _cuprite,
    "cadmium-iodide": _cadmium_iodide,
    "cadmium-chloride": _cadmium_chloride,
    "perovskite": _perovskite,
    "spinel": _spinel,
    "tenorite": _tenorite,
    "litharge": _litharge,
    "cotunnite": _cotunnite,
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
    "cdi2": "cadmium-iodide",
    "cdcl2": "cadmium-chloride",
    "pbcl2": "cotunnite",
}


def canonical_prototype_name(name: str) -> str | None:
    if not isinstance(name, str):
        return None
    key = name.strip().lower().replace("_", "-").replace(" ", "-")
    key = _ALIASES.get(key, key)
    return key if key in _BUILDERS else None


CRYSTAL_SYSTEMS: dict[str, str] = {
    "rock-salt": "cubic", "caesium-chloride": "cubic", "zinc-blende": "cubic", "wurtzite": "hexagonal",
    "fluorite": "cubic", "anti-fluorite": "cubic", "rutile": "tetragonal", "corundum": "hexagonal",
    "cuprite": "cubic", "cadmium-iodide": "hexagonal", "cadmium-chloride": "hexagonal", "perovskite": "cubic",
    "spinel": "cubic", "tenorite": "monoclinic", "litharge": "tetragonal", "cotunnite": "orthorhombic",
}
"""The crystal system of each prototype: which lattice parameters a measured cell needs
(cubic a; tetragonal and hexagonal a, c; orthorhombic a, b, c; monoclinic a, b, c, beta)."""


def with_cell(name: str, a: float, b: float | None = None, c: float | None = None,
              beta_deg: float | None = None) -> CrystalStructure:
    """A prototype's sites in another cell of the same crystal system.

    The fractional coordinates (and free parameters) stay the prototype's; the
    lattice takes the given parameters, in any length unit. Used to turn a
    measured cell into a volume and a first-shell distance.

    Raises
    ------
    ValueError
        When a parameter the crystal system needs is missing.

    Examples
    --------
    >>> s = with_cell("rock-salt", 5.6402)
    >>> s.lattice[0][0], s.species[:2]
    (5.6402, ('Na', 'Na'))
    """
    proto = prototype_structure(name)
    system = CRYSTAL_SYSTEMS[canonical_prototype_name(name)]
    needs = {"cubic": (), "tetragonal": (c,), "hexagonal": (c,), "orthorhombic": (b, c),
             "monoclinic": (b, c, beta_deg)}[system]
    if any(x is None for x in needs):
        raise ValueError(f"a {system} cell ({name}) needs more lattice parameters than were given")
    lattice = {
        "cubic": lambda: _cubic(a),
        "tetragonal": lambda: _tetragonal(a, c),
        "hexagonal": lambda: _hexagonal(a, c),
        "orthorhombic": lambda: _orthorhombic(a, b, c),
        "monoclinic": lambda: _monoclinic(a, b, c, beta_deg),
    }[system]()
    return CrystalStructure(
        proto.name, lattice, proto.species, proto.fractional_positions, proto.charges,
        proto.cation_coordination, proto.anion_coordination, proto.source,
    )
