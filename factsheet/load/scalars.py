"""Convert one plain value of an input file by the kind of its key (text, time, interval, ...).

Each converter takes the raw YAML value and its :class:`~factsheet.load.schema.Key` and returns
the converted value or raises :class:`Bad` with a message that says what was expected. The
:class:`~factsheet.load.checker.Checker` adds the file, line and key path.
"""

from __future__ import annotations

import contextlib
import difflib
import functools
import importlib.util
import math
import re
import warnings
from collections.abc import Callable
from pathlib import Path
from typing import Any
from urllib.parse import urlsplit

import astropy.units as u
from astropy.time import Time
from erfa import ErfaWarning

from factsheet.load.files import FileRefused, target_of
from factsheet.load.schema import Key
from factsheet.load.values import ValueParseError, parse_interval
from factsheet.load.yaml_lines import written
from factsheet.model import Interval

#: An id: anchored at both ends with \Z (``$`` would let a trailing newline through).
SLUG = re.compile(r"^[A-Za-z0-9][A-Za-z0-9._-]{0,99}\Z")
MAX_LINE_TEXT = 200  # characters of a title, a label or another one-line text
MAX_MARKDOWN = 100_000  # characters of one Markdown text
#: Years a time may have: UTC, as astropy's time scales (ERFA) define it, begins on 1960-01-01
#: (earlier dates are "dubious"), and ISO 8601 writes years with four digits.
FIRST_YEAR, LAST_YEAR = 1960, 9999
_LINE_BREAKS = re.compile("[\n\u2028\u2029]")
_ISO_FIELDS = re.compile(
    r"(\d{1,4})-(\d{1,2})-(\d{1,2})(?:[T ](\d{1,2}):(\d{1,2})(?::(\d{1,2})(?:\.\d*)?)?)?"
)


class Bad(ValueError):
    """A value that its key does not accept; the message says what was expected."""


def parse_time(text: str) -> Time:
    """Parse an ISO 8601 UTC time; years past the leap-second table are expected here.

    The time must exist as written: years 1960 to 9999, and a second 60 only at 23:59 on a day
    that astropy's leap-second table ends with a leap second (astropy would otherwise read
    ``23:59:60`` as the next midnight). :class:`Bad` says what is wrong.
    """
    text = text.strip().removesuffix("Z")
    fields = _ISO_FIELDS.fullmatch(text)
    if fields is None:
        raise ValueError(text)
    year = int(fields.group(1))
    if not FIRST_YEAR <= year <= LAST_YEAR:
        raise Bad(
            f"year {year} is outside {FIRST_YEAR} to {LAST_YEAR} (UTC, as astropy's time scales "
            f"define it, begins in {FIRST_YEAR}, and ISO 8601 writes years with four digits)"
        )
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", ErfaWarning)
        time = Time(text, format="isot" if "T" in text else "iso", scale="utc")
        got = time.ymdhms
    wanted = [int(x or 0) for x in fields.groups()]
    found = [int(got[name]) for name in ("year", "month", "day", "hour", "minute", "second")]
    if found != wanted:
        day = f"{wanted[0]:04d}-{wanted[1]:02d}-{wanted[2]:02d}"
        if wanted[3:] == [23, 59, 60]:
            raise Bad(
                f"{day} ends without a leap second in astropy's leap-second table, so "
                f"{day}T23:59:60 does not exist (it would be read as the next midnight)"
            )
        raise Bad(f"{text[:40]!r} does not exist (it would be read as {time.isot})")
    return time


def show(raw: object) -> str:
    """A short form of a value for messages; lists and mappings (maybe alias-shared) by size."""
    if isinstance(raw, list | tuple):
        return f"a list of {len(raw)} items"
    if isinstance(raw, dict):
        return f"a mapping of {len(raw)} keys"
    text = repr(raw) if isinstance(raw, str | int | float | bool | None) else type(raw).__name__
    return text if len(text) <= 60 else text[:57] + "..."


def text(raw: object, key: Key) -> str:
    """One line of text (a title, a label): at most 200 characters, no line break."""
    value = _text(raw, MAX_LINE_TEXT)
    one_line(value)
    return value


def markdown(raw: object, key: Key) -> str:
    """A Markdown text: lines, at most 100 000 characters."""
    return _text(raw, MAX_MARKDOWN)


def _text(raw: object, limit: int) -> str:
    if not isinstance(raw, str | int | float) or isinstance(raw, bool):
        raise Bad(f"expected text, got {type(raw).__name__}")
    value = written(raw).strip()
    if not value:
        raise Bad("must not be empty")
    if len(value) > limit:
        raise Bad(f"text is {len(value)} characters long (at most {limit})")
    return value


def one_line(value: str) -> None:
    """Raise :class:`Bad` when ``value`` holds a line break."""
    if _LINE_BREAKS.search(value):
        raise Bad(f"expected one line of text, got a line break in {show(value)}")


def url(raw: object, key: Key) -> str:
    """An absolute http:// or https:// URL with a host, written as a URL (no spaces)."""
    value = text(raw, key)
    try:
        parts = urlsplit(value)
        good = parts.scheme in ("http", "https") and bool(parts.hostname)
        parts.port  # noqa: B018 - raises ValueError on a bad port
    except ValueError:
        good = False
    if not good or not _URL_TEXT.fullmatch(value):
        raise Bad(
            f"expected an http:// or https:// URL with a host, e.g. "
            f"https://example.org/sheets/, got {show(value)}"
        )
    return value


_URL_TEXT = re.compile(r"[A-Za-z0-9\-._~:/?#\[\]@!$&'()*+,;=%]+")  # RFC 3986 characters


def slug(raw: object, key: Key) -> str:
    if not isinstance(raw, str) or not SLUG.fullmatch(raw):
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
    if isinstance(raw, int | float) and not isinstance(raw, bool):
        raise Bad(
            f"YAML read this value as the number {show(raw)}: write the time in quotes, "
            'e.g. "2034-04-12T07:26:41.2"'
        )
    if not isinstance(raw, str):
        raise Bad(f"expected an ISO 8601 UTC time, got {show(raw)}")
    try:
        return parse_time(raw)
    except Bad as exc:
        raise Bad(f"bad time {show(raw)}: {exc}") from None
    except (ValueError, TypeError, OverflowError):
        raise Bad(
            f"bad time {show(raw)} (expected a date and a time in ISO 8601 UTC, in quotes, "
            'e.g. "2034-04-12T07:26:41.2")'
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


@functools.cache
def cosmology_names() -> tuple[str, ...]:
    """The names of astropy's cosmology realisations, read from the data files astropy ships
    for them (one ``<name>.ecsv`` each) without importing astropy.cosmology, which brings
    scipy in: a build whose events are all unchanged never needs either. Where the files are
    not found, astropy's own list."""
    spec = importlib.util.find_spec("astropy.cosmology")
    for folder in (spec.submodule_search_locations or []) if spec else []:
        with contextlib.suppress(OSError):
            found = sorted(p.stem for p in (Path(folder) / "data").glob("*.ecsv"))
            if found:
                return tuple(found)
    from astropy.cosmology import realizations

    return tuple(sorted(realizations.available))


def count(raw: object, key: Key) -> int:
    if isinstance(raw, bool) or not isinstance(raw, int) or not 100 <= raw <= 1_000_000:
        raise Bad(f"expected a whole number from 100 to 1000000, got {show(raw)}")
    return raw


def cosmology(raw: object, key: Key) -> str:
    names = cosmology_names()
    if raw not in names:
        close = difflib.get_close_matches(str(raw), names, n=1)
        hint = f"did you mean '{close[0]}'? " if close else ""
        raise Bad(
            f"unknown cosmology {show(raw)} ({hint}expected an astropy "
            f"realisation: {', '.join(names)})"
        )
    return str(raw)


def labels(raw: object, key: Key) -> tuple[str, ...]:
    if not isinstance(raw, list) or not all(
        isinstance(x, str | int) and not isinstance(x, bool) for x in raw
    ):
        raise Bad(
            "expected a list of labels, e.g. [A1, B1] (quote a label such as 'true' or 'null')"
        )
    found = tuple(written(x) for x in raw)
    for i, label in enumerate(found):
        if len(label) > MAX_LINE_TEXT:
            raise Bad(f"label {i + 1} is {len(label)} characters long (at most {MAX_LINE_TEXT})")
        one_line(label)
    return found


def mapping(raw: object, key: Key) -> dict:
    if not isinstance(raw, dict):
        raise Bad("expected a mapping")
    return dict(raw)


def file_in(raw: object, base: Path, root: Path | None, what: str = "samples file") -> Path:
    """An existing regular file named relative to ``base`` that does not lead outside ``root``
    (a folder, a FIFO, a device, a link that loops or leads nowhere are refused); ``what`` names
    the file in messages."""
    if not isinstance(raw, str) or not raw.strip() or "\x00" in raw:
        raise Bad(f"expected a file name, got {show(raw)}")
    try:
        lexical = (base / raw).resolve(strict=False)
        outside = root is not None and not lexical.is_relative_to(root.resolve())
    except (OSError, RuntimeError):
        outside = False  # a loop: reported by target_of below
    if outside:
        raise Bad(f"{show(raw)} points outside the catalogue folder")
    try:
        return target_of(base / raw, root)  # read (once) by the file's own reader
    except FileRefused as exc:
        if str(exc) == "not found":
            raise Bad(f"{what} {show(raw)} not found (looked in {base})") from None
        raise Bad(f"{what} {show(raw)}: {exc}") from None


def magnifications(raw: object, key: Key) -> tuple[float, ...]:
    """A short list of lens magnifications, each a finite number above 1 (``[]`` is none)."""
    from factsheet.physics.lensing import check_magnifications  # scipy loads when needed

    if not isinstance(raw, list):
        raise Bad(f"expected a list of magnifications, e.g. {key.example}, got {show(raw)}")
    try:
        return check_magnifications(raw)
    except ValueError as exc:
        raise Bad(f"{exc} (e.g. {key.example})") from None


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
        raise Bad(f"missing unit (expected {article(wanted)}, e.g. {key.example})")
    raise Bad(
        f"unit {value.unit} is a {value.unit.physical_type}, "
        f"expected {article(wanted)} (e.g. {key.example})"
    )


def article(word: str) -> str:
    """``word`` with its indefinite article: "a mass", "an angle"."""
    return f"{'an' if word[:1] in 'aeiou' else 'a'} {word}"


def in_range(x: float, key: Key, what: str) -> None:
    """Raise :class:`Bad` unless ``x`` is finite and inside the key's range."""
    if not math.isfinite(x):
        raise Bad(f"{what}value must be finite, got {x}")
    low_bad = key.low is not None and (x < key.low or (x == key.low and not key.low_inclusive))
    high_bad = key.high is not None and (x > key.high or (x == key.high and not key.high_inclusive))
    if low_bad or high_bad:
        note = f"; {key.range_note}" if key.range_note else ""
        raise Bad(f"{what}value {x:g} out of range (expected {_range_text(key)}{note})")


def _range_text(key: Key) -> str:
    low = f"> {key.low:g}" if not key.low_inclusive else f">= {key.low:g}"
    if key.high is None:
        return low + (f" {key.canonical_unit}" if key.canonical_unit else "")
    high = f"<= {key.high:g}" if key.high_inclusive else f"< {key.high:g}"
    return f"{low} and {high}"


#: Converters by key kind (the structured kinds are methods of the Checker).
CONVERTERS: dict[str, Callable[[object, Key], Any]] = {
    "text": text,
    "markdown": markdown,
    "url": url,
    "slug": slug,
    "choice": choice,
    "time": time,
    "number": number,
    "count": count,
    "cosmology": cosmology,
    "labels": labels,
    "mapping": mapping,
    "unsupported": unsupported,
    "magnifications": magnifications,
    "interval": interval,
    "quantity": quantity,
}
