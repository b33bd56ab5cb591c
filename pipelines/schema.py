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
from ionicity.scorer.columns import column_groups, output_columns
from ionicity.scorer.melting_model import GROUP as MODEL_GROUP
from ionicity.scorer.melting_model import MODEL_COLUMNS

__all__ = ["find_formula_column", "check_name_column", "generated_columns", "generated_names", "output_schema",
           "chosen_columns"]


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


def chosen_columns(requested, with_model: bool = False) -> tuple[str, ...] | None:
    """The generated column names ``--columns`` asks for (names and groups,
    :func:`ionicity.scorer.columns.column_groups`), in output order, with
    ``status`` and ``message`` always; None for every column. An unknown
    name is an :class:`InputError` listing the groups.
    """
    if requested is None:
        return None
    groups = {g: list(names) for g, names in column_groups().items()}
    if with_model:
        groups.setdefault(MODEL_GROUP, []).extend(c.name for c in MODEL_COLUMNS)
    every = [c.name for c in generated_columns(with_model)]
    wanted = {"status", "message"}
    for item in requested:
        if item in groups:
            wanted.update(groups[item])
        elif item in every:
            wanted.add(item)
        else:
            raise InputError(f"--columns: {item!r} is neither a column nor a group; groups: {', '.join(groups)}"
                             " (the columns: ionicity columns)")
    return tuple(n for n in every if n in wanted)


def generated_names(input_names: list[str], prefix: str, with_model: bool = False, chosen=None) -> list[str]:
    """Generated column names (with ``prefix``); a clash with an input column is an error."""
    names = [prefix + c.name for c in generated_columns(with_model, chosen)]
    clashes = [n for n in names if n in input_names]
    if clashes:
        raise InputError(
            f"generated column(s) {clashes} clash with input columns; pass --prefix TEXT (e.g. --prefix ion_)"
        )
    return names


def generated_columns(with_model: bool = False, chosen=None) -> tuple:
    """The declared columns a run adds: the scorer's, then the melting
    model's when a model is applied; only the ``chosen`` names when given."""
    columns = output_columns() if not with_model else output_columns() + tuple(MODEL_COLUMNS)
    if chosen is None:
        return columns
    return tuple(c for c in columns if c.name in chosen)


def output_schema(input_schema: pa.Schema, prefix: str = "", with_model: bool = False, chosen=None) -> pa.Schema:
    """Input fields, unchanged, followed by the generated columns (and the
    melting-model columns when a model is applied; only the ``chosen`` ones
    when given)."""
    columns = generated_columns(with_model, chosen)
    names = generated_names(input_schema.names, prefix, with_model, chosen)
    fields = list(input_schema) + [pa.field(name, OUTPUT_TYPES[c.dtype]) for name, c in zip(names, columns)]
    return pa.schema(fields)
