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


# the elements that are gases or liquids at 25 C, as the substances a formula cell names (O2, Hg): their own
# melting points, for a row that is the element itself (the rule of mixtures still leaves them out); He has no
# melting point at 1 atm; P's allotropes disagree, so only P4, the white one, is listed
FLUID_OUT = Path(__file__).with_name("fluid_element_melting_points.csv")
FLUID_SUBSTANCES = (("H2", "1333-74-0"), ("N2", "7727-37-9"), ("O2", "7782-44-7"), ("O3", "10028-15-6"),
                    ("F2", "7782-41-4"), ("Cl2", "7782-50-5"), ("Br2", "7726-95-6"), ("Ne", "7440-01-9"),
                    ("Ar", "7440-37-1"), ("Kr", "7439-90-9"), ("Xe", "7440-63-3"), ("Rn", "10043-92-2"),
                    ("Hg", "7439-97-6"),
                    # white phosphorus written as its molecule: P alone names no allotrope (red P sublimes
                    # hundreds of kelvin higher), P4 names the white one
                    ("P4", "12185-10-3"))


def build_fluid() -> str:
    import chemicals
    from chemicals.phase_change import Tm, Tm_methods

    buf = io.StringIO()
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(["substance", "mp_K", "source"])
    for substance, cas in FLUID_SUBSTANCES:
        crc = "CRC_INORG" in (Tm_methods(cas) or ())
        value = Tm(cas, method="CRC_INORG") if crc else Tm(cas)
        where = f"Tm({cas}, method='CRC_INORG')" if crc else f"Tm({cas})"
        writer.writerow([substance, f"{value:.2f}",
                         f"{'CRC Handbook' if crc else 'default source'} via chemicals {chemicals.__version__} {where}"])
    return buf.getvalue()


if __name__ == "__main__":
    text, fluid = build(), build_fluid()
    if "--check" in sys.argv:
        sys.exit(0 if OUT.read_text() == text and FLUID_OUT.read_text() == fluid else 1)
    OUT.write_text(text)
    FLUID_OUT.write_text(fluid)
