"""One scan of a formula text before the readers that may change it.

Three readers look at a text before it is parsed as a compound: mixture
notation and blend names (:mod:`scorer.mixture`), a concentration or grade
written after a solute (:mod:`scorer.solutions`) and typing slips
(:mod:`scorer.slips`). Each returns nothing for an ordinary formula, but each
pays its own checks to find that out, once per distinct text: together about
10 us per text, most of the cost of a new hydrate spelling. :func:`ordinary_formula`
decides it for all three with one regular expression (:data:`_ORDINARY`) and
returns the parsed formula, so that an ordinary text goes straight to the
record; anything it does not accept takes the readers' full path, as before.
It accepts only what none of them would change, so no output depends on it
(``tests/test_prescan.py`` checks that against each reader on the benchmark's
formulas, the reference cases and random text).

>>> ordinary_formula("CuSO4·5H2O").canonical
'CuO4S·5H2O'
>>> ordinary_formula("NaCI") is None, ordinary_formula("LiCl-KCl") is None, ordinary_formula("HCl 37%") is None
(True, True, True)
"""
from __future__ import annotations

import re

from ionicity.scorer.formula import FormulaError, ParsedFormula, parse_formula
from ionicity.scorer.mixture import names_a_blend
from ionicity.scorer.slips import MAYBE_SLIP, unknown_abbreviation

__all__ = ["ordinary_formula"]

# Why each part keeps a reader silent (each reader's own checks say the same):
# * characters: letters, digits, brackets and the hydrate dots only -- no
#   whitespace, so no concentration follows a space (scorer.solutions) and no
#   slip hides in spacing; none of the joiners - : + of mixture notation; no
#   q (every (aq) and aq is a state word to scorer.solutions, and no element
#   symbol has a q);
# * not starting with a digit: no leading amount (0.588LiCl·0.412KCl), and
#   a dot-joined text without one is no mixture (scorer.mixture_notation);
# * no "soln"/"solution" (state words) and no closing bracket at the end
#   (where "(2N)" or "(conc)" would be a bracketed concentration);
# * upper and lower case letters both (no all-capitals or all-lower-case
#   re-casing) and no character any slip kind proposes at (slips.MAYBE_SLIP).
_ORDINARY = re.compile(
    r"(?=[^a-z]*[a-z])(?=[^A-Z]*[A-Z])(?!\d)(?!.*(?i:soln|solution))"
    rf"(?!.*(?:{MAYBE_SLIP.pattern}))"
    r"[A-PR-Za-pr-z\d()\[\]·.*]+(?<!\))\Z",
    re.DOTALL,
)


def ordinary_formula(text: str) -> ParsedFormula | None:
    """``text`` parsed, when it is an ordinary formula that no mixture,
    solution or slip reading would change; ``None`` otherwise (the text then
    takes the full path of :func:`scorer.record.score_row`).

    A bracketed ion the library does not know (``[N2224]``), a blend name
    (``FLiNaK``) and a text that does not parse are not ordinary.
    """
    if not _ORDINARY.match(text):
        return None
    if "[" in text and unknown_abbreviation(text) is not None:
        return None
    if names_a_blend(text):
        return None
    try:
        return parse_formula(text)
    except FormulaError:
        return None
