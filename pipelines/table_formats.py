"""Table formats by file name: which extension is which format.

Light on purpose (no pyarrow): the command line and the engines ask for a
path's format before anything heavy is imported.
"""
from __future__ import annotations

from pathlib import Path

from ionicity.pipelines.errors import InputError

__all__ = ["FORMATS", "format_of"]

FORMATS = {".csv": "csv", ".tsv": "tsv", ".tab": "tsv", ".txt": "tsv", ".parquet": "parquet", ".pq": "parquet",
           ".xlsx": "xlsx"}


def format_of(path: str) -> str:
    """The table format named by a path's extension (``-`` is CSV).

    >>> format_of("samples.TSV"), format_of("-"), format_of("parts/*.parquet")
    ('tsv', 'csv', 'parquet')
    """
    if path == "-":
        return "csv"
    p = Path(path)
    if p.is_dir():
        return "parquet"
    suffix = p.suffix.lower()
    if suffix in FORMATS:
        return FORMATS[suffix]
    if any(ch in path for ch in "*?["):
        return "parquet"
    raise InputError(f"cannot tell the format of {path!r} from its extension; use .csv, .tsv, .parquet or .xlsx")
