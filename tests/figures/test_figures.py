"""Figures: structure, units in labels, alt text and reproducible SVG (no pixel comparisons).

All inputs are invented numbers; the figure functions only draw what they are given.
"""

from __future__ import annotations

import datetime as dt
import hashlib
import os
import re
import subprocess
import sys
import xml.etree.ElementTree as ET
from pathlib import Path

import astropy.units as u
import matplotlib
import matplotlib.pyplot as plt
import numpy as np
import pytest
from helpers import PLANE_EDGES as EDGES
from helpers import check_compact
from matplotlib.colors import to_hex
from matplotlib.container import ErrorbarContainer
from matplotlib.figure import Figure
from matplotlib.patches import Rectangle

from factsheet.figures import (
    ComparisonItem,
    DistanceItem,
    Drawing,
    HistoryItem,
    IntervalItem,
    PlaneItem,
    Track,
    WindowItem,
    comparison_points,
    component_intervals,
    distance_mass,
    frequency_track,
    history,
    mass_plane,
    style,
    to_svg,
    window_timeline,
)
from factsheet.figures.catalogue import band_ranges
from factsheet.figures.ticks import log_tick_values, plain_number, symlog_tick_values
from factsheet.figures.timeline import duration_words
from factsheet.figures.track import MAX_TRACK_POINTS
from factsheet.figures.words import interval_words

DAY_S = (1 * u.day).to_value(u.s)


def intervals(level: float = 0.9) -> Drawing:
    return component_intervals(
        [
            IntervalItem("m₁", 36.2, 31.8, 41.3, "solMass", level),
            IntervalItem("m₂", 29.1, 24.2, 33.0, "solMass", level),
            IntervalItem("Remnant mass", 62.0, 58.1, 66.4, "solMass", level),
        ]
    )


def track(ringdown: bool = True, n: int = 2000) -> Drawing:
    tau = np.geomspace(40.0, 1e-3, n)
    f = 20.0 * (tau / 40.0) ** (-3 / 8)  # an invented monotonic track, for drawing only
    return frequency_track(
        Track(tau, f, 20.0, 70.3, 251.0 if ringdown else None, 4.1e-3 if ringdown else None)
    )


def comparison() -> Drawing:
    items = [
        ComparisonItem("this merger", 3.6e49, 3.0e49, 4.5e49, "(3.6 +0.9 −0.6) × 10⁴⁹ W", True),
        ComparisonItem("Sun", 3.828e26, 3.828e26, 3.828e26, "3.8 × 10²⁶ W"),
        ComparisonItem("quasar", 1e40, 1e40, 1e40, "1.0 × 10⁴⁰ W"),
        ComparisonItem("Milky Way", 2e37, 2e37, 2e37, "2.0 × 10³⁷ W"),
    ]
    return comparison_points("Peak luminosity", "W", items)


WINDOWS = [
    WindowItem("prompt gamma", "gamma_ray", -1 / DAY_S, 60 / DAY_S),
    WindowItem("optical", "optical_ultraviolet", 0.2, 5.0),
    WindowItem("infrared", "infrared", 0.5, 14.0),
    WindowItem("late radio", "x_ray_radio", 5.0, 500.0),
]


def windows() -> Drawing:
    return window_timeline(WINDOWS, "2034-05-06 12:34:56 UTC")


def history_points() -> list[HistoryItem]:
    rows = [
        ("first", "2034-05-06", 1.0),
        ("update", "2034-05-20", 0.9),
        ("final", "2034-09-01", 0.95),
    ]
    quantities = [("m₁", 36.0, 30.0, 44.0, "solMass"), ("Distance", 440.0, 300.0, 600.0, "Mpc")]
    return [
        HistoryItem(label, date, q, m * s, lo * s, hi * s, unit)
        for label, date, s in rows
        for q, m, lo, hi, unit in quantities
    ]


def plane_events(n: int) -> list[PlaneItem]:
    rng = np.random.default_rng(7)
    events = []
    for i in range(n):
        m1 = float(np.exp(rng.uniform(np.log(1.3), np.log(110.0))))
        m2 = max(1.1, m1 * rng.uniform(0.2, 1.0))
        status = ("confirmed", "candidate", "retracted")[0 if i % 7 else (i // 7) % 2 + 1]
        events.append(
            PlaneItem(f"Q{i:03d}", m1, m1 * 0.85, m1 * 1.2, m2, m2 * 0.8, m2 * 1.1, status, "BBH")
        )
    return events


def distance_events(n: int = 20) -> list[DistanceItem]:
    return [
        DistanceItem(
            e.id,
            100.0 + 40 * i,
            60.0 + 30 * i,
            150.0 + 50 * i,
            e.m1_median + e.m2_median,
            0.9 * (e.m1_median + e.m2_median),
            1.1 * (e.m1_median + e.m2_median),
            e.status,
        )
        for i, e in enumerate(plane_events(n))
    ]


ALL = {
    "intervals": intervals,
    "track": track,
    "comparison": comparison,
    "windows": windows,
    "history": lambda: history(history_points()),
    "plane": lambda: mass_plane(plane_events(30), EDGES),
    "distance": lambda: distance_mass(distance_events()),
}


def containers(ax) -> list[ErrorbarContainer]:
    return [c for c in ax.containers if isinstance(c, ErrorbarContainer)]


def bars(ax) -> list[Rectangle]:
    return [p for p in ax.patches if isinstance(p, Rectangle)]


# --- each figure's structure -------------------------------------------------------------------


def test_component_intervals_structure_and_alt():
    d = intervals()
    (ax,) = d.figure.axes
    assert isinstance(d.figure, Figure)
    assert ax.get_xlabel() == "Mass (M⊙)"
    assert len(containers(ax)) == 3
    names = [t.get_text() for t in ax.texts]  # each row named above its bar, with its interval
    assert names == ["m₁   36 (32–41) M⊙", "m₂   29 (24–33) M⊙", "Remnant mass   62 (58–66) M⊙"]
    colours = {to_hex(c.lines[0].get_color()) for c in containers(ax)}
    assert colours == {style.ROLE[r].lower() for r in ("primary", "secondary", "remnant")}
    assert "m₁ 36 (32–41) M⊙" in d.alt and "Remnant mass 62 (58–66) M⊙" in d.alt
    assert d.alt.startswith("Medians with 90\xa0% credible intervals: ")


def test_interval_alt_states_the_credible_level_it_is_given():
    d = intervals(level=0.68)
    assert d.alt.startswith("Medians with 68\xa0% credible intervals: ")
    assert "90\xa0%" not in d.alt
    assert "m₁ 36 (32–41) M⊙" in d.alt


def test_frequency_track_axes_marks_and_ringdown():
    d = track()
    ax, after = d.figure.axes
    # one scale per panel: log time before the merger, linear milliseconds after it (no knee)
    assert (ax.get_xscale(), ax.get_yscale(), after.get_xscale()) == ("log", "log", "linear")
    assert ax.get_xlabel().startswith("Time before merger (s)") and ax.get_ylabel().endswith("(Hz)")
    assert after.get_xlabel() == "after (ms)"
    assert ax.xaxis_inverted()  # time to merger shrinks towards the merger, on the right
    flat = {round(ln.get_ydata()[0], 3) for ln in ax.lines if len(set(ln.get_ydata())) == 1}
    assert {20.0, 70.3, 251.0} <= flat
    ringdown = [ln for ln in after.lines if ln.get_label().startswith("ringdown")]
    assert list(ringdown[0].get_xdata()) == pytest.approx([0.0, 5 * 4.1])
    assert len(ax.lines[0].get_xdata()) <= MAX_TRACK_POINTS
    assert min(ax.lines[0].get_xdata()) > 0  # times to merger
    texts = " ".join(t.get_text() for t in ax.texts)
    assert "ISCO 70 Hz" in texts and "Ringdown 250 Hz" in texts and "band edge 20 Hz" in texts
    assert "20 Hz" in d.alt and "70 Hz" in d.alt and "250 Hz" in d.alt and "4.1 ms" in d.alt


def test_frequency_track_without_ringdown_draws_no_ringdown():
    d = track(ringdown=False, n=50)
    (ax,) = d.figure.axes  # no after-merger panel
    assert not [ln for ln in ax.lines if ln.get_label().startswith("ringdown")]
    assert "ringdown" not in d.alt
    assert len(ax.lines[0].get_xdata()) == 50


def test_comparison_points_on_a_log_axis_with_the_mergers_interval():
    d = comparison()
    (ax,) = d.figure.axes
    assert ax.get_xscale() == "log"
    assert ax.get_xlabel() == "Peak luminosity (W), log scale"
    assert not bars(ax)  # points, not bars from an arbitrary base
    (own,) = containers(ax)  # only the merger has an interval
    assert own.lines[0].get_xdata()[0] == 3.6e49
    segment = own.lines[2][0].get_segments()[0]
    assert [p[0] for p in segment] == pytest.approx([3.0e49, 4.5e49])
    assert to_hex(own.lines[0].get_color()) == style.ROLE["primary"].lower()
    others = sorted(ln.get_xdata()[0] for ln in ax.lines if ln.get_linestyle() == "None")
    assert 3.828e26 in others and 1e40 in others and 2e37 in others
    assert "this merger (3.6 +0.9 −0.6) × 10⁴⁹ W" in d.alt and "Sun 3.8 × 10²⁶ W" in d.alt
    assert "with its 90\xa0% credible interval" in d.alt
    names = [t.get_text() for t in ax.texts]
    assert names[0] == "this merger: (3.6 +0.9 −0.6) × 10⁴⁹ W"  # largest first
    assert ax.texts[0].get_fontweight() == "bold"


def test_window_timeline_bars_in_seconds_coloured_by_band():
    d = windows()
    (ax,) = d.figure.axes
    assert ax.get_xscale() == "symlog"
    rects = bars(ax)
    assert len(rects) == len(WINDOWS)
    starts = sorted(r.get_x() for r in rects)
    assert starts == pytest.approx(sorted(w.start_days * DAY_S for w in WINDOWS))
    assert {to_hex(r.get_facecolor()) for r in rects} == {
        style.WINDOW[w.band].lower() for w in WINDOWS
    }
    names = [t.get_text() for t in ax.texts]  # colour is never alone: the band is named
    assert "prompt gamma (gamma rays)" in names and "infrared" in names
    assert "2034-05-06 12:34:56 UTC" in ax.get_xlabel()
    assert "prompt gamma (gamma rays) from −1 s to 1 min" in d.alt
    assert "late radio (X-ray and radio) from 5 d to 1.4 yr" in d.alt


def test_history_one_panel_per_quantity_latest_highlighted():
    d = history(history_points())
    visible = [ax for ax in d.figure.axes if ax.get_visible()]
    assert [ax.get_title(loc="left") for ax in visible] == ["m₁ (M⊙)", "Distance (Mpc)"]
    for ax in visible:
        drawn = containers(ax)
        assert len(drawn) == 3
        hexes = [to_hex(c.lines[0].get_color()) for c in drawn]
        assert hexes.count(style.ROLE["primary"].lower()) == 1
    labels = [t.get_text() for t in visible[0].get_yticklabels()]
    assert labels == ["2034-05-06", "2034-05-20", "2034-09-01"]
    assert "m₁: first (2034-05-06) 36 (30–44) M⊙, then update" in d.alt


def test_band_ranges_are_contiguous_and_clipped():
    bands = band_ranges(EDGES, 0.8, 200.0)
    assert [b[0] for b in bands] == list(style.BAND_SHADE)
    assert all(bands[k][2] == bands[k + 1][1] for k in range(len(bands) - 1))
    assert (bands[0][1], bands[-1][2]) == (0.8, 200.0)
    assert [b[0] for b in band_ranges(EDGES, 1.0, 40.0)][-1] == "stellar_black_hole"


def test_mass_plane_bands_diagonal_statuses_and_alt():
    events = plane_events(30)
    d = mass_plane(events, EDGES)
    (ax,) = d.figure.axes
    assert (ax.get_xscale(), ax.get_yscale()) == ("log", "log")
    assert "(M⊙)" in ax.get_xlabel() and "(M⊙)" in ax.get_ylabel()
    shades = [to_hex(p.get_facecolor()) for p in ax.patches]
    for colour in style.BAND_SHADE.values():  # every band is shaded for m1 and for m2
        assert shades.count(colour.lower()) == 2
    diagonal = [ln for ln in ax.lines if list(ln.get_xdata()) == list(ln.get_ydata())]
    assert len(diagonal) == 1
    drawn = {c.get_label(): c for c in containers(ax)}
    assert set(drawn) == {"confirmed", "candidate", "retracted"}
    assert (
        drawn["candidate"].lines[0].get_markerfacecolor() != drawn["candidate"].lines[0].get_color()
    )
    assert to_hex(drawn["retracted"].lines[0].get_markeredgecolor()) == (style.RETRACTED.lower())
    total = sum(len(c.lines[0].get_xdata()) for c in drawn.values())
    assert total == 30
    counts = {s: sum(e.status == s for e in events) for s in drawn}
    assert f"30 events ({counts['confirmed']} confirmed" in d.alt
    assert "pair-instability gap 55 M⊙ to 130 M⊙" in d.alt


def test_mass_plane_names_events_where_there_is_room_and_says_so():
    drawing = mass_plane(plane_events(15), EDGES)
    few = drawing.figure.axes[0]
    named = [t.get_text() for t in few.texts if t.get_text().startswith("Q")]
    assert 8 <= len(named) <= 15  # the diagonal's name and the markers keep some out
    if len(named) < 15:
        assert f"{len(named)} of the 15 events are named" in drawing.alt
    many = mass_plane(plane_events(200), EDGES).figure.axes[0]
    assert 1 < len(many.texts) <= 5
    chosen = mass_plane(plane_events(200), EDGES, notable_ids={"Q005", "Q150"}).figure.axes[0]
    picked = {t.get_text() for t in chosen.texts if t.get_text().startswith("Q")}
    assert picked and picked <= {"Q005", "Q150"}  # only the chosen, where there is room


def test_distance_mass_log_axes_units_and_quantity_input():
    events = distance_events()
    events[0] = events[0]._replace(
        distance_median=0.1 * u.Gpc, distance_low=60 * u.Mpc, distance_high=0.15 * u.Gpc
    )
    d = distance_mass(events)
    (ax,) = d.figure.axes
    assert (ax.get_xscale(), ax.get_yscale()) == ("log", "log")
    assert ax.get_xlabel() == "Total mass (source frame) (M⊙)"
    assert ax.get_ylabel() == "Luminosity distance (Mpc)"
    ys = np.concatenate([c.lines[0].get_ydata() for c in containers(ax)])
    assert 100.0 in ys  # 0.1 Gpc drawn at 100 Mpc
    assert "distances from 100 Mpc to 860 Mpc" in d.alt


# --- helpers of the figures ----------------------------------------------------------------------


def test_interval_words_round_by_smaller_error_and_mark_negative_bounds():
    assert interval_words(36.2, 31.8, 41.3, "solMass") == "36 (32–41) M⊙"
    assert interval_words(0.05, -0.1, 0.2) == "0.05 (−0.10 to 0.20)"
    assert interval_words(2.0, 2.0, 2.0, "Hz") == "2.0 Hz"


def test_plain_ticks():
    assert [plain_number(x) for x in (0.01, 20.0, 5000.0, 1e6, 2e26, -10.0)] == [
        "0.01",
        "20",
        "5000",
        "10⁶",
        "2×10²⁶",
        "−10",
    ]
    assert log_tick_values(15.0, 400.0) == [20.0, 50.0, 100.0, 200.0]
    assert log_tick_values(1e26, 1e50)[:2] == [1e26, 1e30]
    assert symlog_tick_values(-40.0, 0.02, 0.01) == [-10.0, -1.0, -0.1, -0.01, 0.0, 0.01]


def test_duration_words():
    assert [duration_words(s) for s in (-1.0, 60.0, 6 * 3600.0, 3 * DAY_S, 200 * DAY_S)] == [
        "−1 s",
        "1 min",
        "6 h",
        "3 d",
        "200 d",
    ]


# --- SVG output and global state -----------------------------------------------------------------


@pytest.mark.parametrize("name", list(ALL))
def test_svg_is_clean_xml_without_links_scripts_or_dates(name):
    svg = to_svg(ALL[name]().figure)
    root = ET.fromstring(svg)
    assert root.tag == "{http://www.w3.org/2000/svg}svg"
    text = svg.decode()
    assert "<script" not in text.lower()
    urls = set(re.findall(r"https?://[^\"'\s<>]+", text))
    assert urls <= {"http://www.w3.org/2000/svg", "http://www.w3.org/1999/xlink"}
    assert "dc:date" not in text and "Matplotlib v" not in text
    assert dt.date.today().isoformat() not in text


@pytest.mark.parametrize("name", list(ALL))
def test_compact_svg_draws_what_matplotlib_wrote(name, monkeypatch):
    check_compact(lambda: ALL[name]().figure, monkeypatch)


@pytest.mark.parametrize("name", list(ALL))
def test_svg_is_byte_identical_within_a_process(name):
    assert to_svg(ALL[name]().figure) == to_svg(ALL[name]().figure)


def test_svg_is_byte_identical_across_processes():
    here = hashlib.sha256(to_svg(intervals().figure) + to_svg(track().figure)).hexdigest()
    code = (
        "import hashlib, test_figures as t; from factsheet.figures import to_svg; "
        "print(hashlib.sha256(to_svg(t.intervals().figure) + to_svg(t.track().figure)).hexdigest())"
    )
    here_dir = Path(__file__).parent
    paths = [str(here_dir.parent), os.environ.get("PYTHONPATH", "")]  # the shared test helpers
    env = {**os.environ, "PYTHONPATH": os.pathsep.join(p for p in paths if p)}
    out = subprocess.run(
        [sys.executable, "-c", code],
        capture_output=True,
        text=True,
        check=True,
        cwd=here_dir,
        env=env,
    )
    assert out.stdout.strip() == here


def test_figures_leave_no_pyplot_figures_or_rc_changes_behind():
    before = plt.get_fignums()
    salt = matplotlib.rcParams["svg.hashsalt"]
    for make in ALL.values():
        figure = make().figure
        to_svg(figure)
        assert not figure.axes  # cleared after writing
    assert plt.get_fignums() == before
    assert matplotlib.rcParams["svg.hashsalt"] == salt


def test_to_svg_can_keep_the_figure():
    figure = intervals().figure
    first = to_svg(figure, close=False)
    assert figure.axes and to_svg(figure) == first


def test_history_keeps_the_given_order_and_highlights_the_last_even_undated():
    points = [
        *history_points(),
        HistoryItem("Current estimate", "", "m₁", 35.0, 29.0, 43.0, "solMass"),
    ]
    d = history(points)
    ax = d.figure.axes[0]
    assert [t.get_text() for t in ax.get_yticklabels()][-1] == "Current\nestimate"
    last = max(containers(ax), key=lambda c: -c.lines[0].get_ydata()[0])
    assert to_hex(last.lines[0].get_color()) == style.ROLE["primary"].lower()
    assert d.alt.count("then Current estimate 35 (29–43) M⊙") == 1


def test_long_row_names_are_wrapped_above_their_rows():
    name = "optical and ultraviolet kilonova from the ejecta of the merger"
    d = window_timeline(
        [WindowItem(name, "optical_ultraviolet", 0.2, 5.0)], "2034-05-06 12:34:56 UTC"
    )
    (label,) = d.figure.axes[0].texts
    assert "\n" in label.get_text() and label.get_text().replace("\n", " ") == name
    assert not d.figure.axes[0].get_yticklabels()
