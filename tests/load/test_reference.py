"""Packaged reference data and catalogue overrides (docs/methods.md §11, §13, §14)."""

import astropy.units as u
import pytest

from factsheet.errors import InputError
from factsheet.labels import WINDOWS
from factsheet.load.reference import load_reference

REFERENCE = load_reference()


def test_every_value_has_a_unit_and_a_source():
    for edge in REFERENCE.mass_bands.edges():
        assert edge.value.unit == u.Msun and edge.source and edge.spread
    for spec in REFERENCE.windows:
        assert (
            spec.start.unit == u.s
            and spec.start < spec.end
            and spec.basis
            and WINDOWS[spec.key].plain
        )
    for item in REFERENCE.comparisons:
        assert item.value.unit in (u.J, u.W) and item.source and not item.overridden


def test_rest_frame_windows_of_methods_section_13():
    # Defaults of docs/methods.md §13 (short burst −1…+10 s; blue kilonova 0.25…3 d;
    # neutrinos ±500 s).
    specs = {s.key: s for s in REFERENCE.windows}
    assert (specs["gamma_ray_burst"].start, specs["gamma_ray_burst"].end) == (-1 * u.s, 10 * u.s)
    assert specs["kilonova_blue"].start.to_value(u.d) == pytest.approx(0.25)
    assert specs["afterglow_peak"].end.to_value(u.d) == pytest.approx(365)
    assert specs["neutrino_coincidence"].end == 500 * u.s


def test_mass_band_override_applied_and_marked():
    reference = load_reference({"mass_bands": {"neutron_star_max": "2.5 Msun"}})
    edge = reference.mass_bands.neutron_star_max
    assert edge.value == 2.5 * u.Msun and edge.overridden
    assert not reference.mass_bands.lower_gap_top.overridden
    custom = {"pair_instability_lower": {"value": "50 Msun", "source": "our choice"}}
    edge = load_reference({"mass_bands": custom}).mass_bands.pair_instability_lower
    assert (edge.value, edge.source, edge.overridden) == (50 * u.Msun, "our choice", True)


def test_comparison_overrides_applied_and_marked():
    overrides = {
        "milky_way": {"value": "5e10 solLum"},
        "sun_year": None,
        "city_year": {"label": "a city for a year", "value": "1e17 J", "source": "invented"},
    }
    items = {c.key: c for c in load_reference({"comparisons": overrides}).comparisons}
    # 5e10 L_sun with the IAU 2015 B3 nominal L_sun = 3.828e26 W.
    assert items["milky_way"].value.to_value(u.W) == pytest.approx(5e10 * 3.828e26)
    assert items["milky_way"].overridden and items["milky_way"].low is None
    assert "sun_year" not in items
    assert items["city_year"].kind == "energy" and items["city_year"].overridden
    assert not items["sun"].overridden


@pytest.mark.parametrize(
    ("overrides", "key"),
    [
        ({"mass_bands": {"neutron_star_max": "2.5 km"}}, "mass_bands.neutron_star_max"),
        ({"mass_bands": {"neutron_star_max": 2.5}}, "mass_bands.neutron_star_max"),
        ({"mass_bands": {"neutron_star_max": "7 Msun"}}, "mass_bands.neutron_star_max"),
        (
            {"mass_bands": {"pair_instability_upper": "40 Msun"}},
            "mass_bands.pair_instability_upper",
        ),
        ({"mass_bands": {"heavy": "1 Msun"}}, "mass_bands.heavy"),
        ({"mass_bands": [1, 2]}, "mass_bands"),
        ({"comparisons": {"sun": {"value": "1 kg"}}}, "comparisons.sun"),
        ({"comparisons": {"sun": {"value": "bright"}}}, "comparisons.sun"),
        ({"comparisons": {"new": {"value": "1 J"}}}, "comparisons.new"),
        ({"comparisons": {"sun": {"colour": "yellow"}}}, "comparisons.sun"),
        ({"cosmology": "Planck18"}, "cosmology"),
    ],
)
def test_invalid_overrides_raise_input_error_naming_the_key(overrides, key):
    with pytest.raises(InputError) as caught:
        load_reference(overrides)
    assert [problem.key for problem in caught.value.problems] == [key]
    assert f"{key}:" in str(caught.value)
