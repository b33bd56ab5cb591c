"""Liquidus of a salt mixture: the ideal-solution line corrected for ionic melts.

A mixture of salts (or of a salt and a neutral molecule) melts over a range;
its **liquidus** at a composition is the temperature above which it is all
liquid. Each component ``i`` that can crystallise out sets one branch of the
liquidus through the equilibrium of its solid with the melt,

    ln a_i = -(dHfus_i / R) (1/T - 1/Tm_i)            (Schroeder-van Laar)

and the liquidus is the highest branch. How the activity ``a_i`` is written
is the model:

* **ionic melts** (every component a salt): Temkin's ideal ionic solution
  (:func:`temkin_ln_activity`): cations mix on one quasi-lattice, anions on
  the other, so ``a_i`` is the product of the site fractions of its own ions,
  each to the power of its count (Li2CO3 diluted by K2CO3 loses two Li+ per
  formula unit, so its line falls twice as fast as in a molecular solution);
* a **regular-solution** excess on top (:func:`regular_solution_excess_J_mol`,
  interaction parameters lambda per pair, in J/mol): for common-ion pairs of
  the same charge type, a Kleppa-type size-mismatch rule
  (:func:`size_mismatch_lambda_J_mol`: the more the interionic distances of
  the two salts differ, the more negative the enthalpy of mixing, Hersh and
  Kleppa, J. Chem. Phys. 42 (1965) 1309; Reiss, Katz and Kleppa, J. Chem.
  Phys. 36 (1962) 144); for charge-unsymmetric common-ion pairs (MgCl2 with
  an alkali chloride, BeF2 with LiF) a rule in the difference of the cations'
  ionic potentials z/r (:func:`ionic_potential_lambda_J_mol`), standing for
  the complex anions (MgCl4 2-, BeF4 2-) such melts form. Both coefficients
  were set by hand on the calibration set of ``scorer/data/eutectics.csv``
  (``tests/calibrate_liquidus.py`` prints the scan); the validation set was
  not used to choose them;
* **molecular or deep eutectic mixtures** (a neutral component such as urea):
  ideal mole fractions, no excess: the ideal line is the reference, and a
  measured eutectic below it is reported as the depression.

Everything here is a screening estimate: solid solutions, compounds that
crystallise (KMgCl3, Li2BeF4), decomposition and volatility are not modelled.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

__all__ = [
    "GAS_CONSTANT_J_MOL_K", "MeltIon", "MeltComponent", "LiquidusResult",
    "schroeder_van_laar_K", "temkin_ln_activity", "regular_solution_excess_J_mol",
    "size_mismatch_lambda_J_mol", "ionic_potential_lambda_J_mol", "pair_lambda_J_mol",
    "liquidus_K", "minimum_liquidus", "SIZE_MISMATCH_OMEGA_J_A_MOL", "IONIC_POTENTIAL_K_J_A_MOL",
]

GAS_CONSTANT_J_MOL_K = 8.314462618  # CODATA 2018

# Set by hand on the calibration set (LiCl-KCl, LiF-KF, NaNO3-KNO3) of
# scorer/data/eutectics.csv; tests/calibrate_liquidus.py prints the scan.
SIZE_MISMATCH_OMEGA_J_A_MOL = 1.75e5
# Set by hand on the calibration system KCl-MgCl2 of scorer/data/eutectics.csv.
IONIC_POTENTIAL_K_J_A_MOL = 3.0e4


@dataclass(frozen=True)
class MeltIon:
    """One ion of a component: label, count per formula unit, charge, radius (pm)."""

    label: str
    count: float
    charge: int
    radius_pm: float


@dataclass(frozen=True)
class MeltComponent:
    """One component of a melt, with what its liquidus branch needs.

    ``cations`` and ``anions`` are empty for a molecular component (urea):
    a mixture with one is treated as a molecular solution.
    """

    name: str
    melting_point_K: float
    enthalpy_fusion_J_mol: float
    cations: tuple[MeltIon, ...] = ()
    anions: tuple[MeltIon, ...] = ()

    @property
    def ionic(self) -> bool:
        return bool(self.cations and self.anions)


@dataclass(frozen=True)
class LiquidusResult:
    """The liquidus at one composition: temperature, the branch that sets it, how."""

    temperature_K: float
    primary_phase: str
    method: str


def schroeder_van_laar_K(enthalpy_fusion_J_mol, melting_point_K, ln_activity, excess_J_mol=0.0):
    """Liquidus temperature of one component from its activity in the melt (K).

    Schroeder (1893) and van Laar (1903): with a pure solid in equilibrium
    with the melt and dHfus independent of temperature,
    ``ln a = -(dHfus/R)(1/T - 1/Tm)``. Written with a regular-solution excess
    chemical potential ``RT ln gamma = E`` (J/mol, temperature independent)
    it solves for T in closed form::

        T = (dHfus + E) / (dHfus/Tm - R ln x)

    where ``ln x`` is the ideal part of ``ln a``.

    Parameters
    ----------
    enthalpy_fusion_J_mol : float
        Enthalpy of fusion of the pure component [J/mol].
    melting_point_K : float
        Melting point of the pure component [K].
    ln_activity : float
        Natural log of the component's ideal activity in the melt (mole
        fraction, or the Temkin product of ion fractions), <= 0.
    excess_J_mol : float, default=0.0
        Excess chemical potential RT ln gamma [J/mol]; negative lowers the line.

    Returns
    -------
    float
        Liquidus temperature of this component's branch [K].

    References
    ----------
    Prausnitz, Lichtenthaler and de Azevedo, Molecular Thermodynamics of
    Fluid-Phase Equilibria, 3rd ed. (1999), eq. 11-14 (solid-liquid
    equilibrium with a pure solid phase).

    Examples
    --------
    Urea in choline chloride at the 1:2 composition (x_urea = 2/3), ideal:
    the CRC values (Tm 406.5 K, dHfus 13.9 kJ/mol) give about 370 K, the
    ideal reference that the deep eutectic solvent (285 K, Abbott et al.,
    Chem. Commun. 2003, 70) lies far below.

    >>> round(schroeder_van_laar_K(13900.0, 406.5, math.log(2 / 3)), 1)
    370.0
    >>> schroeder_van_laar_K(19800.0, 883.15, 0.0)  # the pure component melts at Tm
    883.15
    """
    denominator = enthalpy_fusion_J_mol / melting_point_K - GAS_CONSTANT_J_MOL_K * ln_activity
    return (enthalpy_fusion_J_mol + excess_J_mol) / denominator


def temkin_ln_activity(component: MeltComponent, cation_fractions: dict, anion_fractions: dict) -> float:
    """ln of a salt's ideal activity in an ionic melt, after Temkin.

    Temkin, Acta Physicochim. URSS 20 (1945) 411: in a molten salt, cations
    mix only with cations and anions only with anions, each ideally, so a
    salt ``C_p A_q`` has ``a = X_C^p X_A^q`` with ``X`` the ion fractions on
    the cation and on the anion sub-lattice (ions counted, not charges).

    Parameters
    ----------
    component : MeltComponent
    cation_fractions, anion_fractions : dict
        Ion label -> fraction among the melt's cations (anions).

    Returns
    -------
    float
        ``sum p ln X_C + sum q ln X_A``.

    Examples
    --------
    Li2CO3 in a 50:50 (mol) melt with K2CO3: X_Li = 1/2, X_CO3 = 1, so
    ln a = 2 ln 1/2 (Temkin's cryoscopic factor 2 for a common-anion salt
    with two cations; Janz, Molten Salts Handbook 1967, cryoscopy).

    >>> li2co3 = MeltComponent("Li2CO3", 1005.15, 44800.0, (MeltIon("Li", 2, 1, 76.0),), (MeltIon("CO3", 1, -2, 178.0),))
    >>> round(temkin_ln_activity(li2co3, {"Li": 0.5, "K": 0.5}, {"CO3": 1.0}) / math.log(0.5), 6)
    2.0
    """
    total = 0.0
    for ion in component.cations:
        total += ion.count * math.log(cation_fractions[ion.label])
    for ion in component.anions:
        total += ion.count * math.log(anion_fractions[ion.label])
    return total


def regular_solution_excess_J_mol(index: int, fractions, lambdas) -> float:
    """Excess chemical potential RT ln gamma_i of component ``index`` (J/mol).

    For ``G^E = sum_{j<k} lambda_jk x_j x_k`` (a regular solution, Hildebrand
    1929), ``mu_i^E = sum_{j != i} lambda_ij x_j - G^E``; for two components
    ``lambda x_2^2``.

    Parameters
    ----------
    index : int
    fractions : sequence of float
        Mole fractions of the components, summing to 1.
    lambdas : dict
        ``(j, k) -> lambda_jk`` [J/mol] for j < k; missing pairs are 0.

    Examples
    --------
    >>> regular_solution_excess_J_mol(0, (0.5, 0.5), {(0, 1): -10000.0})
    -2500.0
    """
    excess_gibbs = sum(lam * fractions[j] * fractions[k] for (j, k), lam in lambdas.items())
    own = sum(lam * fractions[k if j == index else j] for (j, k), lam in lambdas.items() if index in (j, k))
    return own - excess_gibbs


def size_mismatch_lambda_J_mol(distance_1_A: float, distance_2_A: float, omega=SIZE_MISMATCH_OMEGA_J_A_MOL) -> float:
    """Interaction parameter of two common-ion salts of one charge type (J/mol).

    Kleppa's mixing calorimetry of alkali halides and nitrates (Hersh and
    Kleppa, J. Chem. Phys. 42 (1965) 1309; Kleppa and Hersh, J. Chem. Phys.
    34 (1961) 351) found the enthalpy of mixing negative and growing with
    the mismatch of the interionic distances, ``delta = (d1 - d2)/(d1 d2)``
    (conformal ionic solution theory, Reiss, Katz and Kleppa, J. Chem. Phys.
    36 (1962) 144). Here ``lambda = -omega |delta|``, with ``omega`` set by
    hand on the calibration set (a form linear in |delta| fitted the
    calibration set better than delta^2, which over-corrects Li-Cs and Li-K
    fluorides).

    Parameters
    ----------
    distance_1_A, distance_2_A : float
        Cation-anion distance (sum of radii) of each salt [angstrom].
    omega : float
        Coefficient [J angstrom / mol].

    Examples
    --------
    LiCl (0.76 + 1.81 A, Shannon 1976) with KCl (1.38 + 1.81 A): delta =
    0.0756 / A, lambda about -13 kJ/mol (Hersh and Kleppa measured about
    -17.6 kJ/mol for LiCl-KCl, from memory).

    >>> round(size_mismatch_lambda_J_mol(2.57, 3.19) / 1000, 1)
    -13.2
    """
    delta = abs(distance_1_A - distance_2_A) / (distance_1_A * distance_2_A)
    return -omega * delta


def ionic_potential_lambda_J_mol(potential_1_per_A: float, potential_2_per_A: float,
                                 k=IONIC_POTENTIAL_K_J_A_MOL) -> float:
    """Interaction parameter of a charge-unsymmetric common-anion pair (J/mol).

    MgCl2 with alkali chlorides and BeF2 with alkali fluorides mix with large
    negative enthalpies that grow with the difference of the cations' ionic
    potentials z/r: the small doubly charged cation takes the common anion
    into complex anions (MgCl4 2-, BeF4 2-; Maroni, Hathaway and
    Papatheodorou, J. Phys. Chem. 78 (1974) 1134; Kleppa and McCarty,
    J. Phys. Chem. 70 (1966) 1249, from memory). Here ``lambda = -k |z1/r1 - z2/r2|``
    with ``k`` set by hand on the calibration system KCl-MgCl2. Such systems
    often crystallise compounds (KMgCl3, Li2BeF4), which this does not model.

    Parameters
    ----------
    potential_1_per_A, potential_2_per_A : float
        z/r of each salt's cation [1/angstrom].
    k : float
        Coefficient [J angstrom / mol].

    Examples
    --------
    >>> round(ionic_potential_lambda_J_mol(2 / 0.72, 1 / 1.38) / 1000, 1)
    -61.6
    """
    return -k * abs(potential_1_per_A - potential_2_per_A)


def pair_lambda_J_mol(a: MeltComponent, b: MeltComponent, omega=None, k=None) -> tuple[float, str]:
    """The interaction parameter of two components and which rule gave it.

    Common anion (or common cation), one ion of the other kind each: same
    charge -> :func:`size_mismatch_lambda_J_mol`, different charge ->
    :func:`ionic_potential_lambda_J_mol`. Anything else (reciprocal pairs,
    molecular components, several ions): 0, Temkin's ideal ionic solution.
    ``omega`` and ``k`` default to the calibrated module constants (the
    calibration scan passes others).
    """
    omega = SIZE_MISMATCH_OMEGA_J_A_MOL if omega is None else omega
    k = IONIC_POTENTIAL_K_J_A_MOL if k is None else k
    if not (a.ionic and b.ionic):
        return 0.0, "ideal"
    anions_a = {i.label for i in a.anions}
    anions_b = {i.label for i in b.anions}
    cations_a = {i.label for i in a.cations}
    cations_b = {i.label for i in b.cations}
    if anions_a == anions_b and len(a.cations) == 1 and len(b.cations) == 1 and len(a.anions) == 1:
        common, own_a, own_b = a.anions[0], a.cations[0], b.cations[0]
    elif cations_a == cations_b and len(a.anions) == 1 and len(b.anions) == 1 and len(a.cations) == 1:
        common, own_a, own_b = a.cations[0], a.anions[0], b.anions[0]
    else:
        return 0.0, "Temkin ideal (no common ion rule)"
    if own_a.label == own_b.label:
        return 0.0, "ideal (same salt)"
    if abs(own_a.charge) == abs(own_b.charge):
        d_a = (own_a.radius_pm + common.radius_pm) / 100.0
        d_b = (own_b.radius_pm + common.radius_pm) / 100.0
        if not (math.isfinite(d_a) and math.isfinite(d_b)):
            return 0.0, "Temkin ideal (no radius)"
        return size_mismatch_lambda_J_mol(d_a, d_b, omega), "size mismatch"
    p_a = abs(own_a.charge) / (own_a.radius_pm / 100.0)
    p_b = abs(own_b.charge) / (own_b.radius_pm / 100.0)
    if not (math.isfinite(p_a) and math.isfinite(p_b)):
        return 0.0, "Temkin ideal (no radius)"
    return ionic_potential_lambda_J_mol(p_a, p_b, k), "ionic potential"


def _site_fractions(components, fractions, which: str) -> dict:
    totals: dict[str, float] = {}
    for component, x in zip(components, fractions):
        for ion in getattr(component, which):
            totals[ion.label] = totals.get(ion.label, 0.0) + ion.count * x
    whole = sum(totals.values())
    return {label: n / whole for label, n in totals.items()}


def liquidus_K(components: tuple[MeltComponent, ...], fractions, lambdas: dict | None = None) -> LiquidusResult:
    """The estimated liquidus of a mixture at one composition.

    Parameters
    ----------
    components : tuple of MeltComponent
    fractions : sequence of float
        Mole fractions (formula units), summing to 1; zeros allowed.
    lambdas : dict, optional
        ``(j, k) -> lambda`` [J/mol]; default :func:`pair_lambda_J_mol` per pair.

    Returns
    -------
    LiquidusResult

    Examples
    --------
    Urea and choline chloride 2:1, a molecular solution: the ideal line (370 K).

    >>> urea = MeltComponent("urea", 406.5, 13900.0)
    >>> chcl = MeltComponent("[Ch]Cl", 597.0, 4300.0)
    >>> r = liquidus_K((chcl, urea), (1 / 3, 2 / 3))
    >>> round(r.temperature_K), r.primary_phase
    (370, 'urea')
    """
    if lambdas is None:
        lambdas = {
            (j, k): pair_lambda_J_mol(components[j], components[k])[0]
            for j in range(len(components)) for k in range(j + 1, len(components))
        }
    ionic = all(c.ionic for c in components)
    if ionic:
        cations = _site_fractions(components, fractions, "cations")
        anions = _site_fractions(components, fractions, "anions")
        method = "Schroeder-van Laar with Temkin ion fractions and regular-solution lambda"
    else:
        lambdas = {}
        method = "Schroeder-van Laar, ideal molecular solution (deep eutectic reference line)"
    best = LiquidusResult(-math.inf, "", method)
    for index, (component, x) in enumerate(zip(components, fractions)):
        if x <= 0.0:
            continue
        ln_activity = temkin_ln_activity(component, cations, anions) if ionic else math.log(x)
        excess = regular_solution_excess_J_mol(index, fractions, lambdas) if lambdas else 0.0
        temperature = schroeder_van_laar_K(
            component.enthalpy_fusion_J_mol, component.melting_point_K, ln_activity, excess
        )
        if temperature > best.temperature_K:
            best = LiquidusResult(temperature, component.name, method)
    return best


def minimum_liquidus(components: tuple[MeltComponent, ...], step: float = 0.005) -> tuple[tuple[float, ...], LiquidusResult]:
    """The composition of lowest estimated liquidus (the estimated eutectic).

    A grid over the composition simplex (``step`` in mole fraction; two or
    three components), the best point refined on a grid ten times finer
    around it.

    Returns
    -------
    (mole fractions, LiquidusResult)

    Examples
    --------
    >>> a = MeltComponent("A", 1000.0, 20000.0, (MeltIon("A", 1, 1, 100.0),), (MeltIon("X", 1, -1, 180.0),))
    >>> b = MeltComponent("B", 1000.0, 20000.0, (MeltIon("B", 1, 1, 100.0),), (MeltIon("X", 1, -1, 180.0),))
    >>> x, r = minimum_liquidus((a, b))
    >>> x, round(r.temperature_K)
    ((0.5, 0.5), 776)
    """
    n = len(components)
    if n not in (2, 3):
        raise ValueError(f"a minimum liquidus needs two or three components, got {n}")
    lambdas = {
        (j, k): pair_lambda_J_mol(components[j], components[k])[0]
        for j in range(n) for k in range(j + 1, n)
    }

    def grid(centre, width, fine):
        points = []
        count = int(round(width / fine))
        if n == 2:
            for i in range(-count, count + 1):
                x0 = round(centre[0] + i * fine, 10)
                if 0.0 < x0 < 1.0:
                    points.append((x0, round(1.0 - x0, 10)))
        else:
            for i in range(-count, count + 1):
                for j in range(-count, count + 1):
                    x0 = round(centre[0] + i * fine, 10)
                    x1 = round(centre[1] + j * fine, 10)
                    x2 = round(1.0 - x0 - x1, 10)
                    if x0 > 0.0 and x1 > 0.0 and x2 > 0.0:
                        points.append((x0, x1, x2))
        return points

    start = tuple(1.0 / n for _ in range(n))
    best_x, best = start, liquidus_K(components, start, lambdas)
    for x in grid(start, 1.0, step):
        result = liquidus_K(components, x, lambdas)
        if result.temperature_K < best.temperature_K:
            best_x, best = x, result
    for x in grid(best_x, step, step / 10.0):
        result = liquidus_K(components, x, lambdas)
        if result.temperature_K < best.temperature_K:
            best_x, best = x, result
    return best_x, best
