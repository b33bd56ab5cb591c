"""Melting-model files: written and read as checked JSON, and applied to a scored DataFrame.

A model file is the JSON document ``ionicity fit-melting`` writes (layout in
:mod:`scorer.melting_model`). Only that layout is read; a pickle, a joblib
file or any other document is refused, so a model file cannot run code.
"""
from __future__ import annotations

import json
import math
import os
import stat
from pathlib import Path

import numpy as np

from ionicity.scorer import melting_model
from ionicity.scorer.verdict import Verdict, with_warnings

__all__ = ["save_model", "load_model", "apply_model_to_frame", "trees_to_json", "finite_minmax"]

# fit-melting writes a few hundred kB (the trees and the out-of-fold
# predictions of its training rows); the tree bounds of the layout check
# (scorer.melting_model_format) keep applying a model cheap, this one reading it
_MAX_MODEL_BYTES = 16_000_000


def save_model(document: dict, path) -> None:
    """Write a model document as JSON (atomically: a temporary file, then a rename)."""
    melting_model.model_from_dict(document)
    path = Path(path)
    tmp = path.with_name(path.name + ".tmp")
    tmp.write_text(json.dumps(document, allow_nan=False, separators=(",", ":")), encoding="utf-8")
    os.replace(tmp, path)


def load_model(path) -> melting_model.MeltingModel:
    """Read and check a model file written by :func:`save_model`.

    Only JSON is read, and only the layout :func:`scorer.melting_model.model_from_dict`
    expects is accepted: a pickle, a joblib file or any other document is
    refused with :class:`scorer.melting_model.ModelFormatError` (a ``ValueError``)
    whose message says why. Nothing in the file is executed.
    """
    path = Path(path)
    try:
        # non-blocking, so that a FIFO cannot hold the run; fstat on the open
        # file, so that what is checked is what is read
        fd = os.open(path, os.O_RDONLY | getattr(os, "O_NONBLOCK", 0))
        with os.fdopen(fd, "rb") as stream:
            if not stat.S_ISREG(os.fstat(stream.fileno()).st_mode):
                raise melting_model.ModelFormatError(
                    f"{path} is not a regular file (a folder, device or pipe); give the JSON file 'ionicity fit-melting' wrote")
            # st_size can be wrong (procfs, a file still growing): read one byte past the limit instead
            raw = stream.read(_MAX_MODEL_BYTES + 1)
        if len(raw) > _MAX_MODEL_BYTES:
            raise melting_model.ModelFormatError(f"{path}: more than {_MAX_MODEL_BYTES} bytes is too large for a melting model")
    except OSError as exc:
        raise melting_model.ModelFormatError(f"cannot read the melting model {path}: {exc}") from exc
    if raw[:1] == b"\x80" or raw[:4] == b"PK\x03\x04":
        raise melting_model.ModelFormatError(
            f"{path} looks like a pickle/joblib file; ionicity loads only the JSON models that"
            " 'ionicity fit-melting' writes, since unpickling can run arbitrary code"
        )
    try:
        document = json.loads(raw.decode("utf-8"))
    except RecursionError:  # arrays or objects nested thousands deep
        raise melting_model.ModelFormatError(f"{path} is not a JSON melting model: nested too deeply") from None
    except ValueError as exc:  # not UTF-8, not JSON, or an integer of more than 4,300 digits
        why = "it holds a number of thousands of digits" if "integer string conversion" in str(exc) else str(exc)
        raise melting_model.ModelFormatError(f"{path} is not a JSON melting model: {why}") from None
    try:
        return melting_model.model_from_dict(document)
    except melting_model.ModelFormatError as exc:
        raise melting_model.ModelFormatError(f"{path}: {exc}") from exc


def apply_model_to_frame(frame, model: melting_model.MeltingModel, *, formula_column: str = "formula", prefix: str = ""):
    """A scored DataFrame with the model's columns added, predicted from its formula column.

    The predictions are :func:`scorer.melting_model.predict_for_formulas` of
    ``frame[formula_column]``, as the engines compute them; a row outside the
    model's training domain gets status ``warning`` and a message saying why,
    when the frame has ``status``/``message`` columns.

    Parameters
    ----------
    frame : pandas.DataFrame
        A table scored by ionicity, with the formulas as typed.
    model : MeltingModel
    formula_column : str, default="formula"
        The column of formulas.
    prefix : str, default=""
        Prefix of the scored columns (``--prefix`` of ``ionicity score``).

    Returns
    -------
    pandas.DataFrame
        A copy of ``frame`` with ``mp_predicted_K``, ``mp_interval_low_K``
        and ``mp_interval_high_K`` (each with ``prefix``).

    Raises
    ------
    ValueError
        ``formula_column`` is not a column of ``frame``.
    """
    import pandas as pd  # the scoring path loads model files without pandas: about 0.2 s saved (measured)

    if formula_column not in frame.columns:
        raise ValueError(f"no column {formula_column!r} in the table; columns: {list(frame.columns)}")
    predictions = melting_model.predict_for_formulas(model, frame[formula_column].tolist())
    out = frame.copy()
    for k, column in enumerate(melting_model.MODEL_COLUMNS):
        out[prefix + column.name] = pd.Series([p.values()[k] for p in predictions], index=frame.index)
    status, message, notes = prefix + "status", prefix + "message", prefix + "value_notes"
    if status in out.columns and message in out.columns:
        verdicts = [
            with_warnings(Verdict(s, m or "", v or ""), p.domain_warnings)
            for s, m, v, p in zip(out[status], out[message],
                                  out[notes] if notes in out.columns else [""] * len(out), predictions)
        ]
        out[status] = pd.Series([v.status for v in verdicts], index=frame.index)
        out[message] = pd.Series([v.message for v in verdicts], index=frame.index)
    return out


def trees_to_json(hgb) -> tuple[float, list[dict]]:
    """The fitted trees of a HistGradientBoostingRegressor as lists of plain numbers."""
    baseline = float(np.ravel(hgb._baseline_prediction)[0])
    trees = []
    for iteration in hgb._predictors:
        for predictor in iteration:
            nodes = predictor.nodes
            if np.any(nodes["is_categorical"]):
                raise ValueError("categorical splits are not supported in the JSON model format")
            leaf = nodes["is_leaf"].astype(int)
            trees.append({
                "feature": [int(v) for v in nodes["feature_idx"]],
                "threshold": [float(t) if not lf and math.isfinite(t) else 0.0
                              for t, lf in zip(nodes["num_threshold"], leaf)],
                "left": [int(v) for v in nodes["left"]],
                "right": [int(v) for v in nodes["right"]],
                "missing_left": [int(v) for v in nodes["missing_go_to_left"]],
                "leaf": [int(v) for v in leaf],
                "value": [float(v) for v in nodes["value"]],
            })
    return baseline, trees


def finite_minmax(x: np.ndarray) -> tuple[list[float], list[float]]:
    lo, hi = [], []
    for j in range(x.shape[1]):
        col = x[:, j][np.isfinite(x[:, j])]
        lo.append(float(col.min()) if len(col) else 0.0)
        hi.append(float(col.max()) if len(col) else 0.0)
    return lo, hi
