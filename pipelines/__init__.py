"""ionicity's batch side: table I/O, engines and the command line.

``score_table`` scores a pandas DataFrame; ``score_file`` streams a CSV, TSV
or Parquet file (or a folder of Parquet parts) into another. Both add the
columns of ``ionicity.scorer.columns.output_columns()``.

Names are imported on first use, so ``import ionicity.pipelines`` (and each worker
process) does not pay for pyarrow until it is needed.
"""
from __future__ import annotations

import importlib

__all__ = ["ScoreConfig", "Summary", "InputError", "score_file", "score_table"]

_HOMES = {
    "ScoreConfig": "ionicity.pipelines.config",
    "Summary": "ionicity.pipelines.config",
    "score_file": "ionicity.pipelines.run",
    "score_table": "ionicity.pipelines.table",
    "InputError": "ionicity.pipelines.errors",
}


def __getattr__(name: str):
    if name in _HOMES:
        return getattr(importlib.import_module(_HOMES[name]), name)
    raise AttributeError(f"module 'pipelines' has no attribute {name!r}")


def __dir__():
    return sorted(list(globals()) + __all__)
