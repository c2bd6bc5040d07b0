"""Where in the sky: what the sheet says of the sky map, and each counterpart candidate read
against the map, the merger time and the counterpart windows.

The map is read again here (the load stage only checked it) and dropped once its areas, most
probable position, level grid and the candidates' credible levels are taken.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np

from factsheet.derive.summaries import summarise
from factsheet.i18n import Later, Text
from factsheet.model import CandidateReading, Caveat, Event, SkyMapSummary
from factsheet.notation import format_value
from factsheet.physics import sky
from factsheet.physics.counterparts import Window

#: A given sky area and the map's 90 % area disagree when their ratio lies outside these bounds
#: (our choice: maps of one event from different analyses commonly differ by a few tens of
#: percent; beyond a quarter the two numbers describe different maps).
AREA_RATIO_AGREES = (0.8, 1.25)


def sky_map(event: Event, level: float) -> tuple[SkyMapSummary | None, np.ndarray]:
    """The summary of the event's sky map and its credible level at each counterpart
    candidate's position (an empty array without a map)."""
    found = event.detection.sky_map
    if found is None:
        return None, np.empty(0)
    from factsheet.load.skymap import read_probabilities

    prob = read_probabilities(found)
    summary, at_candidates = summarise_map(prob, found.nside, found.ordering, level, event)
    return summary, at_candidates


def summarise_map(
    prob: np.ndarray, nside: int, ordering: str, level: float, event: Event
) -> tuple[SkyMapSummary, np.ndarray]:
    """Areas, the most probable position and the level grid of a normalised map; and the
    credible level at each of the event's counterpart candidates."""
    ranked = sky.RankedMap(prob, nside)
    top = sky.peak(prob, nside, ordering)
    summary = SkyMapSummary(
        nside=nside,
        ordering=ordering,
        area_50=ranked.area(0.5),
        area_90=ranked.area(0.9),
        area=ranked.area(level),
        peak_ra=top.ra,
        peak_dec=top.dec,
        levels=sky.level_grid(ranked, prob, ordering),
    )
    candidates = event.counterpart_candidates
    if not candidates:
        return summary, np.empty(0)
    ra = u.Quantity([c.ra for c in candidates])
    dec = u.Quantity([c.dec for c in candidates])
    return summary, sky.levels_at(ranked, prob, ordering, ra, dec)


def candidate_readings(
    event: Event,
    redshift: np.ndarray,
    windows: tuple[Window, ...],
    levels: np.ndarray,
    credible_level: float,
) -> tuple[CandidateReading, ...]:
    """Each counterpart candidate with its credible level (None without a map), its delay
    after the merger in the observer's frame and, over the redshift samples, in the source
    frame, and the counterpart windows its time falls in."""
    readings = []
    for i, c in enumerate(event.counterpart_candidates):
        delay = (c.time - event.time).to(u.d)
        source = delay.value / (1.0 + np.asarray(redshift, dtype=float))
        inside = tuple(w.key for w in windows if w.start <= c.time <= w.end)
        readings.append(
            CandidateReading(
                candidate=c,
                credible_level=float(levels[i]) if len(levels) else None,
                delay=delay,
                delay_source=summarise(source * u.d, credible_level, "source", ()),
                windows=inside,
            )
        )
    return tuple(readings)


def sky_caveats(event: Event, summary: SkyMapSummary | None) -> list[Caveat]:
    """A warning when a sky area given beside the map disagrees with the map's 90 % area."""
    given = event.detection.sky_area
    if summary is None or given is None:
        return []
    ratio = float(given.to_value(u.deg**2) / summary.area_90.to_value(u.deg**2))
    low, high = AREA_RATIO_AGREES
    if low <= ratio <= high:
        return []
    return [
        Caveat(
            "sky-area-disagrees",
            "warning",
            Text(
                "The sky map's 90 % credible region covers {area} square degrees, but the "
                "area stated beside it is {stated} square degrees. The sheet uses the map; one of "
                "the two may belong to another analysis.",
                area=Later(format_value, float(summary.area_90.to_value(u.deg**2))),
                stated=Later(format_value, float(given.to_value(u.deg**2))),
            ),
        )
    ]
