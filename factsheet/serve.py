"""``factsheet serve``: a local preview that rebuilds when the catalogue changes.

The site is served from the output folder on 127.0.0.1 only. A watcher thread polls the
catalogue's files; on a change it rebuilds (incrementally), and a bad edit prints its problems
while the last good site stays served. HTML responses get a tiny reload script (the built files
on disk are not changed): it polls ``/__factsheet/version`` and reloads the page after a rebuild.
"""

from __future__ import annotations

import functools
import http.server
import sys
import threading
import time
from pathlib import Path
from urllib.parse import unquote, urlsplit

from factsheet.build import build
from factsheet.errors import FactsheetError

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


class Handler(http.server.SimpleHTTPRequestHandler):
    """Serves the output folder only; adds the reload hook to HTML pages."""

    state: State

    def do_GET(self) -> None:
        path = urlsplit(self.path).path
        if path == VERSION_PATH:
            return self._send(str(self.state.version).encode(), "text/plain")
        if path == RELOAD_PATH:
            return self._send(RELOAD_JS, "text/javascript")
        target = Path(self.translate_path(self.path))
        root = Path(self.directory).resolve()
        if not target.resolve().is_relative_to(root) or ".." in unquote(path).split("/"):
            return self.send_error(404, "Not found")
        if target.is_dir():
            target = target / "index.html"
        if target.suffix == ".html" and target.is_file():
            return self._send(_with_reload(target.read_bytes()), "text/html; charset=utf-8")
        return super().do_GET()

    def _send(self, body: bytes, content_type: str) -> None:
        self.send_response(200)
        self.send_header("Content-Type", content_type)
        self.send_header("Content-Length", str(len(body)))
        self.send_header("Cache-Control", "no-store")
        self.end_headers()
        self.wfile.write(body)

    def log_message(self, format: str, *args) -> None:
        pass


def _with_reload(html: bytes) -> bytes:
    """Let the preview page poll the server: allow same-origin fetch and add the script."""
    html = html.replace(b"connect-src 'none'", b"connect-src 'self'")
    return html.replace(b"</body>", f'<script src="{RELOAD_PATH}"></script></body>'.encode(), 1)


def snapshot(folder: Path) -> dict[str, float]:
    """Modification times and sizes of every file under the catalogue folder."""
    return {
        str(p): (p.stat().st_mtime_ns, p.stat().st_size)
        for p in sorted(folder.rglob("*"))
        if p.is_file()
    }


def rebuild(catalogue: Path, out: Path, audience: str, state: State) -> bool:
    """Build once; print problems instead of stopping; True when the site was replaced."""
    try:
        build(catalogue, out, audience, jobs=1)
    except FactsheetError as exc:
        lines = [str(p) for p in exc.problems] or [str(exc)]
        print("\n".join(f"error: {line}" for line in lines), file=sys.stderr)
        print("the last good site is still being served", file=sys.stderr)
        return False
    with state.lock:
        state.version += 1
    print(f"rebuilt ({time.strftime('%H:%M:%S')})", file=sys.stderr)
    return True


def make_server(out: Path, port: int, state: State) -> http.server.ThreadingHTTPServer:
    """An HTTP server on 127.0.0.1 serving ``out``."""
    handler = functools.partial(
        type("PreviewHandler", (Handler,), {"state": state}), directory=str(out)
    )
    return http.server.ThreadingHTTPServer(("127.0.0.1", port), handler)


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
    seen = snapshot(catalogue) if seen is None else seen
    while not stop.wait(interval):
        now = snapshot(catalogue)
        if now != seen:
            seen = now
            rebuild(catalogue, out, audience, state)


def serve(catalogue: Path, out: Path, port: int = 8000, audience: str = "internal") -> None:
    """Build, serve on 127.0.0.1 and rebuild on change, until interrupted."""
    catalogue, out, state = Path(catalogue), Path(out), State()
    seen = snapshot(catalogue)
    if not rebuild(catalogue, out, audience, state) and not out.is_dir():
        raise FactsheetError("no site to serve: fix the problems above and try again")
    server = make_server(out, port, state)
    stop = threading.Event()
    watcher = threading.Thread(
        target=watch,
        args=(catalogue, out, audience, state, stop),
        kwargs={"seen": seen},
        daemon=True,
    )
    watcher.start()
    host, real_port = server.server_address[:2]
    print(f"serving {out}/ on http://{host}:{real_port}/ (Ctrl+C to stop)", file=sys.stderr)
    try:
        server.serve_forever()
    finally:
        stop.set()
        server.server_close()
