"""Load a catalogue folder: settings, every event file and its samples file, checked whole.

Every problem is collected as ``FILE:LINE: key: what is wrong (what was expected)``; the whole
catalogue is checked before :class:`~factsheet.errors.InputError` is raised with all of them.
"""

from __future__ import annotations

import hashlib
from math import inf
from pathlib import Path

import astropy.units as u

from factsheet.errors import InputError, Problem
from factsheet.load.checker import Checker
from factsheet.load.consistency import consistency_warnings
from factsheet.load.reference import reference_for
from factsheet.load.samples import check_samples
from factsheet.load.schema import CATALOGUE_KEYS, EVENT_KEYS
from factsheet.load.yaml_lines import LineMap, YamlProblem, read_limited, read_yaml
from factsheet.model import Catalogue, Estimate, Event, Limits, Settings

CATALOGUE_FILE = "catalogue.yaml"
EVENT_SUFFIXES = (".yaml", ".yml")


def load_catalogue(folder: str | Path) -> Catalogue:
    """Read and validate a catalogue folder; raise :class:`InputError` listing every problem."""
    root = Path(folder)
    if not root.is_dir():
        raise InputError(problems=[Problem(root, None, "", "catalogue folder not found")])
    problems: list[Problem] = []
    settings = load_settings(root / CATALOGUE_FILE, problems)
    warnings: list[Problem] = []
    events = [
        e
        for path in event_files(root, problems)
        if (e := load_event(path, root, settings, problems, warnings))
    ]
    _check_unique_ids(events, problems)
    if not events and not problems:
        problems.append(Problem(root, None, "", "no event files (*.yaml) in the catalogue"))
    if problems:
        raise InputError(problems=problems)
    events.sort(key=lambda e: (e.time.unix, e.id))
    return Catalogue(root=root, settings=settings, events=tuple(events), warnings=tuple(warnings))


def event_files(root: Path, problems: list[Problem]) -> list[Path]:
    """Every event file under ``root``, sorted; links leading outside the folder are refused."""
    base = root.resolve()
    found = []
    for path in sorted(root.rglob("*")):
        if path.suffix not in EVENT_SUFFIXES or path == root / CATALOGUE_FILE:
            continue
        if not path.resolve().is_relative_to(base):
            problems.append(Problem(path, None, "", "link points outside the catalogue folder"))
        elif path.is_file():
            found.append(path)
    return found


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
    """Read ``catalogue.yaml`` if present; defaults otherwise."""
    if not path.exists():
        return Settings()
    if not path.resolve().is_relative_to(path.parent.resolve()):
        problems.append(Problem(path, 1, "file", "link points outside the catalogue folder"))
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
    check = Checker(path, problems, base=path.parent, root=root)
    values = check.mapping(data, EVENT_KEYS, prefix="")
    if "estimate" in values:
        _check_redshift(check, data["estimate"], values["estimate"], settings.cosmology)
    if "samples" in values:
        values["samples"] = check_samples(values["samples"], settings.limits, problems, noticed)
    if len(problems) > before:
        return None
    values.setdefault("title", values["id"])
    event = Event(
        source=path,
        source_digest=hashlib.sha256(content).hexdigest(),
        line=data.line_of("id") or 1,
        key_lines=_lines(data),
        **values,
    )
    if warnings is not None:
        warnings.extend([*noticed, *consistency_warnings(event)])
    return event


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
    seen: dict[str, Event] = {}
    for event in events:
        if event.id in seen:
            first = seen[event.id]
            problems.append(
                Problem(
                    event.source,
                    event.line,
                    "id",
                    f"duplicate id {event.id!r} (also used in {first.source})",
                )
            )
        else:
            seen[event.id] = event
