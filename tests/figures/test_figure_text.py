"""Figure text is plain text: ``$``, ``\\``, ``^``, ``_`` and braces are drawn as written.

Names reach the figures from catalogue authors (window names, history labels, event ids,
comparison labels); none of them may be read as mathtext or TeX. Each text a figure draws is
checked in the SVG itself, where it is stored as text (``svg.fonttype: none``): a plain text is
one ``<text>`` element per line holding the string as written, while mathtext would drop the
dollar signs and split the letters between them into ``<tspan>`` pieces in the oblique maths
face. All inputs are invented.
"""

from __future__ import annotations

import string
import xml.etree.ElementTree as ET
from collections.abc import Callable

import numpy as np
import pytest
from helpers import PLANE_EDGES as EDGES
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from matplotlib.text import Text

from factsheet.figures import (
    ComparisonItem,
    DistanceItem,
    Drawing,
    HistoryItem,
    IntervalItem,
    PlaneItem,
    SkyMark,
    SkyRegions,
    SkyTexts,
    Track,
    WindowItem,
    comparison_points,
    component_intervals,
    distance_mass,
    frequency_track,
    history,
    mass_plane,
    sky_figure,
    style,
    to_svg,
    window_timeline,
)

HOSTILE = ["$5 to $10", "$\\nonexistent$", "\\alpha", "^_{}", "$x^2$ and $$", "a $ b", "\\$7"]
SVG = "{http://www.w3.org/2000/svg}"


def intervals(text: str) -> Drawing:
    return component_intervals(
        [
            IntervalItem(text, 36.2, 31.8, 41.3, "solMass", 0.9),
            IntervalItem("m₂", 29.1, 24.2, 33.0, "solMass", 0.9),
        ]
    )


def comparison(text: str) -> Drawing:
    items = [
        ComparisonItem("this merger " + text, 3.6e49, 3e49, 4e49, "3.6 × 10⁴⁹ W", True),
        ComparisonItem(text, 3.828e26, 3.828e26, 3.828e26, "3.8 × 10²⁶ W"),
        ComparisonItem("other " + text, 2e37, 2e37, 2e37, "2.0 × 10³⁷ W"),
    ]
    return comparison_points(text, "W", items)


def windows(text: str) -> Drawing:
    items = [WindowItem(text, "gamma_ray", -1e-5, 1e-3), WindowItem("late", "infrared", 0.5, 14.0)]
    return window_timeline(items, text)


def estimates(text: str) -> Drawing:
    points = [
        HistoryItem(label, date, text, m, m - 5.0, m + 6.0, "solMass")
        for label, date, m in ((text, "2034-05-06", 36.0), ("update", "", 34.0))
    ]
    return history(points)


def plane(text: str) -> Drawing:
    events = [
        PlaneItem(text, 36.0, 31.0, 41.0, 29.0, 24.0, 33.0, "confirmed", "BBH"),
        PlaneItem("Q2", 1.5, 1.4, 1.7, 1.3, 1.2, 1.4, "candidate", "BNS"),
    ]
    return mass_plane(events, EDGES)


def distance(text: str) -> Drawing:
    events = [
        DistanceItem(text, 440.0, 300.0, 600.0, 65.0, 60.0, 70.0, "confirmed"),
        DistanceItem("Q2", 40.0, 30.0, 50.0, 2.8, 2.7, 2.9, "retracted"),
    ]
    return distance_mass(events)


def sky(text: str) -> Drawing:
    ra, dec = np.meshgrid(np.arange(180) * 2.0 + 1.0, np.arange(90) * 2.0 - 89.0)
    levels = np.clip(np.hypot(ra - 60.0, dec + 20.0) / 30.0, 0.0, 1.0)  # a disc, as levels
    marks = [SkyMark(text, 62.0, -18.0, "at the 40 % level"), SkyMark("Q2", 300.0, 10.0)]
    texts = SkyTexts("50 % region", "90 % region", "Where " + text + " lies")
    return sky_figure(levels, SkyRegions("40 deg²", "160 deg²"), marks, None, texts)


#: Every drawing function with a text input, and whether its alt text repeats that text.
FIGURES: dict[str, tuple[Callable[[str], Drawing], bool]] = {
    "component_intervals": (intervals, True),
    "comparison_points": (comparison, True),
    "window_timeline": (windows, True),
    "history": (estimates, True),
    "mass_plane": (plane, False),  # the alt text counts events, it does not name them
    "distance_mass": (distance, False),
    "sky_figure": (sky, True),
}


def drawn_texts(svg: bytes) -> list[str]:
    """Each line of text drawn in the SVG, as the viewer reads it (entities decoded)."""
    root = ET.fromstring(svg)
    return ["".join(node.itertext()) for node in root.iter(f"{SVG}text")]


def check_plain(drawing: Drawing, text: str, in_alt: bool) -> bytes:
    for artist in drawing.figure.findobj(Text):
        assert not artist.get_usetex()
    svg = to_svg(drawing.figure)
    assert b"oblique" not in svg.lower() and b"<tspan" not in svg  # nothing set as mathtext
    lines = drawn_texts(svg)
    assert any(text in drawn for drawn in lines), f"{text!r} is not drawn: {lines}"
    if in_alt:
        assert text in drawing.alt
    return svg


@pytest.mark.parametrize("text", HOSTILE)
@pytest.mark.parametrize("name", list(FIGURES))
def test_text_with_maths_characters_is_drawn_as_written(name, text):
    make, in_alt = FIGURES[name]
    first = check_plain(make(text), text, in_alt)
    assert to_svg(make(text).figure) == first  # still byte-identical across draws


def test_rc_settings_make_every_text_plain():
    assert style.RC["text.parse_math"] is False and style.RC["text.usetex"] is False
    drawing = windows("$5 to $10")
    to_svg(drawing.figure, close=False)  # tick labels exist once the figure has been drawn
    texts = drawing.figure.findobj(Text)
    assert len(texts) > 10
    assert all(not t.get_parse_math() and not t.get_usetex() for t in texts)


def test_no_figure_draws_maths_markup_of_its_own():
    # what the figures write themselves (tick labels, units) is Unicode, never "$10^{2}$";
    # the frequency track takes no caller text, so it is checked here only
    tau = np.geomspace(40.0, 1e-3, 50)
    track = frequency_track(Track(tau, 20.0 * (tau / 40.0) ** -0.375, 20.0, 70.0, 250.0, 4e-3))
    for drawing in [track, *(make("plain") for make, _ in FIGURES.values())]:
        to_svg(drawing.figure, close=False)
        texts = [t.get_text() for t in drawing.figure.findobj(Text)]
        assert not [t for t in texts if "$" in t or "\\" in t], texts


_ALPHABET = string.ascii_letters + string.digits + " $\\^_{}%#&~<>()[]|'\"-−⊙χ⁻¹"


@settings(max_examples=30, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(
    name=st.sampled_from(sorted(FIGURES)),
    text=st.text(alphabet=_ALPHABET, min_size=1, max_size=20).filter(lambda s: s.strip()),
)
def test_fuzz_any_printable_name_is_drawn_as_written(name, text):
    make, in_alt = FIGURES[name]
    drawing = make(text)
    svg = to_svg(drawing.figure)
    assert b"oblique" not in svg.lower() and b"<tspan" not in svg
    if in_alt:
        assert text in drawing.alt
