"""``factsheet serve``: 127.0.0.1 only, rebuilds on change, survives bad edits, no traversal;
answers only its own host names, never a traceback for odd paths, a clear error for a busy port,
and a watcher that does not take a build for an edit."""

import http.client
import socket
import threading
import time
import urllib.error
import urllib.request

import pytest
from helpers import VALID_EVENT, write_catalogue

from factsheet import build as build_module
from factsheet import cli
from factsheet import serve as preview
from factsheet.errors import FactsheetError


@pytest.fixture
def running(tmp_path):
    cat = write_catalogue(tmp_path / "cat", {"a.yaml": VALID_EVENT})
    out, state, stop = tmp_path / "site", preview.State(), threading.Event()
    seen = preview.snapshot(cat)
    assert preview.rebuild(cat, out, "internal", state)
    server = preview.make_server(out, 0, state)
    threads = [
        threading.Thread(target=server.serve_forever, daemon=True),
        threading.Thread(
            target=preview.watch, args=(cat, out, "internal", state, stop, 0.1, seen), daemon=True
        ),
    ]
    for thread in threads:
        thread.start()
    yield cat, f"http://127.0.0.1:{server.server_address[1]}", state, out
    stop.set()
    server.shutdown()
    server.server_close()


def get(url: str) -> tuple[int, bytes]:
    try:
        with urllib.request.urlopen(url, timeout=5) as response:
            return response.status, response.read()
    except urllib.error.HTTPError as exc:
        return exc.code, b""


def wait_for(condition, seconds: float = 60.0) -> bool:
    end = time.monotonic() + seconds
    while time.monotonic() < end:
        if condition():
            return True
        time.sleep(0.1)
    return False


def test_binds_loopback_and_serves_the_index_with_reload_hook(running):
    _cat, base, _state, out = running
    assert base.startswith("http://127.0.0.1:")
    status, body = get(base + "/")
    assert status == 200 and b"TEST-1" in body and preview.RELOAD_PATH.encode() in body
    assert b"connect-src 'self'" in body
    assert b"__factsheet" not in (out / "index.html").read_bytes()  # files on disk untouched


def test_rebuilds_after_a_change_and_keeps_the_last_good_site(running, capsys):
    cat, base, state, _out = running
    (cat / "a.yaml").write_text(VALID_EVENT.replace("A test pair", "A renamed pair"))
    assert wait_for(lambda: state.version >= 2)
    assert b"A renamed pair" in get(base + "/events/TEST-1.html")[1]
    (cat / "a.yaml").write_text(VALID_EVENT.replace("36 +5 -4 Msun", "36 +5 -4 Mpc"))
    assert wait_for(lambda: "a.yaml:12: estimate.heavier.mass" in capsys.readouterr().err)
    status, body = get(base + "/events/TEST-1.html")
    assert status == 200 and b"A renamed pair" in body and state.version == 2


@pytest.mark.parametrize(
    "path",
    [
        "/../../etc/passwd",
        "/%2e%2e/%2e%2e/etc/passwd",
        "/events/../../cat/a.yaml",
        "/..%2f..%2fetc%2fpasswd",
    ],
)
def test_refuses_paths_outside_the_output_folder(running, path):
    _cat, base, _state, _out = running
    status, body = get(base + path)
    assert status == 404 and b"root:" not in body and b"estimate" not in body


# --- the Host check: only requests addressed to this preview (DNS rebinding) -------------------


@pytest.fixture(scope="module")
def served(tmp_path_factory):
    """One built site served for the tests that only read (no watcher)."""
    root = tmp_path_factory.mktemp("served")
    cat = write_catalogue(root / "cat", {"a.yaml": VALID_EVENT})
    out, state = root / "site", preview.State()
    assert preview.rebuild(cat, out, "internal", state)
    server = preview.make_server(out, 0, state)
    thread = threading.Thread(target=server.serve_forever, daemon=True)
    thread.start()
    yield f"http://127.0.0.1:{server.server_address[1]}"
    server.shutdown()
    server.server_close()


def exchange(base: str, request: bytes) -> tuple[int, bytes]:
    """Send raw bytes to the server; the status and the body of its answer."""
    port = int(base.rsplit(":", 1)[1])
    with socket.create_connection(("127.0.0.1", port), timeout=10) as conn:
        conn.sendall(request)
        data = b""
        while chunk := conn.recv(65536):
            data += chunk
    head, _, body = data.partition(b"\r\n\r\n")
    assert head.startswith(b"HTTP/"), data[:200]
    return int(head.split()[1]), body


def with_host(base: str, path: str, host: str | None, method: str = "GET") -> tuple[int, bytes]:
    port = int(base.rsplit(":", 1)[1])
    conn = http.client.HTTPConnection("127.0.0.1", port, timeout=10)
    try:
        conn.putrequest(method, path, skip_host=True, skip_accept_encoding=True)
        if host is not None:
            conn.putheader("Host", host.replace("PORT", str(port)))
        conn.endheaders()
        response = conn.getresponse()
        return response.status, response.read()
    finally:
        conn.close()


@pytest.mark.parametrize(
    "host", ["127.0.0.1:PORT", "localhost:PORT", "LocalHost:PORT", "[::1]:PORT", " localhost:PORT"]
)
def test_answers_its_own_names_with_its_port(served, host):
    base = served
    status, body = with_host(base, "/", host)
    assert status == 200 and b"TEST-1" in body


REFUSED_HOSTS = [
    "attacker.example:PORT",  # a rebinding name resolving to 127.0.0.1
    "attacker.example",
    "127.0.0.1",  # no port: port 80, not ours
    "localhost",
    "[::1]",
    "127.0.0.1:1",
    "localhost:PORT0",
    "127.0.0.2:PORT",
    "0.0.0.0:PORT",
    "localhost.:PORT",
    "127.0.0.1.attacker.example:PORT",
    "localhost:PORT@attacker.example",
    "localhost:PORT:PORT",
    "localhost:",
    "[::1]x:PORT",
    "[::ffff:127.0.0.1]:PORT",
    "2130706433:PORT",
    "",
]


@pytest.mark.parametrize("host", REFUSED_HOSTS)
@pytest.mark.parametrize("path", ["/", "/events/TEST-1.html", preview.VERSION_PATH])
def test_refuses_any_other_host_with_a_short_text(served, host, path):
    base = served
    status, body = with_host(base, path, host)
    assert status == 403, (host, status)
    assert body.startswith(b"Forbidden") and len(body) < 200 and b"TEST" not in body


def test_refuses_a_missing_or_repeated_host_and_an_absolute_target(served):
    base = served
    port = base.rsplit(":", 1)[1]
    assert with_host(base, "/", None)[0] == 400
    assert exchange(base, b"GET / HTTP/1.0\r\n\r\n")[0] == 400
    twice = f"GET / HTTP/1.1\r\nHost: 127.0.0.1:{port}\r\nHost: evil.example\r\n\r\n"
    assert exchange(base, twice.encode())[0] == 400
    absolute = f"GET http://evil.example/ HTTP/1.1\r\nHost: 127.0.0.1:{port}\r\n\r\n"
    status, body = exchange(base, absolute.encode())
    assert status == 400 and b"TEST" not in body


def test_host_rule():
    assert preview.host_allowed("127.0.0.1:8000", 8000)
    assert preview.host_allowed("[::1]:8000", 8000)
    assert preview.host_allowed("localhost", 80)
    assert not preview.host_allowed("localhost:٨٠٠٠", 8000)  # digits, but not ASCII ones
    assert not preview.host_allowed("localhost:8000", 8001)


# --- paths no file can have: 400 or 404, never a traceback ----------------------------------

BAD_PATHS = [
    ("/%00", 400),
    ("/a%00b.html", 400),
    ("/index.html%00", 400),
    ("/index.html%00.png", 400),
    ("/%2e%2e%00", 400),
    ("/events/%00/x", 400),
    ("/" + "a" * 256, 404),
    ("/events/" + "b" * 300 + ".html", 404),
    ("/" + "%41" * 256, 404),  # 256 bytes once decoded
    ("/" + "é" * 128, 404),  # 256 bytes in UTF-8
    ("/" + "/".join(["c" * 250] * 20), 404),  # each part fits, the whole is too long
    ("/%ed%a0%80", 404),  # an encoded lone surrogate
    ("/%ff%fe", 404),
]


@pytest.mark.parametrize("method", ["GET", "HEAD"])
@pytest.mark.parametrize(("path", "expected"), BAD_PATHS)
def test_paths_no_file_can_have_get_an_answer_not_a_traceback(
    served, capfd, method, path, expected
):
    base = served
    port = base.rsplit(":", 1)[1]
    target = path.encode("utf-8")
    request = (
        f"{method} ".encode() + target + f" HTTP/1.1\r\nHost: 127.0.0.1:{port}\r\n\r\n".encode()
    )
    status, body = exchange(base, request)
    assert status == expected
    assert (body == b"") if method == "HEAD" else (b"Traceback" not in body and len(body) < 200)
    assert get(base + "/")[0] == 200  # the server still answers
    err = capfd.readouterr().err
    assert "Traceback" not in err and "Exception" not in err


def test_raw_nul_in_the_request_line_is_a_bad_request(served, capfd):
    base = served
    port = base.rsplit(":", 1)[1]
    status, _ = exchange(base, f"GET /\x00 HTTP/1.1\r\nHost: 127.0.0.1:{port}\r\n\r\n".encode())
    assert status == 400 and "Traceback" not in capfd.readouterr().err


# --- start-up: a busy port, the audience said beside the address --------------------------


@pytest.fixture
def busy_port():
    holder = socket.socket(socket.AF_INET, socket.SOCK_STREAM)
    holder.bind(("127.0.0.1", 0))
    holder.listen(1)
    yield holder.getsockname()[1]
    holder.close()


def test_a_busy_port_is_one_clear_error_before_any_build(tmp_path, busy_port):
    cat = write_catalogue(tmp_path / "cat", {"a.yaml": VALID_EVENT})
    with pytest.raises(FactsheetError) as caught:
        preview.serve(cat, tmp_path / "site", busy_port)
    message = str(caught.value)
    assert f"port {busy_port}" in message and "-p 0" in message and "\n" not in message
    assert not (tmp_path / "site").exists()  # refused before building


def test_cli_serve_on_a_busy_port_exits_1_with_one_line(tmp_path, busy_port, capsys):
    cat = write_catalogue(tmp_path / "cat", {"a.yaml": VALID_EVENT})
    code = cli.main(["serve", str(cat), "-o", str(tmp_path / "site"), "-p", str(busy_port)])
    err = capsys.readouterr().err
    assert code == 1
    assert err.count("\n") == 1 and err.startswith(f"error: port {busy_port}")
    assert "-p 0" in err and "Traceback" not in err


@pytest.mark.parametrize("port", [-1, 65536, 10**6])
def test_a_port_that_does_not_exist_is_a_clear_error(tmp_path, port):
    with pytest.raises(FactsheetError, match=f"port {port} .*-p 0"):
        preview.make_server(tmp_path, port, preview.State())


@pytest.mark.parametrize("audience", ["internal", "public"])
def test_start_up_says_which_audience_the_preview_shows(tmp_path, capsys, monkeypatch, audience):
    monkeypatch.setattr(preview.PreviewServer, "serve_forever", lambda self, *a, **k: None)
    cat = write_catalogue(tmp_path / "cat", {"a.yaml": VALID_EVENT})
    preview.serve(cat, tmp_path / "site", 0, audience)
    lines = capsys.readouterr().err.splitlines()
    at = next(i for i, line in enumerate(lines) if "http://127.0.0.1:" in line)
    near = " ".join(lines[at : at + 2])
    if audience == "internal":
        assert "internal audience" in near and "internal notes and embargoed events" in near
        assert "--audience public" in near
    else:
        assert "public site" in near and "internal audience" not in near


# --- the watcher: what a build writes is never an edit ---------------------------------------

BUILD_LEFTOVERS = [
    "site/index.html",
    "site/events/TEST-1.html",
    ".factsheet-cache-site/ab/entry.json",
    ".factsheet-new-site-x1/index.html",
    ".factsheet-old-site-42/index.html",
    ".factsheet-lock-site",
    ".git/index",
    "notes/.draft.yaml",
    ".hidden.yaml",
]


def test_snapshot_skips_the_output_its_neighbours_and_hidden_files(tmp_path):
    cat = write_catalogue(tmp_path / "cat", {"a.yaml": VALID_EVENT, "more/b.yaml": "x: 1\n"})
    before = preview.snapshot(cat, preview.build_paths(cat / "site"))
    for name in BUILD_LEFTOVERS:
        (cat / name).parent.mkdir(parents=True, exist_ok=True)
        (cat / name).write_text("built")
    (cat / "dangling.yaml").symlink_to(cat / "nowhere.yaml")
    after = preview.snapshot(cat, preview.build_paths(cat / "site"))
    assert after == before and sorted(after) == [str(cat / "a.yaml"), str(cat / "more/b.yaml")]
    (cat / "more/b.yaml").write_text("x: 22\n")
    assert preview.snapshot(cat, preview.build_paths(cat / "site")) != before


def test_builds_into_the_catalogue_never_trigger_the_next_one(tmp_path, monkeypatch):
    # a stand-in build that writes what a build writes, so the watcher alone is tested
    cat = write_catalogue(tmp_path / "cat", {"a.yaml": VALID_EVENT})
    out, state, stop, calls = cat / "site", preview.State(), threading.Event(), []

    def fake_rebuild(catalogue, out, audience, state) -> bool:
        calls.append(time.monotonic())
        for name in BUILD_LEFTOVERS:
            path = catalogue / name
            path.parent.mkdir(parents=True, exist_ok=True)
            path.write_text(f"build {len(calls)}")
        return True

    monkeypatch.setattr(preview, "rebuild", fake_rebuild)
    fake_rebuild(cat, out, "internal", state)  # the first build, as serve makes it
    watcher = threading.Thread(
        target=preview.watch, args=(cat, out, "internal", state, stop, 0.05), daemon=True
    )
    watcher.start()
    try:
        time.sleep(2.0)
        assert len(calls) == 1, "a build was taken for an edit"
        (cat / "a.yaml").write_text(VALID_EVENT.replace("A test pair", "A renamed pair"))
        assert wait_for(lambda: len(calls) == 2, 10)
        time.sleep(2.0)
        assert len(calls) == 2 and watcher.is_alive()
    finally:
        stop.set()
        watcher.join(5)


@pytest.mark.slow
def test_real_builds_with_the_output_inside_the_catalogue_settle(tmp_path, monkeypatch):
    # the build itself may refuse this layout; the watcher must hold on its own
    monkeypatch.setattr(build_module, "check_output", lambda *a, **k: None, raising=False)
    cat = write_catalogue(tmp_path / "cat", {"a.yaml": VALID_EVENT})
    out, state, stop = cat / "site", preview.State(), threading.Event()
    assert preview.rebuild(cat, out, "internal", state) and state.version == 1
    watcher = threading.Thread(
        target=preview.watch, args=(cat, out, "internal", state, stop, 0.1), daemon=True
    )
    watcher.start()
    try:
        time.sleep(4.0)
        assert state.version == 1, f"{state.version - 1} rebuilds without an edit"
        (cat / "a.yaml").write_text(VALID_EVENT.replace("A test pair", "A renamed pair"))
        assert wait_for(lambda: state.version == 2)
        time.sleep(4.0)
        assert state.version == 2
        assert b"A renamed pair" in (out / "events/TEST-1.html").read_bytes()
    finally:
        stop.set()
        watcher.join(60)
