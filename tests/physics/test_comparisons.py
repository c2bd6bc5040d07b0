"""Comparison values against their sources (docs/methods.md §8, §14 and §16)."""

import astropy.constants as const
import astropy.units as u
import pytest

from factsheet.load.reference import load_reference
from factsheet.physics.comparisons import (
    DERIVED_VALUES,
    emission_time,
    energy_ratios,
    in_energy_units,
    luminosity_ratios,
)

REFERENCE = load_reference()
ENERGIES = REFERENCE.energies()
LUMINOSITIES = REFERENCE.luminosities()


def test_solar_rest_energy_methods_section_16():
    # M_sun c^2 = 1.787094e47 J (docs/methods.md §16, from IAU 2015 GM_sun and CODATA G).
    assert ENERGIES["solar_rest_energy"].to_value(u.J) == pytest.approx(1.787094e47, rel=1e-6)


def test_planck_luminosity_methods_section_16():
    # c^5/G = 3.628255e52 W (docs/methods.md §16, CODATA through astropy), computed not typed.
    assert LUMINOSITIES["planck_luminosity"].to_value(u.W) == pytest.approx(3.628255e52, rel=1e-6)
    assert DERIVED_VALUES["planck_luminosity"] == (const.c**5 / const.G).to(u.W)


def test_solar_luminosity_iau_2015_b3():
    # IAU 2015 Resolution B3 nominal solar luminosity, as astropy exposes it.
    assert LUMINOSITIES["sun"] == const.L_sun.to(u.W)
    assert LUMINOSITIES["sun"].to_value(u.W) == 3.828e26
    # One Julian year of it: 1.208e34 J (docs/methods.md §14).
    assert ENERGIES["sun_year"].to_value(u.J) == pytest.approx(1.208e34, rel=1e-3)


def test_megaton_tnt_nist_sp811():
    # 1 t TNT = 4.184e9 J by the NIST SP 811 convention, so 1 Mt = 4.184e15 J.
    assert ENERGIES["megaton_tnt"].to_value(u.J) == 4.184e15


def test_handy_ratios_methods_section_14():
    ratios = energy_ratios(ENERGIES["solar_rest_energy"], ENERGIES)
    # One solar mass of energy ≈ 1480 Sun-lifetimes ≈ 4.3e31 megatons of TNT (docs/methods.md §14).
    assert ratios["sun_lifetime"] == pytest.approx(1480, rel=1e-2)
    assert ratios["megaton_tnt"] == pytest.approx(4.3e31, rel=1e-2)
    assert ratios["solar_rest_energy"] == pytest.approx(1.0)
    assert "sun" not in ratios  # luminosities are not compared with energies


def test_luminosity_ratios_and_milky_way_conversion():
    # Milky Way 4e10 L_sun ≈ 1.5e37 W (Licquia, Newman & Brinchmann 2015, ApJ 809, 96;
    # docs/methods.md §14).
    assert LUMINOSITIES["milky_way"].to_value(u.W) == pytest.approx(1.5e37, rel=3e-2)
    ratios = luminosity_ratios(3.6e49 * u.W, LUMINOSITIES)
    assert ratios["planck_luminosity"] == pytest.approx(3.6e49 / 3.628255e52, rel=1e-6)
    assert "megaton_tnt" not in ratios


def test_emission_time_of_the_sun():
    # E / L_sun for one Julian year of solar output is one year (IAU 2015 B3 L_sun).
    assert emission_time(ENERGIES["sun_year"]).to_value(u.yr) == pytest.approx(1.0)
    # M_sun c^2 / L_sun ≈ 1.48e13 yr (the handy ratio of docs/methods.md §14 times 10 Gyr).
    assert emission_time(ENERGIES["solar_rest_energy"]).to_value(u.yr) == pytest.approx(
        1.48e13, rel=1e-2
    )


def test_energy_units_si_and_cgs():
    # 1 J = 1e7 erg by definition of the erg (SI Brochure, 9th ed., non-SI units).
    assert in_energy_units(1 * u.J, "cgs").to_value(u.erg) == 1e7
    assert in_energy_units(1 * u.W, "cgs").unit == u.erg / u.s
    assert in_energy_units(1e7 * u.erg, "SI").unit == u.J
    with pytest.raises(ValueError, match="energy_units"):
        in_energy_units(1 * u.J, "imperial")


def test_wrong_dimension_names_the_argument():
    with pytest.raises(u.UnitsError, match="energy"):
        energy_ratios(1 * u.W, ENERGIES)
    with pytest.raises(u.UnitsError, match="luminosity"):
        luminosity_ratios(1 * u.J, LUMINOSITIES)
