"""Rebuild ``datasets/melting/wikidata_salts.csv`` from the installed ``chemicals`` package.

Only the package's WIKIDATA melting-point table is read: Wikidata's data are
dedicated to the public domain under CC0 1.0. The handbook-derived tables
(CRC) of the same package are never copied here. The rows go through the
same screen as ``ionicity fit-melting`` (anhydrous, charge-balanced salts
whose name and formula agree).

    python datasets/melting/build_fixture.py            # rewrite the file
    python datasets/melting/build_fixture.py --check    # exit 1 if it is stale
"""
from __future__ import annotations

import csv
import io
import sys
from pathlib import Path

HERE = Path(__file__).resolve().parent
TARGET = HERE / "wikidata_salts.csv"
COLUMNS = ("formula", "formula_normalized", "mp_K", "cas", "name", "anion_family", "cation_element", "source")


def build_text() -> str:
    sys.path.insert(0, str(HERE.parents[1]))
    from ionicity.pipelines.melting_data import build_open_training_set

    data = build_open_training_set(sources=("WIKIDATA",))
    source = f"Wikidata (CC0 1.0) via the WIKIDATA melting-point table of {data.info['chemicals_version'].join(('chemicals ', ''))}"
    out = io.StringIO()
    writer = csv.DictWriter(out, fieldnames=COLUMNS, extrasaction="ignore", lineterminator="\n")
    writer.writeheader()
    for row in sorted(data.rows, key=lambda r: r["formula_normalized"]):
        writer.writerow({**row, "mp_K": f"{row['mp_K']:.2f}", "source": source})
    return out.getvalue()


def main(argv: list[str]) -> int:
    text = build_text()
    if "--check" in argv:
        current = TARGET.read_text(encoding="utf-8") if TARGET.exists() else ""
        if current != text:
            print(f"{TARGET} is stale: rerun python datasets/melting/build_fixture.py", file=sys.stderr)
            return 1
        return 0
    TARGET.write_text(text, encoding="utf-8")
    print(f"wrote {TARGET} ({text.count(chr(10)) - 1} rows)")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
