"""Events remembered between builds: a checked event as plain JSON and back, and the record
that lets a build take an unchanged file's event from it instead of reading the file again.

A file counts as unchanged when its size and modification time are those recorded (and so are
those of its samples file and sky map); then its event, and the warnings checking it gave, are
read back from the record. Anything else (a different size or time, a new file, other settings
or other code) is read and checked in full. The JSON names only the model's own dataclasses
and a few value types (quantities, units, times, paths, editors' texts): nothing read back can
name other code.

A remembered event keeps no sample values (the pages never need them); a build that must derive
such an event again reads its files afresh (:func:`needs_reading`).
"""

from __future__ import annotations

import dataclasses
import hashlib
import os
import sys
import time
from collections.abc import Mapping
from functools import cache
from pathlib import Path
from typing import Any

import astropy.units as u
import numpy as np
from astropy.time import Time

from factsheet import i18n, model
from factsheet.errors import Problem

#: The model's dataclasses an event is made of, by name (the only classes the JSON may name).
_CLASSES = {
    cls.__name__: cls
    for cls in (
        model.Interval,
        model.Body,
        model.Estimate,
        model.SkyMapFile,
        model.Detection,
        model.CounterpartCandidate,
        model.Host,
        model.HistoryEntry,
        model.SamplesFile,
        model.Event,
    )
}
_TAG = "~"


def event_to_json(event: model.Event) -> dict[str, Any]:
    """``event`` as plain JSON values (sample values left out)."""
    return _encode(event)


def event_from_json(data: Any) -> model.Event:
    """The inverse of :func:`event_to_json`; ValueError, KeyError or TypeError when ``data``
    is not an event this code wrote."""
    event = _decode(data)
    if not isinstance(event, model.Event):
        raise TypeError("not an event")
    return event


def needs_reading(event: model.Event) -> bool:
    """Whether a remembered event lacks what deriving it needs (its sample values)."""
    return event.samples is not None and not any(len(v) for v in event.samples.values.values())


def _encode(value: Any) -> Any:
    if isinstance(value, i18n.Editorial | i18n.Text | i18n.Later):
        return i18n.to_json(value)
    if value is None or isinstance(value, bool):
        return value
    if isinstance(value, float):  # numbers read from YAML are subclasses that keep the text
        return float(value)
    if isinstance(value, int):
        return int(value)
    if isinstance(value, str):
        return str.__str__(value)
    if isinstance(value, u.Quantity):
        return {_TAG: "Q", "v": value.value.tolist(), "u": value.unit.to_string()}
    if isinstance(value, u.UnitBase):
        return {_TAG: "U", "v": value.to_string()}
    if isinstance(value, Time):
        return {
            _TAG: "T",
            "jd": [float(value.jd1), float(value.jd2)],
            "scale": value.scale,
            "format": value.format,
        }
    if isinstance(value, Path):
        return {_TAG: "P", "v": str(value)}
    if isinstance(value, np.ndarray):
        return {_TAG: "A"}  # sample values are not remembered
    if isinstance(value, tuple):
        return {_TAG: "t", "v": [_encode(v) for v in value]}
    if isinstance(value, list):
        return [_encode(v) for v in value]
    if isinstance(value, Mapping):
        return {_TAG: "d", "v": [[_encode(k), _encode(v)] for k, v in value.items()]}
    if dataclasses.is_dataclass(value) and type(value).__name__ in _CLASSES:
        fields = {f.name: _encode(getattr(value, f.name)) for f in dataclasses.fields(value)}
        return {_TAG: type(value).__name__, **fields}
    raise TypeError(f"cannot remember a {type(value).__name__}")


def _decode(value: Any) -> Any:
    if isinstance(value, str):  # the same key or unit in every event held is one string
        return sys.intern(value) if len(value) <= 48 else value
    if isinstance(value, list):
        return [_decode(v) for v in value]
    if not isinstance(value, dict):
        return value
    tag = value.get(_TAG)
    if tag is None:
        return i18n.from_json(value)  # an editors' text
    if tag == "Q":
        return value["v"] * _unit(value["u"])
    if tag == "U":
        return _unit(value["v"])
    if tag == "T":
        moment = Time(*value["jd"], format="jd", scale=str(value["scale"]))
        moment.format = str(value["format"])
        return moment
    if tag == "P":
        return Path(value["v"])
    if tag == "A":
        return np.empty(0)
    if tag == "t":
        return tuple(_decode(v) for v in value["v"])
    if tag == "d":
        return {_decode(k): _decode(v) for k, v in value["v"]}
    cls = _CLASSES[tag]  # KeyError: not one of ours
    return cls(**{k: _decode(v) for k, v in value.items() if k != _TAG})


def _sha256(path: Path) -> str | None:
    try:
        return hashlib.sha256(path.read_bytes()).hexdigest()
    except OSError:
        return None


@cache
def _unit(text: str) -> u.UnitBase:
    return u.Unit(text)


# -- the record of the files read -------------------------------------------------------------


def stamp(path: Path) -> list[int] | None:
    """[size, modification time in ns] of a file, or None when it cannot be stat'ed."""
    try:
        st = os.stat(path)
    except (OSError, ValueError):
        return None
    return [st.st_size, st.st_mtime_ns]


#: A file modified this recently (ns) is not remembered: a second edit within the file
#: system's clock tick could keep its size and time (it is read again next time instead).
RECENT_NS = 2_000_000_000


def file_record(event: model.Event, warnings: list[Problem]) -> dict[str, Any] | None:
    """What to remember of an event just read: the stamps of its files (taken after reading,
    so a file changed while it was read is read again next time), the event, its warnings."""
    files = [event.source]
    if event.samples is not None:
        files.append(event.samples.path)
    if event.detection.sky_map is not None:
        files.append(event.detection.sky_map.path)
    found = [stamp(p) for p in files]
    now = time.time_ns()
    if any(s is None or now - s[1] < RECENT_NS for s in found):
        return None
    stamps = [[str(p), s] for p, s in zip(files, found, strict=True)]
    return {
        "files": stamps,
        "event": event_to_json(event),
        "warnings": [[str(w.file), w.line, w.key, i18n.to_json(w.message)] for w in warnings],
    }


def recall(record: Any) -> tuple[model.Event, list[Problem]] | None:
    """The event and warnings of a record whose files are all unchanged, else None: same size
    and time; or, for the event file only, a new time but the same SHA-256 (a checkout that
    touched it)."""
    try:
        (source, recorded), *others = record["files"]
        if not all(stamp(Path(p)) == s for p, s in others):
            return None
        event = None
        if stamp(Path(source)) != recorded:
            event = event_from_json(record["event"])
            if _sha256(Path(source)) != event.source_digest:
                return None
        event = event or event_from_json(record["event"])
        warnings = [
            Problem(Path(f), line, key, i18n.from_json(message))
            for f, line, key, message in record["warnings"]
        ]
    except (KeyError, TypeError, ValueError, AttributeError, IndexError):
        return None
    return event, warnings
