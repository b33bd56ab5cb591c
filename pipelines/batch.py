"""The local engine: score a table batch by batch, each distinct formula once.

Per batch: dictionary-encode the formula column, score the distinct formulas
that the process-wide cache has not seen, build each generated column for the
distinct values and expand it to every row with one ``take``. Rows keep their
order and input columns pass through untouched.
"""
from __future__ import annotations

import math
import sys
import time
from dataclasses import dataclass, field

import pyarrow as pa
import pyarrow.compute as pc

from scorer.columns import output_columns
from scorer.record import score_formula

from pipelines.io import InputError, TableWriter, open_reader

__all__ = ["ScoreConfig", "Summary", "score_batch", "score_table", "score_file", "find_formula_column", "FormulaCache"]

_ARROW_TYPES = {"string": pa.string(), "float64": pa.float64(), "int64": pa.int64(), "bool": pa.bool_()}


@dataclass
class ScoreConfig:
    """Options of one scoring run; the CLI builds one from its arguments."""

    input: str
    output: str
    formula_col: str | None = None
    name_col: str | None = None
    prefix: str = ""
    overwrite: bool = False
    strict: bool = False
    quiet: bool = False
    batch_rows: int = 65536


@dataclass
class Summary:
    """What a run did; ``str()`` is the one-line summary printed at the end."""

    rows: int = 0
    ok: int = 0
    warning: int = 0
    error: int = 0
    distinct_formulas: int = 0
    seconds: float = 0.0
    output: str = ""

    def __str__(self) -> str:
        return (
            f"rows: {self.rows}, ok: {self.ok}, warning: {self.warning}, error: {self.error},"
            f" distinct formulas: {self.distinct_formulas}, seconds: {self.seconds:.2f}"
        )


@dataclass
class FormulaCache:
    """Records of formulas already scored in this process."""

    records: dict = field(default_factory=dict)

    def get_many(self, formulas: list) -> list[dict]:
        out = []
        records = self.records
        for text in formulas:
            record = records.get(text)
            if record is None:
                record = score_formula(text)
                records[text] = record
            out.append(record)
        return out


_PROCESS_CACHE = FormulaCache()


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


def generated_names(input_names: list[str], prefix: str) -> list[str]:
    names = [prefix + c.name for c in output_columns()]
    clashes = [n for n in names if n in input_names]
    if clashes:
        raise InputError(
            f"generated column(s) {clashes} clash with input columns; pass --prefix TEXT (e.g. --prefix ion_)"
        )
    return names


def output_schema(input_schema: pa.Schema, prefix: str) -> pa.Schema:
    names = generated_names(input_schema.names, prefix)
    fields = list(input_schema) + [
        pa.field(name, _ARROW_TYPES[c.dtype]) for name, c in zip(names, output_columns())
    ]
    return pa.schema(fields)


def _with_name(record: dict, name) -> dict:
    if record["status"] != "error" or not name:
        return record
    record = dict(record)
    record["message"] = f"{record['message']} (row names {name!r})"
    return record


def score_batch(
    batch: pa.RecordBatch,
    formula_col: str,
    schema: pa.Schema,
    cache: FormulaCache | None = None,
    name_col: str | None = None,
) -> pa.RecordBatch:
    """Append the generated columns to one batch, in row order."""
    cache = cache or _PROCESS_CACHE
    formulas = batch.column(batch.schema.get_field_index(formula_col))
    if not pa.types.is_string(formulas.type):
        formulas = pc.cast(formulas, pa.string())
    if name_col is not None:
        names = batch.column(batch.schema.get_field_index(name_col))
        keys = pc.binary_join_element_wise(
            pc.fill_null(formulas, "\x00"), pc.fill_null(pc.cast(names, pa.string()), ""), "\x01"
        )
        encoded = pc.dictionary_encode(keys)
        distinct = encoded.dictionary.to_pylist()
        split = [k.split("\x01", 1) for k in distinct]
        records = [
            _with_name(r, n) for r, (_, n) in zip(cache.get_many([None if f == "\x00" else f for f, _ in split]), split)
        ]
    else:
        encoded = pc.dictionary_encode(formulas)
        distinct = encoded.dictionary.to_pylist()
        records = cache.get_many(distinct)
    indices = encoded.indices
    if indices.null_count:
        records = records + [score_formula(None)]
        indices = pc.fill_null(indices, len(records) - 1)
    columns = list(batch.columns)
    for column in output_columns():
        values = [r[column.name] for r in records]
        if column.dtype == "float64":
            values = [None if v is None or (isinstance(v, float) and math.isnan(v)) else float(v) for v in values]
        array = pa.array(values, type=_ARROW_TYPES[column.dtype])
        columns.append(pc.take(array, indices))
    return pa.RecordBatch.from_arrays(columns, schema=schema)


def _count_status(summary: Summary, batch: pa.RecordBatch, prefix: str) -> None:
    counts = pc.value_counts(batch.column(batch.schema.get_field_index(prefix + "status"))).to_pylist()
    for item in counts:
        setattr(summary, item["values"], getattr(summary, item["values"]) + item["counts"])


class _Progress:
    """A one-line progress report on stderr, only when stderr is a terminal."""

    def __init__(self, enabled: bool):
        self.enabled = enabled and sys.stderr.isatty()
        self.start = time.perf_counter()
        self.last = 0.0

    def update(self, rows: int) -> None:
        if not self.enabled:
            return
        now = time.perf_counter()
        if now - self.last < 0.2:
            return
        self.last = now
        rate = rows / max(now - self.start, 1e-9)
        sys.stderr.write(f"\r{rows:,} rows  {rate:,.0f} rows/s")
        sys.stderr.flush()

    def close(self) -> None:
        if self.enabled:
            sys.stderr.write("\r" + " " * 60 + "\r")
            sys.stderr.flush()


def score_file(config: ScoreConfig | str, output: str | None = None, **options) -> Summary:
    """Score a CSV, TSV or Parquet file into another, streaming in batches.

    ``score_file("in.csv", "out.parquet", formula_col="smiles_free_formula")``
    or ``score_file(ScoreConfig(...))``. Raises :class:`InputError` for
    unusable input or options; nothing is written at the output path then.
    """
    if not isinstance(config, ScoreConfig):
        config = ScoreConfig(input=config, output=output if output is not None else "-", **options)
    started = time.perf_counter()
    reader = open_reader(config.input, config.batch_rows)
    names = reader.schema.names
    formula_col = find_formula_column(names, config.formula_col)
    if config.name_col is not None and config.name_col not in names:
        raise InputError(f"no column {config.name_col!r} for --name-col; columns found: {', '.join(map(repr, names))}")
    schema = output_schema(reader.schema, config.prefix)
    from scorer import __version__
    from scorer.elements import snapshot_info

    metadata = {
        "ionicity.version": __version__,
        "ionicity.elements_snapshot": str(snapshot_info().get("mendeleev_version", "")),
        "ionicity.formula_col": formula_col,
        "ionicity.input": config.input,
    }
    writer = TableWriter(config.output, schema, overwrite=config.overwrite, metadata=metadata)
    summary = Summary(output=config.output)
    progress = _Progress(not config.quiet)
    before = len(_PROCESS_CACHE.records)
    try:
        for batch in reader.batches:
            scored = score_batch(batch, formula_col, schema, name_col=config.name_col)
            if config.prefix:
                scored = scored.rename_columns(schema.names)
            writer.write(scored)
            summary.rows += batch.num_rows
            _count_status(summary, scored, config.prefix)
            progress.update(summary.rows)
        if summary.rows == 0:
            raise InputError(f"input {config.input!r} has a header but no data rows")
        writer.commit()
    except BaseException:
        writer.abort()
        raise
    finally:
        progress.close()
    summary.distinct_formulas = max(len(_PROCESS_CACHE.records) - before, 0)
    summary.seconds = time.perf_counter() - started
    return summary


def score_table(df, formula_col: str | None = None, *, name_col: str | None = None, prefix: str = ""):
    """Score a pandas DataFrame; returns a new DataFrame with the generated
    columns appended (input columns, index and order unchanged).

    >>> import pandas as pd
    >>> out = score_table(pd.DataFrame({"formula": ["NaCl", "Xx2O"]}))
    >>> out["status"].tolist()
    ['ok', 'error']
    """
    import pandas as pd

    names = [str(c) for c in df.columns]
    formula_col = find_formula_column(names, formula_col)
    out_names = generated_names(names, prefix)
    formulas = df[formula_col]
    codes, uniques = pd.factorize(formulas, use_na_sentinel=True)
    records = _PROCESS_CACHE.get_many(list(uniques))
    if (codes < 0).any():
        records.append(score_formula(None))
        codes = codes.copy()
        codes[codes < 0] = len(records) - 1
    result = df.copy()
    for name, column in zip(out_names, output_columns()):
        values = [r[column.name] for r in records]
        if column.dtype == "float64":
            series = pd.Series(pd.array(values, dtype="float64"))
        else:
            series = pd.Series(values, dtype="object")
        result[name] = series.take(codes).to_numpy()
    return result
