"""The typed contexts of the pages: what each template gets, decided here, not in templates.

Every page also gets the fields of :class:`SiteContext`. The templates list their variables in
a comment at the top; the contributor guide has the same list.
"""

from __future__ import annotations

from dataclasses import dataclass, fields, replace

import astropy.units as u

from factsheet import labels
from factsheet.model import (
    Audio,
    Caveat,
    Derived,
    Edge,
    Event,
    FigureInfo,
    Reference,
    Settings,
    Summary,
    WindowSpec,
)
from factsheet.notation import format_value
from factsheet.physics.comparisons import ENERGY_UNITS
from factsheet.physics.registry import METHODS, Method
from factsheet.render.history import HistoryStep, history_steps
from factsheet.render.prose import headline


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
class QuantityRow:
    key: str
    label: str
    group: str
    summary: Summary


@dataclass(frozen=True)
class BandRow:
    subject: str
    probabilities: tuple[float, ...]  # one per band, in the order of labels.BANDS
    intermediate: float


@dataclass(frozen=True)
class BandTable:
    columns: tuple[str, ...]  # band labels, lowest mass first
    intermediate: str  # the label of the separate intermediate-mass column
    rows: tuple[BandRow, ...]
    edges: tuple[Edge, ...]


@dataclass(frozen=True)
class WindowRow:
    name: str
    plain: str
    band: str
    start_utc: str
    end_utc: str


@dataclass(frozen=True)
class ComparisonRow:
    kind: str  # energy or luminosity
    label: str
    ratio: float


@dataclass(frozen=True)
class EventPage:
    """The context of ``events/<id>.html``."""

    event: Event
    item: Derived
    time_utc: str
    detection: tuple[tuple[str, str], ...]
    headline: tuple[str, ...]
    caveats: tuple[Caveat, ...]
    rows: tuple[QuantityRow, ...]
    figures: tuple[FigureInfo, ...]
    audio: Audio
    history: tuple[HistoryStep, ...]
    bands: BandTable | None
    windows: tuple[WindowRow, ...]
    no_window_reason: str
    comparison_rows: tuple[ComparisonRow, ...]
    previous: Link | None
    next: Link | None
    json_path: str


@dataclass(frozen=True)
class MethodEntry:
    method: Method
    events: tuple[str, ...]


@dataclass(frozen=True)
class WindowScale:
    name: str
    spec: WindowSpec


@dataclass(frozen=True)
class MethodsPage:
    """The context of ``methods.html``."""

    methods: tuple[MethodEntry, ...]
    reference: Reference
    window_scales: tuple[WindowScale, ...]
    levels: tuple[float, ...]


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


def detection_rows(item: Derived) -> tuple[tuple[str, str], ...]:
    """The detection facts as (label, text) rows for the sheet."""
    found, rows = item.event.detection, []
    if found.network:
        rows.append(("Detectors", ", ".join(found.network)))
    if found.snr is not None:
        rows.append(("Network signal-to-noise ratio", f"{found.snr:g}"))
    if found.false_alarm_rate is not None:
        rate = found.false_alarm_rate.to_value(1 / u.yr)
        text = f"one per {format_value(1 / rate, 'yr', 2)} of data" if rate > 0 else "zero"
        rows.append(("False-alarm rate", text))
    if found.sky_area is not None:
        area = format_value(found.sky_area.to_value(u.deg**2), "deg2", 2)
        rows.append(("Sky area (credible region)", area))
    probs = ", ".join(f"{k} {p:.0%}" for k, p in item.class_probabilities.items() if p > 0)
    rows.append(("Source class", f"{item.source_class} ({probs})"))
    if item.disruption_probability is not None:
        radius = item.settings.neutron_star_radius.to_value(u.km)
        rows.append(
            (
                "Neutron star torn apart",
                f"probability {item.disruption_probability:.0%} (radius {radius:g} km assumed)",
            )
        )
    return tuple(rows)


def quantity_rows(item: Derived) -> tuple[QuantityRow, ...]:
    """The sheet's quantities in table order, each in the unit a reader expects."""
    units = item.settings.energy_units
    return tuple(
        QuantityRow(key, label.name, label.group, display_summary(item.quantities[key], units))
        for key, label in labels.QUANTITIES.items()
        if key in item.quantities
    )


def band_table(item: Derived) -> BandTable | None:
    """Mass-band probabilities of each subject, plus the separate intermediate-mass column."""
    if not item.mass_bands:
        return None
    edges = item.reference.mass_bands
    threshold = format_value(edges.intermediate_mass_min.value.to_value(u.Msun), "solMass", 3)
    rows = tuple(
        BandRow(
            labels.SUBJECTS[subject],
            tuple(probs[band] for band in labels.BANDS),
            item.intermediate_mass[subject],
        )
        for subject, probs in item.mass_bands.items()
    )
    intermediate = f"{labels.INTERMEDIATE_MASS} (≥ {threshold})"
    return BandTable(tuple(labels.BANDS.values()), intermediate, rows, edges.edges())


def window_rows(item: Derived) -> tuple[WindowRow, ...]:
    return tuple(
        WindowRow(
            labels.WINDOWS[w.key].name,
            labels.WINDOWS[w.key].plain,
            labels.WINDOW_BANDS[w.band],
            w.start.utc.isot,
            w.end.utc.isot,
        )
        for w in item.windows
    )


def comparison_rows(item: Derived) -> tuple[ComparisonRow, ...]:
    """Energy and luminosity against the comparison objects, largest ratio first."""
    names = item.reference.comparison_labels()
    rows = []
    compared = item.comparisons
    for kind, ratios in (("energy", compared.energy), ("luminosity", compared.luminosity)):
        for key, ratio in sorted(ratios.items(), key=lambda kv: -kv[1]):
            rows.append(ComparisonRow(kind, names.get(key, key), ratio))
    return tuple(rows)


def event_page(
    item: Derived,
    previous: Derived | None,
    following: Derived | None,
    figures: tuple[FigureInfo, ...],
    audio: Audio,
) -> EventPage:
    """The context of one event page."""
    event = item.event
    return EventPage(
        event=event,
        item=item,
        time_utc=time_utc(event),
        detection=detection_rows(item),
        headline=tuple(headline(item)),
        caveats=item.caveats,
        rows=quantity_rows(item),
        figures=figures,
        audio=audio,
        history=tuple(history_steps(event)),
        bands=band_table(item),
        windows=window_rows(item),
        no_window_reason=item.no_window_reason,
        comparison_rows=comparison_rows(item),
        previous=previous and Link(previous.event.id, page_of(previous.event.id)),
        next=following and Link(following.event.id, page_of(following.event.id)),
        json_path=f"data/{event.id}.json",
    )


def methods_page(derived: list[Derived], reference: Reference) -> MethodsPage:
    """Every registered method with the events that used it, and the reference data."""
    used: dict[str, set[str]] = {}
    for item in derived:
        ids = {m for summary in item.quantities.values() for m in summary.methods}
        for method_id in ids | set(item.other_methods):
            used.setdefault(method_id, set()).add(item.event.id)
    entries = tuple(
        MethodEntry(m, tuple(sorted(used.get(m.id, ()))))
        for m in sorted(METHODS.values(), key=lambda m: (not used.get(m.id), m.title))
    )
    scales = tuple(WindowScale(labels.WINDOWS[w.key].name, w) for w in reference.windows)
    levels = tuple(sorted({d.settings.credible_level for d in derived}))
    return MethodsPage(entries, reference, scales, levels)
