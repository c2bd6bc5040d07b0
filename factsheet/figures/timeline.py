"""Figures on a time axis: counterpart windows around the merger, and the history of estimates."""

from __future__ import annotations

import textwrap

import astropy.units as u
import numpy as np
from matplotlib.axes import Axes
from matplotlib.ticker import FixedLocator, MaxNLocator, NullLocator

from factsheet.figures import style
from factsheet.figures.inputs import Drawing, HistoryItem, WindowItem
from factsheet.figures.ticks import plain_number
from factsheet.figures.words import interval_words
from factsheet.i18n import N_, _, ngettext
from factsheet.labels import WINDOW_BANDS

# Tick marks of the window axis, in seconds, named as people say them (translated when drawn).
_MARKS = [
    (u.s, N_("1 s")),
    (u.min, N_("1 min")),
    (u.h, N_("1 h")),
    (u.day, N_("1 d")),
    (7 * u.day, N_("1 wk")),
    (30 * u.day, N_("30 d")),
    (100 * u.day, N_("100 d")),
    (u.yr, N_("1 yr")),
    (10 * u.yr, N_("10 yr")),
]
LINTHRESH_S = 1.0  # with windows before the merger: linear within ±1 s of it, logarithmic beyond
NAME_CHARS = 44  # a window's name wider than this runs onto a second line


def duration_words(seconds: float) -> str:
    """A signed duration in the largest fitting unit: ``−1 s``, ``6 h``, ``1.5 yr``."""
    sign, x = ("−" if seconds < 0 else ""), abs(seconds) * u.s
    for unit in (u.yr, u.day, u.h, u.min, u.s):
        if x >= 1 * unit or unit is u.s:
            value = float(f"{x.to_value(unit):.2g}")
            return sign + _amount(plain_number(value), value, unit.to_string())
    raise AssertionError("unreachable")


def _amount(number: str, value: float, unit: str) -> str:
    """``6 h``, ``1.5 yr``: a number with a unit of time, in the language in use."""
    if unit == "yr":
        return ngettext("{n} yr", "{n} yr", value).format(n=number)
    if unit == "d":
        return ngettext("{n} d", "{n} d", value).format(n=number)
    return f"{number} {unit}"  # h, min, s: the SI's symbols


def _time_marks(left: float, right: float) -> list[tuple[float, str]]:
    marks = [(0.0, "0")] if left <= 0 <= right else []
    for q, mark in _MARKS:
        s, text = float((1 * q).to_value(u.s)), _(mark)
        marks += [(s, text)] if left <= s <= right else []
        marks += [(-s, "−" + text)] if left <= -s <= right else []
    return sorted(marks)


def _spaced(ax: Axes, marks: list[tuple[float, str]]) -> list[tuple[float, str]]:
    """The marks whose names do not touch, zero and the largest first, then inwards."""
    scale = 72 / ax.figure.dpi
    at = ax.transData.transform([(v, 0.0) for v, _text in marks])[:, 0] * scale
    half = [len(text) * 0.33 * style.FONT + 4 for _value, text in marks]  # half a name, a gap
    order = sorted(range(len(marks)), key=lambda k: (marks[k][0] != 0, -abs(marks[k][0])))
    kept: list[int] = []
    for k in order:
        if all(abs(at[k] - at[j]) >= half[k] + half[j] for j in kept):
            kept.append(k)
    return [marks[k] for k in sorted(kept)]


def _window_axis(ax: Axes, left: float, right: float, merger_utc: str, log: bool) -> None:
    ax.set_xlim(left, right)
    marks = _spaced(ax, _time_marks(left, right))
    ax.xaxis.set_major_locator(FixedLocator([v for v, _text in marks]))
    ax.set_xticklabels([text for _value, text in marks])
    ax.xaxis.set_minor_locator(NullLocator())
    if log:
        label = _("Time after the merger at\n{time} (log scale)")
    else:
        label = _("Time after the merger at\n{time} (linear within ±1 s)")
    ax.set_xlabel(label.format(time=merger_utc))


def _span(starts: np.ndarray, ends: np.ndarray) -> tuple[float, float, bool]:
    """The time axis that fits the windows: logarithmic from just before the first start when
    every window opens after the merger, otherwise symmetric-log around the merger."""
    if starts.min() > 0:
        return starts.min() / 2, ends.max() * 2, True
    return starts.min() * 3, ends.max() * 3, False


@style.styled
def window_timeline(windows: list[WindowItem], merger_utc: str) -> Drawing:
    """Counterpart windows as bars on a time axis that fits them, each named above its bar."""
    day = float((1 * u.day).to_value(u.s))
    starts = np.array([w.start_days for w in windows]) * day
    ends = np.array([w.end_days for w in windows]) * day
    names = [textwrap.fill(_window_name(w), NAME_CHARS) for w in windows]
    lines = max(name.count("\n") + 1 for name in names)
    row_in = (lines * 1.25 * style.FONT + 7 + 14) / 72
    height = 0.9 + row_in * len(windows)
    fig = style.new_figure(style.WIDTH, height, (0.04, 0.96, 0.75 / height, 1 - 0.05 / height))
    ax = fig.add_subplot()
    style.axes_look(ax, grid_axis="x")
    left, right, log = _span(starts, ends)
    if log:
        ax.set_xscale("log")
    else:
        ax.set_xscale("symlog", linthresh=LINTHRESH_S, linscale=1.2)
        ax.axvline(0.0, color=style.INK, linewidth=0.9)
    ys = np.arange(len(windows))[::-1]
    ax.barh(
        ys, ends - starts, left=starts, color=[style.WINDOW[w.band] for w in windows], height=0.3
    )
    _window_axis(ax, left, right, merger_utc, log)
    ax.set_ylim(-0.45, len(windows) - 0.2)
    style.row_names(ax, ys, names)
    style.local_numbers(ax)
    parts = [
        _("{window} ({band}) from {start} to {end}").format(
            window=w.name, band=WINDOW_BANDS[w.band], start=duration_words(s), end=duration_words(e)
        )
        for w, s, e in zip(windows, starts, ends, strict=True)
    ]
    alt = _(
        "Counterpart windows relative to the merger at {time}: {windows}. A planning aid, not a "
        "prediction."
    )
    return Drawing(fig, alt.format(time=merger_utc, windows="; ".join(parts)))


def _window_name(w: WindowItem) -> str:
    """The window's name, and its band when the name does not say it (colour is not alone)."""
    name, band = str(w.name), str(WINDOW_BANDS[w.band])
    return name if band.lower() in name.lower() else f"{name} ({band})"


def _estimate_name(label: str, date_iso: str) -> str:
    return f"{label} ({date_iso})" if date_iso else str(label)


def _grouped(points: list[HistoryItem]) -> tuple[list[tuple[str, str]], dict[str, list]]:
    """Estimates in the order given (earliest first) and the points of each quantity."""
    estimates = list(dict.fromkeys((p.date_iso, p.label) for p in points))
    groups: dict[str, list[HistoryItem]] = {}
    for p in points:
        groups.setdefault(p.quantity_label, []).append(p)
    return estimates, groups


def _history_alt(groups: dict[str, list[HistoryItem]]) -> str:
    then = _(", then ")  # between two estimates of one quantity, earliest first
    parts = [
        f"{name}: "
        + then.join(
            f"{_estimate_name(p.label, p.date_iso)} "
            f"{p.shown or interval_words(p.median, p.low, p.high, p.unit)}"
            for p in items
        )
        for name, items in groups.items()
    ]
    return _("History of estimates, earliest first. {quantities}.").format(
        quantities="; ".join(parts)
    )


@style.styled
def history(points: list[HistoryItem]) -> Drawing:
    """Intervals of key quantities per estimate (given earliest first), one panel per quantity,
    stacked so each panel takes the figure's width."""
    estimates, groups = _grouped(points)
    names = [date or style.wrapped(label, 10) for date, label in estimates]
    panel_in = (0.25 * len(estimates) + 0.2) + 0.62  # rows, and the title and ticks around them
    height = panel_in * len(groups) + 0.15
    margins = (style.label_margin(names, style.WIDTH), 0.96, 0.45 / height, 1 - 0.3 / height)
    fig = style.new_figure(style.WIDTH, height, margins)
    fig.subplots_adjust(hspace=0.62 / (panel_in - 0.62))
    axes = fig.subplots(len(groups), 1, sharey=True, squeeze=False).ravel()
    ys = {e: len(estimates) - 1 - i for i, e in enumerate(estimates)}
    for ax, (name, items) in zip(axes, groups.items(), strict=True):
        _history_panel(ax, name, items, ys, estimates[-1])
        ax.yaxis.set_major_locator(FixedLocator(list(ys.values())))
        ax.set_yticklabels(names)
    axes[0].set_ylim(-0.6, len(estimates) - 0.4)
    return Drawing(fig, _history_alt(groups))


def _history_panel(ax, name: str, items: list[HistoryItem], ys: dict, latest: tuple) -> None:
    style.axes_look(ax, grid_axis="x")
    for p in items:
        key = (p.date_iso, p.label)
        colour = style.ROLE["primary"] if key == latest else style.MUTED
        ax.errorbar(
            p.median,
            ys[key],
            xerr=[[p.median - p.low], [p.high - p.median]],
            fmt="o",
            color=colour,
            ms=5,
            capsize=3,
            lw=1.8,
        )
    ax.set_title(style.unit_label(name, items[0].unit), fontsize=style.FONT, loc="left")
    lo = min(p.low for p in items)
    hi = max(p.high for p in items)
    pad = 0.15 * (hi - lo or abs(hi) or 1.0)
    ax.set_xlim(lo - pad, hi + pad)
    style.local_numbers(ax)
    ax.xaxis.set_major_locator(MaxNLocator(5))
