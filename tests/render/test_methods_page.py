"""The methods page is fit to publish: sources stated (how a value was obtained stays in the code
and the data), arXiv ids as links, formulas in Unicode with real superscripts, rest-frame delays
in the units people use, no reference to a file outside the site."""

from __future__ import annotations

import re
from html.parser import HTMLParser
from importlib.resources import files

import astropy.units as u
import pytest
import yaml
from helpers import VALID_EVENT

import factsheet.build  # noqa: F401  (registers every method)
from factsheet.build import build
from factsheet.load.reference import load_reference
from factsheet.model import WindowSpec
from factsheet.physics.registry import METHODS
from factsheet.render.methods_page import delay_range, linked, scripts

#: Maths written as code rather than for readers.
ASCII_MATHS = re.compile(
    r"\*\*|sqrt|\^|<=|>=|\b(?:pi|eta|nu|chi|chi\d\w*|tau|omega|xi|delta|dchi)\b|\d[eE]-?\d"
)
#: Notes on how we obtained a value, which stay with the maintainers.
PROVENANCE = re.compile(r"memory|secondary quotation|recalled", re.I)
#: References to files: the site's readers have only the site.
FILES = re.compile(r"docs/|\.md\b|\.py\b|\.ya?ml\b|methods\.md|§")
ARXIV_ID = re.compile(r"arXiv:\s?(\d{4}\.\d{4,5}|[a-z-]+(?:\.[A-Z]{2})?/\d{7})")


class Page(HTMLParser):
    """The page's text (scripts and styles left out) and its links with their texts."""

    def __init__(self):
        super().__init__()
        self.text: list[str] = []
        self.links: list[tuple[str, str]] = []
        self._href: str | None = None
        self._skip = 0

    def handle_starttag(self, tag, attrs):
        if tag in ("script", "style"):
            self._skip += 1
        if tag == "a":
            self._href = dict(attrs).get("href", "")
            self.links.append((self._href, ""))

    def handle_endtag(self, tag):
        if tag in ("script", "style"):
            self._skip -= 1
        if tag == "a":
            self._href = None

    def handle_data(self, data):
        if self._skip:
            return
        self.text.append(data)
        if self._href is not None:
            href, text = self.links[-1]
            self.links[-1] = (href, text + data)


@pytest.fixture(scope="module")
def page(tmp_path_factory) -> Page:
    folder = tmp_path_factory.mktemp("methods")
    (folder / "cat").mkdir()
    (folder / "cat" / "a.yaml").write_text(VALID_EVENT, encoding="utf-8")
    build(folder / "cat", folder / "site")
    parsed = Page()
    parsed.feed((folder / "site" / "methods.html").read_text(encoding="utf-8"))
    return parsed


def test_no_note_of_how_a_value_was_obtained_on_the_page(page):
    text = " ".join(page.text)
    assert not PROVENANCE.search(text), PROVENANCE.search(text)


def test_every_arxiv_id_on_the_page_is_a_link_to_its_abstract(page):
    text = " ".join(page.text)
    ids = set(ARXIV_ID.findall(text))
    assert len(ids) >= 15
    linked_ids = {
        href.removeprefix("https://arxiv.org/abs/")
        for href, label in page.links
        if href.startswith("https://arxiv.org/abs/") and label == "arXiv:" + href.rsplit("abs/")[1]
    }
    assert ids == linked_ids
    outbound = [h for h, _ in page.links if re.match(r"[a-z]+:", h)]
    assert all(h.startswith("https://arxiv.org/abs/") for h in outbound), outbound


def test_no_reference_to_a_file_outside_the_site(page):
    text = " ".join(page.text)
    assert not FILES.search(text), FILES.search(text)


def test_window_time_scales_read_in_days_and_years(page):
    text = " ".join(" ".join(page.text).split())
    assert "60 days to 1 year" in text
    assert "6 hours to 3 days" in text
    assert "1 second before to 10 seconds after" in text
    assert not re.search(r"\d\.0 s\b|\d{4,} s\b", text)  # no "5184000.0 s"


@pytest.mark.parametrize(
    ("start", "end", "words"),
    [
        (-1 * u.s, 10 * u.s, "1 second before to 10 seconds after"),
        (0.25 * u.day, 3 * u.day, "6 hours to 3 days"),
        (3 * u.day, 14 * u.day, "3 to 14 days"),
        (60 * u.day, 365 * u.day, "60 days to 1 year"),
        (-500 * u.s, 500 * u.s, "8.3 minutes before to 8.3 minutes after"),
        (-2 * u.h, -1 * u.h, "2 hours before to 1 hour before"),
        (1 * u.yr, 3 * u.yr, "1 to 3 years"),
    ],
)
def test_delay_in_words(start, end, words):
    assert delay_range(WindowSpec("k", "b", "s", start, end, "")) == words


def test_every_packaged_window_in_words():
    for spec in load_reference().windows:
        assert re.fullmatch(r"[\d.]+( \w+)?( before)? to [\d.]+ \w+( after)?", delay_range(spec))


@pytest.mark.parametrize("field", ["title", "citation", "formula", "validity", "accuracy"])
def test_registry_texts_are_for_readers(field):
    for method in METHODS.values():
        text = getattr(method, field)
        plain = re.sub(r"[\^_]\{([^{}]*)\}", r"\1", text)  # the page sets these as scripts
        assert not ASCII_MATHS.search(plain), (method.id, field, text)
        assert not PROVENANCE.search(text), (method.id, field, text)
        assert not FILES.search(text), (method.id, field, text)


def test_formulas_are_set_with_superscripts_and_subscripts(page):
    assert (
        str(scripts("(1 − a²)^{1/3}, M_{c} < 2")) == "(1 − a²)<sup>1/3</sup>, M<sub>c</sub> &lt; 2"
    )
    for method in METHODS.values():
        html = str(scripts(method.formula))
        assert "^{" not in html and "_{" not in html, method.id
    text = " ".join(page.text)
    assert "^" not in text and "**" not in text and "sqrt(" not in text


def test_links_escape_the_rest():
    html = str(linked("A & B <i> (arXiv:2004.05187); Hogg 1999, arXiv:astro-ph/9905116"))
    assert html == (
        'A &amp; B &lt;i&gt; (<a href="https://arxiv.org/abs/2004.05187">arXiv:2004.05187</a>); '
        'Hogg 1999, <a href="https://arxiv.org/abs/astro-ph/9905116">arXiv:astro-ph/9905116</a>'
    )


def test_provenance_stays_in_the_code_and_the_data():
    # Recalled values are still marked as such where maintainers look: the registry and the
    # data files, which keep a provenance note beside the source they do not publish.
    recalled = [m.id for m in METHODS.values() if "memory" in m.provenance]
    assert {"fhn18-remnant-baryon-mass", "lp01-baryon-mass"} <= set(recalled)
    for name in ("comparisons.yaml", "counterparts.yaml", "mass_bands.yaml"):
        data = yaml.safe_load((files("factsheet") / "data" / name).read_text(encoding="utf-8"))
        entries = data["windows"] if "windows" in data else list(data.values())
        notes = [e["provenance"] for e in entries if "provenance" in e]
        assert any("memory" in note for note in notes), name
        for entry in entries:
            for key in ("source", "spread", "basis"):
                assert not PROVENANCE.search(entry.get(key, "")), (name, entry.get(key))


def test_reference_values_to_three_significant_figures(page):
    text = " ".join(" ".join(page.text).split())
    assert "1.00 × 10⁴⁴ J" in text  # the supernova's 10⁵¹ erg, never "1.000 × 10⁴⁴"
    assert "2.30 M⊙" in text and "45.0 M⊙" in text
    assert "1.000 × 10" not in text
