"""Equations and weights of the salt melting trend index (read through :mod:`scorer.melting`).

:data:`TREND_WEIGHTS` (every weight, with the set it was fitted on),
:func:`melting_trend_index` (the salt index), the Dannenfelser-Yalkowsky
flexibility entropy and the salt thresholds. Kept apart from the gathering of
inputs and the descriptor protocol in :mod:`scorer.melting`, which re-exports
these names; the routes for other compounds are in :mod:`scorer.melting_routes`.
"""
from __future__ import annotations

import math

import numpy as np

__all__ = [
    "GAS_CONSTANT_J_MOL_K",
    "MELTING_CLASSES",
    "TREND_WEIGHTS",
    "dannenfelser_yalkowsky_flexibility_entropy_J_mol_K",
    "melting_trend_index",
    "ammonium_salt_decomposition_index",
    "decomposing_anion_salt_index",
    "decomposition_band_index",
    "trend_temperature_K",
    "melting_class_from_index",
]

GAS_CONSTANT_J_MOL_K = 8.314462618

# (name, upper bound in K, origin); the last class is open-ended.
MELTING_CLASSES: tuple[tuple[str, float, str], ...] = (
    ("ionic_liquid", 373.15, "melts below 100 C, the trade's definition (Wasserscheid & Welton 2008, from memory)"),
    ("low_melting_salt", 573.15, "100-300 C (common practice)"),
    ("molten_salt", 1773.15, "300-1500 C, the usual molten-salt range (common practice)"),
    ("refractory", math.inf, "1500 C and above, ISO 836 refractoriness (from memory)"),
)

# Weights of the terms of melting_trend_index; every one fitted on a named calibration
# set and checked on another (python -m ionicity.pipelines.melting_weights prints both):
# * inorganic terms (intercept ... hydrogen_bonded_anion, cohesion_curvature ...
#   pseudo_noble_gas_hard_anion, rotor_anion): least squares of log10 T_m on the calibration set, then
#   every weight times the spread factor sd(log10 T_m) / sd(fitted) = 1.204 (least squares
#   shrinks toward the mean; matching the spread keeps the refractory oxides refractory),
#   rounded; then the second-stage terms (crystal_field, saline_nitride, soft_cation_pseudohalide,
#   coinage_cation, heavy_halate) by least squares of the
#   calibration residuals with the weights above held (corrections on top of the ionic index,
#   as the organic terms are). Calibration set: datasets/melting/wikidata_salts.csv (CC0, 128 salts with an
#   index) and the calibration half of the open training set fit-melting builds at run
#   time from chemicals (223 salts; the half chosen by the parity of a SHA-256 digest of
#   formula_normalized, pipelines.melting_weights.open_set_half). Validation: the other
#   half (224 salts), never fitted on. Last refit 5 December 2026 (seventh round), when the hydroxides of
#   the alkali metals, Sr and Ba joined the open set (LiOH, NaOH, Sr(OH)2 in the calibration half) and
#   rotor_anion the index (every weight moved by at most 0.008: hydrogen_bonded_anion 0.047 -> 0.039,
#   organic flexibility 0.093 -> 0.085, protic 0.106 -> 0.1025, the value at which their Nelder-Mead fit
#   stays put, where 0.102 and 0.103 each refit to the other). Before that, when ammonium dinitramide
#   (365 K) joined the calibration half (the dinitramide ion joined the library; every weight
#   moved by at most 0.004); before that, 4 December 2026, when the narrow-gap semiconductors
#   (PbTe, Cu2Te) left the salt sets (scorer.applicability).
# * organic terms (flexibility, delocalised, protic): Nelder-Mead on the calibration rows
#   of datasets/melting/ionic_liquids.csv with the inorganic terms held; validation: its
#   validation rows and the organic salts of the open training set. The last refit, after
#   the inorganic refit above, gave 0.093, 0.293, 0.106 (0.088, 0.287, 0.098 before it). packing_free_torsions is set by hand (the
#   hexyl chain), entropy_per_ion_J_mol_K and chain_melting_K are physical scales,
#   checked against fusion entropies of the alkali halides and polyethylene.
# * molecular route (molecular_*): least squares of dH_m on the calibration rows of
#   datasets/melting/molecular_compounds.csv; validation on its validation rows. The last refit
#   (bridges weighted by Pauling's z/CN, issue 13) gave 1.083, 0.601, 9.364, and 7.508 for
#   secondary contacts (fixed by HgCl2, the one calibration row that has them); with the lone-pair
#   term added to the same fit (4 December 2026): 1.066, 0.569, 9.749, 7.611 and 2.912 per lone pair.
# tests/perturb_trend_weights.py lists which +-50 % changes no test catches.
TREND_WEIGHTS: dict[str, float] = {
    "intercept": 3.04,  # log10 K at the reference energy and chi with no other term
    "reference_energy_per_ion_kJ_mol": 381.0,  # NaCl: volume-based 762 kJ/mol over 2 ions
    "reference_contact_chi": 2.0,  # the fit's centring value (NaCl: (0.93 + 3.16) / 2 = 2.045)
    "cohesion_exponent": 0.556,
    "contact_chi": 0.261,
    "contact_index": 0.208,
    "pseudo_noble_gas": 0.09,
    "polyatomic_anion": 0.312,
    "ions_per_formula_unit": 0.231,
    "entropy_per_ion_J_mol_K": 12.5,  # NaCl: dS_fus 26 J/(mol K) over 2 ions (CRC Handbook, from memory)
    "flexibility": 0.085,
    "chain_melting_K": 414.6,  # polyethylene, the long-chain limit (Wunderlich 1980, from memory)
    "packing_free_torsions": 4.5,  # tau of a hexyl chain: longer chains pack
    "delocalised": 0.292,
    # nitrides: the volume-based energy of a small triply charged anion overstates the
    # cohesion that melting breaks (Li3N 1086 K)
    "trivalent_anion": 0.217,
    "high_charge_cation": 0.129,
    "framework_oxoanion": 0.144,
    "protic": 0.1025,
    # anions that carry hydrogen (HF2-, HSO4-, OH-): hydrogen bonds between the anions
    "hydrogen_bonded_anion": 0.039,
    # the melting point grows faster than a power of the cohesion at the refractory end
    "cohesion_curvature": 0.17,
    # the other axis of the van Arkel-Ketelaar triangle: ionic contacts hold better
    "contact_delta_chi": 0.056,
    "reference_delta_chi": 2.0,  # the fit's centring value (NaCl: 3.16 - 0.93 = 2.23)
    # Carnelley's rule for the anion: log10 of its rotational symmetry number
    "anion_symmetry": 0.182,
    # H-: small, compressible, the hydrides decompose near melting
    "hydride_anion": 0.261,
    # eases the 18/18+2-electron penalty beside O and F donors (ZnO, SnO2 refractory)
    "pseudo_noble_gas_hard_anion": 0.085,
    # second stage (fitted on the calibration residuals, the weights above held):
    # d3/d8 crystal-field stabilisation the point-ion lattice energy misses (NiO, Cr2O3)
    "crystal_field": 0.101,
    # saline nitrides (s-block cations with N3-): ionic, decomposing low (Ca3N2 1468 K)
    "saline_nitride": 0.206,
    # linear pseudohalides bound at both ends by 18/18+2-electron cations: chains and
    # frameworks, not the molecules and layers the covalency terms stand for (TlN3 607 K)
    "soft_cation_pseudohalide": 0.316,
    # Cu(+), Ag(+), Au(+): Born-Haber lattice energies about 10 % above the point-ion value
    # (AgCl, CuI), a covalent cohesion the volume-based lattice energy misses
    "coinage_cation": 0.096,
    # bromates and iodates: the X(V) lone pair's long X...O secondary bonds join the anions into a
    # network the point-ion lattice energy misses (KIO3 833 K)
    "heavy_halate": 0.123,
    # organic anions beside inorganic cations only (metal carboxylates, alkoxides, sulfonates): their O donors
    # bind the cations (coordination polymers), a cohesion the volume-based energy of the whole anion misses;
    # least squares of the log10 residuals of the calibration half of such salts in the open set, every other
    # weight held (pipelines.melting_weights.fit_organic_anion_weights); validation: the other half. Refit on
    # 5 December 2026 (second round) when sodium cyclamate joined the calibration half (the cyclamate ion joined
    # the library; 34 rows): 0.120 -> 0.122. Third round: fitted together with the next weight (the same half, a
    # grid of 0.001; pipelines.melting_weights.fit_organic_anion_weights): 0.122 -> 0.078. Fourth round: 0.078 ->
    # 0.076 when the dithiocarbamates joined the ion library and three of their salts (sodium and ammonium
    # dimethyl-, sodium diethyldithiocarbamate) the open set. Fifth round: 0.076 -> 0.077 when salicylate joined
    # the ion library and salicylates and lactates read as salts of the open set (714 salts, 705 before)
    "coordinating_organic_anion": 0.079,
    # the same anions beside d-, p- and f-block cations (coordination polymers through covalent M-O bonds), on top:
    # with one weight the calibration half came out 0.065 low beside those cations and 0.077 high beside the
    # s-block ones; validation half (40 rows): within a factor 1.5 0.825 -> 0.900, mean |log10 error|
    # 0.115 -> 0.093. Fourth round, refitted with the weight above: 0.109 -> 0.111; fifth round 0.111 -> 0.110
    "polarising_organic_anion": 0.107,
    # NH4(+) beside inorganic anions: N-H...anion hydrogen bonds, a cohesion the contact-electronegativity
    # term reads as covalency; second stage, fitted with the five above on the calibration residuals
    # (pipelines.melting_weights.fit_salt_residual_weights); validation: the other half. Fitted 5 December 2026
    # (fourth round) on 12 calibration salts (NH4NO3, NH4H2PO4, NH4SCN... and NH4F at 273 K, a Wikidata value
    # far below its sublimation, which pulls the weight down; kept: the calibration data are not edited for a
    # fit); heavy_halate moved 0.129 -> 0.123 in the same fit (NH4IO3 carries both terms)
    "ammonium_hydrogen_bonds": 0.045,
    # OH(-), HS(-), CN(-) in salts of s-block cations: these diatomic anions turn freely in the solid below the
    # melting point (rotator phases), so the entropy of fusion is small and the salts melt above what the
    # polyatomic-anion term gives them (NaOH 596 K, KCN 907 K); an inorganic term, fitted with the first group
    # (spread matched). Added 5 December 2026 (seventh round) when the hydroxides of the alkali metals, Sr and
    # Ba joined the open set (pipelines.melting_screen.melts_as_hydroxide); as a second-stage term it came out
    # 0.067, but the hydroxides' residual then went half into hydrogen_bonded_anion (0.047 -> 0.029) in the
    # first stage, which is fitted without it
    "rotor_anion": 0.05,
    # ammonium salts of polyatomic anions (every cation NH4(+), no monatomic anion: NH4NO3, NH4H2PO4, NH4SCN,
    # ammonium acetate) melt with decomposition or decompose first, by proton transfer (NH4X -> NH3 + HX), in a
    # narrow band that the lattice index does not follow (ammonium_salt_decomposition_index); both constants fitted
    # on the 15 such salts of the calibration half (pipelines.melting_weights.fit_ammonium_decomposition: the share
    # on a grid of 0.1 by mean |log10 error|, the level the median), validation on the other half's 8
    "ammonium_decomposition_K": 426.0,
    "ammonium_lattice_share": 0.2,
    # salts whose every anion decomposes on heating (scorer.melting_anions.DECOMPOSING_ANIONS: peroxides,
    # hypochlorites, hydrogencarbonates, disulfites ...): the same band form, fitted the same way on the 9 such
    # salts of the calibration half (decomposing_anion_salt_index)
    "decomposing_anion_K": 319.0,
    "decomposing_anion_lattice_share": 0.5,
    # intermetallics (element-mixture route): log10 of the measured over the rule-of-mixtures
    # melting point per unit of the electronegativity variance (Pauling's heat of formation),
    # least squares through the origin on the calibration rows of
    # datasets/melting/intermetallic_compounds.csv (pipelines.melting_weights.fit_intermetallic_weight)
    "intermetallic_chi_variance": 0.554,
    # molecular route (scorer.melting_routes.molecular_cohesion_kJ_mol)
    "molecular_contact_kJ_mol": 1.07,
    "molecular_polarisability_kJ_mol_A3": 0.569,
    # per valence unit of bridges (open sites times Pauling's z / CN; Al2Br6: 1 * 3/4)
    "molecular_bridge_kJ_mol": 9.75,
    # per valence unit and unit of the primary bond's delta chi (HgCl2: 4 * 2/6 * 1.26)
    "molecular_secondary_kJ_mol": 7.61,
    # per stereochemically active lone pair of a p-block centre (PCl3 1, SCl2 2, XeF2 3), fitted with the
    # four above (PCl3, PBr3, AsCl3, SOCl2 are the calibration rows that have one)
    "molecular_lone_pair_kJ_mol": 2.91,
    # per O-H or N-H donor site of an inorganic molecule (boric acid 3, hydrazine 2): least squares of
    # dH_m in relative errors, the five weights above held (refitted after the lone-pair term: 2.97 -> 3.08), on the calibration half of
    # datasets/melting/hydrogen_bonded_molecules.csv (pipelines.melting_weights.fit_molecular_hydrogen_bond_weight)
    "molecular_hydrogen_bond_kJ_mol": 3.08,
    # organic molecular route (scorer.melting_organic): least squares of log10 T_m
    # (T_m = dH_m / dS_m, linear in these three) on the calibration half of datasets/melting/organic_molecules.csv
    # (pipelines.melting_weights.fit_organic_molecule_weights); per heavy atom, per
    # angstrom^3 of polarisability, per hydrogen-bond site
    # (refitted 4 December 2026, night, when 16 CAS numbers joined the set: diamines and dimethylhydrazines
    # that had read as ammonium carbides, and cyanogen and 2-butynedinitrile, read as networks before;
    # 0.612, 0.637, 4.19 before; refitted again 4 December 2026, evening, when 154 CAS numbers joined: Hill
    # formulas the registry knows only as molecules that had read as organic salts, scorer.registry_formulas;
    # 0.658, 0.621, 4.14 before; refitted 5 December 2026, eighth round, when carbonyl dicyanide C3N2O, read as
    # a covalent network before, joined: 0.64, 0.626, 4.22 before)
    "organic_heavy_atom_kJ_mol": 0.655,
    "organic_polarisability_kJ_mol_A3": 0.621,
    "organic_hydrogen_bond_kJ_mol": 4.2,
    # per molecule that is a zwitterion in the solid (a named amino acid or inner salt, the registry's structure):
    # least squares of log10 T_m on the calibration half of datasets/melting/zwitterions.csv, the three above held
    # (pipelines.melting_weights.fit_zwitterion_weight)
    "organic_zwitterion_kJ_mol": 14.6,
    # organic acids read as such (H(+) beside a library anion): per acid group, on top of the sites above; fitted
    # on the calibration half of datasets/melting/organic_acids.csv (CRC carboxylic and sulfonic acids the scorer
    # reads as acids with as many H(+) as their SMILES has acid groups), the others held
    # (pipelines.melting_weights.fit_organic_acid_weight); validation: the other half
    "organic_acid_group_kJ_mol": 3.19,
    # the formula reading's two constants, each chosen on the same calibration half by its
    # Spearman rho over a grid (0.75 ... 2 and 1, 2, 4;
    # pipelines.melting_weights.choose_organic_constants): skeleton atoms held rigid per
    # ring or pi bond, and sigma of a hydrocarbon or perhalocarbon
    "organic_rigid_atoms_per_unsaturation": 1.0,
    "organic_uniform_symmetry_number": 2.0,
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
    hydrogen_bonded_anion_fraction=0.0,
    anion_symmetry_log10=0.0,
    hydride_fraction=0.0,
    hard_anion_fraction=0.0,
    delta_chi_pauling=math.nan,
    crystal_field_share=0.0,
    saline_nitride_fraction=0.0,
    soft_pseudohalide_fraction=0.0,
    coinage_cation_fraction=0.0,
    heavy_halate_fraction=0.0,
    organic_anion_fraction=0.0,
    polarising_organic_anion_fraction=0.0,
    ammonium_cation_fraction=0.0,
    rotor_anion_fraction=0.0,
    *,
    weights=None,
):
    r"""The melting trend index: log10 of a trend temperature in K (dimensionless).

    Ionic part, a sum of logarithmic terms:

    .. math::

        I_\mathrm{ion} = c_0 + a \log_{10}(u/u_\mathrm{ref})
            - w_\chi (\bar\chi - \bar\chi_\mathrm{ref}) - w_f f - w_p p
            - w_a f_\mathrm{poly} - w_\nu \log_{10}(\nu/2) - w_d f_\mathrm{deloc} - w_3 f_3
            - w_z (z_\mathrm{max} - 3)_+ + w_\mathrm{fw} f_\mathrm{fw} - w_H f_H - w_\mathrm{HB} f_\mathrm{HB}
            + w_c \log_{10}^2(u/u_\mathrm{ref}) + w_\Delta (\Delta\chi - \Delta\chi_\mathrm{ref})
            + w_\sigma \overline{\log_{10}\sigma_a} - w_h f_\mathrm{H^-} + w_{pO}\, p\, f_\mathrm{O,F}
            + w_\mathrm{CF} c_\mathrm{CF} - w_\mathrm{sN} f_\mathrm{sN}

    then the organic ions' entropy and chain packing, as ``T = dH / dS`` with
    the ionic part carrying ``dS_ion = nu s0`` and ``dH_ion = 10**I_ion dS_ion``:

    .. math::

        T = \frac{10^{I_\mathrm{ion}} \nu s_0 + T_\mathrm{PE}\, w_s S_\mathrm{pack}}
                 {\nu s_0 + w_s S_\mathrm{flex}}, \qquad I = \log_{10} T

    ``u`` lattice energy per ion (``w_c``: curvature of the cohesion term; the
    melting point rises faster than a power of the cohesion at the refractory
    end, common practice), ``chi`` mean Pauling electronegativity of the
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
    hydrogen_bonded_anion_fraction : float or array-like, default=0.0
        Count share of anions that carry hydrogen (HF2-, HSO4-, H2PO4-,
        HCO3-, OH-): they bind each other by hydrogen bonds, which take the
        place of cation-anion contacts and break far below the ionic
        lattice (KHF2 512 K, NaHSO4 about 455 K against Na2SO4 1157 K;
        CRC Handbook, from memory) (weight ``w_HB``).
    framework_oxoanion_fraction : float or array-like, default=0.0
        Count share of oxoanions of network formers with at most three oxygens
        per central atom (AlO2-, BO2-, PO3-, SiO3 2-): chains and frameworks in
        the solid, not rotating molecular ions, so they melt like oxides (``+ w_f``).
    anion_symmetry_log10 : float or array-like, default=0.0
        ``mean log10 sigma_a``: count-weighted mean over the anions of log10 of
        the rotational symmetry number of each polyatomic anion (0 for monatomic
        ones), weight ``w_sigma``. Carnelley's rule (T. Carnelley, Phil. Mag.
        1882, 13, 112; from memory): symmetric particles pack better and melt
        higher; in Dannenfelser and Yalkowsky's entropy of melting the same
        symmetry enters as ``-R ln sigma``. Together with the polyatomic-anion
        term it ranks ClO4- (Td, 12) above NO3- (D3h, 6) above SCN- (1):
        KClO4 798 K, KNO3 607 K, KSCN 446 K (CRC Handbook via chemicals).
    hydride_fraction : float or array-like, default=0.0
        Count share of hydride anions H- (weight ``w_h``): the small, very
        compressible H- gives a volume-based lattice energy above the cohesion
        melting breaks, and the saline hydrides decompose near their melting
        points (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed. 1997,
        ch. 3; from memory).
    hard_anion_fraction : float or array-like, default=0.0
        Count share of anions binding through O or F (``f_O,F``); with an
        18/18+2-electron cation (``p``) it gives back part of the
        pseudo-noble-gas penalty (weight ``w_pO``): Fajans' third rule acts on
        soft, polarisable anions much more than on hard O and F donors (HSAB:
        Pearson, J. Am. Chem. Soc. 1963, 85, 3533; from memory), so ZnI2 melts
        low but ZnO is refractory.
    delta_chi_pauling : float or array-like, default=nan
        Pauling electronegativity difference across the contact, the other
        coordinate of the van Arkel-Ketelaar triangle (common practice); NaN
        counts as the reference ``reference_delta_chi`` (no term). Weight ``w_Delta``.
    crystal_field_share : float or array-like, default=0.0
        ``c_CF``: sum over the cations of count times their high-spin
        octahedral crystal-field stabilisation in units of Delta_o
        (:func:`scorer.melting_anions.octahedral_high_spin_cfse_delta_o`),
        over ``nu``: the ligand-field energy the point-ion lattice energy
        leaves out, largest for d3 and d8 (Cr2O3 2708 K, NiO 2228 K against
        MnO 2118 K; CRC Handbook via chemicals). Weight ``w_CF``.
    saline_nitride_fraction : float or array-like, default=0.0
        ``f_sN``: the nitride share (``f_3``) times the share of the cations
        from the s block (:func:`scorer.melting_anions.is_saline_cation`):
        saline nitrides (Li3N 1086 K, Ca3N2 1468 K) melt or decompose far
        below the interstitial nitrides (TiN 3203 K) the nitride term
        ``w_3`` is mostly fitted on (Greenwood & Earnshaw 1997, ch. 11;
        from memory). Weight ``w_sN``.
    soft_pseudohalide_fraction : float or array-like, default=0.0
        ``f_psX``: the share of the anions that are linear pseudohalides
        (CN-, SCN-, SeCN-, OCN-, CNO-, N3-) beside an 18/18+2-electron cation
        (:func:`scorer.melting_anions.soft_cation_pseudohalide_fraction`):
        bound at both ends, they link such cations into chains and
        frameworks (CuCN, Zn(CN)2, CuSCN), so the covalency terms, fitted
        where covalency makes molecules and layers, put these salts too low
        (TlN3 607 K, Zn(CN)2 1073 K; CRC Handbook via chemicals). Weight ``w_psX``.
    coinage_cation_fraction : float or array-like, default=0.0
        ``f_Cu``: the share of the cations that are Cu(+), Ag(+) or Au(+)
        (:func:`scorer.melting_anions.coinage_cation_fraction`): their
        Born-Haber lattice energies exceed the point-ion values by about
        10 % (Waddington 1959), a cohesion the volume-based lattice energy
        misses (AgCl 728 K, CuI 879 K; CRC Handbook via chemicals). Weight ``w_Cu``.
    heavy_halate_fraction : float or array-like, default=0.0
        ``f_XO3``: the share of the anions that are bromate or iodate
        (:func:`scorer.melting_anions.heavy_halate_fraction`): the X(V) lone
        pair's long X...O secondary bonds (Alcock 1972) join the anions into
        a network the point-ion lattice energy misses (KIO3 833 K, LiIO3
        723 K; CRC Handbook via chemicals). Weight ``w_XO3``.
    organic_anion_fraction : float or array-like, default=0.0
        ``f_org``: the share of the anions that are organic when every cation
        is inorganic (:func:`scorer.melting_anions.coordinating_organic_anion_fraction`):
        carboxylate, alkoxide and sulfonate O donors bind metal cations into
        chains and layers, a cohesion the volume-based lattice energy of the
        whole anion misses (Zn(OAc)2 510 K, NaOAc 601 K; CRC Handbook via
        chemicals). Weight ``w_org``.
    polarising_organic_anion_fraction : float or array-like, default=0.0
        ``f_org,p``: ``f_org`` times the share of the cations that are monatomic d-, p- or f-block metals
        (:func:`scorer.melting_anions.polarising_organic_anion_fraction`): beside a polarising cation the O
        donors bridge it covalently into a coordination polymer (the acetates of Cu, Zn, Pb; Zn(OAc)2 510 K,
        Pb(OAc)2 553 K against NaOAc 601 K and KOAc 565 K; CRC Handbook via chemicals). Weight ``w_org,p``.
    ammonium_cation_fraction : float or array-like, default=0.0
        ``f_NH``: the share of the cations that are NH4(+) times the share of the anions that are inorganic
        (:func:`scorer.melting_anions.ammonium_type_cation_fraction`): its N-H...anion hydrogen bonds add the
        cohesion that the contact-electronegativity term, reading the H contact as covalency, takes away
        (NH4NO3 443 K, NH4H2PO4 463 K, NH4SCN 422 K; CRC Handbook via chemicals). Weight ``w_NH``.
    rotor_anion_fraction : float or array-like, default=0.0
        ``f_rot``: the share of the anions that are OH(-), HS(-) or CN(-) in a salt of s-block cations only
        (:func:`scorer.melting_anions.rotor_anion_fraction`): these anions turn freely in a high-temperature
        solid phase, so the entropy of fusion is small and the salt melts above a polyatomic anion's salt of
        the same lattice energy (NaOH 596 K, KOH 679 K, KCN 907 K; CRC Handbook via chemicals). Weight ``w_rot``.
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
    2.045, contact index 0.131, delta chi left at its reference) lands at 3.001, a trend
    temperature of 1002 K, against 1074 K measured (CRC Handbook, from memory).

    Examples
    --------
    >>> round(melting_trend_index(380.9, 2.045, 0.131, False, 0.0, 2), 3)
    3.001
    >>> round(float(10 ** melting_trend_index(380.9, 2.045, 0.131, False, 0.0, 2)))
    1002
    """
    w = TREND_WEIGHTS if weights is None else {**TREND_WEIGHTS, **weights}
    u = _floats(lattice_energy_per_ion_kJ_mol)
    chi = _floats(contact_chi_pauling)
    kappa = _nan_as(_floats(contact_index), 0.0)
    png = _floats(pseudo_noble_gas)
    poly = _floats(polyatomic_anion_fraction)
    nu = _floats(ions_per_formula_unit)
    flex = _floats(flexibility_entropy_J_mol_K)
    pack = _floats(chain_packing_entropy_J_mol_K)
    deloc = _floats(delocalised_fraction)
    dchi = _nan_as(_floats(delta_chi_pauling), w["reference_delta_chi"], finite=False)
    with np.errstate(divide="ignore", invalid="ignore"):
        cohesion = np.log10(u / w["reference_energy_per_ion_kJ_mol"])
        ionic = (
            w["intercept"]
            + w["cohesion_exponent"] * cohesion
            - w["contact_chi"] * (chi - w["reference_contact_chi"])
            - w["contact_index"] * kappa
            - w["pseudo_noble_gas"] * png
            - w["polyatomic_anion"] * poly
            - w["ions_per_formula_unit"] * np.log10(nu / 2.0)
            - w["delocalised"] * deloc
            - w["trivalent_anion"] * _floats(trivalent_anion_fraction)
            - w["high_charge_cation"] * _floats(cation_charge_above_3)
            + w["framework_oxoanion"] * _floats(framework_oxoanion_fraction)
            - w["protic"] * _floats(protic_fraction)
            - w["hydrogen_bonded_anion"] * _floats(hydrogen_bonded_anion_fraction)
            + w["cohesion_curvature"] * cohesion ** 2
            + w["contact_delta_chi"] * (dchi - w["reference_delta_chi"])
            + w["anion_symmetry"] * _floats(anion_symmetry_log10)
            - w["hydride_anion"] * _floats(hydride_fraction)
            + w["pseudo_noble_gas_hard_anion"] * png * _floats(hard_anion_fraction)
            + w["crystal_field"] * _floats(crystal_field_share)
            - w["saline_nitride"] * _floats(saline_nitride_fraction)
            + w["soft_cation_pseudohalide"] * _floats(soft_pseudohalide_fraction)
            + w["coinage_cation"] * _floats(coinage_cation_fraction)
            + w["heavy_halate"] * _floats(heavy_halate_fraction)
            + w["coordinating_organic_anion"] * _floats(organic_anion_fraction)
            + w["polarising_organic_anion"] * _floats(polarising_organic_anion_fraction)
            + w["ammonium_hydrogen_bonds"] * _floats(ammonium_cation_fraction)
            + w["rotor_anion"] * _floats(rotor_anion_fraction)
        )
        s_ion = nu * w["entropy_per_ion_J_mol_K"]
        # symmetric rigid ions may lower the entropy, but never below half the ionic part
        s_total = np.maximum(s_ion + w["flexibility"] * flex, 0.5 * s_ion)
        h_total = np.power(10.0, ionic) * s_ion + w["chain_melting_K"] * w["flexibility"] * pack
        value = np.log10(h_total / s_total)
    return float(value) if np.ndim(value) == 0 else value


def _floats(value):
    """A number as a Python float, anything else as a float array.

    One compound's index (the scorer's path) then runs on scalars: the same
    IEEE operations and the same ufuncs as on 0-d arrays, so the same float,
    at a fraction of the cost (no array made per argument; measured
    with ``timeit``, 105 against 30 us per call)."""
    return float(value) if isinstance(value, (float, int)) else np.asarray(value, dtype=float)


def _nan_as(value, fill: float, finite: bool = True):
    """``value`` with NaN replaced by ``fill`` (and, where ``finite``, infinities by the largest
    floats, as ``np.nan_to_num`` does); a Python float stays one."""
    if not isinstance(value, float):
        return np.nan_to_num(value, nan=fill) if finite else np.where(np.isnan(value), fill, value)
    if math.isnan(value):
        return fill
    return value if math.isfinite(value) or not finite else float(np.nan_to_num(value))


def ammonium_salt_decomposition_index(lattice_index, weights=None):
    """The trend index of an ammonium salt of polyatomic anions: ``I = a I_lattice + (1 - a) log10 T_dec``.

    An ammonium salt does not melt as an ionic lattice does: on heating the
    proton passes from NH4(+) to the anion, NH4X -> NH3 + HX, and the salt
    melts with decomposition or decomposes before it melts (the nitrate near
    443 K, the dihydrogenphosphate near 463 K, the sulfate and the dichromate
    as they break down; Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed.,
    1997, ch. 11.2.6; from memory). The registry's values for these salts lie in
    a narrow band (295-503 K for 22 of the 23 such salts of the open set,
    ``chemicals`` 1.5.2), which the lattice index, read through the hydrogen
    contact as covalency, misses by up to a factor 1.8 (NH4H2PO4 254 K). So
    the level ``T_dec`` carries the estimate and the lattice index keeps a
    share ``a`` for the ranking inside the band. Both are fitted
    (``ammonium_decomposition_K``, ``ammonium_lattice_share`` in
    :data:`TREND_WEIGHTS`; :func:`pipelines.melting_weights.fit_ammonium_decomposition`
    on the 15 calibration salts); the halides (NH4Cl, NH4Br, NH4I) keep the
    lattice index: they dissociate into their gases far higher, 611-824 K.

    Parameters
    ----------
    lattice_index : float
        :func:`melting_trend_index` of the salt.
    weights : mapping, optional
        Entries of :data:`TREND_WEIGHTS` replaced.

    Examples
    --------
    Ammonium dihydrogenphosphate, whose lattice index reads 254 K (2.405);
    its registry melting point is 463 K (``chemicals``, CRC Handbook):

    >>> round(10 ** ammonium_salt_decomposition_index(2.405))
    384
    """
    w = TREND_WEIGHTS if weights is None else {**TREND_WEIGHTS, **weights}
    return decomposition_band_index(lattice_index, w["ammonium_decomposition_K"], w["ammonium_lattice_share"])


def decomposition_band_index(lattice_index, level_K, lattice_share):
    """The trend index of a salt that melts with decomposition in a band: ``I = a I_lattice + (1 - a) log10 T_dec``.

    Defined here (a weighted mean on the log scale, both constants fitted per kind of salt on a calibration
    half: :func:`ammonium_salt_decomposition_index`, :func:`decomposing_anion_salt_index`).

    >>> round(decomposition_band_index(3.0, 100.0, 0.5), 3)
    2.5
    """
    return lattice_share * lattice_index + (1.0 - lattice_share) * math.log10(level_K)


def decomposing_anion_salt_index(lattice_index, weights=None):
    """The trend index of a salt whose anions all decompose on heating (peroxides, superoxides, hypochlorites,
    chlorites, hydrogencarbonates, hydrogensulfites, disulfites, dithionites, peroxosulfates:
    :data:`scorer.melting_anions.DECOMPOSING_ANIONS`): :func:`decomposition_band_index` with
    ``decomposing_anion_K`` and ``decomposing_anion_lattice_share`` of :data:`TREND_WEIGHTS`.

    Such a salt gives off oxygen, carbon dioxide, sulfur dioxide or chlorine compounds below the melting point
    of its lattice (2 BaO2 -> 2 BaO + O2, 2 NaHCO3 -> Na2CO3 + H2O + CO2; Greenwood & Earnshaw, Chemistry of the
    Elements, 2nd ed., 1997, ch. 14-17; from memory): the registry's values for these salts are decomposition
    temperatures, 291-948 K on the calibration half, where the lattice index runs 0.16 high in log10 on average
    (SrO2 1326 K against 488 K). Both constants fitted on that half
    (:func:`pipelines.melting_weights.fit_decomposition_band`), checked on the other.

    Examples
    --------
    Calcium hypochlorite, whose lattice index reads 625 K (2.796); registry value 373 K (``chemicals``):

    >>> round(10 ** decomposing_anion_salt_index(2.796))
    447
    """
    w = TREND_WEIGHTS if weights is None else {**TREND_WEIGHTS, **weights}
    return decomposition_band_index(lattice_index, w["decomposing_anion_K"], w["decomposing_anion_lattice_share"])


def trend_temperature_K(index):
    """``10**index``: the index read back on the kelvin scale (for classes and people).

    >>> round(trend_temperature_K(3.0))
    1000
    """
    value = np.power(10.0, np.asarray(index, dtype=float))
    return float(value) if value.ndim == 0 else value


def melting_class_from_index(index) -> str | None:
    """The salt melting class of a trend index (thresholds in :data:`MELTING_CLASSES`).

    Salts only; :func:`scorer.melting_routes.melting_class_for` covers every compound.

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
