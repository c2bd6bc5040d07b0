"""What ``check`` accepts the build must be able to do: texts, times, ids, URLs, sky areas and
distances are refused at load, at their own line and key, when the build could not use them."""

from __future__ import annotations

import math

import astropy.units as u
import pytest
from astropy.cosmology import WMAP9, Planck18
from helpers import VALID_EVENT

from factsheet.errors import InputError
from factsheet.load import load_catalogue
from factsheet.load.scalars import Bad, parse_time
from factsheet.load.schema import WHOLE_SKY_DEG2

HISTORY = """\
history:
  - date: "{date}"
    label: {label}
    estimate:
      heavier: {{mass: 30 +3 -3 Msun}}
      lighter: {{mass: 20 +3 -3 Msun}}
      distance: {distance}
"""


def problems_of(folder) -> list[str]:
    with pytest.raises(InputError) as info:
        load_catalogue(folder)
    return [str(p) for p in info.value.problems]


def one_problem(catalogue, old: str, new: str, settings: str = "") -> tuple[object, str]:
    assert old in VALID_EVENT
    files = {"ev.yaml": VALID_EVENT.replace(old, new)}
    if settings:
        files["catalogue.yaml"] = settings
    folder = catalogue(files)
    (problem,) = problems_of(folder)
    return folder, problem


def loads(catalogue, old: str, new: str, settings: str = ""):
    files = {"ev.yaml": VALID_EVENT.replace(old, new)}
    if settings:
        files["catalogue.yaml"] = settings
    return load_catalogue(catalogue(files))


# -- texts -------------------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("old", "new", "line", "key", "words"),
    [
        ("title: A test pair", "title: " + "t" * 201, 2, "title", "at most 200"),
        ("title: A test pair", 'title: "two\\nlines"', 2, "title", "one line"),
        ("title: A test pair", 'title: "a\\u2028b"', 2, "title", "one line"),
        ("network: [A1, B1]", "network: [A1, " + "B" * 201 + "]", 6, "detection.network", "200"),
        ("network: [A1, B1]", 'network: [A1, "B\\n1"]', 6, "detection.network", "one line"),
        ("summary: A *test* event.", "summary: " + "s" * 100_001, 18, "summary", "at most 100000"),
        (
            "summary: A *test* event.",
            "caveats: [" + "c" * 100_001 + "]",
            18,
            "caveats[0]",
            "100000",
        ),
    ],
)
def test_text_length_and_lines(catalogue, old, new, line, key, words):
    folder, problem = one_problem(catalogue, old, new)
    assert problem.startswith(f"{folder / 'ev.yaml'}:{line}: {key}: "), problem
    assert words in problem


def test_markdown_keeps_its_lines_and_texts_their_written_form(catalogue):
    cat = loads(catalogue, "title: A test pair", "title: 007")
    assert cat.events[0].title == "007"
    cat = loads(catalogue, "summary: A *test* event.", "summary: |\n  one\n\n  two")
    assert cat.events[0].summary == "one\n\ntwo"
    cat = loads(catalogue, "network: [A1, B1]", "network: [01, on, 'yes', 21:24]")
    assert cat.events[0].detection.network == ("01", "on", "yes", "21:24")


@pytest.mark.parametrize(
    ("settings", "key", "words"),
    [
        (
            'comparisons:\n  city_day: {value: 4e14 J, label: "a\\nb", source: ours}\n',
            "comparisons.city_day.label",
            "one line",
        ),
        ("comparisons:\n  sun: {label: " + "s" * 201 + "}\n", "comparisons.sun.label", "200"),
        ("comparisons:\n  sun: {label: 12}\n", "comparisons.sun.label", "expected text"),
        (
            "mass_bands:\n  lower_gap_top: {value: 5 Msun, source: " + "s" * 100_001 + "}\n",
            "mass_bands.lower_gap_top.source",
            "100000",
        ),
    ],
)
def test_texts_of_reference_overrides(catalogue, settings, key, words):
    folder = catalogue({"a.yaml": VALID_EVENT, "catalogue.yaml": settings})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'catalogue.yaml'}:1: {key}: ") and words in problem


def test_history_label_must_be_one_line(catalogue):
    history = HISTORY.format(date="2034-04-13", label='"one\\ntwo"', distance="400 Mpc")
    folder = catalogue({"ev.yaml": VALID_EVENT + history})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'ev.yaml'}:21: history[0].label: ")


# -- times -------------------------------------------------------------------------------------


@pytest.mark.parametrize(
    "text",
    # leap seconds of astropy's table (inserted at the end of these days)
    ["2016-12-31T23:59:60", "2016-12-31T23:59:60.5", "2015-06-30 23:59:60", "1972-06-30T23:59:60"],
)
def test_real_leap_seconds_are_accepted(text):
    got = parse_time(text)
    assert got.ymdhms["second"] >= 60 and got.isot.startswith(text[:10])


@pytest.mark.parametrize(
    ("text", "words"),
    [
        ("2034-04-12T23:59:60", "ends without a leap second"),
        ("2034-04-12T23:59:60.9", "ends without a leap second"),
        ("2017-06-30T23:59:60", "ends without a leap second"),
        ("2016-12-30T23:59:60", "ends without a leap second"),
        ("2016-12-31T23:59:61", "does not exist"),
        ("2034-04-12T12:00:60", "does not exist"),
        ("0001-01-01T00:00:00", "year 1 is outside 1960 to 9999"),
        ("0999-04-12", "year 999"),
        ("1899-04-12T07:26:41", "year 1899"),
        ("1959-12-31T23:59:59", "year 1959"),
    ],
)
def test_times_that_do_not_exist_or_cannot_be_built_are_refused(text, words):
    with pytest.raises(Bad, match=words):
        parse_time(text)


@pytest.mark.parametrize(
    "text", ["1960-01-01", "2034-04-12T07:26:41.2", "2200-01-01", "9999-12-31"]
)
def test_years_1960_to_9999_are_accepted(text):
    assert parse_time(text).isot.startswith(text[:10])


@pytest.mark.parametrize(
    ("old", "new", "line", "key"),
    [
        ('time: "2034-04-12T07:26:41.2"', 'time: "2034-04-12T23:59:60"', 3, "time"),
        ('time: "2034-04-12T07:26:41.2"', 'time: "0999-04-12T07:26:41"', 3, "time"),
        ("summary: A *test* event.", 'embargo_until: "2030-06-30T23:59:60"', 18, "embargo_until"),
    ],
)
def test_bad_times_name_their_key(catalogue, old, new, line, key):
    folder, problem = one_problem(catalogue, old, new)
    assert problem.startswith(f"{folder / 'ev.yaml'}:{line}: {key}: bad time"), problem


def test_history_date_on_a_day_without_leap_second(catalogue):
    history = HISTORY.format(date="2034-06-30T23:59:60", label="First", distance="400 Mpc")
    folder = catalogue({"ev.yaml": VALID_EVENT + history})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'ev.yaml'}:20: history[0].date: bad time")


# -- ids ---------------------------------------------------------------------------------------


@pytest.mark.parametrize("raw", ['"X\\n"', '"X "', '"X\\tY"', '"X Y"', "|\n  X"])
def test_ids_with_whitespace_or_a_line_break_are_refused(catalogue, raw):
    folder, problem = one_problem(catalogue, "id: TEST-1", f"id: {raw}")
    assert problem.startswith(f"{folder / 'ev.yaml'}:1: id: invalid id"), problem


def test_ids_that_differ_only_in_letter_case_are_refused(catalogue):
    folder = catalogue(
        {"a.yaml": VALID_EVENT, "b.yaml": VALID_EVENT.replace("id: TEST-1", "id: test-1")}
    )
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'b.yaml'}:1: id: id 'test-1' differs from 'TEST-1'")
    assert "only in letter case" in problem


# -- base_url ----------------------------------------------------------------------------------


@pytest.mark.parametrize(
    "url",
    [
        '"javascript:alert(1)//"',
        "https://",
        "ftp://example.org/",
        "//example.org/sheets/",
        "example.org",
        '"http://exa mple.org/"',
        '"https://example.org/<script>"',
        "https://example.org:99999/",
        "data:text/html,hi",
    ],
)
def test_base_url_must_be_http_with_a_host(catalogue, url):
    folder = catalogue({"a.yaml": VALID_EVENT, "catalogue.yaml": f"base_url: {url}\n"})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'catalogue.yaml'}:1: base_url: expected an http://")


@pytest.mark.parametrize(
    "url", ["https://example.org/sheets/", "http://localhost:8000", "https://[::1]/a?b=c#d"]
)
def test_good_base_urls(catalogue, url):
    folder = catalogue({"a.yaml": VALID_EVENT, "catalogue.yaml": f"base_url: '{url}'\n"})
    assert load_catalogue(folder).settings.base_url == url


# -- sky area ----------------------------------------------------------------------------------


def test_whole_sky_is_four_pi_steradians():
    # 4 pi sr = 129600 / pi deg2 = 41252.96 deg2 (astropy units)
    assert pytest.approx((4 * math.pi * u.sr).to_value(u.deg**2)) == WHOLE_SKY_DEG2
    assert pytest.approx(129600 / math.pi) == WHOLE_SKY_DEG2
    assert pytest.approx(41252.96, abs=0.01) == WHOLE_SKY_DEG2


@pytest.mark.parametrize("area", ["41253 deg2", "50000 deg2", "13 sr", "4.2 pi sr"])
def test_a_sky_area_larger_than_the_sky_is_refused(catalogue, area):
    folder, problem = one_problem(catalogue, "sky_area: 580 deg2", f"sky_area: {area}")
    assert problem.startswith(f"{folder / 'ev.yaml'}:9: detection.sky_area: "), problem
    assert "the whole sky is 41252.96 deg2" in problem or "unknown unit" in problem


def test_the_whole_sky_itself_is_accepted(catalogue):
    cat = loads(catalogue, "sky_area: 580 deg2", "sky_area: 12.566 sr")
    assert cat.events[0].detection.sky_area.to_value(u.deg**2) < WHOLE_SKY_DEG2


def test_large_sky_area_setting_is_bounded_too(catalogue):
    folder = catalogue({"a.yaml": VALID_EVENT, "catalogue.yaml": "large_sky_area: 1e6 deg2\n"})
    (problem,) = problems_of(folder)
    assert f"{folder / 'catalogue.yaml'}:1: large_sky_area: " in problem and "whole sky" in problem


# -- distances ---------------------------------------------------------------------------------

DISTANCE = "distance: 440 +180 -170 Mpc"
# d_L(z = 1000): 1.38797e7 Mpc under Planck18, 1.39973e7 Mpc under WMAP9 (astropy)
PLANCK18_LIMIT = Planck18.luminosity_distance(1000).to_value(u.Mpc)
WMAP9_LIMIT = WMAP9.luminosity_distance(1000).to_value(u.Mpc)


@pytest.mark.parametrize(
    "value", ["2e7 Mpc", "1.3e7 +2e6 -1e6 Mpc", "14 Tpc", "{median: 1.3e7, plus: 1e6, unit: Mpc}"]
)
def test_a_distance_beyond_the_redshift_table_is_refused_at_its_line(catalogue, value):
    folder, problem = one_problem(catalogue, DISTANCE, f"distance: {value}")
    assert problem.startswith(f"{folder / 'ev.yaml'}:17: estimate.distance: distance "), problem
    assert "redshift 1000 under Planck18" in problem


def test_the_limit_is_that_of_the_catalogues_cosmology(catalogue):
    between = f"distance: {(PLANCK18_LIMIT + WMAP9_LIMIT) / 2:.6g} Mpc"
    cat = loads(catalogue, DISTANCE, between, settings="cosmology: WMAP9\n")  # inside WMAP9's
    (cat.root / "catalogue.yaml").unlink()  # back to the default, Planck18
    _, problem = one_problem(catalogue, DISTANCE, between)  # beyond Planck18's table
    assert "estimate.distance" in problem and "under Planck18" in problem


def test_a_history_distance_beyond_the_table(catalogue):
    history = HISTORY.format(date="2034-04-13", label="First", distance="1e8 Mpc")
    folder = catalogue({"ev.yaml": VALID_EVENT + history})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'ev.yaml'}:25: history[0].estimate.distance: ")


def test_a_samples_row_beyond_the_table(catalogue):
    rows = "heavier.mass [Msun],lighter.mass [Msun],distance [Mpc]\n36,29,440\n36,29,3e7\n"
    folder = catalogue({"ev.yaml": VALID_EVENT + "samples: s.csv\n", "s.csv": rows})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 's.csv'}:3: distance: distance 3e+07 Mpc lies beyond")


@pytest.mark.parametrize("value", ["1e-4 Mpc", "1 pc", "0.002 +0.001 -0.001 Mpc", "1.38e7 Mpc"])
def test_distances_inside_the_extended_table_load(catalogue, value):
    cat = loads(catalogue, DISTANCE, f"distance: {value}")
    assert cat.events[0].estimate.distance.median > 0
