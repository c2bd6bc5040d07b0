"""Check and convert the values of one YAML file against the key tables of :mod:`schema`.

A :class:`Checker` appends a :class:`~factsheet.errors.Problem` for each bad value and returns
only the good ones, so one run reports every problem of a file.
"""

from __future__ import annotations

import difflib
import math
import re
import warnings
from pathlib import Path
from typing import Any

import astropy.units as u
from astropy.time import Time
from erfa import ErfaWarning

from factsheet.errors import Problem
from factsheet.quantities import Estimate, ValueParseError, parse_estimate
from factsheet.schema import Key
from factsheet.yamlread import LineMap


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


SLUG = re.compile(r"^[A-Za-z0-9][A-Za-z0-9._-]{0,99}$")


class Checker:
    """Validates values from one file, recording problems with their line and key path."""

    def __init__(
        self,
        path: Path,
        problems: list[Problem],
        base: Path | None = None,
        root: Path | None = None,
    ):
        self.path, self.problems = path, problems
        self.base, self.root = base, root

    def fail(self, line: int | None, key: str, message: str) -> None:
        self.problems.append(Problem(self.path, line, key, message))

    def mapping(self, data: LineMap, keys: dict[str, Key], prefix: str) -> dict[str, Any]:
        """Check every key of ``data`` against ``keys``; return the converted good values."""
        out: dict[str, Any] = {}
        for name in data:
            if name not in keys:
                self._unknown(data, name, keys, prefix)
        for name, key in keys.items():
            path = f"{prefix}{name}"
            if name not in data or data[name] is None:
                if key.required:
                    example = f" (e.g. {name}: {key.example})" if key.example else ""
                    self.fail(data.line, path, f"missing required key{example}")
                continue
            value = self.value(data[name], key, path, data.line_of(name))
            if value is not None:
                out[name] = value
        return out

    def _unknown(self, data: LineMap, name: object, keys: dict[str, Key], prefix: str) -> None:
        close = difflib.get_close_matches(str(name)[:60], list(keys), n=1)
        hint = (
            f" (did you mean '{close[0]}'?)" if close else f" (expected one of: {', '.join(keys)})"
        )
        self.fail(data.line_of(name), f"{prefix}{str(name)[:60]}", f"unknown key{hint}")

    def value(self, raw: object, key: Key, path: str, line: int | None) -> Any:
        """Convert one value by the kind of its key; None after recording a problem."""
        handler = getattr(self, f"_{key.kind}")
        return handler(raw, key, path, line)

    # -- scalar kinds --------------------------------------------------------------------
    def _text(self, raw, key, path, line):
        if not isinstance(raw, str | int | float) or isinstance(raw, bool):
            return self.fail(line, path, f"expected text, got {type(raw).__name__}")
        text = str(raw).strip()
        return text or self.fail(line, path, "must not be empty")

    _markdown = _text

    def _slug(self, raw, key, path, line):
        if not isinstance(raw, str) or not SLUG.match(raw):
            return self.fail(
                line,
                path,
                f"invalid id {show(raw)} (expected a URL-safe slug of letters, "
                "digits, '.', '_' and '-', e.g. DX-0412; no slashes)",
            )
        if raw in {".", ".."} or raw.startswith("."):
            return self.fail(line, path, f"invalid id {show(raw)} (must not start with '.')")
        return raw

    def _choice(self, raw, key, path, line):
        if not isinstance(raw, str) or raw not in key.choices:
            close = difflib.get_close_matches(show(raw), key.choices, n=1)
            hint = f"did you mean '{close[0]}'? " if close else ""
            return self.fail(
                line,
                path,
                f"invalid value {show(raw)} ({hint}expected one of: {', '.join(key.choices)})",
            )
        return raw

    def _time(self, raw, key, path, line):
        if not isinstance(raw, str):
            return self.fail(line, path, f"expected an ISO 8601 UTC time, got {show(raw)}")
        try:
            return parse_time(raw)
        except (ValueError, TypeError, OverflowError):
            return self.fail(
                line,
                path,
                f"bad time {show(raw)} (expected ISO 8601 UTC, e.g. 2034-04-12T07:26:41.2)",
            )

    def _number(self, raw, key, path, line):
        if isinstance(raw, bool):
            return self.fail(line, path, f"expected a number, got {show(raw)}")
        try:
            x = float(raw)
        except (TypeError, ValueError, OverflowError):
            return self.fail(line, path, f"expected a number, got {show(raw)}")
        return x if self._in_range(x, key, path, line, "") else None

    def _count(self, raw, key, path, line):
        if isinstance(raw, bool) or not isinstance(raw, int) or not 100 <= raw <= 1_000_000:
            return self.fail(
                line, path, f"expected a whole number from 100 to 1000000, got {show(raw)}"
            )
        return raw

    def _cosmology(self, raw, key, path, line):
        from astropy.cosmology import realizations

        names = list(realizations.available)
        if raw not in names:
            close = difflib.get_close_matches(str(raw), names, n=1)
            hint = f"did you mean '{close[0]}'? " if close else ""
            return self.fail(
                line,
                path,
                f"unknown cosmology {show(raw)} ({hint}expected an astropy "
                f"realisation: {', '.join(names)})",
            )
        return raw

    def _path(self, raw, key, path, line):
        if not isinstance(raw, str) or not raw.strip() or "\x00" in raw:
            return self.fail(line, path, f"expected a file name, got {show(raw)}")
        try:
            target = (self.base / raw).resolve()
            inside = self.root is None or target.is_relative_to(self.root.resolve())
            found = target.is_file()
        except (OSError, RuntimeError) as exc:
            return self.fail(line, path, f"bad file name {show(raw)} ({exc.__class__.__name__})")
        if not inside:
            return self.fail(line, path, f"{show(raw)} points outside the catalogue folder")
        if not found:
            return self.fail(
                line, path, f"samples file {show(raw)} not found (looked in {self.base})"
            )
        try:
            with target.open("rb") as handle:
                handle.read(1)
        except OSError as exc:
            return self.fail(line, path, f"samples file {show(raw)} unreadable ({exc.strerror})")
        return target

    def _labels(self, raw, key, path, line):
        if not isinstance(raw, list) or not all(isinstance(x, str | int) for x in raw):
            return self.fail(line, path, "expected a list of labels, e.g. [A1, B1]")
        return tuple(str(x) for x in raw)

    def _markdown_list(self, raw, key, path, line):
        if not isinstance(raw, list) or not all(isinstance(x, str) and x.strip() for x in raw):
            return self.fail(line, path, "expected a list of Markdown strings")
        return tuple(x.strip() for x in raw)

    def _mapping(self, raw, key, path, line):
        if not isinstance(raw, dict):
            return self.fail(line, path, "expected a mapping")
        return dict(raw)

    # -- quantities ------------------------------------------------------------------------
    def _estimate(self, raw, key, path, line) -> Estimate | None:
        try:
            est = parse_estimate(raw)
        except ValueParseError as exc:
            hint = "" if "e.g." in str(exc) else f" (e.g. {key.example})"
            return self.fail(line, path, f"{exc}{hint}")
        if not self._unit_ok(est, key, path, line):
            return None
        if key.canonical_unit:
            est = est.to(key.canonical_unit)
        checks = ((est.median, ""), (est.low, "lower bound "), (est.high, "upper bound "))
        return est if all(self._in_range(x, key, path, line, what) for x, what in checks) else None

    def _quantity(self, raw, key, path, line):
        est = self._estimate(raw, key, path, line)
        if est is None:
            return None
        if not est.exact:
            return self.fail(
                line, path, f"expected a single value, not an interval (e.g. {key.example})"
            )
        return est.quantity

    def _unit_ok(self, est: Estimate, key: Key, path: str, line: int | None) -> bool:
        wanted = key.physical_type or "dimensionless"
        if est.unit.physical_type == wanted:
            return True
        if wanted == "dimensionless":
            self.fail(
                line,
                path,
                f"unit {est.unit} given for a dimensionless value "
                f"(write it without a unit, e.g. {key.example})",
            )
        elif est.unit == u.dimensionless_unscaled:
            self.fail(line, path, f"missing unit (expected a {wanted}, e.g. {key.example})")
        else:
            self.fail(
                line,
                path,
                f"unit {est.unit} is a {est.unit.physical_type}, "
                f"expected a {wanted} (e.g. {key.example})",
            )
        return False

    def _in_range(self, x: float, key: Key, path: str, line: int | None, what: str) -> bool:
        if not math.isfinite(x):
            self.fail(line, path, f"{what}value must be finite, got {x}")
            return False
        low_bad = key.low is not None and (x < key.low or (x == key.low and not key.low_inclusive))
        high_bad = key.high is not None and (
            x > key.high or (x == key.high and not key.high_inclusive)
        )
        if low_bad or high_bad:
            self.fail(line, path, f"{what}value {x:g} out of range (expected {_range_text(key)})")
            return False
        return True


def _range_text(key: Key) -> str:
    low = f"> {key.low:g}" if not key.low_inclusive else f">= {key.low:g}"
    if key.high is None:
        return low + (f" {key.canonical_unit}" if key.canonical_unit else "")
    high = f"<= {key.high:g}" if key.high_inclusive else f"< {key.high:g}"
    return f"{low} and {high}"
