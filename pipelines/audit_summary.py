"""``ionicity score ... --summary FILE.json``: the audit of a run in one JSON file.

:class:`AuditTally` is given every scored batch, in input order (the local
engine), or reads the written output back (the Dask engine), and counts
with Arrow kernels per batch (no Python work per row): rows by status, by
substance class, by slip kind (read from the message, through
:func:`ionicity.scorer.slips.slip_kind_of` on each distinct message), by
name check (when a ``name_check`` column exists), solutions, duplicates,
and keeps the first :data:`EXAMPLES_PER_KIND` rows of each kind that needs a
person. The layout is documented in README.md ("Audit summary").
"""
from __future__ import annotations

import json
import os
from collections import Counter

import pyarrow as pa
import pyarrow.compute as pc

from ionicity.pipelines.arrow_columns import string_array
from ionicity.pipelines.errors import InputError
from ionicity.pipelines.schema import find_formula_column
from ionicity.scorer.audit import FIRST_ROW_COLUMN
from ionicity.scorer.slips import slip_kind_of
from ionicity.scorer.verdict import STATUSES

__all__ = ["AuditTally", "EXAMPLES_PER_KIND", "SUMMARY_VERSION", "check_summary_path"]

SUMMARY_VERSION = 1
EXAMPLES_PER_KIND = 20
# name_check values that need a person (branch names: match, hydrate_differs, mismatch, name_unread)
_NAME_CHECK_ATTENTION = ("mismatch", "hydrate_differs", "name_unread")


def check_summary_path(path: str, output: str, overwrite: bool) -> None:
    """Refuse a summary path that cannot be written, is the output, or exists
    (without ``--overwrite``), before any scoring starts."""
    if not path.lower().endswith(".json"):
        raise InputError(f"--summary {path!r} must name a .json file")
    if output != "-" and os.path.abspath(path) == os.path.abspath(output):
        raise InputError(f"--summary {path!r} is the output file; give another path")
    folder = os.path.dirname(os.path.abspath(path))
    if not os.path.isdir(folder):
        raise InputError(f"--summary {path!r}: folder {folder!r} does not exist")
    if os.path.lexists(path) and not (overwrite and os.path.isfile(path)):
        raise InputError(f"--summary {path!r} exists; pass --overwrite to replace it")


class AuditTally:
    """Counts and examples of one run's scored rows.

    >>> tally = AuditTally(formula_col="formula")
    >>> tally.add(pa.RecordBatch.from_pydict({"formula": ["NaCl", "NaCI", "NaCl"],
    ...     "status": ["ok", "warning", "ok"], "substance_class": ["ionic_salt"] * 3,
    ...     "message": ["", "typing slip? 'NaCI' looks like NaCl: a capital I typed for a lower-case l", ""],
    ...     "first_row_same_compound": pa.array([None, 1, 1], pa.int64())}))
    >>> report = tally.report()
    >>> report["status"], report["slip_kind"], report["duplicates"]["rows_repeating_a_compound"]
    ({'ok': 2, 'warning': 1, 'error': 0}, {'I_for_l': 1}, 2)
    >>> report["needs_attention"]["slip"][0]["row"]
    2
    """

    def __init__(self, formula_col: str, prefix: str = "", name_col: str | None = None,
                 id_col: str | None = None, examples: int = EXAMPLES_PER_KIND) -> None:
        self.formula_col, self.prefix, self.name_col, self.id_col = formula_col, prefix, name_col, id_col
        self.examples = examples
        self.rows = 0
        self.counts: dict[str, Counter] = {k: Counter() for k in ("status", "substance_class", "slip_kind", "name_check")}
        self.solutions = 0
        self.repeating_rows = 0
        self.repeated_compounds: set[int] = set()
        self.attention: dict[str, list] = {k: [] for k in ("error", "warning", "slip", "name_check", "duplicate")}
        self.has_name_check = False

    def _column(self, batch: pa.RecordBatch, name: str):
        index = batch.schema.get_field_index(self.prefix + name)
        if index < 0:
            return None
        column = batch.column(index)
        return column.dictionary_decode() if pa.types.is_dictionary(column.type) else column

    def add(self, batch: pa.RecordBatch) -> None:
        """Count one scored batch (the next rows of the input)."""
        if not self.formula_col:
            self.formula_col = find_formula_column(batch.schema.names, None)
        status = self._column(batch, "status")
        message = self._column(batch, "message")
        for key, column in (("status", status), ("substance_class", self._column(batch, "substance_class"))):
            if column is not None:
                for item in pc.value_counts(column).to_pylist():
                    if item["values"] is not None:
                        self.counts[key][item["values"]] += item["counts"]
        slipped = None
        if message is not None:
            kinds = {}
            for item in pc.value_counts(message).to_pylist():
                kind = slip_kind_of(item["values"])
                if kind:
                    kinds[item["values"]] = kind
                    self.counts["slip_kind"][kind] += item["counts"]
            if kinds:
                slipped = pc.is_in(message, value_set=string_array(list(kinds)))
        name_check = self._column(batch, "name_check")
        if name_check is not None:
            self.has_name_check = True
            for item in pc.value_counts(name_check).to_pylist():
                if item["values"] is not None:
                    self.counts["name_check"][item["values"]] += item["counts"]
        concentration = self._column(batch, "concentration_as_written")
        if concentration is not None:
            self.solutions += len(concentration) - concentration.null_count
        first = self._column(batch, FIRST_ROW_COLUMN)
        if first is not None and first.null_count < len(first):
            repeats = first.drop_null()
            self.repeating_rows += len(repeats)
            if len(self.repeated_compounds) < 1_000_000:  # one entry per repeated compound, bounded
                self.repeated_compounds.update(pc.unique(repeats).to_pylist())
        if status is not None:
            self._examples(batch, "error", pc.equal(status, "error"), message)
            self._examples(batch, "warning", pc.equal(status, "warning"), message)
        if slipped is not None:
            self._examples(batch, "slip", slipped, message)
        if name_check is not None:
            self._examples(batch, "name_check", pc.is_in(name_check, value_set=string_array(list(_NAME_CHECK_ATTENTION))), message)
        if first is not None:
            self._examples(batch, "duplicate", pc.is_valid(first), message)
        self.rows += batch.num_rows

    def _examples(self, batch, kind: str, mask, message) -> None:
        kept = self.attention[kind]
        room = self.examples - len(kept)
        if room <= 0:
            return
        rows = pc.indices_nonzero(pc.fill_null(mask, False)).slice(0, room).to_pylist()
        if not rows:
            return
        wanted = {"formula": self.formula_col, "name": self.name_col, "id": self.id_col}
        columns = {key: batch.column(batch.schema.get_field_index(col)) for key, col in wanted.items()
                   if col and batch.schema.get_field_index(col) >= 0}
        extra = {
            "message": message, "formula_suggested": self._column(batch, "formula_suggested"),
            "name_check": self._column(batch, "name_check"), FIRST_ROW_COLUMN: self._column(batch, FIRST_ROW_COLUMN),
        }
        for i in rows:
            entry = {"row": self.rows + i + 1}
            for key, column in list(columns.items()) + [(k, c) for k, c in extra.items() if c is not None]:
                value = column[i].as_py()
                if value not in (None, ""):
                    entry[key] = value if isinstance(value, (int, float, str, bool)) else str(value)
            kept.append(entry)

    def add_table_file(self, path: str) -> None:
        """Count a written Parquet output (a file or a folder of parts), batch by batch."""
        # pyarrow.dataset takes about 0.2 s to import (python -X importtime): only the Dask path reads its output back
        import pyarrow.dataset as ds

        dataset = ds.dataset(path, format="parquet")
        for batch in dataset.to_batches():
            self.add(batch)

    def report(self) -> dict:
        """The summary as a JSON-ready dict (layout in README.md, "Audit summary")."""
        out = {
            "version": SUMMARY_VERSION,
            "rows": self.rows,
            "status": {s: self.counts["status"].get(s, 0) for s in STATUSES},
            "substance_class": dict(self.counts["substance_class"].most_common()),
            "slip_kind": dict(self.counts["slip_kind"].most_common()),
            "solutions": self.solutions,
            "duplicates": {
                "rows_repeating_a_compound": self.repeating_rows,
                "compounds_repeated": len(self.repeated_compounds),
            },
            "needs_attention": self.attention,
            "examples_per_kind": self.examples,
        }
        if self.has_name_check:
            out["name_check"] = dict(self.counts["name_check"].most_common())
        return out

    def write(self, path: str) -> None:
        """Write :meth:`report` to ``path`` through a temporary file beside it."""
        temporary = f"{path}.{os.getpid()}.tmp"
        with open(temporary, "w", encoding="utf-8") as handle:
            json.dump(self.report(), handle, indent=1, ensure_ascii=False)
            handle.write("\n")
        os.replace(temporary, path)
