"""Redshift from luminosity distance against astropy's cosmology (Planck18: Planck Collaboration
2020, A&A 641, A6) and its z_at_value root finder."""

import astropy.constants as const
import astropy.cosmology.units as cu
import astropy.units as u
import numpy as np
import pytest
from astropy.cosmology import WMAP9, Planck18, z_at_value

from factsheet.physics import cosmology


@pytest.mark.parametrize(
    ("d_mpc", "z"),
    [(100, 0.02219438), (400, 0.08491816), (1000, 0.1978198), (5000, 0.7794249)],
)
def test_methods_vectors_planck18(d_mpc, z):
    # docs/methods.md §16 (astropy z_at_value with Planck18), tolerance 1e-7 (printed digits).
    got = cosmology.redshift_at_distance(d_mpc * u.Mpc, Planck18)
    assert got == pytest.approx(z, abs=1e-7)


@pytest.mark.parametrize("cosmo", [Planck18, WMAP9])
def test_against_z_at_value(cosmo):
    # astropy's own root finder (z_at_value, through its redshift-distance equivalency of kind
    # "luminosity") is the reference, 1 Mpc to 50 Gpc (36 points), 1e-5 relative.
    d = np.geomspace(1, 5e4, 36) * u.Mpc
    ours = cosmology.redshift_at_distance(d, cosmo)
    to_z = cu.redshift_distance(cosmo, kind="luminosity", ztol=1e-12)
    ref = np.array([x.to_value(cu.redshift, to_z) for x in d])
    assert np.max(np.abs(ours / ref - 1)) < 1e-5


def _z_at_value(cosmo, distance, z_guess):
    """astropy's z_at_value (Brent, bracketed around a guess), on z scaled by the guess: the
    root finder's own checks use an absolute tolerance of 1e-8 in its variable, too coarse for
    z near 1e-9 unless the variable is scaled."""
    scaled = z_at_value(
        lambda x: cosmo.luminosity_distance(x * z_guess),
        distance,
        zmin=0.2,
        zmax=5.0,
        method="Brent",
        bracket=(0.5, 1.5),
        ztol=1e-13,
    )
    return float(scaled) * z_guess


@pytest.mark.parametrize("cosmo", [Planck18, WMAP9])
def test_whole_table_against_z_at_value(cosmo):
    # astropy's z_at_value is the reference from z = 1e-9 to z = 1000 (25 points, half of them
    # between grid points), 1e-9 relative: the spline is good to ~1e-11.
    z_true = np.geomspace(1e-9, 1000, 25) * 1.013
    z_true[-1] = 1000.0
    d = cosmo.luminosity_distance(z_true)
    ours = cosmology.redshift_at_distance(d, cosmo)
    ref = np.array([_z_at_value(cosmo, x, z) for x, z in zip(d, z_true, strict=True)])
    assert np.max(np.abs(ours / ref - 1)) < 1e-9


@pytest.mark.parametrize("cosmo", [Planck18, WMAP9])
def test_continuous_where_the_hubble_law_meets_the_table(cosmo):
    # Below z = 1e-9 the linear Hubble law z = H0 d_L / c; at the junction both sides agree
    # with astropy's z_at_value to 1e-6 relative (measured: ~1e-9, the size of the next term
    # (1 - q0) z / 2 of the series d_L = (c/H0)(z + (1 - q0) z^2 / 2)).
    junction = cosmo.luminosity_distance(cosmology.Z_MIN)
    for factor in (1 - 1e-9, 1 + 1e-9, 0.5, 2.0):
        d = junction * factor
        ref = _z_at_value(cosmo, d, cosmology.Z_MIN * factor)
        assert float(cosmology.redshift_at_distance(d, cosmo)) == pytest.approx(ref, rel=1e-6)
    below, above = cosmology.redshift_at_distance(junction * np.array([1 - 1e-12, 1]), cosmo)
    assert below == pytest.approx(above, rel=1e-6)


def test_any_positive_distance_below_the_table_has_a_redshift():
    # the Hubble law with Planck18's H0 = 67.66 km/s/Mpc (Planck Collaboration 2020, through
    # astropy): z = H0 d / c
    d = np.array([1e-12, 1e-6, 1e-3]) * u.Mpc
    expected = (Planck18.H0 * d / const.c).decompose().value
    assert np.allclose(cosmology.redshift_at_distance(d, Planck18), expected, rtol=1e-9)


def test_distance_limit_is_d_l_at_redshift_1000():
    # astropy: d_L(z = 1000) in Planck18
    limit = cosmology.distance_limit(Planck18)
    assert limit.to_value(u.Mpc) == pytest.approx(
        Planck18.luminosity_distance(1000).to_value(u.Mpc), rel=1e-12
    )
    assert float(cosmology.redshift_at_distance(limit, Planck18)) == pytest.approx(1000, rel=1e-9)
    with pytest.raises(ValueError, match="outside the redshift table"):
        cosmology.redshift_at_distance(limit * 1.0001, Planck18)


def test_accepts_a_name_and_caches():
    a = cosmology.redshift_at_distance([40, 400] * u.Mpc, "Planck18")
    b = cosmology.redshift_at_distance([0.04, 0.4] * u.Gpc, Planck18)
    assert np.allclose(a, b, rtol=1e-12)


def test_outside_grid_raises_naming_distance():
    with pytest.raises(ValueError, match="distance"):
        cosmology.redshift_at_distance([100, 1e9] * u.Mpc, Planck18)
    with pytest.raises(ValueError, match="distance"):
        cosmology.redshift_at_distance(0 * u.Mpc, Planck18)


def test_frames_round_trip():
    z = np.array([0.1, 1.0])
    det = cosmology.to_detector_frame([30, 30] * u.Msun, z)
    assert np.allclose(det.to_value(u.Msun), [33, 60])
    assert np.allclose(cosmology.to_source_frame(det, z).to_value(u.Msun), 30)


def test_named_limits_equal_astropys():
    # astropy: d_L(z = 1000) of every cosmology it ships, against the table the loader reads
    # (tools/make_distance_limits.py writes it; run it again when this fails after an upgrade)
    from astropy.cosmology import realizations

    from factsheet.physics import _distance_limits

    assert sorted(_distance_limits.LIMITS_M) == sorted(realizations.available)
    for name in realizations.available:
        expected = getattr(realizations, name).luminosity_distance(cosmology.Z_MAX)
        assert cosmology.named_distance_limit(name) == pytest.approx(
            expected.to_value(u.Mpc), rel=1e-12
        )
        assert cosmology.named_distance_limit(name) == pytest.approx(
            cosmology.distance_limit(name).to_value(u.Mpc), rel=1e-15
        )
