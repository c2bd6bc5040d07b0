"""Recoil against González et al. 2007 (PRL 98, 091101) and docs/methods.md §6 checks."""

import astropy.units as u
import numpy as np
import pytest

from factsheet.physics.kick import kick_velocity

M = u.Msun


def test_largest_non_spinning_kick_gonzalez_2007():
    # González et al. 2007: maximum 175.2 ± 11 km/s at eta = 0.195 ± 0.005.
    q = np.linspace(0.25, 1, 75001)
    v = kick_velocity(M, q * M, 0, 0).to_value(u.km / u.s)
    i = np.argmax(v)
    assert v[i] == pytest.approx(175.2, abs=0.1)
    assert q[i] / (1 + q[i]) ** 2 == pytest.approx(0.195, abs=0.005)


def test_half_mass_ratio_non_spinning():
    # docs/methods.md §6 check (computed for this project): q = 1/2, no spins -> 156.7 km/s.
    assert kick_velocity(2 * M, M, 0, 0).to_value(u.km / u.s) == pytest.approx(156.7, abs=0.05)


def test_equal_mass_opposite_spins():
    # Equal mass, maximal spins opposite each other: |v| = H/16 = 431.2 km/s with H = 6.9e3 km/s
    # (Lousto & Zlochower 2008, from memory, docs/methods.md §6).
    assert kick_velocity(M, M, 1, -1).to_value(u.km / u.s) == pytest.approx(431.25, rel=1e-9)
    assert kick_velocity(M, M, 0, 0).to_value(u.km / u.s) == pytest.approx(0.0, abs=1e-9)
    assert kick_velocity(M, M, 0.5, 0.5).to_value(u.km / u.s) == pytest.approx(0.0, abs=1e-9)


def test_smaller_body_convention():
    # The papers label the smaller body 1; the spin of the heavier body weighs 1, the lighter q.
    # With q = 1/2 and only the heavier spinning, v_perp = H eta^2 / (1 + q) * chi_big.
    eta = 2 / 9
    v_perp = 6.9e3 * eta**2 / 1.5 * 0.6
    v_m = 1.2e4 * eta**2 * (1 / 3) * (1 - 0.93 * eta)
    xi = np.deg2rad(145)
    expect = np.hypot(v_m + v_perp * np.cos(xi), v_perp * np.sin(xi))
    assert kick_velocity(2 * M, M, 0.6, 0).to_value(u.km / u.s) == pytest.approx(expect)
    assert kick_velocity(M, 2 * M, 0, 0.6).to_value(u.km / u.s) == pytest.approx(expect)
