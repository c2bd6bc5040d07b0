"""The value syntax of the input: intervals, exact values, rates, mappings, unit aliases."""

import astropy.units as u
import pytest

from factsheet.load.values import ValueParseError, parse_interval


def test_interval_with_alias_unit():
    interval = parse_interval("42 +7 -5 Msun")
    assert (interval.median, interval.plus, interval.minus, interval.unit) == (42, 7, 5, u.solMass)
    assert (interval.low, interval.high) == (37, 49)


def test_mapping_form_matches_text_form():
    assert parse_interval({"median": 42, "plus": 7, "minus": 5, "unit": "Msun"}) == parse_interval(
        "42 +7 -5 Msun"
    )


@pytest.mark.parametrize(
    ("text", "value", "unit"),
    [
        ("4 km", 4, u.km),
        ("580 deg2", 580, u.deg**2),
        ("1.2 Gpc", 1.2, u.Gpc),
        ("14.3", 14.3, u.one),
        ("1.39e+07 Mpc", 1.39e7, u.Mpc),  # a plus sign in an exponent is not an offset
        ("2E+3 km", 2000, u.km),
    ],
)
def test_exact_values(text, value, unit):
    interval = parse_interval(text)
    assert interval.exact and interval.median == pytest.approx(value) and interval.unit == unit


def test_rate_forms():
    assert parse_interval("1 / 80 yr").quantity.to_value(1 / u.yr) == pytest.approx(1 / 80)
    assert parse_interval("2 / yr").quantity.to_value(1 / u.yr) == pytest.approx(2)


def test_exponents_with_plus_signs_inside_intervals():
    interval = parse_interval("1e+3 +1e+2 -50 Mpc")
    assert (interval.median, interval.plus, interval.minus) == (1000, 100, 50)


def test_numbers_in_yaml_are_dimensionless():
    assert parse_interval(0).unit == u.one


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
        parse_interval(bad)
