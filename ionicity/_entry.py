"""The command's entry point, kept light so that it is loaded before anything heavy.

Importing the command line takes a noticeable moment (numpy, pyarrow and the
scorer's tables); a Ctrl-C or SIGTERM in that moment must end like any other
interruption (exit 130, one line, no traceback), which only code that runs
before those imports can promise.
"""
from __future__ import annotations

import os
import signal
import sys

_INTERRUPTED = "ionicity: interrupted; no output was written"


_SIGNALLED: list[int] = []


def _terminate_as_interrupt(signum, frame):
    _SIGNALLED.append(signum)
    raise KeyboardInterrupt


def main() -> None:
    signal.signal(signal.SIGTERM, _terminate_as_interrupt)
    # Ctrl-C during the imports is noted here: a KeyboardInterrupt raised inside
    # numpy's C-extension import comes out as an ImportError, which must still
    # end as an interruption, not as a traceback with exit 1
    previous = signal.getsignal(signal.SIGINT)
    if previous is signal.default_int_handler:
        signal.signal(signal.SIGINT, _terminate_as_interrupt)
    try:
        from ionicity.pipelines.cli import entry_point

        if previous is signal.default_int_handler:
            signal.signal(signal.SIGINT, previous)
    except BaseException:
        if not _SIGNALLED:
            raise
        if sys.stderr is not None:
            print(_INTERRUPTED, file=sys.stderr, flush=True)
        os._exit(130)  # half-imported modules are not worth a clean shutdown
    entry_point()
