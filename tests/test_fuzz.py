"""Fuzzing: mutated event files through the loader, random valid events through the physics.

The loader may only succeed or raise :class:`InputError`; any other exception is a bug. Valid
estimates drawn at random must derive without an exception and without a non-finite summary.
"""

from __future__ import annotations

import copy
import json
import math
import re
from pathlib import Path

import yaml
from helpers import VALID_EVENT
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from factsheet.api import derive
from factsheet.errors import InputError
from factsheet.load import load_event
from factsheet.load.scalars import parse_time
from factsheet.load.yaml_lines import YamlProblem, read_yaml, written
from factsheet.model import Limits, Settings

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


# -- issue 11: text, YAML scalars, times, aliases and distances ---------------------------------

BAD_TEXT = re.compile("[\x00-\x08\x0b-\x1f\x7f-\x9f\ud800-\udfff]")
TEXT_KEYS = (
    ("title", "title: {}"),
    ("summary", "summary: {}"),
    ("network", "  network: [A1, {}]"),
    ("caveat", "caveats: [{}]"),
)


def _texts(event) -> list[str]:
    return [event.title, event.summary, *event.detection.network, *event.caveats]


@settings(
    max_examples=150, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture]
)
@given(
    text=st.text(
        st.characters(codec=None, categories=("Cc", "Cs", "Zl", "Zp", "L", "N", "P")),
        min_size=1,
        max_size=30,
    ),
    where=st.sampled_from(TEXT_KEYS),
)
def test_no_control_character_or_surrogate_gets_through(tmp_path, text, where):
    # the text is written as a double-quoted YAML scalar with JSON escapes (\u001b, \ud800, ...)
    name, line = where
    quoted = json.dumps(text, ensure_ascii=True)
    body = VALID_EVENT.replace("title: A test pair", "title: T")
    if name == "network":
        body = body.replace("  network: [A1, B1]", line.format(quoted))
    else:
        body = body.replace("summary: A *test* event.\n", "") + line.format(quoted) + "\n"
    path = tmp_path / "event.yaml"
    path.write_text(body, encoding="ascii")
    problems: list = []
    event = load_event(path, path.parent, SETTINGS, problems)
    if event is None:
        assert problems and all(p.line for p in problems), problems
        return
    assert not any(BAD_TEXT.search(t) for t in _texts(event)), _texts(event)


# YAML 1.2.2 specification, section 10.3.2 (core schema), transcribed for the check
SPEC_NULL = re.compile(r"(?:null|Null|NULL|~|)\Z")
SPEC_BOOL = re.compile(r"(?:true|True|TRUE|false|False|FALSE)\Z")
SPEC_INT = re.compile(r"(?:[-+]?[0-9]+|0o[0-7]+|0x[0-9a-fA-F]+)\Z")
SPEC_FLOAT = re.compile(
    r"(?:[-+]?(?:\.[0-9]+|[0-9]+(?:\.[0-9]*)?)(?:[eE][-+]?[0-9]+)?"
    r"|[-+]?\.(?:inf|Inf|INF)|\.(?:nan|NaN|NAN))\Z"
)


@settings(max_examples=300, deadline=None)
@given(plain=st.text(st.sampled_from("0123456789+-.:_eExXoOabfnNtTrRuUlLsSyYiI~"), max_size=8))
def test_plain_scalars_resolve_as_the_core_schema_says(plain):
    try:
        data = read_yaml(f"k: {plain}\n".encode())
    except YamlProblem:
        return  # not a plain scalar at all (": " or a leading indicator), refused cleanly
    if not isinstance(data, dict) or "k" not in data or len(data) != 1:
        return  # e.g. "k: :" parses as another shape: nothing to compare
    got = data["k"]
    if SPEC_NULL.match(plain):
        assert got is None
    elif SPEC_BOOL.match(plain):
        assert got is (plain.lower() == "true")
    elif SPEC_INT.match(plain):
        assert isinstance(got, int) and not isinstance(got, bool) and written(got) == plain
    elif SPEC_FLOAT.match(plain):
        assert isinstance(got, float) and written(got) == plain
    else:
        assert got == plain.strip()  # text, exactly as written


@settings(max_examples=300, deadline=None)
@given(
    fields=st.tuples(
        st.integers(1, 10000),
        st.integers(0, 13),
        st.integers(0, 32),
        st.integers(0, 24),
        st.integers(0, 60),
        st.integers(0, 61),
    )
)
def test_a_time_is_refused_or_read_as_written(fields):
    year, month, day, hour, minute, second = fields
    text = f"{year:04d}-{month:02d}-{day:02d}T{hour:02d}:{minute:02d}:{second:02d}"
    try:
        got = parse_time(text)
    except ValueError:  # Bad, or astropy's own refusal
        return
    assert 1960 <= year <= 9999
    ymdhms = got.ymdhms
    assert [int(ymdhms[k]) for k in ("year", "month", "day", "hour", "minute", "second")] == list(
        fields
    )


@st.composite
def alias_documents(draw) -> str:
    """Anchored lists that repeat each other through aliases, as a YAML document."""
    rows = [f"a0: &a0 [{draw(st.text('xyz', min_size=1, max_size=50))}]"]
    for i in range(1, draw(st.integers(1, 8))):
        refs = [f"*a{draw(st.integers(0, i - 1))}" for _ in range(draw(st.integers(1, 9)))]
        rows.append(f"a{i}: &a{i} [{', '.join(refs)}]")
    return "\n".join(rows) + "\n"


def _characters(value) -> int:
    if isinstance(value, dict):
        return 1 + sum(len(str(k)) + 1 + _characters(v) for k, v in value.items())
    if isinstance(value, list):
        return 1 + sum(_characters(v) for v in value)
    return len(str(value)) + 1


@settings(max_examples=200, deadline=None)
@given(document=alias_documents())
def test_what_aliases_expand_to_stays_within_the_size_limit(document):
    limits = Limits(max_file_bytes=5_000)
    try:
        data = read_yaml(document.encode(), limits)
    except YamlProblem as exc:
        assert "expands to more than 5000 characters" in str(exc) and exc.line
        return
    assert _characters(data) <= limits.max_file_bytes


@settings(max_examples=25, deadline=None)
@given(
    exponent=st.floats(-12, 8),
    spread=st.floats(0, 0.9),
    unit=st.sampled_from(["Mpc", "Gpc", "pc", "kpc"]),
)
def test_a_distance_that_loads_derives(tmp_path_factory, exponent, spread, unit):
    d = 10**exponent
    text = f"{d:.6g} +{d * spread:.6g} -{d * spread * 0.9:.6g} {unit}"
    path = tmp_path_factory.mktemp("d") / "event.yaml"
    path.write_text(VALID_EVENT.replace("440 +180 -170 Mpc", text), encoding="utf-8")
    problems: list = []
    event = load_event(path, path.parent, SETTINGS, problems)
    if event is None:
        assert any("beyond" in p.message or "out of range" in p.message for p in problems)
        return
    result = derive(path, Settings(samples=200))
    assert 0 < result.summary("redshift").high <= 1000
