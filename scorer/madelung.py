"""Madelung constants by Ewald summation.

A crystal is given as lattice vectors, fractional positions and point
charges; :func:`madelung_constant` sums its Coulomb energy by Ewald's method
(real-space sum with ``erfc``, reciprocal-space sum, self term) and reports it
as a Madelung constant. Nothing is looked up: the built-in prototypes
(:mod:`scorer.crystal`) are geometries, and every constant is computed from
them (a snapshot of those sums is packaged, see :func:`prototype_snapshot`).

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
from ionicity.scorer.crystal import PROTOTYPES, CrystalStructure, canonical_prototype_name, prototype_structure
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
        # Without a stated coordination, a cation's first shell is every anion
        # within 20 % of its own shortest distance (common practice for distorted
        # polyhedra; per cation, so the large A site of a perovskite keeps its 12).
        shell_means = [row[row <= 1.2 * row[0]].mean() for row in per_cation]
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
        snapshot = prototype_snapshot().get(canonical_prototype_name(structure))
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
