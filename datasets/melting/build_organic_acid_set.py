"""Rebuild ``organic_acids.csv``: the carboxylic and sulfonic acids of the CRC Handbook table, in two halves.

usage: python datasets/melting/build_organic_acid_set.py [--check]

Rows: every CAS number of the CRC Handbook organic table of the registry package ``chemicals``
(``chemicals.phase_change``, method ``CRC_ORG``) that has a melting point and that the package's PubChem
identifier tables (``chemical identifiers pubchem large.tsv``, then ``... small.tsv``) give a formula and a
SMILES for, when

* the SMILES is one molecule with one or more carboxylic or sulfonic acid groups and no basic nitrogen
  (:func:`ionicity.scorer.data.smiles_groups.acid_and_basic_groups`; a basic nitrogen makes a zwitterion,
  ``zwitterions.csv``);
* the formula holds only elements of :data:`ionicity.scorer.melting_organic.ORGANIC_ELEMENTS` and
  :func:`~ionicity.scorer.melting_organic.is_organic_molecule` says yes, with at most 60 atoms other than
  hydrogen;
The structure chooses the rows and gives ``acid_groups``, the term's count: the weight is per acid group,
fitted on the calibration half with the count the structure gives. ``scorer_reads_acid`` says whether the
scorer, which has only the formula, reads it as an organic acid with that many H(+)
(:func:`ionicity.scorer.melting.organic_acid_groups`: a library anion, as for acetic, benzoic, oxalic, citric
and stearic acid): the rows on which the term acts when a user types the formula. ``set``: ``calibration`` or ``validation`` by
:func:`ionicity.pipelines.melting_weights.open_set_half` of the formula as ``score_formula`` normalises it,
the rule of ``organic_molecules.csv``. No melting point is written: they are read at run time
(``chemicals.phase_change.Tm(cas, method="CRC_ORG")``). ``--check`` exits 1 when the file differs from a
rebuild.
"""
from __future__ import annotations

from pathlib import Path

from set_file import crc_organic_molecules, csv_text, normalised_half, write_or_check  # this folder's shared helpers

HERE = Path(__file__).resolve().parent
OUT = HERE / "organic_acids.csv"
# the melting point is read at run time: chemicals Tm(CAS, method="CRC_ORG"), the CRC Handbook of
# Chemistry and Physics, 95th ed., organic table (datasets/melting/README.md)
SOURCE = "chemicals CRC_ORG"
MAX_HEAVY_ATOMS = 60


def build() -> str:
    from ionicity.scorer.data.smiles_groups import acid_and_basic_groups, zwitterion
    from ionicity.scorer.formula import parse_formula
    from ionicity.scorer.ions import decompose
    from ionicity.scorer.melting import organic_acid_groups

    rows = []
    for cas, hill, smiles, name in crc_organic_molecules(MAX_HEAVY_ATOMS):
        acids, bases = acid_and_basic_groups(smiles) if "." not in smiles else (0, 0)
        if not acids or bases or zwitterion(smiles):
            continue
        read = "yes" if organic_acid_groups(decompose(parse_formula(hill))) == acids else "no"
        rows.append((hill, cas, name, acids, read, normalised_half(hill)))
    return csv_text(["formula", "cas", "name", "acid_groups", "scorer_reads_acid", "set", "source"],
                    ([hill, cas, name, str(n), read, split, SOURCE] for hill, cas, name, n, read, split in sorted(rows)))


if __name__ == "__main__":
    write_or_check(build(), OUT)
