"""Counterpart candidates read against the sky map, the merger time and the windows; the sky-map
summary and the disagreement with a given sky area (docs/methods.md §18.6)."""

from dataclasses import replace

import astropy.units as u
import numpy as np
import pytest
from astropy.time import Time
from astropy_healpix import HEALPix
from helpers import VALID_EVENT, write_catalogue

from factsheet.derive.sky import candidate_readings, sky_caveats, summarise_map
from factsheet.load import load_catalogue
from factsheet.model import CounterpartCandidate
from factsheet.physics.counterparts import Window

NSIDE = 256
CENTRE = (47.0, -20.0)  # degrees: an invented position
SIGMA = 3.0  # degrees


def blob(nside: int = NSIDE) -> np.ndarray:
    """A normalised Gaussian blob of width SIGMA around CENTRE, in RING order."""
    grid = HEALPix(nside=nside, order="ring")
    lon, lat = grid.healpix_to_lonlat(np.arange(grid.npix))
    ra0, dec0 = np.radians(CENTRE)
    cos_r = np.sin(lat.rad) * np.sin(dec0) + np.cos(lat.rad) * np.cos(dec0) * np.cos(lon.rad - ra0)
    r = np.degrees(np.arccos(np.clip(cos_r, -1, 1)))
    p = np.exp(-(r**2) / (2 * SIGMA**2))
    return (p / p.sum()).astype(np.float32)


@pytest.fixture(scope="module")
def event(tmp_path_factory):
    text = VALID_EVENT + (
        "counterpart_candidates:\n"
        f"  - {{name: Near, ra: {CENTRE[0]} deg, dec: {CENTRE[1] + SIGMA} deg, "
        'time: "2034-04-22T07:26:41.2"}\n'
        f"  - {{name: Far, ra: {CENTRE[0]} deg, dec: {CENTRE[1] + 3 * SIGMA} deg, "
        'time: "2034-04-12T07:00:00"}\n'
    )
    folder = write_catalogue(tmp_path_factory.mktemp("cat"), {"e.yaml": text})
    (found,) = load_catalogue(folder).events
    return found


def test_map_summary_matches_the_closed_forms(event):
    summary, levels = summarise_map(blob(), NSIDE, "RING", 0.9, event)
    # closed forms of a flat-sky 2-D Gaussian: area(p) = -2 pi sigma^2 ln(1 - p)
    assert summary.area_90.to_value(u.deg**2) == pytest.approx(14.468 * SIGMA**2, rel=0.01)
    assert summary.area_50.to_value(u.deg**2) == pytest.approx(4.355 * SIGMA**2, rel=0.01)
    assert summary.area == summary.area_90
    assert summary.peak_ra.to_value(u.deg) == pytest.approx(CENTRE[0], abs=0.3)
    assert summary.peak_dec.to_value(u.deg) == pytest.approx(CENTRE[1], abs=0.3)
    # level at offset r: 1 - exp(-r^2 / 2 sigma^2): 39.3 % at 1 sigma, 98.9 % at 3 sigma
    assert levels[0] == pytest.approx(0.393, abs=0.01)
    assert levels[1] == pytest.approx(0.989, abs=0.003)
    assert summary.levels.shape == (360, 720)


def test_candidates_get_delays_windows_and_levels(event):
    window = Window(
        "agn_flare", "optical_ultraviolet", "agn_disk",
        Time("2034-04-20T00:00:00", scale="utc"), Time("2034-04-25T00:00:00", scale="utc"), "b",
    )  # fmt: skip
    redshift = np.full(100, 0.25)
    near, far = candidate_readings(event, redshift, (window,), np.array([0.39, 0.99]), 0.9)
    assert near.delay.to_value(u.d) == pytest.approx(10.0, abs=1e-9)
    # the source-frame delay is the observed one over 1 + z (cosmological time dilation)
    assert near.delay_source.median == pytest.approx(10.0 / 1.25)
    assert near.windows == ("agn_flare",) and near.credible_level == 0.39
    assert far.delay.to_value(u.d) < 0 and far.windows == ()


def test_without_a_map_a_candidate_has_no_level(event):
    (reading, _) = candidate_readings(event, np.full(10, 0.1), (), np.empty(0), 0.9)
    assert reading.credible_level is None


def test_a_given_sky_area_far_from_the_map_is_a_warning(event):
    summary, _ = summarise_map(blob(), NSIDE, "RING", 0.9, event)
    assert sky_caveats(event, summary)[0].code == "sky-area-disagrees"  # 580 deg2 given, ~130
    agreeing = replace(event.detection, sky_area=summary.area_90 * 1.2)
    assert sky_caveats(replace(event, detection=agreeing), summary) == []
    assert sky_caveats(event, None) == []


def test_a_candidate_record_is_plain():
    c = CounterpartCandidate("X", 1 * u.deg, 2 * u.deg, Time("2034-01-01", scale="utc"))
    assert c.note == ""
