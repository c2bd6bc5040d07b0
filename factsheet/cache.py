"""The build cache: per-event bundles keyed by everything that shapes them.

An event's key hashes its YAML file and samples file (the digests the load stage took as it
read them), the settings that change numbers, the packaged reference data and factsheet's own
code (every ``.py`` and data file of the package),
so a change in any of them re-derives exactly what depends on it. Entries live in a folder
beside the output (``.factsheet-cache-<name>/``), are written atomically and are safe to delete.
"""

from __future__ import annotations

import hashlib
import os
import pickle
import shutil
import tempfile
from dataclasses import replace
from functools import cache
from pathlib import Path

from factsheet import __version__
from factsheet.model import Event, EventBundle, Settings
from factsheet.resources import PACKAGE

FORMAT = "2"


@cache
def code_fingerprint() -> str:
    """A hash of the package's code and data files (the templates only shape the pages)."""
    digest = hashlib.sha256(f"{__version__}|{FORMAT}".encode())
    for path in sorted(PACKAGE.rglob("*")):
        if path.is_file() and path.suffix in {".py", ".yaml"} and "__pycache__" not in path.parts:
            digest.update(path.relative_to(PACKAGE).as_posix().encode())
            digest.update(path.read_bytes())
    return digest.hexdigest()


def event_key(event: Event, settings: Settings) -> str:
    """The cache key of one event: its inputs, the settings and the code."""
    digest = hashlib.sha256(code_fingerprint().encode())
    digest.update(settings.fingerprint().encode())
    digest.update(event.source_digest.encode())
    if event.samples is not None:
        digest.update(event.samples.digest.encode())
    return digest.hexdigest()[:32]


class Cache:
    """Pickled event bundles and their asset files, one folder per key."""

    def __init__(self, out: Path):
        self.root = out.parent / f".factsheet-cache-{out.name}"
        self.used: set[str] = set()

    def load(self, key: str) -> EventBundle | None:
        """The bundle stored under ``key`` (its files stay on disk), or None."""
        path = self.root / key / "bundle.pickle"
        try:
            bundle = pickle.loads(path.read_bytes())
        except (OSError, pickle.UnpicklingError, EOFError, AttributeError, ImportError):
            return None
        self.used.add(key)
        return replace(bundle, key=key)

    def store(self, key: str, bundle: EventBundle) -> EventBundle:
        """Write the bundle's files and metadata under ``key``; return it without file bytes."""
        self.root.mkdir(parents=True, exist_ok=True)
        staging = Path(tempfile.mkdtemp(prefix=".new-", dir=self.root))
        for name, content in bundle.files.items():
            target = staging / "files" / name
            target.parent.mkdir(parents=True, exist_ok=True)
            target.write_bytes(content)
        light = replace(bundle, files={}, key=key)
        (staging / "bundle.pickle").write_bytes(pickle.dumps(light, protocol=5))
        final = self.root / key
        shutil.rmtree(final, ignore_errors=True)
        os.replace(staging, final)
        self.used.add(key)
        return light

    def files(self, key: str) -> list[tuple[str, Path]]:
        """The asset files of an entry as (site path, cached file)."""
        base = self.root / key / "files"
        return [(p.relative_to(base).as_posix(), p) for p in sorted(base.rglob("*")) if p.is_file()]

    def prune(self) -> None:
        """Remove entries this build did not use (and leftovers of interrupted writes)."""
        if not self.root.is_dir():
            return
        for entry in self.root.iterdir():
            if entry.name not in self.used:
                shutil.rmtree(entry, ignore_errors=True)


def content_key(*parts: object) -> str:
    """A cache key from the repr of some inputs and the code fingerprint."""
    digest = hashlib.sha256(code_fingerprint().encode())
    for part in parts:
        digest.update(repr(part).encode())
    return "x" + digest.hexdigest()[:31]


def cached_files(cache_: Cache, key: str, make) -> dict[str, bytes]:
    """Files from the cache under ``key``, or made by ``make()`` and stored."""
    found = cache_.files(key) if (cache_.root / key / "files").is_dir() else []
    if found:
        cache_.used.add(key)
        return {name: path.read_bytes() for name, path in found}
    files = make()
    cache_.root.mkdir(parents=True, exist_ok=True)
    staging = Path(tempfile.mkdtemp(prefix=".new-", dir=cache_.root))
    for name, content in files.items():
        (staging / "files" / name).parent.mkdir(parents=True, exist_ok=True)
        (staging / "files" / name).write_bytes(content)
    shutil.rmtree(cache_.root / key, ignore_errors=True)
    os.replace(staging, cache_.root / key)
    cache_.used.add(key)
    return files
