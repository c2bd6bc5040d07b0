"""Basic accessibility checks on the built demo: language, landmarks, heading order, alt text,
table headers, and colour contrast of the stylesheet's text colours.

Contrast follows WCAG 2.1 (W3C Recommendation, 2018): relative luminance and contrast ratio as
defined there, at least 4.5:1 for normal text (success criterion 1.4.3).
"""

import itertools
import re
from html.parser import HTMLParser

import pytest

from factsheet.build import build
from factsheet.resources import demo_dir, templates_dir

TEXT_COLOURS = ("fg", "muted", "accent", "info", "notice", "warning", "ok", "cand", "retr")


class Outline(HTMLParser):
    def __init__(self):
        super().__init__()
        self.tags: list[tuple[str, dict]] = []

    def handle_starttag(self, tag, attrs):
        self.tags.append((tag, dict(attrs)))


@pytest.fixture(scope="module")
def pages(tmp_path_factory):
    out = tmp_path_factory.mktemp("a11y") / "site"
    build(demo_dir(), out, jobs=1)
    return sorted(out.rglob("*.html"))


def outline(path) -> list[tuple[str, dict]]:
    parser = Outline()
    parser.feed(path.read_text(encoding="utf-8"))
    return parser.tags


def test_language_landmarks_and_one_h1(pages):
    for page in pages:
        tags = outline(page)
        names = [t for t, _ in tags]
        language = "es" if "es" in page.parent.parts[-2:] else "en"  # es/ and es/events/
        assert tags[0] == ("html", {"lang": language}), page
        assert {"header", "main", "footer", "nav"} <= set(names), page.name
        assert names.count("h1") == 1, page.name


def test_headings_do_not_skip_levels(pages):
    for page in pages:
        levels = [int(t[1]) for t, _ in outline(page) if re.fullmatch(r"h[1-6]", t)]
        assert all(b <= a + 1 for a, b in itertools.pairwise(levels)), page.name


def test_images_have_alt_text_and_tables_have_headers(pages):
    for page in pages:
        tags = outline(page)
        for tag, attrs in tags:
            if tag == "img":
                assert len(attrs.get("alt", "")) > 20, f"{page.name}: {attrs.get('src')}"
            if tag == "th":
                assert attrs.get("scope") in {"row", "col"}, page.name


def _luminance(hex_colour: str) -> float:
    channels = [int(hex_colour[i : i + 2], 16) / 255 for i in (1, 3, 5)]
    linear = [c / 12.92 if c <= 0.04045 else ((c + 0.055) / 1.055) ** 2.4 for c in channels]
    return 0.2126 * linear[0] + 0.7152 * linear[1] + 0.0722 * linear[2]


def contrast(a: str, b: str) -> float:
    light, dark = sorted((_luminance(a), _luminance(b)), reverse=True)
    return (light + 0.05) / (dark + 0.05)


def schemes() -> list[dict[str, str]]:
    css = (templates_dir() / "static" / "style.css").read_text()
    blocks = re.findall(r":root\s*\{([^}]*)\}", css)
    return [dict(re.findall(r"--([a-z]+):\s*(#[0-9a-fA-F]{6})", block)) for block in blocks[:2]]


def test_wcag_contrast_check_values():
    assert contrast("#000000", "#ffffff") == pytest.approx(21.0)  # WCAG 2.1 maximum
    assert contrast("#767676", "#ffffff") == pytest.approx(4.54, abs=0.01)  # common practice


@pytest.mark.parametrize("scheme", [0, 1], ids=["light", "dark"])
def test_text_colours_reach_wcag_aa_contrast(scheme):
    colours = schemes()[scheme]
    for name in TEXT_COLOURS:
        for background in ("bg", "panel"):
            ratio = contrast(colours[name], colours[background])
            assert ratio >= 4.5, f"--{name} on --{background}: {ratio:.2f}"
