"""The small exception family of factsheet.

The CLI catches :class:`FactsheetError` and prints one clean line per problem; a traceback is
shown only with ``--debug``.
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path


@dataclass(frozen=True)
class Problem:
    """One problem found in the input, located by file, line and key."""

    file: Path | str
    line: int | None
    key: str
    message: str

    def __str__(self) -> str:
        where = f"{self.file}:{self.line}" if self.line else f"{self.file}"
        return f"{where}: {self.key}: {self.message}" if self.key else f"{where}: {self.message}"


def printable(text: str) -> str:
    """``text`` with control characters and lone surrogates written as escapes, so that no
    input can drive the terminal a message is printed on."""
    return "".join(c if c.isprintable() or c == " " else ascii(c)[1:-1] for c in text)


class FactsheetError(Exception):
    """Base of every error factsheet raises on purpose."""

    def __init__(self, message: str = "", problems: list[Problem] | None = None):
        self.problems = list(problems or [])
        if not message and self.problems:
            message = "\n".join(str(p) for p in self.problems)
        super().__init__(message)


class InputError(FactsheetError, ValueError):
    """The catalogue, an event file or a samples file is not valid input."""


class BuildError(FactsheetError):
    """The site could not be built or published."""
