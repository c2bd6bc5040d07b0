"""Where in the sky, as a sheet says it: the sky map's regions and most probable position, and
each counterpart candidate read against the map, the merger time and the counterpart windows.

The reading of a candidate is plain and never stronger than the facts allow: a transient inside
the region and inside a window is *consistent* with the merger, not proof of a link.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

import astropy.units as u
from astropy.coordinates import Angle

from factsheet import labels
from factsheet.i18n import _, decimal_text, ngettext
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
    in degrees (to the tenth of a degree and of a minute of time: finer than any merger map),
    with the decimal sign of the language in use."""
    minutes = round(Angle(ra).wrap_at(360 * u.deg).hour * 60, 1)  # 0 to 1440
    hours, minutes = divmod(minutes, 60)
    degrees = round(float(dec.to_value(u.deg)), 1)
    sign = "−" if degrees < 0 else "+" if degrees > 0 else ""
    return _("right ascension {hours}h {minutes}m, declination {declination}").format(
        hours=int(hours) % 24,
        minutes=("0" if minutes < 10 else "") + decimal_text(minutes, 1),  # two digits: 09.2
        declination=f"{sign}{decimal_text(abs(degrees), 1)}°",
    )


def sky_sentences(item: Derived) -> tuple[str, ...]:
    """What the map says: its two regions and the most probable position."""
    found = item.sky_map
    if found is None:
        return ()
    a50, a90 = (a.to_value(u.deg**2) for a in (found.area_50, found.area_90))
    share = format_value(100 * a90 / WHOLE_SKY.to_value(u.deg**2), "", 1)
    # The per cent signs are in the values, so that the message has none (gettext tools would
    # read "% o" as a printf conversion).
    return (
        # TRANSLATORS: {half} is "50 %", {most} "90 %", {share} a percentage such as "1.2 %".
        _(
            "The sky map places the source within {area_50} square degrees with {half} "
            "probability and within {area_90} square degrees (about {share} of the sky) with "
            "{most}."
        ).format(
            area_50=format_value(a50, "", 2),
            area_90=format_value(a90, "", 2),
            share=f"{share} %",
            half="50 %",
            most="90 %",
        ),
        _("Its most probable position is {position}.").format(
            position=position_text(found.peak_ra, found.peak_dec)
        ),
    )


def _delay_text(r: CandidateReading) -> str:
    days = float(r.delay.to_value(u.d))
    observed = _duration(abs(days))
    if days < 0:
        return _("{duration} before the merger").format(duration=observed)
    source = r.delay_source
    return ngettext(
        "{duration} after the merger ({days} day in the source frame)",
        "{duration} after the merger ({days} days in the source frame)",
        source.median,
    ).format(duration=observed, days=value_text(replace(source, unit="")))


def _duration(days: float) -> str:
    if days < 1 / 24:
        n = days * 1440
        return ngettext("{n} minute", "{n} minutes", n).format(n=format_value(n, "", 2))
    if days < 2:
        n = days * 24
        return ngettext("{n} hour", "{n} hours", n).format(n=format_value(n, "", 2))
    return ngettext("{n} day", "{n} days", days).format(n=format_value(days, "", 3))


def level_text(r: CandidateReading, level: float) -> str:
    """Where a candidate lies in the sky map's regions, in the language in use (the sheet's
    list and the sky figure's marks)."""
    if r.credible_level is None:
        return _("no sky map to place it")
    at, region = percent(r.credible_level), percent(level)
    if r.credible_level <= level:
        return _("inside the {region} credible region, at the {at} credible level").format(
            region=region, at=at
        )
    return _("outside the {region} credible region, at the {at} credible level").format(
        region=region, at=at
    )


def _reading(r: CandidateReading, level: float) -> str:
    """The plain conclusion: never more than consistent."""
    if r.delay.to_value(u.d) < 0:
        return _("Seen before the merger, so the merger did not cause it.")
    inside = r.credible_level is None or r.credible_level <= level
    timed = bool(r.windows)
    if r.credible_level is not None and not inside:
        return _(
            "Outside the region where the source most probably lies: an unlikely match by position."
        )
    if r.credible_level is not None and timed:
        return _(
            "Seen in the region and at a time one of the windows expects: consistent with this "
            "merger, not proof of a link."
        )
    if r.credible_level is not None:
        return _(
            "Seen in the region but at a time none of the windows expects: a link would need "
            "another explanation."
        )
    if timed:
        return _(
            "Seen with no map to test its place and at a time one of the windows expects: "
            "consistent with this merger, not proof of a link."
        )
    return _(
        "Seen with no map to test its place but at a time none of the windows expects: a link "
        "would need another explanation."
    )


def _repeat(r: CandidateReading, item: Derived) -> str:
    if FLARE not in r.windows:
        return ""
    repeat = next((w for w in item.windows if w.key == REPEAT), None)
    if repeat is None:
        return ""
    start, end, _precision = window_times(repeat.start, repeat.end)
    return _(
        "If {name} is the kicked remnant's flare, the remnant crosses the disk again half an orbit "
        "later and may flare again: look at the same place between {start} and {end} UTC. A "
        "second flare would make the link much stronger; none would not rule it out."
    ).format(name=r.candidate.name, start=start, end=end)


def windows_text(keys: tuple[str, ...] | list[str]) -> str:
    """The counterpart windows a candidate falls in, or that it falls in none."""
    if not keys:
        return _("outside every counterpart window of this sheet")
    names = str(labels.WINDOWS[keys[0]].name)
    for key in keys[1:]:
        # TRANSLATORS: a list of window names: "kilonova and of the afterglow"
        names = _("{names} and of the {name}").format(names=names, name=labels.WINDOWS[key].name)
    return ngettext(
        "inside the window of the {names}", "inside the window of the {names}", len(keys)
    ).format(names=names)


def candidate_rows(item: Derived) -> tuple[CandidateRow, ...]:
    """Each counterpart candidate as the sheet lists it (none on a retracted sheet)."""
    if item.event.status == "retracted":
        return ()
    level = item.credible_level
    rows = []
    for r in item.candidates:
        c = r.candidate
        rows.append(
            CandidateRow(
                name=c.name,
                position=position_text(c.ra, c.dec),
                time=c.time.utc.isot[:16].replace("T", " "),
                time_iso=c.time.utc.isot,
                delay=_delay_text(r),
                level=level_text(r, level),
                windows=windows_text(r.windows),
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
