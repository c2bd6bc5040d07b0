"""Publishing swaps a complete site in, and never harms a folder it did not make."""

import pytest

from factsheet.errors import BuildError
from factsheet.publish import (
    MARKER,
    PLACEHOLDER,
    PLACEHOLDER_TEXT,
    Staging,
    publish,
    replaceable,
)


def site(**files):
    """Site files from keyword arguments; a double underscore stands for a slash."""
    return {name.replace("__", "/"): text.encode() for name, text in files.items()}


def test_publish_replaces_an_earlier_site(tmp_path):
    out = tmp_path / "site"
    publish(site(index_html="one", events__a_html="a"), out)
    publish(site(index_html="two"), out)
    assert (out / "index_html").read_text() == "two"
    assert not (out / "events").exists()
    assert (out / MARKER).exists()
    assert [p.name for p in tmp_path.iterdir()] == ["site"]  # nothing left beside it


def test_placeholder_folder_is_replaceable_and_kept_identical(tmp_path):
    out = tmp_path / "site"
    out.mkdir()
    (out / PLACEHOLDER).write_text(PLACEHOLDER_TEXT)
    publish(site(index_html="x"), out)
    assert (out / PLACEHOLDER).read_text() == PLACEHOLDER_TEXT  # the tracked file stays unchanged


def test_refuses_foreign_folder(tmp_path):
    out = tmp_path / "docs"
    out.mkdir()
    (out / "thesis.tex").write_text("precious")
    with pytest.raises(BuildError, match="did not make"):
        publish(site(index_html="x"), out)
    assert (out / "thesis.tex").read_text() == "precious"
    assert not replaceable(out)
    publish(site(index_html="x"), out, force=True)
    assert not (out / "thesis.tex").exists()


def test_failed_write_leaves_earlier_site(tmp_path):
    out = tmp_path / "site"
    publish(site(index_html="good"), out)
    with pytest.raises(BuildError, match="outside the output folder"):
        publish(site(**{"../evil": "x"}), out)
    assert (out / "index_html").read_text() == "good"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["site"]


def test_tracked_placeholder_is_what_a_build_writes():
    from pathlib import Path

    tracked = Path(__file__).resolve().parents[1] / "site" / PLACEHOLDER
    assert tracked.read_text() == PLACEHOLDER_TEXT  # so a build leaves git status clean


def test_pages_linked_from_the_old_site_are_checked_when_a_file_is_gone(tmp_path):
    out = tmp_path / "site"
    page = b'<a href="b.html">b</a> <img src="fig.svg">'
    publish({"a.html": page, "b.html": b"b", "fig.svg": b"<svg/>"}, out)

    def rebuild(keep_figure: bool) -> Staging:
        staging = Staging(out)
        staging.link(out / "a.html", "a.html", "x")  # taken unchanged from the old site
        staging.write("b.html", b"b, again")
        if keep_figure:
            staging.link(out / "fig.svg", "fig.svg", "y")
        return staging

    with rebuild(keep_figure=True) as staging:
        assert staging._checked_before() == {"a.html"}  # nothing gone: its links still hold
        staging.commit()
    with rebuild(keep_figure=False) as staging:
        assert staging._checked_before() == set()  # a file is gone: every page is checked
        with pytest.raises(BuildError, match=r"fig\.svg"):
            staging.commit()
    assert (out / "fig.svg").read_bytes() == b"<svg/>"
