"""The frequency track through the detector band, with the band edge, ISCO and ringdown marked."""

from __future__ import annotations

import astropy.units as u
import numpy as np
from matplotlib.axes import Axes
from matplotlib.ticker import FixedLocator, NullLocator

from factsheet.figures import style
from factsheet.figures.inputs import Drawing, Track
from factsheet.figures.ticks import plain_number, set_log_ticks, symlog_tick_values
from factsheet.figures.words import value_words
from factsheet.labels import QUANTITIES

MAX_TRACK_POINTS = 600  # the track is thinned to this many points for the drawing
LINTHRESH_S = 1e-2  # the time axis is linear within ±10 ms of the merger, logarithmic beyond
RINGDOWN_TAUS = 5  # the ringdown bar spans this many damping times after the merger


def _thin(t: np.ndarray, f: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    if len(t) <= MAX_TRACK_POINTS:
        return t, f
    keep = np.unique(np.linspace(0, len(t) - 1, MAX_TRACK_POINTS).astype(int))
    return t[keep], f[keep]


def _marks(track: Track) -> list[tuple[str, float, str, str]]:
    """(name, frequency, palette role, line style) of each marked frequency."""
    marks = [
        ("band edge", track.f_low_hz, "band_edge", "--"),
        (QUANTITIES["isco_frequency"].short, track.f_isco_hz, "isco", ":"),
    ]
    if track.f_ringdown_hz is not None:
        marks.append(
            (QUANTITIES["ringdown_frequency"].short, track.f_ringdown_hz, "ringdown", "-.")
        )
    return marks


def _mark_frequencies(ax: Axes, track: Track, x_text: float) -> None:
    for name, f, role, linestyle in _marks(track):
        colour = style.ROLE[role]
        ax.axhline(f, color=colour, linestyle=linestyle, linewidth=1.0)
        below = role == "band_edge"  # the track starts on the band edge: its name goes underneath
        ax.text(
            x_text,
            f / 1.04 if below else f * 1.04,
            f"{name} {value_words(f, 'Hz')}",
            color=colour,
            fontsize=8,
            va="top" if below else "bottom",
            ha="left",
        )
    if track.f_ringdown_hz is not None and track.tau_ringdown_s:
        ax.plot(
            [0.0, RINGDOWN_TAUS * track.tau_ringdown_s],
            [track.f_ringdown_hz] * 2,
            color=style.ROLE["ringdown"],
            linewidth=4,
            solid_capstyle="butt",
            label=f"ringdown ({RINGDOWN_TAUS} τ)",
        )


def _time_axis(ax: Axes, left: float, right: float) -> None:
    ax.set_xlim(left, right)
    values = symlog_tick_values(left, right, LINTHRESH_S)
    ax.xaxis.set_major_locator(FixedLocator(values))
    ax.set_xticklabels([plain_number(v) for v in values])
    ax.xaxis.set_minor_locator(NullLocator())
    ax.set_xlabel(style.unit_label("Time relative to merger", "s"))


@style.styled
def frequency_track(track: Track) -> Drawing:
    """GW frequency against time to merger (log frequency, symlog time) with marked frequencies."""
    t, f = _thin(-np.asarray(track.time_to_merger_s, float), np.asarray(track.frequency_hz, float))
    tau = track.tau_ringdown_s or 0.0
    left, right = min(t.min(), -1.0) * 1.3, max(LINTHRESH_S, RINGDOWN_TAUS * tau) * 1.6
    fig = style.new_figure(6.4, 3.4, (0.11, 0.97, 0.14, 0.95))
    ax = fig.add_subplot()
    ax.set_xscale("symlog", linthresh=LINTHRESH_S, linscale=0.6)
    ax.set_yscale("log")
    ax.plot(t, f, color=style.ROLE["track"], linewidth=1.8, label="frequency track")
    ax.axvline(0.0, color=style.INK, linewidth=0.8)
    ax.text(0.0, 0.98, " merger", transform=ax.get_xaxis_transform(), fontsize=8, va="top")
    _mark_frequencies(ax, track, left * 0.9)
    fs = [f.min(), f.max()] + [m[1] for m in _marks(track)]
    lo, hi = min(fs) / 1.4, max(fs) * 1.6
    ax.set_ylim(lo, hi)
    set_log_ticks(ax.yaxis, lo, hi)
    _time_axis(ax, left, right)
    ax.set_ylabel(style.unit_label("Gravitational-wave frequency", "Hz"))
    style.finish_axes(ax)
    return Drawing(fig, _track_alt(track, float(-t.min())))


def _track_alt(track: Track, duration: float) -> str:
    text = (
        f"Gravitational-wave frequency rising from {value_words(track.f_low_hz, 'Hz')} at the "
        f"band edge, {value_words(duration, 's')} before merger, through the ISCO frequency "
        f"{value_words(track.f_isco_hz, 'Hz')}"
    )
    if track.f_ringdown_hz is not None:
        text += f", to the ringdown frequency {value_words(track.f_ringdown_hz, 'Hz')}"
        if track.tau_ringdown_s:
            tau_ms = (track.tau_ringdown_s * u.s).to_value(u.ms)
            text += f" with damping time {value_words(tau_ms, 'ms')}"
    return text + "."
