"""Scoring with a fitted melting model stays apart from the trainer.

``ionicity score --mp-model`` needs only :mod:`scorer.melting_model` (the JSON
trees walked in numpy) and :mod:`pipelines.melting_model_file`; the trainer
(the optional ``melting`` extra) and its libraries must never load on that path.
"""
from __future__ import annotations

import json
import math
import subprocess
import sys
from pathlib import Path

TRAINER_MODULES = (
    "ionicity.pipelines.melting_fit",
    "ionicity.pipelines.melting_regressor",
    "ionicity.pipelines.melting_validation",
    "ionicity.pipelines.melting_data",
    "ionicity.pipelines.melting_screen",
    "ionicity.pipelines.melting_plot",
    "ionicity.pipelines.transformer",
)
EXTRA_PACKAGES = ("sklearn", "matplotlib", "chemicals")

# one stump on the trend index: <= 3.0 -> 600 K, else 1500 K (a valid model file, no trainer needed)
_STUMP = {
    "format": "ionicity-melting-model", "format_version": 1, "model_type": "gradient_boosted_trees",
    "target": "ln_mp_K", "features": ["mp_trend_index"], "baseline": 0.0,
    "trees": [{"feature": [0, 0, 0], "threshold": [3.0, 0.0, 0.0], "left": [1, 0, 0], "right": [2, 0, 0],
               "missing_left": [1, 0, 0], "leaf": [0, 1, 1], "value": [0.0, math.log(600.0), math.log(1500.0)]}],
    "interval": {"coverage": 0.9, "log_halfwidth": 0.2},
    "domain": {"feature_min": [2.0], "feature_max": [3.6], "substance_classes": ["ionic_salt"]},
}

_PROBE = """
import json, sys
from ionicity.pipelines.cli import main
code = main(["score", sys.argv[1], "-o", sys.argv[2], "--mp-model", sys.argv[3], "--quiet"])
print(json.dumps({"code": code, "modules": sorted(sys.modules)}))
"""


def test_scoring_with_a_model_imports_neither_the_trainer_nor_its_libraries(tmp_path):
    source = tmp_path / "in.csv"
    source.write_text("formula\nNaCl\nMgO\n[C4mim][BF4]\nCCl4\n", encoding="utf-8")
    model = tmp_path / "model.json"
    model.write_text(json.dumps(_STUMP), encoding="utf-8")
    target = tmp_path / "out.csv"
    result = subprocess.run(
        [sys.executable, "-c", _PROBE, str(source), str(target), str(model)],
        capture_output=True, text=True, cwd=Path(__file__).resolve().parents[1], timeout=300,
    )
    assert result.returncode == 0, result.stderr
    probe = json.loads(result.stdout.strip().splitlines()[-1])
    assert probe["code"] == 0
    # the model did run: its columns are in the output
    import pandas as pd

    table = pd.read_csv(target)
    assert table["mp_predicted_K"].notna().sum() == 3 and math.isnan(table["mp_predicted_K"].iloc[3])  # CCl4
    loaded = set(probe["modules"])
    assert "ionicity.scorer.melting_model" in loaded  # the probe watches the right process
    assert not loaded & set(TRAINER_MODULES)
    assert not {m for m in loaded if m.split(".")[0] in EXTRA_PACKAGES}
