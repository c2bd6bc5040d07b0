"""Figures of the whole catalogue: the component-mass plane and the distance–mass view."""

from __future__ import annotations

import astropy.units as u
import numpy as np
from matplotlib.axes import Axes
from matplotlib.patches import Patch

from factsheet import labels
from factsheet.figures import style
from factsheet.figures.inputs import DistanceItem, Drawing, PlaneItem
from factsheet.figures.ticks import set_log_ticks
from factsheet.figures.words import count_words, value_words

MSUN, MPC = u.Msun, u.Mpc
LABEL_ALL_UP_TO = 15  # with more events, only the notable ones are labelled
STATUS_ORDER = ("confirmed", "candidate", "retracted")
_SOURCE_FRAME = " (source frame)"


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
            ms=5,
            elinewidth=0.7,
            alpha=0.9,
            label=status,
            zorder=3,
            **_status_style(status, style.ROLE["primary"]),
        )


def _label(ax, xs: np.ndarray, ys: np.ndarray, ids: list[str], marked: list[int]) -> None:
    for i in marked:
        ax.annotate(
            ids[i],
            (xs[i, 0], ys[i, 0]),
            xytext=(4, 3),
            textcoords="offset points",
            fontsize=6.5,
            color=style.INK,
            zorder=4,
            bbox={"boxstyle": "square,pad=0.1", "fc": style.AXES_FACE, "ec": "none", "alpha": 0.75},
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
        handles.append(Patch(color=shade, label=labels.BANDS[name]))
    # m2 > m1 is empty by convention: the shades fade there, and the legend sits there
    ax.fill_between(
        [1e-3, 1e6], [1e-3, 1e6], 1e6, color=style.AXES_FACE, alpha=0.6, lw=0, zorder=0.5
    )
    return handles


def _square_log_axes(ax: Axes, lo: float, hi: float) -> None:
    """Both axes log over lo..hi, the m2 = m1 diagonal drawn and named."""
    ax.set_xscale("log")
    ax.set_yscale("log")
    ax.set_xlim(lo, hi)
    ax.set_ylim(lo, hi)
    for axis in (ax.xaxis, ax.yaxis):
        set_log_ticks(axis, lo, hi)
    ax.plot([lo, hi], [lo, hi], color=style.MUTED, lw=0.8, ls="--", zorder=1)
    ax.text(
        lo * 1.5,
        lo * 1.62,
        "m₂ = m₁",
        rotation=45,
        rotation_mode="anchor",
        ha="left",
        va="bottom",
        fontsize=7,
        color=style.MUTED,
    )
    ax.set_xlabel(style.unit_label(labels.QUANTITIES["heavier_mass"].name + _SOURCE_FRAME, MSUN))
    ax.set_ylabel(style.unit_label(labels.QUANTITIES["lighter_mass"].name + _SOURCE_FRAME, MSUN))


@style.styled
def mass_plane(
    events: list[PlaneItem], edges: dict[str, float], notable_ids: set[str] | None = None
) -> Drawing:
    """Component masses m1 against m2 on log axes, mass bands shaded (standard mass-plane form)."""
    m1 = _intervals(events, ("m1_median", "m1_low", "m1_high"), MSUN)
    m2 = _intervals(events, ("m2_median", "m2_low", "m2_high"), MSUN)
    lo, hi = min(m2.min(), m1.min(), 1.0) / 1.3, max(m1.max(), 8.0) * 1.5
    fig = style.new_figure(5.4, 5.4, (0.12, 0.97, 0.1, 0.95))  # square axes: the diagonal at 45°
    ax = fig.add_subplot()
    _square_log_axes(ax, lo, hi)
    band_handles = _shade_bands(ax, band_ranges(edges, lo, hi))
    statuses, ids = [e.status for e in events], [e.id for e in events]
    _points(ax, m1, m2, statuses)
    _label(ax, m1, m2, ids, notable(m1, m2, ids, notable_ids))
    status_handles, _ = ax.get_legend_handles_labels()
    ax.legend(handles=status_handles + band_handles, loc="upper left", fontsize=7, framealpha=0.9)
    style.finish_axes(ax)
    return Drawing(fig, _plane_alt(m1, m2, statuses, edges))


def _status_counts(statuses: list[str]) -> str:
    counts = [f"{statuses.count(s)} {s}" for s in STATUS_ORDER if s in statuses]
    return ", ".join(counts)


def _plane_alt(m1: np.ndarray, m2: np.ndarray, statuses: list[str], edges: dict) -> str:
    return (
        f"Component-mass plane of {count_words(len(statuses), 'event')} "
        f"({_status_counts(statuses)}): heavier bodies from "
        f"{value_words(m1[:, 0].min(), MSUN)} to {value_words(m1[:, 0].max(), MSUN)}, lighter "
        f"bodies from {value_words(m2[:, 0].min(), MSUN)} to "
        f"{value_words(m2[:, 0].max(), MSUN)}. Shaded mass bands: "
        f"{labels.BANDS['neutron_star']} up to {value_words(edges['neutron_star_max'], MSUN)}, "
        f"{labels.BANDS['lower_gap']} to {value_words(edges['lower_gap_top'], MSUN)}, "
        f"{labels.BANDS['pair_instability_gap']} "
        f"{value_words(edges['pair_instability_lower'], MSUN)} to "
        f"{value_words(edges['pair_instability_upper'], MSUN)}."
    )


@style.styled
def distance_mass(events: list[DistanceItem], notable_ids: set[str] | None = None) -> Drawing:
    """Luminosity distance against total source-frame mass, both on log axes."""
    d = _intervals(events, ("distance_median", "distance_low", "distance_high"), MPC)
    m = _intervals(events, ("total_mass_median", "total_mass_low", "total_mass_high"), MSUN)
    fig = style.new_figure(6.0, 4.0, (0.12, 0.97, 0.12, 0.97))
    ax = fig.add_subplot()
    ax.set_xscale("log")
    ax.set_yscale("log")
    statuses, ids = [e.status for e in events], [e.id for e in events]
    _points(ax, m, d, statuses)
    _label(ax, m, d, ids, notable(m, d, ids, notable_ids))
    (xlo, xhi), (ylo, yhi) = (m.min() / 1.4, m.max() * 1.6), (d.min() / 1.5, d.max() * 1.6)
    ax.set_xlim(xlo, xhi)
    ax.set_ylim(ylo, yhi)
    set_log_ticks(ax.xaxis, xlo, xhi)
    set_log_ticks(ax.yaxis, ylo, yhi)
    ax.set_xlabel(style.unit_label(labels.QUANTITIES["total_mass"].name + _SOURCE_FRAME, MSUN))
    ax.set_ylabel(style.unit_label(labels.QUANTITIES["distance"].name, MPC))
    ax.legend(loc="lower right", fontsize=7, frameon=True, framealpha=0.9)
    style.finish_axes(ax)
    alt = (
        f"Luminosity distance against total mass for {count_words(len(events), 'event')} "
        f"({_status_counts(statuses)}): distances from {value_words(d[:, 0].min(), MPC)} to "
        f"{value_words(d[:, 0].max(), MPC)}, total masses from "
        f"{value_words(m[:, 0].min(), MSUN)} to {value_words(m[:, 0].max(), MSUN)}."
    )
    return Drawing(fig, alt)
