"""The weights of the melting trend index (scorer.melting.TREND_WEIGHTS) against outside data.

Every test here can tell a right weight from a wrong one: ``tests/perturb_trend_weights.py``
changes each weight by +50 % and by -50 %, one at a time, and lists the changes no
test catches (run by ``tests/test_trend_weight_sensitivity.py``).

Calibration and validation are kept apart:

* **calibration** checks use compounds the weights were fitted or set on, and
  check that the weights still do what they were set for. The inorganic weights
  are a least-squares fit of log10 T_m (spread matched) over the CC0 fixture
  ``datasets/melting/wikidata_salts.csv`` and the calibration half of the open
  training set that ``ionicity fit-melting`` builds from ``chemicals`` 1.5.2 (the
  half chosen by a hash of the formula, ``pipelines.melting_weights.open_set_half``);
  the test refits them and compares.
* **validation** checks use data no weight was fitted or set on: entropies of
  fusion (not melting points), the melting point of polyethylene, and organic salts
  (the fit used inorganic salts only; the organic weights were set by hand on
  [C2mim][BF4], [C4mim][PF6] and [C4mim][NTf2] alone).
"""
from __future__ import annotations

import numpy as np
import pytest

from ionicity.scorer import melting
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose

# the weights of the ionic part, which the least-squares fit sets
FITTED_INORGANIC_WEIGHTS = (
    "intercept", "cohesion_exponent", "contact_chi", "contact_index", "pseudo_noble_gas", "polyatomic_anion",
    "ions_per_formula_unit", "trivalent_anion", "high_charge_cation", "framework_oxoanion",
    "hydrogen_bonded_anion", "cohesion_curvature", "contact_delta_chi", "anion_symmetry", "hydride_anion",
    "pseudo_noble_gas_hard_anion", "rotor_anion",
)


def _trend_K(formula: str) -> float:
    return melting.trend_temperature_K(melting.describe(decompose(parse_formula(formula)))[0]["mp_trend_index"])


# ------------------------------------------------------------ calibration


@pytest.fixture(scope="module")
def open_training_rows():
    """The open training set ``fit-melting`` builds from ``chemicals`` (CRC-derived values, read at run time)."""
    pytest.importorskip("chemicals")
    from ionicity.pipelines.melting_data import build_open_training_set

    return build_open_training_set().rows


@pytest.fixture(scope="module")
def open_salt_rows(open_training_rows):
    """(split, terms, measured K, formula) of the inorganic salts, as ``pipelines.melting_weights`` splits them.

    Calibration: the CC0 fixture plus the calibration half of the open training set
    that ``fit-melting`` builds from ``chemicals`` (CRC-derived values, read at run time);
    validation: the other half.
    """
    from ionicity.pipelines.melting_weights import salt_rows

    rows = salt_rows(open_training_rows)
    assert sum(r[0] == "calibration" for r in rows) >= 300  # 354 with chemicals 1.5.2
    assert sum(r[0] == "validation" for r in rows) >= 200   # 230
    return rows


@pytest.fixture(scope="module")
def refitted_salt_weights(open_salt_rows):
    """The inorganic weights as ``python -m ionicity.pipelines.melting_weights`` fits them now."""
    from ionicity.pipelines.melting_weights import fit_salt_weights

    return fit_salt_weights(open_salt_rows)


@pytest.mark.parametrize("name", FITTED_INORGANIC_WEIGHTS)
def test_calibration_each_inorganic_weight_is_the_fit_of_the_calibration_set(refitted_salt_weights, name):
    # Calibration: the shipped weight is the least-squares weight (spread matched) of
    # log10 T_m on the calibration salts, rounded to three decimals; a weight moved by
    # half its value, or a fit whose terms changed, shows here.
    assert melting.TREND_WEIGHTS[name] == pytest.approx(refitted_salt_weights[name], abs=0.0006)


@pytest.mark.parametrize("name", ("crystal_field", "saline_nitride", "soft_cation_pseudohalide", "coinage_cation",
                                  "heavy_halate", "ammonium_hydrogen_bonds"))
def test_calibration_each_second_stage_weight_is_the_fit_of_the_calibration_residuals(open_salt_rows, name):
    # Calibration: least squares of the calibration residuals with the weights above held
    # (python -m ionicity.pipelines.melting_weights prints it), rounded to three decimals
    from ionicity.pipelines.melting_weights import fit_salt_residual_weights

    assert melting.TREND_WEIGHTS[name] == pytest.approx(fit_salt_residual_weights(open_salt_rows)[name], abs=0.0006)


def test_calibration_the_spread_matching_factor_is_modest(refitted_salt_weights):
    # least squares shrinks by the correlation (about 0.85 here), so the factor that
    # restores the measured spread lies near its inverse (common practice)
    assert 1.0 < refitted_salt_weights["spread"] < 1.4


# ------------------------------------------------------------- validation


def test_validation_held_out_half_of_the_open_set(open_salt_rows):
    # the figures README.md quotes (chemicals 1.5.2): Spearman 0.829, 86.0 % within a factor 1.5,
    # class right for 81.1 %; a floor a little under each
    from scipy.stats import spearmanr

    held_out = [r for r in open_salt_rows if r[0] == "validation"]
    trend = np.array([10 ** t.index() for _, t, _, _ in held_out])
    measured = np.array([mp for _, _, mp, _ in held_out])
    assert spearmanr(trend, measured).correlation >= 0.82
    assert np.mean(np.abs(np.log(trend / measured)) < np.log(1.5)) >= 0.85
    bands = (373.15, 573.15, 1773.15)
    same = [np.searchsorted(bands, a) == np.searchsorted(bands, b) for a, b in zip(trend, measured)]
    assert np.mean(same) >= 0.80
    hot = measured >= 1773.15
    # refractory compounds of the held-out half called refractory (salt route; 0.857 of 35)
    assert np.mean(trend[hot] >= 1773.15) >= 0.78


def test_validation_the_coinage_cation_term_helps_the_held_out_copper_and_silver_salts(open_salt_rows):
    # Validation: the weight is fitted on the calibration residuals only (its CV gain inside the
    # calibration set decided it, pipelines/melting_residuals.py); on the held-out half's Cu(+) and
    # Ag(+) salts (registry values, chemicals 1.5.2) the term must lower the mean |log10 error|
    held_out = [r for r in open_salt_rows if r[0] == "validation" and r[1].coinage_cation_fraction > 0]
    assert len(held_out) >= 5  # 9 with chemicals 1.5.2
    measured = np.log10([mp for _, _, mp, _ in held_out])
    with_term = np.array([t.index() for _, t, _, _ in held_out])
    without = np.array([t.index({"coinage_cation": 0.0}) for _, t, _, _ in held_out])
    assert np.mean(np.abs(with_term - measured)) < np.mean(np.abs(without - measured))


def test_validation_the_ammonium_term_helps_the_held_out_ammonium_salts(open_salt_rows):
    # Validation: ammonium_hydrogen_bonds is fitted with the other second-stage weights on the calibration
    # residuals only; the held-out half's ammonium salts (registry values, chemicals 1.5.2: (NH4)2HPO4,
    # (NH4)2S2O3, (NH4)2SO4, NH4BF4, NH4HCO3, NH4I, NH4VO3, AlNH4(SO4)2) came out 0.057 low in log10 on
    # average without it. Measured 5 December 2026 (fourth round): mean |log10 error| 0.147 -> 0.122,
    # melting class right for 2 -> 5 of 8
    held_out = [r for r in open_salt_rows if r[0] == "validation" and r[1].ammonium_cation_fraction > 0]
    assert len(held_out) >= 6
    measured = np.array([mp for _, _, mp, _ in held_out])
    with_term = np.array([10 ** t.index() for _, t, _, _ in held_out])
    without = np.array([10 ** t.index({"ammonium_hydrogen_bonds": 0.0}) for _, t, _, _ in held_out])
    assert np.mean(np.abs(np.log10(with_term / measured))) < np.mean(np.abs(np.log10(without / measured))) - 0.01
    bands = (373.15, 573.15, 1773.15)
    right = lambda trend: sum(np.searchsorted(bands, a) == np.searchsorted(bands, b)  # noqa: E731
                              for a, b in zip(trend, measured))
    assert right(with_term) > right(without)


@pytest.mark.parametrize("formula, share", [("NH4NO3", 1.0), ("NH4H2PO4", 1.0), ("NH4MgPO4", 0.5), ("KNO3", 0.0),
                                            ("PH4I", 0.0), ("[EtNH3][NO3]", 0.0), ("NH4CH3COO", 0.0),
                                            ("N2H5Cl", 0.0), ("NH3OHCl", 0.0)])
def test_the_ammonium_term_counts_nh4_beside_inorganic_anions_only(formula, share):
    # N-H...anion hydrogen bonds of NH4(+) (Greenwood & Earnshaw, 2nd ed., 1997, ch. 11.2.6; from memory); PH4(+)
    # is a poor donor; the alkylammonium ions of protic ionic liquids are organic, with their own term (protic);
    # beside a carboxylate the O donors' binding is the coordinating_organic_anion term's; hydrazinium and
    # hydroxylammonium salts melt low (N2H5Cl 362 K, NH3OHCl 428 K; CRC Handbook via chemicals) and are left out
    terms = melting.melting_terms(decompose(parse_formula(formula)))
    assert terms.ammonium_cation_fraction == pytest.approx(share)
    if share:
        assert terms.index() > terms.index({"ammonium_hydrogen_bonds": 0.0})


# Enthalpy of fusion [kJ/mol] and melting point [K] of alkali halides, CRC Handbook
# of Chemistry and Physics, 'Enthalpy of fusion' and 'Physical constants of
# inorganic compounds' (from memory). dS_fus = dH_fus / T_m, over 2 ions.
FUSION = [("LiF", 27.09, 1121), ("NaF", 33.35, 1269), ("NaCl", 28.16, 1074), ("KCl", 26.28, 1044), ("KBr", 25.52, 1007)]


def test_validation_entropy_per_ion_is_the_fusion_entropy_of_simple_salts():
    # the index's entropy scale s0 is the entropy of fusion per ion of a simple salt;
    # measured values of the alkali halides lie between 12.1 and 13.2 J/(mol K) per ion
    per_ion = [1000.0 * dh / t / 2 for _, dh, t in FUSION]
    assert melting.TREND_WEIGHTS["entropy_per_ion_J_mol_K"] == pytest.approx(np.mean(per_ion), rel=0.2)


def test_validation_long_chains_tend_to_the_melting_point_of_polyethylene():
    # a salt whose entropy is all long, packing chain melts like polyethylene:
    # equilibrium melting point 414.6 K (Wunderlich, Macromolecular Physics vol. 3, 1980;
    # from memory); n-alkanes extrapolate to 414.3 K (Broadhurst, J. Res. NBS 1962, 66A, 241; from memory)
    index = melting.melting_trend_index(381.0, 2.0, 0.1, False, 0.0, 2, flexibility_entropy_J_mol_K=1e7,
                                        chain_packing_entropy_J_mol_K=1e7)
    assert melting.trend_temperature_K(index) == pytest.approx(414.5, rel=0.03)


def test_validation_imidazolium_chain_minimum_lies_at_hexyl_to_octyl():
    # [Cnmim][PF6]: n = 2 melts at about 60 C, n = 4 at about 10 C, the hexyl and
    # octyl salts do not crystallise (glasses), and from n = 12 the salts melt
    # higher again as the chains pack (Holbrey & Seddon, J. Chem. Soc., Dalton Trans.
    # 1999, 2133; Gordon et al., J. Mater. Chem. 1998, 8, 2627; from memory).
    # None of these salts set a weight but [C4mim][PF6]; the position of the
    # minimum does not depend on it.
    chain = {n: _trend_K(f"[C{n}mim][PF6]") for n in (2, 4, 6, 8, 10)}
    assert min(chain, key=chain.get) in (6, 8)
    assert chain[2] > chain[4] and chain[10] > min(chain.values())


@pytest.mark.parametrize("decision, mp_K, agreeing", [
    # decision texts as pipelines.melting_data writes them (source tables of chemicals 1.5.2)
    ("agree: CRC_INORG=1074.0, WIKIDATA=1073.8", 1073.9, 2),
    ("consensus (2 of 3 within 20 K): CRC_INORG=1157.2, WIKIDATA=360.1, COMMON_CHEMISTRY=1161.2", 1159.2, 2),
    ("single: COMMON_CHEMISTRY=331.1", 331.15, 1),
    # one table counted once across two CAS entries of the same formula
    ("2 CAS entries for NiS; agree: 16812-54-7:CRC_INORG=1249.2, 11113-75-0:CRC_INORG=1249.2", 1249.2, 1),
    ("2 CAS entries for NiS; agree: 16812-54-7:CRC_INORG=1249.2, 11113-75-0:WIKIDATA=1259.2", 1254.2, 2),
])
def test_validation_subset_of_agreeing_sources_counts_tables(decision, mp_K, agreeing):
    # the subset the melting issue measured on (two open sources within 20 K); chosen on the data alone
    from ionicity.pipelines.melting_weights import agreeing_sources

    assert agreeing_sources({"decision": decision, "mp_K": mp_K}) == agreeing


# ------------------------------------------- organic anions beside inorganic cations (metal carboxylates)


@pytest.fixture(scope="module")
def organic_anion_rows(open_training_rows):
    """The open set's salts of organic anions with inorganic cations only (acetates, stearates, sulfonates,
    alkoxides of metals and ammonium), split by the same formula hash as the salts."""
    from ionicity.pipelines.melting_weights import organic_anion_rows as rows_of

    rows = rows_of(open_training_rows)
    assert sum(r[0] == "calibration" for r in rows) >= 25  # 33 with chemicals 1.5.2
    assert sum(r[0] == "validation" for r in rows) >= 30   # 40
    return rows


def test_calibration_the_organic_anion_weights_are_the_fit_of_their_calibration_half(organic_anion_rows):
    # Calibration: least squares of the log10 residuals of the calibration half, both weights together, every
    # other weight held (python -m ionicity.pipelines.melting_weights prints them)
    from ionicity.pipelines.melting_weights import fit_organic_anion_weights

    for key, value in fit_organic_anion_weights(organic_anion_rows).items():
        assert melting.TREND_WEIGHTS[key] == pytest.approx(value, abs=0.0006), key


def test_validation_the_polarising_cation_term_helps_the_held_out_half(organic_anion_rows):
    # Validation: the held-out half of the metal carboxylates, alkoxides and sulfonates (registry values,
    # chemicals 1.5.2; never fitted on), against one weight for every inorganic cation refitted alone on the
    # calibration half: within a factor 1.5 33 -> 36 of 40, mean |log10 error| 0.115 -> 0.093 (measured
    # 5 December 2026, third round); with one weight the d- and p-block salts of that half came out 0.087 low
    # and the s-block ones 0.083 high
    from ionicity.pipelines.melting_weights import fit_one_organic_anion_weight

    held_out = [r for r in organic_anion_rows if r[0] == "validation"]
    measured = np.array([mp for _, _, mp, _ in held_out])
    one = {"coordinating_organic_anion": fit_one_organic_anion_weight(organic_anion_rows),
           "polarising_organic_anion": 0.0}
    with_terms = np.array([10 ** t.index() for _, t, _, _ in held_out])
    one_weight = np.array([10 ** t.index(one) for _, t, _, _ in held_out])
    within = lambda trend: np.mean(np.abs(np.log(trend / measured)) < np.log(1.5))  # noqa: E731
    assert within(with_terms) >= 0.875 > within(one_weight)
    assert np.mean(np.abs(np.log10(with_terms / measured))) < np.mean(np.abs(np.log10(one_weight / measured))) - 0.01


def test_validation_the_organic_anion_term_helps_the_held_out_half(organic_anion_rows):
    # Validation: the held-out half of the metal carboxylates, alkoxides and sulfonates (registry values,
    # chemicals 1.5.2; never fitted on): 25 of 40 within a factor 1.5 without the terms, 36 with them
    # (measured 5 December 2026, third round), and a smaller mean |log10 error|
    held_out = [r for r in organic_anion_rows if r[0] == "validation"]
    measured = np.array([mp for _, _, mp, _ in held_out])
    with_term = np.array([10 ** t.index() for _, t, _, _ in held_out])
    without = np.array([10 ** t.index({"coordinating_organic_anion": 0.0, "polarising_organic_anion": 0.0})
                        for _, t, _, _ in held_out])
    within = lambda trend: np.mean(np.abs(np.log(trend / measured)) < np.log(1.5))  # noqa: E731
    assert within(with_term) >= 0.78 > within(without)
    assert np.mean(np.abs(np.log10(with_term / measured))) < np.mean(np.abs(np.log10(without / measured)))


@pytest.mark.parametrize("formula", ["Zn(CH3COO)2", "NaCH3COO", "Ag[OTs]", "LiOCH3"])
def test_the_organic_anion_term_applies_beside_inorganic_cations_only(formula):
    # an ionic liquid's anion ([C4mim][OAc]) binds no metal: no term; a metal's carboxylate does
    terms = melting.melting_terms(decompose(parse_formula(formula)))
    assert terms.organic_anion_fraction == 1.0
    assert terms.index() > terms.index({"coordinating_organic_anion": 0.0})
    il = melting.melting_terms(decompose(parse_formula("[C4mim][CH3COO]")))
    assert il.organic_anion_fraction == 0.0


@pytest.mark.parametrize("formula, polarising", [("Zn(CH3COO)2", 1.0), ("Pb(CH3COO)2", 1.0), ("Ag[OTs]", 1.0),
                                                 ("NaCH3COO", 0.0), ("LiOCH3", 0.0), ("[C4mim][CH3COO]", 0.0)])
def test_the_polarising_term_applies_beside_d_and_p_block_cations_only(formula, polarising):
    # covalent M-O bridges of coordination polymers (Cu, Zn, Pb acetates), not the ionic layers of the s-block
    # soaps (Greenwood & Earnshaw, 2nd ed., 1997, ch. 8.7; from memory)
    terms = melting.melting_terms(decompose(parse_formula(formula)))
    assert terms.polarising_organic_anion_fraction == polarising
    if polarising:
        assert terms.index() > terms.index({"polarising_organic_anion": 0.0})
