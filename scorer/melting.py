"""Melting behaviour: a trend index and a melting class for every salt.

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

The torsion counts, symmetry numbers and delocalisation flags of organic and
ionic-liquid ions are in ``scorer/data/ion_shape.csv``. The weights of the
terms were fitted once by least squares to ln T_m of the open training set
that ``ionicity fit-melting`` builds (``chemicals`` 1.5.2; about 540 inorganic
salts) and rounded; the organic-ion terms were then set by hand so
that [C2mim][BF4], [C4mim][PF6] and [C4mim][NTf2] fall below 100 C
(:data:`TREND_WEIGHTS`, which says which checks are calibration and which
validation). No fitting happens at scoring time.

Melting class
-------------
``melting_class`` maps the index through the same log10-kelvin scale
(:func:`melting_class_from_index`, thresholds in :data:`MELTING_CLASSES`):

=====================  ===================  ==========================================================
class                  trend range          origin of the threshold
=====================  ===================  ==========================================================
``ionic_liquid``       below 373.15 K       the trade's definition: a salt melting below 100 C
                                            (Wasserscheid & Welton, Ionic Liquids in Synthesis, 2008;
                                            from memory)
``low_melting_salt``   373.15-573.15 K      up to 300 C: nitrate/nitrite heat-transfer melts, organic
                                            ammonium salts, chloroaluminates (common practice)
``molten_salt``        573.15-1773.15 K     the usual molten-salt range, halides, carbonates,
                                            sulfates and fluorides of the alkali and alkaline-earth
                                            metals (common practice)
``refractory``         1773.15 K and above  refractoriness of at least 1500 C, the ISO 836 definition
                                            of a refractory material (from memory)
=====================  ===================  ==========================================================

Applying a fitted model lives in :mod:`scorer.melting_model`.

The trend and the class are :data:`CAUTION` (from :mod:`scorer.caution`,
the one caution text, quoted in both columns' descriptions).
"""
from __future__ import annotations

import math
from dataclasses import dataclass, replace

import numpy as np
from ionicity.scorer import character, fajans, lattice
from ionicity.scorer import melting_routes as routes
from ionicity.scorer.melting_routes import MELTING_CLASS_BANDS, melting_class_for
from ionicity.scorer.caching import once, per_input
from ionicity.scorer.caution import CAUTION
from ionicity.scorer.descriptor import fmt, protocol, result_class
from ionicity.scorer.ion_library import get_ion
from ionicity.scorer.model import Column, Decomposition, Ion
from ionicity.scorer.tables import table

__all__ = [
    "COLUMNS",
    "MELTING_CLASS_BANDS",
    "MELTING_CLASSES",
    "TREND_WEIGHTS",
    "CAUTION",
    "MeltingTrend",
    "MeltingTerms",
    "analyse",
    "describe",
    "explain",
    "melting_trend_index",
    "melting_class_from_index",
    "trend_temperature_K",
    "dannenfelser_yalkowsky_flexibility_entropy_J_mol_K",
    "ion_shape",
    "melting_terms",
]

GAS_CONSTANT_J_MOL_K = 8.314462618

# (name, upper bound in K, origin); the last class is open-ended.
MELTING_CLASSES: tuple[tuple[str, float, str], ...] = (
    ("ionic_liquid", 373.15, "melts below 100 C, the trade's definition (Wasserscheid & Welton 2008, from memory)"),
    ("low_melting_salt", 573.15, "100-300 C (common practice)"),
    ("molten_salt", 1773.15, "300-1500 C, the usual molten-salt range (common practice)"),
    ("refractory", math.inf, "1500 C and above, ISO 836 refractoriness (from memory)"),
)

# Weights of the terms of melting_trend_index.
# Inorganic terms (intercept ... ions_per_formula_unit): a least-squares fit of
# log10 T_m over the inorganic salts of the open training set (chemicals 1.5.2),
# rounded. Checks on those salts, or on datasets/melting/wikidata_salts.csv (118
# of its 140 salts are in that set), are calibration; validation uses salts
# outside it. pseudo_noble_gas and ions_per_formula_unit are weakly determined.
# entropy_per_ion_J_mol_K and chain_melting_K are physical scales, checked
# against the fusion entropies of the alkali halides and the melting point of
# polyethylene. Organic-ion terms (flexibility, packing_free_torsions,
# delocalised) were set by hand so that [C2mim][BF4], [C4mim][PF6] and
# [C4mim][NTf2] fall below 100 C: calibrated on those three only, and not
# pinned to within +-50 % by the measured data in the tests
# (tests/perturb_trend_weights.py lists which perturbations no test catches).
TREND_WEIGHTS: dict[str, float] = {
    "intercept": 2.99,  # log10 K at the reference energy and chi with no other term
    "reference_energy_per_ion_kJ_mol": 381.0,  # NaCl: volume-based 762 kJ/mol over 2 ions
    "reference_contact_chi": 2.0,  # the fit's centring value (NaCl: (0.93 + 3.16) / 2 = 2.045)
    "cohesion_exponent": 0.70,
    "contact_chi": 0.17,
    "contact_index": 0.27,
    "pseudo_noble_gas": 0.12,
    "polyatomic_anion": 0.125,
    "ions_per_formula_unit": 0.18,
    "entropy_per_ion_J_mol_K": 12.5,  # NaCl: dS_fus 26 J/(mol K) over 2 ions (CRC Handbook, from memory)
    "flexibility": 0.08,
    "chain_melting_K": 414.6,  # polyethylene, the long-chain limit (Wunderlich 1980, from memory)
    "packing_free_torsions": 4.5,  # tau of a hexyl chain: longer chains pack
    "delocalised": 0.15,
    # nitrides and other monatomic anions of charge -3 or below: the volume-based energy
    # of a small triply charged anion overstates the cohesion that melting breaks (Li3N 1086 K);
    # least-squares on the calibration part of the open training set (pipelines.melting_weights)
    "trivalent_anion": 0.21,
    "high_charge_cation": 0.10,
    "framework_oxoanion": 0.39,
    "protic": 0.19,
    # molecular route (scorer.melting_routes.molecular_cohesion_kJ_mol): least squares on the
    # calibration rows of datasets/melting/molecular_compounds.csv (pipelines.melting_weights),
    # rounded; validation on that file's validation rows (the compounds named in the issue)
    "molecular_contact_kJ_mol": 1.1,
    "molecular_polarisability_kJ_mol_A3": 0.61,
    "molecular_bridge_kJ_mol": 7.1,
}


# ------------------------------------------------------------------ equations


def dannenfelser_yalkowsky_flexibility_entropy_J_mol_K(torsions_tau, symmetry_number=1.0):
    """Conformational and symmetry part of the entropy of fusion of one molecule or ion.

    ``dS = R ln Phi - R ln sigma`` with the flexibility number
    ``Phi = 2.435**tau``: the molecule-specific part of Dannenfelser and
    Yalkowsky's entropy of melting, ``dS_m = 56.5 - R ln sigma + R ln Phi``
    J/(mol K), without the constant 56.5 (the positional part, which this
    module counts per ion instead).

    Parameters
    ----------
    torsions_tau : float or array-like
        ``tau = SP3 + 0.5 SP2 + 0.5 RING - 1`` (at least 0): non-terminal,
        non-ring sp3 and sp2 heavy atoms and ring systems.
    symmetry_number : float or array-like, default=1.0
        Rotational symmetry number ``sigma`` (>= 1).

    Returns
    -------
    float or ndarray
        Entropy in J/(mol K).

    References
    ----------
    R. M. Dannenfelser and S. H. Yalkowsky, Ind. Eng. Chem. Res. 1996, 35,
    1483-1486, doi:10.1021/ie940581z (from memory).

    Examples
    --------
    n-butyl on an imidazolium ring (tau = 3 + 0.5 - 1 = 2.5), sigma = 1:

    >>> round(dannenfelser_yalkowsky_flexibility_entropy_J_mol_K(2.5), 1)
    18.5
    >>> round(dannenfelser_yalkowsky_flexibility_entropy_J_mol_K(0.0, 12), 1)
    -20.7
    """
    tau = np.asarray(torsions_tau, dtype=float)
    sigma = np.asarray(symmetry_number, dtype=float)
    value = GAS_CONSTANT_J_MOL_K * (np.maximum(tau, 0.0) * math.log(2.435) - np.log(np.maximum(sigma, 1.0)))
    return float(value) if value.ndim == 0 else value


def melting_trend_index(
    lattice_energy_per_ion_kJ_mol,
    contact_chi_pauling,
    contact_index,
    pseudo_noble_gas,
    polyatomic_anion_fraction,
    ions_per_formula_unit,
    flexibility_entropy_J_mol_K=0.0,
    chain_packing_entropy_J_mol_K=0.0,
    delocalised_fraction=0.0,
    trivalent_anion_fraction=0.0,
    cation_charge_above_3=0.0,
    framework_oxoanion_fraction=0.0,
    protic_fraction=0.0,
    *,
    weights=None,
):
    r"""The melting trend index: log10 of a trend temperature in K (dimensionless).

    Ionic part, a sum of logarithmic terms:

    .. math::

        I_\mathrm{ion} = c_0 + a \log_{10}(u/u_\mathrm{ref})
            - w_\chi (\bar\chi - \bar\chi_\mathrm{ref}) - w_f f - w_p p
            - w_a f_\mathrm{poly} - w_\nu \log_{10}(\nu/2) - w_d f_\mathrm{deloc} - w_3 f_3
            - w_z (z_\mathrm{max} - 3)_+ + w_\mathrm{fw} f_\mathrm{fw}

    then the organic ions' entropy and chain packing, as ``T = dH / dS`` with
    the ionic part carrying ``dS_ion = nu s0`` and ``dH_ion = 10**I_ion dS_ion``:

    .. math::

        T = \frac{10^{I_\mathrm{ion}} \nu s_0 + T_\mathrm{PE}\, w_s S_\mathrm{pack}}
                 {\nu s_0 + w_s S_\mathrm{flex}}, \qquad I = \log_{10} T

    ``u`` lattice energy per ion, ``chi`` mean Pauling electronegativity of the
    atoms in contact, ``f`` Fajans contact index, ``p`` 1 for an 18 or 18+2
    electron cation, ``f_poly`` the share of anions that are polyatomic,
    ``nu`` ions per formula unit, ``f_deloc`` the share of ions whose charge
    is delocalised, ``s0`` the entropy of fusion per ion of a simple salt,
    ``S_flex`` the Dannenfelser-Yalkowsky conformational entropy of the organic
    ions per formula unit (:func:`dannenfelser_yalkowsky_flexibility_entropy_J_mol_K`)
    and ``S_pack`` the part of it from torsions beyond the sixth carbon of a
    chain, which pack like polyethylene and bring their own heat of fusion:
    long-chain salts (soaps) tend to the polyethylene melting point
    ``T_PE = 414.6 K`` (Wunderlich, Macromolecular Physics vol. 3, 1980; from
    memory) instead of melting ever lower. Weights: :data:`TREND_WEIGHTS`.

    Parameters
    ----------
    lattice_energy_per_ion_kJ_mol : float or array-like
        Lattice potential energy over ions per formula unit [kJ/mol].
    contact_chi_pauling : float or array-like
        Mean Pauling electronegativity of the cation-anion contact atoms.
    contact_index : float or array-like
        Fajans contact index (dimensionless); NaN counts as 0.
    pseudo_noble_gas : bool or array-like
        An 18 or 18+2 electron cation is present.
    polyatomic_anion_fraction : float or array-like
        Count share of polyatomic anions, 0 to 1.
    ions_per_formula_unit : float or array-like
        ``nu``.
    flexibility_entropy_J_mol_K : float or array-like, default=0.0
        ``S_flex``: sum over organic ions of count times their flexibility entropy [J/(mol K)].
    chain_packing_entropy_J_mol_K : float or array-like, default=0.0
        ``S_pack`` [J/(mol K)].
    delocalised_fraction : float or array-like, default=0.0
        Count share of ions with a resonance-delocalised charge, 0 to 1;
        an anion counted only beside organic cations (a small hard cation
        such as Li+ binds to the anion's donor atoms: LiTFSI melts at 507 K).
    trivalent_anion_fraction : float or array-like, default=0.0
        Count share of monatomic anions of charge -3 or below (nitrides), weight ``w_3``.
    cation_charge_above_3 : float or array-like, default=0.0
        ``max(z_max - 3, 0)`` for the highest cation charge: Ti4+, Cr6+ and
        the like form molecules, chains or layers, not ionic lattices (weight ``w_z``).
    protic_fraction : float or array-like, default=0.0
        Count share of ions that are protic ammonium cations (family
        ``ammonium-protic``: [EtNH3]+): proton transfer is incomplete and the
        N-H...anion hydrogen bonds leave a liquid of ion pairs (weight ``w_H``).
    framework_oxoanion_fraction : float or array-like, default=0.0
        Count share of oxoanions of network formers with at most three oxygens
        per central atom (AlO2-, BO2-, PO3-, SiO3 2-): chains and frameworks in
        the solid, not rotating molecular ions, so they melt like oxides (``+ w_f``).
    weights : dict, optional
        Replaces entries of :data:`TREND_WEIGHTS` (sensitivity studies).

    Returns
    -------
    float or ndarray
        The index; ``10**I`` is the trend temperature in K.

    Notes
    -----
    The intercept and the inorganic weights come from the least-squares fit
    described in the module docstring, not from one reference salt: NaCl
    (u = 381 kJ/mol per ion from its volume-based 762 kJ/mol, contact chi
    2.045, contact index 0.131) lands at 2.98, a trend temperature of 955 K,
    against 1074 K measured (CRC Handbook, from memory).

    Examples
    --------
    >>> round(melting_trend_index(380.9, 2.045, 0.131, False, 0.0, 2), 3)
    2.98
    >>> round(float(10 ** melting_trend_index(380.9, 2.045, 0.131, False, 0.0, 2)))
    956
    """
    w = TREND_WEIGHTS if weights is None else {**TREND_WEIGHTS, **weights}
    u = np.asarray(lattice_energy_per_ion_kJ_mol, dtype=float)
    chi = np.asarray(contact_chi_pauling, dtype=float)
    kappa = np.nan_to_num(np.asarray(contact_index, dtype=float), nan=0.0)
    png = np.asarray(pseudo_noble_gas, dtype=float)
    poly = np.asarray(polyatomic_anion_fraction, dtype=float)
    nu = np.asarray(ions_per_formula_unit, dtype=float)
    flex = np.asarray(flexibility_entropy_J_mol_K, dtype=float)
    pack = np.asarray(chain_packing_entropy_J_mol_K, dtype=float)
    deloc = np.asarray(delocalised_fraction, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        ionic = (
            w["intercept"]
            + w["cohesion_exponent"] * np.log10(u / w["reference_energy_per_ion_kJ_mol"])
            - w["contact_chi"] * (chi - w["reference_contact_chi"])
            - w["contact_index"] * kappa
            - w["pseudo_noble_gas"] * png
            - w["polyatomic_anion"] * poly
            - w["ions_per_formula_unit"] * np.log10(nu / 2.0)
            - w["delocalised"] * deloc
            - w["trivalent_anion"] * np.asarray(trivalent_anion_fraction, dtype=float)
            - w["high_charge_cation"] * np.asarray(cation_charge_above_3, dtype=float)
            + w["framework_oxoanion"] * np.asarray(framework_oxoanion_fraction, dtype=float)
            - w["protic"] * np.asarray(protic_fraction, dtype=float)
        )
        s_ion = nu * w["entropy_per_ion_J_mol_K"]
        # symmetric rigid ions may lower the entropy, but never below half the ionic part
        s_total = np.maximum(s_ion + w["flexibility"] * flex, 0.5 * s_ion)
        h_total = np.power(10.0, ionic) * s_ion + w["chain_melting_K"] * w["flexibility"] * pack
        value = np.log10(h_total / s_total)
    return float(value) if value.ndim == 0 else value


def trend_temperature_K(index):
    """``10**index``: the index read back on the kelvin scale (for classes and people).

    >>> round(trend_temperature_K(3.0))
    1000
    """
    value = np.power(10.0, np.asarray(index, dtype=float))
    return float(value) if value.ndim == 0 else value


def melting_class_from_index(index) -> str | None:
    """The melting class of a trend index (thresholds in :data:`MELTING_CLASSES`).

    Parameters
    ----------
    index : float
        :func:`melting_trend_index`.

    Returns
    -------
    str or None
        ``ionic_liquid``, ``low_melting_salt``, ``molten_salt`` or
        ``refractory``; None for NaN.

    Examples
    --------
    >>> [melting_class_from_index(x) for x in (2.4, 2.6, 3.0, 3.4, float("nan"))]
    ['ionic_liquid', 'low_melting_salt', 'molten_salt', 'refractory', None]
    """
    if index is None or math.isnan(float(index)):
        return None
    temperature = trend_temperature_K(float(index))
    for name, upper, _ in MELTING_CLASSES:
        if temperature < upper:
            return name
    return MELTING_CLASSES[-1][0]


# --------------------------------------------------------------------- inputs


@once
def _shape_table() -> dict[str, tuple[float, float, bool, str]]:
    """ion_id -> (tau, sigma, charge delocalised, source) from ``scorer/data/ion_shape.csv``."""
    shapes = {}
    for row in table("ion_shape.csv"):
        shapes[row["ion_id"]] = (
            float(row["torsions_tau"]),
            float(row["symmetry_number"]),
            row["charge_delocalised"].strip().lower() == "true",
            row["source"],
        )
    return shapes


def ion_shape(ion: Ion) -> tuple[float, float, bool, str]:
    """(tau, sigma, charge delocalised, basis) of an ion.

    Tabulated ions come from ``scorer/data/ion_shape.csv``. An organic ion
    missing there gets an estimate from its composition: every carbon, nitrogen,
    oxygen, sulfur or phosphorus atom beyond the fifth counted as half a
    torsion, sigma 1, charge localised (common practice, said in the basis).
    Inorganic ions not in the table are rigid: tau 0, sigma 1.

    >>> from ionicity.scorer.ion_library import get_ion
    >>> ion_shape(get_ion("[C4mim](+)"))[:3]
    (2.5, 1.0, True)
    """
    shapes = _shape_table()
    if ion.ion_id in shapes:
        tau, sigma, deloc, _ = shapes[ion.ion_id]
        return tau, sigma, deloc, "scorer/data/ion_shape.csv"
    if ion.organic:
        heavy = sum(n for s, n in ion.composition if s in ("C", "N", "O", "S", "P"))
        return max(0.0, (heavy - 5) * 0.5), 1.0, False, "estimated from the composition (no ion_shape.csv entry)"
    return 0.0, 1.0, False, "rigid inorganic ion"


ONIUM_FAMILIES = frozenset({"ammonium-quaternary", "phosphonium"})
NETWORK_FORMERS = frozenset({"B", "Al", "Ga", "Si", "Ge", "P", "As", "Ti", "Zr", "V", "Fe"})


def is_framework_oxoanion(ion: Ion) -> bool:
    """An oxoanion of one network-forming element with at most 3 O per central atom (chains, frameworks).

    Metaborate, aluminate, metasilicate, metaphosphate, ferrite, titanate,
    zirconate: in the solid they share oxygen corners (the O:X ratio below 4
    says so), unlike the discrete SO4 2-, NO3- or ClO4- ions (common practice).

    >>> is_framework_oxoanion(get_ion("AlO2(-)")), is_framework_oxoanion(get_ion("SO4(2-)"))
    (True, False)
    """
    comp = dict(ion.composition)
    others = [e for e in comp if e != "O"]
    return (len(others) == 1 and others[0] in NETWORK_FORMERS and comp.get("O", 0) > 0
            and comp["O"] / comp[others[0]] <= 3)


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
    notes: tuple[str, ...] = ()

    @property
    def lattice_energy_per_ion_kJ_mol(self) -> float:
        return self.lattice_energy_kJ_mol / self.ions_per_formula_unit

    def index(self) -> float:
        return melting_trend_index(
            self.lattice_energy_per_ion_kJ_mol, self.contact_chi_pauling, self.contact_index,
            self.pseudo_noble_gas, self.polyatomic_anion_fraction, self.ions_per_formula_unit,
            self.flexibility_entropy_J_mol_K, self.chain_packing_entropy_J_mol_K, self.delocalised_fraction,
            self.trivalent_anion_fraction, self.cation_charge_above_3, self.framework_oxoanion_fraction,
            self.protic_fraction,
        )


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
        analogue = _radius_analogue(dec)
        if analogue is not None:
            energies, analogue_note = lattice.analyse(analogue[0]), analogue[1]
    terms = _gather_terms(dec, energies, fajans.analyse(dec), character.analyse(dec))
    if analogue_note:
        terms = replace(terms, lattice_energy_basis=terms.lattice_energy_basis + "; " + analogue_note,
                        notes=(*terms.notes, "melting trend: " + analogue_note))
    return terms


# Cations with no Shannon radius, and the cation of the same group and charge whose
# radius stands in for theirs in the lattice energy (both ns2 lone-pair ions; Sn2+ is
# not in Shannon's table, Acta Cryst. 1976, A32, 751, from memory; Pb2+ is, 119 pm)
RADIUS_ANALOGUES: dict[str, str] = {"Sn(2+)": "Pb(2+)"}


def _radius_analogue(dec: Decomposition) -> tuple[Decomposition, str] | None:
    """The decomposition with each cation of :data:`RADIUS_ANALOGUES` replaced by its stand-in."""
    swapped, used = [], []
    for t in dec.cations:
        stand_in = RADIUS_ANALOGUES.get(t.ion.ion_id)
        if stand_in is None:
            swapped.append(t)
            continue
        swapped.append(replace(t, ion=get_ion(stand_in)))
        used.append(f"{t.ion.ion_id} has no Shannon radius: lattice energy with the radius of {stand_in}")
    if not used:
        return None
    return replace(dec, cations=tuple(swapped)), "; ".join(used)


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
    terms = dec.cations + dec.anions
    nu = float(sum(t.count for t in terms))
    anion_total = sum(t.count for t in dec.anions)
    poly = sum(t.count for t in dec.anions if not t.ion.monatomic) / anion_total if anion_total else 0.0
    flex = 0.0
    pack = 0.0
    deloc = 0.0
    free = TREND_WEIGHTS["packing_free_torsions"]
    for t in terms:
        tau, sigma, delocalised, _ = ion_shape(t.ion)
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
    return MeltingTerms(
        lattice_energy_kJ_mol=float(energy),
        lattice_energy_basis=basis,
        ions_per_formula_unit=nu,
        contact_chi_pauling=float(chi),
        contact_index=float(contact_index),
        pseudo_noble_gas=png,
        polyatomic_anion_fraction=float(poly),
        flexibility_entropy_J_mol_K=float(flex),
        chain_packing_entropy_J_mol_K=float(pack),
        delocalised_fraction=float(deloc / nu) if nu else 0.0,
        organic=any(t.ion.organic for t in terms),
        trivalent_anion_fraction=(
            sum(t.count for t in dec.anions if t.ion.monatomic and t.ion.charge <= -3) / anion_total
            if anion_total else 0.0),
        cation_charge_above_3=float(max(max((t.ion.charge for t in dec.cations), default=0) - 3, 0)),
        protic_fraction=float(sum(t.count for t in dec.cations if t.ion.family == "ammonium-protic") / nu) if nu else 0.0,
        framework_oxoanion_fraction=(
            sum(t.count for t in dec.anions if is_framework_oxoanion(t.ion)) / anion_total if anion_total else 0.0),
        notes=tuple(notes),
    )


# ------------------------------------------------------------ module protocol

_SOURCE_INDEX = (
    "defined here (scorer.melting.melting_trend_index, scorer.melting_routes): salts: lattice energy per ion"
    " (Glasser-Jenkins VBT or Kapustinskii), Fajans covalency, Dannenfelser & Yalkowsky, Ind. Eng. Chem. Res."
    " 1996, 35, 1483 (flexibility); molecules: T = dH/dS, Walden's rule with Dannenfelser-Yalkowsky symmetry;"
    " networks and metals: element melting points (CRC Handbook via chemicals); weights fitted to open melting"
    " points (chemicals 1.5.2) and rounded"
)
_BANDS_TEXT = ", ".join(
    f"{name} ({lo:g}-{hi:g} K)" if math.isfinite(hi) else f"{name} (from {lo:g} K)"
    for name, lo, hi, _ in MELTING_CLASS_BANDS
)

COLUMNS: tuple[Column, ...] = (
    Column(
        "mp_trend_index", "float64", "dimensionless (log10 K scale)",
        "melting trend index for every compound, one scale: higher means a higher expected melting point;"
        " reads as log10 of a trend temperature in K (a step of 0.1 is about 26 %), a ranking aid with a typical"
        " scatter of a factor 1.5, not a prediction; anhydrous compound; "
        + CAUTION,
        "by substance_class (mp_route): salts melting_trend_index (lattice energy per ion, contact"
        " electronegativity, Fajans contact index, 18/18+2-electron cation, polyatomic-anion share, ions per"
        " formula unit, nitride share, organic-ion flexibility and symmetry, chain packing, charge"
        " delocalisation); molecules T = dH/dS (melting_routes); chain/layer solids the mean of both;"
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
        "melting_class_for: bands of MELTING_CLASS_BANDS on 10**mp_trend_index in K",
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
    extra=(("terms", "MeltingTerms | None", None), ("route_steps", "tuple", ())),
)


_NO_LATTICE_ENERGY = "melting trend: no lattice energy for this salt (see the lattice-energy notes)"
_HYDRATE = (
    "melting trend of the anhydrous salt: a hydrate melts in its own water of crystallisation, usually far lower"
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
    return (*head, *salt, *result.route_steps, "  caution: " + CAUTION)


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
        f"  protic ammonium ions: -{w['protic']} * their share {terms.protic_fraction:.2f}",
        f"  organic ions: S_flex = {terms.flexibility_entropy_J_mol_K:.1f} J/(mol K), S_pack ="
        f" {terms.chain_packing_entropy_J_mol_K:.1f} J/(mol K) (Dannenfelser-Yalkowsky, w_s = {w['flexibility']},"
        f" s0 = {w['entropy_per_ion_J_mol_K']} J/(mol K) per ion, T_PE = {w['chain_melting_K']} K)",
        f"  charge delocalisation: -{w['delocalised']} * share of delocalised ions with organic counter-ions"
        f" {terms.delocalised_fraction:.2f}",
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
    return float(terms.index()), terms, notes


def _molecular(dec: Decomposition) -> tuple[float, tuple[str, ...]]:
    m = routes.molecular_terms(dec)
    if m is None:
        return math.nan, ()
    w = TREND_WEIGHTS
    entropy = routes.walden_dannenfelser_yalkowsky_entropy_J_mol_K(m.symmetry_number, m.torsions_tau)
    cohesion = routes.molecular_cohesion_kJ_mol(m.ligand_polarisabilities_A3, m.open_sites, w)
    temperature = routes.molecular_melting_K(cohesion, entropy)
    steps = (
        f"  molecular: T = dH_m / dS_m = {cohesion:.1f} kJ/mol / {entropy:.1f} J/(mol K) = {temperature:.0f} K",
        f"  entropy: 56.5 - R ln sigma + R ln 2.435**tau (Walden; Dannenfelser & Yalkowsky 1996), sigma ="
        f" {m.symmetry_number:g}, tau = {m.torsions_tau:g} ({m.basis})",
        f"  cohesion: sum over {len(m.ligand_polarisabilities_A3)} peripheral atoms of ({w['molecular_contact_kJ_mol']}"
        f" + {w['molecular_polarisability_kJ_mol_A3']} * alpha/A3), alphas"
        f" {', '.join(f'{a:.2f}' for a in m.ligand_polarisabilities_A3)}; + {w['molecular_bridge_kJ_mol']} kJ/mol"
        f" * {m.open_sites} open coordination site(s) bridged in the crystal",
    )
    return math.log10(temperature) if temperature > 0 else math.nan, steps


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
        route = None
    terms, notes, steps = None, [], ()
    index = math.nan
    if route == "salt":
        index, terms, notes = _salt(dec)
    elif route == "molecular":
        index, steps = _molecular(dec)
    elif route == "chain_layer":
        molecular, steps = _molecular(dec)
        salt, terms, notes = _salt(dec) if dec.is_ionic else (math.nan, None, [])
        if math.isfinite(salt) and math.isfinite(molecular):
            index = routes.chain_layer_index(salt, molecular)
            steps = (f"  chain/layer solid: I = mean of the salt index {salt:.3f} and the molecular index"
                     f" {molecular:.3f} (chain_layer_index)", *steps)
        else:
            index = molecular
            steps = ("  chain/layer solid without an ionic reading: the molecular index alone", *steps)
    elif route == "element_mixture":
        temperature, how = routes.element_mixture_melting_K(dec.composition)
        index = math.log10(temperature) if temperature > 0 else math.nan
        steps = (f"  networks and metals (stated rule): T = atom-fraction mean of the elements' melting points"
                 f" (solid at 25 C; CRC Handbook via chemicals) = {temperature:.0f} K, {how}",)
        if not math.isfinite(index):
            notes.append("melting trend: " + how)
    else:
        reason = "melting trend: no route for substance class " + str(dec.substance_class)
        return MeltingTrend(steps=(reason,))
    if not math.isfinite(index):
        return MeltingTrend(notes=tuple(notes), steps=tuple(notes) or ("melting trend: not computed",),
                            terms=terms, mp_route=route)
    if dec.hydrate_water:
        notes.append(_HYDRATE)
    return MeltingTrend(
        mp_trend_index=round(float(index), 4),
        melting_class=melting_class_for(trend_temperature_K(index), salt=route == "salt"),
        mp_route=route,
        terms=terms,
        route_steps=steps,
        notes=tuple(notes),
    )


describe = analyse.describe
explain = analyse.explain
