"""Melting-model files: written and read as checked JSON, and applied to a scored DataFrame.

A model file is the JSON document ``ionicity fit-melting`` writes (layout in
:mod:`scorer.melting_model`). Only that layout is read; a pickle, a joblib
file or any other document is refused, so a model file cannot run code.
"""
from __future__ import annotations

import json
import os
from pathlib import Path

from ionicity.scorer import melting_model

__all__ = ["save_model", "load_model", "apply_model_to_frame"]

_MAX_MODEL_BYTES = 50_000_000


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
        size = path.stat().st_size
        if size > _MAX_MODEL_BYTES:
            raise melting_model.ModelFormatError(f"{path}: {size} bytes is too large for a melting model")
        raw = path.read_bytes()
    except OSError as exc:
        raise melting_model.ModelFormatError(f"cannot read the melting model {path}: {exc}") from exc
    if raw[:1] == b"\x80" or raw[:4] == b"PK\x03\x04":
        raise melting_model.ModelFormatError(
            f"{path} looks like a pickle/joblib file; ionicity loads only the JSON models that"
            " 'ionicity fit-melting' writes, since unpickling can run arbitrary code"
        )
    try:
        document = json.loads(raw.decode("utf-8"))
    except (UnicodeDecodeError, json.JSONDecodeError) as exc:
        raise melting_model.ModelFormatError(f"{path} is not a JSON melting model: {exc}") from exc
    try:
        return melting_model.model_from_dict(document)
    except melting_model.ModelFormatError as exc:
        raise melting_model.ModelFormatError(f"{path}: {exc}") from exc



def apply_model_to_frame(frame, model: melting_model.MeltingModel, *, prefix: str = ""):
    """:func:`apply_model_to_records` for a scored pandas DataFrame (columns may carry ``prefix``)."""
    import pandas as pd

    names = [c.name for c in melting_model.MODEL_COLUMNS]
    plain = frame.rename(columns={prefix + c: c for c in frame.columns.str.removeprefix(prefix)}) if prefix else frame
    records = melting_model.apply_model_to_records(plain.to_dict("records"), model)
    out = frame.copy()
    for name in names + ["status", "message"]:
        values = [r.get(name) for r in records]
        if name in ("status", "message") and prefix + name not in out.columns:
            continue
        out[prefix + name] = pd.Series(values, index=frame.index)
    return out
