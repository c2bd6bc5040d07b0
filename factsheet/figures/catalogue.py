"""Figures of the whole catalogue: the component-mass plane and the distance–mass view."""

from __future__ import annotations

import astropy.units as u
import numpy as np
from matplotlib.axes import Axes
from matplotlib.patches import Patch

from factsheet import labels
from factsheet.figures import names, style
from factsheet.figures.inputs import DistanceItem, Drawing, PlaneItem
from factsheet.figures.ticks import set_log_ticks
from factsheet.figures.words import value_words
from factsheet.i18n import _, decimal_text, ngettext, pgettext
from factsheet.notation import format_median

MSUN, MPC = u.Msun, u.Mpc
LABEL_ALL_UP_TO = 15  # with more events, only the notable ones are candidates for a name
STATUS_ORDER = ("confirmed", "candidate", "retracted")


def status_word(status: str) -> str:
    """An event's status as the legend names it, in the language in use."""
    if status == "confirmed":
        return pgettext("status", "confirmed")
    if status == "candidate":
        return pgettext("status", "candidate")
    if status == "retracted":
        return pgettext("status", "retracted")
    return status


def _source_frame(name: str) -> str:
    """An axis name of masses in the source frame: ``Total mass (source frame)``."""
    return _("{name} (source frame)").format(name=name)


def _status_style(status: str, colour: str) -> dict:
    if status == "retracted":
        return {"mfc": "none", "mec": style.RETRACTED, "ecolor": style.RETRACTED, "marker": "x"}
    if status == "candidate":
        return {"mfc": style.AXES_FACE, "mec": colour, "ecolor": colour, "marker": "o"}
    return {"mfc": colour, "mec": colour, "ecolor": colour, "marker": "o"}


def _intervals(items, fields: tuple[str, str, str], unit) -> np.ndarray:
    return np.array([[style.as_value(getattr(i, f), unit) for f in fields] for i in items])


def _points(ax, xs: np.ndarray, ys: np.ndarray, statuses: list[str]) -> None:
    """Medians with interval bars, one errorbar call per status."""
    for status in STATUS_ORDER:
        sel = np.array([s == status for s in statuses])
        if not sel.any():
            continue
        x, y = xs[sel], ys[sel]
        xerr = np.abs(x[:, 1:] - x[:, :1]).T
        yerr = np.abs(y[:, 1:] - y[:, :1]).T
        ax.errorbar(
            x[:, 0],
            y[:, 0],
            xerr=xerr,
            yerr=yerr,
            linestyle="none",
            ms=7,
            elinewidth=0.9,
            alpha=0.95,
            label=status_word(status),
            zorder=3,
            **_status_style(status, style.ROLE["primary"]),
        )


def notable(xs: np.ndarray, ys: np.ndarray, ids: list[str], chosen: set[str] | None) -> list[int]:
    """Which events get a name: all when few, else the caller's choice or the axis extremes."""
    if len(ids) <= LABEL_ALL_UP_TO:
        return list(range(len(ids)))
    if chosen is not None:
        return [i for i, name in enumerate(ids) if name in chosen]
    x, y = xs[:, 0], ys[:, 0]
    extremes = {np.argmax(x), np.argmax(y), np.argmin(x), np.argmin(y / x)}
    return sorted(int(i) for i in extremes)


def band_ranges(edges: dict[str, float], lo: float, hi: float) -> list[tuple[str, float, float]]:
    """The five mass bands as (name, start, end) in M⊙, clipped to the axis range lo..hi.

    ``edges`` maps the reference data's edge keys (``neutron_star_max``, ``lower_gap_top``,
    ``pair_instability_lower``, ``pair_instability_upper``) to masses in M⊙.
    """
    cuts = [
        lo,
        edges["neutron_star_max"],
        edges["lower_gap_top"],
        edges["pair_instability_lower"],
        edges["pair_instability_upper"],
        hi,
    ]
    names = list(labels.BANDS)
    bands = [(names[k], max(cuts[k], lo), min(cuts[k + 1], hi)) for k in range(5)]
    return [b for b in bands if b[2] > b[1]]


def _shade_bands(ax, bands: list[tuple[str, float, float]]) -> list[Patch]:
    """Shade each band on both axes; return legend entries naming them."""
    handles = []
    for name, a, b in bands:
        shade = style.BAND_SHADE[name]
        ax.axvspan(a, b, color=shade, alpha=0.7, lw=0, zorder=0)
        ax.axhspan(a, b, color=shade, alpha=0.7, lw=0, zorder=0)
        handles.append(Patch(color=shade, label=style.wrapped(labels.BANDS[name], LEGEND_CHARS)))
    # m2 > m1 is empty by convention: the shades fade there
    ax.fill_between(
        [1e-3, 1e6], [1e-3, 1e6], 1e6, color=style.AXES_FACE, alpha=0.6, lw=0, zorder=0.5
    )
    return handles


def _square_log_axes(
    ax: Axes, lo: float, hi: float, axis_names: tuple[str, str]
) -> tuple[float, float, float, float]:
    """Both axes log over lo..hi, the m2 = m1 diagonal drawn and named, the axes named
    ``axis_names`` (x, y); return the box (pt) the diagonal's name takes."""
    ax.set_xscale("log")
    ax.set_yscale("log")
    ax.set_xlim(lo, hi)
    ax.set_ylim(lo, hi)
    for axis in (ax.xaxis, ax.yaxis):
        set_log_ticks(axis, lo, hi)
    ax.plot([lo, hi], [lo, hi], color=style.MUTED, lw=0.9, ls="--", zorder=1)
    at = lo * (hi / lo) ** 0.12  # near the low end, on the empty side of the diagonal (m₂ > m₁)
    ax.annotate(
        "m₂ = m₁",
        (at, at),
        xytext=(-4, 4),
        textcoords="offset points",
        rotation=45,
        rotation_mode="anchor",
        ha="left",
        va="bottom",
        fontsize=style.FONT,
        color=style.INK,
    )
    ax.set_xlabel(axis_names[0])
    ax.set_ylabel(axis_names[1])
    x, y = ax.transData.transform((at, at)) * 72 / ax.figure.dpi
    side = 7 * 0.6 * style.FONT * 0.71 + style.FONT  # the rotated name's extent on each axis
    return (x - side / 2, y, x + side, y + side + style.FONT)


PLANE_AXES_IN = 3.9  # side of the square axes of the mass plane, in inches
PLANE_LEFT_IN, PLANE_BOTTOM_IN = 0.85, 1.75  # room for the tick labels, axis names and legend
PLANE_NAME_CHARS = 48  # an axis name longer than this takes two lines (the English ones fit)
LEGEND_CHARS = 24  # a legend name longer than this takes two lines (the legend's two columns)
LINE_IN = 0.2  # inches of one more line of text


@style.styled
def mass_plane(
    events: list[PlaneItem], edges: dict[str, float], notable_ids: set[str] | None = None
) -> Drawing:
    """Component masses m1 against m2 on log axes, mass bands shaded (standard mass-plane form)."""
    m1 = _intervals(events, ("m1_median", "m1_low", "m1_high"), MSUN)
    m2 = _intervals(events, ("m2_median", "m2_low", "m2_high"), MSUN)
    lo, hi = min(m2.min(), m1.min(), 1.0) / 1.3, max(m1.max(), 8.0) * 1.5
    axis_names = tuple(
        style.two_lines(style.unit_label(_source_frame(name), MSUN), PLANE_NAME_CHARS)
        for name in (labels.QUANTITIES["heavier_mass"].name, labels.QUANTITIES["lighter_mass"].name)
    )
    bands = band_ranges(edges, lo, hi)
    statuses, ids = [e.status for e in events], [e.id for e in events]
    legend = [status_word(s) for s in STATUS_ORDER if s in statuses]
    legend += [style.wrapped(labels.BANDS[name], LEGEND_CHARS) for name, _a, _b in bands]
    # Room for names that run onto more lines (in a wordier language): below for the x axis's
    # name and the legend, at the left for the y axis's name (the square axes shrink).
    below = (axis_names[0].count("\n") + _legend_lines(legend)) * LINE_IN
    beside = axis_names[1].count("\n") * LINE_IN
    bottom_in, left_in = PLANE_BOTTOM_IN + below, PLANE_LEFT_IN + beside
    side = PLANE_AXES_IN - beside
    width, height = style.WIDTH, bottom_in + side + 0.15
    left, bottom = left_in / width, bottom_in / height
    top = (bottom_in + side) / height
    fig = style.new_figure(width, height, (left, left + side / width, bottom, top))
    ax = fig.add_subplot()  # square axes: the diagonal at 45°
    style.axes_look(ax)
    diagonal = _square_log_axes(ax, lo, hi, axis_names)
    band_handles = _shade_bands(ax, bands)
    _points(ax, m1, m2, statuses)
    chosen = names.order(statuses, notable(m1, m2, ids, notable_ids))
    named = names.place(ax, m1, m2, ids, chosen, [diagonal])
    status_handles, _labels = ax.get_legend_handles_labels()
    fig.legend(
        handles=status_handles + band_handles,
        loc="lower left",
        ncols=2,
        bbox_to_anchor=(0.01, 0.0),
        fontsize=style.FONT,
        frameon=False,
        handlelength=1.2,
        columnspacing=0.8,
        borderaxespad=0.2,
    )
    style.local_numbers(ax)
    return Drawing(fig, _plane_alt(m1, m2, statuses, edges) + _named_words(len(named), ids))


def _legend_lines(names: list[str], columns: int = 2) -> int:
    """The lines beyond one that the legend's names take in its longest column (filled column
    by column)."""
    per = max(1, -(-len(names) // columns))
    split = [names[k : k + per] for k in range(0, len(names), per)]
    return max((sum(n.count("\n") for n in column) for column in split), default=0)


def _count(n: int) -> str:
    return decimal_text(n, 0)


def _named_words(named: int, ids: list[str]) -> str:
    if named == len(ids):
        return ""
    words = ngettext(
        "{named} of the {total} events are named where there is room; the table lists all.",
        "{named} of the {total} events are named where there is room; the table lists all.",
        named,
    )
    return " " + words.format(named=_count(named), total=_count(len(ids)))


def _events(n: int) -> str:
    return ngettext("{n} event", "{n} events", n).format(n=_count(n))


def _status_count(status: str, n: int) -> str:
    """``3 confirmed``: how many events have a status, in the language in use."""
    if status == "confirmed":
        return ngettext("{n} confirmed", "{n} confirmed", n).format(n=_count(n))
    if status == "candidate":
        return ngettext("{n} candidate", "{n} candidate", n).format(n=_count(n))
    return ngettext("{n} retracted", "{n} retracted", n).format(n=_count(n))


def _status_counts(statuses: list[str]) -> str:
    counts = [_status_count(s, statuses.count(s)) for s in STATUS_ORDER if s in statuses]
    return ", ".join(counts)


def _plane_alt(m1: np.ndarray, m2: np.ndarray, statuses: list[str], edges: dict) -> str:
    return _(
        "Component-mass plane of {events} ({statuses}): heavier bodies from {heavier_low} to "
        "{heavier_high}, lighter bodies from {lighter_low} to {lighter_high}. Shaded mass "
        "bands: {neutron_star} up to {neutron_star_max}, {lower_gap} to {lower_gap_top}, "
        "{pair_gap} {pair_gap_low} to {pair_gap_high}."
    ).format(
        events=_events(len(statuses)),
        statuses=_status_counts(statuses),
        heavier_low=_median_words(m1, np.argmin(m1[:, 0]), MSUN),
        heavier_high=_median_words(m1, np.argmax(m1[:, 0]), MSUN),
        lighter_low=_median_words(m2, np.argmin(m2[:, 0]), MSUN),
        lighter_high=_median_words(m2, np.argmax(m2[:, 0]), MSUN),
        neutron_star=labels.BANDS["neutron_star"],
        neutron_star_max=value_words(edges["neutron_star_max"], MSUN),
        lower_gap=labels.BANDS["lower_gap"],
        lower_gap_top=value_words(edges["lower_gap_top"], MSUN),
        pair_gap=labels.BANDS["pair_instability_gap"],
        pair_gap_low=value_words(edges["pair_instability_lower"], MSUN),
        pair_gap_high=value_words(edges["pair_instability_upper"], MSUN),
    )


@style.styled
def distance_mass(events: list[DistanceItem], notable_ids: set[str] | None = None) -> Drawing:
    """Luminosity distance against total source-frame mass, both on log axes."""
    d = _intervals(events, ("distance_median", "distance_low", "distance_high"), MPC)
    m = _intervals(events, ("total_mass_median", "total_mass_low", "total_mass_high"), MSUN)
    fig = style.new_figure(style.WIDTH, 4.6, (0.19, 0.96, 0.8 / 4.6, 1 - 0.45 / 4.6))
    ax = fig.add_subplot()
    style.axes_look(ax)
    ax.set_xscale("log")
    ax.set_yscale("log")
    statuses, ids = [e.status for e in events], [e.id for e in events]
    _points(ax, m, d, statuses)
    (xlo, xhi), (ylo, yhi) = (m.min() / 1.4, m.max() * 1.6), (d.min() / 1.5, d.max() * 1.6)
    ax.set_xlim(xlo, xhi)
    ax.set_ylim(ylo, yhi)
    set_log_ticks(ax.xaxis, xlo, xhi)
    set_log_ticks(ax.yaxis, ylo, yhi)
    chosen = names.order(statuses, notable(m, d, ids, notable_ids))
    named = names.place(ax, m, d, ids, chosen, [])
    ax.set_xlabel(style.unit_label(_source_frame(labels.QUANTITIES["total_mass"].name), MSUN))
    ax.set_ylabel(style.unit_label(labels.QUANTITIES["distance"].name, MPC))
    fig.legend(
        loc="upper left",
        bbox_to_anchor=(0.01, 1.0),
        ncols=3,
        fontsize=style.FONT,
        frameon=False,
        handlelength=1.2,
        columnspacing=1.0,
    )
    style.local_numbers(ax)
    alt = _(
        "Luminosity distance against total mass for {events} ({statuses}): distances from "
        "{distance_low} to {distance_high}, total masses from {mass_low} to {mass_high}."
    ).format(
        events=_events(len(events)),
        statuses=_status_counts(statuses),
        distance_low=_median_words(d, np.argmin(d[:, 0]), MPC),
        distance_high=_median_words(d, np.argmax(d[:, 0]), MPC),
        mass_low=_median_words(m, np.argmin(m[:, 0]), MSUN),
        mass_high=_median_words(m, np.argmax(m[:, 0]), MSUN),
    )
    return Drawing(fig, alt + _named_words(len(named), ids))


def _median_words(values: np.ndarray, i, unit) -> str:
    """One event's median as its sheet prints it (rounded by its own interval)."""
    return format_median(*values[int(i)], unit)
