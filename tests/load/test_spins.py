"""Spins as vectors and the precession spin in the input (format version 2, section 4):
ranges and the rules that tie the spin keys together, each error naming file, line and key."""

from pathlib import Path

import numpy as np
import pytest
from helpers import VALID_EVENT

from factsheet.errors import InputError
from factsheet.load import load_catalogue
from factsheet.load.samples import read_samples

HEAVIER_SPIN = "    spin: 0.1 +0.2 -0.2\n"
LIGHTER_SPIN = "    spin: 0.0 +0.3 -0.3\n"
VECTOR = "    spin_magnitude: 0.6 +0.3 -0.4\n    tilt: 70 +40 -40 deg\n"
DISTANCE = "  distance: 440 +180 -170 Mpc\n"


def _event(heavier: str = HEAVIER_SPIN, lighter: str = LIGHTER_SPIN, extra: str = "") -> str:
    text = VALID_EVENT.replace(HEAVIER_SPIN, heavier).replace(LIGHTER_SPIN, lighter)
    return text.replace(DISTANCE, DISTANCE + extra)


def _problems(folder: Path) -> list[str]:
    with pytest.raises(InputError) as info:
        load_catalogue(folder)
    return [str(p) for p in info.value.problems]


def test_spin_vectors_and_precession_spin_load(catalogue):
    folder = catalogue({"a.yaml": _event(VECTOR, VECTOR.replace("70 +40", "110 +40"))})
    (event,) = load_catalogue(folder).events
    assert event.estimate["heavier.tilt"].median == 70 and event.estimate.heavier.spin is None
    assert event.estimate["lighter.spin_magnitude"].median == 0.6
    text = _event(extra="  precession_spin: 0.5 +0.3 -0.3\n").replace("TEST-1", "TEST-2")
    folder = catalogue({"b.yaml": text})
    (event,) = [e for e in load_catalogue(folder).events if e.id == "TEST-2"]
    assert event.estimate["precession_spin"].median == 0.5


def test_tilt_in_radians_is_kept_in_degrees(catalogue):
    vector = "    spin_magnitude: 0.6 +0.3 -0.4\n    tilt: 1.5 +0.5 -0.5 rad\n"
    (event,) = load_catalogue(catalogue({"a.yaml": _event(vector)})).events
    assert event.estimate["heavier.tilt"].median == pytest.approx(np.degrees(1.5), rel=1e-12)


@pytest.mark.parametrize(
    ("heavier", "extra", "line", "key", "words"),
    [
        (
            HEAVIER_SPIN + "    tilt: 30 +10 -10 deg\n",
            "",
            14,
            "estimate.heavier.tilt",
            "give either spin (the aligned component) or spin_magnitude with tilt, not both",
        ),
        (
            "    spin_magnitude: 0.5 +0.2 -0.2\n",
            "",
            13,
            "estimate.heavier.spin_magnitude",
            "a spin magnitude needs its tilt (e.g. tilt: 60 +40 -40 deg)",
        ),
        (
            "    tilt: 30 +10 -10 deg\n",
            "",
            13,
            "estimate.heavier.tilt",
            "a tilt needs its spin magnitude (e.g. spin_magnitude: 0.4 +0.4 -0.3)",
        ),
        (
            "    spin_magnitude: 0.5 +0.2 -0.2\n    tilt: 30 +160 -10 deg\n",
            "",
            14,
            "estimate.heavier.tilt",
            "upper bound value 190 out of range (expected >= 0 and <= 180; 0 deg is along the "
            "orbit, 180 deg against it)",
        ),
        (
            "    spin_magnitude: 0.5 +0.2 -0.2\n    tilt: 30 +10 -10\n",
            "",
            14,
            "estimate.heavier.tilt",
            "missing unit (expected an angle, e.g. 60 +40 -40 deg)",
        ),
        (
            "    spin_magnitude: 0.9 +0.2 -0.2\n    tilt: 30 +10 -10 deg\n",
            "",
            13,
            "estimate.heavier.spin_magnitude",
            "upper bound value 1.1 out of range (expected >= 0 and <= 1)",
        ),
        (
            "    spin_magnitude: 0.5 +0.2 -0.2\n    tilt: 30 +10 -10 deg\n",
            "  precession_spin: 0.3 +0.1 -0.1\n",
            19,
            "estimate.precession_spin",
            "the tilts already give the in-plane spins: leave precession_spin out",
        ),
        (
            "    spin: 0.8 +0.1 -0.1\n",
            "  precession_spin: 0.7 +0.1 -0.1\n",
            18,
            "estimate.precession_spin",
            "a precession spin of 0.7 with the heavier body's aligned spin 0.8 makes its spin "
            "1.06, above 1 (the precession spin is carried by the heavier body: expected at "
            "most 0.6 at the median)",
        ),
    ],
)
def test_spin_rules_name_file_line_and_key(catalogue, heavier, extra, line, key, words):
    folder = catalogue({"ev.yaml": _event(heavier, extra=extra)})
    (problem,) = _problems(folder)
    assert problem.startswith(f"{folder / 'ev.yaml'}:{line}: {key}: "), problem
    assert words in problem, problem


def test_effective_spin_with_a_spin_vector_is_refused(catalogue):
    folder = catalogue({"ev.yaml": _event(VECTOR, "", extra="  effective_spin: 0.1 +0.1 -0.1\n")})
    (problem,) = _problems(folder)
    assert "estimate.effective_spin: give either effective_spin or the bodies' spin" in problem


HEADER = "heavier.mass [Msun],lighter.mass [Msun],distance [Mpc]"


def test_samples_file_spin_vector_columns(tmp_path):
    path = tmp_path / "s.csv"
    path.write_text(
        f"{HEADER},heavier.spin_magnitude,heavier.tilt [rad],lighter.spin_magnitude,"
        "lighter.tilt [deg],precession_spin\n"
        "20,30,400,0.5,0.0,0.25,180,0.3\n"
        "30,20,400,0.5,1.0,0.25,90,0.4\n"
    )
    with pytest.raises(InputError, match="precession_spin: the tilt columns already give"):
        read_samples(path)
    text = path.read_text().replace(",precession_spin", "").replace(",0.3\n", "\n")
    path.write_text(text.replace(",0.4\n", "\n"))
    s = read_samples(path).values
    # relabelled heavier-first in the first row: the spin vectors follow their bodies
    assert s["heavier.mass"].tolist() == [30.0, 30.0]
    assert s["heavier.spin_magnitude"].tolist() == [0.25, 0.5]
    assert s["heavier.tilt"] == pytest.approx([180.0, np.degrees(1.0)], rel=1e-12)
    assert s["lighter.tilt"] == pytest.approx([0.0, 90.0], abs=1e-12)  # 0 deg is allowed


@pytest.mark.parametrize(
    ("columns", "row", "words"),
    [
        (",heavier.spin,heavier.spin_magnitude", ",0.1,0.2", "give either heavier.spin or"),
        (",lighter.spin_magnitude", ",0.2", "lighter.spin_magnitude: needs the column"),
        (",heavier.tilt [deg]", ",200", "value 200 outside the physical range"),
    ],
)
def test_samples_file_spin_vector_rules(tmp_path, columns, row, words):
    path = tmp_path / "s.csv"
    path.write_text(f"{HEADER}{columns}\n30,20,400{row}\n")
    if "tilt [deg]" in columns:  # a lone tilt is refused for the pair first; give its magnitude
        path.write_text(f"{HEADER}{columns},heavier.spin_magnitude\n30,20,400{row},0.5\n")
    with pytest.raises(InputError) as info:
        read_samples(path)
    (problem,) = [str(p) for p in info.value.problems]
    assert words in problem, problem
