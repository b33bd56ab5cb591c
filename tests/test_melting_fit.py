"""Tests for pipelines.melting_fit: training-set rules, grouped CV, conformal intervals, model files, the hooks."""
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

from ionicity.pipelines import melting_data, melting_screen
from ionicity.pipelines import melting_fit as mf
from ionicity.pipelines.melting_cli import add_fit_melting_parser
from ionicity.pipelines.melting_model_file import apply_model_to_frame, load_model
from ionicity.scorer import melting_model
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose

FIXTURE = Path(__file__).resolve().parents[1] / "datasets" / "melting" / "wikidata_salts.csv"

# scikit-learn, chemicals and matplotlib make up the optional 'melting' extra
needs_sklearn = pytest.mark.skipif(importlib.util.find_spec("sklearn") is None, reason="scikit-learn not installed")
needs_extra = pytest.mark.skipif(
    any(importlib.util.find_spec(m) is None for m in ("sklearn", "matplotlib", "chemicals")),
    reason="the 'melting' extra is not installed",
)


def _dec(formula: str):
    return decompose(parse_formula(formula))


@pytest.fixture
def fast_pipeline(monkeypatch):
    """The real pipeline with fewer boosting rounds, so the tests stay fast."""
    real = mf.make_melting_pipeline

    def quick(seed=0, features=None):
        pipe = real(seed, features)
        pipe.named_steps["regressor"].regressor.set_params(max_iter=40, learning_rate=0.15)
        return pipe

    monkeypatch.setattr(mf, "make_melting_pipeline", quick)


# ------------------------------------------------------------------ consensus


def test_consensus_keeps_agreeing_sources_and_the_majority():
    assert melting_screen.consensus_melting_point_K({"a": 1074.0, "b": 1074.2, "c": 1073.0})[0] == 1074.0
    value, how = melting_screen.consensus_melting_point_K({"a": 1000.0, "b": 1010.0, "c": 1400.0})
    assert value == 1005.0 and how.startswith("consensus (2 of 3")


def test_consensus_drops_disagreement_and_records_why():
    value, how = melting_screen.consensus_melting_point_K({"a": 1000.0, "b": 1100.0})
    assert math.isnan(value) and how.startswith("disagree")
    value, how = melting_screen.consensus_melting_point_K({"a": 1000.0, "b": 1100.0, "c": 1300.0, "d": 1500.0})
    assert math.isnan(value)


def test_consensus_edge_cases():
    assert melting_screen.consensus_melting_point_K({}) == (math.nan, "no value") or math.isnan(melting_screen.consensus_melting_point_K({})[0])
    assert melting_screen.consensus_melting_point_K({"a": 500.0, "b": float("nan")})[1].startswith("single")
    # exactly the tolerance apart still agrees; the tolerance is a parameter
    assert melting_screen.consensus_melting_point_K({"a": 1000.0, "b": 1020.0})[1].startswith("agree")
    assert math.isnan(melting_screen.consensus_melting_point_K({"a": 1000.0, "b": 1020.0}, tolerance_K=5.0)[0])


# -------------------------------------------------------------- name and screen


@pytest.mark.parametrize("name, formula", [
    ("sodium sulphate", "Na2SO4"),
    ("ferric chloride", "FeCl3"),
    ("iron(III) chloride", "FeCl3"),
    ("caesium iodide", "CsI"),
    ("aluminium oxide", "Al2O3"),
    ("barium titanate", "BaTiO3"),
    ("1-ethyl-3-methylimidazolium tetrafluoroborate", "[C2mim][BF4]"),
    ("tetrabutylammonium bromide", "[N4444]Br"),
])
def test_names_that_agree_with_the_formula(name, formula):
    assert melting_screen.name_agrees_with_ions(name, _dec(formula)) == (True, "")


@pytest.mark.parametrize("name, formula", [
    ("potassium chloride", "NaCl"),
    ("sodium nitrate", "NaNO2"),
    ("1,2-dimethylpyridinium iodide", "[C2py]I"),  # an isomer: the formula cannot tell
    ("", "NaCl"),
])
def test_names_that_do_not_agree(name, formula):
    assert melting_screen.name_agrees_with_ions(name, _dec(formula))[0] is False


@pytest.mark.parametrize("formula, name, reason", [
    ("CuSO4.5H2O", "copper sulfate pentahydrate", "hydrate"),
    ("NaCl", "sodium chloride hydrate", "hydrate"),
    ("HCl", "hydrochloric acid", "not a salt"),
    ("SiO2", "silica", "not a salt"),
    ("Fe0.95O", "wustite", "fractional"),
    ("Al4C3", "aluminium carbide", "not a salt"),
])
def test_screen_refuses_what_is_not_an_anhydrous_simple_salt(formula, name, reason):
    kept, why = melting_screen.screen_salt(_dec(formula), name)
    assert not kept and reason in why


def test_screen_keeps_a_plain_salt():
    assert melting_screen.screen_salt(_dec("K2SO4"), "potassium sulfate") == (True, "")
    assert melting_screen.screen_salt(_dec("CuCl"), "cuprous chloride") == (True, "")  # Cu+ is common
    assert melting_screen.screen_salt(_dec("Nd2S3"), "neodymium sulfide (Nd2S3)") == (True, "")


@pytest.mark.parametrize("formula, name, reason", [
    # identifier formulas that lost their counts read only through odd +1 states
    ("BaOZr", "barium zirconate", "uncommon oxidation state Ba(+)"),
    # the name writes the real formula in brackets
    ("NdS", "neodymium sulfide (Nd2S3)", "another formula"),
    # nitrosyl and nitryl halides are molecules (NOCl boils at -6 C; CRC Handbook, from memory)
    ("NOCl", "nitrosyl chloride", "molecular oxocation NO(+)"),
    ("NO2F", "nitryl fluoride", "molecular oxocation NO2(+)"),
])
def test_screen_catches_broken_identifier_formulas(formula, name, reason):
    kept, why = melting_screen.screen_salt(_dec(formula), name)
    assert not kept and reason in why


def test_groups_for_cross_validation():
    assert melting_screen.anion_family(_dec("NaCl")) == "halide"
    assert melting_screen.anion_family(_dec("MgO")) == "oxide"
    assert melting_screen.anion_family(_dec("ZnS")) == "chalcogenide"
    assert melting_screen.anion_family(_dec("KNO3")) == "nitrate"
    assert melting_screen.anion_family(_dec("[C2mim][BF4]")) == "halo-complex"
    assert melting_screen.cation_element(_dec("Fe2(SO4)3")) == "Fe"
    assert melting_screen.cation_element(_dec("(NH4)2SO4")) == "NH4"
    assert melting_screen.cation_element(_dec("[C4mim]Cl")) == "organic"


# ---------------------------------------------------------------- user tables


def test_user_table_is_screened_and_logged(tmp_path):
    path = tmp_path / "mine.csv"
    path.write_text(
        "formula,mp_K\n"
        "NaCl,1074\n"          # CRC Handbook, from memory
        "NaCl,1075\n"          # a duplicate that agrees
        "KCl,771\n"            # 771 C typed as K: still in range, kept as given
        "KBr,734 C\n"          # not a number
        "CsCl,-5\n"            # out of range
        "CuSO4.5H2O,383\n"     # hydrate
        "SiO2,1986\n"          # not a salt
        "Qq2O,900\n",          # unreadable formula
        encoding="utf-8",
    )
    data = melting_data.read_user_table(path)
    kept = {r["formula_normalized"]: r["mp_K"] for r in data.rows}
    assert kept == {"NaCl": 1074.5, "KCl": 771.0}
    reasons = " | ".join(d["reason"] for d in data.decisions)
    for word in ("not a number", "outside 1-5000 K", "hydrate", "not a salt", "formula not parsed", "duplicate"):
        assert word in reasons
    assert len(data.decisions) == 8


def test_user_table_needs_its_columns(tmp_path):
    from ionicity.pipelines.io import InputError

    path = tmp_path / "bad.csv"
    path.write_text("compound,T\nNaCl,1074\n", encoding="utf-8")
    with pytest.raises(InputError, match="no column 'formula'"):
        melting_data.read_user_table(path)
    with pytest.raises(InputError, match="no melting-point column"):
        melting_data.read_user_table(path, formula_col="compound")
    assert melting_data.read_user_table(path, formula_col="compound", mp_col="T").rows[0]["mp_K"] == 1074.0


def test_combining_lets_the_user_value_win(tmp_path):
    open_set = melting_data.TrainingSet(rows=[{"formula": "ClNa", "formula_normalized": "NaCl", "mp_K": 1070.0,
                                     "origin": "chemicals", "anion_family": "halide", "cation_element": "Na"}],
                              decisions=[])
    path = tmp_path / "mine.csv"
    path.write_text("formula,mp_K\nNaCl,1074\n", encoding="utf-8")
    both = melting_data.combine_training_sets(open_set, melting_data.read_user_table(path))
    assert [r["mp_K"] for r in both.rows] == [1074.0]
    assert any("replaced by user table" in d["reason"] for d in both.decisions)


# ----------------------------------------------------------- the fixture data


def test_fixture_has_provenance_on_every_row():
    frame = pd.read_csv(FIXTURE)
    assert len(frame) == 140  # datasets/melting/README.md gives the same count
    assert frame["source"].str.startswith("Wikidata (CC0 1.0)").all()
    assert frame["mp_K"].between(1, 5000).all()
    assert frame["formula_normalized"].is_unique


# ------------------------------------------------------------- CV and conformal


def test_conformal_quantile_is_the_finite_sample_rank():
    # ceil((n + 1) * 0.9) = 10th smallest of 10 residuals (Lei et al. 2018)
    residuals = np.arange(1, 11, dtype=float)
    assert mf._conformal_halfwidth(residuals, 0.9) == 10.0
    assert mf._conformal_halfwidth(residuals, 0.5) == 6.0


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
def test_exported_trees_predict_like_scikit_learn(fast_pipeline):
    rng = np.random.default_rng(0)
    x = rng.normal(size=(300, len(melting_model.MODEL_FEATURES)))
    x[rng.random(x.shape) < 0.1] = np.nan  # missing values take the learned side
    y = np.exp(6 + 0.3 * np.nan_to_num(x[:, 0]) - 0.2 * np.nan_to_num(x[:, 3]))
    pipe = mf.make_melting_pipeline(0).fit(x, y)
    baseline, trees = mf._trees_to_json(pipe.named_steps["regressor"].regressor_)
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


# -------------------------------------------------------- fit, save, load, apply


@pytest.fixture(scope="module")
def fitted(tmp_path_factory):
    """fit-melting on the CC0 fixture alone, through the CLI hook, with fewer boosting rounds."""
    out = tmp_path_factory.mktemp("fit")
    real = mf.make_melting_pipeline

    def quick(seed=0, features=None):
        pipe = real(seed, features)
        pipe.named_steps["regressor"].regressor.set_params(max_iter=40, learning_rate=0.15)
        return pipe

    mf.make_melting_pipeline = quick
    try:
        parser = argparse.ArgumentParser()
        add_fit_melting_parser(parser.add_subparsers(dest="command"))
        args = parser.parse_args(["fit-melting", "-o", str(out), "--no-open-data", "--table", str(FIXTURE), "--quiet"])
        code = mf.run_fit_melting(args)
    finally:
        mf.make_melting_pipeline = real
    return code, out


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
    assert "pip install 'ionicity[melting]'" in err and "chemicals" in err


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


# ------------------------------------------------------- the open training set


@needs_extra
def test_open_builder_on_a_few_cas_numbers():
    # NaCl, KCl, Na2SO4 and [C2mim][BF4] are salts; CuSO4.5H2O is a hydrate; water is no salt
    cas = ["7647-14-5", "7447-40-7", "7757-82-6", "143314-16-3", "7758-99-8", "7732-18-5"]
    data = melting_data.build_open_training_set(cas_numbers=cas)
    kept = {r["formula_normalized"]: r for r in data.rows}
    assert {"NaCl", "KCl", "Na2SO4"} <= set(kept)
    # NaCl 1074 K (CRC Handbook, from memory): the consensus of the package's sources is close
    assert kept["NaCl"]["mp_K"] == pytest.approx(1074, abs=5)
    assert all(r["origin"].startswith("chemicals") for r in data.rows)
    logged = {d["cas"] for d in data.decisions}
    assert set(cas) <= logged  # every CAS number looked at has a decision
    assert not any(d["kept"] for d in data.decisions if d["cas"] in ("7758-99-8", "7732-18-5"))


@needs_extra
@pytest.mark.slow
def test_trend_index_ranks_the_open_training_set():
    # the bar: Spearman rho >= 0.75 against the set fit-melting builds
    data = melting_data.build_open_training_set()
    _, records = mf.feature_matrix(data.rows)
    report = mf.trend_index_report(data.rows, records)
    assert report["overall"]["n"] > 400
    assert report["overall"]["spearman_rho"] >= 0.75


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
    import pandas as pd

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
