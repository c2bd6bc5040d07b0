"""The what-if-lensed panel on whole events: when it appears, with which magnifications, and that
derive wires the physics per sample (the physics itself is checked against the methods table
and astropy in tests/physics/test_lensing.py)."""

import dataclasses

import astropy.units as u
import numpy as np
import pytest
from astropy.cosmology import Planck18, z_at_value

from factsheet.api import derive
from factsheet.errors import InputError
from factsheet.model import Settings

BASE = {
    "id": "T-1",
    "time": "2034-04-12T07:26:41.2",
    "status": "confirmed",
    "estimate": {
        "heavier": {"mass": "36 +5 -4 Msun", "spin": "0.1 +0.2 -0.2"},
        "lighter": {"mass": "29 +4 -5 Msun", "spin": "0.0 +0.3 -0.3"},
        "distance": "440 +180 -170 Mpc",
    },
}


def event(heavier_mass=None, lighter_mass=None, distance=None, spins=True, **top):
    """The base event (invented values) with its masses, distance and top-level keys changed."""
    estimate = {k: dict(v) if isinstance(v, dict) else v for k, v in BASE["estimate"].items()}
    for body, mass in (("heavier", heavier_mass), ("lighter", lighter_mass)):
        if mass:
            estimate[body]["mass"] = mass
        if not spins:
            estimate[body].pop("spin")
    if distance:
        estimate["distance"] = distance
    return {**BASE, "estimate": estimate, **top}


HEAVY = {"heavier_mass": "88 +17 -14 Msun", "lighter_mass": "67 +15 -17 Msun"}
HEAVY_FAR = {**HEAVY, "distance": "3900 +1900 -1700 Mpc"}


def test_typical_pair_has_no_panel():
    r = derive(event())
    assert r.lensing is None
    assert "lensing-what-if" not in {c.code for c in r.caveats}


def test_heavy_pair_gets_the_automatic_panel():
    # Both bodies in the pair-instability gap (45-130 Msun by default): 4, 25 and 100.
    r = derive(event(**HEAVY_FAR))
    assert r.lensing is not None and r.lensing.origin == "automatic"
    assert [c.magnification for c in r.lensing.cases] == [4.0, 25.0, 100.0]
    note = next(c for c in r.caveats if c.code == "lensing-what-if")
    assert "no lens is known" in note.text and "pair-instability gap" in note.text
    assert "lensing-magnification" in r.other_methods  # listed on the methods page


def test_cases_follow_the_samples():
    # d_true = √μ d per sample, z_true at the median distance (astropy z_at_value), every mass
    # m_det/(1 + z_true): derived on the event's own samples.
    r = derive(event(**HEAVY_FAR))
    d, m1_det = r.samples["distance"], r.samples["heavier_mass_detector"]
    for case in r.lensing.cases:
        root = np.sqrt(case.magnification)
        assert case.distance.median == pytest.approx(root * np.median(d.value), rel=1e-9)
        z = z_at_value(Planck18.luminosity_distance, case.distance.median * u.Mpc, ztol=1e-10)
        assert case.redshift.median == pytest.approx(float(z), rel=1e-6)
        assert case.heavier_mass.frame == "source" and case.heavier_mass.unit == "solMass"
        assert case.heavier_mass.median < r.quantities["heavier_mass"].median
        assert case.remnant_mass is not None
        assert case.remnant_mass.median > case.heavier_mass.median
        assert case.heavier_mass.low < case.heavier_mass.median < case.heavier_mass.high
        assert sum(case.mass_bands["heavier"].values()) == pytest.approx(1)
    m_first = m1_det.value / (1 + r.samples["redshift"].value)  # the source frame, no lens
    assert np.median(m_first) == pytest.approx(r.quantities["heavier_mass"].median, rel=0.05)
    # at μ = 100 the heavier body of this pair lies below the gap's lower edge
    assert r.lensing.cases[-1].mass_bands["heavier"]["stellar_black_hole"] > 0.9


def test_event_list_wins_and_empty_list_means_none():
    r = derive(event(what_if_lensed=[10, 2]))
    assert r.lensing.origin == "event"
    assert [c.magnification for c in r.lensing.cases] == [2.0, 10.0]
    assert derive(event(**HEAVY_FAR, what_if_lensed=[])).lensing is None


def test_catalogue_sets_the_automatic_magnifications():
    settings = dataclasses.replace(Settings(), what_if_lensed=(9.0,))
    r = derive(event(**HEAVY_FAR), settings)
    assert [c.magnification for c in r.lensing.cases] == [9.0]
    off = dataclasses.replace(Settings(), what_if_lensed=())
    assert derive(event(**HEAVY_FAR), off).lensing is None


def test_retracted_event_has_no_automatic_panel():
    assert derive(event(**HEAVY_FAR, status="retracted")).lensing is None


def test_neutron_star_pair_has_no_remnant_row():
    r = derive(
        event(
            heavier_mass="1.5 +0.1 -0.1 Msun",
            lighter_mass="1.3 +0.1 -0.1 Msun",
            spins=False,
            distance="40 +10 -10 Mpc",
            what_if_lensed=[4],
        )
    )
    (case,) = r.lensing.cases
    assert case.remnant_mass is None and set(case.mass_bands) == {"heavier", "lighter"}


@pytest.mark.parametrize(
    ("value", "message"),
    [
        ([1], "not above 1"),
        ([0.5, 4], "not above 1"),
        ([".inf"], "expected a number"),
        (25, "expected a list"),
        ([4, 4], "twice"),
        (list(range(2, 10)), "at most 6"),
    ],
)
def test_bad_event_lists_are_input_errors(value, message):
    with pytest.raises(InputError, match=message) as info:
        derive(event(what_if_lensed=value))
    assert "what_if_lensed" in str(info.value)
