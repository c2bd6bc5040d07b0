"""Figures drawn in another language: numbers take its decimal symbol (ticks, durations,
magnifications) while English stays as it was, words are looked up when drawn (no language
frozen at import), and longer names take more lines rather than leaving the figure.

The shipped Spanish catalogue may not hold every message yet, so these tests check what does
not depend on a translation: Spanish's decimal comma (CLDR, through Babel) and the layout rules.
"""

from __future__ import annotations

import dataclasses
import io

import astropy.units as u
import numpy as np
import pytest
from helpers import PLANE_EDGES as EDGES
from matplotlib.figure import Figure
from PIL import Image

from factsheet import labels
from factsheet.figures import PlaneItem, ShareBody, ShareCard, mass_plane, share_png, style
from factsheet.figures.catalogue import PLANE_NAME_CHARS
from factsheet.figures.share import STATUS_SHADE
from factsheet.figures.ticks import LocalFormatter, digits, plain_number
from factsheet.figures.timeline import _time_marks, duration_words
from factsheet.i18n import use_language
from factsheet.model import WindowSpec
from factsheet.render.methods_page import delay_range


def test_tick_numbers_take_the_spanish_decimal_comma_and_stay_ungrouped():
    values = (0.01, 0.5, 20.0, 5000.0, 2.5e6, -0.25)
    english = [plain_number(x) for x in values]
    assert english == ["0.01", "0.5", "20", "5000", "2.5×10⁶", "−0.25"]
    with use_language("es"):
        spanish = [plain_number(x) for x in values]
    assert spanish == ["0,01", "0,5", "20", "5000", "2,5×10⁶", "−0,25"]
    with use_language("es"):
        assert digits("1.5") == "1,5" and digits("120") == "120"


def test_matplotlibs_own_linear_ticks_follow_the_language():
    ax = Figure().add_subplot()
    ax.set_xlim(0, 1.2)
    style.finish_axes(ax)
    formatter = ax.xaxis.get_major_formatter()
    assert isinstance(formatter, LocalFormatter)
    ticks = [t for t in ax.get_xticks() if 0 <= t <= 1.2]
    formatter.set_locs(ticks)
    english = [formatter(t) for t in ticks]
    assert "0.2" in english and "1.0" in english
    with use_language("es"):
        spanish = [formatter(t) for t in ticks]
    assert spanish == [t.replace(".", ",") for t in english]


def test_log_axes_keep_their_fixed_labels():
    ax = Figure().add_subplot()
    ax.set_xscale("log")
    ax.set_xlim(1, 100)
    style.finish_axes(ax)
    assert not isinstance(ax.xaxis.get_major_formatter(), LocalFormatter)


def test_durations_and_delays_in_spanish_digits():
    year_s = (1 * u.yr).to_value(u.s)
    with use_language("es"):
        assert duration_words(1.5 * year_s).startswith("1,5 ")
        assert duration_words(-22 * 3600.0) == "−22 h"
        spanish = delay_range(WindowSpec("k", "b", "s", -500 * u.s, 500 * u.s, ""))
    assert "8,3" in spanish and "8.3" not in spanish
    english = delay_range(WindowSpec("k", "b", "s", -500 * u.s, 500 * u.s, ""))
    assert english == "8.3 minutes before to 8.3 minutes after"


def test_time_ticks_are_looked_up_when_drawn():
    """The tick words are a table of messages translated at draw time: in English, as written."""
    marks = dict(_time_marks(-100.0, 4e8))
    assert marks[(1 * u.yr).to_value(u.s)] == "1 yr" and marks[-60.0] == "−1 min"


@pytest.mark.parametrize("name", ["heavier_mass", "lighter_mass"])
def test_english_axis_names_of_the_mass_plane_take_one_line(name):
    text = style.unit_label(f"{labels.QUANTITIES[name].name} (source frame)", "solMass")
    assert len(text) <= PLANE_NAME_CHARS and style.two_lines(text, PLANE_NAME_CHARS) == text


def test_a_long_name_breaks_at_the_space_nearest_its_middle():
    assert style.two_lines("aaaa bb cccc dd eeee", 10) == "aaaa bb cccc\ndd eeee"
    assert style.two_lines("short", 10) == "short"
    assert style.two_lines("unbreakable_long_word", 5) == "unbreakable_long_word"


def plane_events() -> list[PlaneItem]:
    rng = np.random.default_rng(3)
    m1 = rng.uniform(5, 80, 8)
    m2 = m1 * rng.uniform(0.3, 0.95, 8)
    return [
        PlaneItem(f"EV-{k:03d}", a, a * 0.8, a * 1.2, b, b * 0.8, b * 1.2, "confirmed", "BBH")
        for k, (a, b) in enumerate(zip(m1, m2, strict=True))
    ]


def test_longer_names_grow_the_mass_plane_instead_of_leaving_it(monkeypatch):
    """Names as long as a wordier language's take more lines, and the figure makes room."""
    events = plane_events()
    height = mass_plane(events, EDGES).figure.get_figheight()
    wordy = {k: v + " of a wordier language" for k, v in labels.BANDS.items()}
    monkeypatch.setattr(labels, "BANDS", wordy)
    quantities = dict(labels.QUANTITIES)
    for key in ("heavier_mass", "lighter_mass"):
        q = quantities[key]
        quantities[key] = dataclasses.replace(q, name=q.name + " in a wordier language")
    monkeypatch.setattr(labels, "QUANTITIES", quantities)
    fig = mass_plane(events, EDGES).figure
    assert fig.get_figheight() > height
    ax = fig.axes[0]
    assert "\n" in ax.get_xlabel() and "\n" in ax.get_ylabel()
    legend = [t.get_text() for t in fig.legends[0].get_texts()]
    assert all(len(line) <= 24 for text in legend for line in text.splitlines())


def test_a_translated_status_word_keeps_its_tint():
    bodies = (
        ShareBody("m₁", "36 M⊙", 36.0, "primary"),
        ShareBody("m₂", "29 M⊙", 29.0, "secondary"),
    )
    card = ShareCard("An invented pair", "EV-001 · 2034-05-06 · BBH", "retirado", bodies, "Demo",
                     "retracted")  # fmt: skip
    image = Image.open(io.BytesIO(share_png(card))).convert("RGB")
    shade = STATUS_SHADE["retracted"]
    expected = tuple(int(shade[k : k + 2], 16) for k in (1, 3, 5))
    assert image.getpixel((1190, 15)) == expected
