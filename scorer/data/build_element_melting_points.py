"""Rebuild ``element_melting_points.csv`` from the installed ``chemicals`` package.

usage: python -m ionicity.scorer.data.build_element_melting_points [--check]

Melting points of the elements that are solids at 25 C (H, N, O, F, Cl, Br, I,
noble gases and Hg, liquid or gaseous, and P, whose allotropes melt
hundreds of kelvin apart, are left out: the rule of mixtures of
:func:`scorer.melting_routes.element_mixture_melting_K` skips them), read with
``chemicals.phase_change.Tm`` (its default source, the CRC Handbook table).
Elements above Cm are left out (no measured values).
"""
from __future__ import annotations

import csv
import io
import sys
from pathlib import Path

OUT = Path(__file__).with_name("element_melting_points.csv")
# P: the table mixes allotropes (white P melts at 317 K, red P near 860 K): left out
NOT_SOLID = {"P", "H", "He", "N", "O", "F", "Ne", "Cl", "Ar", "Br", "Kr", "I", "Xe", "Rn", "Hg", "Fr", "At"}


def build() -> str:
    # chemicals is the optional melting extra, needed only to rebuild (about 1 s to import, measured)
    import chemicals
    from chemicals.elements import periodic_table
    from chemicals.phase_change import Tm

    buf = io.StringIO()
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(["symbol", "mp_K", "source"])
    for element in periodic_table:
        if element.number > 96 or element.symbol in NOT_SOLID:
            continue
        value = Tm(element.CAS)
        if value is None:
            continue
        writer.writerow([element.symbol, f"{value:.2f}",
                         f"CRC Handbook via chemicals {chemicals.__version__} Tm({element.CAS})"])
    return buf.getvalue()


if __name__ == "__main__":
    text = build()
    if "--check" in sys.argv:
        sys.exit(0 if OUT.read_text() == text else 1)
    OUT.write_text(text)
