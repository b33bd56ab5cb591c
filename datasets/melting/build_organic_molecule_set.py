"""Rebuild ``organic_molecules.csv``: organic molecules of the CRC Handbook table by CAS number, in two halves.

usage: python datasets/melting/build_organic_molecule_set.py [--check]

Rows: every CAS number of the CRC Handbook organic table of the registry package
``chemicals`` (``chemicals.phase_change``, method ``CRC_ORG``) that has a melting point
and that the package's PubChem identifier tables (``chemical identifiers pubchem
large.tsv``, then ``... small.tsv``) give a formula and a SMILES for, when

* the SMILES is one neutral molecule (no ``.``, no charged atom);
* the formula holds only elements of :data:`ionicity.scorer.melting_organic.ORGANIC_ELEMENTS`
  and :func:`~ionicity.scorer.melting_organic.is_organic_molecule` says yes;
* it has at most 60 atoms other than hydrogen;
* ``score_formula`` sends it down the ``molecular`` route (``mp_route``), as a user's
  row of that formula would go (formulas the ion solver reads as a salt, such as
  some amino acids and amines, are left out: their route is the salt index's).

The SMILES only chooses the rows; the scorer never sees it. ``set``: ``calibration``
or ``validation`` by :func:`ionicity.pipelines.melting_weights.open_set_half` of
``formula_normalized`` (from ``score_formula``), so every isomer of a formula falls in the same half. No
melting point is written: they are read at run time
(``chemicals.phase_change.Tm(cas, method="CRC_ORG")``). ``--check`` exits 1 when the
file differs from a rebuild.
"""
from __future__ import annotations

import re
from pathlib import Path

from set_file import crc_organic_structures, csv_text, hill_counts, write_or_check  # this folder's shared helpers

HERE = Path(__file__).resolve().parent
OUT = HERE / "organic_molecules.csv"
# the melting point is read at run time: chemicals Tm(CAS, method="CRC_ORG"), the CRC Handbook of
# Chemistry and Physics, 95th ed., organic table (datasets/melting/README.md)
SOURCE = "chemicals CRC_ORG"
MAX_HEAVY_ATOMS = 60
_CHARGED = re.compile(r"[+-]\d*\]")


def build() -> str:
    from ionicity.pipelines.melting_weights import open_set_half
    from ionicity.scorer.melting_organic import is_organic_molecule
    from ionicity.scorer.record import score_formula

    crc, found = crc_organic_structures()
    rows = []
    for cas, (hill, smiles) in found.items():
        if "." in smiles or _CHARGED.search(smiles) or not re.fullmatch(r"(?:[A-Z][a-z]?\d*)+", hill):
            continue
        counts = hill_counts(hill)
        if not is_organic_molecule(counts) or sum(n for s, n in counts.items() if s != "H") > MAX_HEAVY_ATOMS:
            continue
        record = score_formula(hill)
        if record.get("mp_route") != "molecular":
            continue
        normalized = record["formula_normalized"]
        rows.append((hill, cas, str(crc.loc[cas, "Name"]), open_set_half(normalized)))
    return csv_text(["formula", "cas", "name", "set", "source"],
                    ([hill, cas, name, split, SOURCE] for hill, cas, name, split in sorted(rows)))


if __name__ == "__main__":
    write_or_check(build(), OUT)
