"""The index: its count of sheets comes from the build, the exports are linked, internal builds
badge what a public build leaves out, and input values are shown as given."""

from __future__ import annotations

import re

import pytest
from helpers import VALID_EVENT

from factsheet.derive import derive_event
from factsheet.load import load_catalogue
from factsheet.render.environment import make_environment
from factsheet.render.index_page import IndexCount, index_page, index_row
from factsheet.render.site import Renderer

SETTINGS = "title: Test catalogue\nsamples: 200\nlicence: CC BY 4.0\n"


def event(event_id: str, extra: str = "") -> str:
    return VALID_EVENT.replace("id: TEST-1", f"id: {event_id}") + extra


@pytest.fixture(scope="module")
def derived(tmp_path_factory):
    folder = tmp_path_factory.mktemp("index")
    files = {
        "catalogue.yaml": SETTINGS,
        "a.yaml": event("OPEN-1"),
        "b.yaml": event("HIDDEN-2", "visibility: internal\n"),
        "c.yaml": event("LATER-3", 'embargo_until: "2999-01-01T00:00"\n'),
    }
    for name, text in files.items():
        (folder / name).write_text(text, encoding="utf-8")
    loaded = load_catalogue(folder)
    return [derive_event(e, loaded.settings) for e in loaded.events]


def render(derived, audience: str) -> str:
    renderer = Renderer(make_environment(), derived[0].settings, audience, "")
    page = index_page(derived, "", [], audience)
    return renderer.page("index.html", "index.html", page).decode("utf-8")


def text_of(html: str) -> str:
    return " ".join(re.sub(r"<[^>]+>", " ", html).split())


def test_the_count_comes_from_the_build():
    assert IndexCount(13, 0, 0).text == "This catalogue holds 13 fact sheets."
    assert IndexCount(1, 0, 0).text == "This catalogue holds 1 fact sheet."


def test_a_public_index_counts_its_sheets_and_links_the_exports(derived):
    public = [d for d in derived if d.event.id == "OPEN-1"]  # as the build selects them
    html = render(public, "public")
    assert "This catalogue holds 1 fact sheet." in text_of(html)
    assert 'href="data/catalogue.csv"' in html and 'href="data/catalogue.ecsv"' in html
    assert "Licence: CC BY 4.0" in text_of(html)
    assert "internal" not in text_of(html).split("Events", 1)[1].lower()


def test_an_internal_index_counts_and_badges_what_a_public_build_leaves_out(derived):
    html = render(derived, "internal")
    text = text_of(html)
    assert "holds 3 fact sheets, 1 internal only and 1 with an embargo date" in text
    badges = re.findall(r'<span class="badge badge-internal">([^<]*)</span>', html)
    assert sorted(badges) == ["embargoed until 2999-01-01 00:00 UTC", "internal only"]


def test_a_public_row_carries_no_visibility_or_embargo(derived):
    row = index_row(next(d for d in derived if d.event.id == "LATER-3"), "public")
    assert (row.visibility, row.embargo_until, row.withheld) == ("public", "", "")


def test_input_values_are_shown_as_given(derived):
    row = index_row(derived[0])
    assert row.heavier_mass.text == "36 +5 −4 M⊙"  # as in the input
    assert row.distance.text == "440 +180 −170 Mpc"
    assert row.heavier_mass.sort == 36
