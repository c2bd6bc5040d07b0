"""Publish stage: write the new site into a staging folder beside the output, then swap it in.

The staging folder is exchanged with the old output in a single ``renameat2(RENAME_EXCHANGE)``
call on Linux (two renames elsewhere, with recovery on the next run), so an interrupted or
failed build never leaves a half-written site. Before anything is touched, :func:`check_output`
refuses outputs that would put the user's files at risk; :class:`OutputLock` lets one build at a
time work on an output; and :meth:`Staging.commit` swaps in only a site whose every linked file
exists. A folder that factsheet did not make is never replaced unless the caller forces it.
"""

from __future__ import annotations

import contextlib
import ctypes
import errno
import hashlib
import os
import posixpath
import re
import shutil
import tempfile
from collections.abc import Iterator
from pathlib import Path

from factsheet.errors import BuildError

try:
    import fcntl
except ImportError:  # not a POSIX system: see OutputLock
    fcntl = None  # type: ignore[assignment]

MARKER = ".factsheet-site"
PLACEHOLDER = "README.txt"
PLACEHOLDER_TEXT = (
    "This folder is the output of `factsheet build`: a static website of fact sheets.\n"
    "Each build replaces its contents; edit the catalogue, not these files.\n"
)
_RENAME_EXCHANGE = 2


def check_output(out: Path, catalogue: Path | None = None) -> None:
    """Refuse, before anything is written, an output whose replacement would lose files.

    Refused whatever ``--force`` says: an output that contains the catalogue or lies inside
    it, the current folder or a parent of it, a file, a link, or a path under a file.
    """
    out = Path(out)
    where = out.absolute()
    if out.is_symlink():
        raise BuildError(f"{out}: the output is a link; give the folder it points to, or another")
    if out.exists() and not out.is_dir():
        raise BuildError(f"{out}: the output is a file, not a folder; choose a folder")
    for parent in where.parents:
        if parent.exists() and not parent.is_dir():
            raise BuildError(f"{out}: {parent} is a file, so the output cannot be made there")
    real, here = where.resolve(), Path.cwd().resolve()
    if here == real or here.is_relative_to(real):
        raise BuildError(
            f"{out}: the output would replace the current folder or one around it; "
            "choose a folder of its own, e.g. -o site"
        )
    if catalogue is not None:
        source = Path(catalogue).resolve()
        if source == real or source.is_relative_to(real):
            raise BuildError(
                f"{out}: the output contains the catalogue {catalogue}; choose another"
            )
        if real.is_relative_to(source):
            raise BuildError(
                f"{out}: the output lies inside the catalogue {catalogue}; put it beside the "
                "catalogue instead"
            )


class OutputLock:
    """One build per output at a time: a lock file beside the output that names its holder.

    The lock is an ``fcntl.flock`` on ``.factsheet-lock-<name>``: the kernel releases it when
    the holder exits or is killed, so a lock left by a killed build is simply taken over. (Where
    ``fcntl`` is missing, the file is created exclusively and a holder that no longer runs is
    detected by its process id.)
    """

    def __init__(self, out: Path):
        self.out = Path(out)
        self.path = self.out.absolute().parent / f".factsheet-lock-{self.out.name}"
        self.fd: int | None = None

    def __enter__(self) -> OutputLock:
        self.path.parent.mkdir(parents=True, exist_ok=True)
        fd = _take(self.path) if fcntl is not None else _take_exclusive(self.path)
        if fd is None:
            holder = _holder(self.path)
            raise BuildError(
                f"{self.out}: another build into this output is running (process {holder}); "
                "wait for it to finish, or stop it"
            )
        os.ftruncate(fd, 0)
        os.write(fd, f"{os.getpid()}\n".encode())
        self.fd = fd
        HELD.add(fd)
        return self

    def __exit__(self, *exc: object) -> None:
        if self.fd is not None:
            HELD.discard(self.fd)
            if fcntl is None:
                self.path.unlink(missing_ok=True)
            os.close(self.fd)  # releases the lock; the file stays for the next build
            self.fd = None


def _take(path: Path) -> int | None:
    """The locked file descriptor of ``path``, or None when another process holds the lock."""
    fd = os.open(path, os.O_RDWR | os.O_CREAT, 0o644)
    try:
        fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)  # type: ignore[union-attr]
    except OSError as exc:
        os.close(fd)
        if exc.errno in (errno.EAGAIN, errno.EACCES, errno.EWOULDBLOCK):
            return None
        raise
    return fd


def _take_exclusive(path: Path) -> int | None:
    """Without fcntl: create ``path`` exclusively, clearing it first if its holder is gone."""
    holder = _holder(path)
    if holder.isdigit() and not _running(int(holder)):
        path.unlink(missing_ok=True)
    try:
        return os.open(path, os.O_RDWR | os.O_CREAT | os.O_EXCL, 0o644)
    except FileExistsError:
        return None


def _holder(path: Path) -> str:
    try:
        return path.read_text(encoding="ascii", errors="replace").strip() or "unknown"
    except OSError:
        return "unknown"


def _running(pid: int) -> bool:
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except PermissionError:
        return True
    return True


#: File descriptors of the locks this process holds (worker processes close their copies).
HELD: set[int] = set()


class Staging:
    """A new site being written beside ``out``; :meth:`commit` swaps it in whole.

    Used as a context manager, an exception (or interruption) before the commit removes the
    staging folder and leaves ``out`` untouched.
    """

    def __init__(self, out: Path, force: bool = False):
        self.out = Path(out)
        self.committed = False
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
        self.placed: dict[str, str] = {}  # site path to SHA-256 of every file written or linked
        self.linked: set[str] = set()  # the files taken from the site being replaced
        self._made: set[str] = {str(self.folder)}

    def write(self, name: str, content: bytes) -> None:
        target = self._target(name)
        with contextlib.suppress(FileNotFoundError):
            os.unlink(target)  # never write through a link to the published site
        with open(target, "wb") as handle:
            handle.write(content)
        self.placed[name] = hashlib.sha256(content).hexdigest()
        self.linked.discard(name)

    def link(self, source: str | Path, name: str, sha256: str) -> None:
        """Place the published file ``source`` (known to hash to ``sha256``) at ``name``: a
        hard link, or a copy where the file system has none. The swap then removes the old
        site, so the file keeps one name."""
        target = self._target(name)
        with contextlib.suppress(FileNotFoundError):
            os.unlink(target)
        try:
            os.link(source, target)
        except OSError:
            shutil.copyfile(source, target)
        self.placed[name] = sha256
        self.linked.add(name)

    def _target(self, name: str) -> str:
        """The path in the staging folder of the site path ``name`` (its folder made)."""
        target = os.path.join(self.folder, _safe_relative(name))
        parent = os.path.dirname(target)
        if parent not in self._made:
            os.makedirs(parent, exist_ok=True)
            self._made.add(parent)
        return target

    def commit(self) -> None:
        """Check that every page's links resolve, then swap the staged site in."""
        if not (self.folder / PLACEHOLDER).exists():
            self.write(PLACEHOLDER, PLACEHOLDER_TEXT.encode())
        missing = missing_links(self.folder, skip=self._checked_before())
        if missing:
            shown = "; ".join(f"{page} links {target}" for page, target in missing[:5])
            raise BuildError(
                f"{self.out}: the new site is incomplete ({len(missing)} missing files: {shown}); "
                "nothing was published"
            )
        self.write(MARKER, b"made by factsheet\n")
        self.folder.chmod(0o755)
        _swap_in(self.folder, self.out)
        self.committed = True

    def _checked_before(self) -> set[str]:
        """Pages taken unchanged from the site being replaced, whose links were checked when
        it was published: they need no new check unless a file of that site is gone from the
        new one (the only way one of their links could now miss)."""
        pages = {name for name in self.linked if name.endswith(".html")}
        if not pages or not self.out.is_dir():
            return set()
        kept = set(self.placed) | {MARKER, PLACEHOLDER}
        return pages if all(name in kept for name in regular_files(self.out)) else set()

    def abort(self) -> None:
        if not self.committed:
            shutil.rmtree(self.folder, ignore_errors=True)

    def __enter__(self) -> Staging:
        return self

    def __exit__(self, *exc) -> None:
        self.abort()


_LINK = re.compile(rb"""(?:href|src)="([^"#?]*)""")


def missing_links(folder: Path, skip: set[str] | None = None) -> list[tuple[str, str]]:
    """Every (page, target) where an HTML page of the site (but those in ``skip``) links a
    file that is not there.

    Links with a scheme (``https:``, ``mailto:``, ``data:``) and fragments are not files of the
    site and are skipped.
    """
    files = set(regular_files(folder))
    found = []
    for page in sorted(p for p in files if p.endswith(".html") and p not in (skip or ())):
        for match in _LINK.finditer((folder / page).read_bytes()):
            link = match.group(1).decode("utf-8", "replace")
            if not link or ":" in link.split("/")[0]:
                continue
            if posixpath.normpath(posixpath.join(posixpath.dirname(page), link)) not in files:
                found.append((page, link))
    return found


def regular_files(folder: Path, prefix: str = "") -> Iterator[str]:
    """Site paths of the regular files under ``folder`` (links are not followed)."""
    with os.scandir(folder) as entries:
        for entry in entries:
            if entry.is_dir(follow_symlinks=False):
                yield from regular_files(Path(entry.path), f"{prefix}{entry.name}/")
            elif entry.is_file(follow_symlinks=False):
                yield f"{prefix}{entry.name}"


def publish(files: dict[str, bytes], out: Path, force: bool = False) -> None:
    """Write ``files`` (site path to bytes) to ``out`` atomically."""
    with Staging(out, force) as staging:
        for name, content in sorted(files.items()):
            staging.write(name, content)
        staging.commit()


def _safe_relative(name: str) -> str:
    """``name`` as a relative path inside the output (refused if it would leave it)."""
    parts = [part for part in name.split("/") if part not in ("", ".")]
    if name.startswith("/") or ".." in parts or not parts:
        raise BuildError(f"refusing to write {name!r}: outside the output folder")
    return os.path.join(*parts)


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
