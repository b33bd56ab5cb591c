"""Attacks on --mp-model: malformed, oversized and hostile model files are
refused with exit 2 and one line, before any row is scored.

The bounds are our own (scorer/melting_model_format.py): fit-melting writes
200 trees of at most 13 nodes, so a file over the node, depth or byte limits
is not one it wrote. No scientific reference values; refusing oversized and
malformed input early is common practice. The model below is the one-stump
document of tests/test_melting.py (its numbers are arbitrary).
"""
from __future__ import annotations

import copy
import json
import math

import pytest

from ionicity.pipelines.cli import main
from ionicity.pipelines.melting_model_file import load_model
from ionicity.scorer import melting_model_format as layout
from ionicity.scorer.melting_model import ModelFormatError


def _document() -> dict:
    return {
        "format": layout.MODEL_FORMAT,
        "format_version": layout.MODEL_FORMAT_VERSION,
        "model_type": "gradient_boosted_trees",
        "target": "ln_mp_K",
        "features": ["mp_trend_index"],
        "baseline": 0.0,
        "trees": [_stump()],
        "interval": {"coverage": 0.9, "log_halfwidth": 0.2, "method": "split conformal", "calibration_rows": 10},
        "domain": {"feature_min": [2.0], "feature_max": [3.5], "substance_classes": ["ionic_salt"]},
    }


def _stump() -> dict:
    return {"feature": [0, 0, 0], "threshold": [3.0, 0.0, 0.0], "left": [1, 0, 0], "right": [2, 0, 0],
            "missing_left": [1, 0, 0], "leaf": [0, 1, 1], "value": [0.0, math.log(600.0), math.log(1500.0)]}


def _chain(levels: int) -> dict:
    # every inner node sends both branches to the next: `levels` levels with levels + 1 nodes
    n = levels + 1
    nxt = [i + 1 if i < levels else 0 for i in range(n)]
    return {"feature": [0] * n, "threshold": [3.0] * n, "left": nxt, "right": list(nxt), "missing_left": [1] * n,
            "leaf": [0] * levels + [1], "value": [0.0] * levels + [0.01]}


def _write(tmp_path, text: str):
    path = tmp_path / "model.json"
    path.write_text(text, encoding="utf-8")
    return path


def _refused_by_the_cli(tmp_path, capsys, path) -> str:
    src = tmp_path / "in.csv"
    src.write_text("formula\nNaCl\n")
    out = tmp_path / "out.csv"
    assert main(["score", str(src), "-o", str(out), "--mp-model", str(path), "--quiet"]) == 2
    err = capsys.readouterr().err.strip()
    assert len(err.splitlines()) == 1 and err.startswith("ionicity: error: ") and "Traceback" not in err, err
    assert not out.exists()
    return err


def test_the_attack_document_is_valid_before_each_change(tmp_path):
    load_model(_write(tmp_path, json.dumps(_document())))


@pytest.mark.parametrize("change, message", [
    # attack 9: format_version true passed, because True == 1 in Python
    (lambda d: d.update(format_version=True), "unsupported format_version True"),
    (lambda d: d.update(format_version=1.0), "unsupported format_version 1.0"),
    # attack 9: extra keys inside interval and domain were accepted
    (lambda d: d["interval"].update(payload="x"), "unexpected keys in 'interval': \\['payload'\\]"),
    (lambda d: d["domain"].update(payload="x"), "unexpected keys in 'domain': \\['payload'\\]"),
    (lambda d: d["interval"].update(method=["x"]), "'interval.method' must be text"),
    (lambda d: d["interval"].update(calibration_rows=True), "calibration_rows"),
    # build item 4: bounds on the trees' total node count and depth
    (lambda d: d.update(trees=[_chain(20)] * 1000), "nodes in all; the limit is 20000"),
    (lambda d: d.update(trees=[_chain(33)]), "tree 0 is 33 levels deep; the limit is 32"),
    (lambda d: d.update(trees=[_stump()] * 1001), "'trees' must be a list of 1 to 1000 trees"),
    (lambda d: d["trees"][0].update(value=[]), "at least one node"),
    # the optional offset (ln T = scale * mp_trend_index + baseline + trees): an extra key,
    # a missing key, a feature that is not the index or not listed, a scale out of bounds
    (lambda d: d.update(offset={"feature": "mp_trend_index", "scale": 2.3, "payload": "x"}),
     "unexpected keys in 'offset': \\['payload'\\]"),
    (lambda d: d.update(offset={"feature": "mp_trend_index"}), "'offset' must have the keys"),
    (lambda d: d.update(offset={"feature": "delta_chi_pauling", "scale": 2.3}), "'offset.feature' must be one of"),
    (lambda d: d.update(offset={"feature": "mp_trend_index", "scale": 1e300}), "'offset.scale' must be a number"),
    (lambda d: d.update(offset={"feature": "mp_trend_index", "scale": True}), "'offset.scale' must be a number"),
    (lambda d: d.update(offset=["mp_trend_index", 2.3]), "'offset' must be an object"),
    # the optional index weights (the trend index's organic weights refitted with the model): only the
    # three organic keys, all of them, finite numbers from 0 to 5; an inorganic weight may not be replaced
    (lambda d: d.update(index_weights={"flexibility": 0.1, "delocalised": 0.3, "protic": 0.1, "intercept": 9.0}),
     "unexpected keys in 'index_weights': \\['intercept'\\]"),
    (lambda d: d.update(index_weights={"flexibility": 0.1}), "'index_weights' must have the keys"),
    (lambda d: d.update(index_weights={"flexibility": 0.1, "delocalised": 1e300, "protic": 0.1}),
     "'index_weights.delocalised' must be a number from 0 to 5"),
    (lambda d: d.update(index_weights={"flexibility": -0.1, "delocalised": 0.3, "protic": 0.1}),
     "'index_weights.flexibility' must be a number"),
    (lambda d: d.update(index_weights={"flexibility": "0.1", "delocalised": 0.3, "protic": 0.1}),
     "'index_weights.flexibility' must be a number"),
    (lambda d: d.update(index_weights=[0.1, 0.3, 0.1]), "'index_weights' must be an object"),
    # the optional share of the trees per interval group: known groups, numbers from 0 to 1
    (lambda d: d.update(tree_weights={"ionic_liquid": 1.5}), "'tree_weights' must map"),
    (lambda d: d.update(tree_weights={"payload": 0.5}), "'tree_weights' must map"),
    (lambda d: d.update(tree_weights={"ionic_liquid": True}), "'tree_weights' must map"),
    (lambda d: d.update(tree_weights=[0.5]), "'tree_weights' must map"),
])
def test_attack_model_layout_is_checked_everywhere(tmp_path, capsys, change, message):
    document = copy.deepcopy(_document())
    change(document)
    path = _write(tmp_path, json.dumps(document))
    with pytest.raises(ModelFormatError, match=message):
        load_model(path)
    assert str(path) in _refused_by_the_cli(tmp_path, capsys, path)


def test_a_model_with_an_offset_loads_and_one_without_the_feature_is_refused(tmp_path):
    document = _document()
    document["offset"] = {"feature": "mp_trend_index", "scale": math.log(10.0)}
    assert load_model(_write(tmp_path, json.dumps(document))).offset_position == 0
    document["features"] = ["delta_chi_pauling"]
    with pytest.raises(ModelFormatError, match="listed in 'features'"):
        load_model(_write(tmp_path, json.dumps(document)))


def test_the_deepest_and_largest_trees_allowed_still_load(tmp_path):
    document = _document()
    document["trees"] = [_chain(32)] * (layout._MAX_NODES // 33)
    assert len(load_model(_write(tmp_path, json.dumps(document))).trees) == layout._MAX_NODES // 33


@pytest.mark.parametrize("where", ['"baseline": 0.0', '"threshold": [3.0', '"log_halfwidth": 0.2', '"feature_min": [2.0'])
def test_attack_a_huge_integer_is_exit_2(tmp_path, capsys, where):
    # attack 8: an integer of 400 digits overflowed float() (OverflowError, exit 3)
    text = json.dumps(_document()).replace(where, where.split(":")[0] + ": " + "[" * where.count("[") + "9" * 400)
    err = _refused_by_the_cli(tmp_path, capsys, _write(tmp_path, text))
    assert "finite number" in err


def test_attack_an_integer_of_thousands_of_digits_is_exit_2(tmp_path, capsys):
    # attack 8: Python refuses to read integers of more than 4,300 digits (ValueError, exit 3)
    text = json.dumps(_document()).replace('"baseline": 0.0', '"baseline": ' + "9" * 5000)
    err = _refused_by_the_cli(tmp_path, capsys, _write(tmp_path, text))
    assert "thousands of digits" in err and "set_int_max_str_digits" not in err


def test_attack_deeply_nested_json_is_exit_2(tmp_path, capsys):
    # attack 8: 100,000 nested arrays ran the JSON reader out of recursion (RecursionError, exit 3)
    text = json.dumps(_document()).replace('"baseline": 0.0', '"baseline": 0.0, "metrics": ' + "[" * 100_000 + "]" * 100_000)
    err = _refused_by_the_cli(tmp_path, capsys, _write(tmp_path, text))
    assert "nested too deeply" in err


def test_attack_an_oversized_model_is_refused_before_it_is_parsed(tmp_path, capsys):
    # attack 6: a 47 MB model of valid layout slowed a 3,000-row run twentyfold
    path = tmp_path / "model.json"
    with open(path, "w") as f:
        f.write(json.dumps(_document())[:-1] + ', "metrics": {"pad": "')
        f.write("x" * 47_000_000)
        f.write('"}}')
    err = _refused_by_the_cli(tmp_path, capsys, path)
    assert "is too large for a melting model" in err
