"""Read the ECSV and FITS samples tables: their header columns, then the columns chosen, as floats.

These readers know the file formats; what a column must be (its unit, its range, the spin
rules) is checked once for every format in :mod:`factsheet.load.samples`.

* **ECSV** (astropy's Enhanced Character Separated Values): the YAML header of ``#`` lines is
  read with astropy (``astropy.table.meta.get_header_from_yaml``), and the body is parsed here
  in chunks of a few MB with ``numpy.loadtxt``, keeping only the columns read. Astropy's own
  reader holds every cell of the file as text while it reads, about 20 times the size of the
  columns kept (bench/bench_samples.py). Every line is bounded and hashed; a bad row is
  located and reported with its line.
* **FITS** binary tables are read with ``astropy.table.Table.read`` through a memory map, and
  each column read is copied out on its own as 8-byte floats. A FITS file has no lines: its
  problems name line 1 and the column, and a bad value says its row.
"""

from __future__ import annotations

import csv
import hashlib
import io
import os
import re
import warnings as python_warnings
from bisect import bisect_right
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import BinaryIO

import numpy as np

from factsheet.errors import InputError, Problem

MAX_LINE = 4096  # bytes in one line; a row of numbers needs far fewer
MAX_HEADER_LINES = 2000  # lines of an ECSV header (a datatype entry per column, some meta)
CHUNK = 1 << 20  # bytes of ECSV body parsed at a time (and hashed at a time)
NUMERIC_DATATYPES = (
    *(f"int{bits}" for bits in (8, 16, 32, 64)),
    *(f"uint{bits}" for bits in (8, 16, 32, 64)),
    *(f"float{bits}" for bits in (16, 32, 64)),
)
_SKIPPED = re.compile(r"^[ \t\r]*(?:#|$)", re.M)  # a blank or comment line in an ECSV body


@dataclass(frozen=True)
class Column:
    """One column as a samples file's header declares it."""

    index: int
    name: str
    unit: str  # as written ('' for none)
    line: int  # the file line that declares it
    not_numeric: str = ""  # why the column cannot hold numbers ('' when it can)


def problem(path: Path, line: int, key: str, message: str) -> InputError:
    return InputError(problems=[Problem(path, line, key, message)])


def too_many_rows(max_rows: int) -> str:
    return (
        f"more than {max_rows} rows (raise limits.max_sample_rows in catalogue.yaml if this "
        "is intended)"
    )


class Rows:
    """Where each row of a table stands in its file: runs of rows on consecutive lines."""

    def __init__(self, first_line: int | None) -> None:
        self.count = 0
        self._rows: list[int] = []  # first row of each run
        self._lines: list[int] = []  # its line
        self.first_line = first_line  # None: the file has no lines (FITS)

    def add(self, line: int) -> None:
        """Count one row read from ``line``."""
        if not self._rows or self._lines[-1] + self.count - self._rows[-1] != line:
            self._rows.append(self.count)
            self._lines.append(line)
        self.count += 1

    def add_run(self, line: int, count: int) -> None:
        """Count ``count`` rows read from consecutive lines, starting at ``line``."""
        if count:
            self.add(line)
            self.count += count - 1

    def where(self, row: int) -> tuple[int, str]:
        """The file line of a row (0-based) and the words that place it within the line."""
        if self.first_line is None:
            return 1, f"row {row + 1}: "
        run = bisect_right(self._rows, row) - 1
        return self._lines[run] + row - self._rows[run], ""


class EcsvTable:
    """An ECSV samples file, read from an open binary handle in one pass."""

    unit_words = "a unit in the column's header entry"

    def __init__(self, path: Path, handle: BinaryIO) -> None:
        self.path, self.handle = path, handle
        self.digest = hashlib.sha256()
        self.line = 0
        self.columns, self.header_line = self._read_header()

    def _readline(self) -> str:
        data = self.handle.readline(MAX_LINE + 1)
        if not data:
            return ""
        self.line += 1
        self.digest.update(data)
        if len(data) > MAX_LINE and not data.endswith(b"\n"):
            raise self._bad(f"a line longer than {MAX_LINE} bytes")
        return self._text(data)

    def _text(self, data: bytes) -> str:
        if b"\x00" in data:
            raise self._bad("the file contains NUL bytes (binary, not ECSV)")
        try:
            return data.decode("utf-8")
        except UnicodeDecodeError:
            raise self._bad("samples file is not UTF-8 text") from None

    def _bad(self, message: str, line: int | None = None) -> InputError:
        return problem(self.path, line or max(self.line, 1), "file", message)

    def _read_header(self) -> tuple[list[Column], int]:
        first = self._readline()
        if not first.startswith("# %ECSV"):
            raise self._bad("not an ECSV file: its first line must read '# %ECSV <version>'", 1)
        header: list[str] = []
        while (text := self._readline()).startswith("#"):
            header.append(text[1:].removeprefix(" ").rstrip("\r\n"))
            if len(header) > MAX_HEADER_LINES:
                raise self._bad(f"a header longer than {MAX_HEADER_LINES} lines")
        datatype = self._yaml(header)
        names = self._names(text)
        columns = []
        for i, entry in enumerate(datatype):
            line = _entry_line(header, i) + 2  # header[0] is the file's line 2
            columns.append(_column(i, entry, line))
        if names != [c.name for c in columns]:
            raise self._bad("the column names line does not match the header's datatype entries")
        datatype_line = next((i for i, h in enumerate(header) if h.startswith("datatype:")), 0)
        return columns, datatype_line + 2

    def _names(self, text: str) -> list[str]:
        if not text.strip():
            raise self._bad("no column names line after the header")
        self.names_line = self.line
        return self._cells(text.rstrip("\r\n"))

    def _cells(self, text: str) -> list[str]:
        space = self.delimiter == " "
        return next(csv.reader([text], delimiter=self.delimiter, skipinitialspace=space), [])

    def _yaml(self, header: list[str]) -> list:
        from astropy.table import meta

        try:
            found = meta.get_header_from_yaml(header)
        except Exception as exc:  # the YAML parser's several error types
            raise self._bad(f"the header is not valid ECSV YAML ({str(exc)[:200]})", 2) from None
        datatype = found.get("datatype") if isinstance(found, dict) else None
        if not isinstance(datatype, list) or not all(isinstance(e, dict) for e in datatype):
            raise self._bad("the header has no datatype list of columns", 2)
        delimiter = found.get("delimiter", " ")
        if delimiter not in (" ", ","):
            raise self._bad(f"delimiter {str(delimiter)[:20]!r}: ECSV uses a space or a comma", 2)
        self.delimiter = delimiter
        return datatype

    def example(self, name: str, unit: str) -> str:
        return f"'- {{name: {name}, unit: {unit}, datatype: float64}}'"

    def read(self, indices: list[int], max_rows: int) -> tuple[list[np.ndarray], Rows]:
        """The columns ``indices`` of every row as 8-byte floats, and where each row stands."""
        rows, done = Rows(self.names_line + 1), 0
        # room for every row the rest of the file can hold (a row takes at least two bytes a
        # cell) up to the limit; pages of it that no row reaches are never touched
        rest = os.fstat(self.handle.fileno()).st_size - self.handle.tell()
        capacity = min(max_rows, rest // (2 * len(self.columns)) + 1)
        columns = np.empty((len(indices), capacity))
        while text := self._body_text():
            chunk = self._chunk(text, indices, rows)
            self.line += text.count("\n") + (not text.endswith("\n"))
            if done + len(chunk) > capacity:
                raise problem(self.path, rows.where(max_rows)[0], "row", too_many_rows(max_rows))
            columns[:, done : done + len(chunk)] = chunk.T
            done += len(chunk)
        if not done:
            raise problem(self.path, self.line + 1, "row", "no sample rows after the header")
        return [column[:done] for column in columns], rows

    def _body_text(self) -> str:
        """The next chunk of whole lines of the body, hashed and checked ('' at the end)."""
        data = self.handle.read(CHUNK)
        if data and not data.endswith(b"\n"):
            tail = self.handle.readline(MAX_LINE + 1)
            if len(tail) > MAX_LINE and not tail.endswith(b"\n"):
                raise self._bad(f"a line longer than {MAX_LINE} bytes", self.line + 1)
            data += tail
        self.digest.update(data)
        ends = np.flatnonzero(np.frombuffer(data, dtype=np.uint8) == ord("\n"))
        lengths = np.diff(ends, prepend=-1, append=len(data))  # bytes of each line, + 1
        if lengths.size and lengths.max() > MAX_LINE + 1:
            line = self.line + 1 + int(np.argmax(lengths > MAX_LINE + 1))
            raise self._bad(f"a line longer than {MAX_LINE} bytes", line)
        return self._text(data)

    def _chunk(self, text: str, indices: list[int], rows: Rows) -> np.ndarray:
        """Parse one chunk of body lines (the file's lines after ``self.line``)."""
        start, body = self.line + 1, text.removesuffix("\n")
        found: Sequence[int]
        if _SKIPPED.search(body):  # blank or comment lines: pick the rows out one by one
            lines = body.split("\n")
            kept = [i for i, line in enumerate(lines) if not _SKIPPED.match(line)]
            for i in kept:
                rows.add(start + i)
            body = "\n".join(lines[i] for i in kept)
            found = [start + i for i in kept]
        else:
            found = range(start, start + body.count("\n") + 1)
            rows.add_run(start, len(found))
        if not found:
            return np.empty((0, len(indices)))
        try:
            return np.loadtxt(
                io.StringIO(body),
                dtype=np.float64,
                delimiter=None if self.delimiter == " " else ",",
                usecols=indices,
                quotechar='"',
                comments=None,
                ndmin=2,
            )
        except ValueError as exc:
            raise self._locate(body.split("\n"), found, indices, str(exc)) from None

    def _locate(
        self, lines: list[str], found: Sequence[int], indices: list[int], why: str
    ) -> InputError:
        """The first bad row of a chunk that numpy refused, named with its line and column."""
        for text, line in zip(lines, found, strict=True):
            cells = self._cells(text.rstrip("\r"))
            if len(cells) != len(self.columns):
                return problem(self.path, line, "row", f"{len(cells)} cells, expected "
                               f"{len(self.columns)}")  # fmt: skip
            for i in indices:
                if (message := _cell_problem(cells[i])) is not None:
                    return problem(self.path, line, self.columns[i].name, message)
        return problem(self.path, found[0], "row", f"cannot read the rows here ({why[:200]})")


def _cell_problem(cell: str) -> str | None:
    if not cell.strip():
        return "a masked (empty) value: every sample needs a number"
    try:
        float(cell)
    except ValueError:
        return f"not a number: {cell[:60]!r}"
    return None


def _entry_line(header: list[str], i: int) -> int:
    """The index in ``header`` of the i-th entry of the datatype list (0 when not found)."""
    entries = [n for n, text in enumerate(header) if re.match(r"\s*-\s*\{?\s*name\s*:", text)]
    return entries[i] if i < len(entries) else 0


def _column(index: int, entry: dict, line: int) -> Column:
    datatype = str(entry.get("datatype", ""))
    if "subtype" in entry:
        why = f"a column of arrays ({str(entry['subtype'])[:40]}), not of numbers"
    elif datatype not in NUMERIC_DATATYPES:
        why = f"datatype {datatype[:40] or 'none'} is not a number type (e.g. float64)"
    else:
        why = ""
    unit = entry.get("unit")
    return Column(index, str(entry.get("name", ""))[:200], str(unit or ""), line, why)


class FitsTable:
    """A FITS binary table, read through a memory map one column at a time."""

    unit_words = "a TUNIT header card"
    header_line = 1

    def __init__(self, path: Path, handle: BinaryIO) -> None:
        from astropy.table import Table

        self.path = path
        self.digest = hashlib.sha256()
        while data := handle.read(CHUNK):
            self.digest.update(data)
        handle.seek(0)
        try:
            with python_warnings.catch_warnings():
                python_warnings.simplefilter("ignore")  # units and HDU choice are checked here
                self.table = Table.read(handle, format="fits", memmap=True)
        except (OSError, ValueError, TypeError, IndexError, KeyError) as exc:
            why = str(exc).split(". ")[0][:200]
            raise problem(path, 1, "file", f"not a FITS table ({why})") from None
        self.columns = [_fits_column(i, c) for i, c in enumerate(self.table.columns.values())]

    def example(self, name: str, unit: str) -> str:
        return f"TUNIT '{unit}' for the column {name}"

    def read(self, indices: list[int], max_rows: int) -> tuple[list[np.ndarray], Rows]:
        rows = Rows(None)
        if len(self.table) > max_rows:
            raise problem(self.path, 1, "row", f"row {max_rows + 1}: {too_many_rows(max_rows)}")
        if not len(self.table):
            raise problem(self.path, 1, "row", "the table has no rows")
        rows.count = len(self.table)
        out = []
        for i in indices:
            column = self.table.columns[i]
            mask = np.ma.getmaskarray(column) if hasattr(column, "mask") else None
            if mask is not None and mask.any():
                row = int(np.argmax(mask)) + 1
                raise problem(self.path, 1, column.name, f"row {row}: a masked value: every "
                              "sample needs a number")  # fmt: skip
            out.append(np.array(column, dtype=np.float64))  # a native copy of this column only
        del self.table
        return out, rows


def _fits_column(index: int, column) -> Column:
    from astropy import units as u

    unit = column.unit
    text = unit.name if isinstance(unit, u.UnrecognizedUnit) else unit.to_string() if unit else ""
    kind = column.dtype.kind
    if column.ndim > 1:
        why = f"a column of arrays (shape {column.shape[1:]}), not of numbers"
    elif kind not in "iuf":
        why = f"a column of {_KINDS.get(kind, column.dtype.name)}, not of numbers"
    else:
        why = ""
    return Column(index, column.name, text, 1, why)


_KINDS = {"S": "text", "U": "text", "b": "logical values", "c": "complex numbers"}
