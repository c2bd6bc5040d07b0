"""Counterpart windows: the (1+z) rule with astropy Time, and the AGN-disk time scales.

Sources: docs/methods.md §13 (rest-frame windows and worked AGN numbers) and §16 (test vectors);
the leap second at the end of 2016 was announced in IERS Bulletin C 52 (bulletin number from
memory; astropy's leap-second table holds it).
"""

from dataclasses import fields

import astropy.units as u
import numpy as np
import pytest
from astropy.time import Time

from factsheet.load.reference import load_reference
from factsheet.physics.counterparts import (
    Window,
    agn_windows,
    disk_exit_time,
    hill_exit_time,
    observed_delay,
    orbital_period,
    rest_frame_windows,
    return_time,
    utc_window,
    vacuum_windows,
)

T_MERGER = Time("2024-06-02T10:15:00", scale="utc")  # an invented time within the leap-second table
SPECS = {spec.key: spec for spec in load_reference().windows}


def _windows(z):
    windows = rest_frame_windows(T_MERGER, z, SPECS.values())
    return {key: w for key, w in zip(SPECS, windows, strict=True)}


def _days(t):
    return (t - T_MERGER).to_value(u.d)


def test_neutron_star_windows_cover_the_methods_time_scales():
    w = _windows(0.01)
    # Gamma-ray burst 1.74 s after the merger (Abbott et al. 2017, ApJL 848, L13).
    assert _days(w["gamma_ray_burst"].start) < 0 < 1.74 / 86400 < _days(w["gamma_ray_burst"].end)
    # Blue kilonova within the first day (Metzger 2019, Living Rev. Relativ. 23, 1).
    assert _days(w["kilonova_blue"].start) < 1 < _days(w["kilonova_blue"].end)
    # X-rays at ~9 d and radio at ~16 d (Abbott et al. 2017, ApJL 848, L12): weeks.
    assert _days(w["afterglow_rise"].start) < 9
    assert _days(w["afterglow_rise"].end) > 16
    # Radio peak at 149 d (Dobie et al. 2018, ApJL 858, L15).
    assert _days(w["afterglow_peak"].start) < 149 < _days(w["afterglow_peak"].end)
    assert all(window.start.scale == "utc" for window in w.values())


def test_one_plus_z_stretch_methods_section_13():
    near, far = _windows(0.0), _windows(0.5)
    for key in SPECS:
        for side in ("start", "end"):
            ratio = _days(getattr(far[key], side)) / _days(getattr(near[key], side))
            assert ratio == pytest.approx(1.5, rel=1e-9)
    assert observed_delay(2 * u.d, 0.25).to_value(u.d) == pytest.approx(2.5)


def test_leap_second_counted_iers_bulletin_c_52():
    # A leap second was inserted at 2016-12-31T23:59:60 UTC: 2 s after 23:59:59 is 00:00:00.
    start, end = utc_window(Time("2016-12-31T23:59:59", scale="utc"), 0, 0 * u.s, 2 * u.s)
    assert start.isot == "2016-12-31T23:59:59.000"
    assert end.isot == "2017-01-01T00:00:00.000"


@pytest.mark.parametrize(
    ("smbh", "radius", "m_bin", "kick", "period_yr", "hill_days", "rel"),
    [
        (1e8, 1000, 100, 100, 3.101169, 118.5, 1e-3),  # docs/methods.md §13 worked numbers
        (1e7, 1000, 50, 300, 0.310117, 6.8, 1e-2),  # docs/methods.md §13 (rounded to 0.1 d)
        (1e9, 1e4, 100, 200, 980.7, 2750, 1e-3),  # docs/methods.md §13
    ],
)
def test_agn_worked_numbers(smbh, radius, m_bin, kick, period_yr, hill_days, rel):
    period = orbital_period(smbh * u.Msun, radius)
    assert period.to_value(u.yr) == pytest.approx(period_yr, rel=max(rel, 1e-6))
    assert return_time(smbh * u.Msun, radius) == period / 2
    t_hill = hill_exit_time(smbh * u.Msun, radius, m_bin * u.Msun, kick * u.km / u.s)
    assert t_hill.to_value(u.d) == pytest.approx(hill_days, rel=rel)


def test_vectors_methods_section_16():
    # P(1e8 Msun, 1000 r_g) = 3.101169 yr; R_H/v(1e8, 700 r_g, 100 Msun, 200 km/s) = 41.47478 d.
    assert orbital_period(1e8 * u.Msun, 1000).to_value(u.yr) == pytest.approx(3.101169, rel=1e-6)
    t_hill = hill_exit_time(1e8 * u.Msun, 700, 100 * u.Msun, 200 * u.km / u.s)
    assert t_hill.to_value(u.d) == pytest.approx(41.47478, rel=1e-6)


def test_disk_exit_closed_form():
    # t_disk = (H/a) a / (v cos θ) (docs/methods.md §13), with a = 700 GM/c^2 and
    # GM_sun/c^2 = 1476.625 m (docs/methods.md §8).
    a = 700 * 1e8 * 1476.625
    t = disk_exit_time(1e8 * u.Msun, 700, 0.01, 200 * u.km / u.s, 60 * u.deg)
    assert t.to_value(u.s) == pytest.approx(0.01 * a / (200e3 * 0.5), rel=1e-6)


def test_agn_windows_span_the_kick_range():
    kicks = np.linspace(100, 300, 2001) * u.km / u.s
    flare, repeat = agn_windows(T_MERGER, 0.2, 1e8 * u.Msun, 700, 100 * u.Msun, kicks)
    fast = hill_exit_time(1e8 * u.Msun, 700, 100 * u.Msun, np.quantile(kicks, 0.95))
    slow = hill_exit_time(1e8 * u.Msun, 700, 100 * u.Msun, np.quantile(kicks, 0.05))
    assert _days(flare.start) == pytest.approx(1.2 * fast.to_value(u.d), rel=1e-9)
    assert _days(flare.end) == pytest.approx(1.2 * slow.to_value(u.d), rel=1e-9)
    # The repeat covers the next disk crossing at P/2 followed by the same flare delays
    # (docs/methods.md §13).
    half = return_time(1e8 * u.Msun, 700).to_value(u.d)
    assert _days(repeat.start) < 1.2 * (half + fast.to_value(u.d))
    assert _days(repeat.end) > 1.2 * (half + slow.to_value(u.d))
    assert "McKernan et al. 2019" in flare.basis
    assert (flare.key, repeat.key) == ("agn_flare", "agn_repeat_flare")
    assert flare.band == repeat.band == "optical_ultraviolet"
    assert flare.scenario == repeat.scenario == "agn_disk"


def test_windows_carry_keys_not_reader_names():
    # A window is a key, a band key, its scenario, the UTC range and its basis; names for readers
    # are kept outside the physics.
    assert [f.name for f in fields(Window)] == ["key", "band", "scenario", "start", "end", "basis"]
    w = _windows(0.01)
    for key, spec in SPECS.items():
        assert (w[key].key, w[key].band, w[key].scenario) == (spec.key, spec.band, spec.scenario)
        assert w[key].basis == spec.basis


def test_black_hole_pair_in_vacuum_has_no_window():
    windows, reason = vacuum_windows()
    assert windows == []
    assert "no electromagnetic counterpart is expected" in reason


def test_wrong_dimension_names_the_argument():
    with pytest.raises(u.UnitsError, match="kick_velocity"):
        hill_exit_time(1e8 * u.Msun, 700, 100 * u.Msun, 200 * u.km)
    with pytest.raises(u.UnitsError, match="smbh_mass"):
        orbital_period(1e8 * u.s, 700)
