"""Unit checks at the call: wrong dimensions raise UnitsError naming the argument and the type."""

import astropy.units as u
import pytest

from factsheet.physics import cosmology, inspiral, kick, luminosity, remnant, ringdown

M = u.Msun

CASES = [
    (lambda: inspiral.chirp_mass(30 * u.km, 20 * M), "m1", "mass"),
    (lambda: inspiral.chirp_mass(30 * M, 20), "m2", "mass"),
    (lambda: inspiral.time_to_merger(30 * M, 20 * u.s), "frequency", "frequency"),
    (lambda: inspiral.frequency_at_time(30 * M, 1 * u.Hz), "time_before_merger", "time"),
    (lambda: inspiral.strain_amplitude(30 * M, 20 * u.Hz, 1 * u.s), "distance", "length"),
    (lambda: inspiral.isco_frequency(60 * u.m), "total_mass", "mass"),
    (lambda: remnant.remnant_spin_jf17(30 * M, 20 * u.Hz, 0, 0), "m2", "mass"),
    (lambda: remnant.radiated_fraction_bmr12(30 * M, 20 * M, 0.1 * u.m, 0), "chi1z", "dimension"),
    (lambda: luminosity.peak_luminosity_keitel17(30 * u.s, 20 * M, 0, 0), "m1", "mass"),
    (lambda: kick.kick_velocity(30 * M, 20 * u.kg * u.m, 0, 0), "m2", "mass"),
    (lambda: ringdown.qnm_220(60 * u.Hz, 0.7), "remnant_mass", "mass"),
    (lambda: ringdown.qnm_220(60 * M, 0.7 * u.m), "remnant_spin", "dimension"),
    (lambda: ringdown.qnm_220_bcw06(60 * u.s, 0.7), "remnant_mass", "mass"),
    (lambda: cosmology.redshift_at_distance(5 * M, "Planck18"), "distance", "length"),
    (lambda: cosmology.to_source_frame(30 * u.Mpc, 0.1), "mass", "mass"),
]


@pytest.mark.parametrize(("call", "name", "kind"), CASES)
def test_wrong_dimension_raises_naming_argument(call, name, kind):
    with pytest.raises(u.UnitsError, match=rf"^{name}: expected a .*{kind}"):
        call()


def test_any_mass_unit_accepted():
    a = inspiral.chirp_mass(30 * M, 20 * M)
    b = inspiral.chirp_mass((30 * M).to(u.kg), (20 * M).to(u.g))
    assert a.to_value(M) == pytest.approx(b.to_value(M), rel=1e-12)
