"""Incremental, parallel and reproducible builds (the build cache and --jobs)."""

import hashlib
import shutil
from pathlib import Path

import pytest
from helpers import VALID_EVENT, write_catalogue

from factsheet import build as build_module
from factsheet.build import build
from factsheet.render import environment, site
from factsheet.resources import templates_dir


def event(event_id: str, mass: str = "36 +5 -4 Msun", extra: str = "") -> str:
    return (
        VALID_EVENT.replace("id: TEST-1", f"id: {event_id}").replace("36 +5 -4 Msun", mass) + extra
    )


def hashes(folder: Path) -> dict[str, str]:
    return {
        p.relative_to(folder).as_posix(): hashlib.sha256(p.read_bytes()).hexdigest()
        for p in sorted(folder.rglob("*"))
        if p.is_file()
    }


@pytest.fixture
def cat(tmp_path):
    (tmp_path / "cat").mkdir()
    (tmp_path / "cat" / "s.csv").write_text(
        "heavier.mass [Msun],lighter.mass [Msun],distance [Mpc]\n30,20,400\n32,21,450\n31,19,500\n"
    )
    return write_catalogue(
        tmp_path / "cat",
        {
            "a.yaml": event("A-1"),
            "b.yaml": event("B-2", "40 +5 -4 Msun"),
            "c.yaml": event("C-3", extra="samples: s.csv\n"),
        },
    )


def test_two_builds_are_byte_identical_and_jobs_do_not_matter(cat, tmp_path):
    first = build(cat, tmp_path / "one", jobs=1)
    assert first.reused == 0
    build(cat, tmp_path / "two", jobs=2)
    assert hashes(tmp_path / "one") == hashes(tmp_path / "two")
    again = build(cat, tmp_path / "one", jobs=1)
    assert again.reused == 3
    assert hashes(tmp_path / "one") == hashes(tmp_path / "two")


def test_editing_one_event_rebuilds_only_it(cat, tmp_path):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    before = hashes(out)
    (cat / "b.yaml").write_text(event("B-2", "41 +5 -4 Msun"))
    report = build(cat, out, jobs=1)
    assert report.reused == 2 and report.built == 3
    after = hashes(out)
    changed = {k for k in before if before[k] != after.get(k)}
    assert "data/B-2.json" in changed and "data/A-1.json" not in changed
    assert not any(k.startswith("events/A-1") for k in changed)


@pytest.mark.parametrize("key", ["summary", "internal_notes"])
def test_editing_page_only_words_redraws_nothing(cat, tmp_path, key, monkeypatch):
    out = tmp_path / "site"
    build(cat, out, jobs=1, audience="internal")
    before = hashes(out)
    text = event("B-2", "40 +5 -4 Msun") + f"{key}: Words written later,\n  over two lines.\n"
    (cat / "b.yaml").write_text(text.replace("summary: A *test* event.\n", ""))
    drawn = []
    monkeypatch.setattr(build_module, "event_files", lambda *a: drawn.append(a) or 1 / 0)
    report = build(cat, out, jobs=1, audience="internal")
    assert report.reused == 3 and not drawn  # no figure and no sound made again
    after = hashes(out)
    changed = {k for k in before if before[k] != after.get(k)}
    assert (
        "events/B-2.html" in changed
        and "Words written later" in (out / "events" / "B-2.html").read_text()
    )
    assert not any(k.startswith("events/B-2-") or k.endswith(".wav") for k in changed)
    # the page rendered again from the cached bundle is the page a fresh build makes
    monkeypatch.undo()
    build(cat, tmp_path / "fresh", jobs=1, audience="internal")
    assert after == hashes(tmp_path / "fresh")


def test_a_new_neighbour_renders_the_pages_beside_it_as_a_fresh_build_does(cat, tmp_path):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    (cat / "d.yaml").write_text(event("D-4").replace("2034-04-12", "2034-04-13"))
    report = build(cat, out, jobs=1)
    assert report.reused == 3 and report.built == 4
    build(cat, tmp_path / "fresh", jobs=1)
    assert hashes(out) == hashes(tmp_path / "fresh")


def test_editing_the_samples_file_rebuilds_its_event(cat, tmp_path):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    with (cat / "s.csv").open("a") as handle:
        handle.write("33,22,480\n")
    assert build(cat, out, jobs=1).reused == 2


def test_settings_change_rebuilds_everything(cat, tmp_path):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    (cat / "catalogue.yaml").write_text("low_frequency: 15 Hz\n")
    assert build(cat, out, jobs=1).reused == 0
    (cat / "catalogue.yaml").write_text("low_frequency: 15 Hz\ndescription: Words.\n")
    report = build(cat, out, jobs=1)  # the description shapes pages only, not the numbers
    assert report.reused == 3 and "Words." in (out / "index.html").read_text()
    (cat / "catalogue.yaml").write_text("low_frequency: 15 Hz\ntitle: Renamed\n")
    report = build(cat, out, jobs=1)  # every share card names the catalogue
    assert report.reused == 0 and "Renamed" in (out / "index.html").read_text()


def test_template_change_reaches_the_pages(cat, tmp_path, monkeypatch):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    templates = tmp_path / "templates"
    shutil.copytree(templates_dir(), templates)
    page = templates / "event.html"
    page.write_text(page.read_text().replace("All events", "Every event"))
    for module in (environment, site):  # the loader and fingerprint, and the static copy
        monkeypatch.setattr(module, "templates_dir", lambda: templates)
    report = build(cat, out, jobs=1)
    assert report.reused == 3
    assert "Every event" in (out / "events" / "A-1.html").read_text()


def test_deleting_the_cache_gives_the_same_site(cat, tmp_path):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    before = hashes(out)
    shutil.rmtree(tmp_path / ".factsheet-cache-site")
    assert build(cat, out, jobs=1).reused == 0
    assert hashes(out) == before


def test_a_rebuild_reads_only_the_files_that_changed(cat, tmp_path, monkeypatch):
    import os
    import time

    from factsheet.load import catalogue as load_module

    then = time.time() - 3600
    for path in cat.iterdir():
        os.utime(path, (then, then))
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    before = hashes(out)
    read = []
    load_event = load_module.load_event

    def reading(path, *args, **kwargs):
        read.append(path.name)
        return load_event(path, *args, **kwargs)

    monkeypatch.setattr(load_module, "load_event", reading)
    monkeypatch.setattr(build_module, "load_event", reading)
    assert build(cat, out, jobs=1).reused == 3 and read == []  # decided from metadata alone
    assert hashes(out) == before
    (cat / "b.yaml").write_text(event("B-2", "41 +5 -4 Msun"))
    assert build(cat, out, jobs=1).reused == 2 and read == ["b.yaml"]
    for entry in (tmp_path / ".factsheet-cache-site").iterdir():  # the entries gone, the
        if entry.is_dir():  # record of the files read kept: each event is derived again ...
            shutil.rmtree(entry)
    read.clear()
    assert build(cat, out, jobs=1).reused == 0
    assert "c.yaml" in read  # ... and the one with samples read afresh for their values
    assert "a.yaml" not in read
