"""The built demo site in a real headless chromium, over http and from file://.

Checks what only a browser can: no console errors under the page's content policy, every image
decodes, no request leaves 127.0.0.1, the index table sorts and filters, audio is playable. The
browser is Debian's chromium package driven through Playwright, never a downloaded browser; the
launch arguments below run it headless, without a sandbox, a GPU or background network traffic.
"""

from __future__ import annotations

import re
import shutil
import socket
import subprocess
import sys
import time
from pathlib import Path
from urllib.parse import urlsplit

import pytest

from factsheet.build import build
from factsheet.resources import demo_dir

pytestmark = pytest.mark.browser

CHROMIUM = Path("/usr/bin/chromium")
CHROMIUM_ARGS = [
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-quic",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
]
SHEETS = ("events/MER34-001.html", "events/MER34-006.html", "events/MER34-007.html")
PAGES = ("index.html", *SHEETS)
WIDTHS = {"laptop": 1280, "phone": 390}
ARTIFACTS = Path(__file__).resolve().parents[1] / "test-artifacts"
ROW_IDS = (
    "Array.from(document.querySelectorAll('#catalogue tbody tr')).map(r => r.cells[0].dataset.sort)"
)
SHOWN = "document.querySelectorAll('#catalogue tbody tr:not([hidden])').length"
COUNT = "document.querySelector('.table-controls .count').textContent"


@pytest.fixture(scope="module")
def site(tmp_path_factory) -> Path:
    out = tmp_path_factory.mktemp("browser") / "site"
    build(demo_dir(), out)
    return out


def free_port() -> int:
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def wait_for_port(port: int, proc: subprocess.Popen) -> None:
    """Poll until the server accepts a connection (or fail if it died)."""
    for _ in range(200):
        if proc.poll() is not None:
            pytest.fail(f"http.server exited with code {proc.returncode}")
        try:
            socket.create_connection(("127.0.0.1", port), timeout=0.5).close()
            return
        except OSError:
            time.sleep(0.05)
    pytest.fail(f"http.server did not accept connections on port {port}")


@pytest.fixture(scope="module")
def http_root(site: Path):
    port = free_port()
    cmd = [sys.executable, "-m", "http.server", str(port), "--bind", "127.0.0.1"]
    proc = subprocess.Popen(
        [*cmd, "--directory", str(site)], stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL
    )
    try:
        wait_for_port(port, proc)
        yield f"http://127.0.0.1:{port}/"
    finally:
        proc.terminate()
        proc.wait(timeout=10)


@pytest.fixture(scope="module")
def browser():
    if not CHROMIUM.exists() and not shutil.which("chromium"):
        pytest.fail(
            "chromium is missing: install the system package (apt-get install -y "
            "chromium); the browser tests never download a browser"
        )
    try:
        from playwright.sync_api import sync_playwright
    except ImportError:
        pytest.fail("the playwright Python package is missing: pip install -e '.[test]'")
    with sync_playwright() as p:
        chromium = p.chromium.launch(executable_path=str(CHROMIUM), args=CHROMIUM_ARGS)
        yield chromium
        chromium.close()


@pytest.fixture(params=["http", "file"])
def root(request, site: Path) -> str:
    return request.getfixturevalue("http_root") if request.param == "http" else site.as_uri() + "/"


class Visit:
    """One page loaded in a fresh context, with its console errors and requests recorded."""

    def __init__(self, browser, url: str, width: int = 1280, scripts: bool = True):
        self.context = browser.new_context(
            viewport={"width": width, "height": 900}, java_script_enabled=scripts
        )
        self.page = self.context.new_page()
        self.page.set_default_timeout(15_000)
        self.errors: list[str] = []
        self.requests: list[str] = []
        self.page.on("console", lambda m: m.type == "error" and self.errors.append(m.text))
        self.page.on("pageerror", lambda e: self.errors.append(str(e)))
        self.page.on("request", lambda r: self.requests.append(r.url))
        self.page.on("requestfailed", self.failed)
        self.page.goto(url, wait_until="load")

    def failed(self, request) -> None:
        # A media element stops its download once it has what it needs (net::ERR_ABORTED).
        if not (request.resource_type == "media" and "ERR_ABORTED" in (request.failure or "")):
            self.errors.append(f"failed: {request.url} {request.failure}")

    def close(self) -> None:
        self.context.close()


@pytest.fixture
def visit(browser):
    opened: list[Visit] = []

    def open_(url: str, **kwargs) -> Visit:
        opened.append(Visit(browser, url, **kwargs))
        return opened[-1]

    yield open_
    for v in opened:
        v.close()


def foreign(requests: list[str]) -> list[str]:
    """Requests to anything but 127.0.0.1 or the local file system (data: URLs are inline)."""
    local = {"file", "data"}
    return [
        u
        for u in requests
        if urlsplit(u).scheme not in local and urlsplit(u).hostname != "127.0.0.1"
    ]


@pytest.mark.parametrize("path", PAGES)
def test_page_loads_clean(visit, root, path):
    v = visit(root + path)
    assert v.errors == []
    assert foreign(v.requests) == []
    assert v.requests[0] == root + path
    images = v.page.eval_on_selector_all(  # lazy images below the fold: load them as a scroll would
        "img",
        "els => Promise.all(els.map(e => { e.loading = 'eager'; "
        "return e.decode().catch(() => null).then(() => [e.src, e.naturalWidth]); }))",
    )
    assert [src for src, width in images if width == 0] == []
    assert v.page.title()


def test_index_sorts_by_header(visit, root):
    v = visit(root + "index.html")
    before = v.page.evaluate(ROW_IDS)
    header = v.page.locator("#catalogue thead th").nth(3)
    header.get_by_role("button").click()
    assert header.get_attribute("aria-sort") == "ascending"
    keys = v.page.eval_on_selector_all(
        "#catalogue tbody tr td:nth-child(4)", "tds => tds.map(td => Number(td.dataset.sort))"
    )
    assert keys == sorted(keys) and v.page.evaluate(ROW_IDS) != before
    header.get_by_role("button").press("Enter")  # keyboard: a real button, Enter toggles
    assert header.get_attribute("aria-sort") == "descending"
    keys = v.page.eval_on_selector_all(
        "#catalogue tbody tr td:nth-child(4)", "tds => tds.map(td => Number(td.dataset.sort))"
    )
    assert keys == sorted(keys, reverse=True)
    assert v.errors == []


def test_index_filters_and_counts(visit, root):
    v = visit(root + "index.html")
    total = v.page.evaluate(SHOWN)
    assert v.page.evaluate(COUNT) == f"{total} of {total} events shown"
    assert v.page.get_attribute(".table-controls .count", "aria-live") == "polite"
    v.page.get_by_label("Filter", exact=True).fill("MER34-006")
    assert v.page.evaluate(SHOWN) == 1
    assert v.page.evaluate(COUNT) == f"1 of {total} events shown"
    v.page.get_by_label("Filter", exact=True).fill("")
    v.page.get_by_label("Status", exact=True).select_option("retracted")
    shown = v.page.evaluate(SHOWN)
    assert 0 < shown < total
    assert v.page.evaluate(COUNT) == f"{shown} of {total} events shown"
    assert v.errors == []


def test_index_readable_without_scripts(visit, http_root, site):
    v = visit(http_root + "index.html", scripts=False)
    rows = v.page.locator("#catalogue tbody tr")
    assert rows.count() == len(list((site / "events").glob("*.html")))
    assert v.page.locator(".table-controls").count() == 0
    assert rows.first.locator("a").get_attribute("href").startswith("events/")
    # a catalogue of a page or less: the whole table, no note about the rest, no pager
    assert v.page.locator("#catalogue-partial").count() == 0


# Each body row of the table as the reader gets it: its classes and data, and each cell's tag,
# class, sort value (a number read as one) and contents.
ROW_CELLS = """() => Array.from(document.querySelectorAll('#catalogue tbody tr')).map(tr => [
  tr.className, tr.dataset.status, tr.dataset.class,
  Array.from(tr.cells).map(c => [c.tagName, c.className,
    c.dataset.sort === undefined ? null : (c.dataset.sort !== '' && isFinite(c.dataset.sort) ?
      Number(c.dataset.sort) : c.dataset.sort),
    c.innerHTML.replace(/\\s+/g, ' ').trim()])])"""


@pytest.mark.parametrize("path", ["index.html", "es/index.html"])
def test_index_rows_from_the_data_are_the_rows_of_the_page(visit, root, path):
    """The script writes the rows from index-rows.js as the page's HTML writes them."""
    plain = visit(root + path, scripts=False).page.evaluate(ROW_CELLS)
    v = visit(root + path)
    v.page.wait_for_selector(".table-controls")
    assert v.page.evaluate(ROW_CELLS) == plain
    assert len(plain) > 10 and v.errors == []


# --- a catalogue larger than a page: invented rows, ten to a page ------------------------------

PAGED_ROWS, PAGE = 25, 10


@pytest.fixture(scope="module")
def paged_root(tmp_path_factory) -> str:
    """An index page of invented rows, as a build writes it, ten rows to a page."""
    from helpers import index_rows

    from factsheet.i18n import use_language
    from factsheet.model import Settings
    from factsheet.render.environment import make_environment
    from factsheet.render.index_page import IndexCount, IndexPage
    from factsheet.render.site import Renderer, index_files
    from factsheet.resources import templates_dir

    folder = tmp_path_factory.mktemp("paged")
    settings = Settings(title="Invented catalogue")
    with use_language("en"):
        renderer = Renderer(make_environment(), settings, "public", "", "en")
        page = IndexPage(
            index_rows(PAGED_ROWS), "", (), IndexCount(PAGED_ROWS, 0, 0), page_size=PAGE
        )
        for name, content in index_files(renderer, page).items():
            (folder / name).write_bytes(content)
    shutil.copytree(templates_dir() / "static", folder / "static")
    return folder.as_uri() + "/"


def ids(v) -> list[str]:
    return v.page.evaluate(ROW_IDS)


def heavier(v) -> list[float]:
    return v.page.eval_on_selector_all(
        "#catalogue tbody tr td:nth-child(4)", "tds => tds.map(td => Number(td.dataset.sort))"
    )


def test_paged_index_without_scripts_lists_the_first_rows_and_says_so(visit, paged_root):
    v = visit(paged_root + "index.html", scripts=False)
    assert ids(v) == [f"INV-{i:03d}" for i in range(1, PAGE + 1)]
    note = v.page.locator("#catalogue-partial")
    assert note.is_visible()
    assert "the first 10 of the 25 fact sheets" in note.inner_text()
    assert (
        note.get_by_role("link", name="CSV", exact=True).get_attribute("href")
        == "data/catalogue.csv"
    )


def test_paged_index_pages_through_every_row(visit, paged_root):
    from helpers import index_rows

    v = visit(paged_root + "index.html")
    top, bottom = v.page.locator(".table-pager-top"), v.page.locator(".table-pager-bottom")
    assert not v.page.locator("#catalogue-partial").is_visible()  # every row is reachable here
    assert v.page.evaluate(COUNT) == "25 of 25 events shown"
    assert top.get_attribute("aria-label") == "Pages of the table"
    assert top.locator(".range").inner_text() == "Rows 1–10 of 25"
    assert top.locator(".range").get_attribute("aria-live") == "polite"
    assert top.get_by_role("button", name="Previous").is_disabled()
    assert ids(v) == [f"INV-{i:03d}" for i in range(1, 11)]
    # markup in a title is text, written by the script as by the page's HTML
    title = v.page.locator("#catalogue tbody tr").nth(2).locator("th .sub")
    assert title.inner_text().endswith("<b>&</b> <img src=x onerror=alert(1)>")
    assert v.page.locator("#catalogue tbody img:not(.sky-thumb), #catalogue tbody b").count() == 0

    top.get_by_role("button", name="Next").press("Enter")  # a real button: the keyboard works
    assert ids(v) == [f"INV-{i:03d}" for i in range(11, 21)]
    assert top.locator(".range").inner_text() == "Rows 11–20 of 25"
    v.page.wait_for_function("() => location.hash === '#page=2'")

    bottom.get_by_role("button", name="Last").click()
    assert ids(v) == [f"INV-{i:03d}" for i in range(21, 26)]
    assert bottom.locator(".range").inner_text() == "Rows 21–25 of 25"
    # the new rows start at the top: focus went to the pager above the table
    focused = "document.activeElement.closest('.table-pager-top') !== null"
    assert v.page.evaluate(focused)
    assert top.get_by_role("button", name="Next").is_disabled()

    # a sort runs over every row, not the page shown, and starts again at the first page
    masses = sorted(r.heavier_mass.sort for r in index_rows(PAGED_ROWS))
    button = v.page.locator("#catalogue thead th[data-key=heavier_mass]").get_by_role("button")
    button.click()
    assert heavier(v) == masses[:PAGE]
    assert top.locator(".range").inner_text() == "Rows 1–10 of 25"
    button.click()
    assert heavier(v) == masses[::-1][:PAGE]
    header = v.page.locator("#catalogue thead th[data-key=heavier_mass]")
    assert header.get_attribute("aria-sort") == "descending"
    v.page.locator("#catalogue thead th[data-key=id]").get_by_role("button").click()
    v.page.locator("#catalogue thead th[data-key=id]").get_by_role("button").click()
    assert ids(v)[:2] == ["INV-025", "INV-024"]

    # a filter runs over every row too
    v.page.get_by_label("Filter", exact=True).fill("inv-01")
    assert sorted(ids(v)) == [f"INV-{i:03d}" for i in range(10, 20)]
    assert v.page.evaluate(COUNT) == "10 of 25 events shown"
    assert top.get_by_role("button", name="Next").is_disabled()
    v.page.get_by_label("Filter", exact=True).fill("")
    v.page.get_by_label("Status", exact=True).select_option("candidate")
    candidates = [r.id for r in index_rows(PAGED_ROWS) if r.status == "candidate"]
    assert sorted(ids(v)) == candidates
    assert v.page.evaluate(COUNT) == f"{len(candidates)} of 25 events shown"
    assert v.errors == []


def test_paged_index_restores_its_page_from_the_address(visit, paged_root):
    from helpers import index_rows

    v = visit(paged_root + "index.html#sort=heavier_mass&order=desc&page=2")
    masses = sorted((r.heavier_mass.sort for r in index_rows(PAGED_ROWS)), reverse=True)
    assert heavier(v) == masses[PAGE : 2 * PAGE]
    header = v.page.locator("#catalogue thead th[data-key=heavier_mass]")
    assert header.get_attribute("aria-sort") == "descending"
    assert v.page.locator(".table-pager-top .range").inner_text() == "Rows 11–20 of 25"
    assert v.errors == []


@pytest.mark.parametrize("path", SHEETS)
def test_audio_is_playable(visit, http_root, path):
    v = visit(http_root + path)
    for index in range(v.page.locator("audio").count()):
        audio = v.page.locator("audio").nth(index)
        assert audio.evaluate("a => a.canPlayType('audio/wav')") != ""
        src = audio.evaluate("a => a.currentSrc || a.querySelector('source').src")
        response = v.context.request.get(src)
        assert response.status == 200
        assert response.body()[:4] == b"RIFF"
        metadata = audio.evaluate("""a => new Promise(done => {
            a.addEventListener('loadedmetadata', () => done(a.duration), {once: true});
            a.addEventListener('error', () => done(-1), {once: true});
            a.preload = 'metadata'; a.load(); })""")
        assert metadata > 0
    assert v.errors == []


@pytest.mark.parametrize("name,width", WIDTHS.items())
def test_screenshots(visit, http_root, name, width):
    ARTIFACTS.mkdir(exist_ok=True)
    for path in ("index.html", SHEETS[1]):
        v = visit(http_root + path, width=width)
        target = ARTIFACTS / f"{Path(path).stem}-{name}.png"
        v.page.screenshot(path=str(target), full_page=True)
        assert target.stat().st_size > 0
    v = visit(http_root + "index.html", width=width)  # wide tables scroll inside their wrapper
    assert v.page.evaluate("document.documentElement.scrollWidth") <= width


@pytest.mark.parametrize("path", SHEETS)
def test_sheet_prints_on_two_a4_pages_or_fewer(visit, http_root, path):
    v = visit(http_root + path)
    pdf = v.page.pdf(format="A4")
    pages = len(re.findall(rb"/Type\s*/Page[^s]", pdf))
    assert 1 <= pages <= 2, f"{path} prints on {pages} pages"


@pytest.mark.parametrize("path", SHEETS)
def test_sheet_fits_a_phone_width(visit, http_root, path):
    v = visit(http_root + path, width=390)
    assert v.page.evaluate("document.documentElement.scrollWidth") <= 390


@pytest.mark.parametrize("scheme", ["light", "dark"])
def test_methods_page_fits_a_phone_width(visit, http_root, scheme):
    v = visit(http_root + "methods.html", width=390)
    v.page.emulate_media(color_scheme=scheme)
    assert v.page.evaluate("document.documentElement.scrollWidth") <= 390
    # formulas are set as text with real superscripts, not as code
    assert v.page.locator(".method .formula sup").count() >= 10
    assert v.page.locator(".method code").count() == 0
    assert v.errors == []


def test_index_keeps_filter_and_sort_in_the_address(visit, root):
    v = visit(root + "index.html")
    v.page.get_by_label("Filter", exact=True).fill("MER34-006")
    v.page.locator("#catalogue thead th[data-key=heavier_mass]").get_by_role("button").click()
    v.page.wait_for_function("() => location.hash.includes('sort=')")  # the address follows shortly
    shared = v.page.url
    assert urlsplit(shared).fragment == "q=MER34-006&sort=heavier_mass"
    w = visit(shared)  # the shared link restores the view, from file:// as over http
    assert w.page.get_by_label("Filter", exact=True).input_value() == "MER34-006"
    assert w.page.evaluate(SHOWN) == 1
    header = w.page.locator("#catalogue thead th[data-key=heavier_mass]")
    assert header.get_attribute("aria-sort") == "ascending"
    assert v.errors == [] and w.errors == []


def test_index_says_when_nothing_matches_and_clears_the_filter(visit, root):
    v = visit(root + "index.html#q=no-such-event")
    assert v.page.evaluate(SHOWN) == 0
    message = v.page.locator("#catalogue tfoot.no-match")
    assert message.is_visible()
    assert " ".join(message.inner_text().split()) == "No event matches — clear the filter"
    message.get_by_role("button", name="clear the filter").click()
    assert v.page.evaluate(SHOWN) == v.page.locator("#catalogue tbody tr").count()
    v.page.wait_for_function("() => location.hash === ''")  # the address follows shortly
    assert not message.is_visible() and urlsplit(v.page.url).fragment == ""
    assert v.errors == []
