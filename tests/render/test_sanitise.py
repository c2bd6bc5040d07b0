"""Hostile text in every free-text input comes out inert: escaped as text or removed.

Plain-text fields (titles, the network's site labels, estimate labels) must come out escaped;
Markdown fields (summaries, editorial caveats, history notes, the catalogue description) go
through the sanitiser, which keeps harmless text and drops scripts, handlers, frames and unsafe
links.
"""

from __future__ import annotations

import json
from html.parser import HTMLParser
from pathlib import Path

import pytest
import yaml
from helpers import VALID_EVENT, write_catalogue

from factsheet.build import build
from factsheet.render.environment import markdown_html

ATTACKS = (
    "<script>alert(1)</script>",
    "<img src=x onerror=alert(1)>",
    "[x](javascript:alert(1))",
    "<iframe src='https://example.invalid/'></iframe>",
    "<svg onload=alert(1)><circle r=9 /></svg>",
    '<a href="data:text/html,<script>alert(1)</script>">y</a>',
    "<style>body { display: none }</style>",
    '<p style="background:url(javascript:alert(1))">z</p>',
    "</title><script>alert(1)</script>",
)
HOSTILE = " ".join(ATTACKS)
PLAIN = "Kept <b>plain</b> & words"  # harmless text that must survive, escaped
MARKDOWN = "Kept *markdown* words"
URL_ATTRIBUTES = {"href", "src", "action", "formaction", "xlink:href", "poster", "data"}
BAD_SCHEMES = ("javascript:", "vbscript:", "data:text/html")
BANNED_TAGS = {"iframe", "frame", "object", "embed", "style", "base", "form"}
OUR_SCRIPTS = ("static/catalogue.js", "index-rows.js")  # the index's script and its rows


def hostile_event() -> dict:
    event = yaml.safe_load(VALID_EVENT)
    event["title"] = f"{PLAIN} {ATTACKS[0]} {ATTACKS[1]} {ATTACKS[3]} {ATTACKS[8]}"
    event["summary"] = f"{MARKDOWN}\n\n{HOSTILE}"
    event["caveats"] = [f"Caveat {MARKDOWN} {attack}" for attack in ATTACKS]
    event["detection"]["network"] = ["A1", ATTACKS[0], ATTACKS[1]]
    earlier = {
        "heavier": {"mass": "40 +6 -5 Msun"},
        "lighter": {"mass": "30 +5 -5 Msun"},
        "distance": "500 +200 -200 Mpc",
    }
    event["history"] = [
        {
            "date": "2034-04-12",
            "label": f"First {ATTACKS[0]}",
            "note": f"Note {MARKDOWN} {HOSTILE}",
            "estimate": earlier,
        }
    ]
    return event


@pytest.fixture(scope="module")
def site(tmp_path_factory) -> Path:
    folder = tmp_path_factory.mktemp("hostile")
    settings = {
        "title": f"Catalogue {PLAIN} {ATTACKS[8]}",
        "samples": 400,
        "description": f"About {MARKDOWN}\n\n{HOSTILE}",
    }
    files = {
        "catalogue.yaml": yaml.safe_dump(settings, allow_unicode=True),
        "test-1.yaml": yaml.safe_dump(hostile_event(), allow_unicode=True),
    }
    write_catalogue(folder / "cat", files)
    build(folder / "cat", folder / "site")
    return folder / "site"


class Tags(HTMLParser):
    """Every start tag of a document with its attributes, and the text of inline scripts."""

    def __init__(self):
        super().__init__(convert_charrefs=True)
        self.tags: list[tuple[str, dict[str, str]]] = []
        self.script_text = ""
        self._in_script = False

    def handle_starttag(self, tag, attrs):
        self.tags.append((tag, {k.lower(): (v or "") for k, v in attrs}))
        self._in_script = tag == "script"

    def handle_endtag(self, tag):
        self._in_script = False

    def handle_data(self, data):
        if self._in_script:
            self.script_text += data


def parse(path: Path) -> Tags:
    parser = Tags()
    parser.feed(path.read_text(encoding="utf-8"))
    return parser


def markup_files(site: Path) -> list[Path]:
    return sorted(p for p in site.rglob("*") if p.suffix in {".html", ".xml", ".svg"})


def test_site_has_the_hostile_pages(site):
    names = {p.relative_to(site).as_posix() for p in markup_files(site)}
    assert {"index.html", "events/TEST-1.html"} <= names


def test_no_script_but_ours(site):
    for path in markup_files(site):
        text = path.read_text(encoding="utf-8")
        tags = parse(path)
        scripts = [attrs for tag, attrs in tags.tags if tag == "script"]
        assert all(a.get("src", "").endswith(OUR_SCRIPTS) for a in scripts), path
        assert tags.script_text.strip() == "", path
        assert text.count("<script") == len(scripts), path


def test_no_handlers_frames_or_unsafe_urls(site):
    for path in markup_files(site):
        for tag, attrs in parse(path).tags:
            # figures are SVG documents whose own <style> block sets line joins
            assert path.suffix == ".svg" or tag not in BANNED_TAGS | {"svg"}, (path, tag)
            assert tag not in BANNED_TAGS - {"style"}, (path, tag)
            assert not [k for k in attrs if k.startswith("on")], (path, tag, attrs)
            urls = [v.strip().lower() for k, v in attrs.items() if k in URL_ATTRIBUTES]
            assert not [u for u in urls if u.startswith(BAD_SCHEMES)], (path, tag, attrs)
            assert "javascript:" not in attrs.get("style", ""), (path, tag)


def test_raw_markup_absent(site):
    for path in markup_files(site):
        text = path.read_text(encoding="utf-8").lower()
        if path.suffix != ".svg":
            assert "<style" not in text, path
        for needle in ("<iframe", "<img src=x", "<svg onload", '<a href="data:'):
            assert needle not in text, (path, needle)


def test_markdown_fields_sanitised_to_text(site):
    clean = str(markdown_html(f"{MARKDOWN}\n\n{HOSTILE}"))
    assert "Kept <em>markdown</em> words" in clean
    for needle in (
        "onerror=",
        "onload=",
        "javascript:",
        "data:text/html",
        "<script",
        "<iframe",
        "<style",
        "<svg",
        "alert(1)",
    ):
        assert needle not in clean.lower(), needle
    page = (site / "events" / "TEST-1.html").read_text(encoding="utf-8")
    index = (site / "index.html").read_text(encoding="utf-8")
    assert clean in page  # the summary, exactly as sanitised
    assert str(markdown_html(f"About {MARKDOWN}\n\n{HOSTILE}")) in index
    assert page.count("Caveat Kept <em>markdown</em> words") == len(ATTACKS)


def test_plain_text_survives_escaped(site):
    page = (site / "events" / "TEST-1.html").read_text(encoding="utf-8")
    index = (site / "index.html").read_text(encoding="utf-8")
    for text in (page, index):
        assert "Kept &lt;b&gt;plain&lt;/b&gt; &amp; words" in text
        assert "&lt;script&gt;alert(1)&lt;/script&gt;" in text
    assert "&lt;img src=x onerror=alert(1)&gt;" in page
    network = "A1, &lt;script&gt;alert(1)&lt;/script&gt; and &lt;img src=x onerror=alert(1)&gt;"
    assert network in page


def test_index_rows_carry_text_as_data(site):
    """index-rows.js is one JSON value assigned to a global: a hostile title is a string in it
    (the page's script escapes it when it writes the row)."""
    text = (site / "index-rows.js").read_text(encoding="utf-8")
    comment, statement, end = text.split("\n")
    assert comment.startswith("// ") and end == ""
    prefix = "window.factsheetIndexRows = "
    assert statement.startswith(prefix) and statement.endswith(";")
    data = json.loads(statement.removeprefix(prefix).removesuffix(";"))
    titles = [row[data["fields"].index("title")] for row in data["rows"]]
    assert titles == [hostile_event()["title"]]


def test_json_carries_text_as_data(site):
    data = json.loads((site / "data" / "TEST-1.json").read_text(encoding="utf-8"))
    assert data["title"] == hostile_event()["title"]
    assert data["detection"]["network"] == hostile_event()["detection"]["network"]
