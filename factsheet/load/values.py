"""The value syntax of the input: a text or a mapping in, an Interval with a unit out.

Accepted forms (docs/input-format.md, "Values"):

* ``"42 +7 -5 Msun"`` — a median with the distances to the bounds of the catalogue's credible
  interval; ``"30 ± 5 Msun"`` (or ``+/-``) for a symmetric one;
* ``"4 km"`` or ``14.3`` — an exact value (no interval);
* ``"1 / 80 yr"`` or ``"2 / yr"`` — an exact rate, one count per so much time;
* a mapping ``{median: 42, plus: 7, minus: 5, unit: Msun}`` (``plus``/``minus`` optional).

Units are astropy unit strings plus the aliases ``Msun``, ``Mpc``, ``Gpc`` and ``deg2``.
Parsing problems raise :class:`ValueParseError` with a message that says what was expected;
the loader adds the file, line and key.
"""

from __future__ import annotations

import functools
import math
import re

import astropy.units as u

from factsheet.model import Interval

UNIT_ALIASES = {"Msun": "solMass", "Mpc": "Mpc", "Gpc": "Gpc", "deg2": "deg2"}
#: Spellings people type that astropy does not read, with the one it does.
UNIT_SPELLINGS = {
    "ly": "lyr", "light year": "lyr", "light years": "lyr", "light-year": "lyr",
    "light-years": "lyr", "lightyears": "lyr", "parsecs": "pc", "kiloparsec": "kpc",
    "megaparsec": "Mpc", "megaparsecs": "Mpc", "gigaparsec": "Gpc", "gigaparsecs": "Gpc",
    "solar mass": "Msun", "solar masses": "Msun", "msun": "Msun", "M_sun": "Msun",
    "Msol": "Msun", "msol": "Msun", "M_sol": "Msun", "Mo": "Msun", "M⊙": "Msun",
    "years": "yr", "year": "yr", "yrs": "yr", "days": "d", "day": "d", "hours": "h",
    "seconds": "s", "sec": "s", "secs": "s", "sq deg": "deg2", "sq. deg.": "deg2",
    "square degrees": "deg2", "deg^2": "deg2", "degrees": "deg", "degree": "deg",
}  # fmt: skip
#: The accepted forms of a value, said once in an error.
FORMS = (
    "expected 'MEDIAN +PLUS -MINUS UNIT', 'MEDIAN ± ERROR UNIT', "
    "'VALUE UNIT' or a rate 'COUNT / TIME'"
)

_NUMBER = r"[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?"
_INTERVAL = re.compile(rf"^\s*({_NUMBER})\s*\+\s*({_NUMBER})\s*-\s*({_NUMBER})\s*(.*?)\s*$")
#: ``30 ± 5 Msun`` or ``30 +/- 5 Msun``: a symmetric interval, read as ``30 +5 -5 Msun``.
_SYMMETRIC = re.compile(rf"^\s*({_NUMBER})\s*(?:±|\+/-|\+-)\s*({_NUMBER})\s*(.*?)\s*$")
_RATE = re.compile(rf"^\s*({_NUMBER})\s*/\s*({_NUMBER})?\s*([A-Za-z].*?)\s*$")
_EXACT = re.compile(rf"^\s*({_NUMBER})\s*(.*?)\s*$")


class ValueParseError(ValueError):
    """A value that does not follow the input syntax; the message says what was expected."""


@functools.cache
def parse_unit(text: str) -> u.UnitBase:
    """Parse a unit string with astropy, after applying the project's aliases (once per text:
    every event of a catalogue then shares its units)."""
    text = (text or "").strip()
    if not text:
        return u.dimensionless_unscaled
    try:
        unit = u.Unit(UNIT_ALIASES.get(text, text))
    except (ValueError, TypeError, ArithmeticError, KeyError):
        hint = UNIT_SPELLINGS.get(text) or UNIT_SPELLINGS.get(text.lower())
        instead = f": write {hint!r}" if hint else " (astropy unit names, e.g. Msun, Mpc, Hz)"
        raise ValueParseError(f"unknown unit {text[:60]!r}{instead}") from None
    if not isinstance(unit, u.UnitBase):
        raise ValueParseError(f"{text[:60]!r} is a logarithmic unit (expected a plain unit)")
    return unit


@functools.cache
def _per(text: str) -> u.UnitBase:
    """The unit of a rate per ``text`` (``yr`` gives ``1 / yr``), once per text."""
    return parse_unit(text) ** -1


def _finite(x: float | str, what: str) -> float:
    try:
        x = float(x)
    except OverflowError:
        raise ValueParseError(f"{what} is too large for a number") from None
    if not math.isfinite(x):
        raise ValueParseError(f"{what} must be a finite number, got {x}")
    return x


def parse_interval(value: object) -> Interval:
    """Parse any accepted value form into an :class:`~factsheet.model.Interval`."""
    if isinstance(value, bool):
        raise ValueParseError("expected a number or 'MEDIAN +PLUS -MINUS UNIT', got a boolean")
    if isinstance(value, int | float):
        return Interval(_finite(value, "value"), 0.0, 0.0, u.dimensionless_unscaled)
    if isinstance(value, dict):
        return _parse_mapping(value)
    if not isinstance(value, str):
        raise ValueParseError(f"expected 'MEDIAN +PLUS -MINUS UNIT', got {type(value).__name__}")
    return _parse_text(value)


MAX_TEXT = 200  # longer value strings are refused before any pattern is tried on them


def _parse_text(text: str) -> Interval:
    if len(text) > MAX_TEXT:
        raise ValueParseError(f"value text is {len(text)} characters long (at most {MAX_TEXT})")
    if m := _SYMMETRIC.match(text):
        median, error = (_finite(g, "value") for g in m.groups()[:2])
        if error < 0:
            raise ValueParseError(f"the ± error must be non-negative in {text[:80]!r}")
        return Interval(median, error, error, parse_unit(m.group(3)))
    if m := _INTERVAL.match(text):
        median, plus, minus = (_finite(g, "value") for g in m.groups()[:3])
        if plus < 0 or minus < 0:
            raise ValueParseError(f"interval offsets must be non-negative in {text[:80]!r}")
        return Interval(median, plus, minus, parse_unit(m.group(4)))
    if re.search(r"(?<![eE])\+", text) or re.search(rf"{_NUMBER}\s+-", text):  # not 1e+07
        raise ValueParseError(
            f"malformed interval {text[:80]!r} "
            "(expected 'MEDIAN +PLUS -MINUS UNIT', e.g. '42 +7 -5 Msun')"
        )
    if m := _RATE.match(text):
        count = _finite(m.group(1), "count")
        per = _finite(m.group(2) or 1.0, "time")
        if per == 0:
            raise ValueParseError(f"division by zero in {text[:80]!r}")
        return Interval(_finite(count / per, "rate"), 0.0, 0.0, _per(m.group(3)))
    if m := _EXACT.match(text):
        return Interval(_finite(m.group(1), "value"), 0.0, 0.0, parse_unit(m.group(2)))
    raise ValueParseError(f"cannot read {text[:80]!r}: {FORMS}")


def _parse_mapping(value: dict) -> Interval:
    allowed = {"median", "plus", "minus", "unit"}
    unknown = set(map(str, value)) - allowed
    if unknown:
        raise ValueParseError(
            f"unknown field(s) {', '.join(sorted(unknown))} (expected median, plus, minus, unit)"
        )
    if "median" not in value:
        raise ValueParseError("missing 'median' (expected {median, plus, minus, unit})")
    numbers = []
    for name in ("median", "plus", "minus"):
        x = value.get(name, 0.0)
        if isinstance(x, bool) or not isinstance(x, int | float):
            raise ValueParseError(f"'{name}' must be a number, got {x!r}")
        numbers.append(_finite(x, name))
    if numbers[1] < 0 or numbers[2] < 0:
        raise ValueParseError("'plus' and 'minus' must be non-negative")
    unit = value.get("unit", "")
    if not isinstance(unit, str):
        raise ValueParseError(f"'unit' must be a unit string, got {unit!r}")
    return Interval(numbers[0], numbers[1], numbers[2], parse_unit(unit))
