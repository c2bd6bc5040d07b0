"""Two audiences from one catalogue: a public build carries no trace of internal items."""

from pathlib import Path

from helpers import VALID_EVENT, write_catalogue

from factsheet.build import build


def event(event_id: str, title: str, extra: str = "") -> str:
    text = VALID_EVENT.replace("id: TEST-1", f"id: {event_id}")
    return text.replace("title: A test pair", f"title: {title}") + extra


def all_output(folder: Path) -> str:
    return "\n".join(
        p.read_bytes().decode("utf-8", "replace") for p in folder.rglob("*") if p.is_file()
    )


def make(tmp_path: Path) -> Path:
    return write_catalogue(
        tmp_path / "cat",
        {
            "a.yaml": event("OPEN-1", "Open pair", "internal_notes: Secret-note-alpha\n"),
            "b.yaml": event(
                "HIDDEN-2",
                "Hidden-title-beta",
                "visibility: internal\ninternal_notes: Secret-note-gamma\n",
            ),
            "c.yaml": event(
                "LATER-3", "Embargoed-title-delta", 'embargo_until: "2999-01-01T00:00"\n'
            ),
            "d.yaml": event("PAST-4", "Embargo-over", 'embargo_until: "2001-01-01T00:00"\n'),
        },
    )


def test_public_build_has_no_trace_of_internal_or_embargoed(tmp_path, monkeypatch):
    monkeypatch.setenv("SOURCE_DATE_EPOCH", "1800000000")  # 2027: before the embargo ends
    out = tmp_path / "public"
    report = build(make(tmp_path), out)
    assert (report.built, report.withheld_internal, report.withheld_embargo) == (2, 1, 1)
    text = all_output(out)
    for secret in (
        "HIDDEN-2",
        "Hidden-title-beta",
        "Secret-note-gamma",
        "LATER-3",
        "Embargoed-title-delta",
        "Secret-note-alpha",
    ):
        assert secret not in text, secret
    assert "OPEN-1" in text and "PAST-4" in text


def test_internal_build_shows_everything_and_marks_it(tmp_path, monkeypatch):
    monkeypatch.setenv("SOURCE_DATE_EPOCH", "1800000000")
    out = tmp_path / "internal"
    report = build(make(tmp_path), out, audience="internal")
    assert report.built == 4
    hidden = (out / "events" / "HIDDEN-2.html").read_text()
    assert "Secret-note-gamma" in hidden and "internal only" in hidden
    assert "embargoed until" in (out / "events" / "LATER-3.html").read_text()
    assert "Internal build" in (out / "index.html").read_text()


def test_embargo_lifts_with_the_build_time(tmp_path, monkeypatch):
    monkeypatch.setenv("SOURCE_DATE_EPOCH", "32503680000")  # year 3000
    assert build(make(tmp_path), tmp_path / "later").built == 3
