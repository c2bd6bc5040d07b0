"""The chirp mass and the mass ratio in an estimate: what loads, what is refused, what warns.

The chirp mass and mass ratio of two masses are definitions: Mc = (m1 m2)^(3/5)/(m1 + m2)^(1/5)
(Cutler & Flanagan 1994, PRD 49, 2658) and q = m2/m1 <= 1. For the test event's masses 36 and
29 Msun they are 28.10 Msun and 0.806; for 30 and 20 Msun, 21.24 Msun (computed from those
definitions with a calculator).
"""

import pytest
from helpers import VALID_EVENT

from factsheet.errors import InputError
from factsheet.load import load_catalogue

HEAVIER = "    mass: 36 +5 -4 Msun\n"
LIGHTER = "    mass: 29 +4 -5 Msun\n"
DISTANCE = "  distance: 440 +180 -170 Mpc\n"


def event(*edits: tuple[str, str]) -> str:
    text = VALID_EVENT
    for old, new in edits:
        assert old in text
        text = text.replace(old, new)
    return text


def problems(catalogue, text: str) -> list[str]:
    with pytest.raises(InputError) as info:
        load_catalogue(catalogue({"ev.yaml": text}))
    return [str(p) for p in info.value.problems]


def warnings(catalogue, text: str) -> list[str]:
    return [str(w) for w in load_catalogue(catalogue({"ev.yaml": text})).warnings]


def test_chirp_mass_and_mass_ratio_load_without_the_masses(catalogue):
    text = event(
        (HEAVIER, ""),
        (LIGHTER, ""),
        (DISTANCE, DISTANCE + "  chirp_mass: 28.1 +1.1 -1.0 Msun\n  mass_ratio: 0.8 +0.15 -0.25\n"),
    )
    (loaded,) = load_catalogue(catalogue({"ev.yaml": text})).events
    e = loaded.estimate
    assert e.heavier.mass is None and e.lighter.mass is None
    assert e.heavier.spin is not None  # a body may hold its spin alone
    assert (e.chirp_mass.median, e.chirp_mass.low, e.chirp_mass.high) == pytest.approx(
        (28.1, 27.1, 29.2)
    )
    assert e.mass_ratio.median == 0.8 and "chirp_mass" in e.values()


def test_chirp_mass_alone_loads_and_a_whole_body_may_be_left_out(catalogue):
    text = event(
        ("  heavier:\n" + HEAVIER + "    spin: 0.1 +0.2 -0.2\n", ""),
        (LIGHTER, ""),
        (DISTANCE, DISTANCE + "  chirp_mass: 28.1 +1.1 -1.0 Msun\n"),
    )
    (loaded,) = load_catalogue(catalogue({"ev.yaml": text})).events
    assert loaded.estimate.heavier.mass is None and loaded.estimate.mass_ratio is None


@pytest.mark.parametrize(
    ("edits", "key", "words"),
    [
        # q is lighter / heavier: above 0, at most 1
        (
            [(DISTANCE, DISTANCE + "  chirp_mass: 28 Msun\n  mass_ratio: 1.2\n")],
            "estimate.mass_ratio",
            "out of range",
        ),
        (
            [(DISTANCE, DISTANCE + "  chirp_mass: 28 Msun\n  mass_ratio: 0\n")],
            "estimate.mass_ratio",
            "out of range",
        ),
        (
            [(DISTANCE, DISTANCE + "  chirp_mass: 28 Msun\n  mass_ratio: 0.8 +0.3 -0.1\n")],
            "estimate.mass_ratio",
            "out of range",
        ),
        ([(DISTANCE, DISTANCE + "  chirp_mass: 28 Mpc\n")], "estimate.chirp_mass", "mass"),
        ([(DISTANCE, DISTANCE + "  chirp_mass: -28 Msun\n")], "estimate.chirp_mass", "range"),
        (
            [(DISTANCE, DISTANCE + "  mass_ratio: 0.8\n")],
            "estimate.mass_ratio",
            "a mass ratio needs the chirp mass",
        ),
        (
            [(LIGHTER, ""), (DISTANCE, DISTANCE + "  chirp_mass: 28 Msun\n")],
            "estimate.heavier.mass",
            "both bodies' masses or neither",
        ),
        ([(HEAVIER, ""), (LIGHTER, "")], "estimate.heavier.mass", "or give chirp_mass"),
    ],
)
def test_mass_keys_refused(catalogue, edits, key, words):
    found = problems(catalogue, event(*edits))
    assert any(f": {key}: " in p and words in p for p in found), found


def test_masses_that_agree_with_the_chirp_mass_give_no_warning(catalogue):
    # Mc(36, 29) = 28.10 Msun and q = 0.806 (definitions, see the module)
    text = event(
        (DISTANCE, DISTANCE + "  chirp_mass: 28.1 +1.1 -1.0 Msun\n  mass_ratio: 0.8 +0.15 -0.25\n")
    )
    assert warnings(catalogue, text) == []


@pytest.mark.parametrize(
    ("added", "key", "value"),
    [
        ("  chirp_mass: 31.2 +1.1 -1.0 Msun\n", "estimate.chirp_mass", "chirp mass of 28.1 Msun"),
        (
            "  chirp_mass: 28.1 +1.1 -1.0 Msun\n  mass_ratio: 0.5 +0.1 -0.1\n",
            "estimate.mass_ratio",
            "0.8056",
        ),
    ],
)
def test_masses_that_disagree_with_the_chirp_mass_warn(catalogue, added, key, value):
    (warning,) = warnings(catalogue, event((DISTANCE, DISTANCE + added)))
    assert f":18: {key}: " in warning or f":19: {key}: " in warning, warning
    assert value in warning and "fix one, or leave the masses out" in warning


def test_history_estimates_are_checked_too(catalogue):
    text = VALID_EVENT + (
        'history:\n  - date: "2034-04-13"\n    label: early\n    estimate:\n'
        "      heavier: {mass: 30 +3 -3 Msun}\n      lighter: {mass: 20 +3 -3 Msun}\n"
        "      chirp_mass: 30 +1 -1 Msun\n      distance: 400 +100 -100 Mpc\n"
    )
    (warning,) = warnings(catalogue, text)
    assert "history[0].estimate.chirp_mass" in warning and "21.24 Msun" in warning
