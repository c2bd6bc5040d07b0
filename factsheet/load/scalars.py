"""Convert one plain value of an input file by the kind of its key (text, time, interval, ...).

Each converter takes the raw YAML value and its :class:`~factsheet.load.schema.Key` and returns
the converted value or raises :class:`Bad` with a message that says what was expected. The
:class:`~factsheet.load.checker.Checker` adds the file, line and key path.
"""

from __future__ import annotations

import difflib
import math
import re
import warnings
from collections.abc import Callable
from pathlib import Path
from typing import Any

import astropy.units as u
from astropy.time import Time
from erfa import ErfaWarning

from factsheet.load.schema import Key
from factsheet.load.values import ValueParseError, parse_interval
from factsheet.model import Interval

SLUG = re.compile(r"^[A-Za-z0-9][A-Za-z0-9._-]{0,99}$")


class Bad(ValueError):
    """A value that its key does not accept; the message says what was expected."""


def parse_time(text: str) -> Time:
    """Parse an ISO 8601 UTC time; years past the leap-second table are expected here."""
    text = text.strip().removesuffix("Z")
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", ErfaWarning)
        return Time(text, format="isot" if "T" in text else "iso", scale="utc")


def show(raw: object) -> str:
    """A short form of a value for messages; lists and mappings (maybe alias-shared) by size."""
    if isinstance(raw, list | tuple):
        return f"a list of {len(raw)} items"
    if isinstance(raw, dict):
        return f"a mapping of {len(raw)} keys"
    text = repr(raw) if isinstance(raw, str | int | float | bool | None) else type(raw).__name__
    return text if len(text) <= 60 else text[:57] + "..."


def text(raw: object, key: Key) -> str:
    if not isinstance(raw, str | int | float) or isinstance(raw, bool):
        raise Bad(f"expected text, got {type(raw).__name__}")
    value = str(raw).strip()
    if not value:
        raise Bad("must not be empty")
    return value


def slug(raw: object, key: Key) -> str:
    if not isinstance(raw, str) or not SLUG.match(raw):
        raise Bad(
            f"invalid id {show(raw)} (expected a URL-safe slug of letters, "
            "digits, '.', '_' and '-', e.g. DX-0412; no slashes)"
        )
    if raw.startswith("."):
        raise Bad(f"invalid id {show(raw)} (must not start with '.')")
    return raw


def choice(raw: object, key: Key) -> str:
    if not isinstance(raw, str) or raw not in key.choices:
        close = difflib.get_close_matches(show(raw), key.choices, n=1)
        hint = f"did you mean '{close[0]}'? " if close else ""
        raise Bad(f"invalid value {show(raw)} ({hint}expected one of: {', '.join(key.choices)})")
    return raw


def time(raw: object, key: Key) -> Time:
    if not isinstance(raw, str):
        raise Bad(f"expected an ISO 8601 UTC time, got {show(raw)}")
    try:
        return parse_time(raw)
    except (ValueError, TypeError, OverflowError):
        raise Bad(
            f"bad time {show(raw)} (expected ISO 8601 UTC, e.g. 2034-04-12T07:26:41.2)"
        ) from None


def number(raw: object, key: Key) -> float:
    if isinstance(raw, bool):
        raise Bad(f"expected a number, got {show(raw)}")
    try:
        x = float(raw)  # type: ignore[arg-type]
    except (TypeError, ValueError, OverflowError):
        raise Bad(f"expected a number, got {show(raw)}") from None
    in_range(x, key, "")
    return x


def count(raw: object, key: Key) -> int:
    if isinstance(raw, bool) or not isinstance(raw, int) or not 100 <= raw <= 1_000_000:
        raise Bad(f"expected a whole number from 100 to 1000000, got {show(raw)}")
    return raw


def cosmology(raw: object, key: Key) -> str:
    from astropy.cosmology import realizations

    names = list(realizations.available)
    if raw not in names:
        close = difflib.get_close_matches(str(raw), names, n=1)
        hint = f"did you mean '{close[0]}'? " if close else ""
        raise Bad(
            f"unknown cosmology {show(raw)} ({hint}expected an astropy "
            f"realisation: {', '.join(names)})"
        )
    return str(raw)


def labels(raw: object, key: Key) -> tuple[str, ...]:
    if not isinstance(raw, list) or not all(isinstance(x, str | int) for x in raw):
        raise Bad("expected a list of labels, e.g. [A1, B1]")
    return tuple(str(x) for x in raw)


def markdown_list(raw: object, key: Key) -> tuple[str, ...]:
    if not isinstance(raw, list) or not all(isinstance(x, str) and x.strip() for x in raw):
        raise Bad("expected a list of Markdown strings")
    return tuple(x.strip() for x in raw)


def mapping(raw: object, key: Key) -> dict:
    if not isinstance(raw, dict):
        raise Bad("expected a mapping")
    return dict(raw)


def file_in(raw: object, base: Path, root: Path | None) -> Path:
    """An existing file named relative to ``base`` that does not lead outside ``root``."""
    if not isinstance(raw, str) or not raw.strip() or "\x00" in raw:
        raise Bad(f"expected a file name, got {show(raw)}")
    try:
        target = (base / raw).resolve()
        inside = root is None or target.is_relative_to(root.resolve())
        found = target.is_file()
    except (OSError, RuntimeError) as exc:
        raise Bad(f"bad file name {show(raw)} ({exc.__class__.__name__})") from None
    if not inside:
        raise Bad(f"{show(raw)} points outside the catalogue folder")
    if not found:
        raise Bad(f"samples file {show(raw)} not found (looked in {base})")
    return target  # read (once) by the samples reader, which reports what it cannot read


def unsupported(raw: object, key: Key) -> None:
    raise Bad(f"not supported yet: {key.meaning} is not built in this version ({key.example})")


def interval(raw: object, key: Key) -> Interval:
    """A value with or without an interval, in the key's unit and range."""
    try:
        value = parse_interval(raw)
    except ValueParseError as exc:
        hint = "" if "e.g." in str(exc) else f" (e.g. {key.example})"
        raise Bad(f"{exc}{hint}") from None
    _check_unit(value, key)
    if key.canonical_unit:
        value = value.to(key.canonical_unit)
    for x, what in ((value.median, ""), (value.low, "lower bound "), (value.high, "upper bound ")):
        in_range(x, key, what)
    return value


def quantity(raw: object, key: Key) -> u.Quantity:
    """A single value with a unit (no interval)."""
    value = interval(raw, key)
    if not value.exact:
        raise Bad(f"expected a single value, not an interval (e.g. {key.example})")
    return value.quantity


def _check_unit(value: Interval, key: Key) -> None:
    wanted = key.physical_type or "dimensionless"
    if value.unit.physical_type == wanted:
        return
    if wanted == "dimensionless":
        raise Bad(
            f"unit {value.unit} given for a dimensionless value "
            f"(write it without a unit, e.g. {key.example})"
        )
    if value.unit == u.dimensionless_unscaled:
        raise Bad(f"missing unit (expected a {wanted}, e.g. {key.example})")
    raise Bad(
        f"unit {value.unit} is a {value.unit.physical_type}, "
        f"expected a {wanted} (e.g. {key.example})"
    )


def in_range(x: float, key: Key, what: str) -> None:
    """Raise :class:`Bad` unless ``x`` is finite and inside the key's range."""
    if not math.isfinite(x):
        raise Bad(f"{what}value must be finite, got {x}")
    low_bad = key.low is not None and (x < key.low or (x == key.low and not key.low_inclusive))
    high_bad = key.high is not None and (x > key.high or (x == key.high and not key.high_inclusive))
    if low_bad or high_bad:
        raise Bad(f"{what}value {x:g} out of range (expected {_range_text(key)})")


def _range_text(key: Key) -> str:
    low = f"> {key.low:g}" if not key.low_inclusive else f">= {key.low:g}"
    if key.high is None:
        return low + (f" {key.canonical_unit}" if key.canonical_unit else "")
    high = f"<= {key.high:g}" if key.high_inclusive else f"< {key.high:g}"
    return f"{low} and {high}"


#: Converters by key kind (the structured kinds are methods of the Checker).
CONVERTERS: dict[str, Callable[[object, Key], Any]] = {
    "text": text,
    "markdown": text,
    "slug": slug,
    "choice": choice,
    "time": time,
    "number": number,
    "count": count,
    "cosmology": cosmology,
    "labels": labels,
    "markdown_list": markdown_list,
    "mapping": mapping,
    "unsupported": unsupported,
    "interval": interval,
    "quantity": quantity,
}
