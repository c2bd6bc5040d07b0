"""Per-event work: derive, draw the figures and synthesise the chirp — the expensive part.

:func:`event_bundle` runs in a worker process. It returns an :class:`EventBundle`: the derived
event without its samples (small, picklable, enough for every page) and the bytes of the
event's figure and sound files. The build caches bundles, so an unchanged event is neither
re-derived nor re-drawn.
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

import astropy.units as u

from factsheet.audio import chirp_wav
from factsheet.derive import Derived, derive_event
from factsheet.model import Event, Settings
from factsheet.reference import Reference


@dataclass(frozen=True)
class FigureInfo:
    """What a page needs to show a figure: its site path, alt text and caption."""

    path: str
    alt: str
    caption: str


@dataclass(frozen=True)
class SiteFigure:
    """One rendered figure: its site-relative path, SVG bytes, alt text and caption."""

    path: str
    svg: bytes
    alt: str
    caption: str
    seconds: float = 0.0


@dataclass
class EventBundle:
    """A derived event (samples dropped) and its asset files, ready for the pages."""

    derived: Derived
    figures: list[FigureInfo]
    audio_path: str
    audio_description: str
    files: dict[str, bytes] = field(default_factory=dict)
    figure_seconds: float = 0.0
    key: str = ""  # the build cache's key of this event, set by the cache

    def without_files(self) -> EventBundle:
        return replace(self, files={})


def event_bundle(event: Event, settings: Settings, reference: Reference) -> EventBundle:
    """Derive one event and make its figures and chirp sound."""
    from factsheet import site_figures  # matplotlib loads only where figures are drawn

    item = derive_event(event, settings, reference)
    drawn = site_figures.event_figures(item)
    files = {fig.path: fig.svg for fig in drawn}
    chirp = _chirp(item)
    audio_path = f"events/{event.id}.wav"
    files[audio_path] = chirp.wav
    item.samples = {}  # the pages need only the summaries
    figures = [FigureInfo(f.path, f.alt, f.caption) for f in drawn]
    return EventBundle(
        item, figures, audio_path, chirp.description, files, sum(f.seconds for f in drawn)
    )


def _chirp(item: Derived):
    q = item.quantities
    ring, damp = q.get("ringdown_frequency"), q.get("ringdown_damping_time")
    f_low = item.settings.low_frequency
    f_merger = max(q["isco_frequency"].median * u.Hz, f_low * 1.5)
    return chirp_wav(
        q["chirp_mass_detector"].median * u.Msun,
        f_low,
        f_merger,
        ring.median * u.Hz if ring else None,
        damp.median * u.s if damp else None,
    )
