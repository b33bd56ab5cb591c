"""Every cache of the scorer, registered in one place.

Two kinds:

* :func:`per_input`: results computed from one input (a formula text, a set of
  ions, a decomposition), bounded in size. Scoring a table asks for the same
  salts, ions and spellings again and again; these caches make that cost one
  computation per distinct input.
* :func:`once`: data tables and constants loaded or built once per process
  (the data policy: every table loads lazily, once).

:func:`clear_all` empties them (the per-input kind by default), for tests
that need a cold start and for the benchmark's per-row baseline, which must
score every row from scratch; :func:`registered` names them.

>>> @per_input(maxsize=8)
... def square(x):
...     return x * x
>>> square(3), square.cache_info().currsize
(9, 1)
>>> "scorer.caching.square" in clear_all() or "ionicity.scorer.caching.square" in clear_all()
True
>>> square.cache_info().currsize
0
"""
from __future__ import annotations

import functools
from typing import Callable

__all__ = ["per_input", "once", "clear_all", "registered"]

_REGISTRY: dict[str, list[Callable]] = {"per_input": [], "once": []}


def per_input(maxsize: int = 65536):
    """Decorator: a bounded least-recently-used cache of a function of one input."""

    def wrap(function):
        cached = functools.lru_cache(maxsize=maxsize)(function)
        _REGISTRY["per_input"].append(cached)
        return cached

    return wrap


def once(function):
    """Decorator: compute once per process (a data table, a constant)."""
    cached = functools.cache(function)
    _REGISTRY["once"].append(cached)
    return cached


def clear_all(kind: str = "per_input") -> list[str]:
    """Empty every registered cache of ``kind`` (``"per_input"``, ``"once"`` or
    ``"all"``) in the modules imported so far; returns their names."""
    kinds = tuple(_REGISTRY) if kind == "all" else (kind,)
    for k in kinds:
        if k not in _REGISTRY:
            raise ValueError(f"unknown cache kind {kind!r}; use one of: per_input, once, all")
    cleared = []
    for k in kinds:
        for function in _REGISTRY[k]:
            function.cache_clear()
            cleared.append(f"{function.__module__}.{function.__qualname__}")
    return cleared


def registered(kind: str = "per_input") -> list[str]:
    """Names of the registered caches of ``kind``, as ``module.function``."""
    kinds = tuple(_REGISTRY) if kind == "all" else (kind,)
    return [f"{f.__module__}.{f.__qualname__}" for k in kinds for f in _REGISTRY[k]]
