"""Drawing samples from summary intervals: the quantile-matched two-piece normal."""

import astropy.units as u
import numpy as np
import pytest

from factsheet.api import derive
from factsheet.derive.sampling import draw, draw_estimate, drawn_bounds, value_range
from factsheet.model import Body, Estimate, Interval, Settings
from factsheet.physics import cosmology

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


def test_ranges_truncate_a_draw_like_a_physical_limit():
    # the distance is drawn inside the redshift table: truncated at d_L(z = 1000) the same way
    # the physical limits truncate (inverse-CDF sampling, nothing piled onto the limit)
    limit = cosmology.distance_limit("Planck18").to_value(u.Mpc)
    estimate = Estimate(
        heavier=Body(Interval(30.0, 3.0, 3.0, u.solMass)),
        lighter=Body(Interval(20.0, 3.0, 3.0, u.solMass)),
        distance=Interval(1.37e7, 1.7e5, 1.0e6, u.Mpc),
    )
    free = draw_estimate(estimate, 20_000, 0.9, seed=5)["distance"]
    assert (free > limit).any()  # without the range, some draws leave the table
    cut = draw_estimate(estimate, 20_000, 0.9, seed=5, ranges={"distance": (0.0, limit)})
    d = cut["distance"]
    assert d.max() <= limit and len(np.unique(d)) == len(d)
    assert value_range("distance", {"distance": (0.0, limit)}) == (0.0, limit)
    assert value_range("heavier.spin") == (-1.0, 1.0)


def test_ranges_leave_ordinary_draws_unchanged():
    # far from the table's end the truncation moves no sample (same seed, same numbers)
    estimate = Estimate(
        heavier=Body(Interval(36.0, 5.0, 4.0, u.solMass)),
        lighter=Body(Interval(29.0, 4.0, 5.0, u.solMass)),
        distance=Interval(440.0, 180.0, 170.0, u.Mpc),
    )
    limit = cosmology.distance_limit("Planck18").to_value(u.Mpc)
    a = draw_estimate(estimate, 4000, 0.9, seed=11)
    b = draw_estimate(estimate, 4000, 0.9, seed=11, ranges={"distance": (0.0, limit)})
    assert all(np.array_equal(a[k], b[k]) for k in a)


@pytest.mark.parametrize(
    "distance", ["1.37e7 +1.7e5 -1e6 Mpc", "1e-4 +2e-5 -2e-5 Mpc", "3 pc", "1.3879e7 Mpc"]
)
def test_events_at_the_ends_of_the_table_derive(distance):
    # inside the table (d_L(z = 1000) under Planck18) and below its lower end: these passed
    # `check` and failed the build before the table was extended
    result = derive(
        {
            "id": "END-1",
            "time": "2034-01-01T00:00:00",
            "estimate": {
                "heavier": {"mass": "36 +5 -4 Msun"},
                "lighter": {"mass": "29 +4 -5 Msun"},
                "distance": distance,
            },
        },
        Settings(samples=2000),
    )
    z = result.summary("redshift")
    assert 0 < z.low <= z.median <= z.high <= 1000


# --- near a physical limit: the given quantiles are kept, or the sheet says why not -----------
# Check values are closed forms: the draws' quantiles at (1 -+ c)/2 and 1/2 must be the given
# bounds and median (the contract of a summary, docs/input-format.md), and a flat half on
# [m, limit] has its level-c point at m + c (limit - m).


@pytest.mark.parametrize(
    ("value", "limits"),
    [
        ((0.9, 0.09, 0.3), (-1.0, 1.0)),  # the example: the 95 % point was 0.976
        ((0.9, 0.05, 0.3), (-1.0, 1.0)),  # a half-normal cut at the limit, scale re-solved
        ((0.9, 0.095, 0.3), (-1.0, 1.0)),  # closer than any half-normal: flat on each side
        ((0.2, 0.3, 0.19), (0.0, np.inf)),  # a small mass near zero
        ((-0.85, 0.3, 0.12), (-1.0, 1.0)),  # the lower limit
    ],
)
def test_draws_keep_median_and_bounds_near_a_limit(value, limits):
    m, plus, minus = value
    x = draw(Interval(m, plus, minus, u.one), 400_000, 0.9, limits, np.random.default_rng(8))
    low, med, high = np.percentile(x, [5, 50, 95])
    # the quantile's sampling error at n = 4e5 is below 1e-3 of these widths; allow 2e-3
    tol = 2e-3 * (plus + minus)
    assert (low, med, high) == pytest.approx((m - minus, m, m + plus), abs=tol)
    assert limits[0] < x.min() and x.max() < limits[1]  # nothing piled onto the limit
    assert drawn_bounds(Interval(m, plus, minus, u.one), 0.9, limits) == pytest.approx(
        (m - minus, m + plus)
    )


def test_a_bound_on_the_limit_moves_inward_and_says_so():
    # 0.8 +0.2 -0.3 for a mass ratio: the upper bound is the limit 1, which draws cannot reach
    # without piling onto it; the half above the median is flat, so its 95 % point is
    # 0.8 + 0.9 * 0.2 = 0.98 (closed form)
    value = Interval(0.8, 0.2, 0.3, u.one)
    x = draw(value, 400_000, 0.9, (0.0, 1.0), np.random.default_rng(9))
    assert np.percentile(x, [5, 50, 95]) == pytest.approx([0.5, 0.8, 0.98], abs=1e-3)
    assert drawn_bounds(value, 0.9, (0.0, 1.0)) == pytest.approx((0.5, 0.98))
    result = derive(
        {
            "id": "LIM-1",
            "time": "2034-01-01T00:00:00",
            "estimate": {
                "chirp_mass": "28.1 +1.1 -1.0 Msun",
                "mass_ratio": "0.8 +0.2 -0.3",
                "heavier": {"spin": "0.9 +0.09 -0.3"},  # kept: no caveat for it
                "distance": "440 +180 -170 Mpc",
            },
        },
        Settings(samples=2000),
    )
    (note,) = [c for c in result.caveats if c.code == "bound-at-limit"]
    assert "0.98 for the mass ratio instead of 1" in note.text and "spin" not in note.text
