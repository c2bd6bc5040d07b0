"""Redshift from luminosity distance against astropy's cosmology (Planck18: Planck Collaboration
2020, A&A 641, A6) and its z_at_value root finder."""

import astropy.cosmology.units as cu
import astropy.units as u
import numpy as np
import pytest
from astropy.cosmology import WMAP9, Planck18

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
