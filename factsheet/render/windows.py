"""Counterpart windows as a sheet prints them: UTC dates at a precision that fits their width.

A window of seconds is given to the second, one of hours to the hour, one of days to the day
and one of years to the month. The start is rounded down and the end up, so the printed window
always contains the computed one.
"""

from __future__ import annotations

from dataclasses import dataclass
from datetime import datetime, timedelta

from astropy.time import Time

from factsheet import labels
from factsheet.model import Derived

#: (largest width in seconds, the precision used up to it), narrowest first.
PRECISIONS = (
    (120.0, "second"),
    (2 * 3600.0, "minute"),
    (3 * 86400.0, "hour"),
    (400 * 86400.0, "day"),
    (float("inf"), "month"),
)
FORMATS = {
    "second": "%Y-%m-%d %H:%M:%S",
    "minute": "%Y-%m-%d %H:%M",
    "hour": "%Y-%m-%d %H:00",
    "day": "%Y-%m-%d",
    "month": "%Y-%m",
}


@dataclass(frozen=True)
class WindowRow:
    name: str
    plain: str
    band: str
    start: str  # UTC at the window's precision
    end: str
    precision: str  # second, minute, hour, day or month
    start_iso: str  # the full ISO times, for the <time> elements
    end_iso: str


def precision(width_seconds: float) -> str:
    """The precision that fits a window this wide."""
    return next(name for limit, name in PRECISIONS if width_seconds < limit)


#: The fields of a datetime below each precision, which rounding down sets to their start.
BELOW = {
    "second": ("microsecond",),
    "minute": ("second", "microsecond"),
    "hour": ("minute", "second", "microsecond"),
    "day": ("hour", "minute", "second", "microsecond"),
    "month": ("hour", "minute", "second", "microsecond"),
}


def _floor(t: datetime, unit: str) -> datetime:
    start = dict.fromkeys(BELOW[unit], 0) | ({"day": 1} if unit == "month" else {})
    return t.replace(**start)


def _ceil(t: datetime, unit: str) -> datetime:
    down = _floor(t, unit)
    if down == t:
        return t
    if unit == "month":
        return down.replace(year=down.year + down.month // 12, month=down.month % 12 + 1)
    step = {"second": 1, "minute": 60, "hour": 3600, "day": 86400}[unit]
    return down + timedelta(seconds=step)


def _datetime(t: Time) -> datetime:
    """A UTC time as a datetime; a time inside a leap second (23:59:60, which datetime cannot
    hold) is taken as the end of the second before it."""
    try:
        return t.utc.to_datetime()
    except ValueError:
        return datetime.fromisoformat(t.utc.isot[:17] + "59.999999")


def window_times(start: Time, end: Time) -> tuple[str, str, str]:
    """A window's start and end in UTC at the precision its width calls for, and that
    precision."""
    unit = precision((end - start).to_value("s"))
    first, last = _datetime(start), _datetime(end)
    fmt = FORMATS[unit]
    return _floor(first, unit).strftime(fmt), _ceil(last, unit).strftime(fmt), unit


def window_rows(item: Derived) -> tuple[WindowRow, ...]:
    rows = []
    for w in item.windows:
        start, end, unit = window_times(w.start, w.end)
        rows.append(
            WindowRow(
                labels.WINDOWS[w.key].name,
                labels.WINDOWS[w.key].plain,
                labels.WINDOW_BANDS[w.band],
                start,
                end,
                unit,
                w.start.utc.isot,
                w.end.utc.isot,
            )
        )
    return tuple(rows)
