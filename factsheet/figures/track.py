"""The frequency track through the detector band, with the band edge, ISCO and ringdown marked.

Two panels share the frequency axis: before the merger, time to merger on a logarithmic axis
(read right to left as the waves approach the merger; the leading-order track is a straight
line there), and after it, a linear axis in milliseconds holding the ringdown. Each panel has one
scale, so the track shows no knee where an axis changes from logarithmic to linear; the gap
between the panels is the merger.
"""

from __future__ import annotations

import math
import textwrap

import numpy as np
from matplotlib.axes import Axes
from matplotlib.ticker import FixedLocator, MaxNLocator, NullLocator

from factsheet.figures import style
from factsheet.figures.inputs import Drawing, Track
from factsheet.figures.ticks import log_tick_values, plain_number, set_log_ticks
from factsheet.figures.words import value_words
from factsheet.i18n import _
from factsheet.labels import FIGURE_NAMES, QUANTITIES

MAX_TRACK_POINTS = 600  # the track is thinned to this many points for the drawing
RINGDOWN_TAUS = 5  # the ringdown bar spans this many damping times after the merger
NO_TRACK_S = (1.0, 1e-3)  # the span of the before-merger axis when no inspiral is in band
NOTE_CHARS = 28  # the note's lines, at most this long (the before-merger panel's width)
AXIS_NAME_CHARS = 36  # beside the after-merger panel, a longer axis name takes two lines
LINE_IN = 0.2  # inches of one more line of text


def _thin(t: np.ndarray, f: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    if len(t) <= MAX_TRACK_POINTS:
        return t, f
    keep = np.unique(np.linspace(0, len(t) - 1, MAX_TRACK_POINTS).astype(int))
    return t[keep], f[keep]


def _text(track: Track, key: str, value: float, unit: str) -> str:
    return str((track.texts or {}).get(key) or value_words(value, unit))


def _marks(track: Track) -> list[tuple[str, float, str, str, bool]]:
    """(label, frequency, palette role, line style, label above the line) of each mark; the
    band edge's and the ISCO's labels go on their far sides, so they never overlap."""
    isco_in_band = track.f_isco_hz > track.f_low_hz
    marks = [
        (
            f"{FIGURE_NAMES['band_edge']} {value_words(track.f_low_hz, 'Hz')}",
            track.f_low_hz,
            "band_edge",
            "--",
            not isco_in_band,
        ),
        (
            f"{QUANTITIES['isco_frequency'].short} "
            f"{_text(track, 'isco_frequency', track.f_isco_hz, 'Hz')}",
            track.f_isco_hz,
            "isco",
            ":",
            isco_in_band,
        ),
    ]
    if track.f_ringdown_hz is not None:
        text = _text(track, "ringdown_frequency", track.f_ringdown_hz, "Hz")
        name = QUANTITIES["ringdown_frequency"].short
        marks.append((f"{name} {text}", track.f_ringdown_hz, "ringdown", "-.", True))
    return marks


def _mark_frequencies(axes: list[Axes], track: Track) -> None:
    for text, f, role, linestyle, above in _marks(track):
        colour = style.ROLE[role]
        for ax in axes:
            ax.axhline(f, color=colour, linestyle=linestyle, linewidth=1.2, zorder=1)
        axes[0].annotate(
            text,
            (0, f),
            xycoords=axes[0].get_yaxis_transform(),
            xytext=(4, 3 if above else -3),
            textcoords="offset points",
            color=style.TEXT_ROLE[role],
            fontsize=style.FONT,
            va="bottom" if above else "top",
        )


def _before_name(ring: bool) -> str:
    """The before-merger axis's name; beside the after-merger panel, on two lines when it is
    longer than the panel is wide (in a wordier language than English)."""
    label = style.unit_label(FIGURE_NAMES["time_before_merger"], "s")
    label = _("{name}, log scale").format(name=label)
    return style.two_lines(label, AXIS_NAME_CHARS) if ring else label


def _before_axis(ax: Axes, t: np.ndarray, name: str) -> None:
    """Time to merger, log scale, decreasing to the right (towards the merger)."""
    left, right = (t.max() * 1.6, t.min() / 1.6) if len(t) else NO_TRACK_S
    ax.set_xscale("log")
    ax.set_xlim(left, right)
    decades = [
        10.0**e for e in range(math.ceil(math.log10(right)), 1 + math.floor(math.log10(left)))
    ]
    values = decades if len(decades) >= 3 else log_tick_values(right, left)
    span = math.log10(left / right)  # no tick at the panel's right end, beside the other panel's
    values = [v for v in values if 0.0 <= math.log10(left / v) <= 0.92 * span]
    ax.xaxis.set_major_locator(FixedLocator(values))
    ax.set_xticklabels([plain_number(v) for v in values])
    ax.xaxis.set_minor_locator(NullLocator())
    ax.set_xlabel(name)


def _after_axis(ax: Axes, track: Track) -> None:
    """Time after the merger in milliseconds, linear, with the ringdown's bar."""
    tau_ms = 1e3 * (track.tau_ringdown_s or 0.0)
    ax.set_xlim(0.0, max(RINGDOWN_TAUS * tau_ms * 1.25, 1.0))
    ax.xaxis.set_major_locator(MaxNLocator(2, integer=True))
    ax.set_xlabel(style.unit_label(FIGURE_NAMES["time_after_merger"], "ms"))
    ax.tick_params(axis="y", which="both", left=False, labelleft=False)
    ax.axvline(0.0, color=style.INK, linewidth=1.0)
    ax.annotate(
        str(FIGURE_NAMES["merger"]),
        (0, 1),
        xycoords="axes fraction",
        xytext=(4, -4),
        textcoords="offset points",
        va="top",
        fontsize=style.FONT,
    )
    if track.f_ringdown_hz is not None and tau_ms:
        ax.plot(
            [0.0, RINGDOWN_TAUS * tau_ms],
            [track.f_ringdown_hz] * 2,
            color=style.ROLE["ringdown"],
            linewidth=5,
            solid_capstyle="butt",
            label=_("ringdown ({n} τ)").format(n=RINGDOWN_TAUS),
        )


def _note(ax: Axes, track: Track, lo: float, hi: float) -> None:
    """The caller's sentence in the middle of the before-merger panel, between the marks."""
    top = track.f_ringdown_hz or hi
    y = math.sqrt(max(track.f_low_hz, track.f_isco_hz) * top)
    ax.text(
        0.5,
        y,
        textwrap.fill(str(track.note), 30),
        transform=ax.get_yaxis_transform(),
        ha="center",
        va="center",
        fontsize=style.FONT,
        color=style.INK,
    )


@style.styled
def frequency_track(track: Track) -> Drawing:
    """Gravitational-wave frequency against time to merger (log–log before the merger, linear
    after it), the band edge, the ISCO and the ringdown frequency marked."""
    t, f = _thin(np.asarray(track.time_to_merger_s, float), np.asarray(track.frequency_hz, float))
    ring = track.f_ringdown_hz is not None
    before_name = _before_name(ring)
    if "\n" in before_name:  # one more line below the panels
        height = 3.4 + LINE_IN
        margins = (0.16, 0.97, (0.16 * 3.4 + LINE_IN) / height, 1 - 0.03 * 3.4 / height)
    else:
        height, margins = 3.4, (0.16, 0.97, 0.16, 0.97)
    fig = style.new_figure(style.WIDTH, height, margins)
    grid = fig.add_gridspec(1, 2 if ring else 1, width_ratios=[3, 1] if ring else [1], wspace=0.06)
    ax = fig.add_subplot(grid[0])
    axes = [ax, fig.add_subplot(grid[1], sharey=ax)] if ring else [ax]
    for each in axes:
        style.axes_look(each)
    ax.set_yscale("log")
    if len(t):
        track_name = _("frequency track")
        ax.plot(t, f, color=style.ROLE["track"], linewidth=2.2, label=track_name, zorder=2)
    _mark_frequencies(axes, track)
    fs = [*([f.min(), f.max()] if len(f) else []), *(m[1] for m in _marks(track))]
    lo, hi = min(fs) / 1.5, max(fs) * 1.7
    ax.set_ylim(lo, hi)
    set_log_ticks(ax.yaxis, lo, hi)
    _before_axis(ax, t, before_name)
    if ring:
        _after_axis(axes[1], track)
    if track.note:
        _note(ax, track, lo, hi)
    ax.set_ylabel(style.unit_label(FIGURE_NAMES["frequency"], "Hz"))
    for each in axes:
        style.local_numbers(each)
    return Drawing(fig, _track_alt(track, t))


def _track_alt(track: Track, t: np.ndarray) -> str:
    edge = value_words(track.f_low_hz, "Hz")
    isco = _text(track, "isco_frequency", track.f_isco_hz, "Hz")
    ring = tau = ""
    if track.f_ringdown_hz is not None:
        ring = _text(track, "ringdown_frequency", track.f_ringdown_hz, "Hz")
        if track.tau_ringdown_s:
            tau = _text(track, "ringdown_damping_time", track.tau_ringdown_s * 1e3, "ms")
    if len(t):
        duration = _text(track, "time_in_band", float(t.max()), "s")
        if tau:
            text = _(
                "Gravitational-wave frequency rising from {edge} at the band edge, {duration} "
                "before merger, through the ISCO frequency {isco}, to the ringdown frequency "
                "{ringdown} with damping time {damping}."
            )
        elif ring:
            text = _(
                "Gravitational-wave frequency rising from {edge} at the band edge, {duration} "
                "before merger, through the ISCO frequency {isco}, to the ringdown frequency "
                "{ringdown}."
            )
        else:
            text = _(
                "Gravitational-wave frequency rising from {edge} at the band edge, {duration} "
                "before merger, through the ISCO frequency {isco}."
            )
    else:
        duration = ""
        if tau:
            text = _(
                "The inspiral ends at the ISCO frequency {isco}, below the band edge at {edge}, "
                "to the ringdown frequency {ringdown} with damping time {damping}."
            )
        elif ring:
            text = _(
                "The inspiral ends at the ISCO frequency {isco}, below the band edge at {edge}, "
                "to the ringdown frequency {ringdown}."
            )
        else:
            text = _(
                "The inspiral ends at the ISCO frequency {isco}, below the band edge at {edge}."
            )
    text = text.format(edge=edge, duration=duration, isco=isco, ringdown=ring, damping=tau)
    return f"{text} {track.note}" if track.note else text
