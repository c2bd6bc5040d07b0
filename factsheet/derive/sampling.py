"""Samples from summary intervals: the quantile-matched two-piece normal.

A summary ``m +p -n`` at credible level ``c`` is drawn from a two-piece distribution joined at
the median: half the draws on each side, each half a half-normal scaled so that the quantiles
``(1 - c)/2`` and ``(1 + c)/2`` fall exactly on ``m - n`` and ``m + p``, and the median stays
``m``. Physical limits (mass and distance > 0, |spin| <= 1, 0 < q <= 1) cut a half off at the
limit by inverse-CDF sampling, so no sample is ever clipped onto a limit, and the half's scale
is re-solved so that the bound stays where it was given; a bound too close to its limit for any
half-normal is kept by a half that is flat on each side of the bound (:class:`_Half`). Only a
bound given on the limit itself moves (:func:`drawn_bounds`), and the sheet says so.
The caller may narrow a value's range further (``ranges``): the distance is truncated the same
way at the end of the cosmology's redshift table. After drawing, the bodies are relabelled so
that the heavier one is heavier in every sample. When the estimate gives the chirp mass, the
masses are drawn through it (:mod:`factsheet.derive.masses`).
"""

from __future__ import annotations

import math
from collections.abc import Mapping

import numpy as np

from factsheet.derive import masses
from factsheet.load.samples import heavier_first
from factsheet.load.schema import physical_range
from factsheet.model import ESTIMATE_PATHS, Estimate, Event, Interval


def draw(
    value: Interval,
    n: int,
    credible_level: float,
    limits: tuple[float, float],
    rng: np.random.Generator,
) -> np.ndarray:
    """Samples of ``value`` inside ``limits`` whose median and credible bounds are the given
    ones wherever a bound lies inside the limits (:func:`drawn_bounds` says where not)."""
    if value.exact:
        return np.full(n, value.median)
    uniform = rng.uniform(0.0, 1.0, n)
    m = value.median
    below = _Half(value.minus, m - limits[0], credible_level)
    above = _Half(value.plus, limits[1] - m, credible_level)
    lower = uniform < 0.5
    out = np.empty(n)
    out[lower] = m - below.distance(1 - 2 * uniform[lower], lower_tail=2 * uniform[lower])
    out[~lower] = m + above.distance(2 * uniform[~lower] - 1)
    return out


class _Half:
    """One side of the median: half the draws, at distances from 0 to ``room`` (the limit).

    Far from the limit it is a half-normal whose ``level`` quantile is ``spread``. Near it, the
    half-normal is cut off at the limit and its scale re-solved so that, within the half, the
    share ``level`` still lies closer than ``spread``: the bound stays where it was given. When
    even a flat half would put the bound beyond ``spread`` (``spread >= level * room``), the
    half is flat on ``[0, spread]`` with that share and flat on ``[spread, room]`` with the
    rest (a density that rises toward the limit), which still keeps the bound. Only a bound on
    the limit itself cannot be kept without piling draws onto the limit: that half is flat on
    ``[0, room]`` and its bound moves inward to ``level * room``.
    """

    def __init__(self, spread: float, room: float, level: float):
        from scipy.special import ndtri  # loads when drawing: the build's own process never does

        self.spread, self.room, self.level = spread, max(room, 0.0), level
        z = float(ndtri(0.5 + level / 2))
        self.scale = spread / z
        self.kept = spread < self.room or spread == 0
        self.normal = spread == 0 or spread < level * self.room
        if self.normal and spread > 0 and _cut(spread, self.room, self.scale) > 1e-12:
            self.scale = _solve_scale(spread, self.room, level)

    def distance(self, share: np.ndarray, lower_tail: np.ndarray | None = None) -> np.ndarray:
        """Distances from the median at the within-half ``share`` (0 at the median, 1 at the
        limit); ``lower_tail`` is ``1 - share`` when the caller has it more precisely."""
        if self.spread == 0 or self.room == 0:
            return np.zeros_like(share)
        if self.normal:
            from scipy.special import ndtr, ndtri

            with np.errstate(over="ignore"):  # a limit far beyond a tiny spread: ndtr(inf) = 1
                top = float(ndtr(self.room / self.scale)) if math.isfinite(self.room) else 1.0
            tail = 1 - share if lower_tail is None else lower_tail
            t = (1 - top) + tail * (top - 0.5)  # the lower-tail probability of the distance
            return -self.scale * ndtri(np.clip(t, 1e-300, 0.5))
        if not self.kept:
            return share * self.room
        near = share < self.level
        far = self.spread + (share - self.level) / (1 - self.level) * (self.room - self.spread)
        return np.where(near, share / self.level * self.spread, far)

    def bound(self) -> float:
        """The distance of the drawn credible bound from the median."""
        return self.spread if self.kept else self.level * self.room


def _cut(spread: float, room: float, scale: float) -> float:
    """How far the half-normal's ``spread`` quantile moves when it is cut off at ``room``:
    the share of the half beyond the limit."""
    if math.isinf(room):
        return 0.0
    from scipy.special import ndtr

    with np.errstate(over="ignore"):  # a limit far beyond a tiny spread: no share is cut
        return float(2 * ndtr(-room / scale))


def _solve_scale(spread: float, room: float, level: float) -> float:
    """The scale of a half-normal cut off at ``room`` whose ``level`` quantile is ``spread``:
    solves ``erf(spread / (s sqrt 2)) / erf(room / (s sqrt 2)) = level`` for ``s``."""
    from scipy.special import erf, ndtri

    def excess(t: float) -> float:  # t = room / s; the ratio rises from spread/room to 1
        return float(erf(spread / room * t / math.sqrt(2)) / erf(t / math.sqrt(2))) - level

    high = room * float(ndtri(0.5 + level / 2)) / spread  # the uncut scale's t: excess > 0
    from scipy.optimize import brentq  # scipy.optimize loads only when a width is solved for

    return room / brentq(excess, 1e-9, high, xtol=1e-14, rtol=1e-13)


def drawn_bounds(
    value: Interval, credible_level: float, limits: tuple[float, float]
) -> tuple[float, float]:
    """The credible bounds of :func:`draw`'s samples: the given ones, except a bound given on a
    physical limit (``0.8 +0.2 -0.3`` for a mass ratio, whose limit is 1), which the draws
    cannot reach without piling samples onto the limit."""
    if value.exact:
        return value.low, value.high
    m = value.median
    below = _Half(value.minus, m - limits[0], credible_level)
    above = _Half(value.plus, limits[1] - m, credible_level)
    return m - below.bound(), m + above.bound()


Ranges = Mapping[str, tuple[float, float]]


def value_range(path: str, ranges: Ranges | None = None) -> tuple[float, float]:
    """The range a value is drawn in: its physical range, narrowed by ``ranges[path]``."""
    low, high = physical_range(path)
    if ranges and path in ranges:
        low, high = max(low, ranges[path][0]), min(high, ranges[path][1])
    return low, high


def draw_estimate(
    estimate: Estimate,
    n: int,
    credible_level: float,
    seed: int,
    ranges: Ranges | None = None,
) -> dict[str, np.ndarray]:
    """Independent draws of every value of an estimate by path, heavier body first; each is
    truncated to its physical range and to ``ranges`` (by path) where given."""
    rng = np.random.default_rng(seed)
    given = estimate.values()

    def one(path: str, value: Interval) -> np.ndarray:
        return draw(value, n, credible_level, value_range(path, ranges), rng)

    skipped = set(MASS_PATHS) if masses.through_chirp_mass(estimate) else set()
    out = {}
    for path in ESTIMATE_PATHS:  # fixed order, so the draws do not depend on the file's order
        if path in given and path not in skipped:
            out[path] = one(path, given[path])
    if skipped:
        out |= masses.draw_masses(estimate, n, one, rng)
    return heavier_first(out)


MASS_PATHS = ("heavier.mass", "lighter.mass")


BODY_SPINS = ("heavier.spin", "lighter.spin")
#: A body's spin as a vector: its magnitude and its tilt to the orbital angular momentum.
SPIN_VECTORS = ("heavier.spin_magnitude", "heavier.tilt", "lighter.spin_magnitude", "lighter.tilt")
#: The values that say how the bodies spin along the orbit: one form excludes the others.
ALIGNED_FORMS = (*BODY_SPINS, *SPIN_VECTORS, "effective_spin")


def used_paths(event: Event) -> set[str]:
    """The paths of the values the samples come from: the estimate's, or the samples file's
    columns and what :func:`drawn_from_summary` adds to them."""
    if event.samples is None:
        return set(event.estimate.values())
    return set(event.samples.values) | set(drawn_from_summary(event))


def drawn_from_summary(event: Event) -> list[str]:
    """The values a samples file lacks and the summary gives, drawn independently (in path
    order). Spins given in one form in the file (the bodies' aligned spins, their magnitudes
    and tilts, or the effective spin) are not completed from another form in the summary, and
    tilts in the file leave out the summary's precession spin."""
    if event.samples is None:
        return []
    skipped = set(event.samples.values) | masses.kept_by_samples_file(event)
    if skipped & set(ALIGNED_FORMS):
        skipped |= set(ALIGNED_FORMS)
    if skipped & set(SPIN_VECTORS):
        skipped.add("precession_spin")
    if "precession_spin" in skipped:
        skipped |= set(SPIN_VECTORS)
    return [path for path in event.estimate.values() if path not in skipped]


def fill_missing(
    values: dict[str, np.ndarray],
    event: Event,
    credible_level: float,
    ranges: Ranges | None = None,
) -> dict[str, np.ndarray]:
    """A samples file's values, with draws from the summary for what the file lacks."""
    rng = np.random.default_rng(event.seed())
    size = len(values["heavier.mass"])
    out = dict(values)
    for path in drawn_from_summary(event):
        value = event.estimate[path]
        out[path] = draw(value, size, credible_level, value_range(path, ranges), rng)
    return out
