"""Tests for the ionic-liquid descriptors of the melting regression and the held-out measurement command.

Reference values: ion volumes of scorer/data/ion_volumes.csv ([C2mim]+ 0.156 nm^3, [NTf2]- 0.232 nm^3:
Slattery, Daguenet, Dyson, Schubert & Krossing, Angew. Chem. Int. Ed. 2007, 46, 5384; Cl- 0.047 nm^3:
Jenkins, Roobottom, Passmore & Glasser, Inorg. Chem. 1999, 38, 3609; both from memory), symmetry numbers
and torsion counts of scorer/data/ion_shape.csv (Dannenfelser & Yalkowsky rule, Ind. Eng. Chem. Res. 1996,
35, 1483), carbon counts from the ions' formulas (C16H36N for tetrabutylammonium, IUPAC).
"""
from __future__ import annotations

import importlib.util
import math
from pathlib import Path

import numpy as np
import pytest

from ionicity.pipelines import melting_cv
from ionicity.pipelines import melting_fit as mf
from ionicity.scorer import melting_model
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose
from ionicity.scorer.melting_ion_features import ION_FEATURES, ionic_liquid_descriptors

needs_sklearn = pytest.mark.skipif(importlib.util.find_spec("sklearn") is None, reason="scikit-learn not installed")
IL_TABLE = Path(__file__).resolve().parents[1] / "datasets" / "melting" / "ionic_liquids.csv"


def _named(formula):
    return dict(zip(ION_FEATURES, ionic_liquid_descriptors(decompose(parse_formula(formula)))))


def test_the_ion_features_close_the_model_features():
    assert melting_model.MODEL_FEATURES[-len(ION_FEATURES):] == ION_FEATURES


def test_volumes_and_size_asymmetry_of_an_imidazolium_imide():
    x = _named("[C2mim][NTf2]")
    assert x["cation_volume_nm3"] == pytest.approx(0.156)  # Slattery et al. 2007 (from memory)
    assert x["anion_volume_nm3"] == pytest.approx(0.232)  # Slattery et al. 2007 (from memory)
    assert x["cation_anion_volume_ratio"] == pytest.approx(0.156 / 0.232)
    assert x["anion_charge_delocalised"] == 1.0 and x["cation_charge_delocalised"] == 1.0


def test_symmetry_chain_length_and_donors_tell_the_families_apart():
    quaternary, protic, aprotic = _named("[N4444]Br"), _named("[EtNH3][NO3]"), _named("[C4mim]Cl")
    assert quaternary["cation_symmetry_number"] == 12.0  # N(C)4 core, ion_shape.csv
    assert quaternary["cation_carbon_atoms"] == 16.0  # C16H36N
    assert quaternary["cation_torsions_tau"] == 12.0  # ion_shape.csv
    assert protic["cation_hbond_donor"] == 1.0 and aprotic["cation_hbond_donor"] == 0.0
    assert _named("NH4Cl")["cation_hbond_donor"] == 1.0  # N-H donors (common practice)
    assert _named("NaCl")["cation_hbond_donor"] == 0.0
    assert _named("NaCl")["anion_volume_nm3"] == pytest.approx(0.047)  # Jenkins et al. 1999 (from memory)


def test_no_ions_no_descriptors():
    assert all(math.isnan(v) for v in ionic_liquid_descriptors(decompose(parse_formula("CCl4"))))


def test_model_features_carry_the_descriptors():
    _, x = melting_model.features_for_formula("[C4mpyr][NTf2]")
    named = dict(zip(melting_model.MODEL_FEATURES, x.tolist()))
    assert named["cation_torsions_tau"] == 2.5 and named["cation_charge_delocalised"] == 0.0  # ion_shape.csv


def test_balanced_weights_give_each_group_the_same_total():
    labels = ["ionic_liquid"] * 5 + ["other"] * 45
    w = mf.balanced_weights(labels)
    assert w[:5].sum() == pytest.approx(w[5:].sum()) == pytest.approx(25.0)


def test_the_measurement_command_refuses_a_bad_table(tmp_path, capsys):
    bad = tmp_path / "t.csv"
    bad.write_text("formula_normalized,mp_K\nNaCl,hot\n", encoding="utf-8")
    assert melting_cv.main([str(bad)]) == 2
    assert "mp_K 'hot' is not a number" in capsys.readouterr().err


@needs_sklearn
def test_held_out_report_names_every_ionic_liquid_family(fast_pipeline):
    # calibration-free check of the plumbing on the published table (datasets/melting/ionic_liquids.csv)
    # plus a handful of inorganic salts; the figure itself is measured by the command, not asserted here
    rows = melting_cv.read_training_table(IL_TABLE)
    # inorganic salts, melting points from the CRC Handbook (from memory): NaCl 1074 K, KCl 1044 K,
    # KBr 1007 K, NaBr 1020 K, LiCl 883 K, CsCl 919 K
    for formula, mp in (("NaCl", 1074), ("KCl", 1044), ("KBr", 1007), ("NaBr", 1020), ("LiCl", 883), ("CsCl", 919)):
        rows.append({"formula_normalized": formula, "mp_K": float(mp), "anion_family": "halide",
                     "cation_element": formula[:2] if formula[1].islower() else formula[0]})
    result = melting_cv.held_out_report(rows, folds=3)
    families = set(result["ionic_liquid_by_held_out_group"])
    assert {"imidazolium", "pyrrolidinium", "ammonium-quaternary"} <= families
    assert result["per_group"]["ionic_liquid"]["rows"] == sum(
        e["rows"] for e in result["ionic_liquid_by_held_out_group"].values())
    text = melting_cv.report_text(result, "cation_family")
    assert "ionic-liquid MAE held out by cation family" in text
    assert np.isfinite(result["per_group"]["ionic_liquid"]["model"]["mae_K"])


@needs_sklearn
def test_repeated_report_gives_every_seed_and_their_spread(fast_pipeline, capsys, tmp_path):
    # plumbing of --repeats on the published table (datasets/melting/ionic_liquids.csv) and six CRC salts
    # (from memory, as above); each seed is another assignment of families to folds
    rows = melting_cv.read_training_table(IL_TABLE)
    for formula, mp in (("NaCl", 1074), ("KCl", 1044), ("KBr", 1007), ("NaBr", 1020), ("LiCl", 883), ("CsCl", 919)):
        rows.append({"formula_normalized": formula, "mp_K": float(mp), "anion_family": "halide",
                     "cation_element": formula[:2] if formula[1].islower() else formula[0]})
    report = melting_cv.repeated_held_out_report(rows, folds=3, seeds=(0, 1))
    assert [r["seed"] for r in report["repeats"]] == [0, 1]
    mae = report["ionic_liquid_mae_K"]
    assert list(mae["per_seed"]) == [0, 1]
    assert mae["min"] <= mae["mean"] <= mae["max"]
    assert report["repeats"][0] == melting_cv.held_out_report(rows, folds=3, seed=0)
    text = melting_cv.repeated_report_text(report, "cation_family")
    assert "over 2 fold assignments: mean" in text
    assert melting_cv.main([str(IL_TABLE), "--repeats", "0"]) == 2
    assert "--repeats must be at least 1" in capsys.readouterr().err


needs_scipy = pytest.mark.skipif(importlib.util.find_spec("scipy") is None, reason="scipy not installed")


@needs_scipy
def test_organic_weights_refit_without_a_family():
    # calibration cross-check: with every calibration row of ionic_liquids.csv the refit lands on the
    # rounded organic weights of TREND_WEIGHTS (scorer/melting_index.py); pyridinium
    # has no calibration row, so leaving it out changes nothing; imidazolium holds 7 of the 15, so
    # leaving it out moves the weight of charge delocalisation (every imidazolium cation is delocalised)
    from ionicity.scorer import melting

    same = melting_cv.organic_weights_without({"pyridinium"})
    for key, value in same.items():
        assert value == pytest.approx(melting.TREND_WEIGHTS[key], abs=0.01)
    moved = melting_cv.organic_weights_without({"imidazolium"})
    assert abs(moved["delocalised"] - same["delocalised"]) > 0.05


def test_trend_weights_are_restored_after_a_refit_measurement():
    from ionicity.scorer import melting
    from ionicity.scorer.record import score_formula

    before = score_formula("[C4mim][NTf2]")["mp_trend_index"]
    weight = melting.TREND_WEIGHTS["delocalised"]
    with melting_cv.trend_weights({"delocalised": 0.0}):
        inside = score_formula("[C4mim][NTf2]")["mp_trend_index"]
    assert inside > before  # without the delocalisation term the index rises (the term lowers it)
    assert score_formula("[C4mim][NTf2]")["mp_trend_index"] == before
    assert melting.TREND_WEIGHTS["delocalised"] == weight  # scorer/melting_index.py, put back as it was


@needs_sklearn
@needs_scipy
def test_held_out_report_can_refit_the_organic_weights_per_fold(fast_pipeline):
    from ionicity.scorer import melting

    saved = dict(melting.TREND_WEIGHTS)
    rows = melting_cv.read_training_table(IL_TABLE)
    # CRC Handbook (from memory): NaCl 1074 K, KCl 1044 K, KBr 1007 K
    for formula, mp in (("NaCl", 1074), ("KCl", 1044), ("KBr", 1007)):
        rows.append({"formula_normalized": formula, "mp_K": float(mp), "anion_family": "halide",
                     "cation_element": formula[:1]})
    result = melting_cv.held_out_report(rows, folds=3, index_weights="calibration_rows")
    assert np.isfinite(result["per_group"]["ionic_liquid"]["model"]["mae_K"])
    assert melting.TREND_WEIGHTS == saved
    with pytest.raises(ValueError, match="needs the scheme cation_family"):
        melting_cv.held_out_report(rows, scheme="anion_family", index_weights="calibration_rows")
    with pytest.raises(ValueError, match="is not one of fold, shipped, calibration_rows"):
        melting_cv.held_out_report(rows, index_weights="refit")
