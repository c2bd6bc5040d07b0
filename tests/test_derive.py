"""Derive on whole events: quantities, frames, class, remnant gating, windows and caveats.

Physics values are checked against their sources in tests/physics; here the checks are that
derive wires them correctly (frames, units, gating) and that each caveat rule fires on a case
built to trigger it and stays silent on a clean case.
"""

import astropy.units as u
import numpy as np
import pytest

from factsheet.api import derive
from factsheet.errors import InputError
from factsheet.physics import cosmology

BASE = {
    "id": "T-1",
    "time": "2034-04-12T07:26:41.2",
    "status": "confirmed",
    "parameters": {
        "mass_1": "36 +5 -4 Msun",
        "mass_2": "29 +4 -5 Msun",
        "spin_1z": "0.1 +0.2 -0.2",
        "spin_2z": "0.0 +0.3 -0.3",
        "luminosity_distance": "440 +180 -170 Mpc",
    },
    "false_alarm_rate": "1 / 1000 yr",
    "sky_area": "300 deg2",
}


def event(**changes):
    data = {**BASE, "parameters": dict(BASE["parameters"])}
    for key, value in changes.items():
        if key in BASE["parameters"] or key in ("chi_eff", "redshift"):
            if value is None:
                data["parameters"].pop(key)
            else:
                data["parameters"][key] = value
        else:
            data[key] = value
    return data


def codes(result):
    return {c.code for c in result.caveats}


def test_clean_bbh_has_all_quantities_and_only_standing_caveats():
    r = derive(event())
    assert r.source_class == "BBH"
    for key in (
        "final_mass",
        "final_spin",
        "radiated_energy",
        "peak_luminosity",
        "kick_velocity",
        "ringdown_frequency",
        "ringdown_damping_time",
        "isco_frequency",
        "time_in_band",
    ):
        s = r.quantities[key]
        assert s.low <= s.median <= s.high
    assert r.quantities["final_mass"].median < r.quantities["total_mass"].median
    assert codes(r) == {"independent-sampling", "redshift-from-cosmology"}
    assert r.windows == [] and "no electromagnetic" in r.no_window_reason.lower()


def test_detector_frame_masses_are_divided_by_one_plus_z():
    src = derive(event())
    det = derive(event(frame="detector"))
    z = det.samples["redshift"].value
    np.testing.assert_allclose(
        det.samples["mass_1"].value * (1 + z), det.samples["mass_1_detector"].value
    )
    assert det.quantities["mass_1"].median < src.quantities["mass_1"].median


def test_redshift_matches_cosmology_at_the_median():
    r = derive(event())
    z_med = cosmology.redshift_at_distance(440 * u.Mpc, "Planck18")
    assert r.quantities["redshift"].median == pytest.approx(float(z_med), rel=0.02)


def test_same_input_same_numbers_and_prose_does_not_change_them():
    a = derive(event())
    b = derive(event(title="Another title", summary="Other words"))
    assert a.quantities == b.quantities


def test_bns_gets_no_remnant_numbers_but_windows():
    r = derive(
        event(
            mass_1="1.5 +0.1 -0.1 Msun",
            mass_2="1.3 +0.1 -0.1 Msun",
            luminosity_distance="100 +30 -30 Mpc",
        )
    )
    assert r.source_class == "BNS"
    assert "final_mass" not in r.quantities and "neutron-star-remnant" in codes(r)
    names = [w.name for w in r.windows]
    assert len(names) >= 5 and "counterpart-windows-planning-aid" in codes(r)
    gamma = r.windows[0]
    delay = (gamma.end - r.event.time).to_value(u.s)
    assert 1 < delay < 60  # a short burst arrives seconds after the merger


def test_nsbh_plunge_keeps_remnant_disruption_drops_it():
    plunge = derive(
        event(
            mass_1="11 +1 -1 Msun",
            mass_2="1.4 +0.1 -0.1 Msun",
            spin_1z="0 +0 -0",
            spin_2z="0 +0 -0",
        )
    )
    assert plunge.source_class == "NSBH" and "final_mass" in plunge.quantities
    assert "neutron-star-plunges" in codes(plunge) and plunge.windows == []
    torn = derive(
        event(mass_1="5.5 +0.3 -0.3 Msun", mass_2="1.4 +0.1 -0.1 Msun", spin_1z="0.8 +0.05 -0.05")
    )
    assert torn.source_class == "NSBH" and "final_mass" not in torn.quantities
    assert "neutron-star-disrupted" in codes(torn) and torn.windows


def test_chi_eff_only_and_no_spins():
    r = derive(event(spin_1z=None, spin_2z=None, chi_eff="0.2 +0.1 -0.1"))
    assert "spins-from-effective-spin" in codes(r)
    np.testing.assert_array_equal(r.samples["spin_1z"], r.samples["spin_2z"])
    assert "spins-assumed-zero" in codes(derive(event(spin_1z=None, spin_2z=None)))


@pytest.mark.parametrize(
    ("status", "code"), [("candidate", "candidate"), ("retracted", "retracted")]
)
def test_status_caveats(status, code):
    assert code in codes(derive(event(status=status)))


def test_low_significance_and_large_sky_area():
    r = derive(event(false_alarm_rate="3 / yr", sky_area="2500 deg2"))
    assert {"low-significance", "large-sky-area"} <= codes(r)


def test_given_redshift_silences_cosmology_caveat():
    r = derive(event(redshift="0.09 +0.03 -0.03"))
    assert "redshift-from-cosmology" not in codes(r)


def test_out_of_calibration_fit_caveat():
    # q ~ 0.1 is outside the kick fit's calibrated mass ratios 0.25..1 (Gonzalez et al. 2007)
    r = derive(event(mass_1="50 +3 -3 Msun", mass_2="5.5 +0.5 -0.5 Msun"))
    notes = [c.text for c in r.caveats if c.code == "fit-outside-calibration"]
    assert any("Recoil" in t and "mass_ratio" in t for t in notes)
    assert "fit-outside-calibration" not in codes(derive(event()))


def test_band_straddle_caveat():
    r = derive(event(mass_1="47 +6 -6 Msun", mass_2="40 +4 -4 Msun"))
    assert "band-straddles-edge" in codes(r)
    probs = r.mass_bands["mass_1"]
    assert 0.1 < probs["pair_instability_gap"] < 0.9


def test_agn_host_gives_flare_and_repeat_windows():
    r = derive(
        event(host={"smbh_mass": "1e8 Msun", "orbit_radius": 700, "disk_aspect_ratio": 0.01})
    )
    assert len(r.windows) == 2 and all(w.scenario == "agn_disk" for w in r.windows)
    assert r.windows[0].start > r.event.time


def test_editorial_caveats_kept_as_written():
    r = derive(event(caveats=["Check the *calibration* note."]))
    (note,) = [c for c in r.caveats if c.editorial]
    assert note.text == "Check the *calibration* note."


def test_api_reports_bad_input():
    with pytest.raises(InputError, match="mass_1"):
        derive(event(mass_1="36 +5 -4 Mpc"))


def test_neutron_star_radius_and_thresholds_are_settings(tmp_path):
    from factsheet.model import Settings

    torn = event(
        mass_1="5.5 +0.3 -0.3 Msun", mass_2="1.4 +0.1 -0.1 Msun", spin_1z="0.8 +0.05 -0.05"
    )
    wide = derive(torn, Settings(neutron_star_radius=13 * u.km))
    small = derive(torn, Settings(neutron_star_radius=10 * u.km))
    # a larger star is less compact and easier to disrupt (Foucart, Hinderer & Nissanke 2018)
    assert wide.disruption_probability >= small.disruption_probability
    assert "13 km" in next(c.text for c in wide.caveats if c.code.startswith("neutron-star"))
    strict = Settings(low_significance_rate=1 / (10_000 * u.yr), large_sky_area=100 * u.deg**2)
    assert {"low-significance", "large-sky-area"} <= codes(derive(event(), strict))
