"""The figures' one palette, fonts and axes look, defined once.

Palette: our own assignment of the Okabe & Ito hues ("Color Universal Design", 2008), which stay
distinct under the common forms of colour-vision deficiency; the reddish purple is darkened so
lines keep at least 3:1 contrast on the panel. Every colour-coded thing is also named in text, so
colour is never the only carrier.

Text: every text a figure draws (labels, tick labels, legends, annotations, titles) is plain
text, never mathtext or TeX: names written by catalogue authors may hold ``$``, ``\\`` or ``^``
and are drawn as written. Units and symbols are Unicode characters (M⊙, χ, ⁻¹, m₁), which the
font has, so no text needs maths markup.

Size: a sheet figure is drawn :data:`WIDTH` inches (360 pt, the units of its SVG viewBox) wide, and
the page shows it at 100 % of its column up to that natural width: 358 CSS px on a 390 px phone, at
least 80 mm in A4 print. Its smallest text, :data:`FONT` = 11.5 units, then reads at ≥ 11 px on the
phone and ≥ 7 pt on paper. Wider figures scale their fonts in proportion (:func:`font_for`).
Text is stored as SVG ``<text>`` (``svg.fonttype: none``) so it can be read, searched and
scaled; the SVG names ``'DejaVu Sans', sans-serif`` (matplotlib adds the generic family after
the font it measured with), so a viewer without DejaVu Sans falls back to its own sans-serif,
which is narrower than DejaVu in the common cases: labels placed with DejaVu's widths still fit.

Words: the figures are drawn once per language, inside ``factsheet.i18n.use_language``, so
their words are looked up when drawn (``_()``, or ``str()`` of a kept ``Text`` label), and their
numbers take the language's decimal symbol (:mod:`factsheet.figures.ticks`).

Dark mode: each figure is drawn on its own opaque light panel (figure and axes faces below), so
the dark text and mid-tone lines read the same whether the page around it is light or dark.
"""

from __future__ import annotations

import textwrap
from collections.abc import Callable, Iterator
from functools import wraps

import astropy.units as u
import matplotlib
from matplotlib.artist import Artist
from matplotlib.axes import Axes
from matplotlib.axis import Axis
from matplotlib.figure import Figure
from matplotlib.text import Text
from matplotlib.ticker import NullLocator, ScalarFormatter

from factsheet.figures.ticks import LocalFormatter
from factsheet.notation import unit_text

PANEL = "#FAFAF7"  # figure face: the light panel every figure sits on
AXES_FACE = "#FFFFFF"
INK = "#1F1F1F"  # text, axes edges
MUTED = "#6E6E6E"  # secondary text, earlier estimates, comparison bars
GRID = "#DADAD4"
RETRACTED = "#9A9A9A"
COMPARISON = "#B9B9B2"  # bars of the comparison objects, behind the event's own bar

ROLE = {
    "primary": "#0072B2",  # blue: the heavier component, the event itself
    "secondary": "#D55E00",  # vermillion: the lighter component
    "remnant": "#A8487F",  # darkened reddish purple: the final object
    "track": "#0072B2",
    "band_edge": "#6E6E6E",
    "isco": "#D55E00",
    "ringdown": "#009E73",  # bluish green
}

#: Text drawn in a role's colour uses this darker shade of its hue, which keeps at least 4.5:1
#: contrast on the panel (WCAG 2.1, 1.4.3); the lines keep the brighter hue.
TEXT_ROLE = {"isco": "#A34700", "ringdown": "#00775A", "band_edge": INK}

BAND_SHADE = {  # pale tints, only ever behind labelled regions
    "neutron_star": "#CDE6F5",
    "lower_gap": "#F4EDB0",
    "stellar_black_hole": "#DCEFE7",
    "pair_instability_gap": "#F5D9AE",
    "above_gap": "#EAD3E2",
}

WINDOW = {  # by window band (the keys of factsheet.labels.WINDOW_BANDS)
    "gamma_ray": "#A8487F",
    "x_ray_radio": "#0072B2",
    "optical_ultraviolet": "#009E73",
    "infrared": "#D55E00",
    "neutrino": "#56B4E9",
}

#: The sky map's credible regions: a pale tint for the 90 % region and a stronger one for the
#: 50 % region, each with an outline of at least 3:1 on what lies either side of it (the axes
#: face, the pale tint, the stronger tint); dark text keeps at least 4.5:1 on both tints.
SKY = {
    "outer_fill": "#D3E7F4",
    "outer_line": "#0072B2",
    "inner_fill": "#86BDE2",
    "inner_line": "#08446B",
    "peak": "#A34700",  # dark vermillion, with a dark edge
}

WIDTH = 5.0  # inches: the natural width of a sheet figure (360 pt, the SVG's user units)
FONT = 11.5  # the smallest font size (pt = SVG user units) of a figure WIDTH wide
PHONE_COLUMN_PX = 358  # the content column of a 390 px wide phone, in CSS px
MIN_TEXT_PX = 11  # the smallest figure text a reader should meet there


def font_for(width_in: float) -> float:
    """The smallest font size for a figure ``width_in`` inches wide shown in the phone column."""
    return max(FONT, MIN_TEXT_PX * width_in * 72 / PHONE_COLUMN_PX)


RC = {
    "text.parse_math": False,  # "$5 to $10" is a price range, not maths: see the docstring
    "text.usetex": False,
    "axes.formatter.use_mathtext": False,  # tick labels of a default formatter stay plain too
    "font.family": "sans-serif",
    "font.sans-serif": ["DejaVu Sans"],
    "font.size": 11.5,
    "mathtext.fontset": "dejavusans",
    "axes.unicode_minus": True,
    "svg.fonttype": "none",  # text as <text>: see the docstring
    "svg.hashsalt": "factsheet-figures",
    "text.color": INK,
}


def styled(draw: Callable) -> Callable:
    """Run a drawing function under our rc settings only (rc_context, restored after)."""

    @wraps(draw)
    def wrapper(*args, **kwargs):
        with matplotlib.rc_context(RC):
            return draw(*args, **kwargs)

    return wrapper


def plain_text(figure: Figure) -> None:
    """Mark every text already in ``figure`` as plain text (the rc settings cover texts made
    later, such as tick labels made while drawing: they copy ``usetex`` from the axis's first
    tick, which is marked here)."""
    for text in _texts(figure):
        text.set_parse_math(False)
        text.set_usetex(False)


def _texts(artist: Artist) -> Iterator[Text]:
    """Every text in ``artist`` and below it, without making ticks: ``findobj`` asks each axis
    for its ticks, which creates one per tick location (most of the cost of a walk), while
    ticks made later take their text settings from the rc settings and the first tick."""
    if isinstance(artist, Text):
        yield artist
    if isinstance(artist, Axis):
        made = vars(artist)  # the tick lists an axis has made so far (they are made lazily)
        children = [artist.label, artist.offsetText]
        children += [*made.get("majorTicks", ()), *made.get("minorTicks", ())]
    else:
        children = artist.get_children()
    for child in children:
        yield from _texts(child)


def new_figure(width: float, height: float, margins: tuple[float, float, float, float]) -> Figure:
    """A Figure (not pyplot) on the light panel with fixed margins (left, right, bottom, top)."""
    fig = Figure(figsize=(width, height), facecolor=PANEL)
    left, right, bottom, top = margins
    fig.subplots_adjust(left=left, right=right, bottom=bottom, top=top)
    return fig


def wrapped(label: str, width: int = 26) -> str:
    """A long row label broken onto lines of at most ``width`` characters (in the language in
    use: a kept label is wrapped as it is shown)."""
    label = str(label)
    return textwrap.fill(label, width) if len(label) > width else label


def two_lines(label: str, chars: int) -> str:
    """An axis name longer than ``chars`` characters broken at the space nearest its middle
    (names in a wordier language than English then still fit beside the axis)."""
    label = str(label)
    if len(label) <= chars or " " not in label:
        return label
    spaces = [k for k, c in enumerate(label) if c == " "]
    k = min(spaces, key=lambda k: abs(k - len(label) / 2))
    return label[:k] + "\n" + label[k + 1 :]


def row_height(labels: list[str], single: float) -> float:
    """Height in inches of one labelled row: more when a label runs onto a second line."""
    return single * 1.3 if any("\n" in text for text in labels) else single


def label_margin(labels: list[str], fig_width: float, fontsize: float = FONT) -> float:
    """Left margin (figure fraction) that fits the longest y label; DejaVu Sans ≈ 0.6 em a glyph."""
    longest = max((len(line) for text in labels for line in str(text).splitlines()), default=0)
    inches = 0.2 + longest * 0.6 * fontsize / 72
    return min(0.5, max(0.06, inches / fig_width))


def row_names(ax: Axes, ys, names: list[str], bold: int | None = None) -> None:
    """Names written above their rows, from the axes' left edge, instead of y tick labels, so
    long names take the figure's whole width (row ``bold`` in bold: the event's own)."""
    ax.yaxis.set_major_locator(NullLocator())
    for k, (y, name) in enumerate(zip(ys, names, strict=True)):
        ax.annotate(
            str(name),
            (0, y),
            xycoords=ax.get_yaxis_transform(),
            xytext=(0, 7),
            textcoords="offset points",
            va="bottom",
            ha="left",
            fontsize=FONT,
            color=INK,
            fontweight="bold" if k == bold else "normal",
        )


def axes_look(ax: Axes, grid_axis: str = "both") -> None:
    """Our axes look: thin dark frame, outward ticks, major-only light grid below the data.

    Called right after the Axes is made: an axis then has one tick of each kind, and every
    tick it makes later is made with these settings, instead of each tick being set again."""
    ax.set_facecolor(AXES_FACE)
    for spine in ax.spines.values():
        spine.set_color(INK)
        spine.set_linewidth(0.7)
    ax.tick_params(which="both", colors=INK, labelsize=FONT, direction="out", width=0.6)
    ax.tick_params(which="minor", length=2)
    if grid_axis:
        ax.grid(True, which="major", axis=grid_axis, color=GRID, linewidth=0.6)
    ax.set_axisbelow(True)


def local_numbers(ax: Axes) -> None:
    """matplotlib's own tick numbers in the language's digits (once the scales are set)."""
    for axis in (ax.xaxis, ax.yaxis):
        if type(axis.get_major_formatter()) is ScalarFormatter:
            axis.set_major_formatter(LocalFormatter())


def finish_axes(ax: Axes, grid_axis: str = "both") -> None:
    """:func:`axes_look` and :func:`local_numbers` at once, for an Axes already drawn on."""
    axes_look(ax, grid_axis)
    local_numbers(ax)


def unit_label(name: str, unit: str | u.UnitBase) -> str:
    """An axis label with its unit written as readers write it: ``Mass (M⊙)`` (the name in
    the language in use)."""
    text = unit_text(unit)
    return f"{name} ({text})" if text else str(name)


def as_value(x: float | u.Quantity, unit: u.UnitBase) -> float:
    """A plain float in ``unit``; a float is taken to be in ``unit`` already."""
    return float(x.to_value(unit)) if isinstance(x, u.Quantity) else float(x)
