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

INTERRUPTED_NOTHING_WRITTEN = "ionicity: interrupted; no output was written"


_SIGNALLED: list[int] = []


def _terminate_as_interrupt(signum, frame):
    _SIGNALLED.append(signum)
    raise KeyboardInterrupt


def interrupt_on(signum: int) -> None:
    """Make ``signum`` (SIGINT, SIGTERM) raise KeyboardInterrupt in the main
    thread and be noted for :func:`interrupted`."""
    signal.signal(signum, _terminate_as_interrupt)


def interrupted() -> bool:
    """Whether a Ctrl-C or SIGTERM reached this process since the entry point
    started. A run asks this as well as catching KeyboardInterrupt: the
    exception can be raised where it cannot propagate (a weak-reference
    callback of the import system, a finaliser: printed as "Exception
    ignored" and dropped) or be swallowed by a library, and an interrupted
    run must not then finish as if it had not been (seen: 2 of 200 Ctrl-Cs
    sent in the first second of a large run on a loaded machine ended in exit
    0 with the output written, and one in 240 in a module lock's callback)."""
    return bool(_SIGNALLED)


def _quiet_about_interrupts(unraisable) -> None:
    """``sys.unraisablehook``: an interruption raised where Python cannot let
    it propagate (a weak-reference callback of the import system, a
    finaliser) would be printed as "Exception ignored" with a traceback and
    dropped. It is noted (:func:`interrupted`), and the run stops at its next
    check (:func:`stop_if_interrupted`); say nothing here. Anything else goes
    to the hook that was there."""
    if issubclass(unraisable.exc_type, KeyboardInterrupt) and _SIGNALLED:
        return
    _PREVIOUS_HOOK[0](unraisable)


_PREVIOUS_HOOK = [sys.unraisablehook]


def stop_if_interrupted() -> None:
    """Raise KeyboardInterrupt if :func:`interrupted`: where a run reads its
    next batch, and before it puts an output in place."""
    if _SIGNALLED:
        raise KeyboardInterrupt


def main() -> None:
    _PREVIOUS_HOOK[0] = sys.unraisablehook
    sys.unraisablehook = _quiet_about_interrupts
    interrupt_on(signal.SIGTERM)
    # Ctrl-C from here to the end is noted as well as raised (see interrupted),
    # unless the process was started with Ctrl-C ignored (a background job)
    if signal.getsignal(signal.SIGINT) is signal.default_int_handler:
        interrupt_on(signal.SIGINT)
    try:
        from ionicity.pipelines.cli import entry_point
    except BaseException:
        if not _SIGNALLED:
            raise
        if sys.stderr is not None:
            print(INTERRUPTED_NOTHING_WRITTEN, file=sys.stderr, flush=True)
        os._exit(130)  # half-imported modules are not worth a clean shutdown
    entry_point()
