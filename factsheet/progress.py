"""A long build says what it is doing: on a terminal as one line rewritten in place, in a log
(CI, cron, output redirected to a file) as a line every few seconds.

The build calls :meth:`Progress.step` as events are derived and drawn and as pages are written;
the summary at the end is the command line's (``built N fact sheets …``).
"""

from __future__ import annotations

import sys
import time
from typing import TextIO

#: Seconds between two progress lines in a log.
LOG_EVERY = 5.0


class Progress:
    """Progress of one build stage after another; silent when not ``enabled``."""

    def __init__(
        self,
        enabled: bool = False,
        stream: TextIO | None = None,
        tty: bool | None = None,
        every: float = LOG_EVERY,
    ):
        self.enabled, self.stream = enabled, stream or sys.stderr
        self.tty = self.stream.isatty() if tty is None else tty
        self.every, self.last, self.open = every, time.monotonic(), False

    def step(self, done: int, total: int, what: str) -> None:
        """``done`` of ``total`` things of a stage (``what``: "events derived and drawn")."""
        if not self.enabled or not total:
            return
        text = f"  {done}/{total} {what}"
        if self.tty:
            print(f"\r{text}", end="", file=self.stream, flush=True)
            self.open = True
            if done == total:
                self.end()
            return
        now = time.monotonic()
        if done == total or now - self.last >= self.every:
            print(text, file=self.stream, flush=True)
            self.last = now

    def tick(self, done: int, what: str) -> None:
        """``done`` things of a stage whose total is not known ahead (at most one line every
        few seconds, on a terminal as in a log); :meth:`step` with the total closes it."""
        if not self.enabled or time.monotonic() - self.last < self.every:
            return
        self.last = time.monotonic()
        text = f"  {done} {what}"
        if self.tty:
            print(f"\r{text}", end="", file=self.stream, flush=True)
        else:
            print(text, file=self.stream, flush=True)
        self.open = self.tty

    def end(self) -> None:
        """Close a line rewritten in place."""
        if self.open:
            print(file=self.stream, flush=True)
            self.open = False
