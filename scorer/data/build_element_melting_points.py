"""Rebuild ``element_melting_points.csv`` from the installed ``chemicals`` package.

usage: python -m ionicity.scorer.data.build_element_melting_points [--check]

Melting points of the elements that are solids at 25 C (H, N, O, F, Cl, Br, I,
noble gases and Hg, liquid or gaseous, and P, whose allotropes melt
hundreds of kelvin apart, are left out: the rule of mixtures of
:func:`scorer.melting_routes.element_mixture_melting_K` skips them), read with
``chemicals.phase_change.Tm`` from the CRC Handbook table (``method="CRC_INORG"``)
where it has the element, else the package's default source (its default
prefers another table, which puts sulfur at 286 K against the CRC's 388 K).
Iodine is read as I2 (CAS 7553-56-2): the atom's CAS number has only an estimate.
Elements above Cm are left out (no measured values).
"""
from __future__ import annotations

import csv
import io
import sys
from pathlib import Path

OUT = Path(__file__).with_name("element_melting_points.csv")
# P: the table mixes allotropes (white P melts at 317 K, red P near 860 K): left out
NOT_SOLID = {"P", "H", "He", "N", "O", "F", "Ne", "Cl", "Ar", "Br", "Kr", "Xe", "Rn", "Hg", "Fr", "At"}
# the substance's CAS number where the element's own is not the solid's (iodine is I2)
SUBSTANCE_CAS = {"I": "7553-56-2"}


def build() -> str:
    # chemicals is the optional melting extra, needed only to rebuild (about 1 s to import, measured)
    import chemicals
    from chemicals.elements import periodic_table
    from chemicals.phase_change import Tm, Tm_methods

    buf = io.StringIO()
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(["symbol", "mp_K", "source"])
    for element in periodic_table:
        if element.number > 96 or element.symbol in NOT_SOLID:
            continue
        cas = SUBSTANCE_CAS.get(element.symbol, element.CAS)
        crc = "CRC_INORG" in (Tm_methods(cas) or ())
        value = Tm(cas, method="CRC_INORG") if crc else Tm(cas)
        if value is None:
            continue
        where = f"Tm({cas}, method='CRC_INORG')" if crc else f"Tm({cas})"
        writer.writerow([element.symbol, f"{value:.2f}",
                         f"{'CRC Handbook' if crc else 'default source'} via chemicals {chemicals.__version__} {where}"])
    return buf.getvalue()


if __name__ == "__main__":
    text = build()
    if "--check" in sys.argv:
        sys.exit(0 if OUT.read_text() == text else 1)
    OUT.write_text(text)
