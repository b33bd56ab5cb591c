"""Every docstring example of the installed package runs as a test.

The examples are imported by their installed names (``ionicity.scorer...``):
collecting them from the source folders would load a second copy of each
module under the folder's name.
"""
from __future__ import annotations

import doctest
import importlib
import pkgutil

import pytest

# modules that need an optional extra, or run a command when imported
_OPTIONAL = {"ionicity.pipelines.dask_engine": "dask", "ionicity.pipelines.melting_fit": "sklearn"}
_SKIP = {"ionicity.__main__", "ionicity.pipelines.__main__"}


def _module_names() -> list[str]:
    # each subpackage is walked from its own path: an editable install maps
    # them from folders outside ionicity/
    names = ["ionicity"]
    for package in ("ionicity.scorer", "ionicity.pipelines"):
        names.append(package)
        path = importlib.import_module(package).__path__
        names += [info.name for info in pkgutil.walk_packages(path, prefix=package + ".")]
    return sorted(set(names) - _SKIP)


@pytest.mark.parametrize("name", _module_names())
def test_docstring_examples(name):
    if name in _OPTIONAL:
        pytest.importorskip(_OPTIONAL[name])
    module = importlib.import_module(name)
    result = doctest.testmod(module, optionflags=doctest.ELLIPSIS | doctest.NORMALIZE_WHITESPACE, verbose=False)
    assert result.failed == 0, f"{result.failed} docstring example(s) of {name} failed (run python -m doctest -v on it)"


def test_the_walk_finds_the_science_and_the_pipelines():
    names = _module_names()
    assert "ionicity.scorer.lattice" in names and "ionicity.pipelines.cli" in names
