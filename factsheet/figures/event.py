"""Figures of one fact sheet: component intervals and log-scale comparisons.

The functions only draw the numbers they are given (computed by the physics and derive stages).
"""

from __future__ import annotations

import astropy.units as u
import numpy as np
from matplotlib.axes import Axes
from matplotlib.ticker import FixedLocator

from factsheet.figures import style
from factsheet.figures.inputs import Drawing, IntervalItem
from factsheet.figures.ticks import set_log_ticks
from factsheet.figures.words import interval_words, value_words
from factsheet.notation import percent

INTERVAL_COLOURS = ("primary", "secondary", "remnant")


def _quantity_name(unit: str) -> str:
    kind = str(u.Unit(unit).physical_type) if unit else ""
    return "Mass" if kind == "mass" else (kind.capitalize() or "Value")


@style.styled
def component_intervals(items: list[IntervalItem]) -> Drawing:
    """Horizontal error bars of medians and credible intervals (standard interval plot)."""
    unit = items[0].unit_str
    names = [style.wrapped(item.label) for item in items]
    height = 0.5 + style.row_height(names, 0.42) * len(items)
    fig = style.new_figure(6.4, height, (style.label_margin(names, 6.4), 0.97, 0.6 / height, 0.97))
    ax = fig.add_subplot()
    ys = np.arange(len(items))[::-1]
    for y, item, role in zip(ys, items, _cycle(INTERVAL_COLOURS, len(items)), strict=True):
        colour = style.ROLE[role]
        err = [[item.median - item.low], [item.high - item.median]]
        ax.errorbar(item.median, y, xerr=err, fmt="o", color=colour, ms=5, capsize=3, lw=1.6)
        ax.annotate(
            interval_words(item.median, item.low, item.high),
            (item.high, y),
            xytext=(6, 0),
            textcoords="offset points",
            va="center",
            fontsize=8,
            color=style.INK,
        )
    ax.yaxis.set_major_locator(FixedLocator(ys))
    ax.set_yticklabels(names)
    ax.set_ylim(-0.6, len(items) - 0.4)
    ax.set_xlim(0, max(item.high for item in items) * 1.3)
    ax.set_xlabel(style.unit_label(_quantity_name(unit), unit))
    style.finish_axes(ax, grid_axis="x")
    parts = [f"{i.label} {interval_words(i.median, i.low, i.high, unit)}" for i in items]
    levels = "/".join(dict.fromkeys(percent(i.level) for i in items))
    return Drawing(fig, f"Medians with {levels} credible intervals: " + "; ".join(parts) + ".")


def _cycle(names: tuple[str, ...], n: int) -> list[str]:
    return [names[i % len(names)] for i in range(n)]


def _row_labels(ax: Axes, rows: list[tuple[str, float, bool]]) -> None:
    """Names on the y axis and values after the bars; the event's own row in bold."""
    ax.yaxis.set_major_locator(FixedLocator(np.arange(len(rows))))
    ax.set_yticklabels([style.wrapped(r[0]) for r in rows])
    for y, (tick, (_, v, mine)) in enumerate(zip(ax.get_yticklabels(), rows, strict=True)):
        weight = "bold" if mine else "normal"
        tick.set_fontweight(weight)
        ax.text(v * 1.12, y, value_words(v, ""), va="center", fontsize=7.5, fontweight=weight)
    ax.set_ylim(-0.6, len(rows) - 0.4)


@style.styled
def comparison_bars(
    title: str, value: u.Quantity, label: str, others: list[tuple[str, u.Quantity]]
) -> Drawing:
    """The event's value against comparison objects as log-scale horizontal bars."""
    unit = value.unit
    rows = [(label, float(value.value), True)]
    rows += [(n, float(q.to_value(unit)), False) for n, q in others]
    rows.sort(key=lambda r: r[1])
    names = [style.wrapped(r[0]) for r in rows]
    height = 0.7 + style.row_height(names, 0.34) * len(rows)
    left = style.label_margin(names, 6.4)
    fig = style.new_figure(6.4, height, (left, 0.95, 0.5 / height, 1 - 0.3 / height))
    ax = fig.add_subplot()
    ax.set_xscale("log")
    vals = np.array([r[1] for r in rows])
    floor = 10.0 ** np.floor(np.log10(vals.min()) - 0.5)
    colours = [style.ROLE["primary"] if r[2] else style.COMPARISON for r in rows]
    ax.barh(np.arange(len(rows)), vals - floor, left=floor, color=colours, height=0.62)
    _row_labels(ax, rows)
    hi = vals.max() * (vals.max() / floor) ** 0.2  # room for the value written after the bar
    ax.set_xlim(floor, hi)
    set_log_ticks(ax.xaxis, floor, hi)
    ax.set_xlabel(style.unit_label(title, unit) + ", log scale")
    style.finish_axes(ax, grid_axis="x")
    listed = "; ".join(f"{r[0]} {value_words(r[1], unit)}" for r in rows[::-1])
    return Drawing(fig, f"{title} on a logarithmic scale, largest first: {listed}.")
