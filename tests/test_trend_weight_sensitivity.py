"""Every weight of the melting trend index is checked by some test: tests/perturb_trend_weights.py in CI.

A property of our own test suite (common practice: a weight no test can move is untested);
the reference values live in the melting tests it runs, each with its source.

The script changes each weight of ``scorer.melting.TREND_WEIGHTS`` by +50 % and by
-50 %, one at a time, and lists the changes that leave every melting test green.
One change is not caught today, and no referenced test can honestly catch it
(see ``KNOWN_UNCAUGHT``): the measured melting points at hand do not fix that
hand-set weight to within a factor of 1.5. They are listed here like strict expected failures: a new
uncaught change fails this test, and so does one that a new test starts to
catch (then remove it from the list).
"""
from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pytest

SCRIPT = Path(__file__).resolve().parent / "perturb_trend_weights.py"

KNOWN_UNCAUGHT = {
    # 6.75 torsions (an octyl chain) puts the [Cnmim][PF6] minimum at octyl, which the
    # glass-forming hexyl and octyl salts cannot tell from hexyl (Holbrey & Seddon 1999);
    # set by hand, not fitted
    ("packing_free_torsions", "+50 %"): "hexyl and octyl both glass formers",
}


@pytest.mark.slow
def test_every_weight_change_is_caught_but_the_documented_ones():
    result = subprocess.run([sys.executable, str(SCRIPT)], capture_output=True, text=True, timeout=900)
    assert result.returncode in (0, 1), result.stdout + result.stderr
    uncaught = set()
    for line in result.stdout.splitlines():
        if line.startswith("NOT CAUGHT "):
            _, _, key, sign, _ = line.split()
            uncaught.add((key, f"{sign} %"))
    assert result.returncode == (1 if uncaught else 0)
    assert uncaught == set(KNOWN_UNCAUGHT), result.stdout
