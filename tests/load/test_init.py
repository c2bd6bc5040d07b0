"""``factsheet init``: a catalogue of one's own that checks and builds as it is."""

from __future__ import annotations

import re

import pytest

from factsheet import build as build_module
from factsheet.build import build
from factsheet.cli import main
from factsheet.errors import InputError
from factsheet.load import load_catalogue
from factsheet.load.scaffold import init_catalogue


def test_a_new_catalogue_checks_and_builds_as_it_is(tmp_path):
    folder = tmp_path / "my-catalogue"
    written = init_catalogue(folder)
    assert {p.name for p in written} == {"catalogue.yaml", "example-001.yaml", "README.md"}
    catalogue = load_catalogue(folder)
    assert [e.id for e in catalogue.events] == ["EXAMPLE-001"] and not catalogue.warnings
    assert catalogue.settings.title == "My catalogue"
    report = build(folder, tmp_path / "site", jobs=1)
    assert report.built == 1 and (tmp_path / "site" / "events" / "EXAMPLE-001.html").exists()
    readme = (folder / "README.md").read_text(encoding="utf-8")
    assert "factsheet check" in readme and "factsheet build" in readme


def test_every_commented_setting_is_valid_once_uncommented(tmp_path):
    folder = tmp_path / "cat"
    init_catalogue(folder)
    settings = folder / "catalogue.yaml"
    lines = settings.read_text(encoding="utf-8").splitlines()
    opened = [re.sub(r"^# (?=[a-z_]+:)", "", line) for line in lines]
    opened = [re.sub(r"^#   ", "  ", line) for line in opened]  # a Markdown block's lines
    settings.write_text("\n".join(opened) + "\n", encoding="utf-8")
    catalogue = load_catalogue(folder)
    assert catalogue.settings.licence == "CC BY 4.0"
    assert catalogue.settings.base_url == "https://example.org/sheets/"


@pytest.mark.parametrize("kind", ["file", "full folder"])
def test_init_never_overwrites(tmp_path, kind):
    target = tmp_path / "taken"
    if kind == "file":
        target.write_text("keep me", encoding="utf-8")
    else:
        target.mkdir()
        (target / "keep.yaml").write_text("keep me", encoding="utf-8")
    with pytest.raises(InputError, match="nothing is overwritten"):
        init_catalogue(target)
    kept = target if kind == "file" else target / "keep.yaml"
    assert kept.read_text(encoding="utf-8") == "keep me"


def test_a_build_without_a_catalogue_says_it_is_the_packaged_demo(monkeypatch, capsys, tmp_path):
    def stop(*args, **kwargs):
        raise InputError("stopped before building")

    monkeypatch.setattr(build_module, "build", stop)
    assert main(["build", "-o", str(tmp_path / "site")]) == 1
    err = capsys.readouterr().err
    assert "this is the packaged demo" in err and "factsheet init" in err
