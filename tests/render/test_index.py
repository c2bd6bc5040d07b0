"""The index: its count of sheets comes from the build, the exports are linked, internal builds
badge what a public build leaves out, and input values are shown as given. The page's HTML holds
the first rows and says where the others are; every row is in index-rows.js, with the page's
cells, in the page's language."""

from __future__ import annotations

import html as html_module
import json
import re
from html.parser import HTMLParser

import pytest
from helpers import VALID_EVENT, index_rows

from factsheet.derive import derive_event
from factsheet.i18n import use_language
from factsheet.load import load_catalogue
from factsheet.model import Settings
from factsheet.render.environment import make_environment
from factsheet.render.index_page import (
    ROW_FIELDS,
    ROWS_FILE,
    ROWS_GLOBAL,
    IndexCount,
    IndexPage,
    index_page,
    index_row,
)
from factsheet.render.site import Renderer, index_files

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


# --- the page's first rows and every row as data (index-rows.js) ------------------------------


def paged_files(n: int, page_size: int, language: str = "en") -> dict[str, bytes]:
    """The index of ``n`` invented rows, ``page_size`` rows in its HTML, in ``language``."""
    settings = Settings(title="Invented catalogue", languages=("en", "es"))
    with use_language(language):
        renderer = Renderer(make_environment(), settings, "public", "", language)
        page = IndexPage(index_rows(n), "", (), IndexCount(n, 0, 0), page_size=page_size)
        return index_files(renderer, page)


def rows_file(files: dict[str, bytes], prefix: str = "") -> dict:
    text = files[prefix + ROWS_FILE].decode("utf-8")
    assert text.startswith("// ") and f"\nwindow.{ROWS_GLOBAL} = " in text
    return json.loads(text.split(" = ", 1)[1].rstrip().removesuffix(";"))


class Cells(HTMLParser):
    """Each body row of the page's table: its cells' data-sort (None when absent) and text."""

    def __init__(self):
        super().__init__()
        self.rows: list[list[tuple[str | None, str]]] = []
        self.cell: list | None = None
        self.body = False

    def handle_starttag(self, tag, attrs):
        if tag == "tbody":
            self.body = True
        elif tag == "br" and self.cell is not None:
            self.cell[1] += " "
        elif self.body and tag == "tr":
            self.rows.append([])
        elif self.body and tag in ("th", "td"):
            self.cell = [dict(attrs).get("data-sort"), ""]

    def handle_endtag(self, tag):
        if tag == "tbody":
            self.body = False
        elif self.body and tag in ("th", "td") and self.cell is not None:
            self.rows[-1].append((self.cell[0], " ".join(self.cell[1].split())))
            self.cell = None

    def handle_data(self, data):
        if self.cell is not None:
            self.cell[1] += data


def page_cells(files: dict[str, bytes], prefix: str = "") -> list[list[tuple[str | None, str]]]:
    parser = Cells()
    parser.feed(files[prefix + "index.html"].decode("utf-8"))
    return parser.rows


def test_a_large_index_holds_its_first_rows_and_says_where_the_rest_are():
    files = paged_files(25, 10)
    html = files["index.html"].decode("utf-8")
    rows = page_cells(files)
    assert [r[0][1].split()[0] for r in rows] == [f"INV-{i:03d}" for i in range(1, 11)]
    note = re.search(r'<p class="partial-note" id="catalogue-partial">(.*?)</p>', html, re.S)
    assert note, "no note for readers without the script"
    said = html_module.unescape(re.sub(r"<[^>]+>", "", note.group(1)))
    assert " ".join(said.split()) == (
        "Without its script this page lists only the first 10 of the 25 fact sheets, in the "
        "catalogue's order. Every sheet is a row of the whole table as data (CSV, ECSV), and each "
        "sheet links the one before it and the one after it."
    )
    assert 'href="data/catalogue.csv"' in note.group(1)
    # the rows file is linked with src, so the build's link check sees it
    assert '<script src="index-rows.js" defer></script>' in html


def test_a_small_index_is_the_whole_table_without_a_note():
    files = paged_files(7, 10)
    assert len(page_cells(files)) == 7
    assert "partial-note" not in files["index.html"].decode("utf-8")
    assert len(rows_file(files)["rows"]) == 7


def test_the_rows_file_holds_every_row_with_the_cells_of_the_page():
    files = paged_files(25, 25)  # every row in the HTML, to compare them all
    data = rows_file(files)
    assert data["page_size"] == 25 and data["fields"] == list(ROW_FIELDS)
    rows = [dict(zip(data["fields"], row, strict=True)) for row in data["rows"]]
    assert [r["id"] for r in rows] == [f"INV-{i:03d}" for i in range(1, 26)]
    numbers = ("heavier_mass", "lighter_mass", "remnant_mass", "energy_radiated", "distance", "sky")
    words = data["words"]
    for row, cells in zip(rows, page_cells(files), strict=True):
        assert cells[0] == (
            row["id"],
            f"{row['id']}"
            + (f" {words['status'][row['status']]}" if row["status"] != "confirmed" else "")
            + f" {row['title']}",
        )
        assert cells[1] == (None, row["date"])
        assert cells[2] == (None, row["class"])
        for name, (sort, text) in zip(numbers, cells[3:9], strict=True):
            if row[name] is None:
                none = words["not_given" if name == "sky" else "not_computed"]
                assert (sort, text) == ("", f"— {none}")
            else:
                assert (float(sort), text) == (row[name][1], row[name][0])
        assert cells[9] == (row["status"], words["status"][row["status"]])
        assert cells[10] == (None, row["bands"])
        assert row["href"] == f"events/{row['id']}.html"


def test_the_rows_file_speaks_the_page_language_and_is_the_same_twice():
    english, spanish = paged_files(30, 10), paged_files(30, 10, "es")
    assert "es/index-rows.js" in spanish and "index-rows.js" in english
    assert '<script src="index-rows.js" defer></script>' in spanish["es/index.html"].decode()
    data = rows_file(spanish, "es/")
    assert data["words"]["status"]["candidate"] == "candidato"
    assert data["digits"] == {"group": ".", "min_digits": 5}
    assert rows_file(english)["digits"] == {"group": ",", "min_digits": 6}
    assert spanish == paged_files(30, 10, "es")  # byte for byte


def test_a_real_row_reaches_the_rows_file_in_the_page_language(derived):
    public = [d for d in derived if d.event.id == "OPEN-1"]
    settings = public[0].settings
    with use_language("es"):
        renderer = Renderer(make_environment(), settings, "public", "", "es")
        files = index_files(renderer, index_page(public, "", [], "public"))
    data = rows_file(files, renderer.prefix)
    row = dict(zip(data["fields"], data["rows"][0], strict=True))
    assert row["heavier_mass"] == ["36 +5 −4 M⊙", 36.0]  # as given, as the sheet prints it
    assert row["distance"][0] == "440 +180 −170 Mpc"
    assert row["sky"] == ["580 deg²", 580.0]
    energy = row["energy_radiated"][0]  # derived, rounded by its uncertainty: a decimal comma
    assert "," in energy and "." not in energy, energy
