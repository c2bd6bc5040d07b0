"""Read and check a posterior-samples file: CSV (header cells ``path [unit]``), ECSV or FITS.

The format follows the file's suffix. Columns are named by the paths of the estimate
(``heavier.mass``, ``distance``, ``effective_spin``), with their units in the CSV header cell
or in the ECSV and FITS table's own metadata; values come back in canonical units (solMass,
Mpc, dimensionless), the bodies relabelled so that the heavier one is heavier in every sample.
The checks are the same for every format (this module); reading the ECSV and FITS tables is
:mod:`factsheet.load.sample_tables`. A CSV file is read once, in binary, line by line: every
line is bounded, hashed (the build cache keys on the digest) and decoded, so a bad byte or row
is reported with its line. Columns the format does not name are ignored with a warning. Only a
regular file is opened (never a FIFO or a device); a header cell holding a control character
is refused, and so is a distance beyond the end of the redshift table under the catalogue's
cosmology. Memory stays bounded: only the columns read are kept, as 8-byte floats (about 40 MB
for a million rows of five columns).
"""

from __future__ import annotations

import csv
import hashlib
import re
from array import array
from collections.abc import Iterator
from pathlib import Path
from typing import BinaryIO

import numpy as np

from factsheet.errors import InputError, Problem
from factsheet.load import files
from factsheet.load.checker import distance_beyond_table
from factsheet.load.sample_tables import (
    MAX_LINE,
    Column,
    EcsvTable,
    FitsTable,
    Rows,
    problem,
    too_many_rows,
)
from factsheet.load.scalars import article
from factsheet.load.schema import physical_range, value_key
from factsheet.load.values import ValueParseError, parse_unit
from factsheet.load.yaml_lines import bad_character
from factsheet.model import ESTIMATE_PATHS, Limits, SamplesFile

REQUIRED_COLUMNS = ("heavier.mass", "lighter.mass", "distance")
#: Columns of the format whose feature is not built yet.
NOT_YET = (
    "chirp_mass",
    "mass_ratio",
)
HEADER_CELL = re.compile(r"^\s*([A-Za-z_][A-Za-z0-9_.]*)\s*(?:\[(.*)\])?\s*$")
DEFAULT_LIMITS = Limits()


#: The two bodies' columns that travel together when the bodies are relabelled.
BODY_PAIRS = tuple(
    (f"heavier.{name}", f"lighter.{name}") for name in ("mass", "spin", "spin_magnitude", "tilt")
)


def heavier_first(values: dict[str, np.ndarray], in_place: bool = False) -> dict[str, np.ndarray]:
    """Relabel the bodies per sample so that the heavier one comes first, spins following.

    With ``in_place`` the arrays given are swapped where needed instead of copied (the samples
    reader owns its arrays and keeps memory down this way).
    """
    swap = values["lighter.mass"] > values["heavier.mass"]
    if not swap.any():
        return values
    out = dict(values)
    for a, b in BODY_PAIRS:
        if a in values and b in values:
            if in_place:
                kept = values[a][swap]
                values[a][swap] = values[b][swap]
                values[b][swap] = kept
            else:
                out[a] = np.where(swap, values[b], values[a])
                out[b] = np.where(swap, values[a], values[b])
    return out


def read_samples(
    path: Path,
    limits: Limits = DEFAULT_LIMITS,
    warnings: list[Problem] | None = None,
    cosmology: str | None = None,
) -> SamplesFile:
    """Read and check a samples file; :class:`InputError` names its line (or row) and column.

    The format follows the suffix (:data:`FORMATS`). With ``cosmology``, every distance must lie
    inside that cosmology's redshift table.
    """
    path = Path(path)
    table_type = format_of(path)
    try:
        with files.open_regular(path) as handle:
            table = table_type(path, handle)
            values = _read_table(path, table, limits.max_sample_rows, warnings, cosmology)
    except files.FileRefused as exc:
        raise problem(path, 1, "file", str(exc)) from None
    except OSError as exc:
        raise problem(path, 1, "file", f"cannot read ({exc.strerror})") from None
    return SamplesFile(path, table.digest.hexdigest(), values)


def format_of(path: Path):
    """The reader of a samples file's format, from its suffix; :class:`InputError` if unknown."""
    for suffix, table_type in FORMATS.items():
        if path.name.lower().endswith(suffix):
            return table_type
    *most, last = FORMATS
    message = (
        f"suffix {path.suffix[:20]!r} is not a samples format: samples files end in "
        f"{', '.join(most)} or {last}"
    )
    if path.name.lower().endswith((".fits.gz", ".fit.gz", ".fz")):
        message = "compressed FITS is not read (it cannot be memory-mapped): decompress it first"
    raise InputError(problems=[Problem(path, None, "file", message)])


def check_samples(
    path: Path,
    limits: Limits,
    problems: list[Problem],
    warnings: list[Problem],
    cosmology: str | None = None,
) -> SamplesFile | None:
    """Read a samples file for the load stage; record its problems and warnings."""
    try:
        return read_samples(path, limits, warnings, cosmology)
    except InputError as exc:
        problems.extend(exc.problems)
        return None


class CsvTable:
    """A CSV samples file: the first line that is not blank or a comment is the header, every
    later one a sample. It is read once, line by line, each line bounded, hashed and decoded."""

    header_line = 1

    def __init__(self, path: Path, handle: BinaryIO) -> None:
        self.path, self.handle = path, handle
        self.line = 0
        self.digest = hashlib.sha256()
        self.reader = csv.reader(self._lines())
        header = next(self._rows(), None)
        if header is None:
            raise problem(path, 1, "file", "samples file is empty")
        self.header_line, self.width = self.reader.line_num, len(header)
        self.problems: list[Problem] = []
        self.columns = [self._column(i, cell) for i, cell in enumerate(header)]

    def _lines(self) -> Iterator[str]:
        while data := self.handle.readline(MAX_LINE + 1):
            self.line += 1
            self.digest.update(data)
            if b"\x00" in data:
                raise self._bad("the file contains NUL bytes (binary, not CSV)")
            if len(data) > MAX_LINE and not data.endswith(b"\n"):
                raise self._bad(f"a line longer than {MAX_LINE} bytes")
            try:
                yield data.decode("utf-8")
            except UnicodeDecodeError:
                raise self._bad("samples file is not UTF-8 text") from None

    def _bad(self, message: str) -> InputError:
        return problem(self.path, max(self.line, 1), "file", message)

    def _rows(self) -> Iterator[list[str]]:
        """Rows that are neither blank nor comments (a first cell starting with '#')."""
        try:
            for row in self.reader:
                if row and not row[0].lstrip().startswith("#"):
                    yield row
        except csv.Error as exc:
            raise self._bad(f"not valid CSV ({exc})") from None

    def _column(self, index: int, cell: str) -> Column:
        if why := bad_character(cell):
            self.problems.append(
                Problem(self.path, self.header_line, "header",
                        f"column {index + 1}'s name contains {why}")
            )  # fmt: skip
            return Column(index, "", "", self.header_line)
        m = HEADER_CELL.match(cell)
        name, unit = (m.group(1), m.group(2) or "") if m else (cell[:60], "")
        return Column(index, name, unit, self.header_line)

    def example(self, name: str, unit: str) -> str:
        return f"'{name} [{unit}]'" if unit else f"'{name}'"

    def read(self, indices: list[int], max_rows: int) -> tuple[list[np.ndarray], Rows]:
        """The cells of the columns ``indices`` of every row, one array of 8-byte floats per
        column, and where each row stands; the other columns are dropped as each row is read."""
        cells, rows = [array("d") for _ in indices], Rows(self.header_line + 1)
        for row in self._rows():
            line = self.reader.line_num
            if rows.count >= max_rows:
                raise problem(self.path, line, "row", too_many_rows(max_rows))
            if len(row) != self.width:
                raise problem(self.path, line, "row", f"{len(row)} cells, expected {self.width}")
            try:
                values = [float(row[i]) for i in indices]
            except ValueError:
                raise problem(self.path, line, "row", f"not a number in {row!r}"[:200]) from None
            for column, value in zip(cells, values, strict=True):
                column.append(value)
            rows.add(line)
        if not rows.count:
            raise problem(self.path, self.header_line + 1, "row", "no sample rows after the header")
        return [np.frombuffer(c, dtype=float) for c in cells], rows  # views: no copy


#: The samples-file formats by suffix (compared in lower case).
FORMATS = {".csv": CsvTable, ".ecsv": EcsvTable, ".fits": FitsTable, ".fit": FitsTable}


def _read_table(
    path: Path, table, max_rows: int, warnings, cosmology: str | None
) -> dict[str, np.ndarray]:
    problems: list[Problem] = list(getattr(table, "problems", []))
    chosen = _choose_columns(path, table, problems, warnings)
    if problems:
        raise InputError(problems=problems)
    arrays, rows = table.read([column.index for column, _ in chosen], max_rows)
    out = {}
    for (column, factor), x in zip(chosen, arrays, strict=True):
        if factor != 1:
            x *= factor  # in place: the reader's array is ours
        out[column.name] = x
    _check_values(path, out, rows, cosmology)
    return heavier_first(out, in_place=True)


def _choose_columns(
    path: Path, table, problems: list[Problem], warnings
) -> list[tuple[Column, float]]:
    """The header's columns to read, each with the factor to its canonical unit."""
    chosen: list[tuple[Column, float]] = []
    seen: set[str] = set()
    for column in table.columns:
        name, line = column.name, column.line
        if not name:
            continue  # already reported by the reader
        if name in seen:
            problems.append(Problem(path, line, name, "column given twice"))
            continue
        seen.add(name)
        if name in NOT_YET:
            problems.append(Problem(path, line, name, "not supported yet in samples files"))
        elif name not in ESTIMATE_PATHS:
            if warnings is not None:
                warnings.append(Problem(path, line, f"column {name[:60]!r}", _IGNORED))
        elif column.not_numeric:
            problems.append(Problem(path, line, name, column.not_numeric))
        elif (factor := _factor(path, column, table, problems)) is not None:
            chosen.append((column, factor))
    line = table.header_line
    missing = [c for c in REQUIRED_COLUMNS if c not in seen]
    if missing:
        problems.append(Problem(path, line, "header", f"missing column(s): {', '.join(missing)}"))
    for name, message in spin_column_problems(seen):
        problems.append(Problem(path, _line_of(table, name), name, message))
    return chosen


def _line_of(table, name: str) -> int:
    return next((c.line for c in table.columns if c.name == name), table.header_line)


def spin_column_problems(seen: set[str]) -> list[tuple[str, str]]:
    """The spin columns must describe each body one way (the rules of the estimate's keys)."""
    found = []
    body_columns = {f"{b}.{n}" for b in ("heavier", "lighter") for n in ("spin", *VECTOR)}
    if "effective_spin" in seen and seen & body_columns:
        found.append(
            ("effective_spin", "give either effective_spin or the bodies' spin columns, not both")
        )
    for body in ("heavier", "lighter"):
        vector = [f"{body}.{n}" for n in VECTOR if f"{body}.{n}" in seen]
        if f"{body}.spin" in seen and vector:
            found.append((vector[0], f"give either {body}.spin or {body}.spin_magnitude with "
                          f"{body}.tilt, not both"))  # fmt: skip
        elif len(vector) == 1:
            other = f"{body}.{'tilt' if vector[0].endswith('magnitude') else 'spin_magnitude'}"
            found.append((vector[0], f"needs the column {other} too"))
    if "precession_spin" in seen and any(name.endswith(".tilt") for name in seen):
        found.append(
            ("precession_spin", "the tilt columns already give the in-plane spins: leave "
             "precession_spin out")
        )  # fmt: skip
    return found


VECTOR = ("spin_magnitude", "tilt")


_IGNORED = (
    "unknown column, ignored (the columns read are named by a path from: "
    f"{', '.join(ESTIMATE_PATHS)})"
)


def _factor(path: Path, column: Column, table, problems: list[Problem]) -> float | None:
    """The factor from the column's unit to its key's canonical unit (None: a problem)."""
    name, key = column.name, value_key(column.name)
    try:
        unit = parse_unit(column.unit)
    except ValueParseError as exc:
        problems.append(Problem(path, column.line, name, str(exc)))
        return None
    wanted = key.physical_type or "dimensionless"
    if unit.physical_type != wanted:
        example = table.example(name, key.canonical_unit)
        message = f"unit {unit.to_string() or 'none'} is not {article(wanted)} (e.g. {example})"
        problems.append(Problem(path, column.line, name, message))
        return None
    return unit.to(key.canonical_unit or "")


def _check_values(path: Path, values: dict[str, np.ndarray], rows: Rows, cosmology) -> None:
    for name, x in values.items():
        low, high = physical_range(name)
        on_low = (x == low) & (low == 0.0) & (not value_key(name).low_inclusive)
        bad = ~np.isfinite(x) | (x < low) | (x > high) | on_low
        if bad.any():
            line, where = rows.where(int(np.argmax(bad)))
            value = x[int(np.argmax(bad))]
            raise problem(path, line, name, f"{where}value {value:g} outside the physical range")
    distance = values["distance"]
    if cosmology is not None and distance_beyond_table(float(distance.max()), cosmology):
        from factsheet.physics.cosmology import named_distance_limit

        i = int(np.argmax(distance > named_distance_limit(cosmology)))  # the first
        line, where = rows.where(i)
        why = distance_beyond_table(float(distance[i]), cosmology)
        raise problem(path, line, "distance", f"{where}{why}")
