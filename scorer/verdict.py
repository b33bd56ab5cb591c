"""A row's verdict: ``status``, ``message`` and ``value_notes``, decided in one place.

Every path that produces or changes a row's verdict goes through this module:
the record of one compound (:mod:`scorer.record`), a fitted melting model's
domain check, a failed row labelled with its name from ``--name-col``, and
all engines (command line, ``score_table``, Dask, the scikit-learn
transformer) that copy those records onto rows.

The policy:

* ``error``: the row could not be scored; ``message`` says why. Nothing else
  in the row is to be trusted.
* ``warning``: values were computed, but something needs a person's check
  (a structure type guessed, a spelling read one of two ways, a model applied
  outside its training domain); each reason goes to ``message``.
* ``ok``: nothing to check; ``message`` is empty.
* ``value_notes`` explains values left empty or estimated by design (an ion
  no published table covers, a quantity that does not apply). It is
  informational and never changes ``status``.

Repeated reasons are written once, in the order they were first given; reasons
are joined with ``"; "``.

>>> finalise(warnings=["structure type guessed"], gaps=["no polarisability for X(-)"])
Verdict(status='warning', message='structure type guessed', value_notes='no polarisability for X(-)')
>>> finalise(error="unknown element 'Xx'")
Verdict(status='error', message="unknown element 'Xx'", value_notes='')
>>> with_row_name(finalise(error="unknown element 'Xx'"), "mystery salt").message
"unknown element 'Xx' (row named 'mystery salt')"
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import Iterable

__all__ = ["STATUSES", "Verdict", "finalise", "joined", "with_warnings", "with_row_name", "row_name_suffix",
           "fit_message", "MESSAGE_MAX_CHARS", "FORMULA_STARTS"]

STATUSES: tuple[str, ...] = ("ok", "warning", "error")

_SEPARATOR = "; "

#: the longest message a table cell gets; the longest of 3,700 test and demo
#: formulas is about 210 characters, a hostile cell reached 20,000
MESSAGE_MAX_CHARS = 500
#: a cell a spreadsheet runs as a formula starts with one of these (OWASP, "CSV Injection")
FORMULA_STARTS = ("=", "+", "-", "@", "\t", "\r")


def joined(reasons: Iterable[str]) -> str:
    """Reasons joined with ``"; "``, each once, in first-seen order; empty ones dropped.

    >>> joined(["a", "b", "a", ""])
    'a; b'
    """
    return _SEPARATOR.join(dict.fromkeys(r for r in reasons if r))


@dataclass(frozen=True)
class Verdict:
    """The three verdict columns of one row."""

    status: str
    message: str
    value_notes: str


def finalise(*, error: str | None = None, warnings: Iterable[str] = (), gaps: Iterable[str] = ()) -> Verdict:
    """Decide a row's verdict from what its scoring found.

    Parameters
    ----------
    error : str, optional
        Why the row could not be scored at all; given (even empty), it makes
        the status ``error``.
        Warnings given with it follow it in ``message``.
    warnings : iterable of str
        Reasons for a person to check the row (status ``warning``).
    gaps : iterable of str
        Why some values are empty or estimated by design (``value_notes``).

    Returns
    -------
    Verdict
    """
    warnings = list(warnings)
    if error is not None:
        return Verdict("error", joined([error, *warnings]), joined(gaps))
    return Verdict("warning" if any(warnings) else "ok", joined(warnings), joined(gaps))


def with_warnings(verdict: Verdict, warnings: Iterable[str]) -> Verdict:
    """The verdict with more reasons to check (an ``ok`` row becomes ``warning``;
    an ``error`` stays an error).

    >>> with_warnings(Verdict("ok", "", ""), ["outside the model's domain"]).status
    'warning'
    """
    warnings = [w for w in warnings if w]
    if not warnings:
        return verdict
    status = "error" if verdict.status == "error" else "warning"
    return Verdict(status, joined([verdict.message, *warnings]), verdict.value_notes)


def row_name_suffix(row_name: str) -> str:
    """What a failed row's message gains from its name (``--name-col``), so that
    an auditor finds the row without its number."""
    return f" (row named '{row_name}')"


def with_row_name(verdict: Verdict, row_name: str | None) -> Verdict:
    """An error's message with the row's name appended; other rows unchanged."""
    if verdict.status != "error" or not row_name:
        return verdict
    return Verdict(verdict.status, (verdict.message or "") + row_name_suffix(row_name), verdict.value_notes)


def fit_message(message: str) -> str:
    """A message as a table cell gets it: at most :data:`MESSAGE_MAX_CHARS`
    characters (``ionicity explain`` prints the whole text), and never
    starting like a spreadsheet formula (an apostrophe goes first, as
    spreadsheets themselves mark text).

    >>> fit_message("-1 charge left over")
    "'-1 charge left over"
    >>> len(fit_message("x" * 20000)) <= MESSAGE_MAX_CHARS
    True
    """
    if len(message) > MESSAGE_MAX_CHARS:
        tail = f"... (cut: {len(message)} characters; ionicity explain shows the whole text)"
        message = message[: MESSAGE_MAX_CHARS - len(tail)] + tail
    if message.startswith(FORMULA_STARTS):
        message = "'" + message
    return message
