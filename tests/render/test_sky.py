"""The sheet's "where in the sky" words: positions, the candidates' plain readings."""

import astropy.units as u
import pytest

from factsheet.i18n import use_language
from factsheet.render.sky import position_text


@pytest.mark.parametrize(
    ("ra", "dec", "text"),
    [
        (47.3, -21.6, "right ascension 3h 09.2m, declination −21.6°"),  # 47.3 / 15 = 3.1533 h
        (0.0, 0.04, "right ascension 0h 00.0m, declination 0.0°"),
        (359.999, 89.95, "right ascension 0h 00.0m, declination +90.0°"),  # rounds to 24h = 0h
        (180.0, -0.04, "right ascension 12h 00.0m, declination 0.0°"),  # no sign on zero,
    ],
)
def test_positions_are_written_in_hours_and_degrees(ra, dec, text):
    # 15 degrees of right ascension are one hour (the definition of the hour angle)
    assert position_text(ra * u.deg, dec * u.deg) == text


def test_positions_follow_the_readers_decimal_sign():
    # Spanish writes a decimal comma (CLDR's locale data, through Babel); the minutes keep their
    # two digits and the declination its sign, whatever the words of the catalogue.
    with use_language("es"):
        text = position_text(47.3 * u.deg, -21.6 * u.deg)
    assert "3h 09,2m" in text and "−21,6°" in text
