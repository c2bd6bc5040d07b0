"""Faults a careless or hostile user meets, at the level of a whole build: nothing is lost,
nothing half-published, nothing leaked.

Each class: the outputs a build must refuse before touching anything; one build per output at
a time; a site is published only when complete; the site and the cache share no storage and a
damaged or planted cache entry is never used; file-system faults give one clear line and leave
the earlier site as it was. Killed builds and their workers are in test_interrupt.py.
"""

from __future__ import annotations

import errno
import hashlib
import json
import os
import subprocess
import sys
import time
from pathlib import Path

import pytest
from helpers import VALID_EVENT

from factsheet.build import build
from factsheet.cli import main
from factsheet.errors import BuildError
from factsheet.publish import MARKER, OutputLock, Staging


def tree(folder: Path) -> dict[str, bytes]:
    """Every file under ``folder`` with its bytes (to compare a folder before and after)."""
    return {
        p.relative_to(folder).as_posix(): p.read_bytes() for p in folder.rglob("*") if p.is_file()
    }


def run(*args: str, cwd: Path | None = None) -> tuple[int, str]:
    done = subprocess.run(
        [sys.executable, "-m", "factsheet.cli", *args],
        cwd=cwd,
        capture_output=True,
        text=True,
        timeout=600,
    )
    return done.returncode, done.stdout + done.stderr


@pytest.fixture
def cat(catalogue):
    return catalogue({"a.yaml": VALID_EVENT})


# -- outputs a build refuses, --force or not ------------------------------------------------------


@pytest.mark.parametrize("force", [False, True])
def test_output_that_holds_the_catalogue_is_refused(tmp_path, force):
    site = tmp_path / "site"
    (site / "catalogue").mkdir(parents=True)
    (site / "catalogue" / "a.yaml").write_text(VALID_EVENT)
    before = tree(tmp_path)
    with pytest.raises(BuildError, match="contains the catalogue"):
        build(site / "catalogue", site, force=force, jobs=1)
    assert tree(tmp_path) == before  # nothing touched, the catalogue is there
    with pytest.raises(BuildError, match="contains the catalogue"):
        build(site / "catalogue", site / "catalogue", force=force, jobs=1)
    assert tree(tmp_path) == before


@pytest.mark.parametrize("force", [False, True])
def test_output_inside_the_catalogue_is_refused(cat, force):
    before = tree(cat)
    with pytest.raises(BuildError, match="inside the catalogue"):
        build(cat, cat / "site", force=force, jobs=1)
    assert tree(cat) == before and not (cat / "site").exists()


@pytest.mark.parametrize("out", [".", "..", "../.."])
def test_the_current_folder_and_its_parents_are_refused(cat, tmp_path, out, monkeypatch):
    work = tmp_path / "deep" / "work"
    work.mkdir(parents=True)
    (work / "notes.txt").write_text("mine")
    monkeypatch.chdir(work)
    with pytest.raises(BuildError, match="current folder"):
        build(cat, Path(out), force=True, jobs=1)
    assert (work / "notes.txt").read_text() == "mine"


def test_a_file_a_link_and_a_path_under_a_file_are_refused(cat, tmp_path):
    plain = tmp_path / "plain.txt"
    plain.write_text("keep")
    folder = tmp_path / "mine"
    folder.mkdir()
    (folder / "thesis.tex").write_text("precious")
    link = tmp_path / "link"
    link.symlink_to(folder)
    for out, words in ((plain, "is a file"), (link, "is a link"), (plain / "site", "is a file")):
        with pytest.raises(BuildError, match=words):
            build(cat, out, force=True, jobs=1)
    assert plain.read_text() == "keep" and (folder / "thesis.tex").read_text() == "precious"
    assert not list(tmp_path.glob(".factsheet-*"))


def test_refusals_are_one_line_errors_at_the_command_line(cat, tmp_path):
    code, text = run("build", str(cat), "-o", str(cat / "out"), "--force")
    assert code == 1 and "Traceback" not in text
    assert text.count("error:") == 1 and "inside the catalogue" in text


# -- one build per output ---------------------------------------------------------------------


def test_a_held_output_is_refused_with_the_holders_process_id(cat, tmp_path):
    out = tmp_path / "site"
    with OutputLock(out), pytest.raises(BuildError, match=rf"another build .*{os.getpid()}"):
        build(cat, out, jobs=1)
    build(cat, out, jobs=1)  # released: the next build goes ahead


def test_a_lock_left_by_a_killed_build_is_taken_over(cat, tmp_path):
    out = tmp_path / "site"
    holder = subprocess.Popen(
        [sys.executable, "-c", f"from factsheet.publish import OutputLock\n"
         f"import os, time\nwith OutputLock({str(out)!r}):\n    print('held', flush=True)\n"
         "    time.sleep(60)"],
        stdout=subprocess.PIPE,
        text=True,
    )  # fmt: skip
    assert holder.stdout.readline().strip() == "held"
    with pytest.raises(BuildError, match=f"process {holder.pid}"):
        build(cat, out, jobs=1)
    holder.kill()
    holder.wait()
    build(cat, out, jobs=1)  # the lock file is still there, its holder is not
    assert (out / "index.html").is_file()


def test_two_builds_into_one_output_never_publish_an_incomplete_site(catalogue, tmp_path):
    many = {f"e{i}.yaml": VALID_EVENT.replace("TEST-1", f"TEST-{i}") for i in range(6)}
    cat, out = catalogue(many), tmp_path / "site"
    first = subprocess.Popen(
        [sys.executable, "-m", "factsheet.cli", "build", str(cat), "-o", str(out), "-j", "1"],
        stdout=subprocess.PIPE,
        stderr=subprocess.PIPE,
        text=True,
    )
    lock = tmp_path / ".factsheet-lock-site"
    deadline = time.monotonic() + 60
    while not (lock.exists() and lock.read_text().strip()) and time.monotonic() < deadline:
        time.sleep(0.05)
    code, text = run("build", str(cat), "-o", str(out), "-j", "1")
    _, first_err = first.communicate(timeout=600)
    assert first.returncode == 0, first_err
    assert code == 1 and f"process {first.pid}" in text and "Traceback" not in text
    for i in range(6):
        assert (out / "events" / f"TEST-{i}.wav").is_file()
        assert (out / "events" / f"TEST-{i}-masses.svg").is_file()


# -- only a complete site is published ------------------------------------------------------------


def test_a_site_with_a_missing_linked_file_is_not_published(cat, tmp_path, monkeypatch):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    before = tree(out)
    write, link = Staging.write, Staging.link

    def lose_sounds(self, name, content):
        if not name.endswith(".wav"):
            write(self, name, content)

    def lose_linked_sounds(self, source, name, sha256):
        if not name.endswith(".wav"):
            link(self, source, name, sha256)

    monkeypatch.setattr(Staging, "write", lose_sounds)
    monkeypatch.setattr(Staging, "link", lose_linked_sounds)
    with pytest.raises(BuildError, match=r"incomplete .*TEST-1\.wav"):
        build(cat, out, jobs=1)
    assert tree(out) == before
    assert not list(tmp_path.glob(".factsheet-new-*"))


# -- the cache: JSON only, its files taken from the published site when they check out --------


def _cache(tmp_path: Path) -> Path:
    return tmp_path / ".factsheet-cache-site"


def test_the_cache_holds_no_copy_of_the_site(cat, tmp_path):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    assert {p.name for p in _cache(tmp_path).rglob("*") if p.is_file()} <= {
        "entry.json",
        "site.json",
        "read.json",
    }
    build(cat, out, jobs=1)  # a rebuild links the files of the site it replaces ...
    linked = [p for p in out.rglob("*") if p.is_file()]
    assert all(p.stat().st_nlink == 1 for p in linked)  # ... which is then gone: one name each


def test_a_hand_edited_published_file_is_made_again(cat, tmp_path):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    figure = out / "events" / "TEST-1-masses.svg"
    original = figure.read_bytes()
    figure.write_bytes(b"<svg>edited by hand</svg>")  # an edit of the published file ...
    report = build(cat, out, jobs=1)
    assert figure.read_bytes() == original  # ... is not carried into the next build
    assert report.reused == 0


@pytest.mark.parametrize("same_metadata", [False, True])
def test_a_damaged_published_file_is_made_again(cat, tmp_path, same_metadata):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    good = tree(out)
    sound = out / "events" / "TEST-1.wav"
    stamp = sound.stat()
    data = bytearray(sound.read_bytes())
    data[-1] ^= 0xFF  # same size
    sound.write_bytes(bytes(data))
    if not same_metadata:
        (out / "events" / "TEST-1-masses.svg").write_bytes(b"<svg/>")
    else:  # damage that keeps size and time is not seen from metadata (as documented)
        os.utime(sound, ns=(stamp.st_atime_ns, stamp.st_mtime_ns))
    report = build(cat, out, jobs=1)
    if same_metadata:
        assert report.reused == 1
    else:
        assert report.reused == 0  # the damaged entry was not used
        assert tree(out) == good


def test_a_build_never_writes_through_a_link_into_the_old_site(cat, tmp_path):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    page = out / "events" / "TEST-1.html"
    before = page.read_bytes()
    staging = Staging(out)
    try:
        staging.link(page, "events/TEST-1.html", "x")
        staging.write("events/TEST-1.html", b"new")
        assert page.read_bytes() == before
    finally:
        staging.abort()


def test_a_planted_entry_never_runs(cat, tmp_path):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    marker = tmp_path / "ran"
    payload = f"__import__('pathlib').Path({str(marker)!r}).write_text('ran')"
    import pickle

    class Planted:
        def __reduce__(self):
            return (eval, (payload,))

    for entry in [p for p in _cache(tmp_path).iterdir() if p.is_dir()]:
        (entry / "bundle.pickle").write_bytes(pickle.dumps(Planted()))
        (entry / "entry.json").write_text(
            json.dumps(
                {"format": "3", "kind": "event", "files": {}, "bundle": {"__reduce__": payload}}
            )
        )
    report = build(cat, out, jobs=1)
    assert not marker.exists()
    assert report.reused == 0 and (out / "events" / "TEST-1.html").is_file()


def test_an_entry_with_damaged_words_is_removed_and_the_next_build_recovers(cat, tmp_path):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    before = tree(out)
    for path in _cache(tmp_path).glob("*/entry.json"):
        entry = json.loads(path.read_text())
        if entry.get("kind") == "event":  # its kept words damaged, its numbers intact
            entry["bundle"]["caveats"] = [{"\u00a7text": ["not", "a", "message"], "params": {}}]
            path.write_text(json.dumps(entry))
    # page-only words changed: the page must be rendered from the whole (damaged) entry
    (cat / "a.yaml").write_text(VALID_EVENT.replace("A *test* event.", "Words written later."))
    with pytest.raises(BuildError, match="does not read back whole; it was removed"):
        build(cat, out, jobs=1)
    assert tree(out) == before  # the earlier site is unchanged
    report = build(cat, out, jobs=1)
    assert (
        report.reused == 0 and "Words written later" in (out / "events" / "TEST-1.html").read_text()
    )


def test_entries_record_each_files_size_and_hash(cat, tmp_path):
    build(cat, tmp_path / "site", jobs=1)
    entries = list(_cache(tmp_path).glob("*/entry.json"))
    assert entries
    for path in entries:
        entry = json.loads(path.read_text())
        for name, record in entry["files"].items():
            data = (tmp_path / "site" / name).read_bytes()
            assert record == {"size": len(data), "sha256": hashlib.sha256(data).hexdigest()}


# -- file-system faults: one line, exit 1, the earlier site unchanged ---------------------------


@pytest.mark.parametrize(
    "code, words", [(errno.ENOSPC, "No space left"), (errno.EROFS, "Read-only file system")]
)
def test_write_faults_leave_the_earlier_site(cat, tmp_path, monkeypatch, code, words):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    before = tree(out)
    (cat / "a.yaml").write_text(VALID_EVENT.replace("A test pair", "A test pair, edited"))
    write = Staging.write

    def full(self, name, content):
        if name.endswith(".html"):
            raise OSError(code, os.strerror(code), str(self.folder / name))
        write(self, name, content)

    monkeypatch.setattr(Staging, "write", full)
    with pytest.raises(BuildError, match=words):
        build(cat, out, jobs=1)
    assert tree(out) == before
    assert not list(tmp_path.glob(".factsheet-new-*"))


def test_cache_place_taken_by_a_file(cat, tmp_path):
    _cache(tmp_path).write_text("not a folder")
    code, text = run("build", str(cat), "-o", str(tmp_path / "site"))
    assert code == 1 and "Traceback" not in text and "build cache" in text


def test_non_numeric_source_date_epoch(cat, tmp_path, monkeypatch):
    monkeypatch.setenv("SOURCE_DATE_EPOCH", "yesterday")
    with pytest.raises(BuildError, match="SOURCE_DATE_EPOCH"):
        build(cat, tmp_path / "site", jobs=1)
    assert main(["build", str(cat), "-o", str(tmp_path / "site")]) == 1


def test_new_into_a_file(tmp_path, capsys):
    plain = tmp_path / "plain"
    plain.write_text("x")
    assert main(["new", "X-1", "-d", str(plain)]) == 1
    assert main(["new", "X-1", "-d", str(plain / "sub")]) == 1
    err = capsys.readouterr().err
    assert "is a file" in err and "Not a directory" in err and "Traceback" not in err
    assert plain.read_text() == "x"


def test_messages_never_carry_control_characters(tmp_path, capsys):
    bad = tmp_path / "cat\x1b[31m"
    bad.mkdir()
    assert main(["check", str(bad)]) == 1
    err = capsys.readouterr().err
    assert "\x1b" not in err and "\\x1b" in err


def test_a_published_site_has_its_marker_and_no_staging_left(cat, tmp_path):
    build(cat, tmp_path / "site", jobs=1)
    assert (tmp_path / "site" / MARKER).is_file()
    assert sorted(p.name for p in tmp_path.iterdir()) == [
        ".factsheet-cache-site",
        ".factsheet-lock-site",
        "cat",
        "site",
    ]


def test_damage_of_the_same_size_is_caught_by_the_hash(cat, tmp_path):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    good = tree(out)
    damaged = out / "events" / "TEST-1.wav"
    data = bytearray(damaged.read_bytes())
    data[-1] ^= 0xFF  # one bit pattern changed, the size unchanged (the time is not)
    damaged.write_bytes(bytes(data))
    report = build(cat, out, jobs=1)
    assert report.reused == 0  # made again, not published as it was
    assert tree(out) == good
    assert build(cat, out, jobs=1).reused == 1  # and the repaired site lends it next time


def test_a_link_planted_in_the_site_is_not_followed(cat, tmp_path):
    out = tmp_path / "site"
    build(cat, out, jobs=1)
    planted = out / "events" / "TEST-1-masses.svg"
    elsewhere = tmp_path / "elsewhere.svg"
    elsewhere.write_bytes(planted.read_bytes())  # even with the recorded bytes behind it
    planted.unlink()
    planted.symlink_to(elsewhere)
    assert build(cat, out, jobs=1).reused == 0
    assert not (out / "events" / "TEST-1-masses.svg").is_symlink()
