"""The report's one optional dependency, matplotlib (the ``report`` extra):
how to install it, and the check that says so (exit 2, one line). Light, so
the command line can check before it scores anything."""
from __future__ import annotations

import importlib.util

from ionicity.pipelines.errors import InputError

__all__ = ["INSTALL_HINT", "require_matplotlib", "matplotlib_missing"]

#: how to get matplotlib for the report, from a clone or from an index
INSTALL_HINT = 'pip install -e ".[report]" in a clone of ionicity (or: pip install "matplotlib>=3.7")'


def matplotlib_missing() -> bool:
    """True when matplotlib cannot be imported (without importing it)."""
    try:
        return importlib.util.find_spec("matplotlib") is None
    except ValueError:  # sys.modules["matplotlib"] is None: blocked on purpose
        return True


def require_matplotlib():
    """matplotlib, or an :class:`InputError` (exit 2) saying how to install it."""
    try:
        import matplotlib  # the optional report extra, imported when a report is drawn (about 0.3 s)
    except ImportError:
        raise InputError(f"the report draws its figures with matplotlib, which is not installed: {INSTALL_HINT}") from None
    return matplotlib
