"""Rounding by uncertainty: the Particle Data Group's rule (Review of Particle Physics,
"Introduction: rounding"), and units written as readers expect."""

import pytest

from factsheet.notation import (
    decimal_place,
    format_about,
    format_interval,
    format_median,
    format_value,
    unit_text,
)


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


def test_rounding_that_carries_into_the_next_decade():
    # 9.96 to two significant figures is 10, and 9.956e-4 is 1.0e-3: never "10.0" or
    # "10.0 × 10⁻⁴" (a mantissa of ten is not scientific notation).
    assert format_value(9.96) == "10"
    assert format_value(9.956e-6) == "1.0 × 10⁻⁵"
    assert format_value(99_960) == "1.0 × 10⁵"
    assert format_interval(9.97e-6, 9.57e-6, 9.97e-6) == "(1.00 +0.00 −0.04) × 10⁻⁵"


def test_median_reads_as_in_the_interval():
    # A caption or a figure label prints the same median as the table row of the quantity.
    assert format_interval(74.8, 66.1, 80.3, "Hz") == "75 +6 −9 Hz"
    assert format_median(74.8, 66.1, 80.3, "Hz") == "75 Hz"
    assert format_interval(0.000789, 0.00071, 0.00088, "s") == "(7.9 +0.9 −0.8) × 10⁻⁴ s"
    assert format_median(0.000789, 0.00071, 0.00088, "s") == "7.9 × 10⁻⁴ s"


def test_prose_rounds_to_the_digit_the_interval_supports():
    # An interval spanning 4.4-7.4 (billion years) supports "about 6", not "about 6.1".
    assert format_about(6.1, 4.4, 7.4) == "6"
    assert format_about(780, 480, 1040, "Mpc") == "800 Mpc"
    assert format_about(2.43, 1.9, 3.0) == "2.4"


def test_utc_iso_is_astropys_isot_and_leaves_no_conversion_kept():
    # astropy's Time.utc.isot is the reference: leap second, precisions, another scale
    import warnings

    import numpy as np
    from astropy.time import Time

    from factsheet.notation import utc_iso

    rng = np.random.default_rng(5)
    times = [
        Time("2016-12-31T23:59:60.5", scale="utc"),
        Time("2034-05-11T09:14:36.520", scale="utc"),
        Time("2035-01-01", scale="utc"),
        Time("2034-05-11T09:14:36.123456", scale="utc", precision=6),
        Time("2034-05-11T09:14:36.7", scale="utc", precision=0),
        Time("2034-05-11T09:14:36", scale="tt"),
    ]
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # dates beyond the leap-second table are "dubious"
        times += [Time(jd, format="jd", scale="utc") for jd in rng.uniform(2.44e6, 2.48e6, 500)]
        for time in times:
            fresh = Time(time)  # a copy with nothing kept yet
            assert utc_iso(fresh) == time.utc.isot
            if fresh.scale == "utc":
                assert "cache" not in fresh.__dict__
