"""Errors that point at the fix: what a person typed, the line and key it is on, what to write.

Each case is a slip a new user makes (issue of the first hour): the empty scaffold, a ± interval,
an unquoted number where a time goes, one space too many, a rate in words, a unit spelled as
people say it.
"""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pytest
from helpers import VALID_EVENT

from factsheet.errors import InputError
from factsheet.load import load_catalogue
from factsheet.load.scaffold import write_new_event
from factsheet.load.values import parse_interval


def problems_of(folder: Path) -> list[str]:
    with pytest.raises(InputError) as info:
        load_catalogue(folder)
    return [str(p) for p in info.value.problems]


@pytest.mark.parametrize("text", ["30 ± 5 Msun", "30 +/- 5 Msun", "30 ±5 Msun", "30+-5 Msun"])
def test_a_symmetric_interval_reads_as_plus_and_minus(text):
    value = parse_interval(text)
    assert (value.median, value.plus, value.minus, value.unit.to_string()) == (
        30,
        5,
        5,
        "solMass",
    )


@pytest.mark.parametrize(
    ("typed", "instead"),
    [("ly", "lyr"), ("solar mass", "Msun"), ("solar masses", "Msun"), ("years", "yr")],
)
def test_a_unit_spelled_as_people_say_it_gets_the_astropy_spelling(typed, instead):
    with pytest.raises(ValueError, match=f"write '{instead}'"):
        parse_interval(f"440 +180 -170 {typed}")


def test_the_empty_scaffold_names_each_empty_value_on_its_own_line(tmp_path):
    folder = tmp_path / "cat"
    folder.mkdir()
    lines = write_new_event("TEST-9", folder).read_text(encoding="utf-8").splitlines()
    found = problems_of(folder)
    for key in ("time", "mass", "distance"):
        where = [i + 1 for i, line in enumerate(lines) if line.strip().startswith(f"{key}:")]
        for line in where:
            assert any(f":{line}: " in p and "empty: write a value, e.g." in p for p in found), (
                key,
                line,
                found,
            )
    assert not any("missing required key" in p for p in found)


def test_a_time_read_as_a_number_says_to_quote_it(catalogue):
    folder = catalogue({"a.yaml": VALID_EVENT.replace('"2034-04-12T07:26:41.2"', "2034")})
    (problem,) = problems_of(folder)
    assert ":3: time: YAML read this value as the number 2034: write the time in quotes" in problem


def test_one_space_too_many_is_explained_in_words(catalogue):
    text = VALID_EVENT.replace("  heavier:\n    mass", "  heavier:\n     mass")
    (problem,) = problems_of(catalogue({"a.yaml": text}))
    assert ":12: " in problem and "line 12 is indented 5 spaces and line 13 below it 4" in problem
    assert "block end" not in problem


def test_a_line_indented_under_a_value_is_explained_in_words(catalogue):
    text = VALID_EVENT.replace("    spin: 0.1 +0.2 -0.2", "      spin: 0.1 +0.2 -0.2")
    (problem,) = problems_of(catalogue({"a.yaml": text}))
    assert "line 13 is indented 6 spaces, more than line 12 above it (4)" in problem


def test_a_rate_in_words_lists_the_accepted_forms_once(catalogue):
    text = VALID_EVENT.replace("1 / 80 yr", "once per 500 years")
    (problem,) = problems_of(catalogue({"a.yaml": text}))
    assert "'COUNT / TIME'" in problem and problem.count("1 / 80 yr") == 1


def test_counts_are_grammatical(catalogue, tmp_path):
    folder = catalogue({"a.yaml": VALID_EVENT})
    run = [sys.executable, "-m", "factsheet.cli"]
    checked = subprocess.run([*run, "check", str(folder)], capture_output=True, text=True)
    assert "1 event, no problems found" in checked.stdout
    built = subprocess.run(
        [*run, "build", str(folder), "-o", str(tmp_path / "out"), "--jobs", "1"],
        capture_output=True,
        text=True,
    )
    assert "built 1 fact sheet (" in built.stdout, built.stdout + built.stderr
