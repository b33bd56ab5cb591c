"""Rebuild ``hydrogen_bonded_molecules.csv``: inorganic molecules with O-H or N-H groups, by CAS number.

usage: python datasets/melting/build_hydrogen_bonded_set.py [--check]

Rows: every CAS number of the CRC Handbook inorganic table of the registry package
``chemicals`` (``chemicals.phase_change``, method ``CRC_INORG``) that has a melting point
and that the package's identifier lookup (``chemicals.identifiers.search_chemical``) gives a
formula and a SMILES for, when

* the SMILES is one molecule (no ``.``) with no net charge (nitric acid is written with
  a charge-separated nitro group);
* the formula holds hydrogen and oxygen or nitrogen, and only the non-metals and
  metalloids of :data:`ELEMENTS` (no carbon, no D or T);
* ``score_formula`` sends it down the ``molecular`` route (``mp_route``), as a user's
  row of that formula would go.

The SMILES only chooses the rows; the scorer never sees it. ``set``: ``calibration`` or
``validation`` by :func:`ionicity.pipelines.melting_weights.open_set_half` of
``formula_normalized`` (from ``score_formula``); the molecular route's hydrogen-bond weight is
fitted on the calibration half alone. No melting point is written: they are read at run time (``chemicals.phase_change.Tm(cas, method="CRC_INORG")``).
``--check`` exits 1 when the file differs from a rebuild.
"""
from __future__ import annotations

import re
from pathlib import Path

from set_file import csv_text, write_or_check  # this folder's shared writer (see set_file.py)

HERE = Path(__file__).resolve().parent
OUT = HERE / "hydrogen_bonded_molecules.csv"
# the melting point is read at run time: chemicals Tm(CAS, method="CRC_INORG"), the CRC Handbook of
# Chemistry and Physics, 95th ed., inorganic table (datasets/melting/README.md)
SOURCE = "chemicals CRC_INORG"
ELEMENTS = frozenset("H B N O F Si P S Cl Ge As Se Br Sb Te I".split())
_CHARGE = re.compile(r"([+-])(\d*)\]")


def _net_charge(smiles: str) -> int:
    return sum((1 if sign == "+" else -1) * int(n or 1) for sign, n in _CHARGE.findall(smiles))


def build() -> str:
    import chemicals.phase_change as pc
    from chemicals.identifiers import search_chemical

    from ionicity.pipelines.melting_weights import open_set_half
    from ionicity.scorer.record import score_formula

    pc.Tm("7732-18-5")  # loads the tables
    crc = pc.Tm_sources["CRC_INORG"]
    crc = crc[crc["Tm"].notna()]
    rows = []
    for cas in sorted(crc.index):
        try:
            chem = search_chemical(cas)
        except Exception:  # noqa: BLE001 - the lookup raises several types for a missing CAS
            continue
        hill, smiles = chem.formula or "", chem.smiles or ""
        if not hill or not smiles or "." in smiles or _net_charge(smiles) or not re.fullmatch(r"(?:[A-Z][a-z]?\d*)+", hill):
            continue
        symbols = set(re.findall(r"[A-Z][a-z]?", hill))  # D and T (isotope labels) are not in ELEMENTS
        if "H" not in symbols or not {"O", "N"} & symbols or not symbols <= ELEMENTS:
            continue
        record = score_formula(hill)
        if record.get("mp_route") != "molecular":
            continue
        rows.append((hill, cas, str(crc.loc[cas, "Chemical"]), open_set_half(record["formula_normalized"])))
    return csv_text(["formula", "cas", "name", "set", "source"],
                    ([hill, cas, name, split, SOURCE] for hill, cas, name, split in sorted(rows)))


if __name__ == "__main__":
    write_or_check(build(), OUT)
