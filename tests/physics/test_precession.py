"""Spin vectors, the effective precession spin, and the remnant fits with in-plane spins.

Check values: docs/methods.md, sections on precessing spins (Schmidt, Ohme & Hannam 2015;
Hofmann, Barausse & Rezzolla 2016; Lousto, Zlochower, Dotti & Volonteri 2012).
"""

import astropy.units as u
import numpy as np
import pytest

from factsheet.physics import kick, precession, remnant_spin

M = u.Msun
RNG = np.random.default_rng(20260412)


def test_precession_spin_single_heavier_spin_in_plane():
    # chi_p of (a1 = 0.5, tilt 90 deg, a2 = 0) is 0.5 (Schmidt, Ohme & Hannam 2015 definition,
    # recalled from memory; check value of the project's methods notes).
    _, perp1 = precession.spin_components(0.5, 90 * u.deg)
    assert precession.precession_spin(30 * M, 20 * M, perp1, 0.0) == pytest.approx(0.5, abs=1e-15)


def test_precession_spin_equal_masses_lighter_maximal():
    # chi_p of (a1 = 0, a2 = 1 at 90 deg, q = 1) is 1: (4q+3)/(4+3q) q = 1 at q = 1 (same source).
    _, perp2 = precession.spin_components(1.0, 90 * u.deg)
    assert precession.precession_spin(30 * M, 30 * M, 0.0, perp2) == pytest.approx(1.0, abs=1e-15)


def test_precession_spin_weights_lighter_body_by_mass_ratio():
    # q = 1/2: (4q+3)/(4+3q) q = 5/5.5 * 0.5 = 0.454545... (closed form of the definition).
    got = precession.precession_spin(20 * M, 10 * M, 0.1, 1.0)
    assert got == pytest.approx(5 / 5.5 * 0.5, rel=1e-14)
    # bodies in either order give the same
    assert precession.precession_spin(10 * M, 20 * M, 1.0, 0.1) == pytest.approx(got, rel=1e-15)


def test_spin_components_tilt_needs_an_angle():
    with pytest.raises(u.UnitsError, match="tilt: expected an angle"):
        precession.spin_components(0.5, 1.0)


@pytest.mark.parametrize("q", [1.0, 0.7, 0.3, 0.1])
@pytest.mark.parametrize("tilts", [(0, 0), (0, 180), (180, 0), (180, 180)])
def test_hbr16_generic_equals_aligned_magnitude_for_tilts_0_and_pi(q, tilts):
    # With both tilts 0 or pi the generic magnitude equals the aligned formula's |value|
    # (Hofmann, Barausse & Rezzolla 2016; check [N] of the methods notes: to 1e-12).
    a1, a2 = 0.8, 0.6
    z1, p1 = precession.spin_components(a1, tilts[0] * u.deg)
    z2, p2 = precession.spin_components(a2, tilts[1] * u.deg)
    dphi = RNG.uniform(0, 2 * np.pi)
    aligned = remnant_spin.remnant_spin_hbr16(M, q * M, z1, z2)
    generic = remnant_spin.remnant_spin_hbr16_generic(M, q * M, z1, z2, p1, p2, dphi)
    assert abs(generic) == pytest.approx(abs(aligned), abs=1e-12)
    assert generic == pytest.approx(aligned, abs=1e-12)  # signed: the sign follows the orbit


def _hbr16_generic_as_written(q, a1, a2, beta, gamma, dphi):
    """The generic-magnitude formula of HBR16 exactly as the methods notes print it, with
    cos(alpha) = cos(beta) cos(gamma) + sin(beta) sin(gamma) cos(dphi)."""
    z1, z2 = a1 * np.cos(beta), a2 * np.cos(gamma)
    nu = q / (1 + q) ** 2
    ell = remnant_spin.remnant_spin_hbr16(M, q * M, z1, z2) - (z1 + q**2 * z2) / (1 + q) ** 2
    ell = ell / nu
    cos_alpha = np.cos(beta) * np.cos(gamma) + np.sin(beta) * np.sin(gamma) * np.cos(dphi)
    inside = (
        a1**2 + a2**2 * q**4 + 2 * a1 * a2 * q**2 * cos_alpha
        + 2 * (z1 + a2 * q**2 * np.cos(gamma)) * abs(ell) * q + ell**2 * q**2
    )  # fmt: skip
    return np.sqrt(inside) / (1 + q) ** 2


@pytest.mark.parametrize(
    "q, a1, a2, beta, gamma, dphi",
    [
        (1.0, 0.7, 0.7, 1.0, 2.0, 0.3),
        (0.4, 0.9, 0.2, 2.5, 0.4, 4.0),
        (0.15, 0.5, 0.9, 1.6, 1.6, 3.1),
    ],
)
def test_hbr16_generic_magnitude_matches_the_papers_formula(q, a1, a2, beta, gamma, dphi):
    # Hofmann, Barausse & Rezzolla 2016, generic |a_fin| (methods notes, section 3.2 form).
    z1, p1 = a1 * np.cos(beta), a1 * np.sin(beta)
    z2, p2 = a2 * np.cos(gamma), a2 * np.sin(gamma)
    got = remnant_spin.remnant_spin_hbr16_generic(M, q * M, z1, z2, p1, p2, dphi)
    assert abs(got) == pytest.approx(
        _hbr16_generic_as_written(q, a1, a2, beta, gamma, dphi), rel=1e-12
    )


def test_hbr16_generic_remnant_spins_against_the_orbit():
    # A light body with a large spin against the orbit: the aligned fit gives a negative spin
    # (-0.137 at q = 0.2, chi1 = -0.9); a little in-plane spin keeps the sign and raises |a_f|.
    aligned = remnant_spin.remnant_spin_hbr16(M, 0.2 * M, -0.9, -0.5)
    z1, p1 = precession.spin_components(0.92, 168 * u.deg)
    generic = remnant_spin.remnant_spin_hbr16_generic(M, 0.2 * M, z1, -0.5, p1, 0.0, 0.0)
    assert aligned < 0 and generic < 0
    assert abs(generic) > abs(remnant_spin.remnant_spin_hbr16(M, 0.2 * M, z1, -0.5))


def test_hbr16_generic_in_plane_spin_raises_the_remnant_spin():
    # The in-plane spin adds in quadrature to the along-orbit part (methods notes, section 18.2),
    # so equal masses without aligned spin and in-plane spins of 0.5 give more than 0.68646
    # (Scheel et al. 2009, the non-spinning value).
    dphi = np.linspace(0, 2 * np.pi, 9)
    got = remnant_spin.remnant_spin_hbr16_generic(M, M, 0.0, 0.0, 0.5, 0.5, dphi)
    assert np.all(got >= 0.68646 - 1e-12) and got.max() > 0.69


def test_hbr16_generic_bodies_in_either_order():
    a = remnant_spin.remnant_spin_hbr16_generic(30 * M, 20 * M, 0.1, 0.3, 0.6, 0.2, 1.0)
    b = remnant_spin.remnant_spin_hbr16_generic(20 * M, 30 * M, 0.3, 0.1, 0.2, 0.6, 1.0)
    assert a == pytest.approx(b, rel=1e-14)


def test_superkick_equal_masses_opposite_maximal_in_plane_spins():
    # Equal masses, in-plane spins of magnitude 1 and opposite, cos = 1: |v| = 0.5 x 3677.76 x 2
    # = 3677.8 km/s (Lousto et al. 2012 V11 = 3677.76 km/s, recalled from memory; the
    # "superkick" of about 4000 km/s predicted by Campanelli et al. 2007, from memory).
    v = kick.kick_velocity_precessing(M, M, 0.0, 0.0, 1.0, 1.0, np.pi, 0.0)
    assert v.to_value(u.km / u.s) == pytest.approx(3677.76, rel=1e-12)


def test_superkick_magnitude_08_above_gonzalez_2007_measured():
    # Magnitude 0.8: maximum 2942 km/s, above the ~2500 km/s that González et al. 2007
    # (PRL 98, 231101) measured for that configuration at one phase (recalled from memory).
    v = kick.kick_velocity_precessing(M, M, 0.0, 0.0, 0.8, 0.8, np.pi, 0.0).to_value(u.km / u.s)
    assert v == pytest.approx(0.5 * 3677.76 * 1.6, rel=1e-12)
    assert v > 2500


@pytest.mark.parametrize("q", [1.0, 0.6, 0.35])
def test_kick_without_in_plane_spin_is_the_aligned_formula_exactly(q):
    # With both in-plane spins zero the formula is the non-precessing one (González et al. 2007
    # + Lousto & Zlochower 2008), whatever the phases.
    phases = RNG.uniform(0, 2 * np.pi, (2, 5))
    got = kick.kick_velocity_precessing(M, q * M, 0.4, -0.3, 0.0, 0.0, *phases)
    want = kick.kick_velocity(M, q * M, 0.4, -0.3)
    assert np.array_equal(got.value, np.broadcast_to(want.value, got.shape))


def test_kick_non_spinning_maximum_unchanged():
    # Largest non-spinning kick 175.2 km/s at eta = 0.195 (González et al. 2007, PRL 98, 091101).
    q = 0.362
    v = kick.kick_velocity_precessing(M, q * M, 0, 0, 0, 0, 0.0, 0.0).to_value(u.km / u.s)
    assert v == pytest.approx(175.2, abs=0.2)
