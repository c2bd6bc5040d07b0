"""Drawing samples from summary intervals: the quantile-matched two-piece normal."""

import astropy.units as u
import numpy as np
import pytest

from factsheet.derive.sampling import draw, draw_estimate
from factsheet.model import Body, Estimate, Interval

RNG = np.random.default_rng(1)


@pytest.mark.parametrize("level", [0.9, 0.68])
def test_draw_reproduces_median_and_bounds(level):
    value = Interval(42.0, 7.0, 5.0, u.solMass)
    x = draw(value, 200_000, level, (0.0, np.inf), np.random.default_rng(3))
    low, med, high = np.percentile(x, [50 * (1 - level), 50, 50 * (1 + level)])
    # sampling error of a quantile at n = 2e5 is ~0.01 here; allow 0.05
    assert med == pytest.approx(42.0, abs=0.05)
    assert low == pytest.approx(37.0, abs=0.05) and high == pytest.approx(49.0, abs=0.05)


def test_truncation_keeps_samples_inside_physical_limits():
    spin = draw(Interval(0.95, 0.2, 0.3, u.one), 50_000, 0.9, (-1.0, 1.0), RNG)
    mass = draw(Interval(1.0, 3.0, 2.0, u.solMass), 50_000, 0.9, (0.0, np.inf), RNG)
    assert spin.max() <= 1.0 and spin.min() >= -1.0 and (mass > 0).all()
    assert len(np.unique(spin)) == len(spin)  # nothing piled up on the limit


def test_exact_value_gives_constant_samples():
    assert (draw(Interval(4.0, 0, 0, u.km), 10, 0.9, (0, np.inf), RNG) == 4.0).all()


def test_body_labels_kept_and_seed_reproducible():
    estimate = Estimate(
        heavier=Body(Interval(10.0, 3.0, 3.0, u.solMass), Interval(0.5, 0.0, 0.0, u.one)),
        lighter=Body(Interval(9.5, 3.0, 3.0, u.solMass), Interval(-0.5, 0.0, 0.0, u.one)),
        distance=Interval(400.0, 100.0, 100.0, u.Mpc),
    )
    a = draw_estimate(estimate, 5000, 0.9, seed=7)
    b = draw_estimate(estimate, 5000, 0.9, seed=7)
    assert all(np.array_equal(a[k], b[k]) for k in a)
    assert (a["heavier.mass"] >= a["lighter.mass"]).all()
    swapped = a["heavier.spin"] < 0  # spins follow their body when labels swap
    assert swapped.any() and (a["lighter.spin"][swapped] == 0.5).all()
