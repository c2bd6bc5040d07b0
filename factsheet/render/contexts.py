"""The typed contexts of the pages: what each template gets, decided here, not in templates.

Every page also gets the fields of :class:`SiteContext`. The templates list their variables in
a comment at the top; the contributor guide has the same list.
"""

from __future__ import annotations

from dataclasses import dataclass, fields, replace

import astropy.units as u

from factsheet import labels
from factsheet.model import (
    Derived,
    Event,
    Settings,
    SiteFigure,
    Summary,
)
from factsheet.physics.comparisons import ENERGY_UNITS
from factsheet.render.history import ChangeEntry


@dataclass(frozen=True)
class SiteContext:
    """What every page gets: its own site path (for the ``url`` filter) and the catalogue's."""

    page_path: str
    settings: Settings
    catalogue_title: str
    audience: str


def variables(*contexts: object) -> dict[str, object]:
    """The fields of the context dataclasses as template variables."""
    return {f.name: getattr(c, f.name) for c in contexts for f in fields(c)}  # type: ignore[arg-type]


@dataclass(frozen=True)
class Link:
    id: str
    page: str


@dataclass(frozen=True)
class IndexRow:
    id: str
    title: str
    page: str
    date: str
    status: str
    source_class: str
    visibility: str
    band_flags: tuple[str, ...]
    heavier_mass: Summary
    lighter_mass: Summary
    remnant_mass: Summary | None
    energy_radiated: Summary | None
    distance: Summary


@dataclass(frozen=True)
class IndexPage:
    """The context of ``index.html``."""

    rows: tuple[IndexRow, ...]
    description: str
    index_figures: tuple[SiteFigure, ...]


@dataclass(frozen=True)
class ChangesPage:
    """The context of ``changes.html``: additions and revisions, newest first."""

    entries: tuple[ChangeEntry, ...]


def time_utc(event: Event) -> str:
    return event.time.utc.isot


def page_of(event_id: str) -> str:
    return f"events/{event_id}.html"


def display_summary(summary: Summary, energy_units: str = "SI") -> Summary:
    """A summary in the unit a reader expects: milliseconds for short times, and energies and
    powers in the catalogue's ``energy_units`` (J and W, or erg and erg/s)."""
    unit = u.Unit(summary.unit)
    if unit == u.s and abs(summary.median) < 1:
        return converted(summary, "ms")
    for target in ENERGY_UNITS[energy_units]:
        if unit.is_equivalent(target) and unit != target:
            return converted(summary, target.to_string())
    return summary


def converted(summary: Summary, unit: str) -> Summary:
    """The same summary in another unit of the same dimension."""
    factor = u.Unit(summary.unit).to(unit)
    spread = None if summary.fit_spread is None else summary.fit_spread * factor
    return replace(
        summary,
        median=summary.median * factor,
        low=summary.low * factor,
        high=summary.high * factor,
        unit=unit,
        fit_spread=spread,
    )


#: Bands the index flags for a body (and intermediate mass for any subject) when more likely
#: than not.
FLAGGED_BANDS = ("neutron_star", "lower_gap", "pair_instability_gap")


def band_flags(item: Derived, threshold: float = 0.5) -> tuple[str, ...]:
    """Short labels of the notable bands a body is more likely than not to be in, and of
    intermediate mass when a body or the remnant probably is."""
    flags = [
        labels.BANDS[band]
        for band in FLAGGED_BANDS
        if any(item.mass_bands.get(b, {}).get(band, 0) > threshold for b in ("heavier", "lighter"))
    ]
    if any(p > threshold for p in item.intermediate_mass.values()):
        flags.append(labels.INTERMEDIATE_MASS)
    return tuple(flags)


def index_row(item: Derived) -> IndexRow:
    """One row of the index table, numbers in the units the sheets use."""
    q, units = item.quantities, item.settings.energy_units
    energy = q.get("energy_radiated")
    return IndexRow(
        id=item.event.id,
        title=item.event.title,
        page=page_of(item.event.id),
        date=item.event.time.utc.isot[:10],
        status=item.event.status,
        source_class=item.source_class,
        visibility=item.event.visibility,
        band_flags=band_flags(item),
        heavier_mass=q["heavier_mass"],
        lighter_mass=q["lighter_mass"],
        remnant_mass=q.get("remnant_mass"),
        energy_radiated=energy and display_summary(energy, units),
        distance=q["distance"],
    )
