"""What each figure of a sheet and of the index shows: numbers and labels in, SVG bytes out.

The drawing functions in :mod:`factsheet.figures` only draw; this module picks the numbers
(medians and credible bounds from the summaries, the leading-order frequency track), the labels
(from :mod:`factsheet.labels`) and the file names. Each figure is written beside the page that
uses it. Importing this module loads matplotlib.
"""

from __future__ import annotations

import time
from collections.abc import Callable, Sequence

import astropy.units as u
import numpy as np

from factsheet import figures as fg
from factsheet import labels
from factsheet.figures.catalogue import status_word
from factsheet.figures.ticks import digits
from factsheet.i18n import N_, _, pgettext
from factsheet.model import Derived, SiteFigure
from factsheet.notation import format_median, format_value
from factsheet.physics import inspiral
from factsheet.render import numbers
from factsheet.render.contexts import display_summary
from factsheet.render.history import CURRENT_LABEL, value_text
from factsheet.render.sky import level_text
from factsheet.render.sound import band_note

ENERGY_KEYS = (
    "sun_lifetime",
    "supernova_neutrinos",
    "supernova_kinetic",
    "brightest_gamma_ray_burst",
    "solar_rest_energy",
    "world_energy_year",
)
LUMINOSITY_KEYS = ("sun", "milky_way", "luminous_quasar", "planck_luminosity")
#: The values of each estimate the history figure shows.
HISTORY_FIGURE = ("heavier.mass", "lighter.mass", "distance")


def _save(path: str, draw: Callable[[], fg.Drawing], caption: str) -> SiteFigure:
    """Draw a figure, write it as SVG and time both (the benchmark reports the share)."""
    start = time.perf_counter()
    drawing = draw()
    svg = fg.to_svg(drawing.figure)
    return SiteFigure(path, svg, drawing.alt, caption, time.perf_counter() - start)


def _item(item: Derived, key: str) -> fg.IntervalItem:
    s = item.quantities[key]
    label, text = labels.QUANTITIES[key].short, interval_text(item, key)
    return fg.IntervalItem(label, s.median, s.low, s.high, s.unit, s.level, text)


def interval_text(item: Derived, key: str) -> str:
    """A quantity's interval exactly as the sheet's table prints it."""
    return numbers.quantity_text(item, key)


def median_text(item: Derived, key: str) -> str:
    """A quantity's median alone, as the table prints it, with its unit."""
    return numbers.median_text(item, key, unit=True)


def in_band_note(item: Derived) -> str | None:
    """The sentence for a pair whose inspiral ends below the band edge: only the merger and
    ringdown were in band. Said in the frequency track's caption and alt text and in the chirp
    sound's text, in one wording (:func:`factsheet.render.sound.band_note`); None otherwise."""
    return band_note(item)


def event_figures(item: Derived) -> list[SiteFigure]:
    """The figures of one sheet, in page order."""
    q, base = item.quantities, f"events/{item.event.id}"
    out = []
    masses = [k for k in ("heavier_mass", "lighter_mass", "remnant_mass") if k in q]
    out.append(
        _save(
            f"{base}-masses.svg",
            lambda: fg.component_intervals([_item(item, k) for k in masses]),
            _("Masses (source frame) with credible intervals."),
        )
    )
    note = in_band_note(item)
    caption = _(
        "Frequency of the waves as they swept through the detectors' band "
        "(leading-order inspiral; observed frequencies)."
    )
    out.append(
        _save(
            f"{base}-track.svg",
            lambda: fg.frequency_track(_track(item, _(IN_BAND_FIGURE_NOTE) if note else "")),
            f"{caption} {note}" if note else caption,
        )
    )
    if "energy_radiated" in q:
        out.extend(_comparisons(item, base))
    if item.lensing is not None and item.lensing.cases:
        out.append(lensing_figure(item, base))
    if item.windows:
        windows = [
            fg.WindowItem(
                labels.WINDOWS[w.key].name,
                w.band,
                (w.start - item.event.time).to_value(u.day),
                (w.end - item.event.time).to_value(u.day),
            )
            for w in item.windows
        ]
        out.append(
            _save(
                f"{base}-windows.svg",
                lambda: fg.window_timeline(
                    windows, item.event.time.utc.isot[:19].replace("T", " ") + " UTC"
                ),
                _("Counterpart windows after the merger (a planning aid)."),
            )
        )
    if item.sky_map is not None and item.sky_map.levels.size:
        out.extend(sky_figures(item, base))
    if item.event.history:
        out.append(
            _save(
                f"{base}-history.svg",
                lambda: fg.history(_history_points(item)),
                _("How the estimate changed from one analysis to the next."),
            )
        )
    out.append(share_image(item))
    return out


def sky_figures(item: Derived, base: str) -> list[SiteFigure]:
    """The all-sky figure of the map's regions with the most probable position and the
    candidates, and the index's thumbnail (numbers as the sheet prints them)."""
    found, level = item.sky_map, item.credible_level
    assert found is not None
    areas = [
        f"{format_value(a.to_value(u.deg**2), '', 2)} deg²" for a in (found.area_50, found.area_90)
    ]
    marks = [
        fg.SkyMark(
            r.candidate.name,
            float(r.candidate.ra.to_value(u.deg)),
            float(r.candidate.dec.to_value(u.deg)),
            level_text(r, level),
        )
        for r in item.candidates
    ]
    peak = fg.SkyMark(
        labels.SKY_PEAK, float(found.peak_ra.to_value(u.deg)), float(found.peak_dec.to_value(u.deg))
    )
    texts = fg.SkyTexts(labels.SKY_REGIONS[0.5], labels.SKY_REGIONS[0.9], labels.SKY_FIGURE_LEAD)
    caption = sky_caption(bool(marks), fg.close_up_box(found.levels) is not None)
    return [
        _save(
            f"{base}-sky.svg",
            lambda: fg.sky_figure(found.levels, fg.SkyRegions(*areas), marks, peak, texts),
            caption,
        ),
        _save(
            f"{base}-sky-small.svg",
            lambda: fg.sky_thumbnail(found.levels, marks),
            _("The sky map's credible regions, small."),
        ),
    ]


def sky_caption(candidates: bool, close_up: bool) -> str:
    """The sky figure's caption: with or without candidates, with or without a close-up."""
    if candidates and close_up:
        return _(
            "Where the source lies: the sky map's 50 % and 90 % credible regions (equatorial "
            "coordinates, right ascension increasing to the left), with the counterpart "
            "candidates; below, a close-up of the small region (the square outlined on the sky)."
        )
    if candidates:
        return _(
            "Where the source lies: the sky map's 50 % and 90 % credible regions (equatorial "
            "coordinates, right ascension increasing to the left), with the counterpart "
            "candidates."
        )
    if close_up:
        return _(
            "Where the source lies: the sky map's 50 % and 90 % credible regions (equatorial "
            "coordinates, right ascension increasing to the left); below, a close-up of the "
            "small region (the square outlined on the sky)."
        )
    return _(
        "Where the source lies: the sky map's 50 % and 90 % credible regions (equatorial "
        "coordinates, right ascension increasing to the left)."
    )


def lensing_figure(item: Derived, base: str) -> SiteFigure:
    """Source-frame masses without a lens and at each magnification of the what-if-lensed
    panel, against the pair-instability gap (numbers from derive; medians as printed)."""
    from factsheet.figures.lensing import LensColumn, LensMass, lensed_masses

    assert item.lensing is not None
    roles = {"heavier_mass": "primary", "lighter_mass": "secondary", "remnant_mass": "remnant"}
    q = item.quantities
    unlensed = tuple(
        LensMass(labels.QUANTITIES[k].short, role, q[k].median, q[k].low, q[k].high,
                 median_text(item, k))
        for k, role in roles.items() if k in q
    )  # fmt: skip
    columns = [LensColumn(pgettext("magnification", "none"), unlensed)]
    for case in item.lensing.cases:
        found = {k: getattr(case, k) for k in roles}
        lensed = tuple(
            LensMass(labels.QUANTITIES[k].short, roles[k], s.median, s.low, s.high,
                     format_median(s.median, s.low, s.high, s.unit))
            for k, s in found.items() if s is not None
        )  # fmt: skip
        columns.append(LensColumn(digits(f"{case.magnification:g}") + "×", lensed))
    edges = item.reference.mass_bands
    low, high = (e.value.to_value(u.Msun) for e in (edges.pair_instability_lower,
                                                     edges.pair_instability_upper))  # fmt: skip
    return _save(
        f"{base}-lensing.svg",
        lambda: lensed_masses(columns, (low, high), labels.BANDS["pair_instability_gap"]),
        _(
            "Masses (source frame) if a lens had magnified the signal, against the "
            "pair-instability gap; “none” is the sheet's own estimate."
        ),
    )


#: The statuses a sharing image names across its top (a confirmed event shows none).
SHARE_STATUS = ("candidate", "retracted")


def share_image(item: Derived) -> SiteFigure:
    """The sheet's sharing image (PNG bytes in the ``svg`` field), written at
    ``events/<id>-share.png``; its alt text says what it shows."""
    start, event, q = time.perf_counter(), item.event, item.quantities
    roles = {"heavier_mass": "primary", "lighter_mass": "secondary", "remnant_mass": "remnant"}
    keys = [k for k in roles if k in q]
    bodies = tuple(
        fg.ShareBody(labels.QUANTITIES[k].short, median_text(item, k), q[k].median, roles[k])
        for k in keys
    )
    status = status_word(event.status) if event.status in SHARE_STATUS else None
    subtitle = f"{event.id} · {event.time.utc.isot[:10]} · {item.source_class}"
    tone = event.status if status else ""
    card = fg.ShareCard(event.title, subtitle, status, bodies, item.settings.title, tone)
    png = fg.share_png(card)
    masses = ", ".join(f"{b.label} {b.text}" for b in bodies)
    if status:
        alt = _("{status}: {title} ({subtitle}); {masses}.")
    else:
        alt = _("{title} ({subtitle}); {masses}.")
    alt = alt.format(
        status=status.capitalize() if status else "",
        title=event.title,
        subtitle=subtitle,
        masses=masses,
    )
    return SiteFigure(f"events/{event.id}-share.png", png, alt, "", time.perf_counter() - start)


#: What the frequency track says in its panel when the inspiral ends below the band edge (its
#: marks show the two frequencies; the caption gives the full sentence of :func:`in_band_note`);
#: translated where it is drawn.
IN_BAND_FIGURE_NOTE = N_(
    "The inspiral ends below the band edge: only the merger and ringdown are in band."
)
TRACK_TEXTS = ("isco_frequency", "ringdown_frequency", "ringdown_damping_time", "time_in_band")


def _track(item: Derived, note: str) -> fg.Track:
    """The leading-order track from the band edge to the ISCO frequency (none when the ISCO
    lies below the band edge), with the marked numbers as the table prints them."""
    q, f_low = item.quantities, item.settings.low_frequency.to_value(u.Hz)
    mc = q["chirp_mass_detector"].median * u.Msun
    f_isco = q["isco_frequency"].median
    freq = np.geomspace(f_low, f_isco, 200) * u.Hz if f_isco > f_low else np.zeros(0) * u.Hz
    tau = inspiral.time_to_merger(mc, freq).to_value(u.s) if len(freq) else np.zeros(0)
    ring = q.get("ringdown_frequency")
    damp = q.get("ringdown_damping_time")
    texts = {k: median_text(item, k) for k in TRACK_TEXTS if k in q}
    return fg.Track(
        tau,
        freq.value,
        f_low,
        f_isco,
        ring.median if ring else None,
        damp.median if damp else None,
        texts,
        note,
    )


def _comparison(item: Derived, key: str, own: str, others: dict) -> tuple[str, list]:
    """The merger's value (its interval as the table prints it) and the reference values, all
    in the unit the sheet shows the quantity in."""
    units, names = item.settings.energy_units, item.reference.comparison_labels()
    s = display_summary(item.quantities[key], units)
    shown = interval_text(item, key)
    rows = [fg.ComparisonItem(own, s.median, s.low, s.high, shown, own=True)]
    for k, value in others.items():
        v = float(value.to_value(s.unit))
        rows.append(fg.ComparisonItem(names[k], v, v, v, format_value(v, s.unit)))
    return s.unit, rows


def _comparisons(item: Derived, base: str) -> list[SiteFigure]:
    ref, level = item.reference, item.quantities["energy_radiated"].level
    energies, lums = ref.energies(), ref.luminosities()
    e_unit, e_rows = _comparison(
        item,
        "energy_radiated",
        labels.FIGURE_NAMES["merger_energy"],
        {k: energies[k] for k in ENERGY_KEYS if k in energies},
    )
    l_unit, l_rows = _comparison(
        item,
        "peak_luminosity",
        labels.FIGURE_NAMES["merger_peak"],
        {k: lums[k] for k in LUMINOSITY_KEYS if k in lums},
    )
    energy, peak = labels.QUANTITIES["energy_radiated"], labels.QUANTITIES["peak_luminosity"]
    return [
        _save(
            f"{base}-energy.svg",
            lambda: fg.comparison_points(energy.name, e_unit, e_rows, level),
            _(
                "{name} as gravitational waves, with its credible interval, against familiar "
                "sources (log scale: equal steps are equal ratios)."
            ).format(name=energy.name),
        ),
        _save(
            f"{base}-luminosity.svg",
            lambda: fg.comparison_points(peak.name, l_unit, l_rows, level),
            _(
                "{name} in gravitational waves, with its credible interval, against familiar "
                "sources (log scale: equal steps are equal ratios)."
            ).format(name=peak.name),
        ),
    ]


def _history_points(item: Derived) -> list[fg.HistoryItem]:
    """The masses and the distance of every estimate, labelled as in the history list."""
    event = item.event
    steps = [(h.label, h.date.utc.isot[:10], h.estimate) for h in event.history if h.estimate]
    steps.append((CURRENT_LABEL, "", event.estimate))
    current = numbers.estimate_texts(item)  # the current estimate as its sheet prints it
    points = []
    for label, date, estimate in steps:
        given = estimate.values()
        for path in HISTORY_FIGURE:
            if path in given:
                v, name = given[path], labels.estimate_value(path, event.frame)
                shown = current[path] if estimate is event.estimate else value_text(v, path)
                points.append(
                    fg.HistoryItem(label, date, name, v.median, v.low, v.high, v.unit, shown)
                )
    return points


def index_figures(rows: Sequence[tuple], edges: dict[str, float]) -> list[SiteFigure]:
    """The catalogue-wide figures of the index page, from one row per event: its id, status,
    source class, and the summaries of its heavier and lighter masses, distance and total mass
    (what ``factsheet.build`` hands over, so that the drawing may happen in a worker)."""
    if not rows:
        return []
    plane, dist = [], []
    for event_id, status, source_class, m1, m2, dl, mt in rows:
        plane.append(
            fg.PlaneItem(
                event_id, m1.median, m1.low, m1.high, m2.median, m2.low, m2.high, status,
                source_class,
            )
        )  # fmt: skip
        dist.append(
            fg.DistanceItem(
                event_id, dl.median, dl.low, dl.high, mt.median, mt.low, mt.high, status
            )
        )
    return [
        _save(
            "figures/mass-plane.svg",
            lambda: fg.mass_plane(plane, edges),
            _(
                "Component masses of every event, with the mass bands shaded; events are named "
                "where there is room, and the table lists them all."
            ),
        ),
        _save(
            "figures/distance-mass.svg",
            lambda: fg.distance_mass(dist),
            _(
                "{distance} against total mass (source frame); events are named where there is "
                "room, and the table lists them all."
            ).format(distance=labels.QUANTITIES["distance"].name),
        ),
    ]
