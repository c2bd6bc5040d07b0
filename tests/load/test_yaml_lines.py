"""The YAML reader: YAML 1.2 core-schema scalars, refused merge keys and tags, characters that
are not text, and the size of a document with its aliases written out.

The expected values of the scalars are those of the YAML 1.2.2 specification, section 10.3
(the core schema) and its example 10.9."""

from __future__ import annotations

import math
import re

import pytest

from factsheet.load.yaml_lines import YamlProblem, bad_character, read_yaml, written
from factsheet.model import Limits


def load(text: str, limits: Limits | None = None) -> object:
    return read_yaml(text.encode("utf-8"), limits or Limits())


@pytest.mark.parametrize(
    ("plain", "value"),
    [
        # YAML 1.2 core schema (spec 1.2.2 §10.3.2): these stay text
        ("on", "on"),
        ("off", "off"),
        ("yes", "yes"),
        ("no", "no"),
        ("y", "y"),
        ("n", "n"),
        ("Yes", "Yes"),
        ("21:24", "21:24"),  # no base-60 numbers
        ("1:30:00", "1:30:00"),
        ("2034-04-12", "2034-04-12"),  # no timestamps
        ("1_000", "1_000"),  # no digit separators
        ("0b101", "0b101"),  # no binary integers
        ("-0x1f", "-0x1f"),  # hexadecimal and octal take no sign
        ("=", "="),
        # booleans and null
        ("true", True),
        ("True", True),
        ("TRUE", True),
        ("false", False),
        ("FALSE", False),
        ("null", None),
        ("Null", None),
        ("~", None),
        ("", None),
        # integers: decimal (a leading zero is not octal), 0o octal, 0x hexadecimal
        ("021", 21),
        ("+12", 12),
        ("-7", -7),
        ("0o17", 15),
        ("0x1f", 31),
        ("0x1F", 31),
        # floats
        ("1.5", 1.5),
        ("1e5", 1e5),
        ("-.5", -0.5),
        ("1.", 1.0),
        (".inf", math.inf),
        ("-.Inf", -math.inf),
        ("+.INF", math.inf),
    ],
)
def test_plain_scalars_follow_the_core_schema(plain, value):
    got = load(f"k: {plain}\n")["k"]
    assert got == value and isinstance(got, type(value))


def test_nan_is_a_float():
    assert math.isnan(load("k: .nan\n")["k"]) and math.isnan(load("k: .NaN\n")["k"])


def test_numbers_keep_the_text_they_were_written_as():
    data = load("a: 007\nb: 0x1f\nc: 1.50\nd: text\n")
    assert [written(data[k]) for k in "abcd"] == ["007", "0x1f", "1.50", "text"]
    assert data["a"] == 7 and data["c"] == 1.5


def test_quoted_and_tagged_scalars_are_text():
    data = load("a: '021'\nb: \"yes\"\nc: !!str 021\n")
    assert data == {"a": "021", "b": "yes", "c": "021"}


@pytest.mark.parametrize(
    ("text", "line", "key"),
    [
        ("base: &b {x: 1}\nthing:\n  <<: *b\n  y: 2\n", 3, "thing"),
        ("a: &b {x: 1}\nc: {<<: *b}\n", 2, "c"),
        ("list:\n  - a: 1\n  - <<: {a: 2}\n", 3, "list[1]"),
        ("x:\n  !!merge k: 1\n", 2, "x"),
    ],
)
def test_merge_keys_are_refused_at_their_line(text, line, key):
    with pytest.raises(YamlProblem, match="merge keys are not supported: write the keys out") as e:
        load(text)
    assert (e.value.line, e.value.key) == (line, key)


def test_a_quoted_double_angle_key_is_an_ordinary_key():
    assert load("'<<': 1\n") == {"<<": 1}


@pytest.mark.parametrize(
    "text", ["a: !!binary aGk=\n", "a: !!set {x}\n", "a: !!timestamp 2034-01-01\n", "a: !x 1\n"]
)
def test_tags_outside_the_core_schema_are_refused(text):
    with pytest.raises(YamlProblem, match="is not supported") as e:
        load(text)
    assert (e.value.line, e.value.key) == (1, "a")


@pytest.mark.parametrize("text", ["a: !!int 1_000\n", "a: !!float one\n", "a: !!bool yes\n"])
def test_explicit_core_tags_must_match_the_core_schema(text):
    with pytest.raises(YamlProblem, match=r"is not a YAML 1\.2"):
        load(text)


@pytest.mark.parametrize(
    ("escape", "words"),
    [
        ("\\e", "U+001B ESC"),
        ("\\x1b", "U+001B ESC"),
        ("\\u001b", "U+001B ESC"),
        ("\\0", "U+0000 NUL"),
        ("\\a", "U+0007"),
        ("\\b", "U+0008"),
        ("\\v", "U+000B"),
        ("\\f", "U+000C"),
        ("\\r", "U+000D carriage return"),
        ("\\x7f", "U+007F DEL"),
        ("\\N", "U+0085 NEL"),
        ("\\x9b", "U+009B"),
        ("\\ud800", "lone surrogate U+D800"),
        ("\\udfff", "lone surrogate U+DFFF"),
    ],
)
def test_control_characters_and_lone_surrogates_are_refused(escape, words):
    text = f'title: ok\nhistory:\n  - label: "bad {escape} text"\n'
    with pytest.raises(YamlProblem, match=re.escape(words)) as e:
        load(text)
    assert (e.value.line, e.value.key) == (3, "history[0].label")


def test_a_control_character_in_a_key_is_refused():
    with pytest.raises(YamlProblem, match="a key contains a control character") as e:
        load('outer:\n  "k\\e[2J": 1\n')
    assert (e.value.line, e.value.key) == (2, "outer")


def test_tab_and_newline_are_text():
    assert load('a: "one\\ttwo\\nthree"\n') == {"a": "one\ttwo\nthree"}
    assert load("a: |\n  one\r\n  two\r\n") == {"a": "one\ntwo\n"}  # CRLF files read as lines


def test_bad_character_names_the_character():
    assert bad_character("fine\ttext\n") is None
    assert "U+001B" in bad_character("\x1b[31m")
    assert "surrogate" in bad_character("\udc80")
    assert "U+0080" in bad_character("\x80")


def test_expanded_size_is_bounded_by_the_file_size_limit():
    # 99 aliases of a 30 000-character text: 3 MB once written out, over the 2 MB default
    big = "x" * 30_000
    text = f"summary: &s {big}\ncaveats:\n" + "  - *s\n" * 99
    with pytest.raises(YamlProblem, match="expands to more than 2000000 characters") as e:
        load(text)
    assert e.value.line == 2 + 66  # the 66th alias takes it past 2 MB
    assert load(text, Limits(max_file_bytes=4_000_000))["caveats"][98] == big


def test_expanded_size_counts_aliases_inside_aliases():
    # each level repeats the one below nine times: 2 * 9**8 leaves, refused early
    rows = ["b0: &b0 [x, x]"] + [f"b{i}: &b{i} [{', '.join([f'*b{i - 1}'] * 9)}]" for i in (1, 2)]
    rows += [f"b{i}: &b{i} [{', '.join([f'*b{i - 1}'] * 9)}]" for i in range(3, 9)]
    with pytest.raises(YamlProblem, match="expands to more than"):
        load("\n".join(rows) + "\n")


def test_aliases_within_the_limits_still_work():
    data = load("a: &a [A1, B1]\nb: *a\nc: *a\n")
    assert data["b"] == data["c"] == ["A1", "B1"]


@pytest.mark.parametrize("text", ["a: &a [*a]\n", "a: &a {b: [*a]}\n"])
def test_an_alias_inside_its_own_anchor_is_refused(text):
    with pytest.raises(YamlProblem, match="refers to the list or mapping that holds it"):
        load(text)


def test_duplicate_keys_and_their_lines_are_still_reported():
    with pytest.raises(YamlProblem, match=r"duplicate key \(first given on line 2\)") as e:
        load("top:\n  snr: 1\n  snr: 2\n")
    assert (e.value.line, e.value.key) == (3, "snr")
