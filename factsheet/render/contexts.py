"""The typed contexts of the pages: what each template gets, decided here, not in templates.

Every page also gets the fields of :class:`SiteContext`. The templates list their variables in
a comment at the top; the contributor guide has the same list.
"""

from __future__ import annotations

import functools
from dataclasses import dataclass, fields, replace

import astropy.units as u

from factsheet.model import (
    Event,
    Settings,
    Summary,
)
from factsheet.notation import utc_iso
from factsheet.physics.comparisons import ENERGY_UNITS


@dataclass(frozen=True)
class Alternate:
    """A page's version in one language of the site: its code, its name in that language and
    its site path."""

    language: str
    name: str
    path: str


@dataclass(frozen=True)
class SiteContext:
    """What every page gets: its own site path (for the ``url`` filter), the catalogue's
    settings, its language (``lang``, and the folder of the language's pages that the ``url``
    filter puts before links to pages) and its versions in the site's languages."""

    page_path: str
    settings: Settings
    catalogue_title: str
    audience: str
    language: str = "en"
    language_prefix: str = ""
    alternates: tuple[Alternate, ...] = ()


def variables(*contexts: object) -> dict[str, object]:
    """The fields of the context dataclasses as template variables."""
    return {f.name: getattr(c, f.name) for c in contexts for f in fields(c)}  # type: ignore[arg-type]


@dataclass(frozen=True)
class Link:
    id: str
    page: str


def time_utc(event: Event) -> str:
    return utc_iso(event.time)


def page_of(event_id: str) -> str:
    return f"events/{event_id}.html"


def display_summary(summary: Summary, energy_units: str = "SI") -> Summary:
    """A summary in the unit a reader expects: milliseconds for short times, and energies and
    powers in the catalogue's ``energy_units`` (J and W, or erg and erg/s)."""
    if _is_seconds(summary.unit) and abs(summary.median) < 1:
        return converted(summary, "ms")
    target = _energy_unit(summary.unit, energy_units)
    return summary if target is None else converted(summary, target)


# Unit comparisons are slow in astropy (each decomposes both units); a catalogue page asks the
# same few questions thousands of times, so the answers are kept (they depend on the names only).
@functools.cache
def _is_seconds(unit: str) -> bool:
    return u.Unit(unit) == u.s


@functools.cache
def _energy_unit(unit: str, energy_units: str) -> str | None:
    """The unit of ``energy_units`` an energy or power in ``unit`` is shown in (None: as is)."""
    found = u.Unit(unit)
    for target in ENERGY_UNITS[energy_units]:
        if found.is_equivalent(target) and found != target:
            return target.to_string()
    return None


@functools.cache
def _factor(source: str, target: str) -> float:
    return float(u.Unit(source).to(target))


def converted(summary: Summary, unit: str) -> Summary:
    """The same summary in another unit of the same dimension."""
    factor = _factor(summary.unit, unit)
    spread = None if summary.fit_spread is None else summary.fit_spread * factor
    return replace(
        summary,
        median=summary.median * factor,
        low=summary.low * factor,
        high=summary.high * factor,
        unit=unit,
        fit_spread=spread,
    )
