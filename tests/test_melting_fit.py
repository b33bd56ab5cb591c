"""Tests for pipelines.melting_fit and melting_model_file: grouped CV, conformal intervals, model files, the hooks."""
from __future__ import annotations

import argparse
import importlib.util
import json
import math
import pickle
from pathlib import Path

import numpy as np
import pandas as pd
import pytest

from ionicity.pipelines import melting_fit as mf
from ionicity.pipelines import melting_regressor
from ionicity.pipelines.melting_cli import add_fit_melting_parser
from ionicity.pipelines.melting_model_file import apply_model_to_frame, load_model, trees_to_json
from ionicity.scorer import melting_model

FIXTURE = Path(__file__).resolve().parents[1] / "datasets" / "melting" / "wikidata_salts.csv"

# scikit-learn, chemicals and matplotlib make up the optional 'melting' extra
needs_sklearn = pytest.mark.skipif(importlib.util.find_spec("sklearn") is None, reason="scikit-learn not installed")
needs_extra = pytest.mark.skipif(
    any(importlib.util.find_spec(m) is None for m in ("sklearn", "matplotlib", "chemicals")),
    reason="the 'melting' extra is not installed",
)




# ------------------------------------------------------------- CV and conformal


def test_conformal_quantile_is_the_finite_sample_rank():
    # ceil((n + 1) * 0.9) = 10th smallest of 10 residuals (Lei et al. 2018)
    residuals = np.arange(1, 11, dtype=float)
    assert mf._conformal_halfwidth(residuals, 0.9) == 10.0
    assert mf._conformal_halfwidth(residuals, 0.5) == 6.0


def test_family_conformal_quantile_is_the_finite_sample_rank_over_families():
    # Dunn, Wasserman & Ramdas, J. Am. Stat. Assoc. 2023, 118, 2491 (double conformal): a quantile within
    # each family, then the ceil((K + 1) * c)-th smallest over the K families (Lei et al. 2018's rank)
    from ionicity.pipelines.melting_validation import _family_conformal_halfwidth

    # 19 families of one row each: ceil(20 * 0.9) = 18th smallest of 0.01 ... 0.19
    residuals = np.arange(1, 20) / 100.0
    assert _family_conformal_halfwidth(residuals, np.arange(19), 0.9) == pytest.approx(0.18)
    # a family of ten rows counts once, by its own 90 % quantile (its largest, ceil(11 * 0.9) = 10th):
    # 20 families, 0.05, 0.5 and 0.01 ... 0.18, whose ceil(21 * 0.9) = 19th smallest is 0.18 (row by
    # row, the 27th smallest of 29 residuals would be 0.17)
    residuals = np.concatenate([np.full(10, 0.05), [0.5], np.arange(1, 19) / 100.0])
    families = np.concatenate([np.zeros(10), np.arange(1, 20)])
    assert _family_conformal_halfwidth(residuals, families, 0.9) == pytest.approx(0.18)
    assert mf._conformal_halfwidth(residuals, 0.9) == pytest.approx(0.17)
    # below 9 families the rank passes K: the largest family quantile
    assert _family_conformal_halfwidth(np.array([0.1, -0.4, 0.2]), np.array([1, 2, 3]), 0.9) == 0.4


def test_family_level_half_widths_cover_a_held_out_family_where_row_quantiles_do_not():
    # residuals that share a bias per family (family effect sd 0.3, row noise sd 0.05 in ln K), six
    # calibration families, one of them large: the row quantile is exchangeable only with rows, so it
    # covers a new family's rows less often than 90 %; the quantile over families covers at least
    # K/(K+1) = 6/7 of new families in full (Dunn, Wasserman & Ramdas 2023), and rows of the others in part
    from ionicity.pipelines.melting_validation import _group_halfwidths

    rng = np.random.default_rng(3)
    sizes = [40, 8, 6, 5, 3, 2]
    covered = {"rows": [], "families": []}
    for _ in range(400):
        effects = rng.normal(0.0, 0.3, len(sizes) + 1)
        residuals = np.concatenate([effects[k] + rng.normal(0.0, 0.05, m) for k, m in enumerate(sizes)])
        families = np.repeat(np.arange(len(sizes)), sizes)
        labels = np.array(["ionic_liquid"] * len(residuals))
        new_family = effects[-1] + rng.normal(0.0, 0.05, 20)
        _, by_rows = _group_halfwidths(residuals, labels, 0.9)
        _, by_families = _group_halfwidths(residuals, labels, 0.9, families)
        covered["rows"].append(np.mean(np.abs(new_family) <= by_rows["ionic_liquid"]))
        covered["families"].append(np.mean(np.abs(new_family) <= by_families["ionic_liquid"]))
    assert np.mean(covered["families"]) >= 6 / 7
    assert np.mean(covered["rows"]) < 0.85  # 0.81 measured; the family quantile 0.89
    # the other group keeps the row quantile even when families are given
    labels = np.array(["other"] * 20)
    residuals = np.linspace(0.01, 0.2, 20)
    _, per_group = _group_halfwidths(residuals, labels, 0.9, np.repeat([0, 1], 10))
    assert per_group["other"] == mf._conformal_halfwidth(residuals, 0.9)


@needs_sklearn
def test_grouped_cv_on_synthetic_data_beats_the_baselines_and_covers(fast_pipeline):
    # an independent truth: ln T = 5 + 1.2 * x0 + noise, grouped in 8 families
    rng = np.random.default_rng(1)
    n = 240
    x = np.full((n, len(melting_model.MODEL_FEATURES)), np.nan)
    x[:, 0] = rng.uniform(0, 1.5, n)
    x[:, 1] = rng.uniform(300, 3000, n)
    y = np.exp(5 + 1.2 * x[:, 0] + rng.normal(0, 0.05, n))
    groups = np.repeat(np.arange(8), n // 8)
    result = mf.grouped_cross_validation(x, y, groups, x[:, 1], folds=4, coverage=0.9)
    assert result["model"]["mae_K"] < result["baseline_mean"]["mae_K"]
    assert result["model"]["mae_K"] < result["baseline_lattice_energy"]["mae_K"]
    assert result["model"]["spearman_rho"] > 0.9
    assert 0.8 <= result["interval_coverage"] <= 1.0
    assert result["folds"] == 4 and len(result["oof_predictions_K"]) == n


@needs_sklearn
def test_grouped_cv_needs_two_groups():
    with pytest.raises(ValueError, match="at least 2 groups"):
        mf.grouped_cross_validation(np.zeros((5, 3)), np.ones(5), ["a"] * 5, np.ones(5))


@needs_sklearn
def test_grouped_cv_hands_each_fold_the_families_of_its_inner_residuals(fast_pipeline, monkeypatch):
    # the ionic liquids' half-width is a quantile over families (Dunn, Wasserman & Ramdas 2023), so every
    # fold must pass the cross-validation group of each inner residual; families here share a bias of
    # sd 0.3 in ln K that no feature carries (an invented set)
    from ionicity.pipelines import melting_validation as mv

    rng = np.random.default_rng(2)
    n = 160
    x = np.full((n, len(melting_model.MODEL_FEATURES)), np.nan)
    x[:, 0] = rng.uniform(2.3, 3.0, n)
    x[:, 1] = rng.uniform(300, 3000, n)
    groups = np.repeat(np.arange(16), n // 16)
    y = 10 ** x[:, 0] * np.exp(rng.normal(0.0, 0.3, 16)[groups] + rng.normal(0.0, 0.03, n))
    labels = np.where(groups < 8, "ionic_liquid", "other")
    seen = []
    real = mv._group_halfwidths

    def spy(residuals, calib_labels, coverage, families=None):
        seen.append((calib_labels.copy(), None if families is None else np.asarray(families).copy()))
        return real(residuals, calib_labels, coverage, families)

    monkeypatch.setattr(mv, "_group_halfwidths", spy)
    result = mf.grouped_cross_validation(x, y, groups, x[:, 1], folds=4, coverage=0.9, interval_groups=labels)
    assert len(seen) == 4
    for calib_labels, families in seen:
        assert families is not None and len(families) == len(calib_labels)
        # the families handed over are cross-validation groups whose rows carry those labels
        assert set(families[calib_labels == "ionic_liquid"].tolist()) <= set(range(8))
    assert result["per_group"]["ionic_liquid"]["interval_coverage"] >= 0.75


@needs_sklearn
def test_exported_trees_predict_like_scikit_learn(fast_pipeline):
    rng = np.random.default_rng(0)
    x = rng.normal(size=(300, len(melting_model.MODEL_FEATURES)))
    x[rng.random(x.shape) < 0.1] = np.nan  # missing values take the learned side
    y = np.exp(6 + 0.3 * np.nan_to_num(x[:, 0]) - 0.2 * np.nan_to_num(x[:, 3]))
    pipe = mf.make_melting_pipeline(0).fit(x, y)
    baseline, trees = trees_to_json(pipe.named_steps["regressor"].regressor_)
    document = {
        "format": melting_model.MODEL_FORMAT, "format_version": 1, "model_type": "gradient_boosted_trees",
        "target": "ln_mp_K", "features": list(melting_model.MODEL_FEATURES), "baseline": baseline, "trees": trees,
        "interval": {"coverage": 0.9, "log_halfwidth": 0.1},
        "domain": {"feature_min": [0.0] * x.shape[1], "feature_max": [1.0] * x.shape[1]},
    }
    model = melting_model.model_from_dict(json.loads(json.dumps(document)))
    x_test = x[:50].copy()
    x_test[:, -5] = 2.0  # derived features present so rows count as salts
    ours, _, _ = melting_model.predict_melting_K(model, x_test)
    assert np.allclose(ours, pipe.predict(x_test), rtol=1e-9)


@needs_sklearn
def test_the_offset_model_predicts_like_its_file(fast_pipeline):
    # the regressor fits T / 10**index; the file's offset (scale ln 10 on mp_trend_index) puts it back
    rng = np.random.default_rng(2)
    x = rng.normal(size=(300, len(melting_model.MODEL_FEATURES)))
    x[:, 0] = rng.uniform(2.2, 3.4, 300)  # mp_trend_index, log10 of a temperature
    y = 10 ** x[:, 0] * np.exp(0.2 * x[:, 3])
    regressor, used = mf._fit_pipeline(x, y, 0)
    assert melting_model.MODEL_FEATURES[used[regressor.column]] == "mp_trend_index"
    baseline, trees = trees_to_json(regressor.pipe.named_steps["regressor"].regressor_)
    document = {
        "format": melting_model.MODEL_FORMAT, "format_version": 1, "model_type": "gradient_boosted_trees",
        "target": "ln_mp_K", "features": [melting_model.MODEL_FEATURES[j] for j in used], "baseline": baseline,
        "trees": trees, "offset": {"feature": mf.OFFSET_FEATURE, "scale": mf.OFFSET_SCALE},
        "interval": {"coverage": 0.9, "log_halfwidth": 0.1},
        "domain": {"feature_min": [0.0] * len(used), "feature_max": [1.0] * len(used)},
    }
    model = melting_model.model_from_dict(json.loads(json.dumps(document)))
    ours, _, _ = melting_model.predict_melting_K(model, x[:50])
    assert np.allclose(ours, regressor.predict(x[:50][:, used]), rtol=1e-9)
    # closed form: trees that add nothing leave exactly the index's temperature, 10**2.5 = 316.2 K
    flat = {**document, "baseline": 0.0, "trees": [{"feature": [0], "threshold": [0.0], "left": [0], "right": [0],
                                                    "missing_left": [0], "leaf": [1], "value": [0.0]}]}
    row = np.full((1, len(melting_model.MODEL_FEATURES)), 1.0)
    row[0, 0] = 2.5
    assert melting_model.predict_melting_K(melting_model.model_from_dict(flat), row)[0][0] == pytest.approx(316.23, abs=0.01)
    row[0, 0] = np.nan  # no trend index, no prediction
    assert np.isnan(melting_model.predict_melting_K(melting_model.model_from_dict(flat), row)[0][0])


# -------------------------------------------------------- fit, save, load, apply


def _fit(out, *extra):
    """fit-melting on the CC0 fixture, through the CLI hook, with fewer boosting rounds."""
    real = melting_regressor.make_melting_pipeline

    def quick(seed=0, features=None):
        pipe = real(seed, features)
        pipe.named_steps["regressor"].regressor.set_params(max_iter=40, learning_rate=0.15)
        return pipe

    melting_regressor.make_melting_pipeline = quick  # _fit_pipeline looks it up there
    try:
        parser = argparse.ArgumentParser()
        add_fit_melting_parser(parser.add_subparsers(dest="command"))
        args = parser.parse_args(["fit-melting", "-o", str(out), "--no-open-data", "--table", str(FIXTURE), "--quiet",
                                  *extra])
        code = mf.run_fit_melting(args)
    finally:
        melting_regressor.make_melting_pipeline = real
    return code, out


@pytest.fixture(scope="module")
def fitted(tmp_path_factory):
    """The CC0 fixture alone (no ionic liquid)."""
    return _fit(tmp_path_factory.mktemp("fit"), "--no-ionic-liquids")


@pytest.fixture(scope="module")
def fitted_with_ionic_liquids(tmp_path_factory):
    """The CC0 fixture and datasets/melting/ionic_liquids.csv (the default)."""
    return _fit(tmp_path_factory.mktemp("fit_il"))


@needs_extra
def test_fit_writes_every_output(fitted, capsys):
    code, out = fitted
    assert code == 0
    for name in ("melting_model.json", "training_set.csv", "decisions.csv", "report.json", "parity.png"):
        assert (out / name).stat().st_size > 0
    assert (out / "parity.png").read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"
    report = json.loads((out / "report.json").read_text())
    cv = report["metrics"]["cross_validation"]
    for scheme in ("anion_family", "cation_element"):
        assert cv[scheme]["model"]["mae_K"] < cv[scheme]["baseline_mean"]["mae_K"]
        assert cv[scheme]["model"]["mae_K"] < cv[scheme]["baseline_lattice_energy"]["mae_K"]
    assert report["metrics"]["trend_index"]["overall"]["spearman_rho"] > 0.7
    assert "safety data sheet" in report["caution"]


@needs_extra
def test_fit_refuses_to_overwrite(fitted, capsys):
    _, out = fitted
    parser = argparse.ArgumentParser()
    add_fit_melting_parser(parser.add_subparsers(dest="command"))
    args = parser.parse_args(["fit-melting", "-o", str(out), "--no-open-data", "--table", str(FIXTURE), "--quiet"])
    assert mf.run_fit_melting(args) == 2
    assert "--overwrite" in capsys.readouterr().err


@needs_extra
def test_saved_model_loads_and_applies(fitted):
    _, out = fitted
    model = load_model(out / "melting_model.json")
    from ionicity.scorer import score_formula

    formulas = ("NaCl", "MgO", "CCl4", "[C4mim][NTf2]")
    applied = melting_model.apply_model_to_records(formulas, model)
    nacl, mgo, ccl4, il = applied
    assert 300 < nacl["mp_predicted_K"] < 3000
    assert nacl["mp_interval_low_K"] < nacl["mp_predicted_K"] < nacl["mp_interval_high_K"]
    assert mgo["mp_predicted_K"] > nacl["mp_predicted_K"]
    assert math.isnan(ccl4["mp_predicted_K"])  # molecular: no prediction
    # no ionic liquid in the fixture: outside the training domain, so a warning
    assert il["status"] == "warning" and "outside the training domain" in il["message"]
    assert "mp_predicted_K" not in score_formula("NaCl")  # the cached record is untouched
    assert set(score_formula("NaCl")) <= set(nacl)


@needs_extra
def test_apply_model_to_frame_keeps_rows_and_order(fitted):
    _, out = fitted
    model = load_model(out / "melting_model.json")
    from ionicity.scorer import score_formula

    formulas = ["KCl", "Xx", "KCl", "[C4mim][NTf2]"]
    frame = pd.DataFrame([{"formula": f, **score_formula(f)} for f in formulas], index=[10, 11, 12, 13])
    result = apply_model_to_frame(frame, model)
    assert len(result) == 4 and list(result.index) == [10, 11, 12, 13]
    assert result["mp_predicted_K"].iloc[0] == result["mp_predicted_K"].iloc[2]
    assert math.isnan(result["mp_predicted_K"].iloc[1])
    # the same values and verdict as the records API
    il = melting_model.apply_model_to_records(["[C4mim][NTf2]"], model)[0]
    assert result["mp_predicted_K"].iloc[3] == il["mp_predicted_K"]
    assert result["status"].iloc[3] == il["status"] == "warning"
    with pytest.raises(ValueError, match="no column 'formula_text'"):
        apply_model_to_frame(frame, model, formula_column="formula_text")


def test_loading_a_pickle_is_refused_with_a_clear_error(tmp_path):
    path = tmp_path / "model.pkl"
    path.write_bytes(pickle.dumps({"format": melting_model.MODEL_FORMAT}))
    with pytest.raises(melting_model.ModelFormatError, match="pickle"):
        load_model(path)


@pytest.mark.parametrize("content, message", [
    (b"not json at all", "not a JSON melting model"),
    (b'{"format": "ionicity-melting-model", "format_version": 1, "model_type": "linear_svm"}', "is not accepted"),
    (b"[1, 2, 3]", "JSON object"),
])
def test_loading_other_files_is_refused(tmp_path, content, message):
    path = tmp_path / "model.json"
    path.write_bytes(content)
    with pytest.raises(melting_model.ModelFormatError, match=message):
        load_model(path)


def test_loading_a_missing_file_says_so(tmp_path):
    with pytest.raises(melting_model.ModelFormatError, match="cannot read"):
        load_model(tmp_path / "nope.json")


@needs_extra
def test_a_tampered_model_is_refused(fitted, tmp_path):
    _, out = fitted
    document = json.loads((out / "melting_model.json").read_text())
    document["model_type"] = "pickle"
    path = tmp_path / "tampered.json"
    path.write_text(json.dumps(document))
    with pytest.raises(melting_model.ModelFormatError, match="model_type 'pickle' is not accepted"):
        load_model(path)


# --------------------------------------------------------- without the extra


def test_fit_melting_says_what_to_install_without_the_extra(monkeypatch, tmp_path, capsys):
    import sys

    monkeypatch.setitem(sys.modules, "chemicals", None)  # import chemicals now raises ImportError
    parser = argparse.ArgumentParser()
    add_fit_melting_parser(parser.add_subparsers(dest="command"))
    args = parser.parse_args(["fit-melting", "-o", str(tmp_path / "out"), "--quiet"])
    assert mf.run_fit_melting(args) == 2
    err = capsys.readouterr().err
    assert 'pip install "ionicity[melting]"' in err and 'pip install -e ".[melting]"' in err and "chemicals" in err


def test_scoring_does_not_import_the_extra():
    import subprocess
    import sys

    code = ("import sys; sys.modules['chemicals'] = None; sys.modules['matplotlib'] = None;"
            "from ionicity.scorer import melting; from ionicity.scorer.formula import parse_formula; from ionicity.scorer.ions import decompose;"
            "print(melting.describe(decompose(parse_formula('NaCl')))[0]['melting_class'])")
    result = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                            cwd=Path(__file__).resolve().parents[1], timeout=120)
    assert result.returncode == 0, result.stderr
    assert result.stdout.strip() == "molten_salt"


@needs_extra
def test_score_with_mp_model_adds_the_prediction_columns(fitted, tmp_path, capsys):
    from ionicity.pipelines.cli import main

    _, out = fitted
    source = tmp_path / "in.csv"
    source.write_text("formula,label\nNaCl,a\n[C4mim][BF4],b\nCCl4,c\nXx2O,d\nNaCl,e\n", encoding="utf-8")
    target = tmp_path / "out.csv"
    code = main(["score", str(source), "-o", str(target), "--mp-model", str(out / "melting_model.json")])
    assert code == 0
    assert "safety data sheet" in capsys.readouterr().err
    table = pd.read_csv(target, dtype=str, keep_default_na=False)
    assert table["label"].tolist() == ["a", "b", "c", "d", "e"]
    for name in ("mp_predicted_K", "mp_interval_low_K", "mp_interval_high_K"):
        assert name in table.columns
    nacl = table.iloc[0]
    assert float(nacl["mp_interval_low_K"]) < float(nacl["mp_predicted_K"]) < float(nacl["mp_interval_high_K"])
    assert table.iloc[0]["mp_predicted_K"] == table.iloc[4]["mp_predicted_K"]
    assert table.iloc[2]["mp_predicted_K"] == ""  # a molecule gets no prediction
    assert table.iloc[3]["status"] == "error"


@needs_extra
def test_score_refuses_a_model_that_is_not_ours(tmp_path, capsys):
    from ionicity.pipelines.cli import main

    source = tmp_path / "in.csv"
    source.write_text("formula\nNaCl\n", encoding="utf-8")
    bogus = tmp_path / "model.json"
    bogus.write_text('{"format": "something-else"}', encoding="utf-8")
    code = main(["score", str(source), "-o", str(tmp_path / "out.csv"), "--mp-model", str(bogus)])
    assert code == 2
    assert "melting model" in capsys.readouterr().err
    assert not (tmp_path / "out.csv").exists()


@needs_extra
def test_ionic_liquids_train_and_get_their_own_intervals(fitted_with_ionic_liquids):
    code, out = fitted_with_ionic_liquids
    assert code == 0
    report = json.loads((out / "report.json").read_text())
    cv = report["metrics"]["cross_validation"]
    # held out by cation family, the ionic liquids are reported apart, with their own coverage
    per_group = cv["cation_family"]["per_group"]
    assert set(per_group) == {"ionic_liquid", "other"}
    assert per_group["ionic_liquid"]["rows"] >= 20
    assert 0.0 <= per_group["ionic_liquid"]["interval_coverage"] <= 1.0
    document = json.loads((out / "melting_model.json").read_text())
    assert set(document["interval"]["group_log_halfwidths"]) == {"ionic_liquid", "other"}
    # the index's organic weights refitted on the fitted rows, and the ionic liquids' share of the trees
    # (pipelines/melting_offset.py), travel with the model
    assert set(document["index_weights"]) == set(melting_model.INDEX_WEIGHT_KEYS)
    assert 0.0 <= document["tree_weights"]["ionic_liquid"] <= 1.0
    assert document["domain"]["target_min_K"] < 260  # [C4mpyr][dca] 218 K is a training row
    model = load_model(out / "melting_model.json")
    # able to predict below 300 K: the imidazolium [NTf2] salt of the table's validation rows
    il = melting_model.apply_model_to_records(["[C2mim][NTf2]"], model)[0]
    assert il["mp_predicted_K"] < 330  # measured 257 K (Bonhote et al. 1996, from memory)


@needs_extra
def test_class_and_prediction_never_disagree_silently(fitted_with_ionic_liquids):
    _, out = fitted_with_ionic_liquids
    model = load_model(out / "melting_model.json")
    formulas = ["NaCl", "MgO", "KNO3", "[C2mim]Cl", "[C4mim][PF6]", "[N4444][PF6]", "LiCl", "ZnCl2", "Li[NTf2]"]
    for record in melting_model.apply_model_to_records(formulas, model):
        # the band under the row's own names: salts keep the trade's names, ZnCl2 (chain_layer_solid) does not
        band = melting_model.melting_class_for(record["mp_predicted_K"], salt=record["mp_route"] == "salt")
        if band != record["melting_class"]:
            assert record["status"] == "warning" and "disagrees with the model" in record["message"], record


@needs_extra
def test_domain_check_names_rows_below_the_training_range(fitted):
    _, out = fitted
    model = load_model(out / "melting_model.json")
    i = model.features.index("mp_trend_index")
    low = model.feature_min[i]
    x = melting_model.features_for_formula("NaCl")[1].copy()
    x[melting_model.MODEL_FEATURES.index("mp_trend_index")] = low - 1e-6  # just below: no tolerance
    reasons = melting_model.outside_training_domain(model, x)
    assert any(r.startswith("mp_trend_index") and "below the training minimum" in r for r in reasons)
    x[melting_model.MODEL_FEATURES.index("mp_trend_index")] = low
    assert not any(r.startswith("mp_trend_index") for r in melting_model.outside_training_domain(model, x))
