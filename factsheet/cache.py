"""The build cache: per-event entries keyed by everything that shapes them.

An event's key hashes its YAML file's content (all but the summary and internal notes, which
only the pages show), its samples file and sky map (the digests the load stage took as it read
them), the settings that change numbers and factsheet's own code and data (every
``.py`` and data file of the package), so a change in any of them re-derives exactly what
depends on it.
Entries live in a folder beside the output (``.factsheet-cache-<name>/``), one folder per key,
each holding one ``entry.json``: what derive found, as plain JSON (nothing in the cache can run
code), and the size and SHA-256 of each file the entry placed in the site. The files themselves
are kept only in the published site, never twice: a later build takes an unchanged entry's files
from the site it replaces, as hard links into the new site (a copy where the file system has no
links), after checking each against its record. ``site.json`` stamps every published file with
its size, modification time and hash, so an untouched file is recognised from its metadata
alone; a file whose metadata changed is hashed, and one that no longer matches (edited by hand,
damaged, gone) makes its entry count as missing: its event is derived and drawn again. After
the swap the replaced site is removed, so the published files have one name each again. Safe
to delete.
"""

from __future__ import annotations

import array
import contextlib
import hashlib
import itertools
import json
import os
import shutil
import stat
import sys
import tempfile
from collections.abc import Callable, Iterable, Iterator, Mapping
from dataclasses import asdict, dataclass, field, replace
from functools import cache
from pathlib import Path
from typing import Any

import astropy.units as u
from astropy.time import Time

from factsheet import __version__, i18n
from factsheet.errors import BuildError
from factsheet.model import (
    Audio,
    CandidateReading,
    Caveat,
    Comparisons,
    Derived,
    Event,
    EventBundle,
    FigureInfo,
    LensedCase,
    Lensing,
    Reference,
    SecondGeneration,
    Settings,
    SkyMapSummary,
    Summary,
)
from factsheet.physics.counterparts import Window
from factsheet.publish import MARKER
from factsheet.resources import PACKAGE

FORMAT = "8"
STAMPS = "site.json"
RECORDS = "read.json"  # the events read by the last build (factsheet.load.remembered)
ENTRY = "entry.json"
MAX_ENTRY_BYTES = 4_000_000  # an entry's JSON is a few kilobytes; anything far larger is not ours


@cache
def code_fingerprint() -> str:
    """A hash of the package's code, data files and compiled message catalogues (the
    templates only shape the pages)."""
    digest = hashlib.sha256(f"{__version__}|{FORMAT}".encode())
    for path in sorted(PACKAGE.rglob("*")):
        if (
            path.is_file()
            and path.suffix in {".py", ".yaml", ".mo"}
            and "__pycache__" not in path.parts
        ):
            digest.update(path.relative_to(PACKAGE).as_posix().encode())
            digest.update(path.read_bytes())
    return digest.hexdigest()


def event_key(event: Event, settings: Settings) -> str:
    """The cache key of one event: its inputs, the settings and the code."""
    digest = hashlib.sha256(code_fingerprint().encode())
    digest.update(settings.fingerprint().encode())
    digest.update((event.content_digest or event.source_digest).encode())
    if event.samples is not None:
        digest.update(event.samples.digest.encode())
    if event.detection.sky_map is not None:
        digest.update(event.detection.sky_map.digest.encode())
    return digest.hexdigest()[:32]


def content_key(*parts: object) -> str:
    """A cache key from the repr of some inputs and the code fingerprint."""
    digest = hashlib.sha256(code_fingerprint().encode())
    for part in parts:
        digest.update(repr(part).encode())
    return "x" + digest.hexdigest()[:31]


class Cache:
    """Entries of JSON, one folder per key, beside the output; their files are in the site."""

    def __init__(self, out: Path):
        out = Path(out)
        self.root = out.absolute().parent / f".factsheet-cache-{out.name}"
        if self.root.exists() and (self.root.is_symlink() or not self.root.is_dir()):
            raise BuildError(
                f"{self.root}: the build cache's place holds a file or a link; remove it "
                "(the cache is safe to delete) or choose another output"
            )
        self.site = out
        self.used: set[str] = {STAMPS, RECORDS}
        self._stamps: dict[str, int] | None = None
        self._site_made: bool | None = None
        self._files_of: dict[str, dict[str, Any]] = {}  # file records of the entries loaded

    def load(
        self,
        key: str,
        event: Event,
        settings: Settings,
        reference: Reference,
        again: bool = False,
        lean: bool = False,
    ) -> EventBundle | None:
        """The bundle stored under ``key`` for ``event``, or None when there is none or its JSON
        does not check out. Its files are placed by :meth:`place` (unless it is read
        ``again``, after its files were placed). A ``lean`` bundle has only the numbers, class,
        bands, methods and sky-map summary (what the catalogue pages read): its words are not
        read back, which is most of the cost of reading an entry."""
        entry = self._entry(key, words=not lean)
        if entry is None or entry.get("kind") != "event":
            return None
        try:
            bundle = bundle_from_json(entry["bundle"], event, settings, reference, lean)
        except (KeyError, TypeError, ValueError, AttributeError, IndexError):
            return None
        self.used.add(key)
        if not again:
            self._files_of[key] = entry["files"]  # for place(): the entry is read once
        return replace(bundle, key=key)

    def store(
        self,
        key: str,
        bundle: EventBundle,
        event: Event,
        settings: Settings,
        reference: Reference,
        lean: bool = False,
    ) -> EventBundle:
        """Record the bundle's JSON and its files' sizes and hashes under ``key``; return it as
        a later build reads it back with :meth:`load` (for ``event``, without file bytes: the
        caller writes the files into the new site). Every bundle a build holds is then in the
        same form, sharing the build's settings, reference and event, whether made now or
        earlier."""
        text = self._write(key, bundle.files, {"kind": "event", "bundle": bundle_to_json(bundle)})
        data = json.loads(text, object_hook=None if lean else i18n.json_hook)["bundle"]
        return replace(bundle_from_json(data, event, settings, reference, lean), key=key)

    def place(self, key: str, link: Callable[[str, str, str], None]) -> bool:
        """Place every file of the entry ``key`` from the published site into the new one with
        ``link(source, site path, sha256)``; False (and nothing placed) when the entry is
        missing or any of its files is gone or differs from its record."""
        files = self._files_of.pop(key, None)
        if files is None:
            entry = self._entry(key, words=False)
            if entry is None:
                return False
            files = entry["files"]
        sources = {name: self._published(name, record) for name, record in files.items()}
        if not all(sources.values()):
            return False
        for name, source in sources.items():  # the name interned: the stamps hold it too
            link(source, sys.intern(name), files[name]["sha256"])
        self.used.add(key)
        return True

    def forget(self, key: str) -> None:
        """Remove an entry (one that does not read back), so the next build makes it afresh."""
        shutil.rmtree(self.root / key, ignore_errors=True)

    def files_and_notes(self, key: str) -> tuple[dict[str, bytes], Any] | None:
        """The files of an entry of plain files (read from the published site, checked) and
        the notes stored with them, or None when the entry or any of its files is missing or
        differs from its record."""
        entry = self._entry(key)
        if entry is None or entry.get("kind") != "files":
            return None
        found = {}
        for name, record in entry["files"].items():
            source = self._published(name, record)
            data = Path(source).read_bytes() if source else b""
            if not source or not _matches(data, record):
                return None
            found[name] = data
        self.used.add(key)
        return found, entry.get("notes")

    def store_files(self, key: str, files: dict[str, bytes], notes: Any = None) -> None:
        """Record files the build publishes (and, if given, notes about them as plain JSON)."""
        self._write(key, files, {"kind": "files", "notes": notes})

    def recording(
        self, key: str, files: Iterable[tuple[str, bytes]]
    ) -> Iterator[tuple[str, bytes]]:
        """Hand on each (site path, content) of ``files`` as it comes, and record them all
        (as :meth:`store_files` does) once the last has passed: the files are never all held
        at once. Nothing is recorded when the files stop short."""
        recorded = {}
        for name, data in files:
            recorded[name] = _record(data)
            yield name, data
        self._write_recorded(key, recorded, {"kind": "files", "notes": None})

    def stamp_site(self, placed: dict[str, str]) -> None:
        """After the swap: stamp each file of the new site (site path to SHA-256) with its
        size and modification time, so the next build knows it unchanged from its metadata.

        The JSON (``{"format": ..., "files": {path: [size, mtime, sha256]}}``) is written a
        file at a time, never held whole."""

        def parts() -> Iterator[str]:
            yield '{"format":' + json.dumps(FORMAT) + ',"files":{'
            comma = ""
            for name, sha in placed.items():
                try:
                    st = os.lstat(self.site / name)
                except OSError:
                    continue
                yield f"{comma}{json.dumps(name)}:[{st.st_size},{st.st_mtime_ns},{json.dumps(sha)}]"
                comma = ","
            yield "}}"

        self._replace_parts(STAMPS, parts())

    def read_records(self) -> dict[str, str]:
        """The records of the events the last build read, by file, each as its line of JSON
        (read back only when its file is met: a record costs its text, not a tree of objects);
        {} when there are none or they do not read back."""
        try:
            lines = (self.root / RECORDS).read_text(encoding="utf-8").split("\n")
        except (OSError, ValueError):
            return {}
        if lines[0] != _records_header():
            return {}
        records = {}
        for line in lines[1:]:
            name, tab, record = line.partition("\t")
            if tab:
                with contextlib.suppress(ValueError):
                    records[json.loads(name)] = record
        return records

    def write_records(self, records: dict[str, str]) -> None:
        """Write the records (one line each: the file's name as JSON, a tab, the record), a
        line at a time."""
        lines = (f"\n{json.dumps(name)}\t{record}" for name, record in records.items())
        self._replace_parts(RECORDS, itertools.chain([_records_header()], lines))

    def _replace(self, name: str, data: Any) -> None:
        """Write one JSON file of the cache's root atomically."""
        # dumps: the C encoder (dump is Python's)
        self._replace_parts(name, [json.dumps(data, separators=(",", ":"))])

    def _replace_parts(self, name: str, parts: Iterable[str]) -> None:
        """Write one file of the cache's root atomically, from its text's parts as they come."""
        try:
            self.root.mkdir(parents=True, exist_ok=True)
            fd, temporary = tempfile.mkstemp(prefix=".new-", dir=self.root)
            try:
                with os.fdopen(fd, "w", encoding="utf-8", newline="") as handle:
                    handle.writelines(parts)
                os.replace(temporary, self.root / name)
            except BaseException:
                with contextlib.suppress(OSError):
                    os.unlink(temporary)
                raise
        except OSError as exc:
            raise BuildError(f"{self.root}: cannot write the build cache ({exc.strerror})") from exc

    def prune(self) -> None:
        """Remove entries this build did not use (and leftovers of interrupted writes)."""
        if not self.root.is_dir():
            return
        for entry in self.root.iterdir():
            if entry.name not in self.used:
                if entry.is_dir() and not entry.is_symlink():
                    shutil.rmtree(entry, ignore_errors=True)
                else:
                    entry.unlink(missing_ok=True)

    # -- the published files -------------------------------------------------------------------
    @property
    def stamps(self) -> dict[str, int]:
        """The stamps of the published site's files, as a build holds them for every file at
        once: site path (interned: the entries name the same files) to the hash of its
        [size, mtime, sha256] (:func:`_stamp`)."""
        if self._stamps is None:
            self._stamps = {}
            if self._lends():
                try:
                    data = json.loads((self.root / STAMPS).read_bytes())
                    if data.get("format") == FORMAT and isinstance(data.get("files"), dict):
                        found = data["files"].items()
                        self._stamps = {sys.intern(name): _stamp(*st) for name, st in found}
                except (OSError, ValueError, AttributeError, TypeError):
                    pass
        return self._stamps

    def _lends(self) -> bool:
        """Whether the output is a site factsheet made (only such a site lends its files)."""
        if self._site_made is None:
            self._site_made = (self.site / MARKER).is_file() and not self.site.is_symlink()
        return self._site_made

    def _published(self, name: str, record: dict[str, Any]) -> str | None:
        """The published file at site path ``name`` when it is a plain file matching
        ``record``: its size and modification time as stamped (metadata only), else its hash."""
        if not self._lends():
            return None
        path = os.path.join(self.site, name)  # plain strings: thousands of files a build
        try:
            st = os.lstat(path)
        except (OSError, ValueError):
            return None
        if not stat.S_ISREG(st.st_mode) or st.st_size != record["size"]:
            return None
        if self.stamps.get(name) == _stamp(st.st_size, st.st_mtime_ns, record["sha256"]):
            return path
        try:
            with open(path, "rb") as handle:
                return path if _matches(handle.read(), record) else None
        except OSError:
            return None

    # -- the entries on disk -------------------------------------------------------------------
    def _entry(self, key: str, words: bool = True) -> dict[str, Any] | None:
        """An entry's JSON if it reads back whole and its file records are well formed (with
        ``words``, its kept words read back as such; without, left as JSON)."""
        path = self.root / key / ENTRY
        try:
            if path.is_symlink() or path.stat().st_size > MAX_ENTRY_BYTES:
                return None
            # kept words are read back as the parser meets them (i18n.json_hook)
            hook = i18n.json_hook if words else None
            entry = json.loads(path.read_bytes(), object_hook=hook)
        except (OSError, ValueError, TypeError, AttributeError):
            return None
        if not isinstance(entry, dict) or entry.get("format") != FORMAT:
            return None
        files = entry.get("files")
        if not isinstance(files, dict) or not all(
            _recorded(v) and _safe_name(n) for n, v in files.items()
        ):
            return None
        return entry

    def _write(self, key: str, files: dict[str, bytes], entry: dict[str, Any]) -> str:
        """Write an entry into a fresh folder, then move it into place (atomic per entry);
        return its JSON."""
        recorded = {name: _record(data) for name, data in files.items()}
        return self._write_recorded(key, recorded, entry)

    def _write_recorded(self, key: str, recorded: dict[str, Any], entry: dict[str, Any]) -> str:
        """:meth:`_write`, the files' sizes and hashes given."""
        try:
            self.root.mkdir(parents=True, exist_ok=True)
            staging = Path(tempfile.mkdtemp(prefix=".new-", dir=self.root))
            entry = {"format": FORMAT, **entry, "files": recorded}
            # keys stay in insertion order: a bundle read back must give the pages and the JSON
            # export the same bytes as the bundle it was made from (sorted keys reordered the
            # class probabilities and mass bands of an event's JSON)
            text = json.dumps(entry)
            (staging / ENTRY).write_text(text, encoding="utf-8")
            final = self.root / key
            shutil.rmtree(final, ignore_errors=True)
            os.replace(staging, final)
        except OSError as exc:
            raise BuildError(f"{self.root}: cannot write the build cache ({exc.strerror})") from exc
        self.used.add(key)
        return text


def _record(data: bytes) -> dict[str, Any]:
    """What an entry records of a file it lists: its size and SHA-256."""
    return {"size": len(data), "sha256": hashlib.sha256(data).hexdigest()}


def _stamp(size: int, mtime_ns: int, sha256: str) -> int:
    """A published file's stamp as held in memory: the hash of its size, time and SHA-256 (two
    stamps that differ in any of them collide with a chance of one in 2**64)."""
    return hash((size, mtime_ns, sha256))


def _records_header() -> str:
    return json.dumps({"format": FORMAT, "records": "one per line: file name, tab, record"})


def _recorded(record: object) -> bool:
    return (
        isinstance(record, dict)
        and isinstance(record.get("size"), int)
        and isinstance(record.get("sha256"), str)
    )


def _safe_name(name: str) -> bool:
    """A site path inside the site (an entry never names a file outside it)."""
    parts = name.split("/")
    return bool(name) and not name.startswith("/") and ".." not in parts and "" not in parts


def _matches(data: bytes, record: dict[str, Any]) -> bool:
    return len(data) == record["size"] and hashlib.sha256(data).hexdigest() == record["sha256"]


# -- what derive found, as JSON and back ------------------------------------------------------


def bundle_to_json(bundle: EventBundle) -> dict[str, Any]:
    """The parts of a bundle that the pages need, as plain JSON values (exact floats)."""
    d = bundle.derived
    return i18n.to_json(
        {
            "quantities": {k: asdict(s) for k, s in d.quantities.items()},
            "caveats": [asdict(c) for c in d.caveats],
            "second_generation": [asdict(g) for g in d.second_generation],
            "source_class": d.source_class,
            "class_probabilities": dict(d.class_probabilities),
            "mass_bands": {k: dict(v) for k, v in d.mass_bands.items()},
            "intermediate_mass": dict(d.intermediate_mass),
            "disruption_probability": d.disruption_probability,
            "windows": [_window_json(w) for w in d.windows],
            "no_window_reason": d.no_window_reason,
            "energy": dict(d.comparisons.energy),
            "luminosity": dict(d.comparisons.luminosity),
            "sun_years": None if d.comparisons.sun_years is None else d.comparisons.sun_years.value,
            "other_methods": list(d.other_methods),
            "lensing": None if d.lensing is None else asdict(d.lensing),
            "sky_map": _sky_json(d.sky_map),
            "candidates": [
                {
                    "credible_level": r.credible_level,
                    "delay_days": float(r.delay.to_value(u.d)),
                    "delay_source": asdict(r.delay_source),
                    "windows": list(r.windows),
                }
                for r in d.candidates
            ],
            "figures": {
                language: [[f.path, f.alt, f.caption] for f in infos]
                for language, infos in bundle.figures.items()
            },
            "audio": asdict(bundle.audio),
            "figure_seconds": bundle.figure_seconds,
        }
    )


def _sky_json(found: SkyMapSummary | None) -> dict[str, Any] | None:
    """The sky map's numbers (its level grid is for the figures, drawn before caching)."""
    if found is None:
        return None
    areas = {k: float(getattr(found, k).to_value(u.deg**2)) for k in ("area_50", "area_90", "area")}
    peak = {k: float(getattr(found, k).to_value(u.deg)) for k in ("peak_ra", "peak_dec")}
    return {"nside": found.nside, "ordering": found.ordering, **areas, **peak}


def _sky(data: dict[str, Any] | None) -> SkyMapSummary | None:
    if data is None:
        return None
    areas = {k: float(data[k]) * u.deg**2 for k in ("area_50", "area_90", "area")}
    peak = {k: float(data[k]) * u.deg for k in ("peak_ra", "peak_dec")}
    return SkyMapSummary(nside=int(data["nside"]), ordering=str(data["ordering"]), **areas, **peak)


def _readings(data: list[dict[str, Any]], event: Event) -> tuple[CandidateReading, ...]:
    """The candidates' readings, paired with the event's candidates in order."""
    if len(data) != len(event.counterpart_candidates):
        raise ValueError("the cached candidates do not match the event's")
    return tuple(
        CandidateReading(
            candidate=c,
            credible_level=None if r["credible_level"] is None else float(r["credible_level"]),
            delay=float(r["delay_days"]) * u.d,
            delay_source=_summary(r["delay_source"]),
            windows=tuple(map(str, r["windows"])),
        )
        for c, r in zip(event.counterpart_candidates, data, strict=True)
    )


def _window_json(w: Window) -> dict[str, Any]:
    times = {
        k: [float(t.utc.jd1), float(t.utc.jd2)] for k, t in (("start", w.start), ("end", w.end))
    }
    return {"key": w.key, "band": w.band, "scenario": w.scenario, "basis": w.basis, **times}


def bundle_from_json(
    data: dict[str, Any],
    event: Event,
    settings: Settings,
    reference: Reference,
    lean: bool = False,
) -> EventBundle:
    """A bundle from its JSON and the freshly loaded event it belongs to (same key, same
    content); raises KeyError, TypeError or ValueError when the JSON is not a bundle. A
    ``lean`` one has only the numbers, class, bands, methods and sky-map summary (its JSON was
    read without its kept words)."""
    # kept words (caveats, the sound's description) were read back with the entry's JSON
    if lean:
        return EventBundle(
            Derived(
                event=event,
                settings=settings,
                reference=reference,
                quantities=packed_summaries(data["quantities"]),
                caveats=(),
                source_class=sys.intern(str(data["source_class"])),
                class_probabilities=_shared(data["class_probabilities"]),
                mass_bands={sys.intern(k): _shared(v) for k, v in data["mass_bands"].items()},
                intermediate_mass=_shared(data["intermediate_mass"]),
                disruption_probability=data["disruption_probability"],
                other_methods=tuple(map(sys.intern, data["other_methods"])),
                sky_map=_sky(data["sky_map"]),
            ),
            {},
            Audio("", "", 0.0),
            {},
            data["figure_seconds"],
        )
    quantities = {sys.intern(k): _summary(v) for k, v in data["quantities"].items()}
    sun_years = data["sun_years"]
    derived = Derived(
        event=event,
        settings=settings,
        reference=reference,
        quantities=quantities,
        caveats=tuple(
            Caveat(**{**c, "concerns": tuple(c.get("concerns", ()))}) for c in data["caveats"]
        ),
        source_class=str(data["source_class"]),
        class_probabilities=dict(data["class_probabilities"]),
        mass_bands={k: dict(v) for k, v in data["mass_bands"].items()},
        intermediate_mass=dict(data["intermediate_mass"]),
        disruption_probability=data["disruption_probability"],
        windows=tuple(_window(w) for w in data["windows"]),
        no_window_reason=_words(data["no_window_reason"]),
        comparisons=Comparisons(
            dict(data["energy"]),
            dict(data["luminosity"]),
            None if sun_years is None else float(sun_years) * u.yr,
        ),
        other_methods=tuple(data["other_methods"]),
        second_generation=tuple(SecondGeneration.from_fields(g) for g in data["second_generation"]),
        lensing=_lensing(data["lensing"]),
        sky_map=_sky(data["sky_map"]),
        candidates=_readings(data["candidates"], event),
    )
    figures = {
        str(language): tuple(FigureInfo(*map(str, f)) for f in infos)
        for language, infos in data["figures"].items()
    }
    return EventBundle(derived, figures, Audio(**data["audio"]), {}, data["figure_seconds"])


def _words(value: Any) -> str:
    """Words read back from an entry as they were stored: a kept message stays one (``str()``
    would fix it in the language in use while loading)."""
    if not isinstance(value, str):
        raise TypeError(f"expected text, got {type(value).__name__}")
    return value


def _summary(v: dict[str, Any]) -> Summary:
    shared = {k: sys.intern(x) if type(x) is str else x for k, x in v.items()}
    methods = tuple(i18n.from_json(v["methods"]))  # a list's JSON, read without the words
    return Summary(**{**shared, "level": _once(shared["level"]), "methods": _once(methods)})


class PackedSummaries(Mapping[str, Summary]):
    """The summaries of a lean bundle, by quantity: the numbers of each (median, bounds and fit
    spread) in one array, and what every event of a catalogue shares (the names, units, levels,
    frames and methods: :class:`_Shape`, held once). A :class:`~factsheet.model.Summary` is made
    on each access; held, it costs about a tenth of the Summary objects it stands for (the
    build holds one for every event at once)."""

    __slots__ = ("_numbers", "_shape")

    def __init__(self, shape: _Shape, numbers: array.array):
        self._shape, self._numbers = shape, numbers

    def __getitem__(self, name: str) -> Summary:
        i = self._shape.index[name]
        unit, level, frame, methods, spread = self._shape.words[i]
        median, low, high, fit = self._numbers[4 * i : 4 * i + 4]
        return Summary(median, low, high, unit, level, frame, fit if spread else None, methods)

    def __iter__(self) -> Iterator[str]:
        return iter(self._shape.names)

    def __len__(self) -> int:
        return len(self._shape.names)


@dataclass(frozen=True)
class _Shape:
    """The quantity names of a lean bundle, in order, and each one's unit, level, frame,
    methods and whether it has a fit spread."""

    names: tuple[str, ...]
    words: tuple[tuple[str, float, str | None, tuple[str, ...], bool], ...]
    index: dict[str, int] = field(compare=False, hash=False)


def packed_summaries(found: dict[str, dict[str, Any]]) -> Mapping[str, Summary]:
    """The summaries of an entry's JSON as a lean bundle holds them (:class:`PackedSummaries`);
    a plain dict of summaries when a number is not a float (it then keeps its exact type)."""
    summaries = {sys.intern(k): _summary(v) for k, v in found.items()}
    numbers = [
        (s.median, s.low, s.high, 0.0 if s.fit_spread is None else s.fit_spread)
        for s in summaries.values()
    ]
    if not all(type(x) is float for row in numbers for x in row[:3]) or not all(
        type(s.fit_spread) in (float, type(None)) for s in summaries.values()
    ):
        return summaries
    words = tuple(
        (s.unit, s.level, s.frame, s.methods, s.fit_spread is not None) for s in summaries.values()
    )
    shape = _SHAPES.get((tuple(summaries), words))
    if shape is None:
        names = tuple(summaries)
        shape = _Shape(names, words, {name: i for i, name in enumerate(names)})
        _SHAPES[(names, words)] = shape
    return PackedSummaries(shape, array.array("d", [x for row in numbers for x in row]))


#: The shapes of the lean bundles read, each held once.
_SHAPES: dict[tuple, _Shape] = {}


#: Values that recur across every entry (the credible level, the same few tuples of methods),
#: held once however many entries are read.
_ONCE: dict[Any, Any] = {}


def _once(value: Any) -> Any:
    """``value``, or the equal value already held (as ``sys.intern`` does for strings)."""
    if type(value) is tuple:
        value = tuple(map(sys.intern, value))
    return _ONCE.setdefault((type(value), value), value)


def _shared(probabilities: dict[str, float]) -> dict[str, float]:
    """Probabilities by key, the keys interned (the same few in every entry)."""
    return {sys.intern(k): v for k, v in probabilities.items()}


def _lensing(data: dict[str, Any] | None) -> Lensing | None:
    """The what-if-lensed panel from its JSON (None when the event has none)."""
    if data is None:
        return None
    cases = tuple(
        LensedCase(
            magnification=float(c["magnification"]),
            **{k: _summary(c[k]) for k in ("distance", "redshift", "heavier_mass", "lighter_mass")},
            remnant_mass=None if c["remnant_mass"] is None else _summary(c["remnant_mass"]),
            mass_bands={k: dict(v) for k, v in c["mass_bands"].items()},
        )
        for c in data["cases"]
    )
    return Lensing(str(data["origin"]), cases, tuple(float(x) for x in data["beyond"]))


def _window(w: dict[str, Any]) -> Window:
    start, end = (Time(*w[k], format="jd", scale="utc") for k in ("start", "end"))
    return Window(str(w["key"]), str(w["band"]), str(w["scenario"]), start, end, str(w["basis"]))
