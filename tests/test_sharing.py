"""Share, cite, trace: the metadata link previews read, the sharing image, the citation."""

from __future__ import annotations

import re
import struct
from pathlib import Path

import pytest
from helpers import VALID_EVENT, write_catalogue

from factsheet.build import build


@pytest.fixture(scope="module")
def site(tmp_path_factory) -> Path:
    root = tmp_path_factory.mktemp("sharing")
    settings = (
        "base_url: https://example.org/sheets/\n"
        "licence: CC BY 4.0\n"
        "citation: Cite the *Example catalogue* (2034).\n"
    )
    cat = write_catalogue(root / "cat", {"a.yaml": VALID_EVENT, "catalogue.yaml": settings})
    build(cat, root / "site", jobs=1)
    return root / "site"


def meta(html: str) -> dict[str, str]:
    found = re.findall(r'<meta (?:property|name)="([^"]+)" content="([^"]*)">', html)
    return dict(found)


def png_size(data: bytes) -> tuple[int, int]:
    """Width and height from a PNG's header (the PNG specification, IHDR chunk)."""
    assert data[:8] == b"\x89PNG\r\n\x1a\n" and data[12:16] == b"IHDR"
    return struct.unpack(">II", data[16:24])


def test_a_sheet_carries_the_metadata_link_previews_read(site):
    page = (site / "events" / "TEST-1.html").read_text(encoding="utf-8")
    tags = meta(page)
    assert tags["og:title"] == "TEST-1: A test pair"
    assert tags["description"].startswith("Two black holes of about 36 and 29")
    assert tags["og:description"] == tags["description"]
    assert tags["og:url"] == "https://example.org/sheets/events/TEST-1.html"
    assert tags["og:image"] == "https://example.org/sheets/events/TEST-1-share.png"
    assert tags["twitter:card"] == "summary_large_image"
    image = (site / "events" / "TEST-1-share.png").read_bytes()
    assert png_size(image) == (1200, 630)


def test_a_sheet_says_how_to_cite_it_and_under_which_licence(site):
    page = (site / "events" / "TEST-1.html").read_text(encoding="utf-8")
    cite = page[page.index('id="cite-heading"') :]
    assert "https://example.org/sheets/events/TEST-1.html" in cite
    assert "current estimate, undated (merger 12 April 2034)" in cite  # no dated estimate
    assert "<em>Example catalogue</em>" in cite
    footer = page[page.index("<footer") :]
    assert "CC BY 4.0" in footer
    assert re.search(r"Made with factsheet \d+\.\d+", footer)
