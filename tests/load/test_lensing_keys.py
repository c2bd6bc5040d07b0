"""The ``what_if_lensed`` keys of an event file and of ``catalogue.yaml``: read as a short list
of magnifications above 1, every bad value reported with its file, line and key."""

import pytest
from helpers import VALID_EVENT, write_catalogue

from factsheet.errors import InputError
from factsheet.load import load_catalogue


def problems_of(folder) -> list[str]:
    with pytest.raises(InputError) as info:
        load_catalogue(folder)
    return [str(p) for p in info.value.problems]


def test_event_and_catalogue_lists_are_read(catalogue):
    event = VALID_EVENT + "what_if_lensed: [100, 4.5]\n"
    folder = catalogue({"catalogue.yaml": "what_if_lensed: [9]\n", "a.yaml": event})
    cat = load_catalogue(folder)
    assert cat.settings.what_if_lensed == (9.0,)
    assert cat.events[0].what_if_lensed == (4.5, 100.0)


def test_defaults(catalogue):
    cat = load_catalogue(catalogue({"a.yaml": VALID_EVENT}))
    assert cat.settings.what_if_lensed == (4.0, 25.0, 100.0)
    assert cat.events[0].what_if_lensed is None


def test_empty_list_is_no_panel(catalogue):
    folder = catalogue({"catalogue.yaml": "what_if_lensed: []\n", "a.yaml": VALID_EVENT})
    assert load_catalogue(folder).settings.what_if_lensed == ()


@pytest.mark.parametrize(
    ("value", "message"),
    [
        ("[1]", "not above 1"),
        ("[0]", "not above 1"),
        ("[4, .nan]", "must be finite"),
        ("[4, 4]", "listed twice"),
        ("[2, 3, 4, 5, 6, 7, 8]", "at most 6"),
        ("25", "expected a list of magnifications"),
        ("[four]", "expected a number"),
        ("[1e9]", "above 10000"),
    ],
)
def test_bad_lists_name_file_line_and_key(tmp_path, value, message):
    folder = write_catalogue(
        tmp_path / "one",
        {"catalogue.yaml": f"title: A season\nwhat_if_lensed: {value}\n", "a.yaml": VALID_EVENT},
    )
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'catalogue.yaml'}:2: what_if_lensed: "), problem
    assert message in problem
    folder = write_catalogue(
        tmp_path / "two", {"b.yaml": VALID_EVENT + f"what_if_lensed: {value}\n"}
    )
    (problem,) = problems_of(folder)
    assert f"b.yaml:{VALID_EVENT.count(chr(10)) + 1}: what_if_lensed: " in problem, problem
    assert message in problem
