"""Samples from summary intervals: the quantile-matched two-piece normal.

A summary ``m +p -n`` at credible level ``c`` is drawn from a two-piece normal joined at the
median: each half is a half-normal scaled so that the quantiles ``(1 - c)/2`` and ``(1 + c)/2``
fall exactly on ``m - n`` and ``m + p``, and the median stays ``m``. Physical limits (mass and
distance > 0, |spin| <= 1) truncate the draw by restricting the uniform variate to the allowed
part of the distribution (inverse-CDF sampling), so no sample is ever clipped onto a limit.
The caller may narrow a value's range further (``ranges``): the distance is truncated the same
way at the end of the cosmology's redshift table. After drawing, the bodies are relabelled so
that the heavier one is heavier in every sample.
"""

from __future__ import annotations

import math
from collections.abc import Mapping

import numpy as np
from scipy.special import ndtr, ndtri

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
    """Samples of ``value`` from the quantile-matched two-piece normal, truncated to limits."""
    if value.exact:
        return np.full(n, value.median)
    z = float(ndtri(0.5 + credible_level / 2))
    left, right = value.minus / z, value.plus / z
    u_low, u_high = (_cdf(x, value.median, left, right) for x in limits)
    uniform = rng.uniform(u_low, u_high, n)
    return _quantile(uniform, value.median, left, right)


def _cdf(x: float, median: float, left: float, right: float) -> float:
    if math.isinf(x):
        return 0.0 if x < 0 else 1.0
    scale = left if x < median else right
    if scale <= 0:
        return float(x >= median)
    with np.errstate(over="ignore"):  # a limit far beyond a tiny spread: the CDF is 0 or 1
        return float(ndtr(np.float64(x - median) / scale))


def _quantile(p: np.ndarray, median: float, left: float, right: float) -> np.ndarray:
    z = ndtri(np.clip(p, 1e-300, 1 - 1e-16))
    return median + np.where(z < 0, left, right) * z


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
    out = {}
    for path in ESTIMATE_PATHS:  # fixed order, so the draws do not depend on the file's order
        if path in given:
            out[path] = draw(given[path], n, credible_level, value_range(path, ranges), rng)
    return heavier_first(out)


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
    skipped = set(event.samples.values)
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
