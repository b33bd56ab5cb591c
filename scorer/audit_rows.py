"""A scored row changed by what the audit found in its text: a typing slip
(:func:`slipped_row`) or a solution's concentration (:func:`audited_row`).
Kept out of :mod:`scorer.record` so the record's own path stays one hook."""
from __future__ import annotations

from ionicity.scorer.slips import Slip
from ionicity.scorer.solutions import Solution, solution_note
from ionicity.scorer.verdict import Verdict, joined, with_warnings

__all__ = ["slipped_row", "audited_row"]


def slipped_row(row: tuple, slip: Slip, position: dict[str, int]) -> tuple:
    """``row`` (the suggested formula's, or an error) with the slip named in
    its message and the suggestion in ``formula_suggested``: never ``ok``."""
    row = list(row)
    verdict = Verdict(row[position["status"]], row[position["message"]] or "", row[position["value_notes"]] or "")
    if verdict.status == "error":
        message = joined([slip.message, verdict.message]) if slip.suggested else verdict.message or slip.message
        row[position["message"]] = message
        return tuple(row)
    verdict = with_warnings(Verdict(verdict.status, "", verdict.value_notes), [slip.message, verdict.message])
    row[position["status"]] = verdict.status
    row[position["message"]] = verdict.message
    row[position["formula_suggested"]] = slip.suggested or None
    return tuple(row)


def audited_row(row: tuple, solution: Solution, position: dict[str, int]) -> tuple:
    """``row`` (the solute's) with the concentration as written and the
    solution's note (and, for an acid or a base, the caution)."""
    row = list(row)
    row[position["concentration_as_written"]] = solution.concentration
    if row[position["status"]] != "error":
        note = solution_note(solution, row[position["substance_class"]] or "")
        row[position["value_notes"]] = joined([note, row[position["value_notes"]] or ""])
    return tuple(row)
