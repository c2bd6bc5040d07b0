"""``factsheet serve``: 127.0.0.1 only, rebuilds on change, survives bad edits, no traversal."""

import threading
import time
import urllib.error
import urllib.request

import pytest
from helpers import VALID_EVENT, write_catalogue

from factsheet import serve as preview


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
