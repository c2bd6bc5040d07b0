"""Figures on a time axis: counterpart windows around the merger, and the history of estimates."""

from __future__ import annotations

import astropy.units as u
import numpy as np
from matplotlib.axes import Axes
from matplotlib.figure import Figure
from matplotlib.patches import Patch
from matplotlib.ticker import FixedLocator, MaxNLocator, NullLocator

from factsheet.figures import style
from factsheet.figures.inputs import Drawing, HistoryItem, WindowItem
from factsheet.figures.ticks import plain_number
from factsheet.figures.words import interval_words
from factsheet.labels import WINDOW_BANDS

# Tick marks of the window axis, in seconds, named as people say them.
_MARKS = [
    (u.s, "1 s"),
    (u.min, "1 min"),
    (u.h, "1 h"),
    (u.day, "1 d"),
    (30 * u.day, "30 d"),
    (u.yr, "1 yr"),
    (10 * u.yr, "10 yr"),
]
LINTHRESH_S = 1.0  # the time axis is linear within ±1 s of the merger, logarithmic beyond


def duration_words(seconds: float) -> str:
    """A signed duration in the largest fitting unit: ``−1 s``, ``6 h``, ``1.5 yr``."""
    sign, x = ("−" if seconds < 0 else ""), abs(seconds) * u.s
    for unit in (u.yr, u.day, u.h, u.min):
        if x >= 1 * unit:
            return f"{sign}{plain_number(float(f'{x.to_value(unit):.2g}'))} {unit.to_string()}"
    return f"{sign}{plain_number(float(f'{x.to_value(u.s):.2g}'))} s"


def _time_marks(left: float, right: float) -> tuple[list[float], list[str]]:
    values, labels = [0.0], ["0"]
    for q, text in _MARKS:
        s = float((1 * q).to_value(u.s))
        if s <= right:
            values.append(s), labels.append(text)
        if -s >= left:
            values.insert(0, -s), labels.insert(0, "−" + text)
    return values, labels


def _window_axis(ax: Axes, left: float, right: float, merger_utc: str) -> None:
    ax.set_xlim(left, right)
    values, labels = _time_marks(left, right)
    ax.xaxis.set_major_locator(FixedLocator(values))
    ax.set_xticklabels(labels)
    ax.xaxis.set_minor_locator(NullLocator())
    ax.set_xlabel(f"Time since merger at {merger_utc} (linear within ±1 s)")


def _band_legend(fig: Figure, windows: list[WindowItem], left: float) -> None:
    bands = list(dict.fromkeys(w.band for w in windows))
    handles = [Patch(color=style.WINDOW[b], label=WINDOW_BANDS[b]) for b in bands]
    fig.legend(
        handles=handles,
        loc="upper left",
        bbox_to_anchor=(left, 1.0),
        ncols=len(bands),
        frameon=False,
        fontsize=7.5,
        handlelength=1.2,
        columnspacing=1.0,
    )


@style.styled
def window_timeline(windows: list[WindowItem], merger_utc: str) -> Drawing:
    """Counterpart windows as bars on a time axis, linear within ±1 s and logarithmic beyond."""
    day = float((1 * u.day).to_value(u.s))
    starts = np.array([w.start_days for w in windows]) * day
    ends = np.array([w.end_days for w in windows]) * day
    n = len(windows)
    names = [style.wrapped(w.name) for w in windows]
    height = 1.1 + style.row_height(names, 0.32) * n
    left = style.label_margin(names, 6.4)
    fig = style.new_figure(6.4, height, (left, 0.97, 0.55 / height, 1 - 0.45 / height))
    ax = fig.add_subplot()
    ax.set_xscale("symlog", linthresh=LINTHRESH_S, linscale=1.2)
    ys = np.arange(n)[::-1]
    ax.barh(
        ys, ends - starts, left=starts, color=[style.WINDOW[w.band] for w in windows], height=0.6
    )
    ax.axvline(0.0, color=style.INK, linewidth=0.9)
    _window_axis(ax, min(0.0, starts.min() * 3), ends.max() * 3, merger_utc)
    ax.set_ylim(-0.6, n - 0.4)
    ax.yaxis.set_major_locator(FixedLocator(ys))
    ax.set_yticklabels(names)
    _band_legend(fig, windows, left)
    style.finish_axes(ax, grid_axis="x")
    parts = [
        f"{w.name} ({WINDOW_BANDS[w.band]}) from {duration_words(s)} to {duration_words(e)}"
        for w, s, e in zip(windows, starts, ends, strict=True)
    ]
    alt = f"Counterpart windows relative to the merger at {merger_utc}: " + "; ".join(parts)
    return Drawing(fig, alt + ". A planning aid, not a prediction.")


def _estimate_name(label: str, date_iso: str) -> str:
    return f"{label} ({date_iso})" if date_iso else label


def _grouped(points: list[HistoryItem]) -> tuple[list[tuple[str, str]], dict[str, list]]:
    """Estimates in the order given (earliest first) and the points of each quantity."""
    estimates = list(dict.fromkeys((p.date_iso, p.label) for p in points))
    groups: dict[str, list[HistoryItem]] = {}
    for p in points:
        groups.setdefault(p.quantity_label, []).append(p)
    return estimates, groups


def _history_alt(groups: dict[str, list[HistoryItem]]) -> str:
    parts = [
        f"{name}: "
        + ", then ".join(
            f"{_estimate_name(p.label, p.date_iso)} "
            f"{interval_words(p.median, p.low, p.high, p.unit)}"
            for p in items
        )
        for name, items in groups.items()
    ]
    return "History of estimates, earliest first. " + "; ".join(parts) + "."


@style.styled
def history(points: list[HistoryItem]) -> Drawing:
    """Intervals of key quantities per estimate (given earliest first), one panel per quantity."""
    estimates, groups = _grouped(points)
    ncols = min(len(groups), 4)
    nrows = -(-len(groups) // ncols)
    names = [style.wrapped(_estimate_name(label, date)) for date, label in estimates]
    height = (0.75 + 0.3 * len(estimates)) * nrows + 0.2
    margins = (style.label_margin(names, 6.4), 0.98, 0.5 / height, 1 - 0.3 / height)
    fig = style.new_figure(6.4, height, margins)
    fig.subplots_adjust(wspace=0.12, hspace=0.9 if nrows > 1 else 0.2)
    axes = fig.subplots(nrows, ncols, sharey=True, squeeze=False).ravel()
    ys = {e: len(estimates) - 1 - i for i, e in enumerate(estimates)}
    for ax, (name, items) in zip(axes, groups.items(), strict=False):
        _history_panel(ax, name, items, ys, estimates[-1])
    for ax in axes[len(groups) :]:
        ax.set_visible(False)
    axes[0].yaxis.set_major_locator(FixedLocator(list(ys.values())))
    axes[0].set_yticklabels(names)
    axes[0].set_ylim(-0.6, len(estimates) - 0.4)
    return Drawing(fig, _history_alt(groups))


def _history_panel(ax, name: str, items: list[HistoryItem], ys: dict, latest: tuple) -> None:
    for p in items:
        key = (p.date_iso, p.label)
        colour = style.ROLE["primary"] if key == latest else style.MUTED
        ax.errorbar(
            p.median,
            ys[key],
            xerr=[[p.median - p.low], [p.high - p.median]],
            fmt="o",
            color=colour,
            ms=4,
            capsize=2.5,
            lw=1.4,
        )
    ax.set_title(name, fontsize=8.5, loc="left")
    ax.set_xlabel(style.unit_label("", items[0].unit).strip(" ()") or " ", fontsize=8)
    lo = min(p.low for p in items)
    hi = max(p.high for p in items)
    pad = 0.15 * (hi - lo or abs(hi) or 1.0)
    ax.set_xlim(lo - pad, hi + pad)
    style.finish_axes(ax, grid_axis="x")
    ax.xaxis.set_major_locator(MaxNLocator(4))  # small panels keep few ticks
