"""Rebuild ``inorganic_formulas.csv``: every formula without carbon-hydrogen that the registry's identifier tables list.

usage: python -m ionicity.scorer.data.build_inorganic_formulas [--check]

``registry_names.csv`` holds the compounds the registry package ``chemicals`` names in its CRC Handbook tables
and its small PubChem table; many real inorganic compounds are missing there (NbCl3, ThF3, KO2, K2MnO4,
LiNiO2). This file lists the Hill formula of every entry of the package's identifier tables
(``Identifiers/Inorganic db.tsv``, ``chemical identifiers pubchem large.tsv`` and ``... small.tsv``) that is
neutral, written in element symbols and counts only, and holds no carbon with hydrogen (organic formulas are
too many and the tables hold a small share of them). Formulas only: no name, number or property. The scorer
asks it (:func:`scorer.registry_formulas.inorganic_formula_listed`) before it warns that no compound of a
formula is listed (a count lost: SO4, H2SO, PbCl3, Cu(NO3)). ``--check`` exits 1 when the file differs from a
rebuild.
"""
from __future__ import annotations

import io
import os
import re
import sys
from pathlib import Path

OUT = Path(__file__).resolve().with_name("inorganic_formulas.csv")
TABLES = ("Inorganic db.tsv", "chemical identifiers pubchem large.tsv", "chemical identifiers pubchem small.tsv")
_HILL = re.compile(r"(?:[A-Z][a-z]?\d*)+")
_SYMBOL = re.compile(r"[A-Z][a-z]?")


def build() -> str:
    import chemicals
    import chemicals.identifiers as identifiers

    folder = Path(os.path.dirname(identifiers.__file__)) / "Identifiers"
    found = set()
    for name in TABLES:
        with open(folder / name, encoding="utf-8") as handle:
            for line in handle:
                fields = line.rstrip("\n").split("\t")
                if len(fields) < 3 or not _HILL.fullmatch(fields[2]):
                    continue
                symbols = set(_SYMBOL.findall(fields[2]))
                if not {"C", "H"} <= symbols:
                    found.add(fields[2])
    out = io.StringIO()
    out.write("formula,source\n")
    source = f"chemicals {chemicals.__version__} identifiers"
    for formula in sorted(found):
        out.write(f"{formula},{source}\n")
    return out.getvalue()


def main(argv=None) -> int:
    argv = sys.argv[1:] if argv is None else argv
    text = build()
    if "--check" in argv:
        current = OUT.read_text(encoding="utf-8") if OUT.exists() else ""
        if current != text:
            print(f"{OUT.name} is stale: run python -m ionicity.scorer.data.build_inorganic_formulas", file=sys.stderr)
            return 1
        return 0
    OUT.write_text(text, encoding="utf-8")
    print(f"wrote {OUT}", file=sys.stderr)
    return 0


if __name__ == "__main__":
    sys.exit(main())
