"""Publish stage: write the new site into a staging folder beside the output, then swap it in.

The staging folder is exchanged with the old output in a single ``renameat2(RENAME_EXCHANGE)``
call on Linux (two renames elsewhere, with recovery on the next run), so an interrupted or
failed build never leaves a half-written site. A folder that factsheet did not make is never
replaced unless the caller forces it.
"""

from __future__ import annotations

import ctypes
import os
import shutil
import tempfile
from pathlib import Path, PurePosixPath

from factsheet.errors import BuildError

MARKER = ".factsheet-site"
PLACEHOLDER = "README.txt"
PLACEHOLDER_TEXT = (
    "This folder is the output of `factsheet build`: a static website of fact sheets.\n"
    "Each build replaces its contents; edit the catalogue, not these files.\n"
)
_RENAME_EXCHANGE = 2


class Staging:
    """A new site being written beside ``out``; :meth:`commit` swaps it in whole.

    Used as a context manager, an exception (or interruption) before the commit removes the
    staging folder and leaves ``out`` untouched.
    """

    def __init__(self, out: Path, force: bool = False):
        self.out = Path(out)
        self.out.parent.mkdir(parents=True, exist_ok=True)
        recover(self.out)
        if not force and not replaceable(self.out):
            raise BuildError(
                f"{self.out}: refusing to replace a folder that factsheet did not "
                "make (choose another output folder, or pass --force)"
            )
        self.folder = Path(
            tempfile.mkdtemp(prefix=f".factsheet-new-{self.out.name}-", dir=self.out.parent)
        )
        self.committed = False

    def write(self, name: str, content: bytes) -> None:
        target = self.folder / _safe_relative(name)
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_bytes(content)

    def link(self, name: str, source: Path) -> None:
        """Place an existing file (from the build cache) at ``name``: hard link, else copy."""
        target = self.folder / _safe_relative(name)
        target.parent.mkdir(parents=True, exist_ok=True)
        try:
            os.link(source, target)
        except OSError:
            shutil.copyfile(source, target)

    def commit(self) -> None:
        if not (self.folder / PLACEHOLDER).exists():
            self.write(PLACEHOLDER, PLACEHOLDER_TEXT.encode())
        self.write(MARKER, b"made by factsheet\n")
        self.folder.chmod(0o755)
        _swap_in(self.folder, self.out)
        self.committed = True

    def abort(self) -> None:
        if not self.committed:
            shutil.rmtree(self.folder, ignore_errors=True)

    def __enter__(self) -> Staging:
        return self

    def __exit__(self, *exc) -> None:
        self.abort()


def publish(files: dict[str, bytes], out: Path, force: bool = False) -> None:
    """Write ``files`` (site path to bytes) to ``out`` atomically."""
    with Staging(out, force) as staging:
        for name, content in sorted(files.items()):
            staging.write(name, content)
        staging.commit()


def _safe_relative(name: str) -> PurePosixPath:
    path = PurePosixPath(name)
    if path.is_absolute() or ".." in path.parts or not path.parts:
        raise BuildError(f"refusing to write {name!r}: outside the output folder")
    return path


def replaceable(out: Path) -> bool:
    """True when ``out`` is missing, empty, only the placeholder, or made by factsheet."""
    if not out.exists():
        return True
    if not out.is_dir() or out.is_symlink():
        return False
    names = {p.name for p in out.iterdir()}
    return not names or MARKER in names or names == {PLACEHOLDER}


def recover(out: Path) -> None:
    """Undo what an interrupted earlier swap left behind next to ``out``."""
    for stale in out.parent.glob(f".factsheet-new-{out.name}-*"):
        shutil.rmtree(stale, ignore_errors=True)
    olds = sorted(out.parent.glob(f".factsheet-old-{out.name}-*"))
    if olds and not out.exists():
        olds.pop().rename(out)
    for old in olds:
        shutil.rmtree(old, ignore_errors=True)


def _swap_in(staging: Path, out: Path) -> None:
    if not out.exists():
        staging.rename(out)
        return
    if _exchange(staging, out):
        shutil.rmtree(staging)  # now holds the previous site
        return
    old = out.parent / f".factsheet-old-{out.name}-{os.getpid()}"
    out.rename(old)
    staging.rename(out)
    shutil.rmtree(old)


def _exchange(a: Path, b: Path) -> bool:
    """Swap two paths atomically with Linux renameat2; False where unavailable."""
    try:
        libc = ctypes.CDLL(None, use_errno=True)
        renameat2 = libc.renameat2
    except (OSError, AttributeError):
        return False
    at_fdcwd = -100
    result = renameat2(at_fdcwd, os.fsencode(a), at_fdcwd, os.fsencode(b), _RENAME_EXCHANGE)
    return result == 0
