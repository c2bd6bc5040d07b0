"""What each figure of a sheet and of the index shows: numbers and labels in, SVG bytes out.

The drawing functions in :mod:`factsheet.figures` only draw; this module picks the numbers
(medians and credible bounds from the summaries, the leading-order frequency track), the labels
(from :mod:`factsheet.labels`) and the file names. Each figure is written beside the page that
uses it. Importing this module loads matplotlib.
"""

from __future__ import annotations

import time
from collections.abc import Callable

import astropy.units as u
import numpy as np

from factsheet import figures as fg
from factsheet import labels
from factsheet.model import Derived, SiteFigure
from factsheet.physics import inspiral
from factsheet.render.contexts import display_summary
from factsheet.render.history import CURRENT_LABEL

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


def _item(label: str, s) -> fg.IntervalItem:
    return fg.IntervalItem(label, s.median, s.low, s.high, s.unit, s.level)


def event_figures(item: Derived) -> list[SiteFigure]:
    """The figures of one sheet, in page order."""
    q, base = item.quantities, f"events/{item.event.id}"
    out = []
    masses = [k for k in ("heavier_mass", "lighter_mass", "remnant_mass") if k in q]
    out.append(
        _save(
            f"{base}-masses.svg",
            lambda: fg.component_intervals(
                [_item(labels.QUANTITIES[k].short, q[k]) for k in masses]
            ),
            "Masses (source frame) with credible intervals.",
        )
    )
    out.append(
        _save(
            f"{base}-track.svg",
            lambda: fg.frequency_track(_track(item)),
            "Frequency of the waves as they swept through the detectors' band "
            "(leading-order inspiral; observed frequencies).",
        )
    )
    if "energy_radiated" in q:
        out.extend(_comparisons(item, base))
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
                "Counterpart windows after the merger (a planning aid).",
            )
        )
    if item.event.history:
        out.append(
            _save(
                f"{base}-history.svg",
                lambda: fg.history(_history_points(item)),
                "How the estimate changed from one analysis to the next.",
            )
        )
    return out


def _track(item: Derived) -> fg.Track:
    q, f_low = item.quantities, item.settings.low_frequency.to_value(u.Hz)
    mc = q["chirp_mass_detector"].median * u.Msun
    f_isco = q["isco_frequency"].median
    f_top = max(f_isco, f_low * 1.05)
    freq = np.geomspace(f_low, f_top, 200) * u.Hz
    tau = inspiral.time_to_merger(mc, freq).to_value(u.s)
    ring = q.get("ringdown_frequency")
    damp = q.get("ringdown_damping_time")
    return fg.Track(
        tau, freq.value, f_low, f_isco, ring.median if ring else None, damp.median if damp else None
    )


def _median_as_shown(summary, energy_units: str) -> u.Quantity:
    """A median in the unit the sheet's table and the index show it in (J or erg, W or erg/s)."""
    shown = display_summary(summary, energy_units)
    return shown.median * u.Unit(shown.unit)


def _comparisons(item: Derived, base: str) -> list[SiteFigure]:
    ref, q, units = item.reference, item.quantities, item.settings.energy_units
    energies, lums, names = ref.energies(), ref.luminosities(), ref.comparison_labels()
    energy = _median_as_shown(q["energy_radiated"], units)
    peak = _median_as_shown(q["peak_luminosity"], units)
    e_others = [(names[k], energies[k].to(energy.unit)) for k in ENERGY_KEYS if k in energies]
    l_others = [(names[k], lums[k].to(peak.unit)) for k in LUMINOSITY_KEYS if k in lums]
    return [
        _save(
            f"{base}-energy.svg",
            lambda: fg.comparison_bars(
                labels.QUANTITIES["energy_radiated"].name,
                energy,
                "this merger (gravitational waves)",
                e_others,
            ),
            "Energy radiated as gravitational waves against familiar sources (log scale).",
        ),
        _save(
            f"{base}-luminosity.svg",
            lambda: fg.comparison_bars(
                labels.QUANTITIES["peak_luminosity"].name, peak, "this merger at its peak", l_others
            ),
            "Peak power in gravitational waves against familiar sources (log scale).",
        ),
    ]


def _history_points(item: Derived) -> list[fg.HistoryItem]:
    """The masses and the distance of every estimate, labelled as in the history list."""
    event = item.event
    steps = [(h.label, h.date.utc.isot[:10], h.estimate) for h in event.history if h.estimate]
    steps.append((CURRENT_LABEL, "", event.estimate))
    points = []
    for label, date, estimate in steps:
        given = estimate.values()
        for path in HISTORY_FIGURE:
            if path in given:
                v, name = given[path], labels.estimate_value(path, event.frame)
                points.append(fg.HistoryItem(label, date, name, v.median, v.low, v.high, v.unit))
    return points


def index_figures(derived: list[Derived], edges: dict[str, float]) -> list[SiteFigure]:
    """The catalogue-wide figures of the index page."""
    if not derived:
        return []
    plane, dist = [], []
    for d in derived:
        q = d.quantities
        m1, m2, dl, mt = q["heavier_mass"], q["lighter_mass"], q["distance"], q["total_mass"]
        plane.append(
            fg.PlaneItem(
                d.event.id,
                m1.median,
                m1.low,
                m1.high,
                m2.median,
                m2.low,
                m2.high,
                d.event.status,
                d.source_class,
            )
        )
        dist.append(
            fg.DistanceItem(
                d.event.id, dl.median, dl.low, dl.high, mt.median, mt.low, mt.high, d.event.status
            )
        )
    return [
        _save(
            "figures/mass-plane.svg",
            lambda: fg.mass_plane(plane, edges),
            "Component masses of every event, with the mass bands shaded.",
        ),
        _save(
            "figures/distance-mass.svg",
            lambda: fg.distance_mass(dist),
            f"{labels.QUANTITIES['distance'].name} against total mass (source frame).",
        ),
    ]
