"""Turn an estimate into samples: draws from summary intervals, or a posterior-samples CSV.

A summary ``m +p -n`` at credible level ``c`` is drawn from a two-piece normal joined at the
median: each half is a half-normal scaled so that the quantiles ``(1 - c)/2`` and ``(1 + c)/2``
fall exactly on ``m - n`` and ``m + p``, and the median stays ``m``. Physical limits (mass and
distance > 0, |spin| <= 1) truncate the draw by restricting the uniform variate to the allowed
part of the distribution (inverse-CDF sampling), so no sample is ever clipped onto a limit.
After drawing, components are relabelled so that mass_1 >= mass_2 in every sample.
"""

from __future__ import annotations

import csv
import math
import re
from array import array
from pathlib import Path

import astropy.units as u
import numpy as np
from scipy.special import ndtr, ndtri

from factsheet.errors import InputError, Problem
from factsheet.model import Parameters
from factsheet.quantities import Estimate, ValueParseError, parse_unit
from factsheet.schema import PARAMETER_KEYS
from factsheet.yamlread import Limits

LIMITS = {
    "mass_1": (0.0, math.inf),
    "mass_2": (0.0, math.inf),
    "luminosity_distance": (0.0, math.inf),
    "redshift": (0.0, math.inf),
    "spin_1z": (-1.0, 1.0),
    "spin_2z": (-1.0, 1.0),
    "chi_eff": (-1.0, 1.0),
}
REQUIRED_COLUMNS = ("mass_1", "mass_2", "luminosity_distance")
HEADER_CELL = re.compile(r"^\s*([A-Za-z_][A-Za-z0-9_]*)\s*(?:\[(.*)\])?\s*$")


def draw(
    estimate: Estimate,
    n: int,
    credible_level: float,
    limits: tuple[float, float],
    rng: np.random.Generator,
) -> np.ndarray:
    """Samples of ``estimate`` from the quantile-matched two-piece normal, truncated to limits."""
    if estimate.exact:
        return np.full(n, estimate.median)
    z = float(ndtri(0.5 + credible_level / 2))
    left, right = estimate.minus / z, estimate.plus / z
    u_low, u_high = (_cdf(x, estimate.median, left, right) for x in limits)
    uniform = rng.uniform(u_low, u_high, n)
    return _quantile(uniform, estimate.median, left, right)


def _cdf(x: float, median: float, left: float, right: float) -> float:
    if math.isinf(x):
        return 0.0 if x < 0 else 1.0
    scale = left if x < median else right
    return float(ndtr((x - median) / scale)) if scale > 0 else float(x >= median)


def _quantile(p: np.ndarray, median: float, left: float, right: float) -> np.ndarray:
    z = ndtri(np.clip(p, 1e-300, 1 - 1e-16))
    return median + np.where(z < 0, left, right) * z


def draw_parameters(
    parameters: Parameters, n: int, credible_level: float, seed: int
) -> dict[str, np.ndarray]:
    """Independent draws of every parameter, in canonical units, mass_1 >= mass_2 kept."""
    rng = np.random.default_rng(seed)
    out = {}
    for name in PARAMETER_KEYS:  # fixed order, so the draws do not depend on the file's order
        if name in parameters:
            out[name] = draw(parameters[name], n, credible_level, LIMITS[name], rng)
    return order_components(out)


def order_components(values: dict[str, np.ndarray]) -> dict[str, np.ndarray]:
    """Relabel components per sample so that mass_1 >= mass_2, spins following their body."""
    swap = values["mass_2"] > values["mass_1"]
    if not swap.any():
        return values
    out = dict(values)
    for a, b in (("mass_1", "mass_2"), ("spin_1z", "spin_2z")):
        if a in values and b in values:
            out[a] = np.where(swap, values[b], values[a])
            out[b] = np.where(swap, values[a], values[b])
    return out


MAX_LINE = 4096  # characters in one CSV line; seven numbers need far fewer


def read_samples_csv(path: Path, max_rows: int = Limits().max_sample_rows) -> dict[str, np.ndarray]:
    """Read a samples CSV whose header cells are ``name [unit]``; values in canonical units."""
    lines = _BoundedLines(None)
    try:
        with Path(path).open(newline="", encoding="utf-8") as handle:
            lines.handle = handle
            return _read_table(path, csv.reader(lines), max_rows)
    except UnicodeDecodeError:
        lines.line += 1
        message = "samples file is not UTF-8 text"
    except csv.Error as exc:
        message = f"not valid CSV ({exc})"
    except OSError as exc:
        message = f"cannot read ({exc.strerror})"
    raise InputError(problems=[Problem(path, max(lines.line, 1), "file", message)]) from None


def check_samples_csv(
    path: Path, max_rows: int, problems: list[Problem]
) -> dict[str, np.ndarray] | None:
    """Read and validate a samples CSV for the load stage; record problems, return the values."""
    try:
        return read_samples_csv(path, max_rows)
    except InputError as exc:
        problems.extend(exc.problems)
        return None


class _BoundedLines:
    """Lines of a text file, refusing NUL bytes and lines longer than :data:`MAX_LINE`."""

    def __init__(self, handle):
        self.handle, self.line = handle, 0

    def __iter__(self):
        while text := self.handle.readline(MAX_LINE + 1):
            self.line += 1
            if "\x00" in text:
                raise csv.Error("the file contains NUL bytes (binary, not CSV)")
            if len(text) > MAX_LINE and not text.endswith("\n"):
                raise csv.Error(f"a line longer than {MAX_LINE} characters")
            yield text


def _read_table(path: Path, reader, max_rows: int) -> dict[str, np.ndarray]:
    header = next(_data_rows(reader), None)
    if header is None:
        raise InputError(problems=[Problem(path, 1, "file", "samples file is empty")])
    problems: list[Problem] = []
    columns = _read_header(path, header, problems, reader.line_num)
    if problems:
        raise InputError(problems=problems)
    flat, lines = _read_rows(path, reader, len(header), max_rows)
    data = np.frombuffer(flat, dtype=float).reshape(-1, len(header))
    out = {name: data[:, i] * factor for i, (name, factor) in columns.items()}
    _check_values(path, out, lines)
    return order_components(out)


def _read_header(
    path: Path, header: list[str], problems: list[Problem], line: int = 1
) -> dict[int, tuple[str, float]]:
    columns: dict[int, tuple[str, float]] = {}
    seen: set[str] = set()
    for i, cell in enumerate(header):
        m = HEADER_CELL.match(cell)
        name = m.group(1) if m else cell
        if name in seen:
            problems.append(Problem(path, line, name, "column given twice"))
            continue
        seen.add(name)
        if not m or name not in PARAMETER_KEYS:
            problems.append(
                Problem(
                    path,
                    line,
                    f"column {cell[:60]!r}",
                    "unknown column (expected "
                    f"'name [unit]' with a name from: {', '.join(PARAMETER_KEYS)})",
                )
            )
            continue
        if (column := _column(path, name, m.group(2) or "", line, problems)) is not None:
            columns[i] = column
    missing = [c for c in REQUIRED_COLUMNS if c not in seen]
    if missing:
        problems.append(Problem(path, line, "header", f"missing column(s): {', '.join(missing)}"))
    if "chi_eff" in seen and seen & {"spin_1z", "spin_2z"}:
        problems.append(
            Problem(path, line, "chi_eff", "give either chi_eff or spin_1z/spin_2z, not both")
        )
    return columns


def _column(path: Path, name: str, unit_text: str, line: int, problems: list[Problem]):
    key = PARAMETER_KEYS[name]
    try:
        unit = parse_unit(unit_text)
    except ValueParseError as exc:
        problems.append(Problem(path, line, name, str(exc)))
        return None
    if unit.physical_type != (key.physical_type or "dimensionless"):
        problems.append(
            Problem(
                path,
                line,
                name,
                f"unit {unit or 'none'} is not a "
                f"{key.physical_type} (e.g. '{name} [{key.canonical_unit}]')",
            )
        )
        return None
    return name, unit.to(key.canonical_unit or u.dimensionless_unscaled)


def _data_rows(reader):
    """Rows that are neither blank nor comments (a first cell starting with '#')."""
    for row in reader:
        if row and not row[0].lstrip().startswith("#"):
            yield row


def _row_problem(path: Path, line: int, message: str) -> InputError:
    return InputError(problems=[Problem(path, line, "row", message)])


def _read_rows(path: Path, reader, width: int, max_rows: int) -> tuple[array, array]:
    flat, lines = array("d"), array("q")
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
            flat.extend(float(x) for x in row)
        except ValueError:
            raise _row_problem(path, line, f"not a number in {row!r}"[:200]) from None
        lines.append(line)
    if not lines:
        raise InputError(problems=[Problem(path, 2, "row", "no sample rows after the header")])
    return flat, lines


def _check_values(path: Path, values: dict[str, np.ndarray], lines: list[int]) -> None:
    for name, x in values.items():
        low, high = LIMITS[name]
        bad = ~np.isfinite(x) | (x < low) | (x > high) | ((x == low) & (low == 0.0))
        if bad.any():
            i = int(np.argmax(bad))
            raise InputError(
                problems=[
                    Problem(path, lines[i], name, f"value {x[i]:g} outside the physical range")
                ]
            )
