"""The pandas API: :func:`score_table` scores a DataFrame in memory.

It factorizes the formula column, scores each distinct formula once with a
:class:`~ionicity.pipelines.scheduler.BatchScorer` of its own, and expands
the generated columns to every row; failed rows are labelled with their
name by :func:`ionicity.scorer.verdict.with_row_name`, as in files.
"""
from __future__ import annotations

import numpy as np
import pandas as pd
import pyarrow as pa

from ionicity.pipelines.duplicates import FirstRows
from ionicity.pipelines.name_step import NAME_COLUMNS, NameStep
from ionicity.pipelines.scheduler import BatchScorer
from ionicity.pipelines.schema import check_name_column, find_formula_column, generated_names
from ionicity.scorer.audit import FIRST_ROW_COLUMN
from ionicity.scorer.columns import output_columns
from ionicity.scorer.verdict import Verdict, fit_message, with_row_name

__all__ = ["score_table"]


def score_table(df, formula_col: str | None = None, *, name_col: str | None = None, prefix: str = "",
                workers: int | None = 1):
    """Score a pandas DataFrame; returns a new DataFrame with the generated
    columns appended (input columns, index and order unchanged).

    Each distinct formula is scored once; ``workers`` > 1 scores many new
    distinct formulas across processes, as :func:`score_file` does. The
    formula cache of the call goes when it returns.

    See Also
    --------
    ionicity.pipelines.score_file : the same columns, streamed from file to file.

    Examples
    --------
    >>> import pandas as pd
    >>> out = score_table(pd.DataFrame({"formula": ["NaCl", "Xx2O", "NaCl"]}))
    >>> out["status"].tolist()
    ['ok', 'error', 'ok']
    """
    names = [str(c) for c in df.columns]
    formula_col = find_formula_column(names, formula_col)
    check_name_column(names, name_col, option="name_col")
    out_names = generated_names(names, prefix, with_names=name_col is not None)
    formulas = df[formula_col]
    codes, uniques = pd.factorize(formulas, use_na_sentinel=True)
    texts = [u if isinstance(u, str) else str(u) for u in uniques]
    if (codes < 0).any():
        texts.append(None)
        codes = np.where(codes < 0, len(texts) - 1, codes)
    with BatchScorer(workers) as scorer:
        arrays = scorer.columns(texts)
    result = df.copy()
    for name, column, array in zip(out_names, output_columns(), arrays):
        if column.dtype == "float64":
            values = array.to_numpy(zero_copy_only=False).astype("float64")
        else:
            values = np.asarray(array.to_pylist(), dtype="object")
        result[name] = values[codes] if len(codes) else values[:0]
    # the first row of each compound, by position (1-based), as in files
    normalized = pa.array(result[prefix + "formula_normalized"].to_numpy(dtype="object"), type=pa.string(), from_pandas=True)
    result[prefix + FIRST_ROW_COLUMN] = FirstRows().column(normalized).to_pandas(integer_object_nulls=False).astype("Int64")
    if name_col is not None:
        # names against formulas, per distinct pair (pipelines.name_step), as in files
        checked = NameStep().columns(
            _text_array(result[prefix + "formula_normalized"]), _text_array(df[name_col]),
            _text_array(result[prefix + "status"]), _text_array(result[prefix + "message"]),
        )
        result[prefix + "status"] = np.asarray(checked[2].to_pylist(), dtype="object")
        result[prefix + "message"] = np.asarray(checked[3].to_pylist(), dtype="object")
        for column, array in zip(NAME_COLUMNS, checked[:2]):
            result[prefix + column.name] = np.asarray(array.to_pylist(), dtype="object")
        row_names = df[name_col].astype("object").where(df[name_col].notna(), "").astype(str).to_numpy()
        status = result[prefix + "status"].to_numpy()
        messages = result[prefix + "message"].to_numpy(dtype="object").copy()
        notes = result[prefix + "value_notes"].to_numpy(dtype="object")
        for i in np.flatnonzero(status == "error"):
            messages[i] = with_row_name(Verdict(status[i], messages[i], notes[i]), row_names[i]).message
        result[prefix + "message"] = messages
    # capped, never starting like a spreadsheet formula, as in files
    fits = {m: fit_message(m) for m in pd.unique(result[prefix + "message"]) if isinstance(m, str)}
    unfit = {m: f for m, f in fits.items() if f != m}
    if unfit:
        result[prefix + "message"] = result[prefix + "message"].replace(unfit)
    return result


def _text_array(series) -> pa.Array:
    """A column as Arrow text: strings kept, missing cells null, other values as their text."""
    return pa.array([v if isinstance(v, str) else None if v is None or v != v else str(v) for v in series.tolist()],
                    type=pa.string())
