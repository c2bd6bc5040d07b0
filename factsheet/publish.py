"""Publish stage: write the rendered site into a temporary folder, then swap it in.

The new site is written beside the output folder and exchanged with the old one in a single
``renameat2(RENAME_EXCHANGE)`` call on Linux (two renames elsewhere, with recovery on the next
run), so an interrupted or failed build never leaves a half-written site. A folder that factsheet
did not make is never replaced unless the caller forces it.
"""

from __future__ import annotations

import ctypes
import os
import shutil
import tempfile
from pathlib import Path, PurePosixPath

from factsheet.errors import BuildError
from factsheet.render import Site

MARKER = ".factsheet-site"
PLACEHOLDER = "README.txt"
PLACEHOLDER_TEXT = (
    "This folder is the output of `factsheet build`: a static website of fact sheets.\n"
    "Each build replaces its contents; edit the catalogue, not these files.\n"
)
_RENAME_EXCHANGE = 2


def publish(site: Site, out: Path, force: bool = False) -> None:
    """Write ``site`` to ``out`` atomically; refuse to replace a folder we did not make."""
    out = Path(out)
    out.parent.mkdir(parents=True, exist_ok=True)
    recover(out)
    if not force and not replaceable(out):
        raise BuildError(
            f"{out}: refusing to replace a folder that factsheet did not make "
            "(choose another output folder, or pass --force)"
        )
    staging = Path(tempfile.mkdtemp(prefix=".factsheet-new-", dir=out.parent))
    try:
        write_tree(site, staging)
        _swap_in(staging, out)
    except BaseException:
        shutil.rmtree(staging, ignore_errors=True)
        raise


def write_tree(site: Site, folder: Path) -> None:
    """Write every file of ``site`` under ``folder``, refusing paths that would leave it."""
    files = dict(site.files)
    files.setdefault(PLACEHOLDER, PLACEHOLDER_TEXT.encode())
    files[MARKER] = b"made by factsheet\n"
    for name, content in sorted(files.items()):
        target = folder / _safe_relative(name)
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_bytes(content)
    folder.chmod(0o755)


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
    for stale in out.parent.glob(".factsheet-new-*"):
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
