"""Read and check a HEALPix sky map: a FITS binary table of one probability per pixel.

The map is the first binary table of the file. Its probability column is the one named
``PROB`` or ``PROBABILITY`` (any letter case), or the table's only column; the header gives
``NSIDE`` (a power of 2 up to 2048), ``ORDERING`` (``RING`` or ``NESTED``), ``COORDSYS``
(``C``, equatorial, or absent) and ``INDXSCHM`` (``IMPLICIT`` or absent: every pixel of the
sky, in order). A column may hold one value per row or a fixed number per row (the common
layout of 1024 values a row). The map must hold 12 NSIDE² finite, non-negative values, not all
zero; it is normalised to sum to 1 (a density map, in sr-1, needs no more), with a warning when
a probability map sums far from 1.

Only a regular file is opened (never a FIFO or a device). The header is read with
``astropy.io.fits``; the column is then read in chunks of rows straight from the file, so a map
of NSIDE 2048 (50 million pixels) is checked with a few megabytes of temporaries, and read
back as one float32 array. Problems name the map file and the event file's line and key.
"""

from __future__ import annotations

import hashlib
import warnings
from collections.abc import Iterator
from pathlib import Path
from typing import BinaryIO, NamedTuple

import astropy.units as u
import numpy as np

from factsheet.errors import InputError, Problem
from factsheet.load import files
from factsheet.model import SkyMapFile
from factsheet.physics.sky import ORDERS, check_nside, pixel_count

#: Pixels converted at a time while a map is walked (8 MB of doubles).
CHUNK_PIXELS = 1 << 20
#: A map that sums outside this range gets a warning as it is normalised.
NORMAL_TOTAL = (0.99, 1.01)
PROBABILITY_NAMES = ("PROB", "PROBABILITY")
_COORDINATES = {"G": "galactic", "E": "ecliptic"}
_READ_BLOCK = 1 << 20
FITS_BLOCK = 2880  # bytes: FITS files are written in whole blocks


class Where(NamedTuple):
    """Where the map is named: the event file, the line of the key and the key's path."""

    file: Path | str
    line: int | None
    key: str = "detection.sky_map"


class MapProblem(ValueError):
    """A map that cannot be read; the message says what is wrong and what was expected."""


class _Layout(NamedTuple):
    """Where the probability column lies in the file and how it is stored."""

    start: int  # byte offset of the table's data
    row_bytes: int
    rows: int
    offset: int  # of the column within a row
    dtype: np.dtype  # of one value, as stored (big-endian)
    repeat: int  # values per row
    scale: float
    zero: float
    density: bool  # the column's unit is per solid angle


def check_sky_map(
    path: Path, problems: list[Problem], warnings: list[Problem], where: Where
) -> SkyMapFile | None:
    """Check the map at ``path`` for the load stage; record its problems and warnings."""
    try:
        with files.open_regular(Path(path)) as handle:
            digest = _digest(handle)
            sky, layout = _read_header(handle, Path(path))
            total = _walk(handle, layout)
    except (files.FileRefused, MapProblem) as exc:
        problems.append(Problem(where.file, where.line, where.key, f"sky map {path}: {exc}"))
        return None
    except OSError as exc:
        message = f"sky map {path}: cannot read ({exc.strerror or exc})"
        problems.append(Problem(where.file, where.line, where.key, message))
        return None
    low, high = NORMAL_TOTAL
    if not layout.density and not low <= total <= high:
        message = (
            f"sky map {path}: the probabilities sum to {total:.6g}, not 1; the map is "
            "normalised (expected probabilities per pixel summing to 1, or a density in sr-1)"
        )
        warnings.append(Problem(where.file, where.line, where.key, message))
    return SkyMapFile(Path(path), digest, sky.nside, sky.ordering, sky.column)


def read_probabilities(sky: SkyMapFile) -> np.ndarray:
    """The map as checked, normalised to sum to 1, as float32 in the file's ordering.

    :class:`InputError` when the file cannot be read or its bytes changed since the check.
    """
    try:
        with files.open_regular(sky.path) as handle:
            if _digest(handle) != sky.digest:
                raise MapProblem(
                    "the file changed since it was checked (check the catalogue again)"
                )
            _, layout = _read_header(handle, sky.path)
            total = _walk(handle, layout)
            out = np.empty(layout.rows * layout.repeat, dtype=np.float32)
            for start, values in _chunks(handle, layout):
                out[start : start + len(values)] = values / total
            return out
    except (files.FileRefused, MapProblem, OSError) as exc:
        text = str(exc) if not isinstance(exc, OSError) else f"cannot read ({exc.strerror or exc})"
        raise InputError(problems=[Problem(sky.path, None, "sky map", text)]) from None


def _digest(handle: BinaryIO) -> str:
    """SHA-256 of the file's bytes, read in blocks; the handle is left at the start."""
    digest = hashlib.sha256()
    while block := handle.read(_READ_BLOCK):
        digest.update(block)
    handle.seek(0)
    return digest.hexdigest()


def _read_header(handle: BinaryIO, path: Path) -> tuple[SkyMapFile, _Layout]:
    """The map's layout from its FITS header; :class:`MapProblem` says what is wrong."""
    from astropy.io import fits  # imported here: only events with a sky map need it

    size = handle.seek(0, 2)
    handle.seek(0)
    if size == 0:
        raise MapProblem("the file is empty (expected a HEALPix map in FITS)")
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")  # truncation is checked below, with its numbers
            # fits closes the file object it is given: give it one that leaves the file open
            with (
                open(handle.fileno(), "rb", closefd=False) as view,
                fits.open(view, memmap=True, lazy_load_hdus=True) as hdus,
            ):
                table = next((h for h in hdus if isinstance(h, fits.BinTableHDU)), None)
                if table is None:
                    raise MapProblem(f"no binary table in the file ({_why_no_table(size)})")
                header, info = table.header, table.fileinfo()
                columns = table.columns
    except MapProblem:
        raise
    except Exception as exc:  # astropy raises OSError, ValueError, KeyError, ... on bad bytes
        raise MapProblem(f"not a readable FITS file ({_short(exc)})") from None
    finally:
        handle.seek(0)
    sky, layout = _layout(header, columns, info["datLoc"], path)
    end = layout.start + layout.row_bytes * layout.rows
    if end > size:
        raise MapProblem(f"the file is truncated: its table needs {end} bytes, the file has {size}")
    return sky, layout


def _layout(header, columns, start: int, path: Path) -> tuple[SkyMapFile, _Layout]:
    names = list(columns.names)
    if any(n.upper() == "UNIQ" for n in names):
        raise MapProblem(
            "a multi-order map (a UNIQ column) is not read; write it as a single-order map "
            "(every pixel at one NSIDE, ORDERING = RING or NESTED)"
        )
    column = _probability_column(names)
    scheme = str(header.get("INDXSCHM", "IMPLICIT")).strip().upper()
    if scheme != "IMPLICIT":
        raise MapProblem(
            f"INDXSCHM = {scheme!r}: a partial map (explicit pixel indices) is not read; "
            "write the whole sky with INDXSCHM = 'IMPLICIT'"
        )
    nside = _nside(header)
    ordering = _ordering(header)
    _coordinates(header)
    fmt = columns[column].format
    field, offset = columns.dtype.fields[column][:2]
    if field.base.kind not in "iuf" or columns.dtype.itemsize != header.get("NAXIS1"):
        raise MapProblem(
            f"column {column!r} has format {fmt!s}: expected numbers (e.g. E or D, or 1024E)"
        )
    repeat = int(np.prod(field.shape)) if field.shape else 1
    rows = int(header.get("NAXIS2", 0))
    if rows * repeat != pixel_count(nside):
        raise MapProblem(
            f"{rows * repeat} pixels, but NSIDE {nside} needs 12 × {nside}² = {pixel_count(nside)}"
        )
    col = columns[column]
    layout = _Layout(
        start=start,
        row_bytes=columns.dtype.itemsize,
        rows=rows,
        offset=offset,
        dtype=field.base.newbyteorder(">"),
        repeat=repeat,
        scale=1.0 if col.bscale is None else float(col.bscale),
        zero=0.0 if col.bzero is None else float(col.bzero),
        density=_is_density(col.unit),
    )
    return SkyMapFile(path, "", nside, ordering, column), layout


def _probability_column(names: list[str]) -> str:
    found = [n for n in names if n.upper() in PROBABILITY_NAMES]
    if found:
        return found[0]
    if len(names) == 1:
        return names[0]
    listed = ", ".join(repr(n) for n in names) or "none"
    raise MapProblem(
        f"no probability column: the table's columns are {listed} (expected one named PROB "
        "or PROBABILITY, or a table of a single column)"
    )


def _nside(header) -> int:
    if "NSIDE" not in header:
        raise MapProblem("NSIDE is missing from the table's header (e.g. NSIDE = 64)")
    raw = header["NSIDE"]
    try:
        return check_nside(raw)
    except ValueError:
        raise MapProblem(
            f"NSIDE = {raw!r} is not a power of 2 from 1 to 2048 (maps finer than NSIDE "
            "2048 are not read; write the map at NSIDE 2048 or coarser)"
        ) from None


def _ordering(header) -> str:
    raw = str(header.get("ORDERING", "")).strip().upper()
    ordering = "NESTED" if raw == "NEST" else raw
    if ordering not in ORDERS:
        given = f"ORDERING = {header['ORDERING']!r}" if "ORDERING" in header else "no ORDERING"
        raise MapProblem(f"{given} in the table's header (expected RING or NESTED)")
    return ordering


def _coordinates(header) -> None:
    raw = str(header.get("COORDSYS", "C")).strip().upper()
    if raw not in ("C", "CELESTIAL", "EQUATORIAL"):
        name = _COORDINATES.get(raw[:1], "an unknown system") if raw else "an unknown system"
        raise MapProblem(
            f"COORDSYS = {header['COORDSYS']!r} ({name}): convert the map to equatorial "
            "coordinates (COORDSYS = 'C') first"
        )


def _is_density(unit: str | None) -> bool:
    """Whether a column's unit is per solid angle (sr-1, deg-2)."""
    if not unit:
        return False
    parsed = u.Unit(unit, parse_strict="silent")
    return not isinstance(parsed, u.UnrecognizedUnit) and (parsed * u.sr).physical_type == (
        "dimensionless"
    )


def _chunks(handle: BinaryIO, layout: _Layout) -> Iterator[tuple[int, np.ndarray]]:
    """The column's values in file order, as doubles, a few rows at a time, with the index of
    each chunk's first pixel; only one chunk's bytes are held at once."""
    step = max(1, CHUNK_PIXELS // layout.repeat)
    handle.seek(layout.start)
    for row in range(0, layout.rows, step):
        n = min(step, layout.rows - row)
        data = handle.read(n * layout.row_bytes)
        if len(data) < n * layout.row_bytes:
            raise MapProblem("the file is truncated: it ends inside the table")
        values = np.ndarray(
            (n, layout.repeat),
            dtype=layout.dtype,
            buffer=data,
            offset=layout.offset,
            strides=(layout.row_bytes, layout.dtype.itemsize),
        ).astype(np.float64)
        if layout.scale != 1.0 or layout.zero != 0.0:
            values = values * layout.scale + layout.zero
        yield row * layout.repeat, values.ravel()


def _walk(handle: BinaryIO, layout: _Layout) -> float:
    """The sum of the column, after checking every value is finite and not negative."""
    total = 0.0
    for start, values in _chunks(handle, layout):
        bad = ~np.isfinite(values) | (values < 0)
        if bad.any():
            i = int(np.argmax(bad))
            raise MapProblem(
                f"pixel {start + i} holds {values[i]:g} (expected finite probabilities, none "
                "negative)"
            )
        total += float(np.sum(values))
    if not total > 0:
        raise MapProblem("every pixel is zero: the map holds no probability")
    if not np.isfinite(total):
        raise MapProblem("the values sum to more than a double can hold")
    return total


def _why_no_table(size: int) -> str:
    if size % FITS_BLOCK:
        return (
            f"the file's {size} bytes are not a whole number of {FITS_BLOCK}-byte FITS blocks: "
            "it may be truncated"
        )
    return "a HEALPix map is a FITS binary table with a probability column"


def _short(exc: Exception) -> str:
    text = str(exc).split(". ")[0].strip() or type(exc).__name__
    return text[:160]
