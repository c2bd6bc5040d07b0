"""The sheet's context: what a reader sees first, where each caveat goes, how numbers print."""

from __future__ import annotations

import gettext
import re

import astropy.units as u
import yaml
from astropy.time import Time
from helpers import VALID_EVENT
from hypothesis import given
from hypothesis import strategies as st

from factsheet import i18n
from factsheet.api import derive
from factsheet.model import Caveat, Summary
from factsheet.render import prose, sheet
from factsheet.render.windows import window_times


def event(**changes) -> dict:
    data = yaml.safe_load(VALID_EVENT)
    for path, value in changes.items():
        *parents, last = path.split("__")
        target = data
        for key in parents:
            target = target.setdefault(key, {})
        target[last] = value
    return data


@given(st.lists(st.floats(0, 1), min_size=5, max_size=5).filter(lambda p: sum(p) > 0))
def test_band_percentages_add_up_to_100(probabilities):
    shown = sheet.percents(probabilities)
    assert sum(int(p.split()[0]) for p in shown if not p.startswith("<")) == 100
    for p, text in zip(probabilities, shown, strict=True):
        assert (text == "0\xa0%") == (p == 0)


def test_window_times_fit_their_width():
    merger = Time("2034-06-06T01:48:20.4", scale="utc")
    seconds = window_times(merger - 1.0 * u.s, merger + 10.6 * u.s)
    assert seconds == ("2034-06-06 01:48:19", "2034-06-06 01:48:31", "second")
    hours = window_times(merger + 6 * u.h, merger + 60 * u.h)
    assert hours == ("2034-06-06 07:00", "2034-06-08 14:00", "hour")
    days = window_times(merger + 3 * u.day, merger + 15.5 * u.day)
    assert days == ("2034-06-09", "2034-06-22", "day")
    months = window_times(merger + 60 * u.day, merger + 500 * u.day)
    assert months == ("2034-08", "2035-11", "month")  # start floored, end ceiled


def test_a_window_starting_in_a_leap_second_still_prints():
    leap = Time("2016-12-31T23:59:60.5", scale="utc")  # IERS Bulletin C 52: a leap second
    assert window_times(leap, leap + 30 * u.s) == (
        "2016-12-31 23:59:59",
        "2017-01-01 00:00:30",
        "second",
    )


def test_a_bound_instead_of_a_meaningless_interval():
    from factsheet.model import Summary

    assert sheet.value_text(Summary(0.0, 0.0, 0.5, "", 0.9)) == "below 0.50"  # not "0.0 +0.5 −0.0"
    assert sheet.value_text(Summary(0.0, -0.2, 0.2, "", 0.9)) == "0.00 +0.20 −0.20"


def test_inputs_are_shown_as_given():
    item = derive(event(estimate__distance="950 +450 -400 Mpc"))
    page = sheet.event_page(item, None, None, (), _audio())
    rows = {r.key: r for g in page.groups for r in g.rows}
    assert rows["distance"].text == "950 +450 −400 Mpc"
    assert rows["distance"].kind == "measured"
    assert rows["total_mass"].kind == "derived"


def test_an_exact_input_is_marked_as_fixed():
    item = derive(event(estimate__heavier__spin="0", estimate__lighter__spin="0"))
    page = sheet.event_page(item, None, None, (), _audio())
    rows = {r.key: r for g in page.groups for r in g.rows}
    assert rows["heavier_spin"].kind == "fixed in the analysis"


def test_a_lower_gap_object_is_not_called_a_black_hole():
    item = derive(
        event(
            estimate__heavier__mass="8.9 +1.7 -1.3 Msun",
            estimate__lighter__mass="3.1 +0.4 -0.4 Msun",
        )
    )
    first = prose.headline(item)[0]
    assert "Two black holes" not in first
    assert "an object of about 3.1 solar masses, heavier than any known neutron star" in first
    assert "the masses cannot say what the lighter body is" in prose.class_sentence(item)


def test_a_candidate_speaks_conditionally_and_counts_in_words():
    item = derive(event(status="candidate", detection__false_alarm_rate="1 / 0.5 yr"))
    text = prose.headline(item)
    assert text[0].startswith("If it is real, two black holes")
    assert "would have left" in text[1]
    detection = " ".join(prose.detection(item))
    assert "about twice a year" in detection and "0.50 yr" not in detection
    codes = [c.code for c in item.caveats]
    assert "candidate" in codes and "low-significance" not in codes  # one box, not two


def test_a_retraction_comes_first_and_offers_no_sound_or_windows():
    item = derive(event(status="retracted"))
    page = sheet.event_page(item, None, None, (), _audio())
    assert page.opening[0].startswith("Retracted")
    assert page.headline[0].startswith("Had the signal been real")
    assert page.audio is None and page.windows == () and page.comparison_rows == ()
    assert all(c.code != "retracted" for c in page.boxes)


def test_caveats_are_placed_by_what_they_concern():
    notes = [
        Caveat("independent-sampling", "notice", "routine"),
        Caveat("editorial-1", "notice", "an editor's note", editorial=True),
        Caveat("low-significance", "warning", "noise"),
        Caveat("fit-outside-calibration", "warning", "kick", concerns=("kick_velocity",)),
        Caveat("counterpart-windows-planning-aid", "info", "planning"),
    ]
    placed = sheet.place(notes)
    assert [c.code for c in placed["boxes"]] == ["low-significance", "editorial-1"]
    assert [c.code for c in placed["rows"]] == ["fit-outside-calibration"]
    assert [c.code for c in placed["routine"]] == ["independent-sampling"]
    assert [c.code for c in placed["windows"]] == ["counterpart-windows-planning-aid"]


def test_a_warning_marks_the_rows_it_concerns():
    item = derive(
        event(estimate__heavier__mass="60 +5 -5 Msun", estimate__lighter__mass="3 +0.3 -0.3 Msun")
    )
    page = sheet.event_page(item, None, None, (), _audio())
    rows = {r.key: r for g in page.groups for r in g.rows}
    kick = [c for c in item.caveats if "kick_velocity" in c.concerns]
    assert kick, "a mass ratio of 0.05 lies outside the kick fit's calibration"
    assert rows["kick_velocity"].marks


def _audio():
    from factsheet.model import Audio

    return Audio("events/TEST-1.wav", "A sound.", 1.0)


def test_the_headline_says_how_long_a_luminous_quasar_would_shine():
    import astropy.constants as const

    item = derive(event())
    energy = item.quantities["energy_radiated"].quantity
    # the packaged object: 4.3e14 L_sun (Wu et al. 2015, Nature 518, 512); IAU 2015 B3 L_sun
    days = (energy / (4.3e14 * const.L_sun)).to_value(u.day)
    text = " ".join(prose.headline(item))
    assert f"one of the most luminous quasars known about {round(days, -1):.0f} days" in text


def test_durations_in_words():
    assert prose.duration_words(3 * 86400) == "about 3 days"
    assert prose.duration_words(2.2e9) == "about 70 years"
    assert prose.duration_words(1.0) == "about 1 second"


class _Loud(gettext.NullTranslations):
    """A stand-in catalogue that writes every message in capitals (placeholders kept): words
    that reach the page without going through the catalogue stay in lower case."""

    @staticmethod
    def _loud(message: str) -> str:
        return re.sub(r"[^{}]+(?=\{|$)", lambda m: m.group().upper(), message)

    def gettext(self, message):
        return self._loud(message)

    def ngettext(self, singular, plural, n):
        return self._loud(singular if n == 1 else plural)


def _no_english_left(text: str) -> bool:
    # dates in prose are Babel's (month names from the locale data, not our messages)
    text = re.sub(r"\d{1,2} de [a-z]+ de \d{4}", "", text)
    return not re.search(r"[a-z]", text)


def test_the_sheets_own_sentences_are_whole_messages(monkeypatch):
    """Each sentence the sheet writes (headline, detection, opening, how the numbers were made,
    the estimate's date, the index count) is one message of the catalogue with its numbers in
    placeholders, not English pieces glued together (languages differ in word order)."""
    from factsheet.render.index_page import IndexCount

    monkeypatch.setattr(i18n, "translations", lambda language: _Loud())
    confirmed = derive(event())
    candidate = derive(event(status="candidate"))
    retracted = derive(
        event(
            status="retracted",
            history=[
                {
                    "label": "Withdrawn",
                    "date": "2034-04-20",
                    "status": "retracted",
                    "note": "Noise.",
                }
            ],
        )
    )
    gap = derive(
        event(
            estimate__heavier__mass="8.9 +1.7 -1.3 Msun",
            estimate__lighter__mass="3.1 +0.4 -0.4 Msun",
        )
    )
    with i18n.use_language("es"):
        sentences = [
            *prose.headline(confirmed)[:2],
            *prose.headline(candidate)[:2],
            *prose.headline(retracted),
            prose.headline(gap)[0],
            *prose.detection(confirmed)[:1],
            *prose.detection(retracted)[:1],
            *prose.detection(confirmed, large_sky=True)[2:3],
            sheet.opening(retracted.event)[0],
            sheet.made(confirmed, sheet.place(confirmed.caveats))[1],
            sheet.estimate_date(confirmed.event),
            sheet.estimate_date(retracted.event),
            sheet.value_text(Summary(0.0, 0.0, 0.5, "", 0.9)),
            IndexCount(13, 0, 0).text,
            IndexCount(3, 1, 1).text,
            prose.duration_words(3 * 86400),
        ]
    assert all(_no_english_left(s) for s in sentences), [
        s for s in sentences if not _no_english_left(s)
    ]
    assert any("IF IT IS REAL" in s for s in sentences)  # the stand-in catalogue was used
