"""Melting routes for compounds that are not salts, and the melting classes of every route.

:mod:`scorer.melting` sends each compound down one route by its
``substance_class`` (:data:`ROUTE_OF_CLASS`) and puts every result on one
scale, ``log10`` of a trend temperature in K, so that rankings across kinds
mean something:

* ``salt``: the ionic index of :mod:`scorer.melting`;
* ``molecular`` (``covalent_molecular``, ``acid``): ``T_m = dH_m / dS_m`` for
  a molecular crystal (:func:`molecular_melting_K`), with the entropy of
  melting from Walden's rule corrected for rotational symmetry and
  flexibility as Dannenfelser and Yalkowsky do
  (:func:`walden_dannenfelser_yalkowsky_entropy_J_mol_K`) and the heat of
  melting from a cohesion term of the molecule's size and polarisability
  and of the halide or oxide bridges that fill its centre's open
  coordination sites in the crystal, each as strong as Pauling's
  electrostatic bond strength ``z / CN`` (:func:`molecular_cohesion_kJ_mol`;
  the coordination number measured where
  ``scorer/data/molecular_coordination.csv`` lists the solid, else the
  pentahalide and radius-ratio rules of :func:`molecular_terms`);
* ``chain_layer`` (``chain_layer_solid``): between the two, a weighted
  geometric mean of the salt and molecular temperatures
  (:func:`chain_layer_index`), the salt's weight from the share of bonds
  that bridge and how far Pauling's rule lets the bridges be ionic
  (:func:`chain_layer_salt_share`: CrO3 1/6, BeCl2 1/2);
* ``element_mixture`` (``covalent_network``, ``semiconductor``, ``metallic``,
  ``intermetallic``, ``zintl_phase``, ``element``): the stated rule of
  :func:`element_mixture_melting_K`, the atom-fraction weighted mean of the
  melting points of the elements that are solids at room temperature (for an
  ``intermetallic`` raised by the variance of the elements' electronegativities,
  :func:`intermetallic_mixing_variance`), or the salt index where the compound
  has an ionic reading and that is higher (polar networks such as GaN and AlN).

Melting classes (:data:`MELTING_CLASS_BANDS`) share the same temperature
bands; salts keep the trade's names (``ionic_liquid`` is a salt melting below
100 C), other compounds get names of their own, so that a molecular liquid is
never called an ionic liquid.
"""
from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass
from math import factorial

from ionicity.scorer.caching import once
from ionicity.scorer.data.build_gases import MAX_GAS_ATOMS
from ionicity.scorer.elements import get_element
from ionicity.scorer.formula import format_count, hill_formula, parse_formula
from ionicity.scorer.grammar import reduced_key
from ionicity.scorer.model import Decomposition
from ionicity.scorer.radii import shannon_radius_pm
from ionicity.scorer.tables import table

__all__ = [
    "MELTING_CLASS_BANDS",
    "ROUTE_OF_CLASS",
    "SALT_CLASSES",
    "melting_class_for",
    "polar_network_index",
    "HYDRATE_MELT_CLASS",
    "WATER_RICH_HYDRATE_MIN",
    "LOWER_HYDRATE_CLASS",
    "DECOMPOSES_CLASS",
    "lower_salt_hydrate",
    "water_rich_hydrate",
    "walden_dannenfelser_yalkowsky_entropy_J_mol_K",
    "molecular_cohesion_kJ_mol",
    "hydrogen_bond_sites",
    "pauling_bond_strength",
    "molecular_melting_K",
    "MolecularTerms",
    "molecular_terms",
    "element_mixture_melting_K",
    "mixture_counts_whole_formula",
    "electronegativity_variance_pauling",
    "intermetallic_mixing_variance",
    "chain_layer_index",
    "chain_layer_salt_share",
    "ion_symmetry_number",
]

GAS_CONSTANT_J_MOL_K = 8.314462618
BOHR3_TO_A3 = 0.148184711  # (0.529177 A)**3
WALDEN_ENTROPY_J_MOL_K = 56.5  # Dannenfelser & Yalkowsky's constant (Walden's rule, 13 e.u.)

# (class_name, lower_K, upper_K, description): every melting_class value. The
# bands are the same for salts and for other compounds; bands nest (the two
# lowest non-salt bands split the salt band below 100 C at 25 C).
MELTING_CLASS_BANDS: tuple[tuple[str, float, float, str], ...] = (
    ("ionic_liquid", 0.0, 373.15, "salt melting below 100 C, the trade's definition (Wasserscheid & Welton,"
     " Ionic Liquids in Synthesis, 2008; from memory)"),
    ("low_melting_salt", 373.15, 573.15, "salt melting at 100-300 C (common practice)"),
    ("molten_salt", 573.15, 1773.15, "salt melting at 300-1500 C, the usual molten-salt range (common practice)"),
    ("liquid_at_room_temperature", 0.0, 298.15, "not a salt: liquid (or gas) at 25 C"),
    ("gas_at_room_temperature", 0.0, 298.15,
     "not a salt, and every registry compound of its formula boils below 25 C (scorer/data/gases.csv)"),
    ("melts_below_100C", 298.15, 373.15, "not a salt: solid at 25 C, melting below 100 C"),
    ("low_melting_solid", 373.15, 573.15, "not a salt: melting at 100-300 C"),
    ("high_melting_solid", 573.15, 1773.15, "not a salt: melting at 300-1500 C"),
    ("refractory", 1773.15, math.inf, "any compound melting at 1500 C or above, ISO 836 refractoriness (from memory)"),
    ("melts_in_own_water", 0.0, 373.15, "salt hydrate with four or more waters per formula unit: melts or dissolves"
     " in its own water of crystallisation below about 100 C (Lane, Solar Heat Storage: Latent Heat Materials,"
     " 1983; Kenisarin & Mahkamov 2007; from memory), whatever its anhydrous salt does"),
    ("decomposes_below_300C", 0.0, 573.15, "salt that decomposes on heating below about 300 C rather than melting"
     " as a lattice: ammonium salts of polyatomic anions and salts of peroxide, hypochlorite, hydrogencarbonate,"
     " disulfite and other anions that give off a gas (NH4NO3, NH4H2PO4, NaHCO3, Ca(ClO)2); never called an ionic"
     " liquid, whatever its trend"),
    ("loses_water_below_300C", 0.0, 573.15, "salt hydrate with fewer than four waters per formula unit: gives off"
     " its water of crystallisation on heating (or melts in it) below about 300 C, mostly at 100-250 C, before its"
     " anhydrous salt melts (BaCl2.2H2O near 386 K, CaSO4.2H2O to the hemihydrate near 400 K; from memory)"),
)

#: the class of a water-rich salt hydrate (:func:`water_rich_hydrate`)
HYDRATE_MELT_CLASS = "melts_in_own_water"
#: lattice waters per formula unit from which a salt hydrate melts in its own water (water_rich_hydrate)
WATER_RICH_HYDRATE_MIN = 4.0
#: the class of a salt hydrate with fewer waters (:func:`lower_salt_hydrate`)
LOWER_HYDRATE_CLASS = "loses_water_below_300C"
#: the class of a salt whose trend is a decomposition band below 300 C (scorer.melting_index.decomposition_band_index)
DECOMPOSES_CLASS = "decomposes_below_300C"

SALT_CLASSES = frozenset({"ionic_salt", "ionic_liquid_pair", "base"})

# substance_class -> route; the class names of scorer.substance and scorer.applicability
ROUTE_OF_CLASS: dict[str, str] = {
    "ionic_salt": "salt",
    "ionic_liquid_pair": "salt",
    "base": "salt",
    "covalent_molecular": "molecular",
    "acid": "molecular",
    "chain_layer_solid": "chain_layer",
    "covalent_network": "element_mixture",
    "semiconductor": "element_mixture",
    "metallic": "element_mixture",
    "intermetallic": "element_mixture",
    "zintl_phase": "element_mixture",
    "element": "element_mixture",
}

_BAND_LIMITS = {name: (lo, hi) for name, lo, hi, _ in MELTING_CLASS_BANDS}
_SALT_BANDS = ("ionic_liquid", "low_melting_salt", "molten_salt", "refractory")
_OTHER_BANDS = ("liquid_at_room_temperature", "melts_below_100C", "low_melting_solid", "high_melting_solid", "refractory")


GAS_CLASS = "gas_at_room_temperature"
GAS_SOURCE = "registry package chemicals, scorer/data/gases.csv"


@once
def _gases() -> dict[str, tuple[float, str]]:
    return {row["formula"]: (float(row["boiling_point_K"]), row["name"]) for row in table("gases.csv")}


def gas_at_room_temperature(composition) -> tuple[float, str] | None:
    """(boiling point in K, name) when every registry compound of the composition's Hill formula boils below
    25 C (``scorer/data/gases.csv``); None otherwise.

    >>> gas_at_room_temperature((("C", 1.0), ("O", 2.0))), gas_at_room_temperature((("H", 2.0), ("O", 1.0)))
    ((194.7, 'Carbon dioxide'), None)
    """
    if sum(n for _, n in composition) > MAX_GAS_ATOMS:
        return None  # most formulas: no Hill formula to write
    return _gases().get(hill_formula(dict(composition)))


def melting_class_for(temperature_K: float, salt: bool) -> str | None:
    """The melting class of a trend temperature (bands in :data:`MELTING_CLASS_BANDS`).

    >>> melting_class_for(250.0, salt=True), melting_class_for(250.0, salt=False)
    ('ionic_liquid', 'liquid_at_room_temperature')
    >>> melting_class_for(2400.0, salt=False), melting_class_for(float("nan"), salt=True)
    ('refractory', None)
    """
    if temperature_K is None or not math.isfinite(temperature_K):
        return None
    for name in _SALT_BANDS if salt else _OTHER_BANDS:
        lo, hi = _BAND_LIMITS[name]
        if lo <= temperature_K < hi:
            return name
    return "refractory"


def water_rich_hydrate(hydrate_water: float) -> bool:
    """Whether a salt hydrate melts in its own water of crystallisation (the stated rule of the hydrate class).

    A salt hydrate with four or more lattice waters per formula unit melts,
    congruently or incongruently (the salt, or a lower hydrate, left
    undissolved), near the temperature at which its water can hold the salt
    in solution, not near its anhydrous salt's melting point: the salt
    hydrates tabulated as latent-heat materials melt between about 280 and
    380 K whatever the anhydrous salt does (Na2SO4.10H2O 305 K, CaCl2.6H2O
    303 K, Na2S2O3.5H2O 321 K, Mg(NO3)2.6H2O 362 K; dry Na2SO4 and CaCl2
    melt at 1157 and 1045 K; G. A. Lane, Solar Heat Storage: Latent Heat Materials,
    vol. 1, CRC Press, 1983, ch. 3; M. Kenisarin and K. Mahkamov, Renew.
    Sustain. Energy Rev. 2007, 11, 1913, Table 2; from memory). Lower
    hydrates (CaSO4.2H2O, LiOH.H2O, NaClO4.H2O) lose their water as a
    vapour or keep it above 100 C, so the rule stops at four: of the 46
    salt hydrates with a melting point in the registry package ``chemicals``
    outside the audit's half B, a threshold of 4 puts 24 in their band
    against 14 at 7 (the rule's calibration; the audit's half B is its
    validation). Decomposition, hydrolysis and the water vapour a heated
    hydrate gives off are not modelled.

    >>> water_rich_hydrate(10.0), water_rich_hydrate(2.0), water_rich_hydrate(0.0)
    (True, False, False)
    """
    return hydrate_water >= WATER_RICH_HYDRATE_MIN


def lower_salt_hydrate(hydrate_water: float) -> bool:
    """Whether a salt hydrate has fewer than :data:`WATER_RICH_HYDRATE_MIN` lattice waters (and some).

    A lower hydrate does not melt in its own water near room temperature, as the
    water-rich ones do (:func:`water_rich_hydrate`), nor near its anhydrous
    salt's melting point: heated, it gives its water off as a vapour, mostly
    between 100 and 250 C (BaCl2.2H2O near 386 K, CaSO4.2H2O to the
    hemihydrate near 400 K, CuCl2.2H2O near 373 K; from memory), or melts in
    it (SnCl2.2H2O 311 K, LiI.3H2O 346 K, registry values via ``chemicals``),
    long before the dry salt melts (BaCl2 1235 K). Its class is
    :data:`LOWER_HYDRATE_CLASS`, a band up to 300 C; its trend index stays the
    anhydrous salt's. Measured on ``tests/data/salt_hydrates_registry.csv``
    (the registry's salt hydrates outside the audit's half B; the rule's
    calibration): of its 15 lower hydrates 12 have a registry melting point in
    that band, 3 in the band of their anhydrous salt's class; the misses are
    registry values of the anhydrous salt (LiOH.H2O at 723 K) or of a mineral.

    >>> lower_salt_hydrate(2.0), lower_salt_hydrate(0.5), lower_salt_hydrate(4.0), lower_salt_hydrate(0.0)
    (True, True, False, False)
    """
    return 0.0 < hydrate_water < WATER_RICH_HYDRATE_MIN


# ------------------------------------------------------------------ equations


def walden_dannenfelser_yalkowsky_entropy_J_mol_K(symmetry_number=1.0, torsions_tau=0.0):
    """Entropy of melting of a molecular crystal, Walden's rule with Dannenfelser and Yalkowsky's terms.

    ``dS_m = 56.5 - R ln sigma + R ln Phi`` J/(mol K), ``Phi = 2.435**tau``.

    Parameters
    ----------
    symmetry_number : float
        Rotational symmetry number ``sigma`` (>= 1).
    torsions_tau : float
        Torsional angles ``tau`` (>= 0).

    Returns
    -------
    float
        J/(mol K).

    References
    ----------
    R. M. Dannenfelser and S. H. Yalkowsky, Ind. Eng. Chem. Res. 1996, 35,
    1483-1486 (from memory): naphthalene (sigma 4, tau 0) 56.5 - R ln 4 = 45.0 J/(mol K).

    Examples
    --------
    >>> round(walden_dannenfelser_yalkowsky_entropy_J_mol_K(4, 0), 1)
    45.0
    >>> round(walden_dannenfelser_yalkowsky_entropy_J_mol_K(1, 0), 1)
    56.5
    """
    sigma = max(float(symmetry_number), 1.0)
    tau = max(float(torsions_tau), 0.0)
    return WALDEN_ENTROPY_J_MOL_K - GAS_CONSTANT_J_MOL_K * math.log(sigma) + GAS_CONSTANT_J_MOL_K * tau * math.log(2.435)


def pauling_bond_strength(oxidation_state: float, coordination_number: float) -> float:
    """Pauling's electrostatic bond strength ``s = z / CN`` of a cation's bonds (valence units).

    Pauling's second rule: a cation of charge ``z`` among ``CN`` neighbours
    gives each bond the strength ``z / CN``.

    References
    ----------
    L. Pauling, J. Am. Chem. Soc. 1929, 51, 1010-1026 (from memory): Al3+ in
    octahedral coordination, 3/6 = 0.5.

    Examples
    --------
    >>> pauling_bond_strength(3, 6), pauling_bond_strength(2, 6) == 1 / 3
    (0.5, True)
    >>> pauling_bond_strength(4, 0)
    0.0
    """
    return float(oxidation_state) / coordination_number if coordination_number > 0 else 0.0


def molecular_cohesion_kJ_mol(ligand_polarisabilities_A3, open_sites, bond_strength, weights: Mapping[str, float],
                              secondary_contacts=0, primary_delta_chi=0.0, hydrogen_bond_sites=0.0, lone_pairs=0):
    """Heat of melting of a molecular crystal from the size and polarisability of its molecule [kJ/mol].

    ``dH_m = sum_L (h_0 + h_alpha * alpha_L) + h_bridge * n_open * s``: each
    peripheral atom L touches the neighbouring molecules and adds a contact
    share growing with its polarisability ``alpha_L`` (London dispersion);
    ``n_open`` counts coordination sites the central atom leaves open (its
    coordination number in the solid less its ligands and lone pairs), each of
    which a halide or oxide of a neighbour bridges in the crystal (AlCl3
    layers, (NbCl5)2, (TaF5)4, HgCl2 2+4 coordination). A bridge is as strong
    as the centre's bonds: Pauling's electrostatic bond strength
    ``s = z / CN`` (:func:`pauling_bond_strength`), so the four long Hg...Cl
    contacts of HgCl2 (``s`` = 2/6) hold less than the Al-Cl-Al bridges of
    Al2Br6 (3/4).

    Secondary contacts are counted apart: ``n_sec`` of the open sites are
    filled not by bridges but by long secondary contacts (Alcock's secondary
    bonds: the four Hg...X of linear HgX2 at 1.4-1.5 times the Hg-X bond,
    Wells 1984), each worth ``h_sec * s * dchi``. A secondary bond is a
    donor-acceptor contact into the antibonding orbital of the primary bond
    and is the stronger the more polar that bond (N. W. Alcock, Adv. Inorg.
    Chem. Radiochem. 1972, 15, 1; from memory): ``dchi`` is the Pauling
    electronegativity difference of the primary bond (HgCl2 1.26, HgBr2
    1.06, HgI2 0.76), so the contacts weaken from chloride to iodide as the
    dispersion term grows, and the mercury halides melt alike (549, 514 and
    529 K, chemicals Tm). Defined here; the weights ``h_0``, ``h_alpha``,
    ``h_bridge``, ``h_sec`` are fitted (see ``TREND_WEIGHTS``).

    Hydrogen bonds are counted apart too: each O-H or N-H donor site
    (``n_HB``, :func:`hydrogen_bond_sites`: boric acid 3, sulfuric acid 2,
    hydrazine 2) adds ``h_HB`` (``molecular_hydrogen_bond_kJ_mol``), the
    hydrogen bonds broken or loosened on melting (water, the oxoacids and
    hydrazine were read 30-250 K low without it: the ligand contacts alone
    gave water 80 K).

    Stereochemically active lone pairs of a p-block centre are counted apart
    as well: each (``n_LP``: one in PCl3, SbI3, SOCl2, SeO2; two in SCl2,
    ClF3, H2S; three in XeF2 and HCl) adds ``h_LP``
    (``molecular_lone_pair_kJ_mol``). A lone pair makes the molecule polar
    (AX3E, AX2E2: a dipole, Gillespie & Nyholm, Q. Rev. Chem. Soc. 1957, 11,
    339; from memory) and is the donor of the secondary bonds that join
    such molecules in the crystal (the 3+3 layers of AsI3 and SbI3, the
    Xe...F contacts of XeF2; Alcock 1972, above; from memory); the ligand
    contacts alone read those molecules 0.1-0.7 low in log10. Where the
    secondary contacts are measured (``n_sec`` > 0, BiCl3 3+5) they are that
    cohesion, and the caller passes no lone pair
    (:meth:`MolecularTerms.cohesion_kJ_mol`).

    ``dH_m = sum_L (h_0 + h_alpha * alpha_L) + h_bridge * (n_open - n_sec) * s
    + h_sec * n_sec * s * dchi + h_HB * n_HB + h_LP * n_LP``.

    Parameters
    ----------
    ligand_polarisabilities_A3 : sequence of float
        Polarisability volume of each peripheral atom [angstrom^3].
    open_sites : int
        Coordination sites of the centre bridged in the crystal.
    bond_strength : float
        ``s = z / CN`` of the centre [valence units].
    weights : mapping
        ``molecular_contact_kJ_mol``, ``molecular_polarisability_kJ_mol_A3``,
        ``molecular_bridge_kJ_mol`` (kJ/mol per valence unit of bridges) and,
        with secondary contacts, ``molecular_secondary_kJ_mol`` (kJ/mol per
        valence unit and Pauling unit of electronegativity difference).
    secondary_contacts : int, default=0
        How many of the open sites are secondary contacts (at most ``open_sites``).
    primary_delta_chi : float, default=0.0
        Pauling electronegativity difference of the primary bond.
    hydrogen_bond_sites : float, default=0.0
        O-H and N-H donor sites; with them, ``molecular_hydrogen_bond_kJ_mol`` (kJ/mol per site).
    lone_pairs : int, default=0
        Stereochemically active lone pairs of the centre; with them, ``molecular_lone_pair_kJ_mol``
        (kJ/mol per lone pair).

    Examples
    --------
    >>> w = {"molecular_contact_kJ_mol": 1.0, "molecular_polarisability_kJ_mol_A3": 1.0, "molecular_bridge_kJ_mol": 8.0}
    >>> molecular_cohesion_kJ_mol([2.0, 2.0], 1, 0.75, w)
    12.0
    >>> round(molecular_cohesion_kJ_mol([2.0, 2.0], 4, 0.5, {**w, "molecular_secondary_kJ_mol": 10.0}, 4, 1.0), 6)
    26.0
    >>> molecular_cohesion_kJ_mol([2.0, 2.0], 0, 0.0, {**w, "molecular_hydrogen_bond_kJ_mol": 4.0}, hydrogen_bond_sites=2)
    14.0
    >>> molecular_cohesion_kJ_mol([2.0, 2.0], 0, 0.0, {**w, "molecular_lone_pair_kJ_mol": 3.0}, lone_pairs=2)
    12.0
    """
    h_0, h_alpha = weights["molecular_contact_kJ_mol"], weights["molecular_polarisability_kJ_mol_A3"]
    # one term per distinct alpha, summed atom by atom in C: the same float sum as a loop
    # over the atoms (an organic molecule has a few distinct alphas and many atoms;
    # 100,000 atoms took 30 ms in a Python loop)
    term = {a: h_0 + h_alpha * a for a in set(ligand_polarisabilities_A3)}
    total = sum(map(term.__getitem__, ligand_polarisabilities_A3))
    open_sites = max(open_sites, 0)
    secondary = min(max(secondary_contacts, 0), open_sites)
    total += weights["molecular_bridge_kJ_mol"] * (open_sites - secondary) * bond_strength
    if secondary:
        total += weights["molecular_secondary_kJ_mol"] * secondary * bond_strength * primary_delta_chi
    if hydrogen_bond_sites:
        total += weights["molecular_hydrogen_bond_kJ_mol"] * hydrogen_bond_sites
    if lone_pairs:
        total += weights["molecular_lone_pair_kJ_mol"] * lone_pairs
    return total


def molecular_melting_K(cohesion_kJ_mol: float, entropy_J_mol_K: float) -> float:
    """``T_m = dH_m / dS_m`` in K.

    >>> round(molecular_melting_K(9.0, 35.8))
    251
    """
    return 1000.0 * cohesion_kJ_mol / entropy_J_mol_K


def chain_layer_index(salt_index: float, molecular_index: float, salt_share: float = 0.5) -> float:
    """A chain or layer solid sits between its salt and molecular readings: their weighted mean.

    ``I = I_mol + w (I_salt - I_mol)`` with ``w`` the share of the ionic
    reading (:func:`chain_layer_salt_share`): 0.5, the plain mean, for a
    solid whose every bond is a saturated bridge (BeCl2, MoO3, CdCl2).

    >>> chain_layer_index(3.0, 2.4)
    2.7
    >>> round(chain_layer_index(3.0, 2.4, salt_share=1 / 6), 3)
    2.5
    """
    return molecular_index + salt_share * (salt_index - molecular_index)


def chain_layer_salt_share(terms: MolecularTerms | None) -> float:
    """Share ``w`` of the ionic reading in a chain or layer solid, from its bridging and terminal bonds.

    ``w = 0.5 * min(1, 2 n_open / CN) * min(1, |z_X| / (2 s))``:

    * only bridging bonds tie one centre to the next; a terminal bond (the
      two Cr=O of each CrO4 tetrahedron in the CrO3 chain, Wells, Structural
      Inorganic Chemistry, 5th ed., 1984, ch. 24; from memory) holds nothing
      between centres. Each bridge pairs one of the centre's own ligands with
      an open site of a neighbour, so ``2 n_open`` of the centre's ``CN``
      bonds bridge (CrO3: 2 of 4; BeCl2 and MoO3: all);
    * Pauling's electrostatic valence rule (J. Am. Chem. Soc. 1929, 51, 1010;
      from memory): a ligand of charge ``z_X`` bridging two centres receives
      ``2 s`` with ``s = z / CN`` (:func:`pauling_bond_strength`). Where
      ``2 s`` exceeds ``|z_X|`` (CrO3: 2 * 6/4 = 3 on an oxide) the bridge
      over-bonds its anion and cannot be electrostatic: only the share
      ``|z_X| / (2 s)`` reads as ionic.

    The factor 0.5 is the plain mean a fully bridged solid of saturated
    bridges keeps. 0.5 too without a reading of the bridges (no single
    centre, V2O5; or no open site found), said in the explain step.

    Examples
    --------
    >>> from dataclasses import replace
    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> def share(f):
    ...     dec = replace(decompose(parse_formula(f)), cations=(), anions=())
    ...     return round(chain_layer_salt_share(molecular_terms(dec)), 3)
    >>> share("CrO3"), share("BeCl2"), share("MoO3")
    (0.167, 0.5, 0.5)
    """
    if terms is None or terms.open_sites <= 0 or terms.bond_strength <= 0 or terms.coordination_number <= 0:
        return 0.5
    bridging = min(1.0, 2.0 * terms.open_sites / terms.coordination_number)
    n = sum(k for _, k in terms.ligands)
    ligand_charge = sum(abs(_LIGAND_CHARGE.get(s, -1)) * k for s, k in terms.ligands) / n
    return 0.5 * bridging * min(1.0, ligand_charge / (2.0 * terms.bond_strength))


# --------------------------------------------------------- molecular geometry

# Rotational symmetry numbers of a central atom with n equal ligands and L
# stereochemically active lone pairs (VSEPR shapes; point groups common practice).
_SIGMA = {
    (1, 0): 1, (2, 0): 2, (2, 1): 2, (2, 2): 2, (2, 3): 2, (3, 0): 6, (3, 1): 3, (3, 2): 2,
    (4, 0): 12, (4, 1): 2, (4, 2): 8, (5, 0): 6, (5, 1): 4, (6, 0): 24, (6, 1): 3, (7, 0): 10,
}
# Molecules with an infinite rotation axis: Dannenfelser and Yalkowsky give a
# cylinder (D-infinity-h: Cl-Hg-Cl, CO2, XeF2) sigma 20 and a cone (C-infinity-v) sigma 10
# (Ind. Eng. Chem. Res. 1996, 35, 1483; from memory); mixed ligands divide 20 by 2 ways.
_LINEAR_SIGMA = 20.0
_LIGAND_CHARGE = {"F": -1, "Cl": -1, "Br": -1, "I": -1, "O": -2, "S": -2, "Se": -2, "H": -1}
_HALOGENS = frozenset({"F", "Cl", "Br", "I", "At"})


def _shape_symmetry_number(lone_pairs: int, ligand_counts) -> float:
    """sigma of a centre's VSEPR shape, divided by the ways to place mixed ligands (VOCl3: 12 / 4 = 3)."""
    n = int(sum(ligand_counts))
    sigma = float(_SIGMA.get((n, lone_pairs), 1))
    if len(ligand_counts) > 1:
        arrangements = factorial(n)
        for k in ligand_counts:
            arrangements //= factorial(int(k))
        sigma = max(sigma / arrangements, 1.0)
    return sigma


@dataclass(frozen=True)
class MolecularTerms:
    """The inputs of the molecular route for one compound, with how they were read."""

    centre: str
    ligands: tuple[tuple[str, float], ...]
    symmetry_number: float
    torsions_tau: float
    open_sites: int
    ligand_polarisabilities_A3: tuple[float, ...]
    basis: str
    bond_strength: float = 0.0
    coordination_number: int = 0
    secondary_contacts: int = 0
    primary_delta_chi: float = 0.0
    #: O-H and N-H donor sites of the unit read (hydrogen_bond_sites)
    hydrogen_bond_sites: float = 0.0
    #: stereochemically active lone pairs of the centre (VSEPR; none for d- and f-block centres)
    lone_pairs: int = 0

    @property
    def lone_pairs_counted(self) -> int:
        """The lone pairs the cohesion counts: none where the centre's secondary contacts are measured
        (they are the cohesion those lone pairs give, BiCl3 3+5; :func:`molecular_cohesion_kJ_mol`)."""
        return 0 if self.secondary_contacts else self.lone_pairs

    def cohesion_kJ_mol(self, weights: Mapping[str, float], hydrogen_bond_sites: float | None = None) -> float:
        """:func:`molecular_cohesion_kJ_mol` of this reading (``hydrogen_bond_sites`` overrides its own count)."""
        sites = self.hydrogen_bond_sites if hydrogen_bond_sites is None else hydrogen_bond_sites
        return molecular_cohesion_kJ_mol(self.ligand_polarisabilities_A3, self.open_sites, self.bond_strength, weights,
                                         self.secondary_contacts, self.primary_delta_chi, sites,
                                         self.lone_pairs_counted)


@once
def _polarisability_A3(symbol: str) -> float:
    value = get_element(symbol).dipole_polarizability_bohr3 * BOHR3_TO_A3
    return value if math.isfinite(value) else 0.0


def _atom_polarisabilities_A3(counts) -> tuple[float, ...]:
    """One polarisability per atom of ``(symbol, count)`` pairs, in their order
    (each element's repeated by tuple arithmetic, not atom by atom)."""
    out: list[float] = []
    for symbol, n in counts:
        out += [_polarisability_A3(symbol)] * int(round(n))
    return tuple(out)


@once
def _measured_coordination() -> dict[tuple, tuple[int, int, str]]:
    """Reduced composition -> (coordination number of the centre in the solid, how many of them are
    secondary contacts, source)."""
    out = {}
    for row in table("molecular_coordination.csv"):
        out[reduced_key(parse_formula(row["formula"]).counts)] = (
            int(row["coordination_number"]), int(row["secondary_contacts"]), row["source"])
    return out


def _radius_ratio_coordination(centre: str, state: int, ligands) -> int:
    """Coordination number a cation of this size takes among these ligands (radius-ratio rule, Pauling 1929)."""
    r_cat, _ = shannon_radius_pm(centre, state, 6)
    total = sum(n for _, n in ligands)
    r_an = 0.0
    for symbol, n in ligands:
        r, _ = shannon_radius_pm(symbol, _LIGAND_CHARGE.get(symbol, -1), 6)
        r_an += n * (r if math.isfinite(r) else 140.0)
    r_an /= total
    if not math.isfinite(r_cat) or r_an <= 0:
        return 0
    ratio = r_cat / r_an
    return 8 if ratio >= 0.732 else 6 if ratio >= 0.414 else 4 if ratio >= 0.225 else 3


def hydrogen_bond_sites(counts: Mapping[str, float]) -> float:
    """Hydrogen-bond sites a formula can hold: ``min(n_O + n_N, n_H)``.

    An O-H or N-H donor needs both the atom and a hydrogen; the formula does
    not say which hydrogens sit on O or N, so the count is the upper bound,
    every O and N with a hydrogen as far as there are hydrogens (ethanol 1,
    glucose C6H12O6 6, where five OH and one ring O are there; diethyl ether 1,
    an overcount). Common practice.

    >>> hydrogen_bond_sites({"C": 6, "H": 12, "O": 6}), hydrogen_bond_sites({"C": 6, "Cl": 6})
    (6.0, 0.0)
    """
    return float(min(counts.get("O", 0) + counts.get("N", 0), counts.get("H", 0)))


@once
def _centre_chi(symbol: str) -> float:
    """Pauling electronegativity for choosing the centre, 1.5 where there is none."""
    value = get_element(symbol).electronegativity_pauling
    return value if value == value else 1.5


# oxides and sulfides of phosphorus and arsenic written as their empirical formulas are molecules of four
# such atoms, adamantane-like cages: P4O6, P4O10, As4O6, P4S10 (Greenwood & Earnshaw, Chemistry of the
# Elements, 2nd ed., 1997, ch. 12.3.5 and 13.3.4; from memory); the molecular route reads the cage
# (As2S3 and As2Se3 are layer solids, As2O5 a polymer: not listed)
_CAGE_ATOMS = frozenset({"P", "As"})
_CAGE_MOLECULES = {
    (("O", 3.0), ("P", 2.0)): 4.0,
    (("O", 5.0), ("P", 2.0)): 4.0,
    (("As", 2.0), ("O", 3.0)): 4.0,
    (("P", 2.0), ("S", 5.0)): 4.0,
}


def _radical_unit(centre: str, ligands) -> bool:
    """Whether a centre with these ligands (a reduced formula unit) sits at none of its main oxidation states.

    The state counts each ligand at :data:`_LIGAND_CHARGE` (other elements -1);
    the main states are mendeleev's (``oxidation_states_main``: As -3, 3, 5;
    S -2, 2, 4, 6; Al 3). AsS gives As(+2), SCl S(+1), SiCl3 Si(+3), NO2 N(+4):
    halves of As4S4, S2Cl2, Si2Cl6 and N2O4, molecules held by a bond between
    like atoms (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997,
    ch. 13, 15, 9, 11; from memory). AlCl3 gives Al(+3): Al2Cl6 is a dimer of
    that unit, bridged through chlorine.

    >>> _radical_unit("As", (("S", 1.0),)), _radical_unit("Al", (("Cl", 3.0),)), _radical_unit("S", (("Cl", 1.0),))
    (True, False, True)
    """
    state = -sum(_LIGAND_CHARGE.get(s, -1) * n for s, n in ligands)
    if not float(state).is_integer():
        return True
    return int(state) not in get_element(centre).oxidation_states_main


def molecular_terms(dec: Decomposition) -> MolecularTerms | None:
    """Read a molecule off its composition: centre, ligands, symmetry, torsions, open sites.

    The centre is the least electronegative atom when it occurs once per
    (reduced) formula unit; the rest are its ligands. ``sigma`` follows the
    VSEPR shape of the centre (lone pairs from its valence electrons less its
    oxidation state, none for d- and f-block centres); with mixed ligands it is
    divided by the number of ways to place them (VOCl3: 12 / 4 = 3); a linear
    molecule (two ligands, no or three lone pairs) takes Dannenfelser and
    Yalkowsky's cylinder, sigma 20 (a cone with mixed ligands, 10).

    Open sites are the centre's coordination number in the solid less its
    ligands and lone pairs. The coordination number is, in this order: the
    measured one where ``scorer/data/molecular_coordination.csv`` lists the
    compound (AlCl3 6, a layer lattice; HgCl2 2+4, its four long Hg...Cl
    counted as ``secondary_contacts``); that of the ligands alone
    for carbon and nitrogen centres (multiple bonds, no bridges: CO2); 6 for
    a d- or f-block pentahalide (bridged dimers and tetramers: NbBr5); else
    the radius-ratio rule. ``bond_strength`` is Pauling's ``z / CN`` when a
    site is open. Without one centre (organic molecules, chains of like
    atoms) sigma is 1 and ``tau`` counts carbon atoms beyond the second (a
    rough chain), both said in ``basis``, and every atom of the formula as
    written counts (P4O10, not P2O5; organic molecules take
    :mod:`scorer.melting_organic` before this reading). None when the composition is empty.

    Examples
    --------
    >>> from dataclasses import replace
    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> m = molecular_terms(replace(decompose(parse_formula("AlCl3")), cations=(), anions=()))
    >>> m.symmetry_number, m.open_sites, m.bond_strength
    (6.0, 3, 0.5)
    """
    comp = written = [(s, n) for s, n in dec.composition if n > 0]
    if not comp:
        return None
    cage = _CAGE_MOLECULES.get(reduced_key(comp))
    if cage is not None:
        # the empirical formula of a cage molecule (P2O5 is P4O10): the molecule counts, as written out
        comp = written = [(s, n * cage / sum(k for t, k in comp if t in _CAGE_ATOMS)) for s, n in comp]
    counts = [n for _, n in comp]
    g = 1
    if all(float(n).is_integer() for n in counts):
        g = 0
        for n in counts:
            g = math.gcd(g, int(n))
        comp = [(s, n / g) for s, n in comp]
    chi = {s: _centre_chi(s) for s, _ in comp}
    centre, n_centre = min(comp, key=lambda sn: (chi[sn[0]], sn[0]))
    heavy = [(s, n) for s, n in written if s != "H"]
    hydride = len(heavy) == 1 and heavy[0][1] == 1 and len(written) == 2
    if hydride:
        # a molecular hydride XH_n (H2S, HCl, NH3): hydrogen forms one bond and is never the centre,
        # whatever the electronegativities say (H 2.20 against S 2.58, Cl 3.16; common practice)
        centre, n_centre = heavy[0]
    elif centre in _HALOGENS:
        # halogens are terminal where another atom can be the centre (O=N-Br, Cl-O-Cl; common practice):
        # the least electronegative atom that is neither hydrogen nor a halogen and occurs once
        inner = [(s, n) for s, n in comp if n == 1 and s != "H" and s not in _HALOGENS]
        if inner:
            centre, n_centre = min(inner, key=lambda sn: (chi[sn[0]], sn[0]))
    ligands = tuple((s, n) for s, n in comp if s != centre)
    n_lig = sum(n for _, n in ligands)
    if g > 1 and n_centre == 1 and ligands and "H" not in dict(comp) and _radical_unit(centre, ligands):
        # the reduced unit would be a radical half of a molecule held by a bond between like atoms (As4S4 is
        # no AsS, S2Cl2 no SCl, P2I4 no PI2, Si2Cl6 no SiCl3: the centre's state in the unit is none of its
        # main ones); the formula as written is the molecule (Al2Cl6 still reads as AlCl3). Molecules with
        # hydrogen keep the reduced unit: the hydrogen-bond weight is calibrated on it (borazine, written
        # B3H3N3 by the registry, reads as BHN there), and read whole, Si2H6 and Ge2H6 came out twice too high
        comp = written
        centre, n_centre = min(comp, key=lambda sn: (chi.get(sn[0], _centre_chi(sn[0])), sn[0]))
        ligands = tuple((s, n) for s, n in comp if s != centre)
    if n_centre != 1 or not ligands or not float(n_lig).is_integer() or "C" in dict(comp) and centre != "C":
        # the formula as written is the molecule: P4O10 is not P2O5 (the reduction is for a centre
        # with its ligands, Al2Cl6 read as AlCl3)
        carbons = dict(written).get("C", 0.0)
        all_alphas = _atom_polarisabilities_A3(written)
        return MolecularTerms(centre, ligands, 1.0, max(carbons - 2.0, 0.0), 0, all_alphas,
                              "no single central atom: sigma 1, tau from the carbon count (rough)",
                              hydrogen_bond_sites=hydrogen_bond_sites(dict(written)))
    state = -sum(_LIGAND_CHARGE.get(s, -1) * n for s, n in ligands)
    element = get_element(centre)
    if element.block in ("d", "f") or element.group is None:
        lone_pairs = 0
    else:
        valence = element.group if element.group <= 2 else element.group - 10
        lone_pairs = max(int(valence - state) // 2, 0)
    n = int(n_lig)
    sigma = _shape_symmetry_number(lone_pairs, [k for _, k in ligands])
    if n == 2 and lone_pairs in (0, 3):  # linear: a cylinder, or a cone with mixed ligands
        sigma = _LINEAR_SIGMA / (2.0 if len(ligands) > 1 else 1.0)
    measured = _measured_coordination().get(reduced_key(comp))
    secondary = 0
    if measured is not None:
        cn, secondary, how = measured[0], measured[1], "measured in the solid (scorer/data/molecular_coordination.csv)"
        if secondary:
            how += f", {secondary} of them secondary contacts"
    else:
        cn = _radius_ratio_coordination(centre, int(state), ligands) if state > 0 else 0
        how = "radius-ratio"
        if element.period == 2 and element.group is not None and element.group >= 14:
            # carbon and nitrogen keep their ligands by multiple bonds and take no bridges (CO2, CS2;
            # the first-row anomaly, common practice): no open site
            cn, how = n + lone_pairs, "a first-row centre keeps its own ligands"
        elif hydride and element.group >= 14:
            # hydrogen bridges only electron-deficient centres (B2H6, (AlH3)n, (BeH2)n: three-centre
            # two-electron bonds); a centre of groups 14-17 has its valence shell filled by its own
            # hydrogens and lone pairs, and its hydrides are molecules (SiH4, AsH3, SbH3, SnH4; Greenwood &
            # Earnshaw, 2nd ed., 1997, ch. 3; from memory)
            cn, how = n + lone_pairs, "a hydride of groups 14-17 takes no hydrogen bridges"
        elif n == 5 and lone_pairs == 0 and element.block in ("d", "f") and cn < 6:
            # a d- or f-block pentahalide completes its octahedron through two halide bridges,
            # (NbCl5)2, (MoCl5)2, (TaF5)4 (Greenwood & Earnshaw, 2nd ed., 1997, ch. 22; from memory)
            cn, how = 6, "octahedral, a d/f-block pentahalide bridged into dimers or tetramers"
    open_sites = max(cn - n - lone_pairs, 0)
    strength = pauling_bond_strength(state, cn) if open_sites else 0.0
    delta_chi = sum((chi[s] - chi[centre]) * k for s, k in ligands) / n_lig
    alphas = _atom_polarisabilities_A3(ligands)  # after the no-centre return, which reads every atom
    return MolecularTerms(centre, ligands, sigma, 0.0, open_sites, alphas,
                          f"centre {centre}({int(state):+d}) with {n} ligands, {lone_pairs} lone pair(s),"
                          f" coordination {cn or 'unknown'} ({how})", strength, cn, min(secondary, open_sites),
                          delta_chi, hydrogen_bond_sites(dict(comp)), lone_pairs)


def ion_symmetry_number(ion) -> float:
    """Rotational symmetry number of a polyatomic inorganic ion from its VSEPR shape (common practice).

    The centre is the least electronegative atom other than hydrogen that occurs
    once (hydrogen in HF2-); the other atoms are its ligands. Lone pairs from
    the centre's valence electrons less its oxidation state, or for hydrides
    of an electronegative centre (NH4+, OH-) from its ``(V + n_H - z) / 2``
    electron pairs (none for d- and f-block centres); 1 when protons sit on
    the ligands (HSO4-). The
    shape's symmetry number from the table the molecular route uses, divided
    by the ways to place mixed ligands (SCN-: 1). 1 when no centre is found.

    Examples
    --------
    >>> from ionicity.scorer.ion_library import get_ion
    >>> [ion_symmetry_number(get_ion(i)) for i in ("BF4(-)", "PF6(-)", "NO3(-)", "NO2(-)", "SCN(-)", "HF2(-)")]
    [12.0, 24.0, 6.0, 2.0, 1.0, 2.0]
    """
    comp = dict(ion.composition)
    singles = [s for s, n in comp.items() if s != "H" and n == 1] or [s for s, n in comp.items() if n == 1]
    if not singles:
        return 1.0
    chi = {s: get_element(s).electronegativity_pauling for s in comp}
    centre = min(singles, key=lambda s: (chi[s] if chi[s] == chi[s] else 1.5, s))
    ligands = {s: n for s, n in comp.items() if s != centre}
    n = sum(ligands.values())
    if not ligands or not float(n).is_integer():
        return 1.0
    element = get_element(centre)
    valence = None if element.block in ("d", "f") or element.group is None else (
        element.group if element.group <= 2 else element.group - 10)
    if set(ligands) == {"H"} and chi[centre] > 2.20:  # NH4+, OH-, H3O+: electron pairs (V + n_H - z) / 2
        lone_pairs = 0 if valence is None else max(int(valence + n - ion.charge) // 2 - int(n), 0)
    elif "H" in ligands:
        return 1.0  # protons on the ligands (HSO4-, H2PO4-) break the skeleton's symmetry
    else:
        state = ion.charge - sum({**_LIGAND_CHARGE, "N": -3, "C": -4}.get(s, -1) * k for s, k in ligands.items())
        lone_pairs = 0 if valence is None else max(int(valence - state) // 2, 0)
    return _shape_symmetry_number(lone_pairs, list(ligands.values()))


# ------------------------------------------------------ networks and metals


@once
def _element_melting_points() -> dict[str, tuple[float, str]]:
    return {row["symbol"]: (float(row["mp_K"]), row["source"]) for row in table("element_melting_points.csv")}


def mixture_counts_whole_formula(composition) -> bool:
    """Whether :func:`element_mixture_melting_K` counts every element of ``composition``
    (False when gaseous or liquid elements drop out: WO3 reads as tungsten alone).

    >>> mixture_counts_whole_formula((("Ni", 1.0), ("Al", 1.0))), mixture_counts_whole_formula((("W", 1.0), ("O", 3.0)))
    (True, False)
    """
    table_ = _element_melting_points()
    return all(symbol in table_ for symbol, _ in composition)


@once
def _fluid_element_melting_points() -> dict[str, tuple[float, str]]:
    return {row["substance"]: (float(row["mp_K"]), row["source"]) for row in table("fluid_element_melting_points.csv")}


def fluid_element_melting_K(composition) -> tuple[float, str] | None:
    """The melting point of an element that is a gas or a liquid at 25 C, or white phosphorus (P4), when the
    formula is that substance (O2, N2, Cl2, Br2, Hg, P4; ``scorer/data/fluid_element_melting_points.csv``, the CRC
    Handbook or another source of chemicals);
    None for any other formula (O alone, or a compound). The rule of mixtures leaves these elements out.

    >>> round(fluid_element_melting_K((("Hg", 1.0),))[0], 2), fluid_element_melting_K((("O", 1.0),))
    (234.32, None)
    """
    if len(composition) != 1:
        return None
    ((symbol, n),) = composition
    found = _fluid_element_melting_points().get(symbol if n == 1 else f"{symbol}{format_count(n)}")
    return found


def element_mixture_melting_K(composition) -> tuple[float, str]:
    """The stated rule for networks and metals: atom-fraction mean of the elements' melting points.

    Only elements solid at 25 C count (``scorer/data/element_melting_points.csv``);
    gaseous and liquid elements (H, N, O, halogens, noble gases, Hg) drop out of
    the mean, so SiO2 reads as silicon (1687 K). A rule of mixtures, a rough
    guide: polar networks (SiO2, AlN, GaAs) melt higher than it says.

    Returns
    -------
    (float, str)
        Temperature in K (NaN when no element counts) and which elements counted.

    Examples
    --------
    >>> round(element_mixture_melting_K((("Au", 1.0), ("Cu", 3.0)))[0])
    1353
    """
    table_ = _element_melting_points()
    total = weight = 0.0
    used = []
    for symbol, n in composition:
        if symbol in table_:
            total += n * table_[symbol][0]
            weight += n
            used.append(symbol)
    if weight == 0:
        if any(symbol == "P" for symbol, _ in composition):
            return math.nan, ("phosphorus: its allotropes melt far apart (white P4 at 317 K, red P subliming near"
                              " 690 K; from memory): write P4 for the white form")
        return math.nan, "no element of the formula is a solid at 25 C with a tabulated melting point"
    return total / weight, "mean over " + ", ".join(used)


def electronegativity_variance_pauling(composition) -> float:
    """Atom-fraction weighted variance of the elements' Pauling electronegativities (Pauling units squared).

    ``V = sum_i x_i (chi_i - chi_mean)**2 = 1/2 sum_i sum_j x_i x_j (chi_i - chi_j)**2``:
    half the mean squared electronegativity difference of two atoms drawn at
    random from the formula. Pauling's bond-energy relation puts the extra
    (ionic resonance) energy of an A-B bond at ``96.5 (chi_A - chi_B)**2``
    kJ/mol (L. Pauling, The Nature of the Chemical Bond, 3rd ed., 1960,
    ch. 3; from memory), so ``V`` grows as the heat of formation an
    intermetallic compound gains over its elements, which its melting point
    keeps and a rule of mixtures leaves out (NiAl 1911 K against a mean of
    1331 K; CRC Handbook via chemicals). Elements without a Pauling value
    (Eu, Yb, noble gases) are left out; 0 when fewer than two elements count.

    >>> round(electronegativity_variance_pauling((("Ni", 1.0), ("Al", 1.0))), 4)
    0.0225
    >>> electronegativity_variance_pauling((("Cu", 3.0),))
    0.0
    """
    pairs = [(n, get_element(s).electronegativity_pauling) for s, n in composition if n > 0]
    pairs = [(n, chi) for n, chi in pairs if math.isfinite(chi)]
    total = sum(n for n, _ in pairs)
    if len(pairs) < 2 or total <= 0:
        return 0.0
    mean = sum(n * chi for n, chi in pairs) / total
    return sum(n * (chi - mean) ** 2 for n, chi in pairs) / total


def intermetallic_mixing_variance(composition) -> float:
    """:func:`electronegativity_variance_pauling` over the elements the rule of mixtures averages, carbon aside.

    The correction of the intermetallics' rule of mixtures
    (``intermetallic_chi_variance`` in ``TREND_WEIGHTS``) measures the heat of
    formation among the elements whose melting points the rule averages
    (:func:`element_mixture_melting_K`): hydrogen and other elements that are
    not solids at 25 C take no part. Carbon is left out too: the rule
    averages graphite's 3823 K, the triple point of a covalent network that
    sublimes at 1 atm, which already carries more cohesion than the
    metal-carbon bonds of a carbide add (the three carbides of the
    calibration rows, WC, Cr3C2 and MnC, lie 0.09-0.17 in log10 below the
    rule before any term; chemicals Tm).

    >>> round(intermetallic_mixing_variance((("Al", 1.0), ("Ni", 3.0), ("H", 3.0))), 4)
    0.0169
    >>> intermetallic_mixing_variance((("W", 1.0), ("C", 1.0)))
    0.0
    """
    table_ = _element_melting_points()
    return electronegativity_variance_pauling(tuple((s, n) for s, n in composition if s in table_ and s != "C"))


def polar_network_index(mixture_index: float, salt_index: float) -> float:
    """The trend index of a III-V semiconductor: the mean of its element-mixture index and its formal ionic
    reading's salt index (a geometric mean of the two trend temperatures). Stated rule: the tetrahedral bond
    of a III-V compound is partly ionic (Phillips ionicity 0.25-0.42; Phillips, Rev. Mod. Phys. 42 (1970)
    317, from memory), between the metals' and metalloids' own cohesion and an ionic lattice. Chosen on the
    nine III-V compounds of Al, Ga and In with P, As and Sb (registry melting points, ``chemicals``): within
    a factor 1.5 for 7 of 9 (mixture alone 2, ionic reading alone 4), melting class right for 7 of 9
    (mixture alone 5, ionic reading alone 2); no separate validation set exists for this family.

    >>> round(polar_network_index(2.0, 3.0), 3)
    2.5
    """
    return 0.5 * (mixture_index + salt_index)
