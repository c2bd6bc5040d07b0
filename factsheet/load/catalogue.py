"""Load a catalogue folder: settings, every event file, its samples file and sky map, checked
whole.

Every problem is collected as ``FILE:LINE: key: what is wrong (what was expected)``; the whole
catalogue is checked before :class:`~factsheet.errors.InputError` is raised with all of them.
"""

from __future__ import annotations

import hashlib
import json
import zlib
from collections.abc import Iterator, MutableMapping
from math import inf
from pathlib import Path
from typing import Any

import astropy.units as u

from factsheet.errors import InputError, Problem
from factsheet.i18n import Editorial
from factsheet.load.checker import Checker
from factsheet.load.consistency import consistency_warnings
from factsheet.load.files import CATALOGUE_FILE, FileRefused, event_files, target_of
from factsheet.load.reference import reference_for
from factsheet.load.remembered import file_record, recall, stamp
from factsheet.load.samples import check_samples
from factsheet.load.schema import CATALOGUE_KEYS, EVENT_KEYS
from factsheet.load.yaml_lines import LineMap, YamlProblem, read_limited, read_yaml
from factsheet.model import Catalogue, Estimate, Event, Limits, Settings


def load_catalogue(folder: str | Path, memory: Memory | None = None) -> Catalogue:
    """Read and validate a catalogue folder; raise :class:`InputError` listing every problem.

    With a ``memory`` (the build's), an event file whose size and time are those recorded by
    the last build under the same settings and code gives its event from the record instead
    of being read and checked again; ``memory.fresh`` then holds the records for next time."""
    root = Path(folder)
    try:
        is_folder = root.is_dir()
    except OSError:  # a name too long, or a link loop on older Pythons
        is_folder = False
    if not is_folder:
        found = root.exists() or root.is_symlink()
        what = "catalogue folder is not a folder" if found else "catalogue folder not found"
        raise InputError(problems=[Problem(root, None, "", what)])
    problems: list[Problem] = []
    settings = load_settings(root / CATALOGUE_FILE, problems)
    warnings: list[Problem] = []
    skipped: list[tuple[Path, str]] = []
    if memory is not None:
        memory.begin(settings, root)
    events = [
        e
        for path in event_files(root, problems, skipped)
        if (e := _event(path, root, settings, problems, warnings, memory))
    ]
    _check_unique_ids(events, problems)
    if not events and not problems:
        problems.append(Problem(root, None, "", "no event files (*.yaml) in the catalogue"))
    if problems:
        raise InputError(problems=problems)
    events.sort(key=lambda e: (e.time.unix, e.id))
    return Catalogue(
        root=root,
        settings=settings,
        events=tuple(events),
        warnings=tuple(warnings),
        skipped=tuple(skipped),
    )


class Memory:
    """Records of the events a build read (:mod:`factsheet.load.remembered`), keyed by file,
    valid for one fingerprint of the settings and the code."""

    def __init__(self, records: dict[str, str], fingerprint: str):
        self.records = dict(records)  # as JSON text, read back when the file is met
        self.fingerprint = fingerprint  # the code's; the settings' is added by begin()
        self.fresh: MutableMapping[str, str] = Packed()  # the records for next time
        self.recalled = 0

    def begin(self, settings: Settings, root: Path) -> None:
        """Make the records valid only for these settings, this catalogue and this folder."""
        where = f"{root.resolve()}|{Path.cwd()}"  # records name files as the build found them
        self.fingerprint = f"{self.fingerprint}|{settings.fingerprint()}|{settings.limits}|{where}"


class Packed(MutableMapping[str, str]):
    """Texts by name, each held compressed (a record of ``read.json`` is a few kB of JSON that
    only the end of the build writes out: a quarter of that while the build runs)."""

    def __init__(self) -> None:
        self._packed: dict[str, bytes] = {}

    def __getitem__(self, name: str) -> str:
        return zlib.decompress(self._packed[name]).decode("utf-8")

    def __setitem__(self, name: str, text: str) -> None:
        self._packed[name] = zlib.compress(text.encode("utf-8"), 1)

    def __delitem__(self, name: str) -> None:
        del self._packed[name]

    def __iter__(self) -> Iterator[str]:
        return iter(self._packed)

    def __len__(self) -> int:
        return len(self._packed)


def _event(path, root, settings, problems, warnings, memory: Memory | None) -> Event | None:
    """One event: from the memory when its files are unchanged, else read and checked."""
    if memory is None:
        return load_event(path, root, settings, problems, warnings)
    name = str(path)
    text = memory.records.pop(name, "")
    try:
        record = json.loads(text) if text else None
    except ValueError:
        record = None
    known = isinstance(record, dict) and record.get("fingerprint") == memory.fingerprint
    if known and record is not None and (found := recall(record)):
        event, noticed = found
        warnings.extend(noticed)
        memory.recalled += 1
        if record["files"][0][1] != stamp(path):  # touched, same bytes: stamp it anew
            record = {**(file_record(event, noticed) or {}), "fingerprint": memory.fingerprint}
            text = _json_text(record)
        memory.fresh[name] = text
        return event
    read: list[Problem] = []
    fresh = load_event(path, root, settings, problems, read)
    warnings.extend(read)
    if fresh is not None and (made := file_record(fresh, read)) is not None:
        memory.fresh[name] = _json_text({**made, "fingerprint": memory.fingerprint})
    return fresh


def _json_text(record: dict[str, Any]) -> str:
    return json.dumps(record, separators=(",", ":"))


def _read_mapping(
    path: Path, problems: list[Problem], limits: Limits
) -> tuple[LineMap | None, bytes]:
    """The top-level mapping of a YAML file and the file's bytes (None after a problem)."""
    try:
        data = read_limited(path, limits.max_file_bytes)
        content = read_yaml(data, limits)
    except YamlProblem as exc:
        problems.append(Problem(path, exc.line, exc.key, str(exc)))
        return None, b""
    except OSError as exc:
        problems.append(Problem(path, None, "", f"cannot read file ({exc.strerror})"))
        return None, b""
    if content is None:
        problems.append(Problem(path, 1, "", "file is empty (expected a mapping of keys)"))
        return None, data
    if not isinstance(content, LineMap):
        line = getattr(content, "line", 1)
        problems.append(Problem(path, line, "", "expected a mapping of keys at the top"))
        return None, data
    return content, data


def load_settings(path: Path, problems: list[Problem]) -> Settings:
    """Read ``catalogue.yaml`` if present; defaults otherwise.

    A ``catalogue.yaml`` that is there but is not a regular file inside the folder (a folder, a
    FIFO, a link that loops, leads nowhere or leads outside) is a problem, not an absent file.
    """
    if not (path.exists() or path.is_symlink()):
        return Settings()
    try:
        target_of(path, path.parent)
    except FileRefused as exc:
        problems.append(Problem(path, None, "", str(exc)))
        return Settings()
    data, _ = _read_mapping(path, problems, Limits())
    if data is None:
        return Settings()
    check = Checker(path, problems)
    settings = Settings(**check.mapping(data, CATALOGUE_KEYS, prefix=""))
    _check_reference_overrides(path, data, settings, problems)
    return settings


def _check_reference_overrides(
    path: Path, data: LineMap, settings: Settings, problems: list[Problem]
) -> None:
    """Report bad ``mass_bands``/``comparisons`` overrides at check time, with their line."""
    try:
        reference_for(settings)
    except InputError as exc:
        for p in exc.problems:
            top = p.key.split(".")[0]
            problems.append(Problem(path, data.line_of(top), p.key, p.message))


def load_event(
    path: Path,
    root: Path,
    settings: Settings,
    problems: list[Problem],
    warnings: list[Problem] | None = None,
) -> Event | None:
    """Read and validate one event file and its samples file; None (with problems recorded)
    when it is invalid. Warnings about valid but suspicious input go to ``warnings``."""
    data, content = _read_mapping(path, problems, settings.limits)
    if data is None:
        return None
    before, noticed = len(problems), list[Problem]()
    check = Checker(
        path,
        problems,
        base=path.parent,
        root=root,
        cosmology=settings.cosmology,
        warnings=noticed,
        languages=settings.languages,
    )
    values = check.mapping(data, EVENT_KEYS, prefix="")
    if "estimate" in values:
        _check_redshift(check, data["estimate"], values["estimate"], settings.cosmology)
    if "samples" in values:
        values["samples"] = check_samples(
            values["samples"], settings.limits, problems, noticed, settings.cosmology
        )
    if len(problems) > before:
        return None
    values.setdefault("title", Editorial(values["id"]))
    for name in ("summary", "internal_notes"):  # every editors' text is an Editorial
        values.setdefault(name, Editorial(""))
    event = Event(
        source=path,
        source_digest=hashlib.sha256(content).hexdigest(),
        content_digest=content_digest(data),
        line=data.line_of("id") or 1,
        key_lines=_lines(data),
        **values,
    )
    if warnings is not None:
        warnings.extend([*noticed, *consistency_warnings(event)])
    return event


#: Top-level keys whose text only the pages show: editing them re-renders the event's pages
#: but redraws no figure and no sound and derives nothing again.
PAGE_ONLY_KEYS = ("summary", "internal_notes")


def content_digest(data: LineMap) -> str:
    """SHA-256 of an event file's content without its :data:`PAGE_ONLY_KEYS` (values as
    read, in the file's order; not the lines, which such an edit shifts)."""
    kept = {str(k): v for k, v in data.items() if k not in PAGE_ONLY_KEYS}
    text = json.dumps(kept, default=repr, ensure_ascii=False, separators=(",", ":"))
    return hashlib.sha256(text.encode("utf-8")).hexdigest()


def _lines(data: LineMap, prefix: str = "") -> dict[str, int]:
    """The line of every key of a mapping and of its nested mappings, by key path."""
    found = {}
    for key, line in data.lines.items():
        if line:
            found[f"{prefix}{key}"] = line
        if isinstance(data[key], LineMap):
            found.update(_lines(data[key], f"{prefix}{key}."))
    return found


def _check_redshift(check: Checker, raw: LineMap, estimate: Estimate, cosmology: str) -> None:
    """A given redshift's median must lie in the range the distance interval implies."""
    if estimate.redshift is None:
        return
    d, z = estimate.distance, estimate.redshift
    z_low, z_high = (_redshift_or(x, cosmology, edge) for x, edge in ((d.low, 0.0), (d.high, inf)))
    slack = 1e-3 + 0.01 * z.median  # values are written rounded to a few digits
    if not z_low - slack <= z.median <= z_high + slack:
        check.fail(
            raw.line_of("redshift"),
            "estimate.redshift",
            f"redshift {z.median:g} disagrees with the luminosity distance "
            f"{d.median:g} +{d.plus:g} -{d.minus:g} Mpc, which implies {z_low:.3g} to "
            f"{z_high:.3g} under {cosmology} (fix one, or leave the redshift out)",
        )


def _redshift_or(distance_mpc: float, cosmology: str, edge: float) -> float:
    """Redshift at a distance (astropy; Hogg 1999), or ``edge`` outside the redshift table."""
    from factsheet.physics.cosmology import redshift_at_distance  # scipy loads only if needed

    try:
        return float(redshift_at_distance(distance_mpc * u.Mpc, cosmology))
    except ValueError:
        return edge


def _check_unique_ids(events: list[Event], problems: list[Problem]) -> None:
    """Ids must be unique, also when letter case is ignored: ``DX-1`` and ``dx-1`` would share
    one file name on a case-insensitive disk or web host."""
    seen: dict[str, Event] = {}
    for event in events:
        folded = event.id.lower()  # ids are ASCII (a slug)
        if folded not in seen:
            seen[folded] = event
            continue
        first = seen[folded]
        if first.id == event.id:
            message = f"duplicate id {event.id!r} (also used in {first.source})"
        else:
            message = (
                f"id {event.id!r} differs from {first.id!r} (in {first.source}) only in letter "
                "case; the two would share one file name on case-insensitive disks and web hosts"
            )
        problems.append(Problem(event.source, event.line, "id", message))
