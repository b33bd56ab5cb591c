"""The molecular melting route for organic molecules written as formulas.

An organic molecule is read from its formula alone (the scorer has no
structure): ``T_m = dH_m / dS_m`` with

* the entropy of melting of Walden's rule with Dannenfelser and Yalkowsky's
  symmetry and flexibility terms
  (:func:`scorer.melting_routes.walden_dannenfelser_yalkowsky_entropy_J_mol_K`),
  the torsions ``tau`` estimated from the formula
  (:func:`formula_torsions_tau`: skeleton atoms, the degree of unsaturation of
  :func:`degree_of_unsaturation`) and the symmetry number from
  :func:`formula_symmetry_number`;
* the heat of melting from the molecule's size, polarisability and
  hydrogen-bonding capacity (:func:`organic_molecular_cohesion_kJ_mol`, weights
  fitted on the calibration half of ``datasets/melting/organic_molecules.csv``).

The inorganic molecular route (one central atom and its ligands,
:func:`scorer.melting_routes.molecular_terms`) reduces a formula by the
greatest common divisor of its counts (Al2Cl6 is AlCl3); a molecular formula
of carbon is the molecule (C6H6 is not CH), so it is never reduced here.
Before this route benzene was read as CH, two atoms, and came out at 63 K.
"""
from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass

from ionicity.scorer.melting_routes import (  # noqa: F401 - hydrogen_bond_sites is part of this module's API
    _polarisability_A3,
    hydrogen_bond_sites,
    walden_dannenfelser_yalkowsky_entropy_J_mol_K,
)

__all__ = [
    "ORGANIC_ELEMENTS",
    "OrganicTerms",
    "degree_of_unsaturation",
    "formula_symmetry_number",
    "formula_torsions_tau",
    "hydrogen_bond_sites",
    "is_organic_molecule",
    "organic_molecular_cohesion_kJ_mol",
    "organic_terms",
]

#: elements an organic molecule of this route may hold, with their usual valence (common practice)
ORGANIC_ELEMENTS: dict[str, int] = {
    "H": 1, "B": 3, "C": 4, "N": 3, "O": 2, "F": 1, "Si": 4, "P": 3, "S": 2, "Cl": 1, "Se": 2, "Br": 1, "I": 1,
}
_HALOGENS = frozenset({"F", "Cl", "Br", "I"})
_PERIPHERAL = _HALOGENS | {"H"}


def is_organic_molecule(counts: Mapping[str, float]) -> bool:
    """Whether a composition takes the organic molecular route.

    Carbon, only the elements of :data:`ORGANIC_ELEMENTS`, and either
    hydrogen or two or more carbon atoms: CCl4, CO2, COCl2, CF4 (one carbon
    centre, no hydrogen) stay with the inorganic molecular route, which reads
    them as a centre with its ligands.

    >>> is_organic_molecule({"C": 6, "H": 6}), is_organic_molecule({"C": 6, "Cl": 6})
    (True, True)
    >>> is_organic_molecule({"C": 1, "Cl": 4}), is_organic_molecule({"C": 5, "Fe": 1, "O": 5})
    (False, False)
    """
    present = {s for s, n in counts.items() if n > 0}
    return ("C" in present and present <= ORGANIC_ELEMENTS.keys()
            and ("H" in present or counts.get("C", 0) >= 2))


def degree_of_unsaturation(counts: Mapping[str, float]) -> float:
    """Rings plus pi bonds of a molecule from its formula: ``U = 1 + sum_i n_i (v_i - 2) / 2``.

    ``v_i`` the usual valence of element ``i`` (:data:`ORGANIC_ELEMENTS`: C and
    Si 4; N, P, B 3; O, S, Se 2; H and halogens 1): the familiar
    ``C - (H + X)/2 + N/2 + 1``. Never below 0.

    References
    ----------
    D. L. Pavia, G. M. Lampman, G. S. Kriz, Introduction to Spectroscopy, 3rd ed.,
    2001, ch. 1 (the index of hydrogen deficiency; from memory): benzene C6H6 4
    (one ring, three double bonds), C4H8O 1.

    Examples
    --------
    >>> degree_of_unsaturation({"C": 6, "H": 6}), degree_of_unsaturation({"C": 4, "H": 8, "O": 1})
    (4.0, 1.0)
    >>> degree_of_unsaturation({"C": 5, "H": 5, "N": 1})
    4.0
    """
    total = 1.0 + sum(n * (ORGANIC_ELEMENTS.get(s, ORGANOMETALLIC_VALENCE.get(s, 2)) - 2) / 2.0
                      for s, n in counts.items())
    return max(total, 0.0)


def formula_torsions_tau(counts: Mapping[str, float], rigid_atoms_per_unsaturation: float) -> float:
    """Dannenfelser and Yalkowsky's torsion count ``tau`` estimated from a formula.

    Dannenfelser and Yalkowsky count ``tau = SP3 + 0.5 SP2 + 0.5 RING - 1``
    (at least 0) from a structure: non-terminal, non-ring sp3 and sp2 atoms
    and fused-ring systems. From a formula: the skeleton is every atom other
    than hydrogen and the halogens (``S``); ``k U`` of them are held in rings
    and double bonds (``U`` the :func:`degree_of_unsaturation`, ``k`` the
    weight ``organic_rigid_atoms_per_unsaturation``, chosen on the calibration
    half); the rest form chains with two ends, or one end where a ring or
    double bond carries the chain; a rigid part adds 0.5 as one ring system:

    ``tau = max(S - k U - ends + 0.5 [k U > 0] - 1, 0)``.

    References
    ----------
    R. M. Dannenfelser and S. H. Yalkowsky, Ind. Eng. Chem. Res. 1996, 35,
    1483-1486 (from memory): n-octane, SP3 6 (the six inner CH2), tau = 5.

    Examples
    --------
    n-octane C8H18 (U = 0, two ends) gives Dannenfelser and Yalkowsky's 5.
    Benzene gets 0.5 where its true count is 0: with ``k = 1`` four of its six
    ring atoms count as rigid (``k = 1.5`` would hold all six, but the
    calibration half prefers 1 over the whole set, where one ring or double
    bond rarely holds more than one or two chain atoms):

    >>> formula_torsions_tau({"C": 8, "H": 18}, 1.0), formula_torsions_tau({"C": 6, "H": 6}, 1.0)
    (5.0, 0.5)
    """
    skeleton = sum(n for s, n in counts.items() if s not in _PERIPHERAL)
    rigid = min(skeleton, rigid_atoms_per_unsaturation * degree_of_unsaturation(counts))
    ends = 1.0 if rigid > 0 else 2.0
    chain_inner = max(skeleton - rigid - ends, 0.0)
    return max(chain_inner + (0.5 if rigid > 0 else 0.0) - 1.0, 0.0)


def formula_symmetry_number(counts: Mapping[str, float], uniform_symmetry_number: float) -> float:
    """Rotational symmetry number ``sigma`` of an organic molecule as far as its formula says.

    A molecule of one skeleton element, carbon, and one peripheral element (a
    hydrocarbon or a perhalocarbon: C6H6, C10H8, C6Cl6, n-alkanes) is
    ``uniform`` and takes ``uniform_symmetry_number`` (the weight
    ``organic_uniform_symmetry_number``, chosen on the calibration half; such
    molecules have at least a twofold axis as a rule: benzene 12, naphthalene
    4, n-alkanes 2 in Dannenfelser and Yalkowsky's counts); every other
    formula 1, the formula not telling where its heteroatoms sit.

    >>> formula_symmetry_number({"C": 6, "H": 6}, 2.0), formula_symmetry_number({"C": 2, "H": 6, "O": 1}, 2.0)
    (2.0, 1.0)
    """
    present = {s for s, n in counts.items() if n > 0}
    uniform = len(present) == 2 and "C" in present and bool(present & _PERIPHERAL)
    return float(uniform_symmetry_number) if uniform else 1.0


def organic_molecular_cohesion_kJ_mol(heavy_atoms, polarisability_A3, hydrogen_bond_sites_, weights: Mapping[str, float],
                                      zwitterion: bool = False, acid_groups: float = 0.0):
    """Heat of melting of an organic molecular crystal from size, polarisability and hydrogen bonds [kJ/mol].

    ``dH_m = h_n N_heavy + h_alpha alpha_mol + h_HB n_HB``: a contact share
    per heavy atom (non-hydrogen: the molecule's surface), London dispersion
    growing with the molecule's polarisability volume ``alpha_mol`` (the sum of
    its atoms', angstrom^3) and the hydrogen bonds its O-H and N-H groups make
    (:func:`hydrogen_bond_sites`), which break or loosen on melting. Defined
    here; the weights ``organic_heavy_atom_kJ_mol``,
    ``organic_polarisability_kJ_mol_A3`` and ``organic_hydrogen_bond_kJ_mol``
    are a least-squares fit of ``log10 T_m`` on the calibration
    half of ``datasets/melting/organic_molecules.csv``
    (``python -m ionicity.pipelines.melting_weights``).

    A zwitterion (an amino acid or another inner salt, known from the registry's structure of a named
    compound: :mod:`scorer.data.smiles_groups`) adds ``h_zw`` (``organic_zwitterion_kJ_mol``): its crystal
    is held by the Coulomb attraction of the charged ends of neighbouring molecules as well, and the formula
    route read the amino acids a factor of about 1.3 low (mean log10 error -0.12 on both halves of the
    set; glycine 290 K against 506 K). The weight is fitted on the calibration half of
    ``datasets/melting/zwitterions.csv``, the three above held
    (:func:`ionicity.pipelines.melting_weights.fit_zwitterion_weight`).

    An organic acid read as such (its acid protons H(+) beside a library anion: the carboxylic acids, oxalic
    to stearic, and the sulfonic acids) adds ``h_acid`` (``organic_acid_group_kJ_mol``) per acid group: the
    O-H...O=C pairs of its cyclic dimers or chains are stronger than the alcohols' and amines' hydrogen bonds
    the site weight is fitted on (the formula route read the CRC Handbook's carboxylic acids 0.06 (one group)
    to 0.09 (two) higher in log10 than its other molecules). The weight is fitted on the calibration half of
    ``datasets/melting/organic_acids.csv``, the three above held
    (:func:`ionicity.pipelines.melting_weights.fit_organic_acid_weight`).

    Parameters
    ----------
    heavy_atoms : float
        Atoms other than hydrogen.
    polarisability_A3 : float
        Sum of the atoms' static dipole polarisabilities [angstrom^3].
    hydrogen_bond_sites_ : float
        :func:`hydrogen_bond_sites`.
    weights : mapping
        The three weights above [kJ/mol per atom, per angstrom^3, per site], and with ``zwitterion``
        ``organic_zwitterion_kJ_mol`` [kJ/mol].
    zwitterion : bool, default=False
        Whether the molecule is a zwitterion in the solid.
    acid_groups : float, default=0.0
        Acid groups of an organic acid (its H(+) per molecule in the ion reading); needs
        ``organic_acid_group_kJ_mol`` in ``weights`` when not zero.

    Examples
    --------
    >>> w = {"organic_heavy_atom_kJ_mol": 0.5, "organic_polarisability_kJ_mol_A3": 0.7,
    ...      "organic_hydrogen_bond_kJ_mol": 4.0}
    >>> round(organic_molecular_cohesion_kJ_mol(3, 5.0, 1, w), 6)
    9.0
    >>> round(organic_molecular_cohesion_kJ_mol(3, 5.0, 1, {**w, "organic_zwitterion_kJ_mol": 6.0}, True), 6)
    15.0
    >>> round(organic_molecular_cohesion_kJ_mol(3, 5.0, 1, {**w, "organic_acid_group_kJ_mol": 2.5}, acid_groups=2), 6)
    14.0
    """
    total = (weights["organic_heavy_atom_kJ_mol"] * heavy_atoms
             + weights["organic_polarisability_kJ_mol_A3"] * polarisability_A3
             + weights["organic_hydrogen_bond_kJ_mol"] * hydrogen_bond_sites_)
    if acid_groups:
        total += weights["organic_acid_group_kJ_mol"] * acid_groups
    return total + weights["organic_zwitterion_kJ_mol"] if zwitterion else total


@dataclass(frozen=True)
class OrganicTerms:
    """The inputs of the organic molecular route for one molecule, read from its formula."""

    heavy_atoms: float
    polarisability_A3: float
    hydrogen_bond_sites: float
    unsaturation: float
    symmetry_number: float
    torsions_tau: float
    #: a zwitterion in the solid (the registry's structure of a named amino acid or inner salt)
    zwitterion: bool = False
    #: acid groups of an organic acid read as such (its H(+) per molecule)
    acid_groups: float = 0.0

    def entropy_J_mol_K(self) -> float:
        """Walden's rule with Dannenfelser and Yalkowsky's terms for this molecule [J/(mol K)]."""
        return walden_dannenfelser_yalkowsky_entropy_J_mol_K(self.symmetry_number, self.torsions_tau)

    def cohesion_kJ_mol(self, weights: Mapping[str, float]) -> float:
        """:func:`organic_molecular_cohesion_kJ_mol` of this molecule [kJ/mol]."""
        return organic_molecular_cohesion_kJ_mol(self.heavy_atoms, self.polarisability_A3,
                                                 self.hydrogen_bond_sites, weights, self.zwitterion, self.acid_groups)

    def melting_K(self, weights: Mapping[str, float]) -> float:
        """``T_m = dH_m / dS_m`` [K]."""
        return 1000.0 * self.cohesion_kJ_mol(weights) / self.entropy_J_mol_K()


#: main-group metals bonded to alkyl and aryl groups, with their valence in those molecules (Me4Sn, Et4Pb,
#: Me2Hg, Et2Zn, Me3Al, Ph3Bi; Elschenbroich, Organometallics, 3rd ed., 2006; from memory)
ORGANOMETALLIC_VALENCE: dict[str, int] = {
    "Sn": 4, "Pb": 4, "Ge": 4, "Hg": 2, "Zn": 2, "Cd": 2, "Al": 3, "Ga": 3, "In": 3, "Tl": 3, "As": 3, "Sb": 3,
    "Bi": 3, "Te": 2,
}


def organometallic_counts(counts: Mapping[str, float]) -> bool:
    """Whether a composition is an organic molecule with one main-group metal of
    :data:`ORGANOMETALLIC_VALENCE` (tetraethyllead, trimethylaluminium, diphenylmercury).

    >>> organometallic_counts({"C": 8, "H": 20, "Pb": 1}), organometallic_counts({"C": 2, "H": 3, "Na": 1, "O": 2})
    (True, False)
    """
    metals = [s for s, n in counts.items() if n > 0 and s in ORGANOMETALLIC_VALENCE]
    rest = {s: n for s, n in counts.items() if n > 0 and s not in ORGANOMETALLIC_VALENCE}
    return len(metals) == 1 and counts[metals[0]] <= 2 and "H" in rest and is_organic_molecule(rest)


def organic_terms(composition, weights: Mapping[str, float], organometallic: bool = False,
                  zwitterion: bool = False, acid_groups: float = 0.0,
                  metal_by_groups: bool = False) -> OrganicTerms | None:
    """Read an organic molecule off its composition (``(symbol, count)`` pairs), unreduced.

    None when :func:`is_organic_molecule` says no. ``weights`` gives the two
    structural constants of the formula reading
    (``organic_rigid_atoms_per_unsaturation``, ``organic_uniform_symmetry_number``). ``metal_by_groups``: a
    metal alkoxide or amide written by its groups (:mod:`scorer.alkoxides`, Ti(OC3H7)4; :mod:`scorer.metal_amides`,
    NaN(Si(CH3)3)2), read as the organic molecule it is around its metal, which counts as one more skeleton
    atom; its O and N carry no hydrogen, so it has no hydrogen-bond donor site (the weights are those of the
    organic calibration half, not fitted on these compounds).

    >>> w = {"organic_rigid_atoms_per_unsaturation": 1.0, "organic_uniform_symmetry_number": 2.0}
    >>> t = organic_terms((("C", 10.0), ("H", 8.0)), w)
    >>> t.heavy_atoms, t.unsaturation, t.symmetry_number, t.torsions_tau
    (10.0, 7.0, 2.0, 1.5)
    """
    counts: dict[str, float] = {}
    for symbol, n in composition:
        if n > 0:
            counts[symbol] = counts.get(symbol, 0.0) + float(n)
    if not (is_organic_molecule(counts) or organometallic and organometallic_counts(counts) or metal_by_groups):
        return None
    alpha = math.fsum(n * _polarisability_A3(s) for s, n in counts.items())
    return OrganicTerms(
        heavy_atoms=sum(n for s, n in counts.items() if s != "H"),
        polarisability_A3=alpha,
        hydrogen_bond_sites=0.0 if metal_by_groups else hydrogen_bond_sites(counts),
        unsaturation=degree_of_unsaturation(counts),
        symmetry_number=formula_symmetry_number(counts, weights["organic_uniform_symmetry_number"]),
        torsions_tau=formula_torsions_tau(counts, weights["organic_rigid_atoms_per_unsaturation"]),
        zwitterion=zwitterion,
        acid_groups=float(acid_groups),
    )
