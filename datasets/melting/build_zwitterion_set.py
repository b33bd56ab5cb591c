"""Rebuild ``zwitterions.csv``: the amino acids and other inner salts of the CRC Handbook table, in two halves.

usage: python datasets/melting/build_zwitterion_set.py [--check]

Rows: every CAS number of the CRC Handbook organic table of the registry package ``chemicals``
(``chemicals.phase_change``, method ``CRC_ORG``) that has a melting point and that the package's PubChem
identifier tables (``chemical identifiers pubchem large.tsv``, then ``... small.tsv``) give a formula and a
SMILES for, when

* the SMILES is one molecule that is a zwitterion in the solid (a basic nitrogen with a carboxylic or
  sulfonic acid, or its charges written: :func:`ionicity.scorer.data.smiles_groups.zwitterion`), the rule
  by which ``registry_names.csv`` marks a name ``zwitterion``;
* the formula holds only elements of :data:`ionicity.scorer.melting_organic.ORGANIC_ELEMENTS` and
  :func:`~ionicity.scorer.melting_organic.is_organic_molecule` says yes, with at most 60 atoms other than
  hydrogen.

The structure only chooses the rows, as it chooses the names the scorer reads as zwitterions. ``set``:
``calibration`` or ``validation`` by :func:`ionicity.pipelines.melting_weights.open_set_half` of the formula
as ``score_formula`` normalises it, the rule of ``organic_molecules.csv``, so an amino acid in both sets
falls in the same half of each. No melting point is written: they are read at run time
(``chemicals.phase_change.Tm(cas, method="CRC_ORG")``; many amino acids melt with decomposition, and the
table gives that temperature). ``--check`` exits 1 when the file differs from a rebuild.
"""
from __future__ import annotations

from pathlib import Path

from set_file import crc_organic_molecules, csv_text, normalised_half, write_or_check  # this folder's shared helpers

HERE = Path(__file__).resolve().parent
OUT = HERE / "zwitterions.csv"
# the melting point is read at run time: chemicals Tm(CAS, method="CRC_ORG"), the CRC Handbook of
# Chemistry and Physics, 95th ed., organic table (datasets/melting/README.md)
SOURCE = "chemicals CRC_ORG"
MAX_HEAVY_ATOMS = 60


def build() -> str:
    from ionicity.scorer.data.smiles_groups import zwitterion

    rows = [(hill, cas, name, normalised_half(hill)) for cas, hill, smiles, name in crc_organic_molecules(MAX_HEAVY_ATOMS)
            if zwitterion(smiles)]
    return csv_text(["formula", "cas", "name", "set", "source"],
                    ([hill, cas, name, split, SOURCE] for hill, cas, name, split in sorted(rows)))


if __name__ == "__main__":
    write_or_check(build(), OUT)
