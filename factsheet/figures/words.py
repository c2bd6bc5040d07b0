"""Numbers in alt text: intervals as ``36 (32–41) M⊙``, rounded like the pages round them, in
the language in use (called while a figure is drawn for one language)."""

from __future__ import annotations

import math

import astropy.units as u

from factsheet.i18n import _, decimal_text, ngettext
from factsheet.notation import decimal_place, format_value, unit_text


def _fmt(x: float, place: int) -> str:
    return decimal_text(round(x, -place), max(0, -place))


def interval_words(median: float, low: float, high: float, unit: str | u.UnitBase = "") -> str:
    """``median (low–high) unit``, rounded by the smaller error (PDG rounding rule)."""
    errs = [e for e in (high - median, median - low) if e > 0]
    if not errs or not all(map(math.isfinite, (median, low, high))):
        return value_words(median, unit)
    if max(abs(median), abs(high)) >= 1e5 or 0 < abs(median) < 1e-3:
        value, lowest, highest = format_value(median), format_value(low), format_value(high)
        core = f"{value} ({lowest}–{highest})"
    else:
        place = decimal_place(min(errs))
        value, lowest, highest = (_fmt(x, place) for x in (median, low, high))
        core = f"{value} ({lowest}–{highest})"
        if low < 0:  # "−0.10–0.20" would read as a subtraction
            core = _("{value} ({low} to {high})").format(value=value, low=lowest, high=highest)
    return f"{core} {unit_text(unit)}".strip()


def value_words(value: float, unit: str | u.UnitBase = "", digits: int = 2) -> str:
    """A single value to ``digits`` significant figures with its unit."""
    return format_value(value, unit, digits)


def count_words(n: int, singular: str, plural: str | None = None) -> str:
    """A count with its noun in the language in use: ``1 event`` / ``3 events``.

    ``singular`` and ``plural`` are the English messages with a ``{n}`` placeholder, chosen by
    the language's plural rule: ``count_words(n, "{n} event", "{n} events")`` (the message
    extractor reads them as a plural pair). The older form ``count_words(n, "event")``, a bare
    English noun, still gives ``3 events`` but is not translated.
    """
    if plural is None and "{n}" not in singular:
        return f"{n} {singular}" if n == 1 else f"{n} {singular}s"
    return ngettext(singular, plural or singular, n).format(n=decimal_text(n, 0))
