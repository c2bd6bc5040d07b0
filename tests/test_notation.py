"""Rounding by uncertainty: the Particle Data Group's rule (Review of Particle Physics,
"Introduction: rounding"), and units written as readers expect."""

import pytest

from factsheet.notation import decimal_place, format_interval, format_value, unit_text


@pytest.mark.parametrize(
    ("uncertainty", "place"),
    # PDG examples: 0.827 +- 0.119 -> two digits (0.83 +- 0.12); 0.827 +- 0.367 -> one (0.8 +- 0.4);
    # an uncertainty of 0.0976 rounds up to 0.10 and keeps two digits.
    [(0.119, -2), (0.367, -1), (0.0976, -2), (3.54, -1), (3.55, 0), (1000, 2)],
)
def test_pdg_decimal_place(uncertainty, place):
    assert decimal_place(uncertainty) == place


def test_interval_rounded_by_smaller_side():
    assert format_interval(36.23, 32.11, 41.4, "solMass") == "36 +5 −4 M⊙"  # 4.12: one digit
    assert format_interval(36.23, 33.1, 41.4, "solMass") == "36.2 +5.2 −3.1 M⊙"  # 3.13: two
    assert format_interval(0.827, 0.708, 0.944) == "0.83 +0.12 −0.12"


def test_large_values_factor_out_a_power_of_ten():
    assert format_interval(5.36e47, 4.9e47, 5.9e47, "J") == "(5.4 +0.5 −0.5) × 10⁴⁷ J"


def test_exact_value_keeps_four_significant_digits():
    assert format_interval(4.0, 4.0, 4.0, "km") == "4.000 km"


@pytest.mark.parametrize(
    ("unit", "text"),
    [("solMass", "M⊙"), ("km / s", "km s⁻¹"), ("erg / s", "erg s⁻¹"), ("Mpc", "Mpc"), ("", "")],
)
def test_units_written_properly(unit, text):
    assert unit_text(unit) == text


def test_format_value_significant_figures():
    assert format_value(1234.5, "s") == "1200 s"
    assert format_value(3.6e52, "W") == "3.6 × 10⁵² W"


def test_a_value_that_rounds_to_zero_has_no_minus_sign():
    assert format_interval(-0.0002, -0.0302, 0.0298) == "0.000 +0.030 −0.030"
