"""Counterpart candidates in an event file: each problem names the file, line and key."""

import astropy.units as u
import pytest
from helpers import VALID_EVENT, write_catalogue

from factsheet.errors import InputError
from factsheet.load import load_catalogue


def load(tmp_path, block: str):
    return load_catalogue(write_catalogue(tmp_path, {"e.yaml": VALID_EVENT + block}))


def problems(tmp_path, block: str) -> list[str]:
    with pytest.raises(InputError) as caught:
        load(tmp_path, block)
    return [str(p) for p in caught.value.problems]


def test_candidates_are_read_with_units(tmp_path):
    catalogue = load(
        tmp_path,
        "counterpart_candidates:\n"
        '  - {name: F-1, ra: 3.15 hourangle, dec: -21.6 deg, time: "2034-04-25T03:00"}\n'
        "  - name: F-2\n    ra: 10 deg\n    dec: 0 deg\n"
        '    time: "2034-04-26T03:00"\n    note: A *flare*.\n',
    )
    first, second = catalogue.events[0].counterpart_candidates
    # 3.15 hours of right ascension are 47.25 degrees (15 degrees an hour, by definition)
    assert first.ra.to_value(u.deg) == pytest.approx(47.25)
    assert second.note == "A *flare*." and second.time.utc.isot.startswith("2034-04-26T03:00")


@pytest.mark.parametrize(
    ("block", "where", "words"),
    [
        (
            "counterpart_candidates: [a flash]\n",
            "19: counterpart_candidates[0]",
            "expected a mapping",
        ),
        ("counterpart_candidates: {name: x}\n", "19: counterpart_candidates", "expected a list"),
        (
            'counterpart_candidates:\n  - {name: F, ra: 360 deg, dec: 0 deg, time: "2034-05-01"}\n',
            "20: counterpart_candidates[0].ra",
            "out of range",
        ),
        (
            'counterpart_candidates:\n  - {name: F, ra: 10 deg, dec: 91 deg, time: "2034-05-01"}\n',
            "20: counterpart_candidates[0].dec",
            "out of range",
        ),
        (
            'counterpart_candidates:\n  - {name: F, ra: 10, dec: 1 deg, time: "2034-05-01"}\n',
            "20: counterpart_candidates[0].ra",
            "missing unit",
        ),
        (
            "counterpart_candidates:\n  - {name: F, ra: 10 deg, dec: 1 deg}\n",
            "20: counterpart_candidates[0].time",
            "missing required key",
        ),
        (
            'counterpart_candidates:\n  - {name: F, ra: 1 deg, dec: 1 deg, time: "2034-05-01"}\n'
            '  - {name: F, ra: 2 deg, dec: 1 deg, time: "2034-05-02"}\n',
            "21: counterpart_candidates[1].name",
            "a second candidate of this name",
        ),
        (
            "counterpart_candidates:\n"
            + "".join(
                f'  - {{name: F{i}, ra: 1 deg, dec: 1 deg, time: "2034-05-01"}}\n'
                for i in range(21)
            ),
            "19: counterpart_candidates",
            "at most 20",
        ),
    ],
)
def test_each_problem_names_file_line_and_key(tmp_path, block, where, words):
    (problem,) = problems(tmp_path, block)
    assert f"e.yaml:{where}: " in problem and words in problem, problem
