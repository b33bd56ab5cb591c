"""What a written table says about how it was made: Parquet key-value
metadata (:func:`provenance_metadata`) with the ionicity version, the data
snapshots (the element snapshot's mendeleev version and a digest of every
packaged table) and the options of the run. The local and the Dask engine
write the same.
"""
from __future__ import annotations

import json
from dataclasses import asdict

from ionicity.pipelines.config import ScoreConfig
from ionicity.scorer import __version__
from ionicity.scorer.elements import snapshot_info
from ionicity.scorer.tables import digests

__all__ = ["provenance_metadata"]


def _data_versions() -> dict:
    info = snapshot_info()
    tables = {name: "sha256:" + digest[:16] for name, digest in sorted(digests().items())}
    return {
        "elements_snapshot": {
            "mendeleev_version": info.get("mendeleev_version"),
            "format_version": info.get("format_version"),
        },
        "tables": tables,
    }


def provenance_metadata(config: ScoreConfig, formula_col: str) -> dict[str, str]:
    """Parquet key-value metadata: ionicity version, data snapshot versions
    (the element snapshot's mendeleev version and a digest of every packaged
    table) and the options of the run."""
    options = {k: v for k, v in asdict(config).items() if k not in ("output", "quiet", "overwrite")}
    options["formula_col"] = formula_col
    return {
        "ionicity.version": __version__,
        "ionicity.data_versions": json.dumps(_data_versions(), sort_keys=True),
        "ionicity.options": json.dumps(options, sort_keys=True),
    }
