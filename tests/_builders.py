"""Small builders shared by the tests: hand-made decompositions and formula pieces."""
from __future__ import annotations

import re

from ionicity.scorer.ion_library import get_ion, monatomic_ion
from ionicity.scorer.model import Decomposition, IonTerm


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


_SUBSCRIPT_DIGITS = str.maketrans("₀₁₂₃₄₅₆₇₈₉", "0123456789")


def periodictable_spelling(text: str) -> str | None:
    """The same formula in periodictable's grammar ('+' joins adducts,
    round brackets only), or None where periodictable has no spelling
    (ionic-liquid abbreviations, charges)."""
    text = text.translate(_SUBSCRIPT_DIGITS).replace("½", "0.5")
    text = re.sub(r"[·•∙⋅*]", "+", text)
    # a dot joins adducts where a formula starts right after it ("K2SO4.Al2(SO4)3") or where a
    # count ends before it and water follows ("CuSO4.5H2O"); elsewhere it is a decimal ("Fe0.95O")
    text = re.sub(r"\.(?=[A-Z(\[])", "+", text)
    text = re.sub(r"(?<=[A-Za-z)\]])(\d+)\.(?=\d+(?:\.\d+)?H2O)", r"\1+", text)
    text = text.replace("[", "(").replace("]", ")")
    if re.search(r"[a-z]{2}|\s|\^|[+-]$", text):
        return None
    return text


def registry_melting_point_K(cas: str) -> float:
    """The registry's melting point of ``cas`` (``chemicals.phase_change.Tm``, CRC Handbook), read at test
    time; the test is skipped without the ``melting`` extra and fails where the registry has no value."""
    import pytest

    pytest.importorskip("chemicals")
    from chemicals.phase_change import Tm

    value = Tm(cas)
    assert value, f"no registry melting point for {cas}"
    return value
