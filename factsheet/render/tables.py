"""The catalogue as one table: ``data/catalogue.ecsv`` and ``data/catalogue.csv``.

One row per event; for each main quantity three columns, ``<name>`` (median), ``<name>_low`` and
``<name>_high`` (bounds of the credible interval, not offsets), with astropy units and masked
where the event has no such quantity (remnant numbers of a neutron-star pair, for example); then
the 90 % sky area and the sky map's most probable position (masked where absent).
The ECSV is astropy's Enhanced Character Separated Values format (units, descriptions and table
meta in a YAML header); the CSV writes each unit into its header cell as ``name [unit]``, the
convention of our samples files. Both are deterministic: no dates, no build clock.

An internal build's tables add ``visibility`` and ``embargo_until`` after the text columns; a
public build's carry no trace of them. The catalogue's ``licence`` and ``citation`` go into the
ECSV's table meta. The CSV stays plain CSV (IETF RFC 4180: a header row, then the data), with
no comment lines — those are not part of the format, and spreadsheets and most readers would
take one for a row of data — so its licence is the one stated beside its link on the index and
in the ECSV.

The CSV is the file people open in a spreadsheet, which runs a cell starting with ``=``, ``+``,
``-``, ``@``, a tab or a carriage return as a formula. Every text cell (id, title, status, source
class, and any text column added later) that starts with one of them is written with a single
quote ``'`` before it, which spreadsheets read as "this cell is text" (the OWASP guidance on CSV
injection); number cells, negative ones included, stay numbers. A line break inside a text cell
is written as one line feed (a carriage return becomes a line feed), so the cell is quoted and
stays one cell. The ECSV is left as written: it is read by astropy, not by spreadsheets.
"""

from __future__ import annotations

import csv
import functools
import io
import math
from collections.abc import Callable, Iterator

import astropy.units as u
import numpy as np
from astropy.table import Column, MaskedColumn, Table

from factsheet.labels import QUANTITIES
from factsheet.model import Derived, Settings
from factsheet.notation import utc_iso
from factsheet.render.event_json import CONTRACT_QUANTITIES

MAIN_QUANTITIES = CONTRACT_QUANTITIES  # every quantity of the JSON contract

TEXT_COLUMNS = {
    "id": "event designation (also the page and JSON file name)",
    "title": "display title",
    "time_utc": "merger time, UTC, ISO 8601",
    "status": "candidate, confirmed or retracted",
    "source_class": "BNS, NSBH or BBH, from the masses and the neutron-star mass bound",
}

#: Columns only an internal build's tables carry.
INTERNAL_COLUMNS = {
    "visibility": "public or internal (internal builds only)",
    "embargo_until": "UTC time before which a public build leaves the event out, or empty",
}

NOTE = (
    "Numbers are derived from published fits applied to the summary given for each event, "
    "not from a full re-analysis of the data; preliminary estimates can change."
)


def catalogue_table(derived: list[Derived], audience: str = "public") -> Table:
    """One row per event: text columns and median/low/high of each main quantity, with units;
    an internal build's table also says which events a public build leaves out."""
    table = Table()
    text = TEXT_COLUMNS | (INTERNAL_COLUMNS if audience == "internal" else {})
    for name, description in text.items():
        table[name] = Column([_text(d, name) for d in derived], dtype=str, description=description)
    settings = derived[0].settings if derived else Settings()
    level = settings.credible_level
    for name in MAIN_QUANTITIES:
        for column in _quantity_columns(derived, name, level):
            table.add_column(column)
    for column in _sky_columns(derived):
        table.add_column(column)
    table.meta.update(_meta(settings))
    return table


def _text(item: Derived, name: str) -> str:
    event = item.event
    embargo = utc_iso(event.embargo_until) if event.embargo_until is not None else ""
    values = {
        "time_utc": utc_iso(event.time),
        "source_class": item.source_class,
        "embargo_until": embargo,
    }
    return values[name] if name in values else str(getattr(event, name))


def _quantity_columns(derived: list[Derived], name: str, level: float) -> list[MaskedColumn]:
    """Median, low and high of ``name`` in one unit (the first event's), masked where absent."""
    present = [d.quantities[name] for d in derived if name in d.quantities]
    unit = u.Unit(present[0].unit) if present else u.dimensionless_unscaled
    label, frame = QUANTITIES[name].name, (present[0].frame if present else None)
    where = f", {frame} frame" if frame else ""
    percent = f"{100 * (present[0].level if present else level):g} %"
    parts = {
        "": f"{label}{where}: median",
        "_low": f"{label}{where}: lower bound of the {percent} credible interval",
        "_high": f"{label}{where}: upper bound of the {percent} credible interval",
    }
    columns = []
    for suffix, description in parts.items():
        field = {"": "median", "_low": "low", "_high": "high"}[suffix]
        values = [_value(d, name, field, unit) for d in derived]
        data = np.array([np.nan if v is None else v for v in values], dtype=float)
        mask = np.array([v is None for v in values], dtype=bool)
        columns.append(
            MaskedColumn(
                data,
                mask=mask,
                name=name + suffix,
                unit=None if unit == u.dimensionless_unscaled else unit,
                description=description,
            )
        )
    return columns


#: Where in the sky, after the quantities: (name, unit, description).
SKY_COLUMNS = (
    ("sky_area_90", u.deg**2, "area of the 90 % credible sky region: the sky map's, else as given"),
    ("sky_peak_ra", u.deg, "right ascension of the sky map's most probable pixel (equatorial)"),
    ("sky_peak_dec", u.deg, "declination of the sky map's most probable pixel (equatorial)"),
)


def _sky_values(item: Derived) -> dict[str, float | None]:
    found, given = item.sky_map, item.event.detection.sky_area
    area = found.area_90 if found is not None else given
    return {
        "sky_area_90": None if area is None else float(area.to_value(u.deg**2)),
        "sky_peak_ra": None if found is None else float(found.peak_ra.to_value(u.deg)),
        "sky_peak_dec": None if found is None else float(found.peak_dec.to_value(u.deg)),
    }


def _sky_columns(derived: list[Derived]) -> list[MaskedColumn]:
    rows = [_sky_values(d) for d in derived]
    columns = []
    for name, unit, description in SKY_COLUMNS:
        values = [r[name] for r in rows]
        data = np.array([np.nan if v is None else v for v in values], dtype=float)
        mask = np.array([v is None for v in values], dtype=bool)
        columns.append(MaskedColumn(data, mask=mask, name=name, unit=unit, description=description))
    return columns


def _value(item: Derived, name: str, field: str, unit: u.UnitBase) -> float | None:
    summary = item.quantities.get(name)
    if summary is None:
        return None
    return getattr(summary, field) * _factor(summary.unit, unit)


@functools.cache
def _factor(source: str, target: u.UnitBase) -> float:
    return float(u.Unit(source).to(target))


def _meta(settings: Settings) -> dict:
    return {
        "credible_level": settings.credible_level,
        "cosmology": settings.cosmology,
        "low_frequency": f"{settings.low_frequency.to_value(u.Hz):g} Hz",
        "note": NOTE,
    } | {
        key: str.__str__(text)
        for key in ("licence", "citation")
        if (text := getattr(settings, key))
    }


#: Rows written at a time: the text of one block is made while the table is written, never
#: the text of every cell at once (a catalogue of ten thousand events writes ten blocks).
BLOCK_ROWS = 1000


def write_ecsv(table: Table) -> bytes:
    """The table in astropy's ECSV format (units, descriptions and meta in the YAML header):
    the header as astropy writes it for the table without rows, then the rows as astropy
    writes them (space-separated, text quoted where it must be, masked cells ``""``), a block
    at a time, column by column (a test checks the bytes equal astropy's own writing)."""
    out = io.StringIO()
    table[:0].write(out, format="ascii.ecsv")
    out.writelines(" ".join(row) + "\n" for row in _rows(table, _ecsv_cells))
    return out.getvalue().encode("utf-8")


def _rows(table: Table, cells: Callable[[Column], list[str]]) -> Iterator[tuple[str, ...]]:
    """Every row of the table as its cells' texts: column by column (the cells of one column
    made in one pass; walking the table row by row cost ~1.7 ms a row), a block of
    :data:`BLOCK_ROWS` rows at a time."""
    for start in range(0, len(table), BLOCK_ROWS):
        block = table[start : start + BLOCK_ROWS]
        yield from zip(*(cells(block[name]) for name in block.colnames), strict=True)


def _ecsv_cells(column: Column) -> list[str]:
    """Every cell of one column as ECSV text: numbers in their shortest round-trip form."""
    mask = np.ma.getmaskarray(column).tolist()
    values = np.asarray(column).tolist()
    if column.dtype.kind == "f":
        return ['""' if hidden else repr(v) for v, hidden in zip(values, mask, strict=True)]
    return ['""' if hidden else _ecsv_text(str(v)) for v, hidden in zip(values, mask, strict=True)]


def _ecsv_text(value: str) -> str:
    """A text cell of the ECSV as astropy writes one: without surrounding white space, and
    quoted when empty or holding a space, a quote or a line break (a quote doubled inside)."""
    value = value.strip()
    if value and not any(c in value for c in ' "\n\r'):
        return value
    return '"' + value.replace('"', '""') + '"'


#: First characters that make a spreadsheet read a cell as a formula (OWASP, CSV injection);
#: a leading line feed is quoted too, as the carriage return it may have been.
FORMULA_STARTS = ("=", "+", "-", "@", "\t", "\r", "\n")


def write_csv(table: Table) -> bytes:
    """Plain CSV, each header cell ``name [unit]`` (no bracket when dimensionless); text cells
    that a spreadsheet would run as a formula are quoted with a leading ``'``."""
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow([_header(table[name]) for name in table.colnames])
    writer.writerows(_rows(table, _cells))
    return out.getvalue().encode("utf-8")


def _cells(column: Column) -> list[str]:
    """Every cell of one column as CSV text: masked cells and non-finite numbers empty, numbers
    in their shortest round-trip form, text through :func:`text_cell`."""
    mask = np.ma.getmaskarray(column)
    if column.dtype.kind in "USO":
        values = [text_cell(str(v)) for v in np.asarray(column).tolist()]
    elif column.dtype.kind == "f":
        values = [repr(v) if math.isfinite(v) else "" for v in np.asarray(column).tolist()]
    else:
        values = [str(v) for v in np.asarray(column).tolist()]
    return ["" if hidden else v for v, hidden in zip(values, mask.tolist(), strict=True)]


def text_cell(value: str) -> str:
    """A text cell a spreadsheet shows as text: a leading ``'`` where it would be a formula, and
    line breaks as line feeds (the CSV writer quotes a cell holding one, not a carriage return)."""
    value = "'" + value if value.startswith(FORMULA_STARTS) else value
    return value.replace("\r\n", "\n").replace("\r", "\n")


def _header(column: Column) -> str:
    return f"{column.name} [{column.unit.to_string()}]" if column.unit else column.name
