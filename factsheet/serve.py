"""``factsheet serve``: a local preview that rebuilds when the catalogue changes.

The site is served from the output folder on 127.0.0.1 only. A watcher thread polls the
catalogue's files; on a change it rebuilds (incrementally), and a bad edit prints its problems
while the last good site stays served. HTML responses get a tiny reload script (the built files
on disk are not changed): it polls ``/__factsheet/version`` and reloads the page after a rebuild.

The preview shows the internal audience by default (internal notes and embargoed events), so
it answers only requests addressed to itself: the ``Host`` header must name ``127.0.0.1``,
``localhost`` or ``[::1]`` with the server's own port (403 otherwise, 400 when it is missing or
repeated). A page of another site that has its own name resolve to 127.0.0.1 (DNS rebinding)
sends its own name as the host and is refused. A path with a NUL byte gets 400, one with a part
longer than a file name can be gets 404; no request makes a traceback.

The watcher skips what a build writes, so a build never triggers the next one even when the
output lies inside the catalogue: the output folder, the cache, staging and lock entries beside
it (``.factsheet-cache-<name>``, ``.factsheet-new-*``, ``.factsheet-old-*``,
``.factsheet-lock-*``) and anything hidden.
"""

from __future__ import annotations

import errno
import functools
import http.server
import os
import stat
import sys
import threading
import time
from collections.abc import Iterable
from pathlib import Path
from urllib.parse import unquote, unquote_to_bytes, urlsplit

from factsheet.build import build
from factsheet.errors import FactsheetError, printable

VERSION_PATH = "/__factsheet/version"
RELOAD_PATH = "/__factsheet/reload.js"
RELOAD_JS = b"""(function () {
  var seen = null;
  function poll() {
    fetch('/__factsheet/version', {cache: 'no-store'}).then(function (r) { return r.text(); })
      .then(function (v) { if (seen !== null && v !== seen) { location.reload(); } seen = v; })
      .catch(function () {}).finally(function () { setTimeout(poll, 1000); });
  }
  poll();
})();
"""


class State:
    """The preview's shared state: the build counter and the last error."""

    def __init__(self) -> None:
        self.version = 0
        self.lock = threading.Lock()


#: The names the preview answers to (with its own port); any other Host header is refused.
LOCAL_HOSTS = ("127.0.0.1", "localhost", "[::1]")
NAME_MAX = 255  # bytes in one file name (one part of a path) on the file systems we serve from
FREE_PORT_HINT = "choose another with -p PORT (-p 0 picks a free one)"


def host_allowed(host: str, port: int) -> bool:
    """Whether a ``Host`` header value names this preview: a local name and ``port`` (a value
    without a port means 80, as HTTP defines)."""
    host = host.strip().lower()
    if host.startswith("["):
        name, _, rest = host.partition("]")
        name += "]"
        if rest and not rest.startswith(":"):
            return False
        given = rest[1:] if rest else None
    else:
        name, colon, given = host.partition(":")
        given = given if colon else None
    if given is not None and not (given.isascii() and given.isdigit()):
        return False
    return name in LOCAL_HOSTS and (int(given) if given is not None else 80) == port


def path_problem(path: str) -> tuple[int, str] | None:
    """The status and message for a request path no file can have, else None."""
    raw = unquote_to_bytes(path)
    if b"\0" in raw:
        return 400, "Bad request: the path holds a NUL byte"
    if any(len(part) > NAME_MAX for part in raw.split(b"/")):
        return 404, "Not found: a part of the path is longer than a file name can be"
    try:
        raw.decode("utf-8")
    except UnicodeDecodeError:
        return 404, "Not found: the path is not UTF-8"
    return None


class Handler(http.server.SimpleHTTPRequestHandler):
    """Serves the output folder only; adds the reload hook to HTML pages."""

    state: State

    def parse_request(self) -> bool:
        """Parse as usual, then refuse a request not addressed to this preview by its Host."""
        if not super().parse_request():
            return False
        hosts = self.headers.get_all("Host") or []
        port = self.server.server_address[1]
        if len(hosts) != 1:
            self._text(400, "Bad request: one Host header is required")
        elif not host_allowed(hosts[0], port):
            names = ", ".join(f"http://{name}:{port}/" for name in LOCAL_HOSTS)
            self._text(403, f"Forbidden: this preview answers only at {names}")
        elif not self.path.startswith("/"):
            self._text(400, "Bad request: the request target must be a path")
        else:
            return True
        return False

    def do_GET(self) -> None:
        self._answer(head=False)

    def do_HEAD(self) -> None:
        self._answer(head=True)

    def _answer(self, head: bool) -> None:
        path = urlsplit(self.path).path
        if path == VERSION_PATH:
            return self._send(str(self.state.version).encode(), "text/plain", head)
        if path == RELOAD_PATH:
            return self._send(RELOAD_JS, "text/javascript", head)
        problem = path_problem(path)
        if problem:
            return self._text(*problem)
        try:
            target = Path(self.translate_path(self.path))
            root = Path(self.directory).resolve()
            if not target.resolve().is_relative_to(root) or ".." in unquote(path).split("/"):
                return self._text(404, "Not found")
            if target.is_dir():
                target = target / "index.html"
            page = target.read_bytes() if target.suffix == ".html" and target.is_file() else None
        except (OSError, ValueError):  # a path the file system cannot look up: no such file
            return self._text(404, "Not found")
        if page is not None:
            return self._send(_with_reload(page), "text/html; charset=utf-8", head)
        return super().do_HEAD() if head else super().do_GET()

    def _send(self, body: bytes, content_type: str, head: bool = False) -> None:
        self.send_response(200)
        self.send_header("Content-Type", content_type)
        self.send_header("Content-Length", str(len(body)))
        self.send_header("Cache-Control", "no-store")
        self.end_headers()
        if not head:
            self.wfile.write(body)

    def _text(self, status: int, message: str) -> None:
        """A short plain-text answer (refusals and errors); the connection is closed after it."""
        body = (message + "\n").encode("utf-8")
        self.close_connection = True
        self.send_response(status)
        self.send_header("Content-Type", "text/plain; charset=utf-8")
        self.send_header("Content-Length", str(len(body)))
        self.send_header("Cache-Control", "no-store")
        self.send_header("Connection", "close")
        self.end_headers()
        if self.command != "HEAD":
            self.wfile.write(body)

    def log_message(self, format: str, *args) -> None:
        pass


class PreviewServer(http.server.ThreadingHTTPServer):
    """The HTTP server of the preview: one line on stderr, not a traceback, when a request
    fails; a client that hangs up early is not an error."""

    def handle_error(self, request, client_address) -> None:
        exc = sys.exc_info()[1]
        if isinstance(exc, ConnectionError | TimeoutError):
            return
        print(f"preview: a request failed: {printable(repr(exc))}", file=sys.stderr)


def _with_reload(html: bytes) -> bytes:
    """Let the preview page poll the server: allow same-origin fetch and add the script."""
    html = html.replace(b"connect-src 'none'", b"connect-src 'self'")
    return html.replace(b"</body>", f'<script src="{RELOAD_PATH}"></script></body>'.encode(), 1)


#: Entries a build writes beside its output (and so inside a catalogue that holds the output).
BUILD_PREFIXES = (".factsheet-cache-", ".factsheet-new-", ".factsheet-old-", ".factsheet-lock-")


def build_paths(out: Path) -> list[Path]:
    """What a build into ``out`` writes: the output and, beside it, its cache folder."""
    out = Path(out).absolute()
    return [out, out.parent / f".factsheet-cache-{out.name}"]


def _skipped(name: str) -> bool:
    return name.startswith(".") or name.startswith(BUILD_PREFIXES)


def snapshot(folder: Path, ignore: Iterable[Path] = ()) -> dict[str, tuple[int, int]]:
    """Modification times and sizes of the catalogue's files.

    Skipped: the folders in ``ignore`` (the output and its cache, :func:`build_paths`), the
    entries a build writes beside its output (:data:`BUILD_PREFIXES`) and anything hidden, so
    a build never looks like an edit. A file that vanishes while it is listed is left out.
    """
    skip = {os.path.realpath(p) for p in ignore}
    found = {}
    for here, folders, files in os.walk(folder):
        folders[:] = sorted(
            name
            for name in folders
            if not _skipped(name) and os.path.realpath(os.path.join(here, name)) not in skip
        )
        for name in sorted(files):
            path = os.path.join(here, name)
            if _skipped(name):
                continue
            try:
                info = os.stat(path)
            except OSError:
                continue
            if stat.S_ISREG(info.st_mode):
                found[path] = (info.st_mtime_ns, info.st_size)
    return found


def rebuild(catalogue: Path, out: Path, audience: str, state: State) -> bool:
    """Build once; print problems instead of stopping; True when the site was replaced."""
    try:
        build(catalogue, out, audience, jobs=1)
    except FactsheetError as exc:
        lines = [str(p) for p in exc.problems] or [str(exc)]
        print("\n".join(f"error: {printable(line)}" for line in lines), file=sys.stderr)
        print("the last good site is still being served", file=sys.stderr)
        return False
    with state.lock:
        state.version += 1
    print(f"rebuilt ({time.strftime('%H:%M:%S')})", file=sys.stderr)
    return True


def make_server(out: Path, port: int, state: State) -> PreviewServer:
    """An HTTP server on 127.0.0.1 serving ``out``; a port that cannot be had is a
    :class:`FactsheetError` naming it."""
    if not 0 <= port <= 65535:
        raise FactsheetError(f"port {port} does not exist; {FREE_PORT_HINT}")
    handler = functools.partial(
        type("PreviewHandler", (Handler,), {"state": state}), directory=str(out)
    )
    try:
        return PreviewServer(("127.0.0.1", port), handler)
    except OSError as exc:
        why = "is already in use" if exc.errno == errno.EADDRINUSE else f"cannot be used ({exc})"
        raise FactsheetError(f"port {port} on 127.0.0.1 {why}; {FREE_PORT_HINT}") from exc


def watch(
    catalogue: Path,
    out: Path,
    audience: str,
    state: State,
    stop: threading.Event,
    interval: float = 0.5,
    seen: dict | None = None,
) -> None:
    """Poll the catalogue and rebuild after each change until ``stop`` is set.

    ``seen`` is the snapshot the current site was built from (taken before that build, so an
    edit made during it is not missed).
    """
    ignore = build_paths(out)
    seen = snapshot(catalogue, ignore) if seen is None else seen
    while not stop.wait(interval):
        now = snapshot(catalogue, ignore)
        if now != seen:
            seen = now
            rebuild(catalogue, out, audience, state)


def audience_note(audience: str) -> str:
    """What the preview shows, printed beside its address."""
    if audience == "internal":
        return (
            "the preview shows the internal audience: internal notes and embargoed events; "
            "preview the public site with --audience public"
        )
    return "the preview shows the public site: no internal notes, internal or embargoed events"


def serve(catalogue: Path, out: Path, port: int = 8000, audience: str = "internal") -> None:
    """Build, serve on 127.0.0.1 and rebuild on change, until interrupted."""
    catalogue, out, state = Path(catalogue), Path(out), State()
    server = make_server(out, port, state)  # a busy port fails before a long build
    try:
        seen = snapshot(catalogue, build_paths(out))
        if not rebuild(catalogue, out, audience, state) and not out.is_dir():
            raise FactsheetError("no site to serve: fix the problems above and try again")
        stop = threading.Event()
        watcher = threading.Thread(
            target=watch,
            args=(catalogue, out, audience, state, stop),
            kwargs={"seen": seen},
            daemon=True,
        )
        watcher.start()
        host, real_port = server.server_address[:2]
        print(
            f"serving {out}/ on http://{host}:{real_port}/ (Ctrl+C to stop)\n"
            f"  {audience_note(audience)}",
            file=sys.stderr,
        )
        try:
            server.serve_forever()
        finally:
            stop.set()
    finally:
        server.server_close()
