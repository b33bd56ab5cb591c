"""Rebuild ``intermetallic_compounds.csv``: registry intermetallics by CAS number, split in two halves.

usage: python datasets/melting/build_intermetallic_set.py [--check]

Rows: every compound of the identifier tables of the registry package ``chemicals``
(``Inorganic db.tsv`` and ``chemical identifiers pubchem large.tsv``) that the audit's
strata (``tests/audit_inorganic_sample.py``) call intermetallic, boride/silicide/pnictide,
hydride or carbide, that ionicity reads as ``intermetallic`` and that has a melting point
(``chemicals.phase_change.Tm``), leaving out every row of the audit's half B (its formula or
CAS number), which stays validation of the audit only. ``set``: ``calibration`` or
``validation`` by :func:`ionicity.pipelines.melting_weights.open_set_half` of
``formula_normalized``. No melting point is written: they are read at run time.
``--check`` exits 1 when the file differs from a rebuild.
"""
from __future__ import annotations

import os
import re
import sys
from pathlib import Path

from set_file import csv_text, write_or_check  # this folder's shared writer (see set_file.py)

HERE = Path(__file__).resolve().parent
OUT = HERE / "intermetallic_compounds.csv"
sys.path.insert(0, str(HERE.parents[1] / "tests"))  # the audit's strata and halves live beside the tests

import audit_inorganic_sample as audit  # noqa: E402

STRATA = ("intermetallic", "boride_silicide_pnictide", "hydride", "carbide")
# registry values that are not the compound's melting point, left out with the reason
EXCLUDED = {"AlB3": "registry 209 K is no boride's melting point (AlB12 melts at 2343 K, chemicals Tm)"}
SOURCE = "melting point read at run time: chemicals Tm(CAS) (CRC Handbook)"


def build() -> str:
    import chemicals.identifiers as ident
    from chemicals.phase_change import Tm
    from ionicity.pipelines.melting_weights import open_set_half
    from ionicity.scorer.record import score_formula

    half_b = set()
    for row in audit.read_audit():
        if row["half"] == "B":
            half_b |= {row["cas"], row["formula"]}
    folder = Path(os.path.dirname(ident.__file__)) / "Identifiers"
    seen, rows = set(), {}
    for name in ("Inorganic db.tsv", "chemical identifiers pubchem large.tsv"):
        with open(folder / name, encoding="utf-8") as handle:
            for line in handle:
                f = line.rstrip("\n").split("\t")
                if len(f) < 8 or not f[2] or "+" in f[2] or "-" in f[2]:
                    continue
                cas, hill, smiles = f[1], f[2], f[4]
                if cas in seen or not re.fullmatch(r"(?:[A-Z][a-z]?\d*)+", hill):
                    continue
                seen.add(cas)
                counts = audit._counts(hill)
                if "C" in counts and set(counts) - {"C"} - audit.METALS:
                    continue
                if audit.stratum(counts, smiles) not in STRATA or cas in half_b or hill in half_b:
                    continue
                if Tm(cas) is None:
                    continue
                record = score_formula(hill)
                if record["substance_class"] != "intermetallic" or record["formula_normalized"] in rows:
                    continue
                normalized = record["formula_normalized"]
                split = "excluded" if hill in EXCLUDED else open_set_half(normalized)
                rows[normalized] = (hill, cas, split, EXCLUDED.get(hill, ""))
    return csv_text(["formula", "formula_normalized", "cas", "set", "note", "source"],
                    ([hill, normalized, cas, split, note, SOURCE]
                     for normalized, (hill, cas, split, note) in sorted(rows.items())))


if __name__ == "__main__":
    write_or_check(build(), OUT)
