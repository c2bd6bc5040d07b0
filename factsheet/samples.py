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
from pathlib import Path

import astropy.units as u
import numpy as np
from scipy.special import ndtr, ndtri

from factsheet.errors import InputError, Problem
from factsheet.model import Parameters
from factsheet.quantities import Estimate, ValueParseError, parse_unit
from factsheet.schema import PARAMETER_KEYS

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


def read_samples_csv(path: Path, max_rows: int = 1_000_000) -> dict[str, np.ndarray]:
    """Read a samples CSV whose header cells are ``name [unit]``; values in canonical units."""
    problems: list[Problem] = []
    try:
        with path.open(newline="", encoding="utf-8") as handle:
            reader = csv.reader(handle)
            header = next(_data_rows(reader), None)
            if header is None:
                raise InputError(problems=[Problem(path, 1, "", "samples file is empty")])
            columns = _read_header(path, header, problems)
            if problems:
                raise InputError(problems=problems)
            rows, lines = _read_rows(path, reader, len(header), max_rows)
    except UnicodeDecodeError:
        raise InputError(
            problems=[Problem(path, None, "", "samples file is not UTF-8 text")]
        ) from None
    except OSError as exc:
        raise InputError(
            problems=[Problem(path, None, "", f"cannot read ({exc.strerror})")]
        ) from None
    data = np.asarray(rows, dtype=float).reshape(-1, len(header))
    out = {name: data[:, i] * factor for i, (name, factor) in columns.items()}
    _check_values(path, out, lines)
    return order_components(out)


def _read_header(
    path: Path, header: list[str], problems: list[Problem]
) -> dict[int, tuple[str, float]]:
    columns: dict[int, tuple[str, float]] = {}
    seen = set()
    for i, cell in enumerate(header):
        m = HEADER_CELL.match(cell)
        name = m.group(1) if m else cell
        seen.add(name)
        if not m or name not in PARAMETER_KEYS:
            problems.append(
                Problem(
                    path,
                    1,
                    f"column {cell!r}",
                    "unknown column (expected "
                    f"'name [unit]' with a name from: {', '.join(PARAMETER_KEYS)})",
                )
            )
            continue
        key = PARAMETER_KEYS[name]
        try:
            unit = parse_unit(m.group(2) or "")
        except ValueParseError as exc:
            problems.append(Problem(path, 1, name, str(exc)))
            continue
        if unit.physical_type != (key.physical_type or "dimensionless"):
            problems.append(
                Problem(
                    path,
                    1,
                    name,
                    f"unit {unit or 'none'} is not a "
                    f"{key.physical_type} (e.g. '{name} [{key.canonical_unit}]')",
                )
            )
            continue
        columns[i] = (name, unit.to(key.canonical_unit or u.dimensionless_unscaled))
    missing = [c for c in REQUIRED_COLUMNS if c not in seen]
    if missing:
        problems.append(Problem(path, 1, "header", f"missing column(s): {', '.join(missing)}"))
    return columns


def _data_rows(reader):
    """Rows that are neither blank nor comments (a first cell starting with '#')."""
    for row in reader:
        if row and not row[0].lstrip().startswith("#"):
            yield row


def _read_rows(path: Path, reader, width: int, max_rows: int) -> tuple[list, list[int]]:
    rows, lines = [], []
    for row in _data_rows(reader):
        line = reader.line_num
        lines.append(line)
        if len(rows) >= max_rows:
            raise InputError(
                problems=[
                    Problem(
                        path,
                        line,
                        "",
                        f"more than {max_rows} rows "
                        "(raise limits.max_sample_rows in catalogue.yaml)",
                    )
                ]
            )
        if len(row) != width:
            raise InputError(
                problems=[Problem(path, line, "", f"{len(row)} cells, expected {width}")]
            )
        try:
            rows.append([float(x) for x in row])
        except ValueError:
            raise InputError(
                problems=[Problem(path, line, "", f"not a number in {row!r}")]
            ) from None
    if not rows:
        raise InputError(problems=[Problem(path, 2, "", "no sample rows after the header")])
    return rows, lines


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
