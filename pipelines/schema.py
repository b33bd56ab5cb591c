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
from ionicity.scorer.name_check import COLUMNS as NAME_COLUMNS

__all__ = ["MAX_INPUT_COLUMNS", "check_width", "find_formula_column", "check_formula_type", "check_name_column", "check_unique_names",
           "generated_columns", "generated_names", "output_schema", "chosen_columns"]


#: the widest input read: 10,000 columns of three rows took 7 s, 100,000 over 15 minutes and 2 GB
MAX_INPUT_COLUMNS = 10_000


def find_formula_column(names: list[str], requested: str | None) -> str:
    """The formula column: ``requested``, else the one named ``formula`` in any
    case. Column names must be unique (:func:`check_unique_names`), and at most
    :data:`MAX_INPUT_COLUMNS`."""
    check_width(names)
    check_unique_names(names)
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


def check_formula_type(schema: pa.Schema, formula_col: str) -> None:
    """Raise :class:`InputError` when the formula column holds values that
    are not text: lists, structs and maps have no formula to read. Text,
    bytes (a cell that is not UTF-8 becomes that row's error), numbers and
    empty columns are read cell by cell."""
    kind = schema.field(formula_col).type
    if pa.types.is_dictionary(kind):
        kind = kind.value_type
    if pa.types.is_nested(kind):
        raise InputError(
            f"column {formula_col!r} holds {kind} values; the formula column must hold text"
            " (choose another with --formula-col)"
        )


def check_width(names: list[str]) -> None:
    """Raise :class:`InputError` for more than :data:`MAX_INPUT_COLUMNS` columns."""
    if len(names) > MAX_INPUT_COLUMNS:
        raise InputError(f"the input has {len(names)} columns; ionicity reads at most {MAX_INPUT_COLUMNS}: keep the"
                         " formula column and the ones you need (e.g. with pandas or csvcut) and score that")


def check_name_column(names: list[str], name_col: str | None, option: str = "--name-col") -> None:
    """Raise :class:`InputError` when ``name_col`` is given but not among ``names``."""
    if name_col is not None and name_col not in names:
        raise InputError(f"no column {name_col!r} for {option}; columns found: {', '.join(map(repr, names))}")


def check_unique_names(input_names: list[str]) -> None:
    """Raise :class:`InputError` when the input repeats a column name (Parquet
    allows it; no output table could say which is which)."""
    seen: set[str] = set()
    repeated = sorted({n for n in input_names if n in seen or seen.add(n)})
    if repeated:
        raise InputError(f"the input has more than one column named {', '.join(map(repr, repeated))}; rename them first")


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


def generated_names(input_names: list[str], prefix: str, with_model: bool = False, chosen=None,
                    with_names: bool = False) -> list[str]:
    """Generated column names (with ``prefix``); a clash with an input column
    is an error, in any case (``STATUS`` clashes with ``status``: spreadsheets,
    SQL and pandas' case-insensitive lookups cannot tell them apart)."""
    names = [prefix + c.name for c in generated_columns(with_model, chosen, with_names)]
    taken = {n.casefold(): n for n in input_names}
    clashes = [f"{n} (input {taken[n.casefold()]!r})" if taken[n.casefold()] != n else n
               for n in names if n.casefold() in taken]
    if clashes:
        raise InputError(
            f"generated column(s) {', '.join(clashes)} clash with input columns; pass --prefix TEXT (e.g. --prefix ion_)"
        )
    return names


def generated_columns(with_model: bool = False, chosen=None, with_names: bool = False) -> tuple:
    """The declared columns a run adds: the scorer's, then the melting
    model's when a model is applied (only the ``chosen`` ones when given),
    then the name check's (``name_formula``, ``name_check``) when a name
    column is given: with ``--name-col`` they are always written."""
    columns = output_columns() if not with_model else output_columns() + tuple(MODEL_COLUMNS)
    if chosen is not None:
        columns = tuple(c for c in columns if c.name in chosen)
    if with_names:
        columns = columns + tuple(NAME_COLUMNS)
    return columns


def output_schema(input_schema: pa.Schema, prefix: str = "", with_model: bool = False, chosen=None,
                  with_names: bool = False) -> pa.Schema:
    """Input fields, unchanged, followed by the generated columns (and the
    melting-model columns when a model is applied; only the ``chosen`` ones
    when given; the name check's when a name column is given)."""
    columns = generated_columns(with_model, chosen, with_names)
    names = generated_names(input_schema.names, prefix, with_model, chosen, with_names)
    fields = list(input_schema) + [pa.field(name, OUTPUT_TYPES[c.dtype]) for name, c in zip(names, columns)]
    return pa.schema(fields)
