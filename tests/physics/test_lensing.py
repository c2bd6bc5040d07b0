"""The source frame of a lensed signal (Wang, Stebbins & Turner 1996, PRL 77, 2875: strain ∝ √μ,
waveform shape unchanged) against astropy's cosmology (Planck18: Planck Collaboration 2020,
A&A 641, A6) and its z_at_value root finder."""

import astropy.units as u
import numpy as np
import pytest
from astropy.cosmology import WMAP9, Planck18, z_at_value

from factsheet.physics import lensing

#: docs/methods.md, lensing check table: Planck18, astropy z_at_value; inferred distance
#: 4000 Mpc (z = 0.64914), heavier source mass 70 Msun, i.e. 115.440 Msun in the detector frame.
INFERRED = 4000 * u.Mpc
Z_INFERRED = 0.64914
DETECTOR_MASS = 70 * (1 + 0.6491396328976358) * u.Msun  # 115.440 Msun
CHECKS = [  # magnification, true distance (Mpc), z_true, heavier source mass (Msun)
    (4, 8000, 1.14212, 53.890),
    (25, 20000, 2.41219, 33.832),
    (100, 40000, 4.30634, 21.755),
]


def test_check_value_inputs():
    # The table's own inputs, astropy z_at_value with Planck18 (docs/methods.md, lensing).
    z = z_at_value(Planck18.luminosity_distance, INFERRED)
    assert float(z) == pytest.approx(Z_INFERRED, abs=5e-6)
    assert DETECTOR_MASS.to_value(u.Msun) == pytest.approx(115.440, abs=5e-4)


@pytest.mark.parametrize(("mu", "d_true", "z_true", "m_source"), CHECKS)
def test_methods_check_table(mu, d_true, z_true, m_source):
    # docs/methods.md, lensing check table (Planck18, astropy z_at_value), to its printed digits.
    got = lensing.lensed_source(INFERRED, [DETECTOR_MASS], mu, "Planck18")
    assert got.distance.to_value(u.Mpc) == pytest.approx(d_true, rel=1e-12)
    assert float(got.redshift) == pytest.approx(z_true, abs=5e-6)
    assert got.masses[0].to_value(u.Msun) == pytest.approx(m_source, abs=5e-4)


@pytest.mark.parametrize("cosmo", [Planck18, WMAP9])
def test_redshift_against_z_at_value(cosmo):
    # astropy's z_at_value is the reference for z(√μ d) at every magnification, 1e-8 relative.
    for mu in (1.5, 4, 25, 100, 1000):
        got = lensing.lensed_source(1000 * u.Mpc, [], mu, cosmo)
        ref = z_at_value(cosmo.luminosity_distance, np.sqrt(mu) * 1000 * u.Mpc, ztol=1e-12)
        assert float(got.redshift) == pytest.approx(float(ref), rel=1e-8)


def test_per_sample_and_every_mass():
    # Vectorised over samples; each mass is divided by the same (1 + z_true) (closed form).
    d = np.array([400.0, 4000.0, 9000.0]) * u.Mpc
    m1, m2, rem = (np.array(x) * u.Msun for x in ([100, 80, 60], [50, 40, 30], [140, 110, 85]))
    got = lensing.lensed_source(d, [m1, m2, rem], 9, Planck18)
    assert got.distance.to_value(u.Mpc) == pytest.approx([1200, 12000, 27000])
    for given, source in zip((m1, m2, rem), got.masses, strict=True):
        assert source.unit == u.Msun
        assert source.value == pytest.approx(given.value / (1 + got.redshift))


def test_more_magnification_means_farther_and_lighter():
    # Monotonic: the distance grows as √μ and the source-frame mass falls with it.
    found = [lensing.lensed_source(INFERRED, [DETECTOR_MASS], mu, Planck18) for mu in (2, 4, 8)]
    assert [float(f.redshift) for f in found] == sorted(float(f.redshift) for f in found)
    masses = [float(f.masses[0].value) for f in found]
    assert masses == sorted(masses, reverse=True)


def test_true_distance_is_root_mu():
    # d_true = √μ d (Wang, Stebbins & Turner 1996): amplitude ∝ √μ, amplitude ∝ 1/d.
    assert lensing.true_distance(1 * u.Gpc, 16).to_value(u.Mpc) == pytest.approx(4000)


@pytest.mark.parametrize(
    ("values", "message"),
    [
        ([1], "not above 1"),
        ([0.5], "not above 1"),
        ([-4], "not above 1"),
        ([float("nan")], "finite"),
        ([float("inf")], "finite"),
        ([4, 4], "twice"),
        (["25"], "expected a number"),
        ([True], "expected a number"),
        ([2, 3, 4, 5, 6, 7, 8], "at most 6"),
        ([1e6], "above 10000"),
    ],
)
def test_bad_magnifications(values, message):
    with pytest.raises(ValueError, match=message):
        lensing.check_magnifications(values)


def test_magnifications_sorted():
    assert lensing.check_magnifications([100, 4, 25.0]) == (4.0, 25.0, 100.0)


def test_beyond_the_redshift_table_names_the_magnification():
    with pytest.raises(ValueError, match="magnification 10000"):
        lensing.lensed_source(2e5 * u.Mpc, [], 1e4, Planck18)


def test_units_checked():
    with pytest.raises(u.UnitsError, match="distance"):
        lensing.lensed_source(4000 * u.s, [], 4, Planck18)
    with pytest.raises(u.UnitsError, match="mass"):
        lensing.lensed_source(INFERRED, [3 * u.km], 4, Planck18)
