"""Value syntax of DESIGN.md section 4: intervals, exact values, rates, mappings, aliases."""

import astropy.units as u
import pytest

from factsheet.quantities import ValueParseError, parse_estimate


def test_interval_with_alias_unit():
    est = parse_estimate("42 +7 -5 Msun")
    assert (est.median, est.plus, est.minus, est.unit) == (42, 7, 5, u.solMass)
    assert (est.low, est.high) == (37, 49)


def test_mapping_form_matches_text_form():
    assert parse_estimate({"median": 42, "plus": 7, "minus": 5, "unit": "Msun"}) == parse_estimate(
        "42 +7 -5 Msun"
    )


@pytest.mark.parametrize(
    ("text", "value", "unit"),
    [
        ("4 km", 4, u.km),
        ("580 deg2", 580, u.deg**2),
        ("1.2 Gpc", 1.2, u.Gpc),
        ("14.3", 14.3, u.one),
    ],
)
def test_exact_values(text, value, unit):
    est = parse_estimate(text)
    assert est.exact and est.median == pytest.approx(value) and est.unit == unit


def test_rate_forms():
    assert parse_estimate("1 / 80 yr").quantity.to_value(1 / u.yr) == pytest.approx(1 / 80)
    assert parse_estimate("2 / yr").quantity.to_value(1 / u.yr) == pytest.approx(2)


def test_numbers_in_yaml_are_dimensionless():
    assert parse_estimate(0).unit == u.one


@pytest.mark.parametrize(
    "bad",
    [
        "42 +7 Msun",
        "42 -5 +7 Msun",
        "forty Msun",
        "42 +7 -5 parsecs-ish",
        "1 / 0 yr",
        True,
        {"plus": 1},
        {"median": "x"},
        {"median": 1, "extra": 2},
        [1, 2],
        float("nan"),
    ],
)
def test_malformed_values_raise(bad):
    with pytest.raises(ValueParseError):
        parse_estimate(bad)
