"""Kerr ISCO against Bardeen, Press & Teukolsky 1972 (ApJ 178, 347): limits, numerical minimum."""

import numpy as np
import pytest
from scipy.optimize import minimize_scalar

from factsheet.physics.kerr import isco_angular_momentum, isco_energy, isco_radius

SQRT3 = np.sqrt(3.0)

# Closed-form limits, BPT 1972 (Schwarzschild a = 0, extremal prograde a = +1, retrograde a = -1).
LIMITS = [
    (0.0, 6.0, np.sqrt(8 / 9), 2 * SQRT3),
    (1.0, 1.0, 1 / SQRT3, 2 / SQRT3),
    (-1.0, 9.0, np.sqrt(1 - 2 / 27), 22 / (3 * SQRT3)),
]


@pytest.mark.parametrize(("spin", "radius", "energy", "ang_mom"), LIMITS)
def test_limits_bardeen_press_teukolsky_1972(spin, radius, energy, ang_mom):
    assert isco_radius(spin) == pytest.approx(radius, rel=1e-12)
    assert isco_energy(spin) == pytest.approx(energy, rel=1e-12)
    assert isco_angular_momentum(spin) == pytest.approx(ang_mom, rel=1e-12)


def test_retrograde_values_from_methods_table():
    # docs/methods.md §2 check values (computed for this project): a = -1 gives E = 0.962250,
    # L = 4.233902.
    assert isco_energy(-1.0) == pytest.approx(0.962250, abs=5e-7)
    assert isco_angular_momentum(-1.0) == pytest.approx(4.233902, abs=5e-7)


def _circular_energy(r, a):
    """Energy of a circular equatorial orbit (Bardeen, Press & Teukolsky 1972, eq. 2.12)."""
    return (r**1.5 - 2 * r**0.5 + a) / (r**0.75 * np.sqrt(r**1.5 - 3 * r**0.5 + 2 * a))


def _circular_ang_mom(r, a):
    """Angular momentum of a circular equatorial orbit (BPT 1972, eq. 2.13)."""
    return (r**2 - 2 * a * r**0.5 + a**2) / (r**0.75 * np.sqrt(r**1.5 - 3 * r**0.5 + 2 * a))


@pytest.mark.parametrize("spin", [0.5, 0.9, 0.99, -0.5, 0.0])
def test_isco_is_the_minimum_of_circular_orbit_energy(spin):
    # The ISCO is the minimum of E(r) over circular orbits (BPT 1972); independent numerical check.
    r_min = isco_radius(spin)
    found = minimize_scalar(
        _circular_energy,
        bounds=(r_min * 0.9, r_min * 1.5),
        args=(spin,),
        method="bounded",
        options={"xatol": 1e-10},
    )
    assert isco_energy(spin) == pytest.approx(found.fun, rel=1e-10)
    assert r_min == pytest.approx(found.x, rel=1e-4)
    assert isco_angular_momentum(spin) == pytest.approx(_circular_ang_mom(r_min, spin), rel=1e-10)


def test_vectorised_and_continuous_through_zero():
    # sign(0) = +1 and the sqrt guard: no jump across a = 0 (docs/methods.md §2, implementation
    # notes).
    a = np.array([-1e-9, 0.0, 1e-9])
    assert np.all(np.isfinite(isco_radius(a)))
    assert np.ptp(isco_radius(a)) < 1e-6


def test_spin_beyond_one_is_not_a_black_hole():
    assert np.isnan(isco_radius(1.01))
