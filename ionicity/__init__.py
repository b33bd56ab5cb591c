"""ionicity: score tables of ionic compounds.

The documented Python API. The science lives in :mod:`ionicity.scorer` (pure,
importable alone); files, engines and the command line in
:mod:`ionicity.pipelines`. In the repository they are the folders
``scorer/`` and ``pipelines/``, installed under this package so that they
never collide with a user's own ``scorer`` or ``pipelines``.

>>> import ionicity
>>> ionicity.score_formula("NaCl")["status"]
'ok'

Every name loads on first use: ``import ionicity`` imports neither numpy
nor pyarrow, so that a worker process can set numpy's thread variables
before numpy loads (:mod:`ionicity.pipelines._warm`) and a command-line run
pays for pyarrow (about 0.2 s) only when it reads a table.
"""
from __future__ import annotations

import importlib

__all__ = [
    "FormulaDescriptors",
    "FormulaError",
    "InputError",
    "ParsedFormula",
    "ScoreConfig",
    "Summary",
    "explain",
    "madelung_constant",
    "parse_formula",
    "score_file",
    "score_formula",
    "score_table",
    "__version__",
]

__version__ = "0.1.0"

_LAZY = {
    "FormulaError": "ionicity.scorer.formula",
    "ParsedFormula": "ionicity.scorer.formula",
    "madelung_constant": "ionicity.scorer.madelung",
    "parse_formula": "ionicity.scorer.formula",
    "score_formula": "ionicity.scorer.record",
    "FormulaDescriptors": "ionicity.pipelines.transformer",
    "InputError": "ionicity.pipelines.errors",
    "ScoreConfig": "ionicity.pipelines.config",
    "Summary": "ionicity.pipelines.config",
    "explain": ("ionicity.pipelines.explain", "explain_formula"),
    "score_file": "ionicity.pipelines.run",
    "score_table": "ionicity.pipelines.table",
}


def __getattr__(name: str):
    if name in _LAZY:
        home = _LAZY[name]
        module, attribute = home if isinstance(home, tuple) else (home, name)
        return getattr(importlib.import_module(module), attribute)
    raise AttributeError(f"module 'ionicity' has no attribute {name!r}")


def __dir__():
    return sorted(set(globals()) | set(__all__))
