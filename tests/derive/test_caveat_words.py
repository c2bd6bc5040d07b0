"""Caveats are kept messages: English as their value (what the exports and comparisons see),
the reader's language and digits when shown, and they survive the pickling of parallel builds.

These are checks of our own wording and of the i18n plumbing, not of physics: the numbers in
them come from the rules of tests/derive/test_event.py and friends.
"""

import pickle
import re

import astropy.units as u
import pytest

from factsheet import labels
from factsheet.api import derive
from factsheet.derive import classify, lensing, windows
from factsheet.derive.caveats import general, listed, sentence_start, share
from factsheet.i18n import Later, Text, use_language

# Events of an invented scenario that between them raise many of the caveat rules.
CANDIDATE = {
    "id": "T-W1",
    "time": "2034-04-12T07:26:41.2",
    "status": "candidate",
    "detection": {"false_alarm_rate": "3 / yr", "sky_area": "2500 deg2"},
    "estimate": {
        "heavier": {"mass": "36 +5 -4 Msun", "spin": "0.9 +0.1 -0.2"},
        "lighter": {"mass": "35 +4 -5 Msun"},
        "distance": "440 +180 -170 Mpc",
    },
}
NEUTRON_STARS = {
    "id": "T-W2",
    "time": "2034-05-01T00:00:00",
    "estimate": {
        "heavier": {"mass": "1.5 +0.1 -0.1 Msun"},
        "lighter": {"mass": "1.3 +0.1 -0.1 Msun"},
        "distance": "40 +10 -10 Mpc",
    },
}


@pytest.fixture(scope="module")
def caveats():
    return [c for e in (CANDIDATE, NEUTRON_STARS) for c in derive(e).caveats]


def test_every_caveat_derive_writes_is_a_kept_message(caveats):
    codes = {c.code for c in caveats}
    assert {"candidate", "large-sky-area", "spin-assumed-zero", "neutron-star-remnant"} <= codes
    assert all(isinstance(c.text, Text) for c in caveats if not c.editorial)


def test_caveats_pickle_with_their_words_and_numbers(caveats):
    again = pickle.loads(pickle.dumps(caveats))
    assert [c.text for c in again] == [c.text for c in caveats]
    with use_language("es"):
        assert [str(c.text) for c in again] == [str(c.text) for c in caveats]


def test_numbers_in_a_caveat_follow_the_reader_and_english_stays_as_written(caveats):
    sky = next(c for c in caveats if c.code == "large-sky-area")
    # 2500 deg² as given: English as the exports carry it, Spanish without a thousands
    # separator for four digits (CLDR's minimum grouping for Spanish).
    assert "2500 square degrees" in sky.text
    limit = derive({**CANDIDATE, "status": "confirmed"}).caveats
    bound = next(c for c in limit if c.code == "bound-at-limit")
    assert re.search(r"0\.9\d* for the heavier body's spin instead of 1\b", bound.text)
    with use_language("es"):
        shown = str(bound.text)
        assert re.search(r"0,9\d*", shown) and not re.search(r"\d\.\d", shown)
        assert "2500" in str(sky.text)


def test_number_words():
    assert general(0.1) == "0.1" and general(-0.25, ".3g") == "-0.25" and general(1e-5) == "1e-05"
    assert share(0.375) == "38%" and share(1.0) == "100%"
    with use_language("es"):
        assert general(0.1) == "0,1" and general(-0.25, ".3g") == "−0,25"
        assert share(0.375).startswith("38")


def test_lists_read_as_the_english_sentences_always_did():
    abc = ("a", "b", "c")
    assert listed(("a",), "and") == "a"
    assert listed(("a", "b"), "and") == "a and b"
    assert listed(abc, "and") == "a, b and c"
    assert listed(abc, "nor") == "a, b or c"
    assert listed(("a", "b"), "clauses") == "a; and b"
    assert listed(abc, "clauses") == "a; b; and c"
    assert listed(abc, "numbers") == "a, b, c"
    assert listed(abc) == "a, b, c"
    assert sentence_start(Later(listed, ("the mass", "b"), "and")) == "The mass and b"


def test_band_edges_in_a_sentence_are_the_labels_with_their_article():
    assert set(classify.EDGES_IN_SENTENCE) == set(labels.EDGES)
    for key, words in classify.EDGES_IN_SENTENCE.items():
        assert words == "the " + labels.EDGES[key]


def test_two_straddled_edges_in_one_sentence():
    edges = {"pair_instability_lower": 45 * u.Msun, "pair_instability_upper": 130 * u.Msun}
    (note,) = classify._straddle_notes(
        [("heavier_mass", "pair_instability_lower"), ("remnant_mass", "pair_instability_upper")],
        edges,
    )
    assert note.text == (
        "The heavier body's mass straddles the lower edge of the pair-instability gap (45 M⊙); "
        "and remnant mass straddles the upper edge of the pair-instability gap (130 M⊙): these "
        "edges are uncertain in the literature, so the band labels are soft."
    )


def test_windows_left_out_are_counted_in_words():
    one, two = windows._window_notes(1)[1], windows._window_notes(2)[1]
    assert one.text.startswith("1 counterpart window would") and one.text.endswith("is left out.")
    assert two.text.startswith("2 counterpart windows would") and two.text.endswith("are left out.")


def test_magnifications_beyond_the_table_are_listed():
    note = lensing.beyond_caveat([2000.0, 5000.0])
    assert note.text.startswith("Magnified 2000, 5000 times, the source would lie beyond")


def test_the_vacuum_reason_is_the_physics_wording_as_a_message():
    from factsheet.derive.windows import VACUUM_REASON
    from factsheet.physics.counterparts import VACUUM_REASON as PHYSICS_WORDING

    assert str.__str__(VACUUM_REASON) == PHYSICS_WORDING
    with use_language("es"):
        assert str(VACUUM_REASON) != PHYSICS_WORDING
