"""Read YAML safely and remember where every key stood (the load stage's YAML reader).

Mappings come back as :class:`LineMap` (a dict that knows the line of each key) and sequences
as :class:`LineList`. Plain scalars follow the YAML 1.2 core schema, so a value means what a
person wrote: ``on``, ``off``, ``yes``, ``no``, ``y`` and ``n`` stay text, ``021`` is 21 (``0o17``
is octal, ``0x1f`` hexadecimal), ``21:24`` stays text (no base-60 numbers), only
``true``/``false`` (any of three capitalisations) are booleans, and timestamps stay text (the
loader parses them with astropy, so ``2034-04-12T07:26:41.2`` keeps its decimal second).
A number keeps the text it was written as (``written``), so a title or a label written ``007``
stays ``007``.

Refused, each with its line and the path of its key: duplicate keys in one mapping, merge keys
(``<<``), tags other than the core schema's, excessive nesting, more aliases than the limit, a
document whose text, counted every time an alias repeats it, exceeds the file-size limit, and
any text (a value or a key) holding a lone surrogate or a control character other than tab and
newline.
"""

from __future__ import annotations

import re
from pathlib import Path
from typing import Any, ClassVar

import yaml
from yaml.events import AliasEvent, CollectionStartEvent, ScalarEvent
from yaml.nodes import MappingNode, Node, ScalarNode

from factsheet.load import files
from factsheet.model import Limits

DEFAULT_LIMITS = Limits()


class YamlProblem(ValueError):
    """A YAML file that cannot be read; ``line`` is 1-based or None."""

    def __init__(self, message: str, line: int | None = None, key: str = ""):
        super().__init__(message)
        self.line = line
        self.key = key


class LineMap(dict):
    """A mapping that records the 1-based line of each key and of itself."""

    line: int | None = None
    lines: dict

    def line_of(self, key: object) -> int | None:
        return self.lines.get(key, self.line)


class LineList(list):
    """A sequence that records the 1-based line of each item and of itself."""

    line: int | None = None
    lines: list

    def line_of(self, index: int) -> int | None:
        return self.lines[index] if 0 <= index < len(self.lines) else self.line


class WrittenInt(int):
    """An integer that remembers the text it was written as (``written``)."""

    written: str


class WrittenFloat(float):
    """A float that remembers the text it was written as (``written``)."""

    written: str


def written(raw: object) -> str:
    """The text a plain value was written as: the string itself, or a number's written form."""
    return getattr(raw, "written", None) or str(raw)


# -- characters ------------------------------------------------------------------------------

_BAD_CHARACTER = re.compile("[\x00-\x08\x0b-\x1f\x7f-\x9f\ud800-\udfff]")
_CONTROL_NAMES = {0x00: "NUL", 0x0D: "carriage return", 0x1B: "ESC", 0x7F: "DEL", 0x85: "NEL"}


def bad_character(text: str) -> str | None:
    """Why ``text`` cannot be used as text, or None: a lone surrogate, or a control character
    other than tab and newline (C0, DEL and C1)."""
    m = _BAD_CHARACTER.search(text)
    if m is None:
        return None
    code = ord(m.group())
    if 0xD800 <= code <= 0xDFFF:
        return f"a lone surrogate U+{code:04X}, which is not a character"
    name = _CONTROL_NAMES.get(code)
    what = f"U+{code:04X} {name}" if name else f"U+{code:04X}"
    return f"a control character ({what}); only tab and newline are allowed in text"


# -- the YAML 1.2 core schema ------------------------------------------------------------------

_NULL = r"(?:~|null|Null|NULL|)"
_BOOL = r"(?:true|True|TRUE|false|False|FALSE)"
_INT = r"(?:[-+]?[0-9]+|0o[0-7]+|0x[0-9a-fA-F]+)"
_FLOAT = (
    r"(?:[-+]?(?:\.[0-9]+|[0-9]+(?:\.[0-9]*)?)(?:[eE][-+]?[0-9]+)?"
    r"|[-+]?\.(?:inf|Inf|INF)|\.(?:nan|NaN|NAN))"
)
CORE_SCHEMA = (  # (tag, pattern of a plain scalar, possible first characters), in order
    ("tag:yaml.org,2002:null", _NULL, ["~", "n", "N", ""]),
    ("tag:yaml.org,2002:bool", _BOOL, list("tTfF")),
    ("tag:yaml.org,2002:int", _INT, list("-+0123456789")),
    ("tag:yaml.org,2002:float", _FLOAT, list("-+.0123456789")),
)
_PATTERNS = {tag: re.compile(rf"{pattern}\Z") for tag, pattern, _ in CORE_SCHEMA}
_TAGS = {"null", "bool", "int", "float", "str", "seq", "map"}
MERGE_KEY = "merge keys are not supported: write the keys out"


def _where(parts: list[object]) -> str:
    """A key path such as ``history[0].estimate.distance``."""
    out = ""
    for part in parts:
        if isinstance(part, int) and not isinstance(part, bool):
            out += f"[{part}]"
        else:
            out += f".{part}" if out else str(part)
    return out


def _make_loader(limits: Limits) -> type[yaml.SafeLoader]:
    class Loader(yaml.SafeLoader):
        # our own tables, not copies of the YAML 1.1 ones that SafeLoader holds
        yaml_implicit_resolvers: ClassVar[dict] = {}
        yaml_constructors: ClassVar[dict] = {}

        def __init__(self, stream: Any) -> None:
            super().__init__(stream)
            self.depth = self.aliases = self.total = 0
            self.open_anchors: set[str] = set()
            self.sizes: dict[int, int] = {}
            self.parts: list[object] = []  # the key path being constructed
            self.reading_key = False

        # -- composing: nesting, aliases and the expanded size --------------------------
        def compose_node(self, parent, index):
            event = self.peek_event()
            line = event.start_mark.line + 1
            if isinstance(event, AliasEvent):
                self.aliases += 1
                if self.aliases > limits.max_aliases:
                    raise YamlProblem(
                        f"more than {limits.max_aliases} YAML aliases (raise the limit in "
                        "catalogue.yaml if this is intended)",
                        line,
                    )
                if event.anchor in self.open_anchors:
                    raise YamlProblem(
                        f"the alias *{event.anchor} refers to the list or mapping that holds it",
                        line,
                    )
                if (target := self.anchors.get(event.anchor)) is not None:
                    self._grow(self._size(target), line)
                return super().compose_node(parent, index)
            self.depth += 1
            if self.depth > limits.max_depth:
                raise YamlProblem(f"nesting deeper than {limits.max_depth} levels", line)
            anchor = event.anchor if isinstance(event, CollectionStartEvent) else None
            if anchor is not None:
                self.open_anchors.add(anchor)
            try:
                node = super().compose_node(parent, index)
            finally:
                self.depth -= 1
                self.open_anchors.discard(anchor or "")
            self._grow(len(event.value) + 1 if isinstance(event, ScalarEvent) else 1, line)
            return node

        def _size(self, node: Node) -> int:
            """The characters of every text under ``node``, aliases expanded, plus one per
            node (the same count :meth:`_grow` keeps for the text as written)."""
            key = id(node)
            if key not in self.sizes:
                if isinstance(node, ScalarNode):
                    size = len(node.value) + 1
                elif isinstance(node, MappingNode):
                    size = 1 + sum(self._size(k) + self._size(v) for k, v in node.value)
                else:
                    size = 1 + sum(self._size(item) for item in node.value)
                self.sizes[key] = size
            return self.sizes[key]

        def _grow(self, size: int, line: int) -> None:
            self.total += size
            if self.total > limits.max_file_bytes:
                raise YamlProblem(
                    f"the document expands to more than {limits.max_file_bytes} characters "
                    "when its aliases are written out (the limit is limits.max_file_bytes in "
                    "catalogue.yaml; write the repeated values out, or raise the limit if this "
                    "is intended)",
                    line,
                )

        # -- constructing ------------------------------------------------------------------
        def _fail(self, node: Node, message: str) -> YamlProblem:
            return YamlProblem(message, node.start_mark.line + 1, _where(self.parts))

        def construct_text(self, node):
            value = self.construct_scalar(node)
            if why := bad_character(value):
                raise self._fail(node, f"{'a key' if self.reading_key else 'text'} contains {why}")
            return value

        def construct_null(self, node):
            self._core(node, "null")
            return None

        def construct_bool(self, node):
            return self._core(node, "bool").lower() == "true"

        def construct_int(self, node):
            text = self._core(node, "int")
            digits = text.lstrip("+-")
            try:
                if digits.startswith(("0o", "0x")):
                    value = WrittenInt(int(digits[2:], 8 if digits[1] == "o" else 16))
                else:
                    value = WrittenInt(int(text, 10))
            except ValueError:  # more digits than Python converts
                raise self._fail(node, f"the number has too many digits ({len(text)})") from None
            value.written = text
            return value

        def construct_float(self, node):
            text = self._core(node, "float")
            lowered = text.lower()
            if lowered.endswith(".nan"):
                value = WrittenFloat("nan")
            elif lowered.endswith(".inf"):
                value = WrittenFloat("-inf" if text.startswith("-") else "inf")
            else:
                value = WrittenFloat(text)
            value.written = text
            return value

        def _core(self, node, name: str) -> str:
            """The text of a scalar tagged ``name``, which must match the core schema."""
            text = self.construct_scalar(node)
            if not _PATTERNS[f"tag:yaml.org,2002:{name}"].match(text):
                raise self._fail(node, f"{text[:40]!r} is not a YAML 1.2 {name}")
            return text

        def construct_unknown(self, node):
            tag = str(node.tag).replace("tag:yaml.org,2002:", "!!")
            raise self._fail(
                node,
                f"the YAML tag {tag[:40]} is not supported (write plain values, lists and "
                "mappings)",
            )

        def construct_mapping(self, node, deep=False):
            result = LineMap()
            result.line, result.lines = node.start_mark.line + 1, {}
            for key_node, value_node in node.value:
                if key_node.tag == "tag:yaml.org,2002:merge" or (
                    isinstance(key_node, ScalarNode)
                    and key_node.style is None
                    and key_node.value == "<<"
                ):
                    raise self._fail(key_node, MERGE_KEY)
                self.reading_key = True
                key = self.construct_object(key_node, deep=True)
                self.reading_key = False
                if not isinstance(key, str | int | float | bool) and key is not None:
                    raise self._fail(key_node, "mapping keys must be plain words")
                if key in result:
                    raise YamlProblem(
                        f"duplicate key (first given on line {result.lines[key]})",
                        key_node.start_mark.line + 1,
                        str(key),
                    )
                self.parts.append(key)
                try:
                    result[key] = self.construct_object(value_node, deep=True)
                finally:
                    self.parts.pop()
                result.lines[key] = key_node.start_mark.line + 1
            return result

        def construct_sequence(self, node, deep=False):
            result = LineList()
            for i, child in enumerate(node.value):
                self.parts.append(i)
                try:
                    result.append(self.construct_object(child, deep=True))
                finally:
                    self.parts.pop()
            result.line = node.start_mark.line + 1
            result.lines = [child.start_mark.line + 1 for child in node.value]
            return result

    for tag, pattern, first in CORE_SCHEMA:
        Loader.add_implicit_resolver(tag, re.compile(rf"{pattern}\Z"), first)
    core = "tag:yaml.org,2002:"
    Loader.add_constructor(f"{core}null", Loader.construct_null)
    Loader.add_constructor(f"{core}bool", Loader.construct_bool)
    Loader.add_constructor(f"{core}int", Loader.construct_int)
    Loader.add_constructor(f"{core}float", Loader.construct_float)
    Loader.add_constructor(f"{core}str", Loader.construct_text)
    Loader.add_constructor(f"{core}seq", Loader.construct_sequence)
    Loader.add_constructor(f"{core}map", Loader.construct_mapping)
    Loader.add_constructor(None, Loader.construct_unknown)
    return Loader


def read_limited(path: Path, max_bytes: int) -> bytes:
    """Read at most ``max_bytes`` of a regular file; :class:`YamlProblem` when it is larger or
    is not a regular file (a FIFO is never opened for blocking reads)."""
    try:
        with files.open_regular(path) as handle:
            data = handle.read(max_bytes + 1)
    except files.FileRefused as exc:
        raise YamlProblem(str(exc)) from None
    if len(data) > max_bytes:
        raise YamlProblem(_too_large(max_bytes), 1)
    return data


def _too_large(max_bytes: int) -> str:
    return (
        f"file is larger than the limit of {max_bytes} bytes "
        "(raise limits.max_file_bytes in catalogue.yaml if this is intended)"
    )


def read_yaml(data: bytes, limits: Limits = DEFAULT_LIMITS) -> object:
    """Parse YAML bytes; raise :class:`YamlProblem` with the line of the first problem."""
    if len(data) > limits.max_file_bytes:  # callers that read files use read_limited
        raise YamlProblem(_too_large(limits.max_file_bytes), 1)
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError as exc:
        line = data[: exc.start].count(b"\n") + 1
        raise YamlProblem(
            f"file is not UTF-8 text (bad byte at offset {exc.start})", line
        ) from None
    if "\x00" in text:
        raise YamlProblem(
            "file contains NUL bytes (binary, not YAML)", text[: text.index("\x00")].count("\n") + 1
        )
    try:
        return yaml.load(text, Loader=_make_loader(limits))
    except YamlProblem as exc:
        raise YamlProblem(str(exc), exc.line, exc.key or _key_near(text, exc.line)) from None
    except yaml.MarkedYAMLError as exc:
        mark = exc.problem_mark or exc.context_mark
        line = mark.line + 1 if mark else 1
        what = exc.problem or exc.context
        if hint := indentation_hint(text, line):
            line, message = hint
            raise YamlProblem(message, line, _key_near(text, line)) from None
        raise YamlProblem(f"not valid YAML: {what}", line, _key_near(text, line)) from None
    except (yaml.YAMLError, RecursionError, ValueError, TypeError, OverflowError) as exc:
        raise YamlProblem(f"not valid YAML: {type(exc).__name__}", 1) from None


def _blank(line: str) -> bool:
    """A line with no content: empty, spaces only, or a comment."""
    return not line.strip() or line.lstrip().startswith("#")


def _indent(line: str) -> int:
    return len(line) - len(line.lstrip(" "))


def indentation_hint(text: str, line: int) -> tuple[int, str] | None:
    """When YAML stops at ``line`` (1-based) because two neighbouring lines are indented
    differently, the line to fix and a sentence saying how; None when that is not the cause."""
    lines = text.splitlines()
    if not 1 < line <= len(lines):
        return None
    here = lines[line - 1]
    above = line - 1  # the nearest line above with content (not blank, not a comment)
    while above > 0 and _blank(lines[above - 1]):
        above -= 1
    if above == 0:
        return None
    before = lines[above - 1]
    a, b = _indent(before), _indent(here)
    opens = before.rstrip().endswith(":")
    if a > b and not opens:
        return above, (
            f"line {above} is indented {a} spaces and line {line} below it {b}: the keys of one "
            f"mapping start in the same column, so indent line {above} like line {line} "
            "(or the other way round)"
        )
    if b > a and not opens:
        return line, (
            f"line {line} is indented {b} spaces, more than line {above} above it ({a}), which "
            f"already has a value: indent line {line} like line {above}"
        )
    return None


_KEY_AT = re.compile(r"^[\s-]*([A-Za-z_][A-Za-z0-9_.-]*)\s*:")


def _key_near(text: str, line: int | None) -> str:
    """The key written on ``line`` or the nearest line above it, for locating a problem."""
    if not line:
        return ""
    lines = text.splitlines()[: min(line, 10_000)]
    for candidate in reversed(lines[-50:]):
        if m := _KEY_AT.match(candidate):
            return m.group(1)
    return ""
