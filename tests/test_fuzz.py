"""Fuzzing: mutated event files through the loader, random valid events through the physics.

The loader may only succeed or raise :class:`InputError`; any other exception is a bug. Valid
estimates drawn at random must derive without an exception and without a non-finite summary.
"""

from __future__ import annotations

import copy
import math
from pathlib import Path

import yaml
from helpers import VALID_EVENT
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from factsheet.api import derive
from factsheet.errors import InputError
from factsheet.load import load_event
from factsheet.model import Settings

BASE = yaml.safe_load(VALID_EVENT)
SETTINGS = Settings()
ODD_NUMBERS = st.one_of(
    st.floats(allow_nan=True, allow_infinity=True),
    st.integers(min_value=-(10**400), max_value=10**400),
    st.sampled_from([0, -0.0, 1e308, -1e-320, True, None]),
)
ODD_VALUES = st.one_of(
    ODD_NUMBERS,
    st.text(max_size=40),
    st.lists(st.integers(), max_size=3),
    st.dictionaries(st.text(max_size=5), st.integers(), max_size=3),
    st.builds(
        lambda x, unit: f"{x} {unit}",
        ODD_NUMBERS,
        st.sampled_from(["Msun", "Mpc", "kg", "", "dex(Msun)", "m**9"]),
    ),
)


def _load(path: Path) -> None:
    try:
        load_event(path, path.parent, SETTINGS, problems := [])
    except InputError:
        return
    assert all(p.file == path or Path(p.file).parent == path.parent for p in problems)


#: The mappings of an event whose keys are mutated: the top level and the nested sections.
SECTIONS = ((), ("detection",), ("estimate",), ("estimate", "heavier"), ("estimate", "lighter"))


def _section(data: dict, path: tuple[str, ...]) -> object:
    for name in path:
        data = data.get(name) if isinstance(data, dict) else None
    return data


@st.composite
def mutated(draw) -> bytes:
    """A valid event with keys deleted, duplicated, retyped or renamed, maybe truncated."""
    data = copy.deepcopy(BASE)
    for _ in range(draw(st.integers(1, 4))):
        target = _section(data, draw(st.sampled_from(SECTIONS)))
        if not isinstance(target, dict) or not target:
            continue
        key = draw(st.sampled_from(sorted(target, key=str)))
        action = draw(st.sampled_from(["delete", "retype", "rename"]))
        if action == "delete":
            del target[key]
        elif action == "retype":
            target[key] = draw(ODD_VALUES)
        else:
            target[draw(st.text(min_size=1, max_size=12))] = target.pop(key)
    text = yaml.safe_dump(data, allow_unicode=True, sort_keys=False).encode()
    if draw(st.booleans()):
        text += text.splitlines(keepends=True)[draw(st.integers(0, 3))]  # a duplicated key
    if draw(st.booleans()):
        text = text[: draw(st.integers(0, len(text)))]
    return text


@settings(
    max_examples=200, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture]
)
@given(content=mutated())
def test_mutated_event_files_give_clean_errors(tmp_path, content):
    path = tmp_path / "event.yaml"
    path.write_bytes(content)
    _load(path)


@settings(
    max_examples=100, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture]
)
@given(content=st.binary(max_size=300) | st.text(max_size=300).map(str.encode))
def test_random_bytes_give_clean_errors(tmp_path, content):
    path = tmp_path / "event.yaml"
    path.write_bytes(VALID_EVENT.encode()[:200] + content)
    _load(path)


def _interval(draw, low, high, unit):
    median = draw(st.floats(low, high))
    plus = draw(st.floats(0, 0.3 * median if median > 0 else 0.3))
    minus = draw(st.floats(0, 0.3 * abs(median)))
    return f"{median:.6g} +{plus:.6g} -{minus:.6g} {unit}".strip()


@st.composite
def valid_events(draw) -> dict:
    """Random estimates inside the documented calibration ranges of the fits."""
    m1 = draw(st.floats(1.2, 150.0))
    m2 = draw(st.floats(max(1.0, m1 / 18), m1))  # mass ratio up to 18 (Keitel et al. 2017)
    heavier = {"mass": f"{m1:.6g} +{0.1 * m1:.4g} -{0.1 * m1:.4g} Msun"}
    lighter = {"mass": f"{m2:.6g} Msun"}
    estimate = {
        "heavier": heavier,
        "lighter": lighter,
        "distance": _interval(draw, 10.0, 8000.0, "Mpc"),
    }
    if draw(st.booleans()):
        estimate["effective_spin"] = f"{draw(st.floats(-0.9, 0.9)):.3f}"
    else:
        heavier["spin"] = f"{draw(st.floats(-0.95, 0.95)):.3f} +0.05 -0.05"
        lighter["spin"] = f"{draw(st.floats(-0.95, 0.95)):.3f}"
    frame = draw(st.sampled_from(["source", "detector"]))
    return {"id": "FZ-1", "time": "2034-01-01T00:00:00", "frame": frame, "estimate": estimate}


@settings(max_examples=30, deadline=None)
@given(event=valid_events())
def test_random_valid_events_derive_finite_summaries(event):
    result = derive(event, Settings(samples=400))
    assert result.quantities
    for name, summary in result.quantities.items():
        for x in (summary.median, summary.low, summary.high):
            assert math.isfinite(x), (name, summary)
