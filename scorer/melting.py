"""Melting behaviour: a trend index, a melting class and its route for every compound.

Trend index
-----------
``mp_trend_index`` is dimensionless and reads on the scale of log10 of a
temperature in kelvin: higher means a higher expected melting point, a step of
0.1 is about 26 %. It is a ranking aid, not a prediction; its typical scatter
against measured melting points is a factor of about 1.5 (see ``datasets/melting/README.md``
for the figures per anion family). It follows ``T_m = dH_fus / dS_fus`` with
each factor replaced by what the other scoring modules know
(:func:`melting_trend_index`):

* **cohesion**: the lattice potential energy per ion ``u = U / nu``
  (Glasser-Jenkins volume-based estimate, else Kapustinskii; ``nu`` ions per
  formula unit). The heat of fusion is a small, roughly constant share of
  the cohesion of a simple ionic crystal (about 3.6 % for NaCl: 28 kJ/mol of
  787; CRC Handbook, from memory), and a melting point grows with it (the
  Lindemann picture);
* **covalency (Fajans)**: a salt whose contact bond is covalent forms layers,
  chains or molecules that come apart far below what its ionic lattice energy
  suggests (AlCl3, GaCl3, HgCl2 against NaCl). Three measures: the mean
  Pauling electronegativity of the two atoms in contact (van Arkel-Ketelaar's
  x: high means covalent), the Fajans contact index (induced dipole at the
  contact) and Fajans' third rule (an 18 or 18+2 electron cation);
* **entropy of fusion**: polyatomic anions gain orientational freedom on
  melting, many rotate in the solid already (plastic phases), so salts of
  molecular anions melt low for their lattice energy; organic ions add the
  conformational entropy of Dannenfelser and Yalkowsky (Ind. Eng. Chem. Res.
  1996, 35, 1483; from memory), ``R ln Phi`` with ``Phi = 2.435**tau`` for an
  ion with ``tau`` torsional angles, less ``R ln sigma`` for its rotational
  symmetry number ``sigma`` (Carnelley's rule: symmetric ions pack and melt
  higher);
* **charge delocalisation**: an ion whose charge is spread by resonance over
  three or more atoms (imidazolium, pyridinium, [NTf2], sulfonates, [dca])
  holds its counter-ions more weakly than a point charge of its volume,
  which the volume-based energy assumes. Carboxylates and phosphate diesters
  share their charge between two oxygens only and chelate metal ions, so
  they do not count.

Further salt terms: nitrides (a small triply charged anion), high-valent
cations (``(z_max - 3)+``: Ti4+, Cr6+ form molecules, chains and layers),
framework oxoanions (AlO2-, BO2-, PO3-: corner-sharing chains that melt like
oxides), protic ammonium cations ([EtNH3]+), the anion's rotational symmetry
(Carnelley's rule: ClO4- above NO3- above SCN-), hydride anions, an
18/18+2-electron cation beside O or F donors (its covalency penalty partly
given back: ZnO, SnO2 are refractory), the electronegativity difference (the
second van Arkel-Ketelaar coordinate) and a curvature of the cohesion term. A delocalised anion beside a
small hard inorganic cation (LiTFSI) does not count as delocalised. Lone-pair
cations with no Shannon radius take a stand-in's for the lattice energy
(:mod:`scorer.melting_stand_in`: Sn2+ takes Pb2+'s; other cations one of the same
charge and the radius estimated from the element's nearest listed charge), said in the notes.

The torsion counts, symmetry numbers and delocalisation flags of organic and
ionic-liquid ions are in ``scorer/data/ion_shape.csv``. Every weight was fitted
on a named calibration set and checked on another (:data:`TREND_WEIGHTS` says
which; ``python -m ionicity.pipelines.melting_weights`` refits and prints the
figures). No fitting happens at scoring time.

Other compounds
---------------
Compounds that are not salts take the routes of :mod:`scorer.melting_routes`
by their ``substance_class`` (column ``mp_route``): molecular compounds
``T_m = dH_m / dS_m`` (Walden's rule with Dannenfelser-Yalkowsky symmetry, a
size-polarisability cohesion plus halide or oxide bridges of Pauling's bond strength z/CN), chain and layer solids the mean of the salt and
molecular indices, networks and metals a stated rule of mixtures of the
elements' melting points. One scale for all.

Melting class
-------------
``melting_class`` is the band of the trend temperature ``10**index``
(:data:`MELTING_CLASS_BANDS`, :func:`scorer.melting_routes.melting_class_for`).
Salts keep the trade's names: ``ionic_liquid`` (below 373.15 K, a salt
melting below 100 C; Wasserscheid & Welton, Ionic Liquids in Synthesis, 2008,
from memory), ``low_melting_salt`` (to 573.15 K), ``molten_salt`` (to
1773.15 K). Other compounds: ``liquid_at_room_temperature`` (below 298.15 K),
``melts_below_100C`` (to 373.15 K), ``low_melting_solid`` (to 573.15 K),
``high_melting_solid`` (to 1773.15 K). Any compound from 1773.15 K up is
``refractory`` (ISO 836 refractoriness, from memory). A salt hydrate with four
or more waters per formula unit is ``melts_in_own_water`` (below 373.15 K;
:func:`hydrate_melting_class`, :func:`scorer.melting_routes.water_rich_hydrate`):
it melts in its own water of crystallisation whatever its anhydrous salt does.

Applying a fitted model lives in :mod:`scorer.melting_model`.

The trend and the class are :data:`CAUTION` (from :mod:`scorer.caution`,
the one caution text, quoted in the columns' descriptions).
"""
from __future__ import annotations

import dataclasses

import math
from dataclasses import dataclass, replace

from ionicity.scorer.bond_class_rules import layered_dichalcogenide_reason
from ionicity.scorer import character, fajans, lattice
from ionicity.scorer import melting_organic
from ionicity.scorer.alkoxides import ALKOXIDE_HINT
from ionicity.scorer.metal_amides import METAL_AMIDE_HINT
from ionicity.scorer import melting_routes as routes
from ionicity.scorer.melting_routes import MELTING_CLASS_BANDS, melting_class_for
from ionicity.scorer.melting_anions import (
    is_framework_oxoanion,
    is_hard_donor_anion,
    is_hydrogen_bonded_anion,
    octahedral_high_spin_cfse_delta_o,
    saline_nitride_fraction,
    soft_cation_pseudohalide_fraction,
    coinage_cation_fraction,
    ammonium_polyatomic_salt,
    ammonium_type_cation_fraction,
    heavy_halate_fraction,
    rotor_anion_fraction,
    coordinating_organic_anion_fraction,
    polarising_organic_anion_fraction,
    DECOMPOSING_ANIONS,
    ENERGETIC_ANIONS,
    FUEL_CATIONS,
    MOLECULAR_OXIDISERS,
    OXIDISING_ANIONS,
)
from ionicity.scorer.melting_stand_in import radius_analogue
from ionicity.scorer.radii import fallback_radii
from ionicity.scorer.ion_shapes import ONIUM_FAMILIES, _shape_table, anion_symmetry_number, ion_shape
from ionicity.scorer.caching import once, per_input
from ionicity.scorer.elements import is_metal
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.grammar import hill_formula
from ionicity.scorer.caution import CAUTION
from ionicity.scorer.descriptor import fmt, protocol, result_class
from ionicity.scorer.melting_index import (
    MELTING_CLASSES,
    TREND_WEIGHTS,
    ammonium_salt_decomposition_index,
    decomposing_anion_salt_index,
    dannenfelser_yalkowsky_flexibility_entropy_J_mol_K,
    melting_class_from_index,
    melting_trend_index,
    trend_temperature_K,
)
from ionicity.scorer.model import Column, Decomposition

__all__ = [
    "COLUMNS",
    "MELTING_CLASS_BANDS",
    "fusion_estimate",
    "MELTING_CLASSES",
    "TREND_WEIGHTS",
    "CAUTION",
    "MeltingTrend",
    "MeltingTerms",
    "analyse",
    "formal_salt_reading",
    "describe",
    "explain",
    "melting_trend_index",
    "melting_class_from_index",
    "trend_temperature_K",
    "dannenfelser_yalkowsky_flexibility_entropy_J_mol_K",
    "ion_shape",
    "melting_terms",
    "hydrate_melting_class",
]

# --------------------------------------------------------------------- inputs


@dataclass(frozen=True)
class MeltingTerms:
    """The inputs of :func:`melting_trend_index` for one compound, with their origins."""

    lattice_energy_kJ_mol: float
    lattice_energy_basis: str
    ions_per_formula_unit: float
    contact_chi_pauling: float
    contact_index: float
    pseudo_noble_gas: bool
    polyatomic_anion_fraction: float
    flexibility_entropy_J_mol_K: float
    chain_packing_entropy_J_mol_K: float
    delocalised_fraction: float
    organic: bool
    trivalent_anion_fraction: float = 0.0
    cation_charge_above_3: float = 0.0
    framework_oxoanion_fraction: float = 0.0
    protic_fraction: float = 0.0
    hydrogen_bonded_anion_fraction: float = 0.0
    anion_symmetry_log10: float = 0.0
    hydride_fraction: float = 0.0
    hard_anion_fraction: float = 0.0
    delta_chi_pauling: float = math.nan
    crystal_field_share: float = 0.0
    saline_nitride_fraction: float = 0.0
    soft_pseudohalide_fraction: float = 0.0
    coinage_cation_fraction: float = 0.0
    heavy_halate_fraction: float = 0.0
    organic_anion_fraction: float = 0.0
    polarising_organic_anion_fraction: float = 0.0
    ammonium_cation_fraction: float = 0.0
    rotor_anion_fraction: float = 0.0
    # every cation NH4(+), no monatomic anion: melts with decomposition (ammonium_salt_decomposition_index)
    ammonium_decomposes: bool = False
    # every anion decomposes on heating (DECOMPOSING_ANIONS): decomposing_anion_salt_index
    decomposing_anions: bool = False
    notes: tuple[str, ...] = ()

    @property
    def lattice_energy_per_ion_kJ_mol(self) -> float:
        return self.lattice_energy_kJ_mol / self.ions_per_formula_unit

    def index(self, weights=None) -> float:  # weights: entries of TREND_WEIGHTS replaced (a model file's own)
        return melting_trend_index(
            self.lattice_energy_per_ion_kJ_mol, self.contact_chi_pauling, self.contact_index,
            self.pseudo_noble_gas, self.polyatomic_anion_fraction, self.ions_per_formula_unit,
            self.flexibility_entropy_J_mol_K, self.chain_packing_entropy_J_mol_K, self.delocalised_fraction,
            self.trivalent_anion_fraction, self.cation_charge_above_3, self.framework_oxoanion_fraction,
            self.protic_fraction, self.hydrogen_bonded_anion_fraction, self.anion_symmetry_log10,
            self.hydride_fraction, self.hard_anion_fraction, self.delta_chi_pauling,
            self.crystal_field_share, self.saline_nitride_fraction, self.soft_pseudohalide_fraction,
            self.coinage_cation_fraction, self.heavy_halate_fraction, self.organic_anion_fraction,
            self.polarising_organic_anion_fraction, self.ammonium_cation_fraction, self.rotor_anion_fraction,
            weights=weights,
        )

    def trend_index(self, weights=None) -> float:
        """The salt route's index: :meth:`index`, then, for an ammonium salt of polyatomic anions,
        :func:`scorer.melting_index.ammonium_salt_decomposition_index` (the lattice index alone is what the
        salt weights are fitted on)."""
        lattice_index = self.index(weights)
        if self.ammonium_decomposes:
            return ammonium_salt_decomposition_index(lattice_index, weights)
        if self.decomposing_anions:
            return decomposing_anion_salt_index(lattice_index, weights)
        return lattice_index


@per_input(maxsize=16384)
def melting_terms(dec: Decomposition) -> MeltingTerms | None:
    """Gather the index inputs of an ionic decomposition; None when it is not ionic.

    Lattice energy: the Glasser-Jenkins volume-based estimate of
    :mod:`scorer.lattice`, else its Kapustinskii estimate. Covalency: the
    contact electronegativities of :mod:`scorer.character` and the Fajans
    contact index and 18/18+2-electron flag of :mod:`scorer.fajans`.
    """
    if not dec.is_ionic:
        return None
    energies = lattice.analyse(dec)
    analogue_note = None
    if not (math.isfinite(energies.lattice_energy_vbt_kJ_mol) or math.isfinite(energies.lattice_energy_kapustinskii_kJ_mol)):
        analogue = radius_analogue(dec)
        if analogue is not None:
            energies, analogue_note = lattice.analyse(analogue[0]), analogue[1]
    terms = _gather_terms(dec, energies, fajans.analyse(dec), character.analyse(dec))
    if analogue_note:
        terms = replace(terms, lattice_energy_basis=terms.lattice_energy_basis + "; " + analogue_note,
                        notes=(*terms.notes, "melting trend: " + analogue_note))
    return terms


def _gather_terms(
    dec: Decomposition,
    energies: lattice.LatticeEnergies,
    polarisation: fajans.FajansValues,
    bond: character.BondCharacter,
) -> MeltingTerms:
    notes: list[str] = []
    energy = energies.lattice_energy_vbt_kJ_mol
    basis = "Glasser-Jenkins volume-based lattice energy"
    if not math.isfinite(energy):
        energy = energies.lattice_energy_kapustinskii_kJ_mol
        basis = "Kapustinskii lattice energy (no formula-unit volume for the volume-based one)"
    if not math.isfinite(energy):
        energy, basis = math.nan, "none"
    contact_index = polarisation.fajans_contact_index
    if not math.isfinite(contact_index):
        contact_index = math.nan
        notes.append("melting trend: no Fajans contact index, its covalency term left out")
    png = bool(polarisation.cation_pseudo_noble_gas)
    # the x of van Arkel-Ketelaar: the pair-weighted mean electronegativity of the contact atoms
    chi = bond.mean_chi_pauling
    if not math.isfinite(chi):
        notes.append("melting trend: no Pauling electronegativity for a contact atom, covalency term at the reference")
        chi = TREND_WEIGHTS["reference_contact_chi"]
    decomposing = sorted({t.ion.ion_id for t in dec.anions if t.ion.ion_id in DECOMPOSING_ANIONS})
    if decomposing:
        for ion_id in decomposing:
            notes.append(f"melting trend: {ion_id} decomposes on heating (giving off oxygen, carbon dioxide, sulfur"
                         " dioxide or chlorine compounds): the trend is of the decomposition, the salt may never melt")
        notes.append(_DECOMPOSITION_CAUTION)
    energetic = sorted({t.ion.ion_id for t in dec.anions if t.ion.ion_id in ENERGETIC_ANIONS})
    for ion_id in energetic:
        notes.append(f"melting trend: {ion_id} salts decompose on heating, and heavy-metal ones explode on heating,"
                     " shock or friction: the trend is not a temperature to heat towards")
    fuels = sorted({t.ion.ion_id for t in dec.cations if t.ion.ion_id in FUEL_CATIONS})
    oxidisers = sorted({t.ion.ion_id for t in dec.anions if t.ion.ion_id in OXIDISING_ANIONS})
    if fuels and oxidisers:
        notes.append(f"melting trend: {fuels[0]} with {oxidisers[0]} is fuel and oxidiser in one salt: it decomposes"
                     " exothermically on heating and can explode; the trend is not a temperature to heat towards")
    elif oxidisers:
        # chlorates, perchlorates, permanganates, nitrates: hot or molten oxidisers (molten nitrate salts are
        # handled this way in practice too; Bretherick's Handbook of Reactive Chemical Hazards, from memory)
        notes.append(f"melting trend: {oxidisers[0]} salts are oxidisers: hot or molten they can ignite organic"
                     " matter, reducing agents and powdered metals, and give off oxygen as they decompose; keep them"
                     " apart (see the safety data sheet)")
    if (energetic or fuels and oxidisers) and not decomposing:
        notes.append(_DECOMPOSITION_CAUTION)
    terms = dec.cations + dec.anions
    nu = float(sum(t.count for t in terms))
    anion_total = sum(t.count for t in dec.anions)
    poly = sum(t.count for t in dec.anions if not t.ion.monatomic) / anion_total if anion_total else 0.0
    flex = 0.0
    pack = 0.0
    deloc = 0.0
    free = TREND_WEIGHTS["packing_free_torsions"]
    organic_salt = any(t.ion.organic for t in terms)
    # Beside aprotic organic cations only, the anions rotate freely in the melt: a rigid inorganic ion
    # ([PF6], [BF4]) adds its symmetry term, -R ln sigma, to the Dannenfelser-Yalkowsky entropy, which then
    # carries every ion's orientational entropy, and the polyatomic-anion term (fitted on inorganic salts
    # for the same entropy) is left out. A protic cation's N-H...anion hydrogen bonds, or a small hard
    # inorganic cation bound to the anion's donor atoms (LiTFSI), fix the anion's orientation instead.
    free_rotors = (organic_salt and all(t.ion.organic for t in dec.cations)
                   and not any(t.ion.family == "ammonium-protic" for t in dec.cations))
    for t in terms:
        tau, sigma, delocalised, _ = ion_shape(t.ion)
        if free_rotors and not t.ion.organic and not t.ion.monatomic and t.ion.ion_id not in _shape_table():
            flex += t.count * dannenfelser_yalkowsky_flexibility_entropy_J_mol_K(0.0, routes.ion_symmetry_number(t.ion))
        if t.ion.organic or t.ion.ion_id in _shape_table():
            flex += t.count * dannenfelser_yalkowsky_flexibility_entropy_J_mol_K(tau, sigma)
            if t.ion.family in ONIUM_FAMILIES and sigma < 12:
                # four unequal chains on one centre ([P66614]) cannot line up like polyethylene: no packing
                continue
            pack += t.count * dannenfelser_yalkowsky_flexibility_entropy_J_mol_K(max(tau - free, 0.0))
        # a delocalised anion beside a small hard inorganic cation still binds it through its donor atoms
        anion_with_hard_cation = t in dec.anions and not all(c.ion.organic for c in dec.cations)
        if delocalised and not anion_with_hard_cation:
            deloc += t.count
    # the index is fitted on whole formula units: a reading with half counts (GaCl2 as Ga(+)*0.5
    # with GaCl4(-)*0.5) takes the extensive terms of its smallest whole unit, so GaCl2 and
    # Ga2Cl4 get one index
    whole = lattice.whole_unit_factor(dec.cations, dec.anions)
    if whole != 1:
        energy, nu, flex, pack, deloc = energy * whole, nu * whole, flex * whole, pack * whole, deloc * whole
    return MeltingTerms(
        lattice_energy_kJ_mol=float(energy),
        lattice_energy_basis=basis,
        ions_per_formula_unit=nu,
        contact_chi_pauling=float(chi),
        contact_index=float(contact_index),
        pseudo_noble_gas=png,
        polyatomic_anion_fraction=0.0 if free_rotors else float(poly),
        flexibility_entropy_J_mol_K=float(flex),
        chain_packing_entropy_J_mol_K=float(pack),
        delocalised_fraction=float(deloc / nu) if nu else 0.0,
        organic=organic_salt,
        trivalent_anion_fraction=(
            sum(t.count for t in dec.anions if t.ion.monatomic and t.ion.charge <= -3) / anion_total
            if anion_total else 0.0),
        cation_charge_above_3=float(max(max((t.ion.charge for t in dec.cations), default=0) - 3, 0)),
        protic_fraction=float(sum(t.count for t in dec.cations if t.ion.family == "ammonium-protic") / nu) if nu else 0.0,
        framework_oxoanion_fraction=(
            sum(t.count for t in dec.anions if is_framework_oxoanion(t.ion)) / anion_total if anion_total else 0.0),
        hydrogen_bonded_anion_fraction=(
            sum(t.count for t in dec.anions if is_hydrogen_bonded_anion(t.ion)) / anion_total if anion_total else 0.0),
        # beside free-rotating organic cations the symmetry is in the Dannenfelser-Yalkowsky entropy already
        anion_symmetry_log10=0.0 if free_rotors else (
            sum(t.count * math.log10(anion_symmetry_number(t.ion)) for t in dec.anions if not t.ion.monatomic)
            / anion_total if anion_total else 0.0),
        hydride_fraction=(
            sum(t.count for t in dec.anions if t.ion.ion_id == "H(-)") / anion_total if anion_total else 0.0),
        hard_anion_fraction=(
            sum(t.count for t in dec.anions if is_hard_donor_anion(t.ion)) / anion_total if anion_total else 0.0),
        delta_chi_pauling=float(bond.delta_chi_pauling),
        crystal_field_share=float(sum(t.count * octahedral_high_spin_cfse_delta_o(t.ion) for t in dec.cations) / nu)
        if nu else 0.0,
        saline_nitride_fraction=saline_nitride_fraction(dec.cations, dec.anions),
        soft_pseudohalide_fraction=soft_cation_pseudohalide_fraction(dec.anions, png),
        coinage_cation_fraction=coinage_cation_fraction(dec.cations),
        heavy_halate_fraction=heavy_halate_fraction(dec.anions),
        organic_anion_fraction=coordinating_organic_anion_fraction(dec.cations, dec.anions),
        polarising_organic_anion_fraction=polarising_organic_anion_fraction(dec.cations, dec.anions),
        ammonium_cation_fraction=ammonium_type_cation_fraction(dec.cations, dec.anions),
        ammonium_decomposes=ammonium_polyatomic_salt(dec.cations, dec.anions),
        decomposing_anions=bool(dec.anions) and all(t.ion.ion_id in DECOMPOSING_ANIONS for t in dec.anions)
        and not organic_salt and not ammonium_polyatomic_salt(dec.cations, dec.anions),
        rotor_anion_fraction=rotor_anion_fraction(dec.cations, dec.anions),
        notes=tuple(notes),
    )


# ------------------------------------------------------------ module protocol

_SOURCE_INDEX = (
    "defined here (scorer.melting.melting_trend_index, scorer.melting_routes): salts: lattice energy per ion"
    " (Glasser-Jenkins VBT or Kapustinskii), Fajans covalency, Dannenfelser & Yalkowsky, Ind. Eng. Chem. Res."
    " 1996, 35, 1483 (flexibility); molecules: T = dH/dS, Walden's rule with Dannenfelser-Yalkowsky symmetry;"
    " networks and metals: element melting points (CRC Handbook via chemicals); weights fitted on named"
    " calibration sets (pipelines.melting_weights) and rounded"
)
_BANDS_TEXT = ", ".join(
    f"{name} ({lo:g}-{hi:g} K)" if math.isfinite(hi) else f"{name} (from {lo:g} K)"
    for name, lo, hi, _ in MELTING_CLASS_BANDS
)

#: the --columns group of this module's COLUMNS
GROUP = "melting"

COLUMNS: tuple[Column, ...] = (
    Column(
        "mp_trend_index", "float64", "dimensionless (log10 K scale)",
        "melting trend index for every compound, one scale: higher means a higher expected melting point;"
        " reads as log10 of a trend temperature in K (a step of 0.1 is about 26 %), a ranking aid with a typical"
        " scatter of a factor 1.5, not a prediction; anhydrous compound; "
        + CAUTION,
        "by substance_class (mp_route): salts melting_trend_index (lattice energy per ion, contact"
        " electronegativity, Fajans contact index, 18/18+2-electron cation, polyatomic-anion share, ions per"
        " formula unit, nitride share (saline nitrides apart), 3d crystal-field stabilisation, organic-ion"
        " flexibility and symmetry, chain packing, charge delocalisation); molecules T = dH/dS (melting_routes;"
        " organic molecules read from the formula as written, melting_organic);"
        " chain/layer solids a weighted mean of both;"
        " networks and metals the element-mixture rule",
        _SOURCE_INDEX,
        "salts: lattice energy of the whole formula unit over its ion count; contact terms averaged over"
        " cation-anion pairs weighted by the product of stoichiometric fractions; entropy terms summed over ions;"
        " molecules: sums over peripheral atoms; networks and metals: atom-fraction mean",
    ),
    Column(
        "melting_class", "string", "",
        "band of the trend temperature; salts keep the trade's names, other compounds names of their own: "
        + _BANDS_TEXT + "; from mp_trend_index, so as rough as it; " + CAUTION,
        "melting_class_for: bands of MELTING_CLASS_BANDS on 10**mp_trend_index in K; mixture: the band of"
        " liquidus_estimate_K, with the salts' names when every component takes the salt route (empty without"
        " an estimate, or where a component forms networks in the melt)",
        "ionic liquid: Wasserscheid & Welton, Ionic Liquids in Synthesis, 2008 (from memory); refractory: ISO 836"
        " (from memory); other bounds common practice",
    ),
    Column(
        "mp_route", "string", "",
        "which route gave mp_trend_index: salt, molecular, chain_layer or element_mixture (empty: none applies)",
        "ROUTE_OF_CLASS on substance_class",
        "defined here (scorer.melting_routes)",
    ),
)


MeltingTrend = result_class(
    "MeltingTrend", COLUMNS, "The melting trend of one compound (fields named as the columns) and the terms behind it.",
    extra=(("terms", "MeltingTerms | None", None), ("route_steps", "tuple", ()),
           ("molecular", "_MolecularReading | _OrganicReading | None", None)),
)


_NO_LATTICE_ENERGY = "melting trend: no lattice energy for this salt (see the lattice-energy notes)"
_METAL_ACID = (
    "melting trend: not computed for a metal's acid (its only cation the proton, the metal in the anion): such"
    " acids are kept as hydrates or solutions that lose water and decompose on heating; " + CAUTION
)
_HYDRATE = (
    "melting trend of the anhydrous salt: a hydrate melts in its own water of crystallisation, usually far lower"
)
_LOWER_HYDRATE = (
    "melting class of the hydrate: with {n:g} waters per formula unit (fewer than {limit:g}) a salt hydrate gives off"
    " its water of crystallisation on heating, or melts in it, below about 300 C (lower_salt_hydrate); mp_trend_index"
    " is the anhydrous salt's; " + CAUTION
)
_WATER_RICH_HYDRATE = (
    "melting class of the hydrate: with {n:g} waters per formula unit (at least {limit:g}) a salt hydrate melts or"
    " dissolves in its own water of crystallisation, usually below about 100 C (water_rich_hydrate; Lane 1983);"
    " mp_trend_index is the anhydrous salt's; " + CAUTION
)


def _summary(result: MeltingTrend) -> tuple[str, ...]:
    if result.mp_trend_index != result.mp_trend_index:
        return ()
    head = (
        f"mp_route = {result.mp_route}; mp_trend_index = {fmt(result.mp_trend_index, '.3f')} (trend temperature"
        f" {trend_temperature_K(result.mp_trend_index):.0f} K; a ranking aid, typical scatter a factor 1.5)",
        f"melting_class = {result.melting_class} (bands: {_BANDS_TEXT})",
    )
    salt = _steps(result.terms, result.terms.index()) if result.terms is not None else ()
    if result.terms is not None and result.terms.ammonium_decomposes and result.mp_route == "salt":
        salt = (*salt, _ammonium_step(result.terms))
    elif result.terms is not None and result.terms.decomposing_anions and result.mp_route == "salt":
        w = TREND_WEIGHTS
        salt = (*salt, f"  salt of anions that decompose on heating (oxygen, CO2, SO2 or chlorine compounds given off):"
                       f" I = {w['decomposing_anion_lattice_share']} * {result.terms.index():.3f} +"
                       f" {1 - w['decomposing_anion_lattice_share']:.1f} * log10({w['decomposing_anion_K']:g} K) ="
                       f" {result.terms.trend_index():.3f} ({trend_temperature_K(result.terms.trend_index()):.0f} K;"
                       " decomposing_anion_salt_index)")
    return (*head, *salt, *result.route_steps, *_molecular_steps(result.molecular), "  caution: " + CAUTION)


def _ammonium_step(terms: MeltingTerms) -> str:
    w = TREND_WEIGHTS
    lattice_index = terms.index()
    return (f"  ammonium salt of polyatomic anions (melts with decomposition, NH4X -> NH3 + HX): I ="
            f" {w['ammonium_lattice_share']} * {lattice_index:.3f} + {1 - w['ammonium_lattice_share']:.1f}"
            f" * log10({w['ammonium_decomposition_K']:g} K) = {terms.trend_index():.3f}"
            f" ({trend_temperature_K(terms.trend_index()):.0f} K; ammonium_salt_decomposition_index)")


def _steps(terms: MeltingTerms, index: float) -> tuple[str, ...]:
    w = TREND_WEIGHTS
    u = terms.lattice_energy_per_ion_kJ_mol
    kappa = 0.0 if not math.isfinite(terms.contact_index) else terms.contact_index
    return (
        f"  salt: I = {fmt(index, '.3f')}; T = (10**I_ion * nu*s0 + T_PE*w_s*S_pack) / (nu*s0 + w_s*S_flex),"
        " I = log10 T (melting_trend_index)",
        f"  cohesion: {w['cohesion_exponent']} * log10(u / {w['reference_energy_per_ion_kJ_mol']:g}) with"
        f" u = {terms.lattice_energy_kJ_mol:.0f} kJ/mol / {terms.ions_per_formula_unit:g} ions = {u:.0f} kJ/mol"
        f" ({terms.lattice_energy_basis})",
        f"  covalency: -{w['contact_chi']} * (contact chi {terms.contact_chi_pauling:.3f} - {w['reference_contact_chi']})"
        f", -{w['contact_index']} * Fajans contact index {kappa:.3f}"
        f", -{w['pseudo_noble_gas']} * 18/18+2-electron cation ({'yes' if terms.pseudo_noble_gas else 'no'})",
        f"  entropy: -{w['polyatomic_anion']} * polyatomic-anion share {terms.polyatomic_anion_fraction:.2f}"
        f", -{w['ions_per_formula_unit']} * log10(nu/2), nu = {terms.ions_per_formula_unit:g}",
        f"  nitrides: -{w['trivalent_anion']} * share of monatomic anions of charge -3 or below"
        f" {terms.trivalent_anion_fraction:.2f}; high-valent cation: -{w['high_charge_cation']} *"
        f" (z_max - 3)+ = {terms.cation_charge_above_3:g}; framework oxoanions: +{w['framework_oxoanion']} * share"
        f" {terms.framework_oxoanion_fraction:.2f}",
        f"  protic ammonium ions: -{w['protic']} * their share {terms.protic_fraction:.2f};"
        f" hydrogen-bonded anions: -{w['hydrogen_bonded_anion']} * their share of the anions"
        f" {terms.hydrogen_bonded_anion_fraction:.2f}",
        f"  organic ions: S_flex = {terms.flexibility_entropy_J_mol_K:.1f} J/(mol K), S_pack ="
        f" {terms.chain_packing_entropy_J_mol_K:.1f} J/(mol K) (Dannenfelser-Yalkowsky, w_s = {w['flexibility']},"
        f" s0 = {w['entropy_per_ion_J_mol_K']} J/(mol K) per ion, T_PE = {w['chain_melting_K']} K)",
        f"  charge delocalisation: -{w['delocalised']} * share of delocalised ions with organic counter-ions"
        f" {terms.delocalised_fraction:.2f}",
        f"  cohesion curvature: +{w['cohesion_curvature']} * log10(u / {w['reference_energy_per_ion_kJ_mol']:g})**2;"
        f" ionicity: +{w['contact_delta_chi']} * (delta chi {fmt(terms.delta_chi_pauling, '.3f')}"
        f" - {w['reference_delta_chi']})",
        f"  anion symmetry (Carnelley): +{w['anion_symmetry']} * mean log10 sigma {terms.anion_symmetry_log10:.3f};"
        f" hydride: -{w['hydride_anion']} * share of H- {terms.hydride_fraction:.2f};"
        f" 18/18+2-electron cation beside O/F donors: +{w['pseudo_noble_gas_hard_anion']} * their share"
        f" {terms.hard_anion_fraction:.2f}{'' if terms.pseudo_noble_gas else ' (no such cation: 0)'}",
        f"  crystal field: +{w['crystal_field']} * high-spin octahedral CFSE per ion {terms.crystal_field_share:.2f}"
        f" Delta_o; saline nitride: -{w['saline_nitride']} * share {terms.saline_nitride_fraction:.2f}",
        f"  linear pseudohalides bound by an 18/18+2-electron cation (chains, frameworks):"
        f" +{w['soft_cation_pseudohalide']} * their share of the anions {terms.soft_pseudohalide_fraction:.2f}",
        f"  Cu(+), Ag(+), Au(+) (Born-Haber lattice energy above the point-ion value): +{w['coinage_cation']}"
        f" * their share of the cations {terms.coinage_cation_fraction:.2f}",
        f"  bromate and iodate (X...O secondary bonds join the anions): +{w['heavy_halate']}"
        f" * their share of the anions {terms.heavy_halate_fraction:.2f}",
        f"  organic anions beside inorganic cations only (O donors bind the cations): +{w['coordinating_organic_anion']}"
        f" * their share of the anions {terms.organic_anion_fraction:.2f}; beside d-, p- and f-block cations"
        f" (coordination polymers): +{w['polarising_organic_anion']} * {terms.polarising_organic_anion_fraction:.2f}",
        f"  NH4(+) (N-H hydrogen bonds to inorganic anions): +{w['ammonium_hydrogen_bonds']}"
        f" * its share of the cations times the inorganic anions' share {terms.ammonium_cation_fraction:.2f}",
        f"  OH(-), HS(-), CN(-) beside s-block cations (they turn in the solid; small entropy of fusion):"
        f" +{w['rotor_anion']} * their share of the anions {terms.rotor_anion_fraction:.2f}",
    )


def _salt(dec: Decomposition) -> tuple[float, MeltingTerms | None, list[str]]:
    terms = melting_terms(dec)
    if terms is None:
        return math.nan, None, []
    notes = list(terms.notes)
    if not math.isfinite(terms.lattice_energy_kJ_mol):
        return math.nan, terms, [*notes, _NO_LATTICE_ENERGY]
    for t in dec.cations + dec.anions:
        if t.ion.organic and t.ion.ion_id not in _shape_table():
            notes.append(f"melting trend: flexibility of {t.ion.ion_id} estimated from its composition")
    if terms.ammonium_decomposes and not any(t.ion.ion_id in OXIDISING_ANIONS for t in dec.anions):
        # NH4NO3, NH4ClO4: the fuel-and-oxidiser note says more (they do not simply lose ammonia)
        notes.append(_AMMONIUM_DECOMPOSITION)
    return float(terms.trend_index()), terms, notes


@dataclass(frozen=True)
class _MolecularReading:
    """The molecular route's inputs and results for one compound; its explain
    lines are written from them only when ``ionicity explain`` asks
    (:func:`_molecular_steps`): formatting one alpha per atom was about a third
    of the route's cost for every molecule scored."""

    terms: routes.MolecularTerms
    cohesion_kJ_mol: float
    entropy_J_mol_K: float
    temperature_K: float


@dataclass(frozen=True)
class _OrganicReading:
    """The organic molecular route's inputs and results for one molecule (:mod:`scorer.melting_organic`)."""

    terms: melting_organic.OrganicTerms
    cohesion_kJ_mol: float
    entropy_J_mol_K: float
    temperature_K: float


def organic_acid_groups(dec: Decomposition) -> float:
    """The acid groups of an organic acid read as such: its H(+) per formula unit when the reading is an
    ``acid`` whose every anion is organic (oxalic acid 2, benzoic acid 1); 0 otherwise.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> [organic_acid_groups(decompose(parse_formula(f))) for f in ("C2H2O4", "C7H6O2", "HNO3", "C2H6O")]
    [2.0, 1.0, 0.0, 0.0]
    """
    if dec.substance_class != "acid" or not dec.anions or not all(t.ion.organic for t in dec.anions):
        return 0.0
    return float(sum(t.count for t in dec.cations if t.ion.ion_id == "H(+)"))


# metal compounds written by their organic groups, read by the organic molecular route (scorer.melting_organic)
_METAL_BY_GROUPS = frozenset({ALKOXIDE_HINT, METAL_AMIDE_HINT})


def _molecular(dec: Decomposition) -> tuple[float, _MolecularReading | _OrganicReading | None]:
    organic = melting_organic.organic_terms(dec.composition, TREND_WEIGHTS, organometallic=not dec.cations,
                                            zwitterion="zwitterion" in dec.written_groups,
                                            acid_groups=organic_acid_groups(dec),
                                            metal_by_groups=bool(_METAL_BY_GROUPS & set(dec.written_groups)))
    if organic is not None:
        # a molecular formula of carbon is the molecule itself (C6H6, not CH): read unreduced
        cohesion, entropy = organic.cohesion_kJ_mol(TREND_WEIGHTS), organic.entropy_J_mol_K()
        temperature = routes.molecular_melting_K(cohesion, entropy)
        reading = _OrganicReading(organic, cohesion, entropy, temperature)
        return math.log10(temperature) if temperature > 0 else math.nan, reading
    m = routes.molecular_terms(dec)
    if m is None:
        return math.nan, None
    w = TREND_WEIGHTS
    entropy = routes.walden_dannenfelser_yalkowsky_entropy_J_mol_K(m.symmetry_number, m.torsions_tau)
    cohesion = m.cohesion_kJ_mol(w)
    temperature = routes.molecular_melting_K(cohesion, entropy)
    reading = _MolecularReading(m, cohesion, entropy, temperature)
    return math.log10(temperature) if temperature > 0 else math.nan, reading


def _molecular_steps(reading: _MolecularReading | _OrganicReading | None) -> tuple[str, ...]:
    if reading is None:
        return ()
    if isinstance(reading, _OrganicReading):
        return _organic_steps(reading)
    m, cohesion = reading.terms, reading.cohesion_kJ_mol
    entropy, temperature = reading.entropy_J_mol_K, reading.temperature_K
    w = TREND_WEIGHTS
    return (
        f"  molecular: T = dH_m / dS_m = {cohesion:.1f} kJ/mol / {entropy:.1f} J/(mol K) = {temperature:.0f} K",
        f"  entropy: 56.5 - R ln sigma + R ln 2.435**tau (Walden; Dannenfelser & Yalkowsky 1996), sigma ="
        f" {m.symmetry_number:g}, tau = {m.torsions_tau:g} ({m.basis})",
        f"  cohesion: sum over {len(m.ligand_polarisabilities_A3)} peripheral atoms of ({w['molecular_contact_kJ_mol']}"
        f" + {w['molecular_polarisability_kJ_mol_A3']} * alpha/A3), alphas"
        f" {', '.join(f'{a:.2f}' for a in m.ligand_polarisabilities_A3)}; + {w['molecular_bridge_kJ_mol']} kJ/mol"
        f" * {m.open_sites - m.secondary_contacts} open coordination site(s) bridged in the crystal * Pauling bond"
        f" strength z/CN {m.bond_strength:.3f}",
        *((f"  secondary contacts (Alcock 1972): + {w['molecular_secondary_kJ_mol']} kJ/mol * {m.secondary_contacts}"
           f" contact(s) * z/CN {m.bond_strength:.3f} * electronegativity difference of the primary bond"
           f" {m.primary_delta_chi:.2f}",) if m.secondary_contacts else ()),
        *((f"  hydrogen bonds: + {w['molecular_hydrogen_bond_kJ_mol']} kJ/mol * {m.hydrogen_bond_sites:g} O-H/N-H"
           f" donor site(s)",) if m.hydrogen_bond_sites else ()),
        *((f"  lone pairs (polar molecule, secondary bonds; Alcock 1972): + {w['molecular_lone_pair_kJ_mol']} kJ/mol"
           f" * {m.lone_pairs_counted} stereochemically active lone pair(s) of the centre",)
          if m.lone_pairs_counted else ()),
    )


# said in full in output files too (scorer.note_codes leaves it long)
_DECOMPOSITION_CAUTION = "heating it can release gas and pressure: see the safety data sheet"
@once
def _molecular_oxidisers() -> frozenset:
    """:data:`MOLECULAR_OXIDISERS` as Hill formulas (OsO4 is written O4Os in Hill order)."""
    return frozenset(hill_formula(dict(parse_formula(f).counts)) for f in MOLECULAR_OXIDISERS)


_MOLECULAR_OXIDISER = ("melting trend: a strong oxidiser: it can ignite or react violently with organic matter, fuels,"
                       " reducing agents, ammonia and powdered metals; keep it apart and see the safety data sheet")
# interstitial and intermetallic hydrides lose hydrogen from a few hundred C (TiH2 and ZrH2 from about 400-600 C,
# PdH and LaNi5H6 near room temperature; Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 3.4;
# from memory)
_AMMONIUM_DECOMPOSITION = ("melting trend: an ammonium salt of this kind melts with decomposition or decomposes"
                           " (NH4X -> NH3 + HX): ammonia and the acid are given off on heating; the trend is not a"
                           " temperature to heat towards: see the safety data sheet")
_METAL_HYDRIDE = ("melting trend: a metal hydride gives off its hydrogen (a flammable gas) on heating, far below the"
                  " metal's melting point: the class is that of the metal left behind, not a temperature to heat"
                  " the hydride to")


def _organic_steps(reading: _OrganicReading) -> tuple[str, ...]:
    t, w = reading.terms, TREND_WEIGHTS
    return (
        f"  organic molecule: T = dH_m / dS_m = {reading.cohesion_kJ_mol:.1f} kJ/mol / {reading.entropy_J_mol_K:.1f}"
        f" J/(mol K) = {reading.temperature_K:.0f} K (from the formula alone, no structure)",
        f"  entropy: 56.5 - R ln sigma + R ln 2.435**tau (Walden; Dannenfelser & Yalkowsky 1996), sigma ="
        f" {t.symmetry_number:g} (formula_symmetry_number), tau = {t.torsions_tau:g} (formula_torsions_tau: rings"
        f" plus pi bonds {t.unsaturation:g}, {w['organic_rigid_atoms_per_unsaturation']:g} rigid skeleton atom(s)"
        " each)",
        f"  cohesion: {w['organic_heavy_atom_kJ_mol']} kJ/mol * {t.heavy_atoms:g} heavy atoms +"
        f" {w['organic_polarisability_kJ_mol_A3']} kJ/mol * polarisability {t.polarisability_A3:.2f} A3 +"
        f" {w['organic_hydrogen_bond_kJ_mol']} kJ/mol * {t.hydrogen_bond_sites:g} hydrogen-bond site(s)"
        " (O and N with H, an upper bound)"
        + (f" + {w['organic_zwitterion_kJ_mol']} kJ/mol (a zwitterion: its charged ends attract)" if t.zwitterion
           else "")
        + (f" + {w['organic_acid_group_kJ_mol']} kJ/mol * {t.acid_groups:g} acid group(s) (an organic acid: its"
           " O-H...O=C pairs)" if t.acid_groups else ""),
        "  a rough guide: isomers share a formula and may melt far apart (typical scatter a factor 1.5)",
    )


def formal_salt_reading(dec: Decomposition) -> Decomposition | None:
    """The ionic reading of a compound for the salt index of the chain-layer
    and network routes: its own ions, or the formal ions the applicability
    decision dropped (scorer.applicability: CrO3 as Cr(6+) with O(2-)), read
    as a salt for this purpose only; None without either."""
    if dec.is_ionic and dec.ionic_model != "not_applicable":
        return dec
    if dec.is_ionic:
        cations, anions = dec.cations, dec.anions
    elif dec.formal_ions and dec.formal_ions[0] and dec.formal_ions[1]:
        cations, anions = dec.formal_ions
    else:
        return None
    return dataclasses.replace(dec, cations=cations, anions=anions, substance_class="ionic_salt",
                               ionic_model="applies", formal_ions=())


def hydrate_melting_class(melting_class: str | None, route: str | None, hydrate_water: float,
                          oxide_only: bool = False) -> str | None:
    """The melting class of a compound with its lattice water: a water-rich salt hydrate's own class.

    A salt (``mp_route`` ``salt``) with at least
    :data:`scorer.melting_routes.WATER_RICH_HYDRATE_MIN` waters per formula
    unit melts in its own water of crystallisation
    (:func:`scorer.melting_routes.water_rich_hydrate`): ``melts_in_own_water``;
    every other compound keeps the class of its anhydrous trend index. The
    record (:mod:`scorer.record`, which scores the anhydrous compound once for
    all its hydrates) and :func:`analyse` both ask here.

    A salt with fewer waters (:func:`scorer.melting_routes.lower_salt_hydrate`)
    gives them off on heating below about 300 C: ``loses_water_below_300C``
    (an ionic liquid's hydrate keeps ``ionic_liquid``; an oxide's, ``oxide_only``,
    keeps its class: Al2O3.H2O and Fe2O3.H2O are oxide hydroxides, boehmite
    and goethite, which give their water off at 570-800 K; from memory).

    >>> hydrate_melting_class("molten_salt", "salt", 10.0), hydrate_melting_class("molten_salt", "salt", 2.0)
    ('melts_in_own_water', 'loses_water_below_300C')
    >>> hydrate_melting_class("ionic_liquid", "salt", 1.0), hydrate_melting_class("molten_salt", "salt", 0.0)
    ('ionic_liquid', 'molten_salt')
    >>> hydrate_melting_class("low_melting_solid", "molecular", 6.0)
    'low_melting_solid'
    """
    if melting_class and route == "salt" and routes.water_rich_hydrate(hydrate_water):
        return routes.HYDRATE_MELT_CLASS
    if melting_class and route == "salt" and routes.lower_salt_hydrate(hydrate_water) and not oxide_only and (
            melting_class not in ("ionic_liquid", routes.HYDRATE_MELT_CLASS)):
        # an ionic liquid's water stays dissolved in it: its class already says it is liquid below 100 C
        return routes.LOWER_HYDRATE_CLASS
    return melting_class


def fusion_estimate(dec: Decomposition) -> tuple[float, float, str] | None:
    """(melting point K, enthalpy of fusion J/mol, route) as the melting routes estimate them, for a component
    of a mixture without measured fusion data (:mod:`scorer.mixture`); None where no salt or molecular route
    gives both.

    The salt route's trend temperature ``T`` is ``dH / dS`` with ``dS = nu s0`` plus the organic ions'
    flexibility (:func:`melting_trend_index`), the molecular routes' ``dH / dS`` with Walden's entropy
    corrected by Dannenfelser and Yalkowsky: the enthalpy given is ``T dS`` of the same route, so the pair is
    consistent (NaCl: 1034 K and 25.9 kJ/mol against 1077 K and 28.2 kJ/mol, CRC Handbook). Screening values:
    the trend's scatter (a factor 1.5) carries into any liquidus drawn from them.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> t, h, route = fusion_estimate(decompose(parse_formula("NaCl")))
    >>> round(t), round(h / 1000, 1), route
    (1034, 25.9, 'salt')
    """
    route = routes.ROUTE_OF_CLASS.get(dec.substance_class)
    if route == "salt" and dec.is_ionic:
        terms = melting_terms(dec)
        if terms is None or not math.isfinite(terms.lattice_energy_kJ_mol):
            return None
        w = TREND_WEIGHTS
        s_ion = terms.ions_per_formula_unit * w["entropy_per_ion_J_mol_K"]
        entropy = max(s_ion + w["flexibility"] * terms.flexibility_entropy_J_mol_K, 0.5 * s_ion)
        temperature = trend_temperature_K(terms.trend_index())
    elif route == "molecular" or (route == "salt" and dec.substance_class == "base"):
        _, reading = _molecular(dec)
        if reading is None:
            return None
        entropy, temperature = reading.entropy_J_mol_K, reading.temperature_K
    else:
        return None
    if not (math.isfinite(temperature) and temperature > 0 and entropy > 0):
        return None
    return temperature, temperature * entropy, route


@protocol(title="", columns=COLUMNS, result=MeltingTrend, failure="melting trend not computed",
          summary=_summary, maxsize=16384)
def analyse(dec: Decomposition) -> MeltingTrend:
    """``mp_trend_index``, ``melting_class`` and ``mp_route`` for one compound, with notes and explain steps.

    Never raises (see :mod:`scorer.descriptor`): odd input gives NaN/None and a note.

    Examples
    --------
    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> analyse(decompose(parse_formula("[C2mim][BF4]"))).melting_class
    'ionic_liquid'
    >>> analyse(decompose(parse_formula("MgO"))).melting_class
    'refractory'
    >>> r = analyse(decompose(parse_formula("TiCl4")))
    >>> r.mp_route, r.melting_class
    ('molecular', 'liquid_at_room_temperature')
    """
    route = routes.ROUTE_OF_CLASS.get(dec.substance_class)
    if route == "salt" and not dec.is_ionic:
        # a base without ions is a molecule (NH3, N2H4, amines): the molecular route
        route = "molecular" if dec.substance_class == "base" else None
    terms, notes, steps, reading = None, [], (), None
    index = math.nan
    if dec.substance_class == "acid" and any(is_metal(s) for s, _ in dec.composition):
        # a metal's acid (HMnO4, H2CrO4, HAuCl4, H2PtCl6, H3PW12O40): kept as hydrates or solutions that lose
        # water and decompose on heating (chromic acid near 470 K, tungstic acid to WO3; Greenwood & Earnshaw,
        # 2nd ed., 1997, ch. 23; from memory); the molecular reading gave these from 250 K to 2,800 K
        return MeltingTrend(notes=(_METAL_ACID,), steps=(_METAL_ACID,), mp_route=route)
    if route == "salt":
        index, terms, notes = _salt(dec)
    elif route == "molecular":
        index, reading = _molecular(dec)
    elif route == "chain_layer":
        molecular, reading = _molecular(dec)
        formal = formal_salt_reading(dec)
        salt, terms, notes = _salt(formal) if formal is not None else (math.nan, None, [])
        if math.isfinite(salt) and layered_dichalcogenide_reason(dict(dec.composition)) is not None:
            # sheets of covalent M-X bonds (MoS2): melting breaks those bonds, as in the formal ionic
            # lattice, so its salt index is taken; the mean with a molecular index below is for
            # chains and layers of molecular units bridged by halide or oxide (CrO3, ZnCl2)
            index = salt
            steps = (f"  layered dichalcogenide: melting breaks the covalent M-X bonds of the sheets, the salt"
                     f" index of the formal ionic reading {salt:.3f} is taken",)
        elif math.isfinite(salt) and math.isfinite(molecular):
            share = routes.chain_layer_salt_share(reading.terms if isinstance(reading, _MolecularReading) else None)
            index = routes.chain_layer_index(salt, molecular, share)
            steps = (f"  chain/layer solid: I = weighted mean of the salt index {salt:.3f} (weight {share:.3f}:"
                     f" bridging bonds and Pauling's rule, chain_layer_salt_share) and the molecular index"
                     f" {molecular:.3f} (chain_layer_index)",)
        else:
            index = molecular
            steps = ("  chain/layer solid without an ionic reading: the molecular index alone",)
    elif route == "element_mixture":
        if dec.substance_class in ("intermetallic", "metallic") and any(s == "H" for s, _ in dec.composition):
            # an interstitial hydride (TiH2, ZrH2, PdH0.7, LaNi5H6) gives its hydrogen off on heating, far below
            # the metal's melting point, which is what the element mixture reports (TiH2 as refractory)
            notes.extend((_METAL_HYDRIDE, _DECOMPOSITION_CAUTION))
        temperature, how = routes.element_mixture_melting_K(dec.composition)
        index = math.log10(temperature) if temperature > 0 else math.nan
        steps = (f"  networks and metals (stated rule): T = atom-fraction mean of the elements' melting points"
                 f" (solid at 25 C; CRC Handbook via chemicals) = {temperature:.0f} K, {how}",)
        if dec.substance_class == "intermetallic" and math.isfinite(index):
            variance = routes.intermetallic_mixing_variance(dec.composition)
            index += TREND_WEIGHTS["intermetallic_chi_variance"] * variance
            steps = (*steps, f"  intermetallic: + {TREND_WEIGHTS['intermetallic_chi_variance']} * variance of the"
                             f" Pauling electronegativities {variance:.3f} (heat of formation, Pauling's"
                             f" bond-energy relation) -> {trend_temperature_K(index):.0f} K")
        formal = formal_salt_reading(dec)
        tetrahedral = formal is not None and dec.substance_class == "semiconductor" and any(
            t.ion.ion_id in fallback_radii() for t in formal.anions)
        salt, _, salt_notes = _salt(formal) if formal is not None else (math.nan, None, [])
        partial = not routes.mixture_counts_whole_formula(dec.composition)
        if tetrahedral and math.isfinite(salt) and math.isfinite(index):
            # a III-V semiconductor (GaP, InSb, AlAs) is neither limit: Pauling's crystal radii of P(3-),
            # As(3-), Sb(3-) (fallback_radii.csv) describe those ions in salts (Mg3P2), and its formal ionic
            # reading overestimates (InSb 1960 K against 797 K), while the element mixture counts gallium's and
            # indium's low melting points and drops phosphorus (GaP 303 K against 1730 K): the mean of the two
            # indices is taken (stated rule: its bonds are about a third ionic, Phillips 1970)
            mixture_K = trend_temperature_K(index)
            index = routes.polar_network_index(index, salt)
            steps = (*steps, f"  III-V semiconductor: mean of the mixture index ({mixture_K:.0f} K) and the formal ionic"
                             f" reading's ({trend_temperature_K(salt):.0f} K), polar_network_index ->"
                             f" {trend_temperature_K(index):.0f} K")
        elif math.isfinite(salt) and not salt <= index:
            # a polar network (GaN, AlN) holds at least as well as its ionic reading
            steps = (*steps, f"  the ionic reading is higher, {trend_temperature_K(salt):.0f} K: it is taken"
                     " (a polar network holds at least as well as its ionic lattice)")
            index = salt
            notes.extend(salt_notes)
        elif math.isfinite(salt) and partial:
            # the mixture dropped the gaseous elements (WO3 read as tungsten, 3695 K): the formal
            # ionic reading describes the whole formula (WO3 1487 K against 1745 K measured)
            steps = (*steps, f"  the mixture counts only the elements solid at 25 C, the formula's other atoms"
                     f" drop out: the formal ionic reading, {trend_temperature_K(salt):.0f} K, is taken")
            index = salt
            notes.extend(salt_notes)
        fluid = routes.fluid_element_melting_K(dec.composition) if not math.isfinite(index) else None
        if fluid is not None:
            # the element itself, a gas or a liquid at 25 C (O2, Hg): its own melting point
            index = math.log10(fluid[0])
            steps = (f"  an element that is a gas or a liquid at 25 C: its own melting point, {fluid[0]:.2f} K"
                     f" ({fluid[1]})",)
        if not math.isfinite(index):
            notes.append("melting trend: " + how)
    else:
        reason = "melting trend: no route for substance class " + str(dec.substance_class)
        return MeltingTrend(steps=(reason,))
    if route != "salt" and hill_formula(dict(dec.composition)) in _molecular_oxidisers():
        notes.append(_MOLECULAR_OXIDISER)
    elif any(part.split("*")[0] == "H2O2" for part in dec.neutral_parts):
        # a hydrogen peroxide adduct (sodium percarbonate 2Na2CO3.3H2O2, urea peroxide): it gives off H2O2, an
        # oxidiser, in water and on heating (Greenwood & Earnshaw, 2nd ed., 1997, ch. 14; from memory)
        notes.append(_MOLECULAR_OXIDISER)
    gas = routes.gas_at_room_temperature(dec.composition) if route != "salt" and not dec.hydrate_water else None
    if gas is not None:
        # the registry's boiling point says more than the trend: a gas on the shelf (CO2, NH3, CH4, He)
        notes.append(f"a gas at 25 C: {gas[1]} boils (or sublimes) at {gas[0]:g} K ({routes.GAS_SOURCE}): store and"
                     " handle it as the safety data sheet says for a gas")
    if not math.isfinite(index):
        return MeltingTrend(melting_class=routes.GAS_CLASS if gas is not None else None, notes=tuple(notes),
                            steps=tuple(notes) or ("melting trend: not computed",), terms=terms, mp_route=route)
    band_class = melting_class_for(trend_temperature_K(index), salt=route == "salt")
    if (route == "salt" and terms is not None and (terms.ammonium_decomposes or terms.decomposing_anions)
            and band_class in ("ionic_liquid", "low_melting_salt")):
        # a decomposition band, not a melting point: baking soda is no ionic liquid (decomposition_band_index)
        band_class = routes.DECOMPOSES_CLASS
    melting_class = hydrate_melting_class(
        band_class, route, dec.hydrate_water,
        oxide_only=bool(dec.anions) and all(t.ion.ion_id == "O(2-)" for t in dec.anions))
    if melting_class == routes.HYDRATE_MELT_CLASS:
        notes.append(_WATER_RICH_HYDRATE.format(n=dec.hydrate_water, limit=routes.WATER_RICH_HYDRATE_MIN))
        steps = (*steps, "  " + notes[-1])
    elif melting_class == routes.LOWER_HYDRATE_CLASS:
        notes.append(_LOWER_HYDRATE.format(n=dec.hydrate_water, limit=routes.WATER_RICH_HYDRATE_MIN))
        steps = (*steps, "  " + notes[-1])
    elif dec.hydrate_water:
        notes.append(_HYDRATE)
    if gas is not None:
        melting_class = routes.GAS_CLASS
        steps = (*steps, f"  melting_class = {routes.GAS_CLASS}: {gas[1]} boils (or sublimes) at {gas[0]:g} K, below 25 C")
    return MeltingTrend(
        mp_trend_index=round(float(index), 4),
        melting_class=melting_class,
        mp_route=route,
        terms=terms,
        route_steps=steps,
        molecular=reading,
        notes=tuple(notes),
    )


describe = analyse.describe
explain = analyse.explain
