"""The one exception a person is meant to read: :class:`InputError`.

Kept apart from the readers and writers (:mod:`ionicity.pipelines.io`, which
re-exports it) so that the command line and :mod:`ionicity.pipelines.config`
can name it without importing pyarrow.
"""
from __future__ import annotations

__all__ = ["InputError"]


class InputError(ValueError):
    """Unusable input or options; the message is one line meant for a person."""
