"""Where the salt melting index misses, on the calibration set only, and whether a candidate term would help.

usage: python -m ionicity.pipelines.melting_residuals [--training CSV]

Reads the inorganic salts of :func:`pipelines.melting_weights.salt_rows` and
keeps the **calibration** rows only (``datasets/melting/wikidata_salts.csv``
and the calibration half of the open training set): the held-out half is
never read here, so nothing this script prints can leak it into a choice.

Prints the calibration residuals ``log10 T_m - mp_trend_index`` grouped by
anion family, by the block and the charge of the highest-charged cation and
by the anion's charge, then, for each candidate term of :data:`CANDIDATE_TERMS`
(physically motivated ideas not in the index), the repeated five-fold
cross-validated gain inside the calibration set of adding it as a
second-stage term (:func:`cross_validated_gain`, fitted on four folds, scored
on the fifth, the shipped weights held); ``--without-flagged-targets`` leaves
out the calibration rows whose melting point the screen flags as a hydrate's
or a decomposition's (:func:`flagged_targets`). A term is worth adding only if it
lowers the out-of-fold error and raises the out-of-fold Spearman; the
figures of the last run are in ``datasets/melting/README.md``.
"""
from __future__ import annotations

import argparse
import csv
import math
import sys
from collections import defaultdict

import numpy as np
from ionicity.pipelines import melting_weights as weights_fit
from ionicity.scorer import lattice
from ionicity.scorer.elements import get_element
from ionicity.scorer.melting import formal_salt_reading
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose
from ionicity.scorer.model import Decomposition
from ionicity.scorer.radii import ion_radius_pm

# Pauling's radius-ratio limit of octahedral coordination: below it the anions touch (common practice)
OCTAHEDRAL_RADIUS_RATIO = 0.414


def polyatomic_charge_asymmetry(dec: Decomposition) -> float:
    """Share of polyatomic anions times log10(mean anion charge / mean cation charge) (dimensionless).

    The idea tested: a polyatomic anion whose charge exceeds its cations'
    (SO4 2- among K+) is held in place by them and rotates less than one
    beside cations of higher charge (NO3- beside Ca2+), so the polyatomic
    anion penalty of the index should shrink with the charge ratio.

    >>> round(polyatomic_charge_asymmetry(decompose(parse_formula("K2SO4"))), 3)
    0.301
    >>> round(polyatomic_charge_asymmetry(decompose(parse_formula("Ca(NO3)2"))), 3)
    -0.301
    >>> polyatomic_charge_asymmetry(decompose(parse_formula("NaCl")))
    0.0
    """
    anions = sum(t.count for t in dec.anions)
    cations = sum(t.count for t in dec.cations)
    poly = sum(t.count for t in dec.anions if not t.ion.monatomic) / anions
    if poly == 0.0:
        return 0.0
    z_anion = sum(t.count * -t.ion.charge for t in dec.anions) / anions
    z_cation = sum(t.count * t.ion.charge for t in dec.cations) / cations
    return poly * math.log10(z_anion / z_cation)


def anion_contact_radius_ratio(dec: Decomposition) -> float:
    """``max(0, log10(0.414 / (r+/r-)))`` for a binary salt of monatomic ions, else 0 (dimensionless).

    Below Pauling's octahedral radius ratio 0.414 the anions touch each other
    (Lande's picture of LiI); their repulsion is missing from a volume-based
    lattice energy, so the index should overrate such salts. Radii: Shannon's
    (1976) for the cation in six-fold coordination, the anion's tabulated radius.

    Li+ (CN 6) 76 pm and I- 220 pm (Shannon, Acta Cryst. 1976, A32, 751, Table 1;
    from memory): r+/r- = 0.345, log10(0.414/0.345) = 0.079.

    >>> round(anion_contact_radius_ratio(decompose(parse_formula("LiI"))), 3)
    0.079
    >>> anion_contact_radius_ratio(decompose(parse_formula("NaCl")))
    0.0
    """
    if len(dec.cations) != 1 or len(dec.anions) != 1 or not dec.anions[0].ion.monatomic:
        return 0.0
    try:
        ratio = ion_radius_pm(dec.cations[0].ion, 6)[0] / ion_radius_pm(dec.anions[0].ion)[0]
    except (KeyError, ValueError):  # no tabulated radius: no term
        return 0.0
    return max(0.0, math.log10(OCTAHEDRAL_RADIUS_RATIO / ratio)) if math.isfinite(ratio) and ratio > 0 else 0.0


def pseudo_noble_gas_oxoanion_share(dec: Decomposition, pseudo_noble_gas: bool) -> float:
    """Share of oxoanions beside an 18/18+2-electron cation (Ag2SO4, TlClO4, Pb(NO3)2), else 0.

    The idea tested: the oxygens of an oxoanion are already bound to its centre,
    so the covalency the contact-electronegativity term charges for Ag+ or Tl+
    does not build molecules or layers as it does with halides.

    >>> pseudo_noble_gas_oxoanion_share(decompose(parse_formula("Ag2SO4")), True)
    1.0
    >>> pseudo_noble_gas_oxoanion_share(decompose(parse_formula("AgCl")), True)
    0.0
    """
    if not pseudo_noble_gas:
        return 0.0
    anions = sum(t.count for t in dec.anions)
    return sum(t.count for t in dec.anions
               if not t.ion.monatomic and not t.ion.organic and "O" in dict(t.ion.composition)) / anions


def fluoride_share(dec: Decomposition) -> float:
    """Share of the anions that are F- (the hardest, least polarisable anion; HSAB, Pearson 1963).

    >>> fluoride_share(decompose(parse_formula("CaF2")))
    1.0
    """
    return sum(t.count for t in dec.anions if t.ion.ion_id == "F(-)") / sum(t.count for t in dec.anions)


# name -> feature of (decomposition, MeltingTerms), each a physically motivated idea
CANDIDATE_TERMS = {
    "polyatomic_charge_asymmetry": lambda dec, terms: polyatomic_charge_asymmetry(dec),
    "anion_contact_radius_ratio": lambda dec, terms: anion_contact_radius_ratio(dec),
    "pseudo_noble_gas_oxoanion": lambda dec, terms: pseudo_noble_gas_oxoanion_share(dec, terms.pseudo_noble_gas),
    "fluoride_share": lambda dec, terms: fluoride_share(dec),
    # not a new idea: the index's own polyatomic-anion feature again; a gain means its weight is off
    "polyatomic_anion_fraction (refit check)": lambda dec, terms: terms.polyatomic_anion_fraction,
}


def calibration_residuals(salt_rows) -> list[tuple[str, float, float, object]]:
    """(formula, log10 T_m, residual log10 T_m - index, terms) of the calibration rows; validation rows dropped."""
    return [(formula, math.log10(mp), math.log10(mp) - terms.index(), terms)
            for split, terms, mp, formula in salt_rows if split == "calibration"]


def flagged_targets(training) -> set[str]:
    """``formula_normalized`` of the calibration targets the screen flags (a hydrate's or a decomposition's look).

    Open-set rows carry the flags in their decision text (``target flagged: ...``);
    the rows of ``wikidata_salts.csv`` (one source each, Wikidata) are put through
    the same rules, :func:`pipelines.melting_screen.target_flags`. Blind to the index.
    """
    from ionicity.pipelines.melting_screen import target_flags

    flagged = {r["formula_normalized"] for r in training if "target flagged" in r.get("decision", "")}
    with open(weights_fit.CALIBRATION_SALTS, newline="", encoding="utf-8") as handle:
        for row in csv.DictReader(handle):
            dec = decompose(parse_formula(row["formula_normalized"]))
            if target_flags([row["name"]], "single: WIKIDATA", float(row["mp_K"]), dec):
                flagged.add(row["formula_normalized"])
    return flagged


def group_residuals(labelled) -> dict[str, tuple[int, float, float]]:
    """label -> (n, mean, standard deviation) of (label, residual) pairs.

    >>> group_residuals([("a", 0.1), ("a", 0.3), ("b", -0.2)])
    {'a': (2, 0.2, 0.1), 'b': (1, -0.2, 0.0)}
    """
    groups = defaultdict(list)
    for label, residual in labelled:
        groups[label].append(residual)
    return {k: (len(v), round(float(np.mean(v)), 3), round(float(np.std(v)), 3)) for k, v in sorted(groups.items())}


def cross_validated_gain(measured_log10, residual, feature, folds: int = 5, repeats: int = 40, seed: int = 0) -> dict:
    """Out-of-fold effect of a second-stage term ``w * feature`` on the calibration rows.

    For each of ``repeats`` random splits into ``folds`` folds, ``w`` is the
    least-squares weight (no intercept) of ``residual`` on ``feature`` over the
    other folds, and the held-out fold's index becomes ``index + w * feature``.
    Returns the mean out-of-fold squared error and Spearman's rho against
    ``measured_log10``, without the term (``mse_before``, ``spearman_before``)
    and with it, and the weight fitted on all rows.
    """
    from scipy.stats import spearmanr  # melting extra: only the analysis needs it

    y, r, x = (np.asarray(a, dtype=float) for a in (measured_log10, residual, feature))
    index = y - r
    if not np.any(x):
        raise ValueError("the feature is zero on every calibration row: nothing to fit")
    rng = np.random.default_rng(seed)
    mse, rho = [], []
    for _ in range(repeats):
        order = rng.permutation(len(y))
        predicted = np.empty_like(y)
        for held in np.array_split(order, folds):
            train = np.setdiff1d(order, held)
            denominator = x[train] @ x[train]
            w = (x[train] @ r[train]) / denominator if denominator else 0.0
            predicted[held] = index[held] + w * x[held]
        mse.append(np.mean((predicted - y) ** 2))
        rho.append(spearmanr(predicted, y).correlation)
    return {
        "weight": round(float((x @ r) / (x @ x)), 3),
        "rows_with_term": int(np.count_nonzero(x)),
        "mse_before": round(float(np.mean(r ** 2)), 5),
        "mse_after": round(float(np.mean(mse)), 5),
        "spearman_before": round(float(spearmanr(index, y).correlation), 4),
        "spearman_after": round(float(np.mean(rho)), 4),
    }


def _formal(dec: Decomposition) -> Decomposition:
    """The reading the salt index scores: the formal ionic one where the compound keeps no ions."""
    return dec if dec.cations else (formal_salt_reading(dec) or dec)


def _labels(dec: Decomposition, family: str) -> dict[str, str]:
    top = max(dec.cations, key=lambda t: t.ion.charge).ion
    symbol = next(iter(dict(top.composition)))
    return {
        "anion family": family or "?",
        "structure type": lattice.analyse(dec).structure_type or "none",
        "cation block": get_element(symbol).block if top.monatomic else "polyatomic",
        "cation charge": f"{top.charge}+",
        "anion charge": f"{-min(t.ion.charge for t in dec.anions)}-",
    }


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--training", help="a training_set.csv written by fit-melting (default: build it now)")
    parser.add_argument("--without-flagged-targets", action="store_true",
                        help="leave out the calibration rows whose target the screen flags (flagged_targets)")
    args = parser.parse_args(argv)
    training = weights_fit.training_rows(args.training)
    families = {r["formula_normalized"]: r.get("anion_family", "") for r in training}
    with open(weights_fit.CALIBRATION_SALTS, newline="", encoding="utf-8") as handle:
        families.update({r["formula_normalized"]: r["anion_family"] for r in csv.DictReader(handle)})
    rows = calibration_residuals(weights_fit.salt_rows(training))
    if args.without_flagged_targets:
        flagged = flagged_targets(training)
        print("left out, target flagged:", sorted(f for f, *_ in rows if f in flagged))
        rows = [r for r in rows if r[0] not in flagged]
    # the salt index reads an interstitial nitride or a layered dichalcogenide by its formal ions (TiN, TiS2)
    decs = [_formal(decompose(parse_formula(formula))) for formula, *_ in rows]
    print(f"calibration salts: {len(rows)} (validation half not read)")
    labels = [_labels(dec, families.get(formula, "")) for dec, (formula, *_) in zip(decs, rows)]
    for axis in labels[0]:
        print(f"residual log10 T_m - index by {axis}: n, mean, sd")
        for label, figures in group_residuals((lab[axis], r) for lab, (_, _, r, _) in zip(labels, rows)).items():
            print(f"  {label:28s} {figures}")
    measured = [y for _, y, _, _ in rows]
    residual = [r for _, _, r, _ in rows]
    for name, feature in CANDIDATE_TERMS.items():
        values = [feature(dec, terms) for dec, (_, _, _, terms) in zip(decs, rows)]
        print("candidate", name, cross_validated_gain(measured, residual, values))
    return 0


if __name__ == "__main__":
    sys.exit(main())
