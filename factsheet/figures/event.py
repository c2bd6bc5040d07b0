"""Figures of one fact sheet: component intervals and comparisons on a log axis.

The functions only draw the numbers they are given (computed by the physics and derive stages);
numbers written in a figure come in as text, printed as the sheet's table prints them.
"""

from __future__ import annotations

import textwrap

import astropy.units as u
import numpy as np

from factsheet.figures import style
from factsheet.figures.inputs import ComparisonItem, Drawing, IntervalItem
from factsheet.figures.ticks import set_log_ticks
from factsheet.figures.words import interval_words
from factsheet.i18n import N_, _
from factsheet.notation import percent

INTERVAL_COLOURS = ("primary", "secondary", "remnant")
LINE_PT = 1.25 * style.FONT  # the height of one line of text
NBSP = "\u00a0"
NAME_CHARS = 44  # a row name wider than this runs onto a second line (the figure's width)


#: The axis name of a unit's kind (astropy's physical type); another kind is named as astropy
#: names it.
KIND_NAMES = {
    "mass": N_("Mass"),
    "length": N_("Length"),
    "time": N_("Time"),
    "frequency": N_("Frequency"),
}


def _quantity_name(unit: str) -> str:
    kind = str(u.Unit(unit).physical_type) if unit else ""
    if kind in KIND_NAMES:
        return _(KIND_NAMES[kind])
    return kind.capitalize() or _("Value")


def _shown(item: IntervalItem, unit: str = "") -> str:
    return item.shown or interval_words(item.median, item.low, item.high, unit)


def _rows_layout(names: list[str]) -> tuple[np.ndarray, float]:
    """y of each row (first row on top) in row units, and the height of a row in inches: each
    row holds its name above (one or two lines) and its mark below."""
    lines = max(name.count("\n") + 1 for name in names)
    row_pt = lines * LINE_PT + 7 + 14
    return np.arange(len(names))[::-1].astype(float), row_pt / 72


@style.styled
def component_intervals(items: list[IntervalItem]) -> Drawing:
    """Horizontal error bars of medians and credible intervals (standard interval plot), each
    row named above its bar with its interval as the sheet's table prints it."""
    unit = items[0].unit_str
    names = [f"{item.label}   {_shown(item, unit)}" for item in items]
    ys, row_in = _rows_layout(names)
    height = 0.62 + row_in * len(items)
    fig = style.new_figure(style.WIDTH, height, (0.04, 0.96, 0.5 / height, 1 - 0.05 / height))
    ax = fig.add_subplot()
    style.axes_look(ax, grid_axis="x")
    for y, item, role in zip(ys, items, _cycle(INTERVAL_COLOURS, len(items)), strict=True):
        err = [[item.median - item.low], [item.high - item.median]]
        colour = style.ROLE[role]
        ax.errorbar(item.median, y, xerr=err, fmt="o", color=colour, ms=6, capsize=4, lw=2)
    style.row_names(ax, ys, names)
    ax.set_ylim(-0.45, len(items) - 0.2)
    ax.set_xlim(0, max(item.high for item in items) * 1.08)
    ax.set_xlabel(style.unit_label(_quantity_name(unit), unit))
    style.local_numbers(ax)
    parts = [f"{i.label} {_shown(i, unit)}" for i in items]
    levels = "/".join(dict.fromkeys(percent(i.level) for i in items))
    alt = _("Medians with {levels} credible intervals: {values}.")
    return Drawing(fig, alt.format(levels=levels, values="; ".join(parts)))


def _cycle(names: tuple[str, ...], n: int) -> list[str]:
    return [names[i % len(names)] for i in range(n)]


def _log_range(items: list[ComparisonItem]) -> tuple[float, float]:
    lo = min(i.low for i in items)
    hi = max(i.high for i in items)
    pad = (hi / lo) ** 0.04
    return 10 ** np.floor(np.log10(lo / pad)), 10 ** np.ceil(np.log10(hi * pad))


def _name(row: ComparisonItem) -> str:
    """``name: value`` wrapped between words of the name, never inside the value."""
    glued = str(row.shown).replace(" ", NBSP)
    return textwrap.fill(f"{row.name}: {glued}", NAME_CHARS).replace(NBSP, " ")


@style.styled
def comparison_points(
    title: str, unit: str | u.UnitBase, items: list[ComparisonItem], level: float = 0.9
) -> Drawing:
    """The merger's value with its credible interval against reference values, as points on
    one log axis: equal distances are equal ratios, and no bar starts at an arbitrary base."""
    rows = sorted(items, key=lambda i: -i.median)
    names = [_name(r) for r in rows]
    ys, row_in = _rows_layout(names)
    height = 0.62 + row_in * len(rows)
    fig = style.new_figure(style.WIDTH, height, (0.04, 0.96, 0.5 / height, 1 - 0.05 / height))
    ax = fig.add_subplot()
    style.axes_look(ax, grid_axis="x")
    ax.set_xscale("log")
    for y, r in zip(ys, rows, strict=True):
        if r.own:
            err = [[r.median - r.low], [r.high - r.median]]
            ax.errorbar(
                r.median,
                y,
                xerr=err,
                fmt="D",
                color=style.ROLE["primary"],
                ms=7,
                capsize=4,
                lw=2,
                zorder=3,
            )
        else:
            ax.plot([r.median], [y], "o", color=style.MUTED, ms=6, zorder=3)
    style.row_names(ax, ys, names, bold=[r.own for r in rows].index(True))
    lo, hi = _log_range(rows)
    ax.set_xlim(lo, hi)
    set_log_ticks(ax.xaxis, lo, hi)
    ax.set_ylim(-0.45, len(rows) - 0.2)
    ax.set_xlabel(_("{name}, log scale").format(name=style.unit_label(title, unit)))
    style.local_numbers(ax)
    listed = "; ".join(f"{r.name} {r.shown}" for r in rows)
    alt = _(
        "{quantity} on a logarithmic scale, largest first, the merger's with its {level} "
        "credible interval: {values}."
    )
    return Drawing(fig, alt.format(quantity=title, level=percent(level), values=listed))
