"""Where in the sky, as a sheet says it: the sky map's regions and most probable position, and
each counterpart candidate read against the map, the merger time and the counterpart windows.

The reading of a candidate is plain and never stronger than the facts allow: a transient inside
the region and inside a window is *consistent* with the merger, not proof of a link.
"""

from __future__ import annotations

from dataclasses import dataclass

import astropy.units as u
from astropy.coordinates import Angle

from factsheet import labels
from factsheet.model import CandidateReading, Derived, FigureInfo
from factsheet.notation import format_value, percent
from factsheet.physics.sky import WHOLE_SKY
from factsheet.render.numbers import value_text
from factsheet.render.windows import window_times

#: The window whose candidate makes the sheet say when to look for a repeat, and that repeat.
FLARE, REPEAT = "agn_flare", "agn_repeat_flare"


@dataclass(frozen=True)
class CandidateRow:
    """One counterpart candidate as the sheet lists it."""

    name: str
    position: str  # right ascension and declination
    time: str  # UTC, to the minute
    time_iso: str
    delay: str  # after (or before) the merger, observer and source frame
    level: str  # where it lies in the sky map's regions, or that there is no map
    windows: str  # the windows it falls in, or none
    reading: str  # the plain conclusion
    note: str  # the editors' note (Markdown)
    repeat: str  # when to look for a repeat flare, or ""


@dataclass(frozen=True)
class SkyPanel:
    """The "where in the sky" section: sentences on the map, its figure, the candidates."""

    text: tuple[str, ...]
    figures: tuple[FigureInfo, ...]
    candidates: tuple[CandidateRow, ...]


def position_text(ra: u.Quantity, dec: u.Quantity) -> str:
    """A position as astronomers write it: right ascension in hours and minutes, declination
    in degrees (to the tenth of a degree and of a minute of time: finer than any merger map)."""
    minutes = round(Angle(ra).wrap_at(360 * u.deg).hour * 60, 1)  # 0 to 1440
    hours, minutes = divmod(minutes, 60)
    degrees = round(float(dec.to_value(u.deg)), 1)
    sign = "−" if degrees < 0 else "+" if degrees > 0 else ""
    declination = f"{sign}{abs(degrees):.1f}°"
    return f"right ascension {int(hours) % 24}h {minutes:04.1f}m, declination {declination}"


def sky_sentences(item: Derived) -> tuple[str, ...]:
    """What the map says: its two regions and the most probable position."""
    found = item.sky_map
    if found is None:
        return ()
    a50, a90 = (a.to_value(u.deg**2) for a in (found.area_50, found.area_90))
    share = format_value(100 * a90 / WHOLE_SKY.to_value(u.deg**2), "", 1)
    return (
        f"The sky map places the source within {format_value(a50, '', 2)} square degrees with "
        f"50 % probability and within {format_value(a90, '', 2)} square degrees (about "
        f"{share} % of the sky) with 90 %.",
        f"Its most probable position is {position_text(found.peak_ra, found.peak_dec)}.",
    )


def _delay_text(r: CandidateReading) -> str:
    days = float(r.delay.to_value(u.d))
    observed = _duration(abs(days))
    if days < 0:
        return f"{observed} before the merger"
    source = value_text(r.delay_source).replace(" d", " days")
    return f"{observed} after the merger ({source} in the source frame)"


def _duration(days: float) -> str:
    if days < 1 / 24:
        return f"{format_value(days * 1440, '', 2)} minutes"
    if days < 2:
        return f"{format_value(days * 24, '', 2)} hours"
    return f"{format_value(days, '', 3)} days"


def level_text(r: CandidateReading, level: float) -> str:
    if r.credible_level is None:
        return "no sky map to place it"
    at = percent(r.credible_level)
    if r.credible_level <= level:
        return f"inside the {percent(level)} credible region, at the {at} credible level"
    return f"outside the {percent(level)} credible region, at the {at} credible level"


def _reading(r: CandidateReading, level: float) -> str:
    """The plain conclusion: never more than consistent."""
    if r.delay.to_value(u.d) < 0:
        return "Seen before the merger, so the merger did not cause it."
    inside = r.credible_level is None or r.credible_level <= level
    timed = bool(r.windows)
    if r.credible_level is not None and not inside:
        return (
            "Outside the region where the source most probably lies: an unlikely match by position."
        )
    where = "in the region" if r.credible_level is not None else "with no map to test its place"
    if timed:
        return (
            f"Seen {where} and at a time one of the windows expects: consistent with this "
            "merger, not proof of a link."
        )
    return (
        f"Seen {where} but at a time none of the windows expects: a link would need another "
        "explanation."
    )


def _repeat(r: CandidateReading, item: Derived) -> str:
    if FLARE not in r.windows:
        return ""
    repeat = next((w for w in item.windows if w.key == REPEAT), None)
    if repeat is None:
        return ""
    start, end, _ = window_times(repeat.start, repeat.end)
    return (
        f"If {r.candidate.name} is the kicked remnant's flare, the remnant crosses the disk again "
        f"half an orbit later and may flare again: look at the same place between {start} and "
        f"{end} UTC. A second flare would make the link much stronger; none would not rule it "
        "out."
    )


def candidate_rows(item: Derived) -> tuple[CandidateRow, ...]:
    """Each counterpart candidate as the sheet lists it (none on a retracted sheet)."""
    if item.event.status == "retracted":
        return ()
    level = item.credible_level
    rows = []
    for r in item.candidates:
        c = r.candidate
        inside = [labels.WINDOWS[k].name for k in r.windows]
        rows.append(
            CandidateRow(
                name=c.name,
                position=position_text(c.ra, c.dec),
                time=c.time.utc.isot[:16].replace("T", " "),
                time_iso=c.time.utc.isot,
                delay=_delay_text(r),
                level=level_text(r, level),
                windows=("inside the window of the " + " and of the ".join(inside))
                if inside
                else "outside every counterpart window of this sheet",
                reading=_reading(r, level),
                note=c.note,
                repeat=_repeat(r, item),
            )
        )
    return tuple(rows)


def sky_panel(item: Derived, figures: tuple[FigureInfo, ...]) -> SkyPanel | None:
    """The section, when the event has a sky map or candidates (never on a retracted sheet)."""
    if item.event.status == "retracted" or (item.sky_map is None and not item.candidates):
        return None
    return SkyPanel(sky_sentences(item), figures, candidate_rows(item))
