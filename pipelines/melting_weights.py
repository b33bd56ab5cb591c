"""Fit and check the weights of the melting trend index, calibration apart from validation.

usage: python -m ionicity.pipelines.melting_weights [--training CSV]

Two named sets, each with its source in the repository:

* **inorganic salts**: calibration is ``datasets/melting/wikidata_salts.csv``
  (CC0, in the repository) and the calibration half (:func:`open_set_half`)
  of the open training set that ``ionicity fit-melting`` builds from
  ``chemicals`` (:func:`pipelines.melting_data.build_open_training_set`);
  the inorganic weights of ``scorer.melting.TREND_WEIGHTS`` are a
  least-squares fit of log10 T_m on it, spread matched
  (:func:`fit_salt_weights`). Validation is the other half, outside the
  file; its figures are the ones the README quotes. The figure over every
  open-set salt outside the file (the validation set before the halving)
  is printed too, marked as including the fitted half.
* **organic salts**: calibration is the ``calibration`` rows of
  ``datasets/melting/ionic_liquids.csv`` (published values, a source per
  row); the organic weights are fitted on them by Nelder-Mead, the inorganic
  ones held. Validation is its ``validation`` rows and every organic salt of
  the open training set not listed in that file.
* **molecules**: ``datasets/melting/molecular_compounds.csv`` names its rows
  ``calibration`` or ``validation``; melting points are read at run time with
  ``chemicals.phase_change.Tm``; validation figures are printed over all
  its validation rows and per ``origin`` (``issue_13``: the compounds the
  issue names; ``widened``: the rows a stated rule added). The five weights of the molecular route
  (:data:`MOLECULAR_WEIGHTS`, the lone-pair weight among them) are a least-squares fit of dH_m on the
  calibration rows; :func:`lone_pair_figures` prints each half with and without the lone-pair term.

* **organic molecules**: ``datasets/melting/organic_molecules.csv`` (CAS numbers of the
  CRC Handbook organic table; ``Tm(cas, method="CRC_ORG")`` at run time; one row per
  formula, the median of its isomers, formulas whose isomers melt more than a factor 1.5
  apart dropped: :func:`organic_molecule_rows`). The three cohesion weights of the organic
  molecular route (:data:`ORGANIC_MOLECULE_WEIGHTS`) are a least-squares fit of log10 T_m
  on the ``calibration`` half (:func:`fit_organic_molecule_weights`) and its two formula
  constants are chosen there (:func:`choose_organic_constants`); figures per half
  (:func:`organic_molecule_figures`: Spearman, mean |log10 error|, within x1.5, class).

The second-stage salt terms (``RESIDUAL_FEATURES``) are then fitted on the
calibration residuals with those weights held (:func:`fit_salt_residual_weights`).

Prints the fitted weights and, per set, Spearman's rho, the share within a
factor 1.5 and the class accuracy (on MELTING_CLASS_BANDS); then, on the open
set's validation salts scored as a user's rows are, the share with an index
and the share of those melting at 1500 C or above called ``refractory``. The
validation salts are also scored on the subset whose melting point two or more
source tables give within 20 K (``salts_validation_two_sources_agree``, the
measure of the melting issue; chosen on the data alone, never on the index). Progress goes to
stderr. Needs the ``melting`` extra (chemicals, scipy).
"""
from __future__ import annotations

import argparse
import csv
import hashlib
import math
import re
import sys
from dataclasses import replace
from pathlib import Path

import numpy as np
from ionicity.scorer import melting
from ionicity.scorer import melting_routes as routes
from ionicity.scorer.bond_class_rules import keeps_formal_salt_reading
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose
from ionicity.scorer.record import normalized_formula, score_formula

MOLECULAR_SET = Path(__file__).resolve().parents[1] / "datasets" / "melting" / "molecular_compounds.csv"
CALIBRATION_SALTS = MOLECULAR_SET.with_name("wikidata_salts.csv")
# name in TREND_WEIGHTS -> feature of MeltingTerms, with the sign the index gives it
SALT_FEATURES = (
    ("cohesion_exponent", lambda t: math.log10(t.lattice_energy_per_ion_kJ_mol / 381.0)),
    ("contact_chi", lambda t: -(t.contact_chi_pauling - 2.0)),
    ("contact_index", lambda t: -(t.contact_index if math.isfinite(t.contact_index) else 0.0)),
    ("pseudo_noble_gas", lambda t: -float(t.pseudo_noble_gas)),
    ("polyatomic_anion", lambda t: -t.polyatomic_anion_fraction),
    ("ions_per_formula_unit", lambda t: -math.log10(t.ions_per_formula_unit / 2.0)),
    ("trivalent_anion", lambda t: -t.trivalent_anion_fraction),
    ("high_charge_cation", lambda t: -t.cation_charge_above_3),
    ("framework_oxoanion", lambda t: t.framework_oxoanion_fraction),
    ("hydrogen_bonded_anion", lambda t: -t.hydrogen_bonded_anion_fraction),
    ("cohesion_curvature", lambda t: math.log10(t.lattice_energy_per_ion_kJ_mol / 381.0) ** 2),
    ("contact_delta_chi", lambda t: (t.delta_chi_pauling if math.isfinite(t.delta_chi_pauling) else 2.0) - 2.0),
    ("anion_symmetry", lambda t: t.anion_symmetry_log10),
    ("hydride_anion", lambda t: -t.hydride_fraction),
    ("pseudo_noble_gas_hard_anion", lambda t: float(t.pseudo_noble_gas) * t.hard_anion_fraction),
    ("rotor_anion", lambda t: t.rotor_anion_fraction),
)
# second stage: corrections fitted on the calibration residuals of the index above, its weights held
RESIDUAL_FEATURES = (
    ("crystal_field", lambda t: t.crystal_field_share),
    ("saline_nitride", lambda t: -t.saline_nitride_fraction),
    ("soft_cation_pseudohalide", lambda t: t.soft_pseudohalide_fraction),
    ("coinage_cation", lambda t: t.coinage_cation_fraction),
    ("heavy_halate", lambda t: t.heavy_halate_fraction),
    ("ammonium_hydrogen_bonds", lambda t: t.ammonium_cation_fraction),
)


def _figures(predicted_K, measured_K, salt=True) -> dict:
    from scipy.stats import spearmanr  # melting extra: only the fit needs it

    p, m = np.asarray(predicted_K, float), np.asarray(measured_K, float)
    classes_right = [routes.melting_class_for(a, salt) == routes.melting_class_for(b, salt) for a, b in zip(p, m)]
    return {
        "n": int(len(p)),
        "spearman": round(float(spearmanr(p, m).correlation), 3),
        "within_factor_1_5": round(float(np.mean(np.abs(np.log(p / m)) < math.log(1.5))), 3),
        "class_accuracy": round(float(np.mean(classes_right)), 3),
    }


def _figures_with_log_errors(predicted_K, measured_K) -> dict:
    """:func:`_figures` (non-salt bands) with the mean log10 error and its mean absolute value."""
    figures = _figures(predicted_K, measured_K, salt=False)
    errors = np.log10(np.divide(predicted_K, measured_K))
    figures["mean_log10"] = round(float(np.mean(errors)), 4)
    figures["mean_abs_log10"] = round(float(np.mean(np.abs(errors))), 4)
    return figures


def open_set_half(formula_normalized: str) -> str:
    """``calibration`` or ``validation``: the fixed half of the open training set a formula falls in.

    The parity of the SHA-256 digest of ``formula_normalized``: deterministic,
    independent of the row order and of the chemicals version, and blind to
    the melting point (so the two halves are alike).

    >>> open_set_half("NaCl"), open_set_half("KCl")
    ('calibration', 'validation')
    """
    digest = hashlib.sha256(formula_normalized.encode("utf-8")).digest()
    return "calibration" if digest[-1] % 2 == 0 else "validation"


def calibration_formulas() -> set[str]:
    """``formula_normalized`` of the CC0 fixture ``wikidata_salts.csv`` (calibration whatever its half)."""
    with open(CALIBRATION_SALTS, newline="", encoding="utf-8") as handle:
        return {row["formula_normalized"] for row in csv.DictReader(handle)}


def salt_rows(training_rows):
    """(split, terms, measured K, formula) of the inorganic salts with a trend index.

    Calibration: the rows of ``wikidata_salts.csv`` and the open training set's
    rows in the calibration half (:func:`open_set_half`); validation: the open
    set's rows in the other half, outside the fixture.
    """
    with open(CALIBRATION_SALTS, newline="", encoding="utf-8") as handle:
        fixture = list(csv.DictReader(handle))
    known = {row["formula_normalized"] for row in fixture}
    out = []
    for in_fixture, row in [*((True, r) for r in fixture),
                            *((False, r) for r in training_rows if r["formula_normalized"] not in known)]:
        dec = decompose(parse_formula(row["formula_normalized"]))
        if not dec.is_ionic and keeps_formal_salt_reading(dict(dec.composition)):
            # interstitial nitrides and layered dichalcogenides (TiN, VN, TiS2, WTe2) are read without
            # ions, but their melting route takes the salt index of their formal ionic reading: the
            # calibration fits that index on that reading, as before the rules (scorer.bond_class_rules)
            dec = melting.formal_salt_reading(dec)
        terms = melting.melting_terms(dec)
        if terms is None or terms.organic or not math.isfinite(terms.lattice_energy_kJ_mol):
            continue
        split = "calibration" if in_fixture else open_set_half(row["formula_normalized"])
        out.append((split, terms, float(row["mp_K"]), row["formula_normalized"]))
    return out


def fit_salt_weights(rows) -> dict[str, float]:
    """The intercept and the SALT_FEATURES weights: least squares of log10 T_m on the calibration rows, spread matched.

    Least squares shrinks the fitted values toward the mean by the correlation
    (Galton's regression to the mean): with rho about 0.85 the refractory
    oxides land in ``molten_salt``. So every feature weight is multiplied by
    ``s = sd(log10 T_m) / sd(fitted)`` on the calibration rows and the
    intercept moved to keep the mean: the index then spreads as the measured
    values do (variance matching, common practice), which leaves every
    Spearman figure as it was.
    """
    cal = [r for r in rows if r[0] == "calibration"]
    x = np.array([[1.0, *(f(t) for _, f in SALT_FEATURES)] for _, t, _, _ in cal])
    y = np.log10([mp for _, _, mp, _ in cal])
    w, *_ = np.linalg.lstsq(x, y, rcond=None)
    fitted = x @ w
    spread = float(np.std(y) / np.std(fitted))
    intercept = float(np.mean(y) * (1.0 - spread) + spread * w[0])
    return {"intercept": intercept, "spread": spread,
            **{k: float(c) * spread for (k, _), c in zip(SALT_FEATURES, w[1:])}}


def fit_salt_residual_weights(rows, weights=None) -> dict[str, float]:
    """The RESIDUAL_FEATURES weights: least squares of the calibration residuals, the SALT_FEATURES weights held.

    The residual is log10 T_m minus the index with ``weights`` (default: the
    shipped :data:`scorer.melting.TREND_WEIGHTS`, rounded as they are) and these
    terms at zero; no
    intercept and no spread factor: the terms are corrections that are zero
    for most salts (a d0/d5/d10 cation, no nitride), so they cannot shift or
    stretch the rest of the scale (stagewise fitting, as the organic terms
    are fitted with the inorganic ones held).
    """
    held = {**(weights or {}), **{k: 0.0 for k, _ in RESIDUAL_FEATURES}}
    cal = [r for r in rows if r[0] == "calibration"]
    x = np.array([[f(t) for _, f in RESIDUAL_FEATURES] for _, t, _, _ in cal])
    y = np.log10([mp for _, _, mp, _ in cal]) - np.array([_index_with(t, held) for _, t, _, _ in cal])
    w, *_ = np.linalg.lstsq(x, y, rcond=None)
    return {k: float(c) for (k, _), c in zip(RESIDUAL_FEATURES, w)}


def agreeing_sources(row, tolerance_K: float = 20.0) -> int:
    """How many distinct source tables of an open-set row lie within ``tolerance_K`` of its melting point.

    Read from the row's decision text (``agree: CRC_INORG=1157.2, ...``, the
    sources :func:`pipelines.melting_screen.consensus_melting_point_K` saw;
    several CAS entries of one formula count a table once). Blind to the
    index: it looks at the data only.

    >>> agreeing_sources({"mp_K": "1159.2", "decision": "consensus (2 of 3 within 20 K): CRC_INORG=1157.2, WIKIDATA=360.1, COMMON_CHEMISTRY=1161.2"})
    2
    >>> agreeing_sources({"mp_K": "331.15", "decision": "single: COMMON_CHEMISTRY=331.1"})
    1
    """
    target = float(row["mp_K"])
    tables = set()
    for name, value in re.findall(r"([A-Za-z0-9_.:-]+)=(-?[0-9.]+)", row.get("decision", "")):
        if abs(float(value) - target) <= tolerance_K:
            tables.add(name.rsplit(":", 1)[-1])
    return len(tables)


IONIC_LIQUID_SET = MOLECULAR_SET.with_name("ionic_liquids.csv")
ORGANIC_WEIGHTS = ("flexibility", "delocalised", "protic")


def organic_rows(training_rows):
    """(split, terms, measured K, formula) of salts with an organic cation or a bracketed ion.

    ``datasets/melting/ionic_liquids.csv`` split as its ``set`` column says; the
    open training set's organic salts not in that file are validation.
    """
    out = []
    with open(IONIC_LIQUID_SET, newline="", encoding="utf-8") as handle:
        sources = [(r["set"], r["formula"], float(r["mp_K"])) for r in csv.DictReader(handle)]
    listed = set()
    for _, formula, _ in sources:
        comp = parse_formula(formula)
        listed.add(normalized_formula(comp, decompose(comp)))
    sources += [("validation", r["formula_normalized"], float(r["mp_K"])) for r in training_rows
                if r["formula_normalized"] not in listed]
    for split, formula, mp in sources:
        dec = decompose(parse_formula(formula))
        if not dec.is_ionic or not (any(t.ion.organic for t in dec.cations)
                                    or any(t.ion.label.startswith("[") for t in dec.cations + dec.anions)):
            continue
        terms = melting.melting_terms(dec)
        if terms is not None and math.isfinite(terms.lattice_energy_kJ_mol):
            out.append((split, terms, mp, formula))
    return out


def organic_anion_rows(training_rows):
    """(split, terms, measured K, formula) of the open set's salts of organic anions with inorganic cations only
    (metal carboxylates, alkoxides, sulfonates: the rows :func:`salt_rows` and :func:`organic_rows` both
    leave out), split by :func:`open_set_half`."""
    out = []
    for row in training_rows:
        dec = decompose(parse_formula(row["formula_normalized"]))
        if not dec.is_ionic or melting.coordinating_organic_anion_fraction(dec.cations, dec.anions) <= 0:
            continue
        terms = melting.melting_terms(dec)
        if terms is not None and math.isfinite(terms.lattice_energy_kJ_mol):
            out.append((open_set_half(row["formula_normalized"]), terms, float(row["mp_K"]), row["formula_normalized"]))
    return out


def ammonium_decomposition_rows(salts, organic_anion_salts):
    """(split, terms, measured K, formula) of the ammonium salts of polyatomic anions among the rows of
    :func:`salt_rows` and :func:`organic_anion_rows` (ammonium carboxylates), each formula once, in the split
    its set gave it."""
    seen, out = set(), []
    for row in [*salts, *organic_anion_salts]:
        if row[1].ammonium_decomposes and row[3] not in seen:
            seen.add(row[3])
            out.append(row)
    return out


def fit_ammonium_decomposition(rows) -> dict[str, float]:
    """``ammonium_lattice_share`` and ``ammonium_decomposition_K`` on the calibration rows of
    :func:`ammonium_decomposition_rows`, the lattice index's weights held.

    For each share ``a`` on a grid of 0.1 (0 to 0.9) the level is the median of
    ``(log10 T_m - a I) / (1 - a)`` (robust: two of the calibration values are
    single-source values far off the band, NH4F's aside, which never takes the
    rule); the share with the least mean |log10 error| is kept, the level rounded
    to 1 K.
    """
    share, level = fit_decomposition_band(rows)
    return {"ammonium_lattice_share": share, "ammonium_decomposition_K": level}


def fit_decomposition_band(rows) -> tuple[float, float]:
    """(lattice share, level in K) of :func:`scorer.melting_index.decomposition_band_index` on the calibration
    rows of ``rows`` ((split, terms, measured K, formula)): for each share ``a`` on a grid of 0.1 (0 to 0.9)
    the level is the median of ``(log10 T_m - a I) / (1 - a)``; the share with the least mean |log10 error| is
    kept, the level rounded to 1 K."""
    cal = [(t.index(), math.log10(mp)) for split, t, mp, _ in rows if split == "calibration"]
    best = None
    for a in np.round(np.arange(0.0, 1.0, 0.1), 1):
        level = float(np.median([(y - a * i) / (1.0 - a) for i, y in cal]))
        loss = float(np.mean([abs(a * i + (1.0 - a) * level - y) for i, y in cal]))
        if best is None or loss < best[0] - 1e-12:
            best = (loss, float(a), level)
    return best[1], float(round(10 ** best[2]))


def decomposing_anion_rows(salts):
    """(split, terms, measured K, formula) of :func:`salt_rows` whose every anion decomposes on heating."""
    return [row for row in salts if row[1].decomposing_anions]


def fit_decomposing_anion_band(rows) -> dict[str, float]:
    """``decomposing_anion_lattice_share`` and ``decomposing_anion_K`` (:func:`fit_decomposition_band`)."""
    share, level = fit_decomposition_band(rows)
    return {"decomposing_anion_lattice_share": share, "decomposing_anion_K": level}


def ammonium_decomposition_figures(rows, weights=None, label="ammonium_salts") -> dict:
    """Per split of :func:`ammonium_decomposition_rows` (or :func:`decomposing_anion_rows`, with ``label``):
    figures with the band and with the lattice index alone."""
    out = {}
    for split in ("calibration", "validation"):
        part = [r for r in rows if r[0] == split]
        if not part:
            continue
        measured = [mp for _, _, mp, _ in part]
        for kind, predicted in (("with_rule", [10 ** t.trend_index(weights) for _, t, _, _ in part]),
                                ("lattice_index", [10 ** t.index(weights) for _, t, _, _ in part])):
            figures = _figures(predicted, measured)
            figures["mean_abs_log10"] = round(float(np.mean(np.abs(np.log10(np.array(predicted) / measured)))), 4)
            out[f"{label}_{split}_{kind}"] = figures
    return out


ORGANIC_ANION_WEIGHTS = ("coordinating_organic_anion", "polarising_organic_anion")


def fit_organic_anion_weights(rows) -> dict[str, float]:
    """The ``coordinating_organic_anion`` and ``polarising_organic_anion`` weights: least squares of the log10
    residuals of the calibration rows of :func:`organic_anion_rows`, every other weight held as shipped.

    The terms sit inside the ionic part of the index, which the organic ions' entropy then dilutes, so the
    fit is a minimisation on grids, not a linear solve: steps of 0.01 over [-0.2, 0.5] for both, then steps of
    0.001 within 0.02 of the best pair (deterministic; the loss is smooth and has one minimum there).
    """
    cal = [r for r in rows if r[0] == "calibration"]
    log_mp = np.log10([mp for _, _, mp, _ in cal])

    def loss(pair) -> float:
        changed = dict(zip(ORGANIC_ANION_WEIGHTS, pair))
        predicted = np.array([_index_with(t, changed) for _, t, _, _ in cal])
        return float(np.sum((predicted - log_mp) ** 2))

    coarse = np.round(np.arange(-0.2, 0.5005, 0.01), 3)
    best = min(((a, b) for a in coarse for b in coarse), key=loss)
    fine = [np.round(np.arange(c - 0.02, c + 0.0205, 0.001), 3) for c in best]
    best = min(((a, b) for a in fine[0] for b in fine[1]), key=loss)
    return {k: float(v) for k, v in zip(ORGANIC_ANION_WEIGHTS, best)}


def organic_anion_figures(rows, weights=None) -> dict:
    """Figures per half of :func:`organic_anion_rows`, with the shipped weights (or ``weights``), with one weight
    for every inorganic cation (the polarising term at 0, the other refitted alone as before the term was added)
    and without the terms."""
    out = {}
    one = fit_one_organic_anion_weight(rows)
    for split in ("calibration", "validation"):
        part = [r for r in rows if r[0] == split]
        if not part:
            continue
        measured = [mp for _, _, mp, _ in part]
        for label, changed in (("with_terms", weights), ("one_weight", {ORGANIC_ANION_WEIGHTS[0]: one,
                                                                       ORGANIC_ANION_WEIGHTS[1]: 0.0}),
                               ("without_terms", dict.fromkeys(ORGANIC_ANION_WEIGHTS, 0.0))):
            predicted = [10 ** _index_with(t, changed) for _, t, _, _ in part]
            figures = _figures(predicted, measured)
            figures["mean_abs_log10"] = round(float(np.mean(np.abs(np.log10(np.array(predicted) / measured)))), 4)
            out[f"organic_anion_salts_{split}_{label}"] = figures
    return out


def fit_one_organic_anion_weight(rows) -> float:
    """The ``coordinating_organic_anion`` weight alone (the polarising term at 0), fitted as the pair is: the
    comparison :func:`organic_anion_figures` reports."""
    cal = [r for r in rows if r[0] == "calibration"]
    log_mp = np.log10([mp for _, _, mp, _ in cal])

    def loss(w: float) -> float:
        changed = {ORGANIC_ANION_WEIGHTS[0]: w, ORGANIC_ANION_WEIGHTS[1]: 0.0}
        return float(np.sum((np.array([_index_with(t, changed) for _, t, _, _ in cal]) - log_mp) ** 2))

    grid = np.round(np.arange(0.0, 0.5005, 0.001), 3)
    return float(grid[int(np.argmin([loss(w) for w in grid]))])


def _index_with(terms, weights) -> float:
    return terms.index(weights)


def fit_organic_weights(rows) -> dict[str, float]:
    """Nelder-Mead on the squared log10 error of the calibration rows, inorganic weights held."""
    from scipy.optimize import minimize  # melting extra

    cal = [r for r in rows if r[0] == "calibration"]
    y = np.log10([mp for _, _, mp, _ in cal])

    def loss(w):
        weights = dict(zip(ORGANIC_WEIGHTS, np.abs(w)))
        return float(np.mean((np.array([_index_with(t, weights) for _, t, _, _ in cal]) - y) ** 2))

    start = [melting.TREND_WEIGHTS[k] or 0.1 for k in ORGANIC_WEIGHTS]
    result = minimize(loss, start, method="Nelder-Mead", options={"maxiter": 2000, "xatol": 1e-3, "fatol": 1e-7})
    return dict(zip(ORGANIC_WEIGHTS, map(float, np.abs(result.x))))


def molecular_rows():
    """(split, formula, terms, measured K) of datasets/melting/molecular_compounds.csv (chemicals Tm at run time)."""
    from chemicals.phase_change import Tm  # melting extra

    out = []
    with open(MOLECULAR_SET, newline="", encoding="utf-8") as handle:
        for row in csv.DictReader(handle):
            value = Tm(row["cas"])
            if value is None:
                continue
            terms = routes.molecular_terms(decompose(parse_formula(row["formula"])))
            out.append((row["set"], row["formula"], terms, float(value)))
    return out


MOLECULAR_WEIGHTS = ("molecular_contact_kJ_mol", "molecular_polarisability_kJ_mol_A3", "molecular_bridge_kJ_mol",
                     "molecular_secondary_kJ_mol", "molecular_lone_pair_kJ_mol")


def molecular_origins() -> dict[str, str]:
    """formula -> ``origin`` of datasets/melting/molecular_compounds.csv: ``issue_13`` (named in the
    melting issue), ``first_set`` (the first calibration rows) or ``widened`` (validation rows added
    by the rule in datasets/melting/README.md)."""
    with open(MOLECULAR_SET, newline="", encoding="utf-8") as handle:
        return {row["formula"]: row["origin"] for row in csv.DictReader(handle)}


def fit_molecular_weights(rows) -> dict[str, float]:
    """Least squares of dH_m = T_m dS_m (relative errors) on the calibration rows.

    ``molecular_secondary_kJ_mol`` rests on the calibration rows with secondary
    contacts in ``scorer/data/molecular_coordination.csv`` (HgCl2); the other
    rows of that kind (HgBr2, HgI2, BiCl3) are validation. ``molecular_lone_pair_kJ_mol``
    rests on the four calibration rows whose centre has a lone pair (PCl3, PBr3, AsCl3,
    SOCl2, one each); the validation half holds 24 such rows, with one to three lone pairs.
    """
    a, b = [], []
    for split, _, m, t in rows:
        if split != "calibration":
            continue
        ds = routes.walden_dannenfelser_yalkowsky_entropy_J_mol_K(m.symmetry_number, m.torsions_tau)
        dh = t * ds / 1000.0
        secondary = min(m.secondary_contacts, m.open_sites)
        a.append(np.array([len(m.ligand_polarisabilities_A3), sum(m.ligand_polarisabilities_A3),
                           (m.open_sites - secondary) * m.bond_strength,
                           secondary * m.bond_strength * m.primary_delta_chi, m.lone_pairs_counted]) / dh)
        # the hydrogen-bond weight is held (fit_molecular_hydrogen_bond_weight; none of these rows has a donor site)
        b.append(1.0 - melting.TREND_WEIGHTS["molecular_hydrogen_bond_kJ_mol"] * m.hydrogen_bond_sites / dh)
    w, *_ = np.linalg.lstsq(np.array(a), np.array(b), rcond=None)
    return dict(zip(MOLECULAR_WEIGHTS, map(float, w)))


ORGANIC_MOLECULE_SET = MOLECULAR_SET.with_name("organic_molecules.csv")
#: fitted by least squares (fit_organic_molecule_weights)
ORGANIC_MOLECULE_WEIGHTS = ("organic_heavy_atom_kJ_mol", "organic_polarisability_kJ_mol_A3",
                            "organic_hydrogen_bond_kJ_mol")
#: the formula reading's constants, each chosen on the calibration half over these grids (choose_organic_constants)
ORGANIC_CONSTANT_GRIDS = {"organic_rigid_atoms_per_unsaturation": (0.75, 1.0, 1.25, 1.5, 2.0),
                          "organic_uniform_symmetry_number": (1.0, 2.0, 4.0)}
#: isomers whose CRC melting points differ by more than this factor: the formula cannot tell them apart
ISOMER_SPREAD_LIMIT = 1.5


def _median_crc_rows(path, spread_limit: float):
    """(split, formula, composition, median K, isomers) of a set file of CAS numbers (``formula``, ``cas``,
    ``set``): melting points read at run time (``chemicals.phase_change.Tm(cas, method="CRC_ORG")``), one row per
    formula, the median over its CAS numbers; a formula whose isomers melt more than ``spread_limit`` apart
    (max / min) is dropped."""
    from chemicals.phase_change import Tm  # melting extra

    values: dict[tuple[str, str], list[float]] = {}
    with open(path, newline="", encoding="utf-8") as handle:
        for row in csv.DictReader(handle):
            value = Tm(row["cas"], method="CRC_ORG")
            if value is not None and value > 0:
                values.setdefault((row["set"], row["formula"]), []).append(float(value))
    return [(split, formula, parse_formula(formula).counts, float(np.median(found)), len(found))
            for (split, formula), found in sorted(values.items()) if max(found) / min(found) <= spread_limit]


def organic_molecule_rows(spread_limit: float = ISOMER_SPREAD_LIMIT):
    """(split, formula, composition, median K, isomers) of datasets/melting/organic_molecules.csv.

    Melting points are read at run time (``chemicals.phase_change.Tm(cas, method="CRC_ORG")``,
    the CRC Handbook organic table). A formula is one row: the median over its CAS numbers
    (isomers); a formula whose isomers melt more than ``spread_limit`` apart (max / min) is
    dropped, as no reading of the formula can place it. Both halves alike.
    """
    return _median_crc_rows(ORGANIC_MOLECULE_SET, spread_limit)


def _acid_groups_of(formula: str) -> float:
    """The acid groups the scorer reads in ``formula`` (:func:`scorer.melting.organic_acid_groups`)."""
    return melting.organic_acid_groups(decompose(parse_formula(formula)))


def _organic_design(rows, weights):
    """(features, dS_m, measured T_m, fixed dH_m) of rows: heavy atoms, polarisability, hydrogen-bond sites per
    row, and the acid term of an organic acid as the scorer reads the formula (its weight held)."""
    from ionicity.scorer.melting_organic import organic_terms

    features, entropy, measured, fixed = [], [], [], []
    for _, formula, counts, t, _ in rows:
        m = organic_terms(counts, weights)
        features.append([m.heavy_atoms, m.polarisability_A3, m.hydrogen_bond_sites])
        entropy.append(m.entropy_J_mol_K())
        measured.append(t)
        fixed.append(weights["organic_acid_group_kJ_mol"] * _acid_groups_of(formula))
    return np.array(features), np.array(entropy), np.array(measured), np.array(fixed)


def fit_organic_molecule_weights(rows, weights=None) -> dict[str, float]:
    """Least squares of log10 T_m on the ``calibration`` rows of :func:`organic_molecule_rows`.

    ``T_m = 1000 (w . f) / dS_m`` is linear in the weights ``w``; the squared log10
    errors are minimised (``scipy.optimize.least_squares``) from the linear least-squares
    solution of ``w . f = T_m dS_m`` in relative errors, whose log errors lean low
    (mean -0.027 on the calibration half). The formula reading's constants as in
    ``weights`` (default ``TREND_WEIGHTS``).
    """
    from scipy.optimize import least_squares  # melting extra

    weights = melting.TREND_WEIGHTS if weights is None else {**melting.TREND_WEIGHTS, **weights}
    features, entropy, measured, fixed = _organic_design([r for r in rows if r[0] == "calibration"], weights)
    scale = measured * entropy / 1000.0
    start, *_ = np.linalg.lstsq(features / scale[:, None], 1.0 - fixed / scale, rcond=None)

    def log_errors(w):
        return np.log10(np.maximum(features @ w + fixed, 1e-9) * 1000.0 / entropy) - np.log10(measured)

    w = least_squares(log_errors, start).x
    return dict(zip(ORGANIC_MOLECULE_WEIGHTS, map(float, w)))


def organic_molecule_figures(rows, weights=None, splits=("calibration", "validation")) -> dict:
    """Per split: n, Spearman, mean |log10 error|, share within x1.5, melting class right (non-salt bands)."""
    from ionicity.scorer.melting_organic import organic_terms

    weights = melting.TREND_WEIGHTS if weights is None else {**melting.TREND_WEIGHTS, **weights}
    out = {}
    for split in splits:
        part = [r for r in rows if r[0] == split]
        if not part:
            continue
        predicted = [organic_terms(c, weights, acid_groups=_acid_groups_of(f)).melting_K(weights)
                     for _, f, c, _, _ in part]
        measured = [t for _, _, _, t, _ in part]
        figures = _figures(predicted, measured, salt=False)
        figures["mean_abs_log10"] = round(float(np.mean(np.abs(np.log10(np.divide(predicted, measured))))), 4)
        out[f"organic_molecules_{split}"] = figures
    return out


def choose_organic_constants(rows) -> tuple[dict[str, float], list]:
    """The formula reading's constants with the highest Spearman rho on the calibration half.

    Each combination of :data:`ORGANIC_CONSTANT_GRIDS` refits the three weights
    (:func:`fit_organic_molecule_weights`) and is scored on the calibration rows
    only. Returns the chosen constants and every (constants, figures) tried.
    """
    import itertools

    names = list(ORGANIC_CONSTANT_GRIDS)
    tried = []
    for values in itertools.product(*ORGANIC_CONSTANT_GRIDS.values()):
        constants = dict(zip(names, values))
        fitted = fit_organic_molecule_weights(rows, constants)
        figures = organic_molecule_figures(rows, {**constants, **fitted}, splits=("calibration",))
        tried.append((constants, figures["organic_molecules_calibration"]))
    best = max(tried, key=lambda item: item[1]["spearman"])
    return best[0], tried


INTERMETALLIC_SET = MOLECULAR_SET.with_name("intermetallic_compounds.csv")


ZWITTERION_SET = MOLECULAR_SET.with_name("zwitterions.csv")


def zwitterion_rows():
    """(split, formula, composition, median K, isomers) of datasets/melting/zwitterions.csv, as
    :func:`organic_molecule_rows` reads its set (``Tm(cas, method="CRC_ORG")`` at run time, the median over a
    formula's CAS numbers, a formula whose isomers melt more than ``ISOMER_SPREAD_LIMIT`` apart dropped)."""
    return _median_crc_rows(ZWITTERION_SET, ISOMER_SPREAD_LIMIT)


def _zwitterion_K(counts, weights, zwitterion=True) -> float:
    from ionicity.scorer.melting_organic import organic_terms

    return organic_terms(counts, weights, zwitterion=zwitterion).melting_K(weights)


def fit_zwitterion_weight(rows) -> float:
    """``organic_zwitterion_kJ_mol``: least squares of log10 T_m on the ``calibration`` rows of
    :func:`zwitterion_rows`, every other weight held at ``TREND_WEIGHTS``; the term adds to dH_m, so the
    fit is one-dimensional (``scipy.optimize.least_squares`` from 0)."""
    from scipy.optimize import least_squares  # melting extra

    part = [r for r in rows if r[0] == "calibration"]

    def log_errors(w):
        weights = {**melting.TREND_WEIGHTS, "organic_zwitterion_kJ_mol": float(w[0])}
        return np.log10([_zwitterion_K(c, weights) for _, _, c, _, _ in part]) - np.log10([t for *_, t, _ in part])

    return float(least_squares(log_errors, [0.0]).x[0])


def zwitterion_figures(rows, weights=None) -> dict:
    """Per split, with the term (``TREND_WEIGHTS`` or ``weights``) and without it: n, Spearman, share within
    x1.5, class right (non-salt bands), mean log10 error and its mean absolute value."""
    weights = melting.TREND_WEIGHTS if weights is None else {**melting.TREND_WEIGHTS, **weights}
    out = {}
    for split in ("calibration", "validation"):
        part = [r for r in rows if r[0] == split]
        if not part:
            continue
        measured = [t for *_, t, _ in part]
        for label, on in (("with_term", True), ("without_term", False)):
            predicted = [_zwitterion_K(c, weights, on) for _, _, c, _, _ in part]
            out[f"zwitterions_{split}_{label}"] = _figures_with_log_errors(predicted, measured)
    return out


ORGANIC_ACID_SET = MOLECULAR_SET.with_name("organic_acids.csv")


def organic_acid_rows(spread_limit: float = ISOMER_SPREAD_LIMIT):
    """(split, formula, composition, median K, acid groups, scorer reads it as that acid) of
    datasets/melting/organic_acids.csv: melting points read at run time (``Tm(cas, method="CRC_ORG")``), one
    row per formula and count of acid groups, the median over its CAS numbers, a formula whose isomers melt
    more than ``spread_limit`` apart dropped (as :func:`organic_molecule_rows`)."""
    from chemicals.phase_change import Tm  # melting extra

    values: dict[tuple, list[float]] = {}
    with open(ORGANIC_ACID_SET, newline="", encoding="utf-8") as handle:
        for row in csv.DictReader(handle):
            value = Tm(row["cas"], method="CRC_ORG")
            if value is not None and value > 0:
                key = (row["set"], row["formula"], float(row["acid_groups"]), row["scorer_reads_acid"] == "yes")
                values.setdefault(key, []).append(float(value))
    return [(split, formula, parse_formula(formula).counts, float(np.median(found)), groups, read)
            for (split, formula, groups, read), found in sorted(values.items())
            if max(found) / min(found) <= spread_limit]


def _organic_acid_K(counts, groups, weights) -> float:
    from ionicity.scorer.melting_organic import organic_terms

    return organic_terms(counts, weights, acid_groups=groups).melting_K(weights)


def fit_organic_acid_weight(rows) -> float:
    """``organic_acid_group_kJ_mol``: least squares of log10 T_m on the ``calibration`` rows of
    :func:`organic_acid_rows` (the count of acid groups from the structure), every other weight held at
    ``TREND_WEIGHTS``; one-dimensional (``scipy.optimize.least_squares`` from 0)."""
    from scipy.optimize import least_squares  # melting extra

    part = [r for r in rows if r[0] == "calibration"]

    def log_errors(w):
        weights = {**melting.TREND_WEIGHTS, "organic_acid_group_kJ_mol": float(w[0])}
        return (np.log10([_organic_acid_K(c, g, weights) for _, _, c, _, g, _ in part])
                - np.log10([t for _, _, _, t, _, _ in part]))

    return float(least_squares(log_errors, [0.0]).x[0])


def organic_acid_figures(rows, weights=None) -> dict:
    """Per split, with the term and without it: n, Spearman, share within x1.5, class right (non-salt bands),
    mean log10 error and its mean absolute value; and the same on the rows the scorer reads as acids."""
    weights = melting.TREND_WEIGHTS if weights is None else {**melting.TREND_WEIGHTS, **weights}
    out = {}
    for split in ("calibration", "validation"):
        for subset, part in (("", [r for r in rows if r[0] == split]),
                             ("_read_as_acid", [r for r in rows if r[0] == split and r[5]])):
            if len(part) < 2:
                continue
            measured = [r[3] for r in part]
            for label, scale in (("with_term", 1.0), ("without_term", 0.0)):
                w = {**weights, "organic_acid_group_kJ_mol": weights["organic_acid_group_kJ_mol"] * scale}
                predicted = [_organic_acid_K(c, g, w) for _, _, c, _, g, _ in part]
                out[f"organic_acids_{split}{subset}_{label}"] = _figures_with_log_errors(predicted, measured)
    return out


def intermetallic_rows():
    """(split, formula, element-mixture K, electronegativity variance, measured K) of
    datasets/melting/intermetallic_compounds.csv (chemicals Tm at run time; ``excluded`` rows left out)."""
    from chemicals.phase_change import Tm  # melting extra

    out = []
    with open(INTERMETALLIC_SET, newline="", encoding="utf-8") as handle:
        for row in csv.DictReader(handle):
            value = Tm(row["cas"])
            if value is None or row["set"] == "excluded":
                continue
            composition = decompose(parse_formula(row["formula"])).composition
            mixture_K, _ = routes.element_mixture_melting_K(composition)
            out.append((row["set"], row["formula"], mixture_K,
                        routes.intermetallic_mixing_variance(composition), float(value)))
    return out


def fit_intermetallic_weight(rows) -> float:
    """``intermetallic_chi_variance``: least squares through the origin of log10(T_m / T_mix) on the
    electronegativity variance, calibration rows only (no intercept: the rule of mixtures stands for
    a compound of like elements)."""
    x = np.array([v for split, _, _, v, _ in rows if split == "calibration"])
    y = np.array([math.log10(t / m) for split, _, m, _, t in rows if split == "calibration"])
    return float(np.sum(x * y) / np.sum(x * x))


def intermetallic_figures(rows, weight: float) -> dict:
    """Per split: mean |log10 error|, share within a factor 1.5 and class right, with and without the term."""
    out = {}
    for split in ("calibration", "validation"):
        chosen = [r for r in rows if r[0] == split]
        measured = [t for *_, t in chosen]
        for label, w in (("rule_of_mixtures", 0.0), ("with_term", weight)):
            predicted = [m * 10 ** (w * v) for _, _, m, v, _ in chosen]
            figures = _figures(predicted, measured, salt=False)
            figures["mean_abs_log10"] = round(float(np.mean(np.abs(np.log10(np.divide(predicted, measured))))), 4)
            out[f"intermetallics_{split}_{label}"] = figures
    return out


HYDROGEN_BONDED_SET = MOLECULAR_SET.with_name("hydrogen_bonded_molecules.csv")


def hydrogen_bonded_rows():
    """(split, formula, terms, measured K) of ``hydrogen_bonded_molecules.csv``, read down the molecular route.

    The melting points are the CRC Handbook's inorganic table,
    ``chemicals.phase_change.Tm(cas, method="CRC_INORG")``, read now.
    """
    from chemicals.phase_change import Tm  # melting extra

    out = []
    with open(HYDROGEN_BONDED_SET, newline="", encoding="utf-8") as handle:
        for row in csv.DictReader(handle):
            value = Tm(row["cas"], method="CRC_INORG")
            if value is not None:
                out.append((row["set"], row["formula"], routes.molecular_terms(as_molecular(row["formula"])),
                            float(value)))
    return out


def _molecular_cohesion(m, weights, hydrogen_bond_sites) -> float:
    return m.cohesion_kJ_mol(weights, hydrogen_bond_sites)


def _molecular_K(m, weights, hydrogen_bond_sites) -> float:
    entropy = routes.walden_dannenfelser_yalkowsky_entropy_J_mol_K(m.symmetry_number, m.torsions_tau)
    return routes.molecular_melting_K(_molecular_cohesion(m, weights, hydrogen_bond_sites), entropy)


def fit_molecular_hydrogen_bond_weight(rows) -> float:
    """``molecular_hydrogen_bond_kJ_mol``: least squares of dH_m = T_m dS_m (relative errors) on the calibration
    rows of :func:`hydrogen_bonded_rows`, the other molecular weights held (as :func:`fit_molecular_weights`)."""
    a, b = [], []
    held = {**melting.TREND_WEIGHTS, "molecular_hydrogen_bond_kJ_mol": 0.0}
    for split, _, m, t in rows:
        if split != "calibration" or not m.hydrogen_bond_sites:
            continue
        dh = t * routes.walden_dannenfelser_yalkowsky_entropy_J_mol_K(m.symmetry_number, m.torsions_tau) / 1000.0
        a.append(m.hydrogen_bond_sites / dh)
        b.append(1.0 - _molecular_cohesion(m, held, 0.0) / dh)
    a, b = np.array(a), np.array(b)
    return float(a @ b / (a @ a))


def lone_pair_figures(rows, weights=None) -> dict:
    """Figures of the molecular route on :func:`molecular_rows`, per split, with and without the lone-pair term;
    ``_lone_pair_rows`` only the rows whose centre has a lone pair the cohesion counts."""
    w = {**melting.TREND_WEIGHTS, **(weights or {})}
    out = {}
    for split in ("calibration", "validation"):
        for subset, keep in (("", lambda m: True), ("_lone_pair_rows", lambda m: m.lone_pairs_counted > 0)):
            part = [r for r in rows if r[0] == split and keep(r[2])]
            measured = [t for *_, t in part]
            for name, h in (("with_lone_pairs", w["molecular_lone_pair_kJ_mol"]), ("without_lone_pairs", 0.0)):
                predicted = [_molecular_K(m, {**w, "molecular_lone_pair_kJ_mol": h}, m.hydrogen_bond_sites)
                             for _, _, m, _ in part]
                out[f"{split}{subset}_{name}"] = {
                    **_figures(predicted, measured, salt=False),
                    "mean_abs_log10": round(float(np.mean(np.abs(np.log10(np.divide(predicted, measured))))), 3)}
    return out


def hydrogen_bonded_figures(rows, weights=None) -> dict:
    """Figures of the molecular route on :func:`hydrogen_bonded_rows`, per split, with and without the
    hydrogen-bond term (``weights`` overrides :data:`scorer.melting.TREND_WEIGHTS`)."""
    w = {**melting.TREND_WEIGHTS, **(weights or {})}
    out = {}
    for split in ("calibration", "validation"):
        part = [r for r in rows if r[0] == split]
        measured = [t for *_, t in part]
        for name, on in (("with_hydrogen_bonds", True), ("without_hydrogen_bonds", False)):
            predicted = [_molecular_K(m, w, m.hydrogen_bond_sites if on else 0.0) for _, _, m, _ in part]
            out[f"{split}_{name}"] = {
                **_figures(predicted, measured, salt=False),
                "mean_abs_log10": round(float(np.mean(np.abs(np.log10(np.divide(predicted, measured))))), 3)}
    return out


def as_molecular(formula: str):
    """The decomposition of a formula read as a molecular compound (no ions, class covalent_molecular)."""
    return replace(decompose(parse_formula(formula)), cations=(), anions=(), substance_class="covalent_molecular")


def evaluate(salts, molecules, organics=None, agreed=None, flagged=None) -> dict:
    """Figures per set and split with the weights now in TREND_WEIGHTS, and over all validation rows.

    ``agreed``: the formulas whose melting point two or more source tables give within 20 K
    (:func:`agreeing_sources`); adds ``salts_validation_two_sources_agree``, the validation
    salts among them (the issue's measure), beside the full validation half. ``flagged``: the
    formulas whose target :func:`pipelines.melting_screen.target_flags` flagged (hydrate or
    decomposition look); adds ``salts_validation_unflagged``, the validation salts without them.
    """
    out = {}
    pooled_p, pooled_m = [], []
    for split in ("calibration", "validation"):
        rows = [r for r in salts if r[0] == split]
        predicted = []
        if rows:
            out[f"salts_{split}"] = _figures([10 ** t.trend_index() for _, t, _, _ in rows], [mp for _, _, mp, _ in rows])
        sure = [r for r in rows if agreed is not None and r[3] in agreed]
        if sure and split == "validation":
            out["salts_validation_two_sources_agree"] = _figures([10 ** t.trend_index() for _, t, _, _ in sure],
                                                                 [mp for _, _, mp, _ in sure])
        clean = [r for r in rows if flagged is not None and r[3] not in flagged]
        if clean and split == "validation":
            out["salts_validation_unflagged"] = _figures([10 ** t.trend_index() for _, t, _, _ in clean],
                                                         [mp for _, _, mp, _ in clean])
        organic = [r for r in (organics or ()) if r[0] == split]
        if organic:
            predicted = [10 ** t.trend_index() for _, t, _, _ in organic]
            measured = [mp for _, _, mp, _ in organic]
            out[f"organic_salts_{split}"] = {**_figures(predicted, measured),
                                              "mae_K": round(float(np.mean(np.abs(np.subtract(predicted, measured)))), 1)}
        mols = [r for r in molecules if r[0] == split]
        if mols:
            # the set is molecular by definition: read every row down the molecular route, whatever
            # class the ion solver gives it today (AlCl3 and HgX2 are covalent_molecular after issue 12)
            predicted = [10 ** melting.describe(as_molecular(f))[0]["mp_trend_index"] for _, f, _, _ in mols]
            out[f"molecules_{split}"] = _figures(predicted, [t for *_, t in mols], salt=False)
            if split == "validation":
                origin = molecular_origins()
                for name in sorted({origin.get(f, "") for _, f, _, _ in mols}):
                    pairs = [(p, t) for p, (_, f, _, t) in zip(predicted, mols) if origin.get(f, "") == name]
                    out[f"molecules_validation_{name}"] = _figures(*zip(*pairs), salt=False)
        if split == "validation":
            pooled_p += [10 ** t.trend_index() for _, t, _, _ in rows + organic] + (predicted if mols else [])
            pooled_m += [mp for _, _, mp, _ in rows + organic] + [t for *_, t in mols]
    open_rows = [r for r in salts if r[3] not in calibration_formulas()]
    if open_rows:
        # the figure quoted before the open set was halved: it now includes the fitted calibration half
        out["salts_open_set_old_style_includes_fitted_half"] = _figures(
            [10 ** t.trend_index() for _, t, _, _ in open_rows], [mp for _, _, mp, _ in open_rows])
    if pooled_p:
        out["all_validation"] = {k: v for k, v in _figures(pooled_p, pooled_m).items() if k != "class_accuracy"}
    return out


def coverage_and_refractory(training_rows, held_out_only=True) -> dict:
    """Validation salts of the open set (its held-out half, outside the CC0 fixture), scored as a user's rows are.

    ``held_out_only=False``: every row outside the fixture, the calibration half included (the figure
    quoted before the open set was halved).

    ``coverage``: the share with a finite ``mp_trend_index`` (any route);
    ``refractory_share``: of those melting at 1773.15 K or above, the share whose
    ``melting_class`` is ``refractory``; ``no_index``: the formulas without one.
    """
    known = calibration_formulas()
    rows = [r for r in training_rows if r["formula_normalized"] not in known
            and (not held_out_only or open_set_half(r["formula_normalized"]) == "validation")]
    scored = [(r, score_formula(r["formula_normalized"])) for r in rows]
    indexed = [(r, s) for r, s in scored if isinstance(s.get("mp_trend_index"), float) and math.isfinite(s["mp_trend_index"])]
    hot = [s for r, s in indexed if float(r["mp_K"]) >= 1773.15]
    return {
        "n": len(rows),
        "coverage": round(len(indexed) / len(rows), 3) if rows else math.nan,
        "refractory_n": len(hot),
        "refractory_share": round(sum(s["melting_class"] == "refractory" for s in hot) / len(hot), 3) if hot else math.nan,
        "no_index": sorted({r["formula_normalized"] for r, s in scored} - {r["formula_normalized"] for r, _ in indexed}),
    }


def training_rows(path=None) -> list[dict]:
    """The rows of a training_set.csv written by fit-melting, or, without ``path``, the open set built now
    (:func:`pipelines.melting_data.build_open_training_set`, progress on stderr)."""
    if path:
        with open(path, newline="", encoding="utf-8") as handle:
            return list(csv.DictReader(handle))
    from ionicity.pipelines.melting_data import build_open_training_set

    return build_open_training_set(progress=lambda text: print(text, file=sys.stderr, flush=True)).rows


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--training", help="a training_set.csv written by fit-melting (default: build it now)")
    args = parser.parse_args(argv)
    training = training_rows(args.training)
    print("scoring the salts", file=sys.stderr, flush=True)
    salts = salt_rows(training)
    print("reading the molecular set", file=sys.stderr, flush=True)
    molecules = molecular_rows()
    salt_weights = fit_salt_weights(salts)
    print("salt weights (fit on calibration):", {k: round(v, 3) for k, v in salt_weights.items()})
    print("second-stage salt weights (fit on calibration residuals):",
          {k: round(v, 3) for k, v in fit_salt_residual_weights(salts).items()})
    organics = organic_rows(training)
    print("organic weights (fit on calibration):", {k: round(v, 3) for k, v in fit_organic_weights(organics).items()})
    print("molecular weights (fit on calibration):", {k: round(v, 3) for k, v in fit_molecular_weights(molecules).items()})
    for name, figures in lone_pair_figures(molecules).items():
        print(f"molecules_{name}", figures)
    print("reading the organic molecules", file=sys.stderr, flush=True)
    organic_molecules = organic_molecule_rows()
    constants, tried = choose_organic_constants(organic_molecules)
    for tried_constants, figures in tried:
        print("organic formula constants tried (calibration):", tried_constants, figures, file=sys.stderr)
    print("organic formula constants (chosen on calibration Spearman):", constants)
    print("organic molecule weights (fit on calibration):",
          {k: round(v, 3) for k, v in fit_organic_molecule_weights(organic_molecules).items()})
    anion_rows = organic_anion_rows(training)
    anion_weights = fit_organic_anion_weights(anion_rows)
    print("organic-anion weights (fit on calibration):", {k: round(v, 3) for k, v in anion_weights.items()})
    for name, figures in organic_anion_figures(anion_rows).items():
        print(name, figures)
    ammonium = ammonium_decomposition_rows(salts, anion_rows)
    print("ammonium decomposition (fit on calibration):", fit_ammonium_decomposition(ammonium))
    for name, figures in ammonium_decomposition_figures(ammonium).items():
        print(name, figures)
    decomposing = decomposing_anion_rows(salts)
    print("decomposing-anion band (fit on calibration):", fit_decomposing_anion_band(decomposing))
    for name, figures in ammonium_decomposition_figures(decomposing, label="decomposing_anion_salts").items():
        print(name, figures)
    metals = intermetallic_rows()
    metal_weight = fit_intermetallic_weight(metals)
    print("intermetallic weight (fit on calibration):", {"intermetallic_chi_variance": round(metal_weight, 3)})
    agreed = {r["formula_normalized"] for r in training if agreeing_sources(r) >= 2}
    flagged = {r["formula_normalized"] for r in training if "target flagged" in r["decision"]}
    print("targets flagged (rules blind to the index):", len(flagged), sorted(flagged), file=sys.stderr)
    for name, figures in evaluate(salts, molecules, organics, agreed, flagged).items():
        print(name, figures)
    for name, figures in organic_molecule_figures(organic_molecules).items():
        print(name, figures)
    for name, figures in intermetallic_figures(metals, metal_weight).items():
        print(name, figures)
    zwitterions = zwitterion_rows()
    print("zwitterion weight (fit on calibration):",
          {"organic_zwitterion_kJ_mol": round(fit_zwitterion_weight(zwitterions), 2)})
    for name, figures in zwitterion_figures(zwitterions).items():
        print(name, figures)
    acids = organic_acid_rows()
    print("organic acid weight (fit on calibration):",
          {"organic_acid_group_kJ_mol": round(fit_organic_acid_weight(acids), 2)})
    for name, figures in organic_acid_figures(acids).items():
        print(name, figures)
    bonded = hydrogen_bonded_rows()
    print("molecular hydrogen-bond weight (fit on calibration):",
          {"molecular_hydrogen_bond_kJ_mol": round(fit_molecular_hydrogen_bond_weight(bonded), 3)})
    for name, figures in hydrogen_bonded_figures(bonded).items():
        print(f"hydrogen_bonded_molecules_{name}", figures)
    print("open_set_validation_salts", coverage_and_refractory(training))
    print("open_set_old_style_includes_fitted_half", coverage_and_refractory(training, held_out_only=False))
    return 0


if __name__ == "__main__":
    sys.exit(main())
