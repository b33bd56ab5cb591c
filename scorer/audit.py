"""The audit columns of an inventory run (group ``audit``).

``formula_suggested`` (a typing slip's corrected formula, :mod:`scorer.slips`)
and ``concentration_as_written`` (a solution's concentration,
:mod:`scorer.solutions`) are set per distinct text by :mod:`scorer.audit_rows`;
``first_row_same_compound`` depends on the row's place in the table and is
filled by the engines (:mod:`ionicity.pipelines.duplicates`): empty from
:func:`scorer.record.score_formula`.
"""
from __future__ import annotations

from ionicity.scorer.model import Column

__all__ = ["GROUP", "COLUMNS", "FIRST_ROW_COLUMN"]

GROUP = "audit"

FIRST_ROW_COLUMN = "first_row_same_compound"

COLUMNS: tuple[Column, ...] = (
    Column(
        "formula_suggested", "string", "",
        "the formula the text most plausibly meant where it holds a typing slip (0 for O, 1/I for l, wrong case);"
        " the row's values are for this formula and its status is warning; empty when no slip was found",
        "scorer.slips: corrected spellings ranked by the charge-balance solver's reading", "common practice",
    ),
    Column(
        "concentration_as_written", "string", "",
        "the concentration or grade written before or after a solute (37 %, 65 % w/w, 1 M, 0.1 mol/L, conc.); the row's"
        " values are for the pure solute; empty for a plain formula",
        "scorer.solutions", "",
    ),
    Column(
        FIRST_ROW_COLUMN, "int64", "row",
        "the 1-based data-row number (header not counted) of the first row holding the same compound (same"
        " formula_normalized, lattice water included); empty for that first row and for error rows",
        "ionicity.pipelines.duplicates", "",
    ),
)
