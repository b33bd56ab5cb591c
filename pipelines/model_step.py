"""The melting-model step of a run (``--mp-model``): :class:`ModelApplier`.

It applies a fitted model to each distinct formula once
(:func:`ionicity.scorer.melting_model.predict_for_formulas`), giving the
three ``mp_*_K`` columns, and turns the scorer's verdict of rows outside the
model's training domain into a warning
(:func:`ionicity.scorer.verdict.with_warnings`).
"""
from __future__ import annotations

import pyarrow as pa
import pyarrow.compute as pc

from ionicity.pipelines.config import ScoreConfig
from ionicity.pipelines.errors import InputError
from ionicity.pipelines.formula_cache import FormulaCache
from ionicity.pipelines.melting_model_file import load_model
from ionicity.scorer.columns import column_names
from ionicity.scorer.melting_model import MODEL_COLUMNS, ModelFormatError, predict_for_formulas
from ionicity.scorer.verdict import Verdict, with_warnings

__all__ = ["ModelApplier", "load_model_applier"]


class ModelApplier:
    """Applies a fitted melting model to the distinct formulas of each batch,
    once per formula: the three ``mp_*_K`` columns, and the verdict of rows
    outside the model's training domain (:func:`ionicity.scorer.verdict.with_warnings`)."""

    def __init__(self, model):
        self.model = model
        self.done: dict = {}

    def columns(self, distinct: list, cache_rows: pa.Array, cache: FormulaCache) -> tuple[list[pa.Array], pa.Array, pa.Array]:
        """(model arrays, status, message) for ``distinct``, one row each."""
        new = [i for i, f in enumerate(distinct) if f not in self.done]
        if new:
            positions = column_names()
            arrays = cache.arrays()
            rows = pa.array([cache_rows[i].as_py() for i in new], type=pa.int64())
            status = arrays[positions.index("status")].take(rows).to_pylist()
            message = arrays[positions.index("message")].take(rows).to_pylist()
            value_notes = arrays[positions.index("value_notes")].take(rows).to_pylist()
            predictions = predict_for_formulas(self.model, [distinct[i] for i in new])
            for k, (i, prediction) in enumerate(zip(new, predictions)):
                verdict = Verdict(status[k], message[k], value_notes[k])
                if prediction.domain_warnings:
                    verdict = with_warnings(verdict, prediction.domain_warnings)
                self.done[distinct[i]] = prediction.values() + (verdict.status, verdict.message)
        rows = [self.done[f] for f in distinct]
        model_arrays = [
            pa.array([None if r[k] != r[k] else float(r[k]) for r in rows], type=pa.float64())
            for k in range(len(MODEL_COLUMNS))
        ]
        status = pc.dictionary_encode(pa.array([r[-2] for r in rows], type=pa.string()))
        message = pc.dictionary_encode(pa.array([r[-1] for r in rows], type=pa.string()))
        return model_arrays, status, message


def load_model_applier(config: ScoreConfig) -> ModelApplier | None:
    """The ``--mp-model`` file, checked and loaded; InputError when unusable."""
    if config.mp_model is None:
        return None
    try:
        return ModelApplier(load_model(config.mp_model))
    except ModelFormatError as exc:
        raise InputError(str(exc).splitlines()[0]) from None
