"""Numbers in alt text: intervals as ``36 (32–41) M⊙``, rounded like the pages round them."""

from __future__ import annotations

import math

import astropy.units as u

from factsheet.notation import decimal_place, format_value, unit_text


def _fmt(x: float, place: int) -> str:
    return f"{round(x, -place):.{max(0, -place)}f}".replace("-", "−")


def interval_words(median: float, low: float, high: float, unit: str | u.UnitBase = "") -> str:
    """``median (low–high) unit``, rounded by the smaller error (PDG rounding rule)."""
    errs = [e for e in (high - median, median - low) if e > 0]
    if not errs or not all(map(math.isfinite, (median, low, high))):
        return value_words(median, unit)
    if max(abs(median), abs(high)) >= 1e5 or 0 < abs(median) < 1e-3:
        core = f"{format_value(median)} ({format_value(low)}–{format_value(high)})"
    else:
        place = decimal_place(min(errs))
        dash = " to " if low < 0 else "–"  # "−0.10–0.20" would read as a subtraction
        core = f"{_fmt(median, place)} ({_fmt(low, place)}{dash}{_fmt(high, place)})"
    return f"{core} {unit_text(unit)}".strip()


def value_words(value: float, unit: str | u.UnitBase = "", digits: int = 2) -> str:
    """A single value to ``digits`` significant figures with its unit."""
    return format_value(value, unit, digits)


def count_words(n: int, noun: str) -> str:
    """``1 event`` / ``3 events``."""
    return f"{n} {noun}" if n == 1 else f"{n} {noun}s"
