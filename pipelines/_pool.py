"""Worker side of multiprocess scoring: kept free of pyarrow and pandas so a
worker process only carries the scorer. A task is one list of formulas
(:func:`score_values`); how workers are started is in
:mod:`pipelines._workers`.
"""
from __future__ import annotations

from ionicity.scorer.columns import column_names
from ionicity.scorer.record import score_formula, score_row

__all__ = ["score_values", "warm_up"]


def score_values(texts: list) -> list[tuple]:
    """Score formulas; one tuple of values per formula, in
    :func:`scorer.columns.column_names` order."""
    out = []
    for text in texts:
        try:
            out.append(score_row(text))
        except Exception as exc:  # a scorer bug must not sink the whole table
            record = _failed_record(text, exc)
            out.append(tuple(record[name] for name in column_names()))
    return out


def _failed_record(text, exc: Exception) -> dict:
    from ionicity.scorer.record import empty_record

    record = empty_record()
    record["status"] = "error"
    record["message"] = (
        f"internal error while scoring {text!r}: {type(exc).__name__}: {exc}"
        " (a bug in ionicity; please report it)"
    )
    return record


_WARM = []


def warm_up() -> bool:
    """Load the scorer's data tables and the Madelung constants of every
    prototype now, rather than inside the first tasks; once per process (the
    forkserver does it once for all workers, see :mod:`pipelines._warm`).
    Returns whether this call did the work."""
    if _WARM:
        return False
    from ionicity.scorer.madelung import PROTOTYPES, madelung_details

    for text in ("NaCl", "CuSO4·5H2O", "[C4mim][BF4]", "Al2O3", "TiO2", "CaF2", "ZnS", "CsCl"):
        score_formula(text)
    for name in PROTOTYPES:
        madelung_details(name)
    _WARM.append(True)
    return True
