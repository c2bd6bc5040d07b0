"""What a reader of the demo's sheets sees, checked in headless chromium from file://.

Every page of the demo at phone width has no sideways scroll; every sheet opens with the truth
about its status, shows at most three caveat boxes before its numbers, prints mass-band rows
that add up to 100 %, shows no code names, and prints on at most two A4 pages. The browser is
Debian's chromium package driven through Playwright (see tests/test_browser.py).
"""

from __future__ import annotations

import re
import shutil
from pathlib import Path

import pytest

pytestmark = pytest.mark.browser

CHROMIUM = Path("/usr/bin/chromium")
ARGS = [
    "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
    "--disable-background-networking", "--disable-component-update", "--disable-sync",
]  # fmt: skip
#: An identifier of code (``mass_ratio``, ``effective_spin``): lower-case words joined by "_".
CODE_NAME = re.compile(r"(?<![\w.])[a-z][a-z0-9]*_[a-z0-9_]+(?![\w.])")
BOXES_BEFORE_NUMBERS = """() => {
  const numbers = document.querySelector('#numbers');
  return Array.from(document.querySelectorAll('.caveat, .opening')).filter(
    box => box.compareDocumentPosition(numbers) & Node.DOCUMENT_POSITION_FOLLOWING).length;
}"""


@pytest.fixture(scope="module")
def site(demo_site) -> Path:
    return demo_site  # the demo, built once for the session (conftest.py)


@pytest.fixture(scope="module")
def browser():
    if not CHROMIUM.exists() and not shutil.which("chromium"):
        pytest.fail("chromium is missing: install the system package (apt-get install chromium)")
    from playwright.sync_api import sync_playwright

    with sync_playwright() as p:
        chromium = p.chromium.launch(executable_path=str(CHROMIUM), args=ARGS)
        yield chromium
        chromium.close()


@pytest.fixture(scope="module")
def phone(browser):
    context = browser.new_context(viewport={"width": 390, "height": 800})
    page = context.new_page()
    yield page
    context.close()


def pages(site: Path) -> list[Path]:
    sheets = sorted((site / "events").glob("*.html"))
    return [site / "index.html", site / "methods.html", site / "changes.html", *sheets]


def test_no_page_scrolls_sideways_at_phone_width(site, phone):
    wide = {}
    for path in pages(site):
        phone.goto(path.as_uri())
        width = phone.evaluate("document.documentElement.scrollWidth")
        if width > 390:
            wide[path.name] = width
    assert wide == {}


def test_each_sheet_reads_as_a_reader_needs(site, phone):
    for path in sorted((site / "events").glob("*.html")):
        phone.goto(path.as_uri())
        name = path.name
        assert phone.evaluate(BOXES_BEFORE_NUMBERS) <= 3, name
        text = phone.evaluate("document.querySelector('main').innerText")
        assert CODE_NAME.findall(text) == [], name
        for row in phone.eval_on_selector_all(
            "table.bands tbody tr",
            "rows => rows.map(r => Array.from(r.cells).map(c => c.innerText))",
        ):
            percents = [int(cell.split()[0]) for cell in row[1:] if not cell.startswith("<")]
            assert sum(percents) == 100, (name, row)


def test_a_retracted_sheet_opens_with_the_retraction(site, phone):
    phone.goto((site / "events" / "MER34-007.html").as_uri())
    first = phone.evaluate("document.querySelector('article header').nextElementSibling.innerText")
    assert first.startswith("Retracted")
    lead = phone.evaluate("document.querySelector('.lead').innerText")
    assert lead.startswith("Had the signal been real")
    assert phone.locator("audio").count() == 0
    assert phone.locator("#windows-heading").count() == 0
    assert "Compared with familiar sources" not in phone.evaluate("document.body.innerText")
    phone.goto((site / "index.html").as_uri())  # marked in words, never struck through
    struck = phone.evaluate("""() => Array.from(document.querySelectorAll('tr.status-retracted *'))
        .filter(e => getComputedStyle(e).textDecorationLine.includes('line-through')).length""")
    assert struck == 0


def test_a_candidate_speaks_conditionally(site, phone):
    phone.goto((site / "events" / "MER34-011.html").as_uri())
    lead = phone.evaluate("document.querySelector('.lead').innerText")
    assert lead.startswith("If it is real,")
    box = phone.evaluate("document.querySelector('.caveat-warning').innerText")
    assert "Noise alone would make a signal like this about twice a year" in box
    detection = phone.evaluate("document.querySelector('.detection').innerText")
    assert "Noise alone" not in detection  # said once, in the box


def test_every_sheet_prints_on_two_a4_pages_or_fewer(site, browser):
    context = browser.new_context()
    page = context.new_page()
    too_long = {}
    for path in sorted((site / "events").glob("*.html")):
        page.goto(path.as_uri())
        count = len(re.findall(rb"/Type\s*/Page[^s]", page.pdf(format="A4")))
        if count > 2:
            too_long[path.name] = count
    context.close()
    assert too_long == {}


@pytest.mark.parametrize("width", [390, 1280])
def test_sky_figures_load_and_fit_at_phone_and_desktop_width(site, browser, width):
    context = browser.new_context(viewport={"width": width, "height": 900})
    page = context.new_page()
    shown = {}
    for name in ("MER34-005", "MER34-011", "MER34-012"):  # the demo's three sky maps
        page.goto((site / "events" / f"{name}.html").as_uri())
        figure = page.locator(f"#sky img[src$='{name}-sky.svg']")
        figure.scroll_into_view_if_needed()
        figure.evaluate("img => img.decode()")
        natural, drawn = figure.evaluate("img => [img.naturalWidth, img.clientWidth]")
        alt = figure.get_attribute("alt")
        shown[name] = natural > 0 and 0 < drawn <= width and "90 %" in alt
    page.goto((site / "index.html").as_uri())
    thumbs = page.eval_on_selector_all(
        "img[src$='-sky-small.svg']",
        # lazy images load when near the view: ask for them now, as a scroll would
        "els => Promise.all(els.map(e => { e.loading = 'eager'; "
        "return e.decode().then(() => e.naturalWidth); }))",
    )
    context.close()
    assert shown == {"MER34-005": True, "MER34-011": True, "MER34-012": True}
    assert len(thumbs) == 3 and all(w > 0 for w in thumbs)
