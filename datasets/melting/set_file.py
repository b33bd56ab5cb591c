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
