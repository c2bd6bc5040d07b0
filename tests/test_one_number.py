"""One quantity, one number: every place of a demo sheet prints a quantity as its table does.

The table row of a quantity is the reference; the headline, the history list, the figures'
alt text and the sound's description must print the same median (and the history the same
interval), so a reader never sees 88 +17 −13 in one place and 88 +17 −14 in another.
"""

from __future__ import annotations

import re
from html.parser import HTMLParser
from pathlib import Path

import pytest


@pytest.fixture(scope="module")
def site(demo_site) -> Path:
    return demo_site  # the demo, built once for the session (conftest.py)


class Sheet(HTMLParser):
    """The table rows (quantity key → value text), the headline and the history items."""

    def __init__(self, html: str):
        super().__init__()
        self.rows: dict[str, str] = {}
        self.headline: list[str] = []
        self.history: list[str] = []
        self.alts: list[str] = []
        self.audio = ""
        self._row = ""
        self._cell = 0
        self._where: list[str] = []
        self._text: list[str] = []
        self.feed(html)

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        if tag == "tr" and (a.get("id") or "").startswith("row-"):
            self._row, self._cell = a["id"][4:], 0
        if tag == "td" and self._row:
            self._cell += 1
            self._text = []
        if tag == "div" and a.get("class") == "lead":
            self._where.append("lead")
        if tag == "ul" and a.get("class") == "changes":
            self._where.append("history")
        if tag == "img" and a.get("alt"):
            self.alts.append(a["alt"])
        if tag == "figcaption" and "audio-caption" in (a.get("class") or ""):
            self._where.append("audio")
        if tag in ("li", "p"):
            self._text = []

    def handle_endtag(self, tag):
        text = "".join(self._text).strip()
        if tag == "td" and self._row and self._cell == 1:
            self.rows[self._row] = re.sub(r"[⚠\d]+$", "", text.split("\n")[0]).strip()
        if tag == "tr":
            self._row = ""
        if tag == "p" and self._where[-1:] == ["lead"]:
            self.headline.append(text)
        if tag == "div" and self._where[-1:] == ["lead"]:
            self._where.pop()
        if tag == "li" and self._where[-1:] == ["history"]:
            self.history.append(text)
        if tag == "ul" and self._where[-1:] == ["history"]:
            self._where.pop()

    def handle_data(self, data):
        self._text.append(data)


def sheets(site: Path) -> list[tuple[str, Sheet]]:
    return [
        (p.name, Sheet(p.read_text(encoding="utf-8"))) for p in sorted(site.glob("events/*.html"))
    ]


def median(text: str) -> str:
    """The median of a printed value: "88 +17 −14 M⊙" → "88"."""
    return text.strip("(").split(" ")[0]


def test_the_headline_prints_the_table_medians(site):
    for name, sheet in sheets(site):
        headline = " ".join(sheet.headline)
        masses = [median(sheet.rows[k]) for k in ("heavier_mass", "lighter_mass")]
        assert f"of about {masses[0]} and {masses[1]} times" in headline or all(
            f"of about {m} solar masses" in headline for m in masses
        ), (name, masses, headline)
        if "remnant_mass" in sheet.rows and not headline.startswith("Had"):
            assert f"about {median(sheet.rows['remnant_mass'])} solar masses" in headline, name


def test_the_history_prints_the_current_values_as_the_table_does(site):
    checked = 0
    for path in sorted(site.glob("events/*.html")):
        html = path.read_text(encoding="utf-8")
        blocks = re.findall(r'<ul class="changes">(.*?)</ul>', html, re.S)
        if not blocks:
            continue
        rows = Sheet(html).rows
        for item in re.findall(r"<li>(.*?)</li>", blocks[-1]):  # the current estimate
            label, _, change = item.partition(": ")
            key = {"m₁": "heavier_mass", "m₂": "lighter_mass", "Distance": "distance"}.get(label)
            if key in rows:
                assert change.split(" → ")[-1] == rows[key], (path.name, item, rows[key])
                checked += 1
    assert checked  # the demo has an event with a history


def test_the_changes_page_prints_the_sheets_numbers(site):
    """Events whose inputs date no estimate are listed once, with their current estimate: each
    value must read as on the sheet (a samples file's summary included)."""
    html = (site / "changes.html").read_text(encoding="utf-8")
    undated = html[html.index("Added without a date") :]
    labels = {"m₁": "heavier_mass", "m₂": "lighter_mass", "Distance": "distance"}
    checked = 0
    for event_id, block in re.findall(
        r'href="events/([^"]+)\.html">.*?<ul class="changes">(.*?)</ul>', undated, re.S
    ):
        rows = Sheet((site / "events" / f"{event_id}.html").read_text(encoding="utf-8")).rows
        for item in re.findall(r"<li>(.*?)</li>", block):
            label, _, text = item.partition(": ")
            if labels.get(label) in rows:
                assert text == rows[labels[label]], (event_id, item)
                checked += 1
    assert checked > 20


def test_a_samples_file_summary_is_rounded_by_its_uncertainty(site):
    """MER34-001 gives a samples file: its sheet prints the file's summary rounded by the PDG
    rule, not with every digit of the draws' quantiles."""
    import json

    from factsheet.notation import format_interval

    data = json.loads((site / "data" / "MER34-001.json").read_text())
    rows = Sheet((site / "events" / "MER34-001.html").read_text(encoding="utf-8")).rows
    for key in ("heavier_mass", "lighter_mass", "distance"):
        q = data["quantities"][key]
        assert rows[key] == format_interval(q["median"], q["low"], q["high"], q["unit"]), key
