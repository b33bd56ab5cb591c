"""The one exception a person is meant to read: :class:`InputError`.

Kept apart from the readers and writers (:mod:`ionicity.pipelines.io`, which
re-exports it) so that the command line and :mod:`ionicity.pipelines.config`
can name it without importing pyarrow.
"""
from __future__ import annotations

__all__ = ["InputError", "install_hint"]


class InputError(ValueError):
    """Unusable input or options; the message is one line meant for a person."""


def install_hint(extra: str, packages: str) -> str:
    """How to install an optional extra, from the package index and from a
    clone of the repository alike (``ionicity[...]`` alone would look the
    name up on the index, which a clone does not need).

    >>> install_hint("xlsx", "openpyxl")
    'pip install "ionicity[xlsx]" (from a clone: pip install -e ".[xlsx]"; or: pip install openpyxl)'
    """
    return f'pip install "ionicity[{extra}]" (from a clone: pip install -e ".[{extra}]"; or: pip install {packages})'
