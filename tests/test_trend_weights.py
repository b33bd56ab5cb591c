"""The weights of the melting trend index (scorer.melting.TREND_WEIGHTS) against outside data.

Every test here can tell a right weight from a wrong one: ``tests/perturb_trend_weights.py``
changes each weight by +50 % and by -50 %, one at a time, and lists the changes no
test catches (run by ``tests/test_trend_weight_sensitivity.py``).

Calibration and validation are kept apart:

* **calibration** checks use compounds the weights were fitted or set on, and
  check that the weights still do what they were set for. The inorganic weights
  are a least-squares fit of log10 T_m over the open training set that
  ``ionicity fit-melting`` builds from ``chemicals`` 1.5.2; 118 of the 140 salts of
  ``datasets/melting/wikidata_salts.csv`` (the CC0 fixture) are in that set (114
  with the same melting point within 20 K), so a check on the fixture is calibration.
* **validation** checks use data no weight was fitted or set on: entropies of
  fusion (not melting points), the melting point of polyethylene, and organic salts
  (the fit used inorganic salts only; the organic weights were set by hand on
  [C2mim][BF4], [C4mim][PF6] and [C4mim][NTf2] alone).
"""
from __future__ import annotations

import math
from pathlib import Path

import numpy as np
import pandas as pd
import pytest

from ionicity.scorer import melting
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose

FIXTURE = Path(__file__).resolve().parents[1] / "datasets" / "melting" / "wikidata_salts.csv"

# the weights of the ionic part, which the least-squares fit set
INORGANIC_WEIGHTS = (
    "intercept", "reference_energy_per_ion_kJ_mol", "reference_contact_chi", "cohesion_exponent", "contact_chi",
    "contact_index", "pseudo_noble_gas", "polyatomic_anion", "ions_per_formula_unit", "trivalent_anion",
    "high_charge_cation", "framework_oxoanion", "hydrogen_bonded_anion",
)


def _trend_K(formula: str) -> float:
    return melting.trend_temperature_K(melting.describe(decompose(parse_formula(formula)))[0]["mp_trend_index"])


# ------------------------------------------------------------ calibration


@pytest.fixture(scope="module")
def fixture_terms():
    """Index inputs and measured log10 T_m of the fixture's salts that have a trend index."""
    frame = pd.read_csv(FIXTURE)
    terms, log_mp = [], []
    for formula, mp_K in zip(frame["formula_normalized"], frame["mp_K"]):
        t = melting.melting_terms(decompose(parse_formula(formula)))
        if t is None or not math.isfinite(t.lattice_energy_kJ_mol) or t.organic:
            continue
        terms.append(t)
        log_mp.append(math.log10(mp_K))
    assert len(terms) >= 120  # 128 of the 140 rows with chemicals 1.5.2
    fields = ("lattice_energy_per_ion_kJ_mol", "contact_chi_pauling", "contact_index", "pseudo_noble_gas",
              "polyatomic_anion_fraction", "ions_per_formula_unit", "trivalent_anion_fraction",
              "cation_charge_above_3", "framework_oxoanion_fraction", "hydrogen_bonded_anion_fraction")
    arrays = {name: np.array([getattr(t, name) for t in terms], dtype=float) for name in fields}
    return arrays, np.array(log_mp)


def _sum_of_squares(arrays, log_mp, weights) -> float:
    index = melting.melting_trend_index(
        arrays["lattice_energy_per_ion_kJ_mol"], arrays["contact_chi_pauling"], arrays["contact_index"],
        arrays["pseudo_noble_gas"], arrays["polyatomic_anion_fraction"], arrays["ions_per_formula_unit"],
        trivalent_anion_fraction=arrays["trivalent_anion_fraction"],
        cation_charge_above_3=arrays["cation_charge_above_3"],
        framework_oxoanion_fraction=arrays["framework_oxoanion_fraction"],
        hydrogen_bonded_anion_fraction=arrays["hydrogen_bonded_anion_fraction"],
        weights=weights,
    )
    return float(np.sum((log_mp - index) ** 2))


# The inorganic weights were refitted (python -m ionicity.pipelines.melting_weights) after
# scorer.applicability took AlN, BeTe, HgCl2, MoO3 and V2O5 out of the point-ion salts.
_MOVED_BY_APPLICABILITY: set = set()


@pytest.mark.parametrize("name", [
    pytest.param(n, marks=pytest.mark.xfail(strict=True, reason="fitting set changed by scorer.applicability; refit due"))
    if n in _MOVED_BY_APPLICABILITY else n
    for n in INORGANIC_WEIGHTS
])
def test_calibration_each_inorganic_weight_sits_at_its_least_squares_optimum(fixture_terms, name):
    # Calibration (the fixture is part of the fitting set): with the other weights
    # as they are, the value of this weight that minimises the squared log10 error
    # on the fixture lies within 30 % of the shipped value. The weights were
    # fitted on a larger, earlier set and rounded, hence the 30 %.
    arrays, log_mp = fixture_terms
    current = melting.TREND_WEIGHTS[name]
    grid = np.linspace(0.0, 3.0 * current, 1201)
    errors = [_sum_of_squares(arrays, log_mp, {name: float(v)}) for v in grid]
    best = float(grid[int(np.argmin(errors))])
    assert abs(current - best) <= 0.3 * best, f"{name} = {current}, least-squares optimum on the fixture {best:.4g}"


# ------------------------------------------------------------- validation

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
