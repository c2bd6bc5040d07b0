"""History entries: earlier estimates and changes of status, oldest first, checked at their line;
and the catalogue's licence and citation settings."""

from __future__ import annotations

import pytest
from helpers import VALID_EVENT

from factsheet.errors import InputError
from factsheet.load import load_catalogue
from factsheet.resources import demo_dir

ESTIMATE = """\
    estimate:
      heavier: {mass: 30 +3 -3 Msun}
      lighter: {mass: 20 +3 -3 Msun}
      distance: 400 +100 -100 Mpc
"""
FIRST = '  - date: "2034-04-13"\n    label: First look\n    status: candidate\n' + ESTIMATE
WITHDRAWN = (
    '  - date: "2034-04-20"\n    label: Withdrawn\n    status: retracted\n'
    "    note: Noise at one site.\n"
)


def event(history: str, status: str = "retracted") -> str:
    text = VALID_EVENT.replace("status: confirmed", f"status: {status}")
    return text + "history:\n" + history


def problems_of(folder) -> list[str]:
    with pytest.raises(InputError) as info:
        load_catalogue(folder)
    return [str(p) for p in info.value.problems]


def test_a_status_change_needs_no_estimate(catalogue):
    loaded = load_catalogue(catalogue({"ev.yaml": event(FIRST + WITHDRAWN)}))
    (ev,) = loaded.events
    first, withdrawn = ev.history
    assert (first.status, first.estimate.heavier.mass.median) == ("candidate", 30)
    assert (withdrawn.label, withdrawn.status, withdrawn.estimate) == (
        "Withdrawn",
        "retracted",
        None,
    )
    assert withdrawn.note == "Noise at one site."
    assert loaded.warnings == ()


def test_an_entry_needs_an_estimate_or_a_status(catalogue):
    folder = catalogue({"ev.yaml": event('  - date: "2034-04-20"\n    label: Nothing\n')})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'ev.yaml'}:20: history[0]: "), problem
    assert "an estimate, a status, or both" in problem


@pytest.mark.parametrize(
    ("entry", "line", "key", "words"),
    [
        ("  - label: Withdrawn\n    status: retracted\n", 20, "history[0].date", "missing"),
        ('  - date: "2034-04-20"\n    status: retracted\n', 20, "history[0].label", "missing"),
        (
            '  - date: "2034-04-20"\n    label: Gone\n    status: withdrawn\n',
            22,
            "history[0].status",
            "retracted",
        ),
        (
            '  - date: "2034-04-20"\n    label: Gone\n    state: retracted\n',
            22,
            "history[0].state",
            "unknown key (did you mean",
        ),
    ],
)
def test_bad_entries_are_named_by_file_line_and_key(catalogue, entry, line, key, words):
    folder = catalogue({"ev.yaml": event(entry)})
    problems = problems_of(folder)
    assert any(p.startswith(f"{folder / 'ev.yaml'}:{line}: {key}: ") for p in problems), problems
    assert any(words in p for p in problems), problems


def test_entries_must_be_oldest_first(catalogue):
    folder = catalogue({"ev.yaml": event(WITHDRAWN + FIRST)})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'ev.yaml'}:24: history[1].date: "), problem
    assert "2034-04-13 is earlier than the entry before it ('Withdrawn', 2034-04-20)" in problem
    assert "oldest first" in problem


def test_entries_of_one_date_keep_their_order(catalogue):
    same_day = WITHDRAWN.replace("2034-04-20", "2034-04-13")
    (ev,) = load_catalogue(catalogue({"ev.yaml": event(FIRST + same_day)})).events
    assert [h.label for h in ev.history] == ["First look", "Withdrawn"]


def test_the_status_should_agree_with_the_latest_change(catalogue):
    folder = catalogue({"ev.yaml": event(FIRST + WITHDRAWN, status="confirmed")})
    (warning,) = load_catalogue(folder).warnings
    text = str(warning)
    assert text.startswith(f"{folder / 'ev.yaml'}:4: status: "), text
    assert "'confirmed'" in text and "history[1], 'Withdrawn'" in text and "'retracted'" in text


def test_the_demo_retraction_is_dated():
    loaded = load_catalogue(demo_dir())
    (ev,) = [e for e in loaded.events if e.id == "MER34-007"]
    assert ev.status == "retracted" and ev.history[-1].status == "retracted"
    assert ev.history[-1].estimate is None
    assert ev.history[0].estimate == ev.estimate  # the first report is the current estimate
    assert loaded.warnings == ()


def test_licence_and_citation_are_settings(catalogue):
    settings = "title: A season\nlicence: CC BY 4.0\ncitation: |\n  The *season* catalogue.\n"
    loaded = load_catalogue(catalogue({"catalogue.yaml": settings, "a.yaml": VALID_EVENT}))
    assert loaded.settings.licence == "CC BY 4.0"
    assert loaded.settings.citation == "The *season* catalogue."


def test_a_licence_is_one_line_of_text(catalogue):
    settings = "title: A season\nlicence: [CC, BY]\n"
    folder = catalogue({"catalogue.yaml": settings, "a.yaml": VALID_EVENT})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'catalogue.yaml'}:2: licence: "), problem
