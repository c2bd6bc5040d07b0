"""Credible regions of HEALPix maps against closed forms (docs/methods.md, sky maps).

Sources beside each check:
* the pixel area 4π/(12 NSIDE²) of Górski et al. 2005 (ApJ 622, 759), with the whole sky, 4π sr,
  converted to square degrees by astropy's units (the square degree's definition);
* the closed form of a 2-D Gaussian in the flat-sky limit: the region of level p is the disc of
  radius r with 1 − exp(−r²/2σ²) = p, so its area is −2πσ² ln(1 − p) (14.468 σ² at 90 %,
  4.355 σ² at 50 %), and the level at offset r is 1 − exp(−r²/2σ²) (39.3 % at 1σ, 86.5 % at 2σ);
* a map of constant density, whose region of level p is the fraction p of the whole sky;
* RING and NESTED numbering of one map, converted with astropy-healpix: nothing may change.
"""

from __future__ import annotations

import math

import astropy.units as u
import numpy as np
import pytest
from astropy_healpix import HEALPix

from factsheet.physics.sky import (
    RankedMap,
    check_nside,
    level_grid,
    levels_at,
    peak,
    pixel_area,
    pixel_centres,
)

WHOLE_SKY_DEG2 = (4 * math.pi * u.sr).to_value(u.deg**2)  # 41 252.96 deg2, by definition
SIGMA = 2.5  # deg: the blob's width, far above the pixel (0.11 deg at NSIDE 512)
NSIDE = 512
CENTRE = (60.0, 20.0)  # deg: right ascension, declination of the blob


def _separation(ra, dec, ra0, dec0):
    """Angle between two directions, in degrees (the haversine form, good at small angles)."""
    ra, dec, ra0, dec0 = (np.radians(x) for x in (ra, dec, ra0, dec0))
    h = np.sin((dec - dec0) / 2) ** 2 + np.cos(dec) * np.cos(dec0) * np.sin((ra - ra0) / 2) ** 2
    return np.degrees(2 * np.arcsin(np.sqrt(h)))


def gaussian_map(order: str, nside: int = NSIDE, sigma: float = SIGMA) -> np.ndarray:
    ra, dec = pixel_centres(nside, order, np.arange(12 * nside**2))
    r = _separation(ra.value, dec.value, *CENTRE)
    prob = np.exp(-(r**2) / (2 * sigma**2))
    return (prob / prob.sum()).astype(np.float32)


@pytest.fixture(scope="module")
def blob():
    prob = gaussian_map("RING")
    return prob, RankedMap(prob, NSIDE)


def test_pixel_area_is_the_whole_sky_over_12_nside_squared():
    # Górski et al. 2005 pixel area: 4π / (12 NSIDE²)
    assert pixel_area(1).to_value(u.deg**2) == pytest.approx(WHOLE_SKY_DEG2 / 12, rel=1e-12)
    assert pixel_area(2048).to_value(u.deg**2) == pytest.approx(
        WHOLE_SKY_DEG2 / 50_331_648, rel=1e-12
    )
    assert pytest.approx(41_252.96, abs=0.01) == WHOLE_SKY_DEG2


@pytest.mark.parametrize("bad", [0, 3, 12, 4096, 2.0, True, "64"])
def test_nside_must_be_a_power_of_two_up_to_2048(bad):
    with pytest.raises(ValueError, match="NSIDE"):
        check_nside(bad)


@pytest.mark.parametrize(("level", "closed_form"), [(0.9, 14.468), (0.5, 4.355)])
def test_gaussian_blob_area_matches_the_flat_sky_closed_form(blob, level, closed_form):
    # closed form of a 2-D Gaussian: area(p) = −2πσ² ln(1 − p)
    assert -2 * math.pi * math.log(1 - level) == pytest.approx(closed_form, abs=5e-4)
    area = blob[1].area(level).to_value(u.deg**2)
    assert area == pytest.approx(closed_form * SIGMA**2, rel=0.005)  # got 0.1 % off


@pytest.mark.parametrize(("offset", "closed_form"), [(1.0, 0.393), (2.0, 0.865)])
def test_gaussian_blob_level_at_an_offset_matches_the_closed_form(blob, offset, closed_form):
    # closed form of a 2-D Gaussian: level(r) = 1 − exp(−r²/2σ²)
    assert 1 - math.exp(-(offset**2) / 2) == pytest.approx(closed_form, abs=5e-4)
    prob, ranked = blob
    ra, dec = CENTRE[0] * u.deg, (CENTRE[1] + offset * SIGMA) * u.deg
    level = float(levels_at(ranked, prob, "RING", ra, dec))
    # the level is the pixel's: exact at the pixel centre's own offset, near the nominal value
    hp = HEALPix(nside=NSIDE, order="ring")
    lon, lat = hp.healpix_to_lonlat(hp.lonlat_to_healpix(ra, dec))
    r = _separation(lon.to_value(u.deg), lat.to_value(u.deg), *CENTRE) / SIGMA
    assert level == pytest.approx(1 - math.exp(-(r**2) / 2), abs=0.003)
    assert level == pytest.approx(closed_form, abs=0.02)


def test_peak_is_the_blob_centre_to_a_pixel(blob):
    found = peak(blob[0], NSIDE, "RING")
    assert _separation(found.ra.value, found.dec.value, *CENTRE) < 0.12  # the pixel's size


def test_uniform_map_region_is_the_fraction_of_the_whole_sky():
    nside = 16
    ranked = RankedMap(np.full(12 * nside**2, 1.0, np.float32), nside)
    # constant density: the region of level p is p of the whole sky (41 252.96 deg2)
    assert ranked.area(0.9).to_value(u.deg**2) == pytest.approx(0.9 * WHOLE_SKY_DEG2, rel=1e-3)
    assert ranked.area(0.5).to_value(u.deg**2) == pytest.approx(0.5 * WHOLE_SKY_DEG2, rel=1e-3)
    assert ranked.area(1.0).to_value(u.deg**2) == pytest.approx(WHOLE_SKY_DEG2, rel=1e-12)


def test_ring_and_nested_give_the_same_areas_levels_and_peak():
    nside = 128
    ring = gaussian_map("RING", nside, sigma=8.0)
    nested = np.empty_like(ring)
    nested[HEALPix(nside=nside).ring_to_nested(np.arange(ring.size))] = ring  # astropy-healpix
    a, b = RankedMap(ring, nside), RankedMap(nested, nside)
    for level in (0.5, 0.9):
        assert a.area(level) == b.area(level)
    ra = [60.0, 61.0, 70.0, 240.0, 0.0] * u.deg
    dec = [20.0, 25.0, 10.0, -30.0, 89.0] * u.deg
    np.testing.assert_array_equal(
        levels_at(a, ring, "RING", ra, dec), levels_at(b, nested, "NESTED", ra, dec)
    )
    assert peak(ring, nside, "RING") == peak(nested, nside, "NESTED")
    np.testing.assert_array_equal(
        level_grid(a, ring, "RING", 72, 36), level_grid(b, nested, "NESTED", 72, 36)
    )


def test_level_grid_is_low_at_the_blob_and_one_far_away(blob):
    prob, ranked = blob
    grid = level_grid(ranked, prob, "RING", 360, 180)
    assert grid.shape == (180, 360) and grid.dtype == np.float32
    row, column = int(CENTRE[1] + 90), int(CENTRE[0])  # 1-degree cells from dec -90, ra 0
    assert grid[row, column] < 0.1 and grid[0, 0] == pytest.approx(1.0)
    assert grid.min() >= 0.0 and grid.max() <= 1.0
