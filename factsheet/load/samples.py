"""Read and check a posterior-samples file (CSV whose header cells read ``path [unit]``).

Columns are named by the paths of the estimate (``heavier.mass [Msun]``, ``distance [Mpc]``,
``effective_spin``); values come back in canonical units (solMass, Mpc, dimensionless), the
bodies relabelled so that the heavier one is heavier in every sample. The file is read once, in
binary, line by line: every line is bounded, hashed (the build cache keys on the digest) and
decoded, so a bad byte or row is reported with its line. Columns the format does not name are
ignored with a warning. Only a regular file is opened (never a FIFO or a device); a header
cell holding a control character is refused, and so is a distance beyond the end of the redshift
table under the catalogue's cosmology. Memory stays bounded: only the columns read are kept, as
8-byte floats (about 40 MB for a million rows of five columns).
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
MAX_LINE = 4096  # bytes in one line; seven numbers need far fewer
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
    """Read and check a samples file; :class:`InputError` names its line and column.

    With ``cosmology``, every distance must lie inside that cosmology's redshift table.
    """
    lines = _Lines()
    try:
        with files.open_regular(Path(path)) as handle:
            lines.handle = handle
            reader = csv.reader(lines)
            values = _read_table(Path(path), reader, limits.max_sample_rows, warnings, cosmology)
    except csv.Error as exc:
        message = f"not valid CSV ({exc})"
    except files.FileRefused as exc:
        message = str(exc)
    except OSError as exc:
        message = f"cannot read ({exc.strerror})"
    else:
        return SamplesFile(Path(path), lines.digest.hexdigest(), values)
    raise InputError(problems=[Problem(path, max(lines.line, 1), "file", message)]) from None


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


class _Lines:
    """Decoded lines of a binary file: bounded, hashed, refusing NUL bytes and bad UTF-8."""

    def __init__(self) -> None:
        self.handle: BinaryIO | None = None
        self.line = 0
        self.digest = hashlib.sha256()

    def __iter__(self) -> Iterator[str]:
        assert self.handle is not None, "open the file first"
        while data := self.handle.readline(MAX_LINE + 1):
            self.line += 1
            self.digest.update(data)
            if b"\x00" in data:
                raise csv.Error("the file contains NUL bytes (binary, not CSV)")
            if len(data) > MAX_LINE and not data.endswith(b"\n"):
                raise csv.Error(f"a line longer than {MAX_LINE} bytes")
            try:
                yield data.decode("utf-8")
            except UnicodeDecodeError:
                raise csv.Error("samples file is not UTF-8 text") from None


def _read_table(
    path: Path, reader, max_rows: int, warnings, cosmology: str | None
) -> dict[str, np.ndarray]:
    header = next(_data_rows(reader), None)
    if header is None:
        raise InputError(problems=[Problem(path, 1, "file", "samples file is empty")])
    problems: list[Problem] = []
    columns = _read_header(path, header, problems, reader.line_num, warnings)
    if problems:
        raise InputError(problems=problems)
    cells, lines = _read_rows(path, reader, len(header), list(columns), max_rows)
    out = {}
    for (name, factor), cell in zip(columns.values(), cells, strict=True):
        x = np.frombuffer(cell, dtype=float)  # a view of the column as read: no copy
        if factor != 1:
            x = x * factor
        out[name] = x
    _check_values(path, out, lines, cosmology)
    return heavier_first(out, in_place=True)


def _read_header(
    path: Path, header: list[str], problems: list[Problem], line: int, warnings
) -> dict[int, tuple[str, float]]:
    columns: dict[int, tuple[str, float]] = {}
    seen: set[str] = set()
    for i, cell in enumerate(header):
        if why := bad_character(cell):
            problems.append(Problem(path, line, "header", f"column {i + 1}'s name contains {why}"))
            continue
        m = HEADER_CELL.match(cell)
        name = m.group(1) if m else cell[:60]
        if name in seen:
            problems.append(Problem(path, line, name, "column given twice"))
            continue
        seen.add(name)
        if m and name in NOT_YET:
            problems.append(Problem(path, line, name, "not supported yet in samples files"))
        elif not m or name not in ESTIMATE_PATHS:
            if warnings is not None:
                warnings.append(Problem(path, line, f"column {cell[:60]!r}", _IGNORED))
        elif (column := _column(path, name, m.group(2) or "", line, problems)) is not None:
            columns[i] = column
    missing = [c for c in REQUIRED_COLUMNS if c not in seen]
    if missing:
        problems.append(Problem(path, line, "header", f"missing column(s): {', '.join(missing)}"))
    for name, message in spin_column_problems(seen):
        problems.append(Problem(path, line, name, message))
    return columns


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
    "unknown column, ignored (the columns read are 'path [unit]' with a path from: "
    f"{', '.join(ESTIMATE_PATHS)})"
)


def _column(path: Path, name: str, unit_text: str, line: int, problems: list[Problem]):
    key = value_key(name)
    try:
        unit = parse_unit(unit_text)
    except ValueParseError as exc:
        problems.append(Problem(path, line, name, str(exc)))
        return None
    wanted = key.physical_type or "dimensionless"
    if unit.physical_type != wanted:
        example = f"{name} [{key.canonical_unit}]" if key.canonical_unit else name
        problems.append(
            Problem(
                path,
                line,
                name,
                f"unit {unit.to_string() or 'none'} is not {article(wanted)} (e.g. '{example}')",
            )
        )
        return None
    return name, unit.to(key.canonical_unit or "")


def _data_rows(reader):
    """Rows that are neither blank nor comments (a first cell starting with '#')."""
    for row in reader:
        if row and not row[0].lstrip().startswith("#"):
            yield row


def _row_problem(path: Path, line: int, message: str) -> InputError:
    return InputError(problems=[Problem(path, line, "row", message)])


def _read_rows(
    path: Path, reader, width: int, read: list[int], max_rows: int
) -> tuple[list[array], array]:
    """The cells of the columns ``read`` of every row, one array of 8-byte floats per column,
    and the line of each row; the other columns are dropped as each row is read."""
    cells, lines = [array("d") for _ in read], array("q")
    for row in _data_rows(reader):
        line = reader.line_num
        if len(lines) >= max_rows:
            raise _row_problem(
                path,
                line,
                f"more than {max_rows} rows (raise limits.max_sample_rows "
                "in catalogue.yaml if this is intended)",
            )
        if len(row) != width:
            raise _row_problem(path, line, f"{len(row)} cells, expected {width}")
        try:
            values = [float(row[i]) for i in read]
        except ValueError:
            raise _row_problem(path, line, f"not a number in {row!r}"[:200]) from None
        for column, value in zip(cells, values, strict=True):
            column.append(value)
        lines.append(line)
    if not lines:
        raise InputError(problems=[Problem(path, 2, "row", "no sample rows after the header")])
    return cells, lines


def _check_values(path: Path, values: dict[str, np.ndarray], lines, cosmology) -> None:
    for name, x in values.items():
        low, high = physical_range(name)
        on_low = (x == low) & (low == 0.0) & (not value_key(name).low_inclusive)
        bad = ~np.isfinite(x) | (x < low) | (x > high) | on_low
        if bad.any():
            i = int(np.argmax(bad))
            raise InputError(
                problems=[
                    Problem(path, lines[i], name, f"value {x[i]:g} outside the physical range")
                ]
            )
    distance = values["distance"]
    if cosmology is not None and distance_beyond_table(float(distance.max()), cosmology):
        from factsheet.physics.cosmology import distance_limit

        i = int(np.argmax(distance > distance_limit(cosmology).to_value("Mpc")))  # the first
        why = distance_beyond_table(float(distance[i]), cosmology)
        raise InputError(problems=[Problem(path, lines[i], "distance", why)])
