"""One scored batch: the input columns, then the generated ones in row order
(:func:`score_batch`).

The generated columns are taken from the run's cache with one ``take`` per
column; the melting model's step, when a model is applied, replaces
``status`` and ``message``; with ``--name-col``, each row's name is checked
against its formula (:mod:`ionicity.pipelines.name_step`: ``name_formula``,
``name_check``, a mismatch made a warning) and failed rows are labelled with
their name, by the one verdict policy, :mod:`ionicity.scorer.verdict`.
The local engine and every Dask partition call :func:`score_batch`.
"""
from __future__ import annotations

import pyarrow as pa
import pyarrow.compute as pc

from ionicity.pipelines.arrow_columns import as_text, int_array, string_array
from ionicity.pipelines.duplicates import FirstRows
from ionicity.pipelines.formula_cache import FormulaCache
from ionicity.pipelines.model_step import ModelApplier
from ionicity.pipelines.name_step import name_step_for
from ionicity.pipelines.scheduler import BatchScorer, Ticket, formula_array
from ionicity.scorer.audit import FIRST_ROW_COLUMN
from ionicity.scorer.columns import column_names
from ionicity.scorer.melting_model import MODEL_COLUMNS
from ionicity.scorer.verdict import MESSAGE_MAX_CHARS, Verdict, fit_message, with_row_name

__all__ = ["score_batch", "label_failed_rows"]


def score_batch(
    batch: pa.RecordBatch,
    formula_col: str,
    schema: pa.Schema,
    scorer: BatchScorer | FormulaCache | None = None,
    name_col: str | None = None,
    model: ModelApplier | None = None,
    ticket: Ticket | None = None,
    chosen: tuple[str, ...] | None = None,
    first_rows: FirstRows | None = None,
) -> pa.RecordBatch:
    """Append the generated columns to one batch, in row order.

    ``schema`` is :func:`ionicity.pipelines.schema.output_schema` of the
    batch's schema (it names the generated columns, prefix included).
    ``scorer`` is the run's :class:`~ionicity.pipelines.scheduler.BatchScorer`,
    or a cache to score into (in-process), or ``None`` for a cache of this
    batch alone. ``ticket`` is what :meth:`BatchScorer.submit` returned for
    this batch, when its formulas were sent for scoring ahead of time.
    ``chosen`` names the generated columns to keep (``--columns``; None: all):
    only those are taken from the cache.
    ``first_rows`` is the run's :class:`~ionicity.pipelines.duplicates.FirstRows`,
    given batches in input order; without it ``first_row_same_compound`` stays empty.
    """
    if not isinstance(scorer, BatchScorer):
        # no scorer: one for this batch alone (a cache, when given, is kept)
        scorer = BatchScorer(1, cache=scorer)
    if ticket is None:
        ticket = scorer.submit(formula_array(batch, formula_col))
    rows = scorer.rows_of(ticket)
    names = column_names()
    every = list(names) + ([c.name for c in MODEL_COLUMNS] if model is not None else [])
    keep = range(len(every)) if chosen is None else [every.index(n) for n in chosen]
    status_at, message_at = names.index("status"), names.index("message")
    cached = scorer.cache.arrays()
    # only the columns written are taken (with --columns, most of the rows' cost)
    generated = scorer.cache.take(rows, [k for k in keep if k < len(names)])
    normalized_at = names.index("formula_normalized")

    def normalized() -> pa.Array:
        return generated[normalized_at] if normalized_at in generated else cached[normalized_at].take(rows)
    if model is not None:
        distinct = ticket.distinct.to_pylist()
        indices = ticket.indices
        if indices.null_count:
            distinct.append(None)
            indices = pc.fill_null(indices, len(distinct) - 1)
        cache_rows = pa.array(scorer.cache.ids(distinct), type=pa.int64())
        model_arrays, status, message = model.columns(distinct, cache_rows, scorer.cache)
        generated[status_at] = status.take(indices)
        generated[message_at] = message.take(indices)
        for k, array in enumerate(model_arrays):
            if len(names) + k in keep:
                generated[len(names) + k] = array.take(indices)
    if first_rows is not None and names.index(FIRST_ROW_COLUMN) in keep:
        # the first row of each compound, known as batches stream past in input order
        generated[names.index(FIRST_ROW_COLUMN)] = first_rows.column(normalized())
    if name_col is not None:
        row_names = batch.column(batch.schema.get_field_index(name_col))
        # names against formulas (name_formula, name_check; a mismatch is a warning), then failed rows labelled
        checked = name_step_for(scorer.cache).columns(normalized(), row_names, generated[status_at], generated[message_at])
        generated[status_at], generated[message_at] = checked[2], checked[3]
        name_columns = [checked[0], checked[1]]
        generated[message_at] = label_failed_rows(generated[status_at], generated[message_at], row_names)
    else:
        name_columns = []
    if message_at in keep:
        generated[message_at] = fitted_messages(generated[message_at])
    columns = [
        # a column read dictionary-encoded (the formulas, from Parquet) goes
        # out with its input type
        c.dictionary_decode() if pa.types.is_dictionary(c.type) and not pa.types.is_dictionary(f.type) else c
        for c, f in zip(batch.columns, schema)
    ] + [generated[k] for k in keep] + name_columns
    return pa.RecordBatch.from_arrays(columns, schema=schema)


def fitted_messages(message: pa.Array) -> pa.Array:
    """The message column with :func:`ionicity.scorer.verdict.fit_message`
    applied: capped in length, never starting like a spreadsheet formula.
    Two kernels over the dictionary (a batch's distinct messages); Python
    only for the few messages that need it."""
    values = message.dictionary if pa.types.is_dictionary(message.type) else message
    if pa.types.is_dictionary(values.type):
        values = values.dictionary_decode()
    lengths = pc.utf8_length(values)
    # the bound as an Arrow scalar taken from an array: a Python int here would go through pa.scalar, which imports pandas
    longest = int_array([MESSAGE_MAX_CHARS]).cast(lengths.type)[0]
    unfit = pc.or_(pc.greater(lengths, longest), pc.match_substring_regex(values, "^[=+\\-@\\t\\r]"))
    if not pc.any(unfit).as_py():
        return message
    fitted = string_array([None if v is None else fit_message(v) for v in values.to_pylist()])
    if pa.types.is_dictionary(message.type):
        return pa.DictionaryArray.from_arrays(message.indices, fitted)
    return fitted


def label_failed_rows(status: pa.Array, message: pa.Array, row_names: pa.Array) -> pa.DictionaryArray:
    """The ``message`` column with each failed row's name appended
    (:func:`ionicity.scorer.verdict.with_row_name`); rows that did not fail,
    or have no name, keep their message. Returned dictionary-encoded, as
    every generated text column is written."""
    if pa.types.is_dictionary(status.type):
        status = status.dictionary_decode()
    if pa.types.is_dictionary(message.type):
        message = message.dictionary_decode()
    if not pa.types.is_string(row_names.type):
        row_names = as_text(row_names)
    row_names = pc.fill_null(row_names, "")
    failed = pc.and_(pc.equal(status, "error"), pc.not_equal(row_names, ""))
    rows = pc.indices_nonzero(failed)
    if len(rows):
        labelled = [
            with_row_name(Verdict("error", text, ""), name).message
            for text, name in zip(message.take(rows).to_pylist(), row_names.take(rows).to_pylist())
        ]
        message = pc.replace_with_mask(message, failed, string_array(labelled))
    return pc.dictionary_encode(message)
