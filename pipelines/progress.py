"""The progress line of a run on a terminal (:class:`Progress`)."""
from __future__ import annotations

import sys
import time

__all__ = ["Progress"]


class Progress:
    """Rows done, rows per second and time left on one stderr line, only when
    stderr is a terminal and the run is not ``--quiet``."""

    def __init__(self, enabled: bool, total_rows: int | None = None, fraction_done=None, stream=None):
        self.stream = stream or sys.stderr
        self.enabled = enabled and self.stream.isatty()
        self.total_rows = total_rows
        self.fraction_done = fraction_done
        self.start = time.perf_counter()
        self.last = 0.0

    def update(self, rows: int, force: bool = False) -> None:
        if not self.enabled:
            return
        now = time.perf_counter()
        if now - self.last < 0.25 and not force:
            return
        self.last = now
        elapsed = max(now - self.start, 1e-9)
        fraction = None
        if self.total_rows:
            fraction = rows / self.total_rows
        elif self.fraction_done is not None:
            fraction = self.fraction_done()
        left = ""
        if fraction and fraction > 0:
            seconds = max(elapsed * (1 - fraction) / fraction, 0.0)
            left = f"  {int(seconds // 60)}:{int(seconds % 60):02d} left"
        percent = f" ({100 * fraction:.0f}%)" if fraction is not None else ""
        self.stream.write(f"\r{rows:,} rows{percent}  {rows / elapsed:,.0f} rows/s{left}   ")
        self.stream.flush()

    def close(self) -> None:
        if self.enabled:
            self.stream.write("\r" + " " * 72 + "\r")
            self.stream.flush()
