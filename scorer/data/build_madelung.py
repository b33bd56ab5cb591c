"""Build ``scorer/data/madelung_prototypes.csv``: the Ewald sums of the
built-in structure prototypes (:data:`scorer.madelung.PROTOTYPES`).

Run ``python -m ionicity.scorer.data.build_madelung`` to rewrite the snapshot, or
``python -m ionicity.scorer.data.build_madelung --check`` to compare it with a fresh
computation (exit status 1 when they differ beyond 1e-12 relative).

The values are this project's own computation
(:func:`scorer.madelung.ewald_details`), kept in a file only because every
scoring process needs them and the sums take about 0.1 s; floats are written
with ``repr`` so they read back exactly.
"""
from __future__ import annotations

import argparse
import csv
import io
import math
import sys
from pathlib import Path

from ionicity.scorer.madelung import (
    _SNAPSHOT_FIELDS,
    PROTOTYPE_SNAPSHOT_FILE,
    PROTOTYPES,
    ewald_details,
    prototype_structure,
)

OUT = Path(__file__).with_name(PROTOTYPE_SNAPSHOT_FILE)
SOURCE = "Ewald sum by scorer.madelung.ewald_details (this project); geometry as in scorer.madelung.prototype_structure"


def build() -> str:
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(("prototype", *_SNAPSHOT_FIELDS, "source"))
    for name in PROTOTYPES:
        result = ewald_details(prototype_structure(name))
        writer.writerow((name, *(repr(getattr(result, f)) for f in _SNAPSHOT_FIELDS), SOURCE))
    return buffer.getvalue()


def differences(fresh: str, stored: str, rel: float = 1e-12) -> list[str]:
    """Rows or values that differ between two builds (floats to ``rel``)."""
    a = list(csv.DictReader(fresh.splitlines()))
    b = list(csv.DictReader(stored.splitlines()))
    if [r["prototype"] for r in a] != [r["prototype"] for r in b]:
        return ["the prototypes differ"]
    out = []
    for x, y in zip(a, b):
        for f in _SNAPSHOT_FIELDS:
            u, v = float(x[f]), float(y[f])
            same = (math.isnan(u) and math.isnan(v)) or math.isclose(u, v, rel_tol=rel, abs_tol=0.0)
            if not same:
                out.append(f"{x['prototype']}.{f}: computed {u!r}, stored {v!r}")
    return out


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--check", action="store_true", help="compare with the stored file instead of writing it")
    args = parser.parse_args(argv)
    fresh = build()
    if args.check:
        problems = differences(fresh, OUT.read_text(encoding="utf-8"))
        for line in problems:
            print(line, file=sys.stderr)
        return 1 if problems else 0
    OUT.write_text(fresh, encoding="utf-8")
    return 0


if __name__ == "__main__":
    sys.exit(main())
