"""Changes and the Atom feed: one entry per addition or revision, dated from the inputs."""

from __future__ import annotations

import xml.etree.ElementTree as ET
from dataclasses import replace
from html.parser import HTMLParser

import pytest
from astropy.time import Time

from factsheet.build import build_time, select_events
from factsheet.derive import derive_event
from factsheet.i18n import use_language
from factsheet.load import load_catalogue
from factsheet.load.values import parse_interval
from factsheet.model import Body, Estimate
from factsheet.render.environment import make_environment
from factsheet.render.feed import atom_feed, entry_id, entry_summary
from factsheet.render.history import (
    UNDATED_NOTE,
    ChangesPage,
    change_entries,
    changes_between,
    changes_page,
    history_steps,
)
from factsheet.render.site import Renderer
from factsheet.resources import demo_dir

ATOM = "{http://www.w3.org/2005/Atom}"
ABSURD_EPOCH = "253402300799"  # 9999-12-31T23:59:59 UTC: must never show up

SETTINGS = "title: Test catalogue\nsamples: 200\n"
NO_HISTORY = """\
id: A-1
title: "<script>alert(1)</script> & friends"
time: "2034-03-01T10:00:00"
estimate:
  heavier: {mass: 30 +5 -5 Msun}
  lighter: {mass: 20 +5 -5 Msun}
  distance: 500 +100 -100 Mpc
"""
REVISED = """\
id: B-2
title: "Revised ]]> twice"
time: "2034-04-02T08:30:00"
estimate:
  heavier: {mass: 38 +4 -4 Msun, spin: 0.2 +0.2 -0.2}
  lighter: {mass: 30 +4 -4 Msun}
  distance: 800 +200 -200 Mpc
history:
  - {date: "2034-04-02", label: Rapid, note: "First look.",
     estimate: {heavier: {mass: 40 +8 -8 Msun}, lighter: {mass: 31 +6 -6 Msun},
                distance: 900 +300 -300 Mpc}}
  - {date: "2034-05-20", label: Refined, note: "All sites.",
     estimate: {heavier: {mass: 39 +5 -5 Msun}, lighter: {mass: 30 +4 -4 Msun},
                distance: 800 +200 -200 Mpc}}
"""
SETTLED = """\
id: C-3
title: Settled
time: "2034-06-10T01:00:00"
estimate:
  heavier: {mass: 12 +2 -2 Msun}
  lighter: {mass: 8 +2 -2 Msun}
  distance: 300 +90 -90 Mpc
history:
  - {date: "2034-06-11T12:00:00", label: Rapid,
     estimate: {heavier: {mass: 13 +3 -3 Msun}, lighter: {mass: 8 +2 -2 Msun},
                distance: 320 +90 -90 Mpc}}
  - {date: "2034-07-01", label: Final,
     estimate: {heavier: {mass: 12 +2 -2 Msun}, lighter: {mass: 8 +2 -2 Msun},
                distance: 300 +90 -90 Mpc}}
"""
UNCHANGED = """\
id: D-4
time: "2034-08-01T00:00:00"
estimate:
  heavier: {mass: 19 +3 -3 Msun}
  lighter: {mass: 15 +2 -2 Msun}
  distance: 600 +90 -90 Mpc
history:
  - {date: "2034-08-02", label: Rapid,
     estimate: {heavier: {mass: 20 +3 -3 Msun}, lighter: {mass: 15 +2 -2 Msun},
                distance: 600 +90 -90 Mpc}}
  - {date: "2034-08-09", label: Rechecked,
     estimate: {heavier: {mass: 20 +3 -3 Msun}, lighter: {mass: 15 +2 -2 Msun},
                distance: 600 +90 -90 Mpc}}
"""
# One addition per event (3); revisions: B-2 "Refined" and its undated current estimate (2),
# C-3 "Final" (1); C-3's current estimate equals "Final", so it is no revision.
INPUT_DATES = {
    ("A-1", "added"): ["2034-03-01T10:00:00.000Z"],  # undated: carries the merger time
    ("B-2", "added"): ["2034-04-02T08:30:00.000Z"],  # day-only date before the merger: merger
    ("B-2", "revised"): ["2034-05-20T00:00:00.000Z", "2034-05-20T00:00:00.000Z"],
    ("C-3", "added"): ["2034-06-11T12:00:00.000Z"],
    ("C-3", "revised"): ["2034-07-01T00:00:00.000Z"],
}


@pytest.fixture
def derived(catalogue, monkeypatch):
    monkeypatch.setenv("SOURCE_DATE_EPOCH", ABSURD_EPOCH)
    folder = catalogue(
        {"catalogue.yaml": SETTINGS, "a.yaml": NO_HISTORY, "b.yaml": REVISED, "c.yaml": SETTLED}
    )
    loaded = load_catalogue(folder)
    events, _, _ = select_events(loaded, "public", build_time())
    return [derive_event(e, loaded.settings) for e in events]


def parse(feed: bytes) -> ET.Element:
    root = ET.fromstring(feed)
    assert root.tag == f"{ATOM}feed"
    return root


def test_one_entry_per_addition_or_revision(derived):
    entries = change_entries(derived)
    assert len(entries) == 6
    found: dict = {}
    for e in entries:
        found.setdefault((e.event_id, e.kind), []).append(e.timestamp)
    assert found == INPUT_DATES
    root = parse(atom_feed(entries, derived[0].settings))
    assert len(root.findall(f"{ATOM}entry")) == 6


def test_entries_newest_first_and_deterministic(derived):
    entries = change_entries(derived)
    stamps = [e.timestamp for e in entries]
    assert stamps == sorted(stamps, reverse=True)
    same_day = [e for e in entries if e.event_id == "B-2" and e.day == "2034-05-20"]
    assert [e.label for e in same_day] == ["Current estimate", "Refined"]
    assert same_day[0].note == UNDATED_NOTE
    assert atom_feed(entries, derived[0].settings) == atom_feed(
        change_entries(list(reversed(derived))), derived[0].settings
    )


def test_what_changed_old_to_new(derived):
    by_label = {(e.event_id, e.label): e for e in change_entries(derived)}
    refined = [c.text for c in by_label["B-2", "Refined"].changes]
    # values as the sheets write them: the given interval, with the digits it was given with
    assert refined == [
        "m₁: 40 +8 −8 M⊙ → 39 +5 −5 M⊙",
        "m₂: 31 +6 −6 M⊙ → 30 +4 −4 M⊙",
        "Distance: 900 +300 −300 Mpc → 800 +200 −200 Mpc",
    ]
    current = [c.text for c in by_label["B-2", "Current estimate"].changes]
    assert current == [
        "m₁: 39 +5 −5 M⊙ → 38 +4 −4 M⊙",
        "χ₁: not given → 0.2 +0.2 −0.2",
    ]  # as given: the digits the input wrote
    first = [c.text for c in by_label["A-1", "First estimate"].changes]
    assert first == ["m₁: 30 +5 −5 M⊙", "m₂: 20 +5 −5 M⊙", "Distance: 500 +100 −100 Mpc"]


def test_feed_dates_come_from_the_inputs_not_the_clock(derived):
    feed = atom_feed(change_entries(derived), derived[0].settings)
    root = parse(feed)
    assert b"9999-12-31" not in feed
    assert Time.now().utc.isot[:10].encode() not in feed
    assert root.find(f"{ATOM}updated").text == "2034-07-01T00:00:00.000Z"
    dates = sorted(e.find(f"{ATOM}updated").text for e in root.findall(f"{ATOM}entry"))
    assert dates == sorted(d for ds in INPUT_DATES.values() for d in ds)


def test_feed_has_the_required_atom_elements(derived):
    root = parse(atom_feed(change_entries(derived), derived[0].settings))
    for tag in ("id", "title", "updated", "author/" + ATOM + "name"):
        assert root.find(ATOM + tag).text
    ids = []
    for entry in root.findall(f"{ATOM}entry"):
        for tag in ("id", "title", "updated", "summary"):
            assert entry.find(ATOM + tag).text, tag
        ids.append(entry.find(f"{ATOM}id").text)
        assert entry.find(f"{ATOM}link").get("href").startswith("events/")
    assert len(set(ids)) == len(ids)
    assert all(i.startswith("urn:uuid:") for i in ids)


def test_entry_ids_are_stable_across_builds(derived, monkeypatch):
    first = [entry_id(e) for e in change_entries(derived)]
    monkeypatch.setenv("SOURCE_DATE_EPOCH", "1")  # another build, another clock
    folder = derived[0].event.source.parent
    rebuilt = [
        derive_event(e, d.settings)
        for e, d in zip(load_catalogue(folder).events, derived, strict=True)
    ]
    assert [entry_id(e) for e in change_entries(rebuilt)] == first


def test_a_feed_in_another_language_keeps_its_structure(derived):
    # One feed per language: the words change; the elements, dates and links do not, and the
    # second language's feed and entries have ids of their own (Atom ids are unique).
    def shape(root):
        return [
            (el.tag, el.get("href"), el.text if el.tag.endswith("updated") else None)
            for el in root.iter()
        ]

    def ids(root):
        return [el.text for el in root.iter() if el.tag.endswith("id")]

    settings = replace(derived[0].settings, languages=("en", "es"))
    english = parse(atom_feed(change_entries(derived), settings))
    with use_language("es"):
        feed = atom_feed(change_entries(derived), settings)
    spanish = parse(feed)
    assert shape(spanish) == shape(english)
    assert not set(ids(spanish)) & set(ids(english))
    assert english.get("{http://www.w3.org/XML/1998/namespace}lang") == "en"
    assert spanish.get("{http://www.w3.org/XML/1998/namespace}lang") == "es"
    assert ids(english)[0] == atom_id_of_first_language(settings)


def atom_id_of_first_language(settings) -> str:
    import uuid

    from factsheet.render.feed import NAMESPACE

    return f"urn:uuid:{uuid.uuid5(NAMESPACE, 'feed|' + str.__str__(settings.title))}"


def test_hostile_text_is_escaped(derived):
    feed = atom_feed(change_entries(derived), derived[0].settings)
    assert b"<script>" not in feed and b"]]>" not in feed
    assert b"&lt;script&gt;alert(1)&lt;/script&gt; &amp; friends" in feed
    root = parse(feed)
    titles = [e.find(f"{ATOM}title").text for e in root.findall(f"{ATOM}entry")]
    assert "A-1 added: First estimate — <script>alert(1)</script> & friends" in titles
    assert any(t.endswith("Revised ]]> twice") for t in titles)


def test_characters_xml_forbids_are_dropped(derived):
    # The loader refuses control characters; the feed drops any that reach it all the same.
    entries = [replace(e, title="A \x01 b\ufffe") for e in change_entries(derived)]
    feed = atom_feed(entries, derived[0].settings)
    assert b"\x01" not in feed and "\ufffe".encode() not in feed
    titles = [e.find(f"{ATOM}title").text for e in parse(feed).findall(f"{ATOM}entry")]
    assert all(t.endswith("A  b") for t in titles)


def test_absolute_links_with_a_base_url(derived):
    settings = replace(derived[0].settings, base_url="https://example.org/cat/")
    root = parse(atom_feed(change_entries(derived), settings))
    links = [e.find(f"{ATOM}link").get("href") for e in root.findall(f"{ATOM}entry")]
    assert "https://example.org/cat/events/A-1.html" in links
    self_link = [x for x in root.findall(f"{ATOM}link") if x.get("rel") == "self"]
    assert self_link[0].get("href") == "https://example.org/cat/feed.xml"


class Page(HTMLParser):
    def __init__(self):
        super().__init__()
        self.links: list[str] = []
        self.times: list[str] = []
        self.text: list[str] = []

    def handle_starttag(self, tag, attrs):
        attrs = dict(attrs)
        if tag == "a":
            self.links.append(attrs["href"])
        if tag == "time":
            self.times.append(attrs["datetime"])
        assert tag != "script"

    def handle_data(self, data):
        self.text.append(data)


def test_changes_page(derived):
    entries = change_entries(derived)
    renderer = Renderer(make_environment(), derived[0].settings, "public", "")
    html = renderer.page("changes.html", "changes.html", changes_page(change_entries(derived)))
    page = Page()
    page.feed(html.decode("utf-8"))
    assert "feed.xml" in page.links and "events/B-2.html" in page.links
    assert page.times == [e.timestamp for e in entries]  # dated ones, then the undated
    text = " ".join("".join(page.text).split())
    assert "<script>alert(1)</script> & friends" in text
    assert "m₁: 40 +8 −8 M⊙ → 39 +5 −5 M⊙" in text
    assert "merger 2034-03-01" in text  # A-1's addition is undated: its merger date, labelled
    assert "not from a full re-analysis" in text


def test_demo_history_event():
    catalogue = load_catalogue(demo_dir())
    event = next(e for e in catalogue.events if e.id == "MER34-006")
    item = derive_event(event, replace(catalogue.settings, samples=200))
    entries = change_entries([item])
    assert [(e.kind, e.label) for e in reversed(entries)] == [
        ("added", "Rapid estimate"),
        ("revised", "Refined estimate"),
        ("revised", "Current estimate"),
    ]
    assert entries[-1].timestamp == event.time.utc.isot + "Z"


def test_detector_frame_masses_are_labelled_as_such():
    estimate = Estimate(
        heavier=Body(parse_interval("30 +3 -3 Msun")),
        lighter=Body(parse_interval("20 +2 -2 Msun")),
        distance=parse_interval("400 +100 -100 Mpc"),
    )
    labels = [c.label for c in changes_between(None, estimate, "detector")]
    assert labels == ["m₁ (detector frame)", "m₂ (detector frame)", "Distance"]
    assert [c.label for c in changes_between(None, estimate)] == ["m₁", "m₂", "Distance"]


def test_a_revision_without_change_says_so(catalogue):
    folder = catalogue({"catalogue.yaml": SETTINGS, "d.yaml": UNCHANGED})
    loaded = load_catalogue(folder)
    entries = change_entries([derive_event(e, loaded.settings) for e in loaded.events])
    (rechecked,) = [e for e in entries if e.label == "Rechecked"]
    assert rechecked.changes == ()
    assert "no change in the listed values" in entry_summary(rechecked)
    renderer = Renderer(make_environment(), loaded.settings, "public", "")
    page = Page()
    context = ChangesPage(tuple(entries), ())
    page.feed(renderer.page("changes.html", "changes.html", context).decode())
    assert "No change in the listed values." in " ".join("".join(page.text).split())


RETRACTED = """\
id: E-5
title: Withdrawn pair
time: "2034-09-01T12:00:00"
status: retracted
estimate:
  heavier: {mass: 88 +17 -14 Msun}
  lighter: {mass: 67 +15 -17 Msun}
  distance: 3900 +1900 -1700 Mpc
history:
  - {date: "2034-09-01T13:00:00", label: First report, status: candidate,
     estimate: {heavier: {mass: 88 +17 -14 Msun}, lighter: {mass: 67 +15 -17 Msun},
                distance: 3900 +1900 -1700 Mpc}}
  - {date: "2034-09-03", label: Withdrawn, status: retracted, note: Noise at one site.}
"""


@pytest.fixture
def retracted(catalogue):
    loaded = load_catalogue(catalogue({"catalogue.yaml": SETTINGS, "e.yaml": RETRACTED}))
    return [derive_event(e, loaded.settings) for e in loaded.events]


def test_a_retraction_is_an_entry_of_its_own_on_its_own_date(retracted):
    entries = change_entries(retracted)
    assert [(e.kind, e.label, e.timestamp) for e in entries] == [
        ("retracted", "Withdrawn", "2034-09-03T00:00:00.000Z"),
        ("added", "First report", "2034-09-01T13:00:00.000Z"),
    ]
    withdrawn, added = entries
    assert [c.text for c in withdrawn.changes] == ["Status: candidate → retracted"]
    assert entry_summary(withdrawn) == "Noise at one site. Status: candidate → retracted."
    # the given interval as the sheet writes it: 88 +17 −14, not a summary of the draws
    assert [c.text for c in added.changes] == [
        "m₁: 88 +17 −14 M⊙",
        "m₂: 67 +15 −17 M⊙",
        "Distance: 3900 +1900 −1700 Mpc",
        "Status: candidate",
    ]
    feed = parse(atom_feed(entries, retracted[0].settings))
    titles = [e.find(f"{ATOM}title").text for e in feed.findall(f"{ATOM}entry")]
    assert "E-5 retracted: Withdrawn — Withdrawn pair" in titles


def test_an_undated_addition_is_listed_apart_and_says_so(derived):
    page = changes_page(change_entries(derived))
    assert [e.event_id for e in page.undated] == ["A-1"]
    assert all(e.dated for e in page.entries)
    (added,) = page.undated
    assert "The inputs give this estimate no date; the entry carries the merger time" in (
        entry_summary(added)
    )
    renderer = Renderer(make_environment(), derived[0].settings, "public", "")
    html = renderer.page("changes.html", "changes.html", page).decode()
    undated = html.split('id="undated-heading"', 1)[1]
    assert 'merger <time datetime="2034-03-01T10:00:00.000Z">2034-03-01</time>' in undated
    assert "A-1" not in html.split('id="undated-heading"', 1)[0].split("<main", 1)[1]


def test_every_feed_link_is_absolute_under_a_base_url_and_relative_without(derived):
    settings = replace(derived[0].settings, base_url="https://example.org/cat")
    root = parse(atom_feed(change_entries(derived), settings))
    hrefs = [link.get("href") for link in root.iter(f"{ATOM}link")]
    assert hrefs and all(h.startswith("https://example.org/cat/") for h in hrefs), hrefs
    assert "https://example.org/cat/changes.html" in hrefs
    relative = parse(atom_feed(change_entries(derived), derived[0].settings))
    hrefs = [link.get("href") for link in relative.iter(f"{ATOM}link")]
    assert hrefs and not any("//" in h or h.startswith("/") for h in hrefs), hrefs


def test_the_licence_is_the_feeds_rights(derived):
    settings = replace(derived[0].settings, licence="CC BY 4.0")
    rights = parse(atom_feed(change_entries(derived), settings)).find(f"{ATOM}rights")
    assert (rights.text, rights.get("type")) == ("CC BY 4.0", "text")
    assert (
        parse(atom_feed(change_entries(derived), derived[0].settings)).find(f"{ATOM}rights") is None
    )


def test_demo_retraction_on_the_changes_page_and_in_the_feed():
    catalogue = load_catalogue(demo_dir())
    event = next(e for e in catalogue.events if e.id == "MER34-007")
    item = derive_event(event, replace(catalogue.settings, samples=200))
    entries = change_entries([item])
    assert [(e.kind, e.day) for e in entries] == [
        ("retracted", "2034-05-26"),
        ("added", "2034-05-24"),
    ]
    assert all(e.dated for e in entries)
    assert event.time.utc.isot[:10] == "2034-05-24" and entries[0].date > event.time


def test_a_history_of_status_changes_only(catalogue):
    text = RETRACTED.split("history:")[0] + (
        'history:\n  - {date: "2034-09-03", label: Withdrawn, status: retracted}\n'
    )
    loaded = load_catalogue(catalogue({"catalogue.yaml": SETTINGS, "e.yaml": text}))
    (event,) = loaded.events
    entries = change_entries([derive_event(event, loaded.settings)])
    assert [(e.kind, e.dated, e.day) for e in entries] == [
        ("retracted", True, "2034-09-03"),
        ("added", False, "2034-09-01"),  # the estimate has no date: listed under the merger
    ]
    assert [c.text for c in entries[0].changes] == ["Status: retracted"]
    steps = history_steps(event)  # the sheet: the estimate first, then the retraction
    assert [(s.label, s.changes) for s in steps] == [
        ("First estimate", ()),
        ("Withdrawn", (("Status", "not recorded", "retracted"),)),
    ]


def test_what_check_accepts_builds(catalogue, tmp_path):
    from factsheet.build import build

    text = RETRACTED.split("history:")[0] + (
        'history:\n  - {date: "2034-09-03", label: Withdrawn, status: retracted}\n'
    )
    out = tmp_path / "site"
    build(catalogue({"catalogue.yaml": SETTINGS, "e.yaml": text}), out, jobs=1)
    sheet = " ".join((out / "events" / "E-5.html").read_text(encoding="utf-8").split())
    assert "Status: not recorded → retracted" in sheet
    changes = (out / "changes.html").read_text(encoding="utf-8")
    assert "E-5</a> retracted: <strong>Withdrawn</strong>" in changes
