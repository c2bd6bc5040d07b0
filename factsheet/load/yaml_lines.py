"""Read YAML safely and remember where every key stood (the load stage's YAML reader).

Mappings come back as :class:`LineMap` (a dict that knows the line of each key) and sequences
as :class:`LineList`. Duplicate keys in one mapping, excessive nesting and alias expansion are
refused with the line they occur on. Timestamps stay strings (the loader parses them with
astropy), so ``2034-04-12T07:26:41.2`` keeps its decimal second.
"""

from __future__ import annotations

import re
from pathlib import Path

import yaml
from yaml.events import AliasEvent

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


def _make_loader(limits: Limits) -> type[yaml.SafeLoader]:
    class Loader(yaml.SafeLoader):
        depth = 0
        aliases = 0

        def compose_node(self, parent, index):
            if self.check_event(AliasEvent):
                self.aliases += 1
                if self.aliases > limits.max_aliases:
                    mark = self.peek_event().start_mark
                    raise YamlProblem(
                        f"more than {limits.max_aliases} YAML aliases (raise the limit in "
                        "catalogue.yaml if this is intended)",
                        mark.line + 1,
                    )
            self.depth += 1
            if self.depth > limits.max_depth:
                mark = self.peek_event().start_mark
                raise YamlProblem(f"nesting deeper than {limits.max_depth} levels", mark.line + 1)
            try:
                return super().compose_node(parent, index)
            finally:
                self.depth -= 1

        def construct_mapping(self, node, deep=False):
            result = LineMap()
            result.line, result.lines = node.start_mark.line + 1, {}
            self.flatten_mapping(node)
            for key_node, value_node in node.value:
                key = self.construct_object(key_node, deep=True)
                if not isinstance(key, str | int | float | bool) and key is not None:
                    raise YamlProblem(
                        "mapping keys must be plain words", key_node.start_mark.line + 1
                    )
                if key in result:
                    raise YamlProblem(
                        f"duplicate key (first given on line {result.lines[key]})",
                        key_node.start_mark.line + 1,
                        str(key),
                    )
                result[key] = self.construct_object(value_node, deep=True)
                result.lines[key] = key_node.start_mark.line + 1
            return result

        def construct_sequence(self, node, deep=False):
            result = LineList(self.construct_object(child, deep=True) for child in node.value)
            result.line = node.start_mark.line + 1
            result.lines = [child.start_mark.line + 1 for child in node.value]
            return result

    Loader.add_constructor("tag:yaml.org,2002:map", Loader.construct_mapping)
    Loader.add_constructor("tag:yaml.org,2002:seq", Loader.construct_sequence)
    Loader.add_constructor(
        "tag:yaml.org,2002:timestamp", lambda loader, node: loader.construct_scalar(node)
    )
    return Loader


def read_limited(path: Path, max_bytes: int) -> bytes:
    """Read at most ``max_bytes`` of a file; :class:`YamlProblem` when it is larger."""
    with path.open("rb") as handle:
        data = handle.read(max_bytes + 1)
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
        raise YamlProblem(f"not valid YAML: {what}", line, _key_near(text, line)) from None
    except (yaml.YAMLError, RecursionError, ValueError, TypeError, OverflowError) as exc:
        raise YamlProblem(f"not valid YAML: {type(exc).__name__}", 1) from None


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
