"""The output table's layout: which input column holds the formulas, the
generated column names (prefix included) and the output schema.

The generated columns are the scorer's declared ones
(:func:`ionicity.scorer.columns.output_columns`), followed by the melting
model's (:data:`ionicity.scorer.melting_model.MODEL_COLUMNS`) when a model is
applied; text columns are written dictionary-encoded
(:data:`~ionicity.pipelines.arrow_columns.TEXT_TYPE`).
"""
from __future__ import annotations

import pyarrow as pa

from ionicity.pipelines.arrow_columns import OUTPUT_TYPES
from ionicity.pipelines.errors import InputError
from ionicity.scorer.columns import output_columns
from ionicity.scorer.melting_model import MODEL_COLUMNS
from ionicity.scorer.name_check import COLUMNS as NAME_COLUMNS

__all__ = ["find_formula_column", "check_name_column", "generated_columns", "generated_names", "output_schema"]


def find_formula_column(names: list[str], requested: str | None) -> str:
    """The formula column: ``requested``, else the one named ``formula`` in any case."""
    if requested is not None:
        if requested not in names:
            raise InputError(f"no column {requested!r} in the input; columns found: {', '.join(map(repr, names))}")
        return requested
    matches = [n for n in names if n.strip().lower() == "formula"]
    if len(matches) == 1:
        return matches[0]
    if len(matches) > 1:
        raise InputError(f"several columns could be the formula column: {matches}; choose one with --formula-col")
    raise InputError(
        "no column named 'formula'; choose one with --formula-col. Columns found: " + ", ".join(map(repr, names))
    )


def check_name_column(names: list[str], name_col: str | None, option: str = "--name-col") -> None:
    """Raise :class:`InputError` when ``name_col`` is given but not among ``names``."""
    if name_col is not None and name_col not in names:
        raise InputError(f"no column {name_col!r} for {option}; columns found: {', '.join(map(repr, names))}")


def generated_names(input_names: list[str], prefix: str, with_model: bool = False, with_names: bool = False) -> list[str]:
    """Generated column names (with ``prefix``); a clash with an input column is an error."""
    names = [prefix + c.name for c in generated_columns(with_model, with_names)]
    clashes = [n for n in names if n in input_names]
    if clashes:
        raise InputError(
            f"generated column(s) {clashes} clash with input columns; pass --prefix TEXT (e.g. --prefix ion_)"
        )
    return names


def generated_columns(with_model: bool = False, with_names: bool = False) -> tuple:
    """The declared columns a run adds: the scorer's, then the melting
    model's when a model is applied, then the name check's
    (``name_formula``, ``name_check``) when a name column is given."""
    columns = output_columns()
    if with_model:
        columns = columns + tuple(MODEL_COLUMNS)
    if with_names:
        columns = columns + tuple(NAME_COLUMNS)
    return columns


def output_schema(input_schema: pa.Schema, prefix: str = "", with_model: bool = False,
                  with_names: bool = False) -> pa.Schema:
    """Input fields, unchanged, followed by the generated columns (and the
    melting-model columns when a model is applied, and the name check's
    when a name column is given)."""
    columns = generated_columns(with_model, with_names)
    names = generated_names(input_schema.names, prefix, with_model, with_names)
    fields = list(input_schema) + [pa.field(name, OUTPUT_TYPES[c.dtype]) for name, c in zip(names, columns)]
    return pa.schema(fields)
