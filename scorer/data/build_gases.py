"""Rebuild ``gases.csv``: the formulas whose every registry compound boils below 25 C.

usage: python -m ionicity.scorer.data.build_gases [--check]

A molecular compound that melts below 25 C is ``liquid_at_room_temperature`` by its melting band; if it
also boils below 25 C it is a gas on the shelf (CO2, NH3, CH4, HCl, SO2, C3H8), and
:mod:`scorer.melting` calls it ``gas_at_room_temperature``. A formula does not say which isomer it is,
so a Hill formula is listed only when every compound of ``registry_names.csv`` with that formula has a
normal boiling point in the registry package ``chemicals`` (``chemicals.phase_change.Tb``: CRC Handbook,
Yaws and the other sources it ranks) and the highest of them is below 298.15 K: C2H6O (dimethyl ether
249 K, ethanol 351 K) is not listed. Formulas of more than one element that the registry lists only as
salts are left out too, and those with a compound whose registry melting point (``chemicals.phase_change.Tm``)
is 25 C or more (a gas at 25 C melts below it; telluric acid has a 273 K boiling point in the registry), and formulas of more than ``MAX_GAS_ATOMS`` atoms (the registry's boiling points
for two such are wrong). Columns: ``formula`` (Hill order), ``boiling_point_K`` (the highest over the
formula's compounds, rounded to 0.1 K), ``name`` and ``cas`` (the compound with that boiling point), and
``source``. Cl2 and F2, whose names the name reader reads itself, are added by CAS number. ``--check`` exits 1 when the file differs from a rebuild.
"""
from __future__ import annotations

import csv
import io
import sys
from collections import defaultdict
from pathlib import Path

HERE = Path(__file__).resolve().parent
OUT = HERE / "gases.csv"
ROOM_TEMPERATURE_K = 298.15
# the most atoms a molecule has that boils below 25 C (C4F10, C4H10: 14); the two larger formulas the registry
# puts below 25 C, 2-butanone peroxide (C8H18O6) and a triethoxy(chloropropyl)silane (C9H21ClO3Si), boil far
# above it (common practice): MAX_GAS_ATOMS keeps such values out and lets the scorer skip larger formulas
MAX_GAS_ATOMS = 16
# elements that are gases as diatomic molecules and that registry_names.csv does not hold, by CAS number
_ELEMENT_GASES = {"Cl2": ("Chlorine", "7782-50-5"), "F2": ("Fluorine", "7782-41-4")}


def build() -> str:
    from chemicals.phase_change import Tb, Tm

    from ionicity.scorer.formula import parse_formula

    by_formula: dict[str, list[tuple[float | None, str, str, str]]] = defaultdict(list)
    solid = set()
    with open(HERE / "registry_names.csv", encoding="utf-8", newline="") as fh:
        for row in csv.DictReader(fh):
            try:
                tb = Tb(row["cas"])
            except Exception:  # the registry raises on CAS numbers it has never seen
                tb = None
            try:
                tm = Tm(row["cas"])
            except Exception:
                tm = None
            if tm is not None and tm == tm and tm >= ROOM_TEMPERATURE_K:
                # a gas at 25 C melts below it: a registry melting point at or above 25 C (telluric acid, Tm
                # listed far above the 273 K boiling point the registry also gives it) marks the boiling point
                # as wrong, and the formula stays off the list
                solid.add(row["formula"])
            by_formula[row["formula"]].append((tb, row["name"], row["cas"], row["kind"]))
    for formula, (name, cas) in _ELEMENT_GASES.items():
        # the diatomic halogens: the name reader reads their names itself, so the names table leaves them out
        if formula not in by_formula:
            by_formula[formula].append((Tb(cas), name, cas, "molecule"))
    rows = []
    for formula, entries in sorted(by_formula.items()):
        if any(kind == "salt" for *_, kind in entries) or formula in solid:
            continue
        if sum(n for _, n in parse_formula(formula).counts) > MAX_GAS_ATOMS:
            continue  # a molecule this large boils far above 25 C: the registry's value is wrong
        boiling = [tb for tb, *_ in entries]
        if any(tb is None or tb != tb for tb in boiling) or max(boiling) >= ROOM_TEMPERATURE_K:
            continue
        tb, name, cas, _ = max(entries, key=lambda e: e[0])
        rows.append((formula, f"{tb:.1f}", name, cas,
                     "chemicals.phase_change.Tb (CRC Handbook and the sources the package ranks), every compound"
                     " of registry_names.csv with this formula"))
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow(("formula", "boiling_point_K", "name", "cas", "source"))
    writer.writerows(rows)
    return out.getvalue()


def main() -> int:
    text = build()
    if "--check" in sys.argv:
        current = OUT.read_text(encoding="utf-8") if OUT.exists() else ""
        if current != text:
            print("gases.csv is stale: run python -m ionicity.scorer.data.build_gases", file=sys.stderr)
            return 1
        return 0
    OUT.write_text(text, encoding="utf-8")
    print(f"wrote {OUT} ({text.count(chr(10)) - 1} rows)", file=sys.stderr)
    return 0


if __name__ == "__main__":
    sys.exit(main())
