"""CAS Registry Numbers in the formula column, as stock lists write them: alone
(``7647-14-5``, ``CAS 7647-14-5``) or after the name or formula
(``Sodium chloride [7647-14-5]``, ``NaCl, CAS 7647-14-5``).

A CAS number carries a check digit: the last digit is the sum of the other
digits, each times its position counted from the right, modulo 10 (CAS,
"CAS Registry Number: check digit", chemical abstracts service documentation;
common practice). A number that fails it is a typing slip, and said so. A
valid number is looked up in the registry table of ``scorer/data/registry_names.csv``
(names, formulas and CAS numbers of the registry package ``chemicals``); where
it is written beside a formula or name, the two are compared and a mismatch
is said.
"""
from __future__ import annotations

import re

from ionicity.scorer.caching import once
from ionicity.scorer.tables import table

__all__ = ["cas_check_digit_valid", "registry_by_cas", "whole_cas", "trailing_cas"]

_CAS_WORD = r"(?:CAS(?:[\s-]*(?:No\.?|number|RN|#|Reg\.?\s*No\.?))?\s*[:#.]?\s*)"
_NUMBER = r"(?P<cas>\d{2,7}-\d{2}-\d)"
_WHOLE = re.compile(rf"^\s*{_CAS_WORD}?{_NUMBER}\s*$", re.IGNORECASE)
_TRAILING = re.compile(
    rf"^(?P<rest>.*?[^\s,;(\[])\s*(?:[,;]\s*)?(?P<open>[\[(]\s*)?{_CAS_WORD}?{_NUMBER}\s*(?(open)[\])])\s*$",
    re.IGNORECASE)


def cas_check_digit_valid(number: str) -> bool:
    """Whether a CAS Registry Number's check digit holds.

    >>> cas_check_digit_valid("7647-14-5"), cas_check_digit_valid("7732-18-5"), cas_check_digit_valid("7647-14-4")
    (True, True, False)
    """
    digits = number.replace("-", "")
    if not digits.isdigit() or len(digits) < 5:
        return False
    body, check = digits[:-1], int(digits[-1])
    return sum(int(d) * i for i, d in enumerate(reversed(body), start=1)) % 10 == check


@once
def _by_cas() -> dict[str, tuple[str, str]]:
    out: dict[str, tuple[str, str]] = {}
    for row in table("registry_names.csv"):
        out.setdefault(row["cas"], (row["formula"], row["name"]))
    return out


def registry_by_cas(number: str) -> tuple[str, str] | None:
    """(formula, name) of a CAS number in the registry table, or None.

    >>> registry_by_cas("7647-14-5")[0]
    'ClNa'
    """
    return _by_cas().get(number)


def whole_cas(text: str) -> str | None:
    """The CAS number a whole cell is (``7647-14-5``, ``CAS No. 7647-14-5``), valid or not; None otherwise."""
    m = _WHOLE.match(text) if isinstance(text, str) and len(text) <= 40 else None
    return m.group("cas") if m else None


def trailing_cas(text: str) -> tuple[str, str] | None:
    """(the text before it, the CAS number) of a CAS number written after a name or formula; None otherwise.

    >>> trailing_cas("Sodium chloride [7647-14-5]"), trailing_cas("NaCl, CAS 7647-14-5")
    (('Sodium chloride', '7647-14-5'), ('NaCl', '7647-14-5'))
    >>> trailing_cas("LiCl-KCl") is None
    True
    """
    m = _TRAILING.match(text) if isinstance(text, str) and len(text) <= 200 else None
    if m is None:
        return None
    return m.group("rest").strip(), m.group("cas")
