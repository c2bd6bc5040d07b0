"""Figures stage: turn derived events into figure inputs, draw them and keep the SVG bytes.

The drawing functions in :mod:`factsheet.figures` only draw; this module picks the numbers
(medians and credible bounds from the summaries, the leading-order frequency track) and names
the files. Each figure is written beside the page that uses it.
"""

from __future__ import annotations

import time
from collections.abc import Callable

import astropy.units as u
import numpy as np

from factsheet import figures as fg
from factsheet.assets import SiteFigure
from factsheet.derive import Derived
from factsheet.physics import inspiral

ENERGY_KEYS = (
    "sun_lifetime",
    "supernova_neutrinos",
    "supernova_kinetic",
    "brightest_gamma_ray_burst",
    "solar_rest_energy",
    "world_energy_year",
)
LUMINOSITY_KEYS = ("sun", "milky_way", "luminous_quasar", "planck_luminosity")
# Window bands of the reference data -> colour roles of the figure palette.
BAND_ROLES = {
    "gamma-ray": "gamma",
    "optical/ultraviolet": "optical",
    "infrared": "infrared",
    "X-ray/radio": "xray_radio",
    "neutrino": "neutrino",
    "optical": "optical",
}


def _save(path: str, draw: Callable[[], fg.Drawing], caption: str) -> SiteFigure:
    """Draw a figure, write it as SVG and time both (the benchmark reports the share)."""
    start = time.perf_counter()
    drawing = draw()
    svg = fg.to_svg(drawing.figure)
    return SiteFigure(path, svg, drawing.alt, caption, time.perf_counter() - start)


def _item(label: str, s) -> fg.IntervalItem:
    return fg.IntervalItem(label, s.median, s.low, s.high, s.unit)


def event_figures(item: Derived) -> list[SiteFigure]:
    """The figures of one sheet, in page order."""
    q, base = item.quantities, f"events/{item.event.id}"
    out = []
    masses = [("m₁", "mass_1"), ("m₂", "mass_2"), ("remnant", "final_mass")]
    out.append(
        _save(
            f"{base}-masses.svg",
            lambda: fg.component_intervals([_item(lbl, q[k]) for lbl, k in masses if k in q]),
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
    if "radiated_energy" in q:
        out.extend(_comparisons(item, base))
    if item.windows:
        windows = [
            fg.WindowItem(
                w.name,
                _role(w),
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


def _role(window) -> str:
    return "flare" if window.scenario == "agn_disk" else BAND_ROLES.get(window.band, "optical")


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


def _comparisons(item: Derived, base: str) -> list[SiteFigure]:
    ref, q = item.reference, item.quantities
    energies, lums = ref.energies(), ref.luminosities()
    labels = {c.key: c.label for c in ref.comparisons}
    energy = q["radiated_energy"].median * u.J
    peak = q["peak_luminosity"].median * u.W
    e_others = [(labels[k], energies[k].to(u.J)) for k in ENERGY_KEYS if k in energies]
    l_others = [(labels[k], lums[k].to(u.W)) for k in LUMINOSITY_KEYS if k in lums]
    return [
        _save(
            f"{base}-energy.svg",
            lambda: fg.comparison_bars(
                "Energy radiated", energy, "this merger (gravitational waves)", e_others
            ),
            "Energy radiated as gravitational waves against familiar sources (log scale).",
        ),
        _save(
            f"{base}-luminosity.svg",
            lambda: fg.comparison_bars(
                "Peak luminosity", peak, "this merger at its peak", l_others
            ),
            "Peak power in gravitational waves against familiar sources (log scale).",
        ),
    ]


def _history_points(item: Derived) -> list[fg.HistoryItem]:
    steps = [(h.label, h.date.utc.isot[:10], h.parameters) for h in item.event.history]
    steps.append(("current", "", item.event.parameters))
    points = []
    for label, date, params in steps:
        for key, name in (("mass_1", "m₁"), ("mass_2", "m₂"), ("luminosity_distance", "distance")):
            if key in params:
                e = params[key]
                points.append(fg.HistoryItem(label, date, name, e.median, e.low, e.high, e.unit))
    return points


def index_figures(derived: list[Derived], edges: dict[str, float]) -> list[SiteFigure]:
    """The catalogue-wide figures of the index page."""
    if not derived:
        return []
    plane, dist = [], []
    for d in derived:
        q = d.quantities
        m1, m2, dl, mt = q["mass_1"], q["mass_2"], q["luminosity_distance"], q["total_mass"]
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
            "Luminosity distance against total mass (source frame).",
        ),
    ]
