"""Madelung constants by Ewald summation.

A crystal is given as lattice vectors, fractional positions and point
charges; :func:`madelung_constant` sums its Coulomb energy by Ewald's method
(real-space sum with ``erfc``, reciprocal-space sum, self term) and reports it
as a Madelung constant. Nothing is looked up: the built-in prototypes are
geometries, and every constant is computed from them, once per process.

Convention
----------
``E`` is the electrostatic (point-charge) energy of the crystal per formula
unit, ``r0`` the shortest cation-anion distance, ``e`` the elementary charge
and charges ``z_i`` are in units of ``e``. The Madelung constant ``A`` is
defined by

    E = -A * z**2 * e**2 / (4 pi eps0 r0)

where ``z`` is the highest common factor of the ion charges (1 for CaF2 and
Al2O3, 2 for ZnS and TiO2). This is the convention of the classical tables
(Sherman, Chem. Rev. 1932, 11, 93; Johnson and Templeton, J. Chem. Phys.
1962, 36, 3045), which give NaCl 1.74756, CsCl 1.76267, zinc blende 1.63806,
ideal wurtzite 1.64132, fluorite 5.03878, rutile 4.816 and corundum 25.0312.
The last two depend on the structure's free parameters. For the geometries
built in here (rutile: Burdett et al. 1987; corundum: Lewis et al. 1982) the
Ewald sum gives rutile 4.776 and corundum 24.335 referred to the shortest
distance, 4.802 and 25.099 referred to the mean first-shell cation-anion
distance (``reference_distance="mean_first_shell"``); the published corundum
value matches the second reading. Two other normalisations are available
through ``convention``:

``"charge_product"``
    ``E = -M * |z+ z-| e**2 / (4 pi eps0 r0)`` for a binary salt, the form of
    the Born-Lande equation in most textbooks (fluorite 2.51939, rutile
    2.408, corundum 4.1719).
``"reduced"``
    Templeton's reduced constant, ``E = -a * (sum_i n_i z_i**2 / 2) e**2 /
    (4 pi eps0 r0)``, the sum running over the ions of one formula unit (the
    ionic strength ``I`` of the Glasser-Jenkins equations). It varies little
    between structures (NaCl 1.7476, CaF2 1.6796), which is why
    Kapustinskii's structure-free equation works.

The prototypes keep their formal charges (rutile Ti +4, O -2); a structure
with charges of another magnitude gives the same ``"common_factor"`` and
``"reduced"`` constants only if the charges are scaled as a whole.

Examples
--------
>>> round(madelung_constant("rock-salt"), 6)
1.747565
>>> round(madelung_constant("fluorite", convention="charge_product"), 5)
2.51939
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from functools import reduce

import numpy as np
from ionicity.scorer.caching import once, per_input
from ionicity.scorer.tables import table

__all__ = [
    "CrystalStructure",
    "MadelungResult",
    "PROTOTYPES",
    "CONVENTIONS",
    "REFERENCE_DISTANCES",
    "prototype_structure",
    "madelung_constant",
    "madelung_details",
    "ewald_energy_per_cell",
    "ewald_details",
    "prototype_snapshot",
]

CONVENTIONS = ("common_factor", "charge_product", "reduced")
REFERENCE_DISTANCES = ("shortest", "mean_first_shell")

# Convergence target for each of the three Ewald terms, far below the 1e-6
# asked of a Madelung constant, so the sum of the truncation errors is too.
_EWALD_TOLERANCE = 1e-14


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


@dataclass(frozen=True)
class MadelungResult:
    """Everything the Ewald sum of one structure gives.

    Attributes
    ----------
    energy_per_cell : float
        Coulomb energy of one cell in e**2 / (4 pi eps0 * length unit).
    r0 : float
        Shortest cation-anion distance, in the length unit of the lattice.
    r_mean_first_shell : float
        Mean cation-anion distance over each cation's first shell (its
        ``cation_coordination`` nearest anions), averaged over the cations;
        equal to ``r0`` when all first-shell distances are equal.
    formula_units : int
        Formula units per cell (highest common factor of the site counts of
        each species).
    total : float
        ``-energy_per_cell * r0 / formula_units``: the constant with the
        actual charges, per formula unit.
    common_factor : float
        Highest common factor ``z`` of the charges (NaN if they are not
        commensurate).
    charge_product : float
        ``|z+ z-|`` for a structure with one cation and one anion charge,
        else NaN.
    ionic_strength : float
        ``sum n_i z_i**2 / 2`` over one formula unit.
    """

    energy_per_cell: float
    r0: float
    r_mean_first_shell: float
    formula_units: int
    total: float
    common_factor: float
    charge_product: float
    ionic_strength: float

    def constant(self, convention: str = "common_factor", reference_distance: str = "shortest") -> float:
        """The Madelung constant in the given convention (see the module docstring)."""
        if reference_distance == "shortest":
            total = self.total
        elif reference_distance == "mean_first_shell":
            total = self.total * self.r_mean_first_shell / self.r0
        else:
            raise ValueError(
                f"unknown reference_distance {reference_distance!r}; allowed: {', '.join(REFERENCE_DISTANCES)}"
            )
        if convention == "common_factor":
            return total / self.common_factor**2
        if convention == "charge_product":
            return total / self.charge_product
        if convention == "reduced":
            return total / self.ionic_strength
        raise ValueError(f"unknown convention {convention!r}; allowed: {', '.join(CONVENTIONS)}")


def _erfc(x: np.ndarray) -> np.ndarray:
    """Complementary error function of an array (the standard library's
    ``math.erfc`` element by element; scipy's import alone would cost more
    than the whole summation)."""
    return np.fromiter(map(math.erfc, x.ravel()), dtype=float, count=x.size).reshape(x.shape)


def _cartesian(structure: CrystalStructure) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    lattice = np.asarray(structure.lattice, dtype=float)
    frac = np.asarray(structure.fractional_positions, dtype=float) % 1.0
    charges = np.asarray(structure.charges, dtype=float)
    return lattice, frac @ lattice, charges


def _translations(lattice: np.ndarray, cutoff: float) -> np.ndarray:
    """Integer translation vectors n with all |n . lattice| that can fall within ``cutoff``."""
    # The spacing of lattice planes normal to reciprocal vector b_i is 1/|b_i|,
    # so ceil(cutoff*|b_i|) cells in direction i are enough.
    reciprocal = np.linalg.inv(lattice).T
    limits = [int(math.ceil(cutoff * np.linalg.norm(b))) for b in reciprocal]
    axes = [np.arange(-m, m + 1) for m in limits]
    grid = np.stack(np.meshgrid(*axes, indexing="ij"), axis=-1).reshape(-1, 3)
    return grid.astype(float)


def ewald_energy_per_cell(structure: CrystalStructure, *, alpha: float | None = None) -> float:
    """Coulomb energy of one cell of a periodic point-charge crystal (Ewald).

    .. math::

        E = \\tfrac12 \\sum_{i,j,\\mathbf n}{}' q_i q_j \\frac{\\operatorname{erfc}(\\alpha r_{ij\\mathbf n})}{r_{ij\\mathbf n}}
          + \\frac{2\\pi}{V} \\sum_{\\mathbf k \\ne 0} \\frac{e^{-k^2/4\\alpha^2}}{k^2} |S(\\mathbf k)|^2
          - \\frac{\\alpha}{\\sqrt\\pi} \\sum_i q_i^2,
        \\qquad S(\\mathbf k) = \\sum_j q_j e^{i\\mathbf k\\cdot\\mathbf r_j}

    in units of e**2 / (4 pi eps0 * length unit of the lattice). The cell must
    be charge-neutral, so the k = 0 term vanishes (tin-foil boundary).

    Parameters
    ----------
    structure : CrystalStructure
    alpha : float, optional
        Ewald splitting parameter in 1/length; the result must not depend on
        it (a test checks this). Default: ``sqrt(pi) * (N / V**2)**(1/6)``,
        which balances the work of the two sums.

    Returns
    -------
    float
        The energy per cell (negative for a stable ionic arrangement).

    References
    ----------
    P. P. Ewald, Ann. Phys. 1921, 369, 253, doi:10.1002/andp.19213690304.

    Examples
    --------
    Rock salt with a = 2 (r0 = 1) holds 4 NaCl per cell, so the energy is
    -4 times the Madelung constant 1.747565 (Johnson and Templeton 1962):

    >>> s = prototype_structure("rock-salt")
    >>> scaled = CrystalStructure("NaCl a=2", ((2, 0, 0), (0, 2, 0), (0, 0, 2)),
    ...                           s.species, s.fractional_positions, s.charges)
    >>> round(-ewald_energy_per_cell(scaled) / 4, 6)
    1.747565
    """
    lattice, positions, charges = _cartesian(structure)
    volume = abs(float(np.linalg.det(lattice)))
    n_sites = len(charges)
    if alpha is None:
        alpha = math.sqrt(math.pi) * (n_sites / volume**2) ** (1.0 / 6.0)
    log_tol = math.sqrt(-math.log(_EWALD_TOLERANCE))
    real_cutoff = log_tol / alpha
    recip_cutoff = 2.0 * alpha * log_tol

    # Real space: every site pair, every translation within the cutoff plus
    # the largest intra-cell separation.
    diffs = positions[None, :, :] - positions[:, None, :]
    reach = real_cutoff + float(np.max(np.linalg.norm(diffs, axis=-1)))
    shifts = _translations(lattice, reach) @ lattice
    qq = np.broadcast_to(charges[:, None] * charges[None, :], (len(shifts), n_sites, n_sites))
    r = np.linalg.norm(diffs[None, :, :, :] + shifts[:, None, None, :], axis=-1)
    mask = (r > 1e-10) & (r < reach)
    e_real = 0.5 * float(np.sum(qq[mask] * _erfc(alpha * r[mask]) / r[mask]))

    # Reciprocal space.
    reciprocal = 2.0 * math.pi * np.linalg.inv(lattice).T
    ms = _translations(reciprocal, recip_cutoff)
    ks = ms @ reciprocal
    k2 = np.einsum("ij,ij->i", ks, ks)
    keep = (k2 > 1e-20) & (k2 <= recip_cutoff**2)
    ks, k2 = ks[keep], k2[keep]
    phases = ks @ positions.T
    structure_factor = np.exp(1j * phases) @ charges
    e_recip = (2.0 * math.pi / volume) * float(
        np.sum(np.exp(-k2 / (4.0 * alpha**2)) / k2 * np.abs(structure_factor) ** 2)
    )

    e_self = -alpha / math.sqrt(math.pi) * float(np.sum(charges**2))
    return e_real + e_recip + e_self


def _cation_anion_distances(structure: CrystalStructure) -> tuple[float, float]:
    """Shortest cation-anion distance and the mean first-shell distance."""
    lattice, positions, charges = _cartesian(structure)
    cations = positions[charges > 0]
    anions = positions[charges < 0]
    shifts = _translations(lattice, float(np.max(np.linalg.norm(lattice, axis=1)))) @ lattice
    diffs = anions[None, :, None, :] - cations[:, None, None, :] + shifts[None, None, :, :]
    per_cation = np.sort(np.linalg.norm(diffs, axis=-1).reshape(len(cations), -1), axis=1)
    shortest = float(per_cation[:, 0].min())
    shell = structure.cation_coordination
    if shell is None:
        # Without a stated coordination, the first shell is every anion within
        # 20 % of the shortest distance (common practice for distorted polyhedra).
        shell_means = [row[row <= 1.2 * shortest].mean() for row in per_cation]
    else:
        shell_means = per_cation[:, :shell].mean(axis=1)
    return shortest, float(np.mean(shell_means))


def _formula_units(species: tuple[str, ...]) -> int:
    counts = {}
    for label in species:
        counts[label] = counts.get(label, 0) + 1
    return reduce(math.gcd, counts.values())


def _common_factor(charges: tuple[float, ...]) -> float:
    """Highest common factor of integer charges; NaN for non-integer ones."""
    rounded = [round(abs(q)) for q in charges if q != 0]
    if any(abs(abs(q) - r) > 1e-9 for q, r in zip((q for q in charges if q != 0), rounded)):
        return math.nan
    return float(reduce(math.gcd, rounded))


@per_input(maxsize=256)
def madelung_details(structure: CrystalStructure | str) -> MadelungResult:
    """Ewald-sum a structure and return every form of its Madelung constant.

    Parameters
    ----------
    structure : CrystalStructure or str
        A structure, or the name of a built-in prototype (see
        :data:`PROTOTYPES`).

    Returns
    -------
    MadelungResult
        Cached: each distinct structure is summed once per process.

    See Also
    --------
    madelung_constant : the constant alone, in one convention.
    """
    if isinstance(structure, str):
        snapshot = prototype_snapshot().get(_canonical_prototype_name(structure))
        if snapshot is not None:
            return snapshot
        structure = prototype_structure(structure)
    return ewald_details(structure)


def ewald_details(structure: CrystalStructure) -> MadelungResult:
    """:func:`madelung_details` computed now by the Ewald sum, never read
    from the prototype snapshot (which this function builds and checks)."""
    energy = ewald_energy_per_cell(structure)
    r0, r_shell = _cation_anion_distances(structure)
    z_units = _formula_units(structure.species)
    total = -energy * r0 / z_units
    cation_charges = {q for q in structure.charges if q > 0}
    anion_charges = {q for q in structure.charges if q < 0}
    if len(cation_charges) == 1 and len(anion_charges) == 1:
        charge_product = abs(next(iter(cation_charges)) * next(iter(anion_charges)))
    else:
        charge_product = math.nan
    ionic_strength = 0.5 * sum(q * q for q in structure.charges) / z_units
    return MadelungResult(
        energy_per_cell=energy,
        r0=r0,
        r_mean_first_shell=r_shell,
        formula_units=z_units,
        total=total,
        common_factor=_common_factor(structure.charges),
        charge_product=charge_product,
        ionic_strength=ionic_strength,
    )


def madelung_constant(
    structure: CrystalStructure | str,
    *,
    convention: str = "common_factor",
    reference_distance: str = "shortest",
) -> float:
    """The Madelung constant of a structure, computed by Ewald summation.

    Parameters
    ----------
    structure : CrystalStructure or str
        A :class:`CrystalStructure`, or a prototype name: ``"rock-salt"``,
        ``"caesium-chloride"``, ``"zinc-blende"``, ``"wurtzite"``,
        ``"fluorite"``, ``"anti-fluorite"``, ``"rutile"``, ``"corundum"``.
    convention : {"common_factor", "charge_product", "reduced"}, default="common_factor"
        Which normalisation (module docstring). All refer the energy to one
        formula unit.
    reference_distance : {"shortest", "mean_first_shell"}, default="shortest"
        The distance the constant is referred to: the shortest cation-anion
        distance ``r0`` (the tables' convention), or the mean distance of a
        cation's first shell. They differ only where the coordination
        polyhedron is distorted (rutile 0.5 %, corundum 3 %); the second
        is the one to pair with a sum of ionic radii, which estimates a mean
        bond length.

    Returns
    -------
    float
        Converged to better than 1e-6; the Ewald sum runs once per structure
        per process (cached).

    Raises
    ------
    ValueError
        For an unknown prototype or convention, a charged cell, or
        ``"charge_product"`` on a structure with several cation or anion
        charges.

    References
    ----------
    Q. C. Johnson and D. H. Templeton, J. Chem. Phys. 1962, 36, 3045,
    doi:10.1063/1.1732427 (the convention and reference values).

    Examples
    --------
    Values of Johnson and Templeton (1962):

    >>> round(madelung_constant("caesium-chloride"), 5)
    1.76267
    >>> round(madelung_constant("zinc-blende"), 5)
    1.63806
    """
    if convention not in CONVENTIONS:
        raise ValueError(f"unknown convention {convention!r}; allowed: {', '.join(CONVENTIONS)}")
    if reference_distance not in REFERENCE_DISTANCES:
        raise ValueError(
            f"unknown reference_distance {reference_distance!r}; allowed: {', '.join(REFERENCE_DISTANCES)}"
        )
    result = madelung_details(structure)
    value = result.constant(convention, reference_distance)
    if math.isnan(value):
        raise ValueError(
            f"convention {convention!r} is undefined for this structure "
            "(several cation or anion charges, or incommensurate charges); use 'reduced'"
        )
    return value


# --- Prototypes --------------------------------------------------------------

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
    key = _canonical_prototype_name(name)
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


PROTOTYPE_SNAPSHOT_FILE = "madelung_prototypes.csv"
_SNAPSHOT_FIELDS = (
    "energy_per_cell", "r0", "r_mean_first_shell", "formula_units", "total",
    "common_factor", "charge_product", "ionic_strength",
)


@once
def prototype_snapshot() -> dict[str, MadelungResult]:
    """The Ewald results of the built-in prototypes, as
    ``scorer/data/build_madelung.py`` wrote them: every scoring process needs
    them, and summing them again in each took about 0.1 s (corundum most).
    ``tests/test_madelung.py`` sums them afresh and compares."""
    out = {}
    for row in table(PROTOTYPE_SNAPSHOT_FILE):
        values = {f: (int(row[f]) if f == "formula_units" else float(row[f])) for f in _SNAPSHOT_FIELDS}
        out[row["prototype"]] = MadelungResult(**values)
    return out


def _canonical_prototype_name(name: str) -> str | None:
    if not isinstance(name, str):
        return None
    key = name.strip().lower().replace("_", "-").replace(" ", "-")
    key = _ALIASES.get(key, key)
    return key if key in _BUILDERS else None
