"""What the set-building scripts of this folder share: the CSV text of their rows and the
``--check`` / write step (imported from the script's own folder, which Python puts first on
``sys.path`` when a script is run by its path)."""
from __future__ import annotations

import csv
import io
import sys
from pathlib import Path


def csv_text(header, rows) -> str:
    """The rows as CSV text, ``\\n`` line ends, header first."""
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow(header)
    writer.writerows(rows)
    return out.getvalue()


def write_or_check(text: str, path: Path, argv=None) -> None:
    """With ``--check``: exit 1 when ``path`` differs from ``text`` (or is missing), 0 when equal;
    else write ``text`` to ``path`` and say how many rows."""
    argv = sys.argv[1:] if argv is None else argv
    if argv == ["--check"]:
        sys.exit(0 if path.exists() and path.read_text(encoding="utf-8") == text else 1)
    path.write_text(text, encoding="utf-8")
    print(f"{text.count(chr(10)) - 1} rows written to {path}", file=sys.stderr)


def hill_counts(hill: str) -> dict[str, float]:
    """Element counts of a Hill formula as the identifier tables write it (``C2H6O``)."""
    import re

    counts: dict[str, float] = {}
    for symbol, n in re.findall(r"([A-Z][a-z]?)(\d*)", hill):
        counts[symbol] = counts.get(symbol, 0.0) + float(n or 1)
    return counts


def crc_organic_structures():
    """(the CRC Handbook organic table of the registry package ``chemicals`` with a melting point, {CAS: (Hill
    formula, SMILES)} from the package's PubChem identifier tables, large then small): what the organic set
    builders read."""
    import os

    import chemicals.identifiers as ident
    import chemicals.phase_change as pc

    pc.Tm("7732-18-5")  # loads the tables
    crc = pc.Tm_sources["CRC_ORG"]
    crc = crc[crc["Tm"].notna()]
    wanted = set(crc.index)
    folder = Path(os.path.dirname(ident.__file__)) / "Identifiers"
    found: dict[str, tuple[str, str]] = {}
    for name in ("chemical identifiers pubchem large.tsv", "chemical identifiers pubchem small.tsv"):
        with open(folder / name, encoding="utf-8") as handle:
            for line in handle:
                f = line.split("\t", 6)
                if len(f) > 5 and f[1] in wanted and f[1] not in found:
                    found[f[1]] = (f[2], f[4])
    return crc, found


def crc_organic_molecules(max_heavy_atoms: int) -> list[tuple[str, str, str, str]]:
    """(CAS, Hill formula, SMILES, name) of the CRC organic table's compounds with a PubChem formula and SMILES
    (:func:`crc_organic_structures`) whose formula is a plain Hill formula of an organic molecule
    (:func:`ionicity.scorer.melting_organic.is_organic_molecule`) with at most ``max_heavy_atoms`` atoms other
    than hydrogen: what the organic set builders choose among by the SMILES."""
    import re

    from ionicity.scorer.melting_organic import is_organic_molecule

    crc, found = crc_organic_structures()
    out = []
    for cas, (hill, smiles) in found.items():
        if not re.fullmatch(r"(?:[A-Z][a-z]?\d*)+", hill):
            continue
        counts = hill_counts(hill)
        if is_organic_molecule(counts) and sum(n for s, n in counts.items() if s != "H") <= max_heavy_atoms:
            out.append((cas, hill, smiles, str(crc.loc[cas, "Name"])))
    return out


def normalised_half(hill: str) -> str:
    """:func:`ionicity.pipelines.melting_weights.open_set_half` of a formula as ``score_formula`` normalises it
    (the split rule of the organic sets, so a formula in two of them falls in the same half of each)."""
    from ionicity.pipelines.melting_weights import open_set_half
    from ionicity.scorer.record import score_formula

    return open_set_half(score_formula(hill).get("formula_normalized") or hill)
