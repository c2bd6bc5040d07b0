"""The what-if-lensed figure: source-frame masses at each assumed magnification, with the
pair-instability gap shaded (an interval plot in columns). Draws the numbers it is given."""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from factsheet.figures import style
from factsheet.figures.inputs import Drawing
from factsheet.figures.ticks import digits
from factsheet.i18n import _


class LensMass(NamedTuple):
    """One mass at one magnification (solar masses), its role (a key of ``style.ROLE``: primary,
    secondary, remnant) and its name in the legend."""

    name: str
    role: str
    median: float
    low: float
    high: float
    shown: str = ""  # the median as the sheet's panel prints it, for the alt text


class LensColumn(NamedTuple):
    """One magnification: its label on the axis ("none", "4×") and the masses there."""

    label: str
    masses: tuple[LensMass, ...]


OFFSETS = {"primary": -0.18, "secondary": 0.0, "remnant": 0.18}
MARKERS = {"primary": "o", "secondary": "s", "remnant": "D"}


@style.styled
def lensed_masses(columns: list[LensColumn], gap: tuple[float, float], gap_label: str) -> Drawing:
    """Medians and credible intervals of the source-frame masses per magnification (columns,
    the unlensed values first), the pair-instability gap shaded between ``gap`` and labelled."""
    height = 3.7
    fig = style.new_figure(style.WIDTH, height, (0.14, 0.97, 0.62 / height, 1 - 0.72 / height))
    ax = fig.add_subplot()
    style.axes_look(ax, grid_axis="y")
    top = max(m.high for c in columns for m in c.masses) * 1.08
    gap_label = str(gap_label)  # the band's name in the language in use
    ax.axhspan(
        gap[0], min(gap[1], top * 2), color=style.BAND_SHADE["pair_instability_gap"], lw=0,
        label=gap_label,
    )  # fmt: skip
    seen: dict[str, str] = {}
    for x, column in enumerate(columns):
        for m in column.masses:
            err = [[m.median - m.low], [m.high - m.median]]
            ax.errorbar(
                x + OFFSETS.get(m.role, 0.0), m.median, yerr=err, fmt=MARKERS.get(m.role, "o"),
                color=style.ROLE[m.role], ms=5.5, capsize=3, lw=1.6,
                label=None if m.role in seen else str(m.name),
            )  # fmt: skip
            seen.setdefault(m.role, str(m.name))
    ax.set_xticks(np.arange(len(columns)), [str(c.label) for c in columns])
    ax.set_xlim(-0.5, len(columns) - 0.5)
    ax.set_ylim(0, top)
    ax.set_xlabel(_("Magnification assumed"))
    ax.set_ylabel(style.unit_label(_("Mass, source frame"), "solMass"))
    handles, names = ax.get_legend_handles_labels()
    order = [names.index(n) for n in names if n != gap_label] + [names.index(gap_label)]
    ax.legend(
        [handles[i] for i in order], [names[i] for i in order], loc="lower left",
        bbox_to_anchor=(-0.16, 1.0), ncol=2, frameon=False, fontsize=style.FONT,
        handletextpad=0.4, columnspacing=1.2, borderaxespad=0.2,
    )  # fmt: skip
    style.local_numbers(ax)
    return Drawing(fig, _alt(columns, gap_label))


def _alt(columns: list[LensColumn], gap_label: str) -> str:
    """The figure in words: each magnification with its masses."""
    parts = [
        f"{c.label}: "
        + ", ".join(f"{m.name} {m.shown or digits(f'{m.median:.3g}')}" for m in c.masses)
        for c in columns
    ]
    return _(
        "Source-frame masses (medians) at each assumed magnification, against the {gap} "
        "(shaded): {columns}."
    ).format(gap=gap_label, columns="; ".join(parts))
