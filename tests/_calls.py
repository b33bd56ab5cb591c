"""Counting the Python function calls a piece of work makes: a deterministic
measure of cost for tests (the machine's speed does not change it; timings
belong to the benchmark)."""
from __future__ import annotations

import sys


def python_calls(function, *args, **kwargs):
    """``(function(*args, **kwargs), number of Python-level calls it made)``.

    Counts ``call`` events of :func:`sys.setprofile`: every Python function
    or method entered, the outer one included; builtins and C code are not
    counted.
    """
    count = 0

    def profile(frame, event, arg):
        nonlocal count
        if event == "call":
            count += 1

    previous = sys.getprofile()
    sys.setprofile(profile)
    try:
        result = function(*args, **kwargs)
    finally:
        sys.setprofile(previous)
    return result, count
