"""Small builders shared by the tests: hand-made decompositions and formula pieces."""
from __future__ import annotations

import re

from scorer.ion_library import get_ion, monatomic_ion
from scorer.model import Decomposition, IonTerm


def salt(cations, anions) -> Decomposition:
    """A decomposition from [(ion, count)] lists; ions are ids or (symbol, charge)."""

    def term(spec, count):
        ion = monatomic_ion(*spec) if isinstance(spec, tuple) else get_ion(spec)
        return IonTerm(ion, count)

    return Decomposition(
        cations=tuple(term(s, n) for s, n in cations),
        anions=tuple(term(s, n) for s, n in anions),
        substance_class="ionic_salt",
    )


def formula_piece(text: str, count: int) -> str:
    """``Cl`` x 2 -> ``Cl2``; ``SO4`` x 3 -> ``(SO4)3``."""
    if count == 1:
        return text
    if re.fullmatch(r"[A-Z][a-z]?", text):
        return f"{text}{count}"
    return f"({text}){count}"
