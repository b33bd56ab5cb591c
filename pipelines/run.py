"""One scoring run of a file, whichever engine: :func:`score_file`.

It turns the caller's arguments into a checked
:class:`~ionicity.pipelines.config.ScoreConfig` and hands the run to the
local engine (:func:`~ionicity.pipelines.local_engine.score_file_local`) or
to the Dask engine (:func:`~ionicity.pipelines.dask_engine.score_file_dask`).
Neither engine imports this module, so there is no import circle.
"""
from __future__ import annotations

from ionicity.pipelines.audit_summary import AuditTally, check_summary_path
from ionicity.pipelines.config import ScoreConfig, Summary
from ionicity.pipelines.dask_engine import score_file_dask
from ionicity.pipelines.local_engine import score_file_local

__all__ = ["score_file"]


def score_file(config: ScoreConfig | str, output: str | None = None, **options) -> Summary:
    """Score a CSV, TSV or Parquet file into another, streaming in batches.

    ``score_file("in.csv", "out.parquet", formula_col="smiles_free_formula")``
    or ``score_file(ScoreConfig(...))``. Raises :class:`InputError` for
    unusable input or options; nothing is written at the output path then.
    With ``engine="dask"`` the work goes to
    :func:`ionicity.pipelines.dask_engine.score_file_dask`.

    See Also
    --------
    score_table : the same columns for a pandas DataFrame in memory.
    """
    if not isinstance(config, ScoreConfig):
        config = ScoreConfig(input=config, output=output if output is not None else "-", **options)
    config.validate()
    if config.summary is None:
        return score_file_dask(config) if config.engine == "dask" else score_file_local(config)
    check_summary_path(config.summary, config.output, config.overwrite)
    tally = AuditTally(config.formula_col or "", config.prefix, config.name_col)
    if config.engine == "dask":
        summary = score_file_dask(config)
        tally.add_table_file(config.output)
    else:
        summary = score_file_local(config, tally=tally)
    tally.write(config.summary)
    return summary
