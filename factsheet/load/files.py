"""Find the files of a catalogue folder and open them safely.

Only regular files are ever opened: a FIFO, a socket or a device named like an event file, a
link that loops or leads nowhere, and a folder named ``x.yaml`` are each refused with a
one-line reason naming the path, before anything is opened (a FIFO would otherwise block the
reader for ever). Files are opened without blocking and checked again once open, so a file
swapped for a FIFO in between is refused too. Hidden files and folders (names starting with
``.``, such as ``.git/``) are not part of the catalogue: they are skipped, and the skip is
recorded with its reason.
"""

from __future__ import annotations

import errno
import os
import stat
from pathlib import Path
from typing import BinaryIO

from factsheet.errors import Problem

EVENT_SUFFIXES = (".yaml", ".yml")
CATALOGUE_FILE = "catalogue.yaml"


class FileRefused(ValueError):
    """A path that is not a regular file that may be read; the message says why."""


_KINDS = (
    (stat.S_ISDIR, "a folder"),
    (stat.S_ISFIFO, "a named pipe (FIFO)"),
    (stat.S_ISSOCK, "a socket"),
    (stat.S_ISCHR, "a character device"),
    (stat.S_ISBLK, "a block device"),
)


def kind_of(mode: int) -> str:
    """What a file of this mode is, in words ('a regular file', 'a named pipe (FIFO)', ...)."""
    if stat.S_ISREG(mode):
        return "a regular file"
    return next((words for test, words in _KINDS if test(mode)), "not a regular file")


def _not_regular(mode: int) -> str:
    return f"is {kind_of(mode)}, not a regular file (only regular files are read)"


def target_of(path: Path, root: Path | None = None) -> Path:
    """The resolved regular file ``path`` names; :class:`FileRefused` says why it cannot be read.

    Refused: a link that loops or whose target does not exist, a target outside ``root`` (when
    given), and anything that is not a regular file (a folder, a FIFO, a socket, a device).
    """
    try:
        link = path.is_symlink()
        target = path.resolve(strict=True)
    except RuntimeError:  # Python < 3.13 reports a loop this way
        raise FileRefused("link loop: the link leads back to itself") from None
    except FileNotFoundError:
        if link:
            raise FileRefused("dangling link: the file it points to does not exist") from None
        raise FileRefused("not found") from None
    except OSError as exc:
        if exc.errno == errno.ELOOP:
            raise FileRefused("link loop: the link leads back to itself") from None
        raise FileRefused(f"cannot read ({exc.strerror})") from None
    if root is not None and not target.is_relative_to(root.resolve()):
        raise FileRefused("link points outside the catalogue folder")
    try:
        mode = target.stat().st_mode
    except OSError as exc:
        raise FileRefused(f"cannot read ({exc.strerror})") from None
    if not stat.S_ISREG(mode):
        raise FileRefused(_not_regular(mode))
    return target


def open_regular(path: Path) -> BinaryIO:
    """Open a regular file for reading in binary; :class:`FileRefused` for anything else.

    The file is checked before it is opened (so a device is never opened), opened without
    blocking (so a FIFO put in its place meanwhile cannot hang the reader) and checked again
    through the open descriptor.
    """
    try:
        mode = os.stat(path).st_mode
    except OSError as exc:
        raise FileRefused(f"cannot read ({exc.strerror})") from None
    if not stat.S_ISREG(mode):
        raise FileRefused(_not_regular(mode))
    flags = os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_CLOEXEC", 0)
    try:
        fd = os.open(path, flags)
    except OSError as exc:
        raise FileRefused(f"cannot read ({exc.strerror})") from None
    try:
        mode = os.fstat(fd).st_mode
        if not stat.S_ISREG(mode):
            raise FileRefused(_not_regular(mode))
        os.set_blocking(fd, True)
        return os.fdopen(fd, "rb")
    except BaseException:
        os.close(fd)
        raise


def event_files(
    root: Path, problems: list[Problem], skipped: list[tuple[Path, str]] | None = None
) -> list[Path]:
    """Every event file under ``root`` (``*.yaml`` and ``*.yml`` in any sub-folder), sorted.

    Hidden folders and hidden event files are skipped (and listed in ``skipped`` with the
    reason), as are names that end in another spelling of the suffix (``.YAML``). A would-be
    event file that is not a regular file inside the catalogue folder is a problem; links to
    folders are not followed.
    """
    skipped = [] if skipped is None else skipped
    base = root.resolve()
    found: list[Path] = []
    folders = [root]
    while folders:
        folder = folders.pop()
        try:
            with os.scandir(folder) as listing:
                entries = sorted(listing, key=lambda e: e.name)
        except OSError as exc:
            problems.append(Problem(folder, None, "", f"cannot read folder ({exc.strerror})"))
            continue
        inner = []
        for entry in entries:
            path = Path(entry.path)
            is_event_name = path.suffix in EVENT_SUFFIXES
            try:
                is_folder = entry.is_dir(follow_symlinks=False)
                is_link = entry.is_symlink()
            except OSError as exc:
                problems.append(Problem(path, None, "", f"cannot read ({exc.strerror})"))
                continue
            if path == root / CATALOGUE_FILE:
                continue  # the settings, read by load_settings
            if entry.name.startswith("."):
                if is_folder or is_event_name:
                    what = "hidden folder" if is_folder else "hidden file"
                    skipped.append((path, f"{what} (names starting with '.' are not read)"))
            elif is_folder:
                if is_event_name:
                    problems.append(Problem(path, None, "", "is a folder, not an event file"))
                else:
                    inner.append(path)
            elif is_event_name:
                try:
                    target_of(path, base)
                except FileRefused as exc:
                    problems.append(Problem(path, None, "", str(exc)))
                else:
                    found.append(path)
            elif path.suffix.lower() in EVENT_SUFFIXES:
                skipped.append(
                    (path, f"suffix {path.suffix!r}: event files end in '.yaml' or '.yml'")
                )
            elif is_link and _is_folder(path):
                skipped.append((path, "link to a folder (links to folders are not followed)"))
        folders.extend(reversed(inner))
    return sorted(found)


def _is_folder(path: Path) -> bool:
    try:
        return path.is_dir()
    except OSError:
        return False
