"""Files and folders of a catalogue: only regular files are opened, hidden entries are skipped."""

from __future__ import annotations

import os
import subprocess
import sys
from pathlib import Path

import pytest
from helpers import VALID_EVENT

from factsheet.errors import InputError
from factsheet.load import load_catalogue
from factsheet.load.files import FileRefused, open_regular, target_of
from factsheet.load.samples import read_samples


def problems_of(folder: Path) -> list[str]:
    with pytest.raises(InputError) as info:
        load_catalogue(folder)
    return [str(p) for p in info.value.problems]


def check_in_subprocess(folder: Path) -> subprocess.CompletedProcess:
    """``factsheet check`` with a timeout, so that a reader blocked on a FIFO fails the test
    instead of hanging it."""
    return subprocess.run(
        [sys.executable, "-m", "factsheet.cli", "check", str(folder)],
        capture_output=True,
        text=True,
        timeout=60,
    )


@pytest.mark.parametrize("name", ["x.yaml", "catalogue.yaml", "sub/y.yml"])
def test_a_fifo_is_refused_without_being_opened(catalogue, name):
    folder = catalogue({"a.yaml": VALID_EVENT})
    (folder / name).parent.mkdir(parents=True, exist_ok=True)
    os.mkfifo(folder / name)
    result = check_in_subprocess(folder)
    assert result.returncode == 1 and "Traceback" not in result.stderr
    assert f"error: {folder / name}: is a named pipe (FIFO), not a regular file" in result.stderr


def test_a_fifo_named_as_the_samples_file_is_refused(catalogue):
    folder = catalogue({"a.yaml": VALID_EVENT + "samples: s.csv\n"})
    os.mkfifo(folder / "s.csv")
    result = check_in_subprocess(folder)
    assert result.returncode == 1
    assert f"{folder / 'a.yaml'}:19: samples: samples file 's.csv': is a named pipe" in (
        result.stderr
    )


def test_open_regular_refuses_a_fifo_and_a_folder(tmp_path):
    os.mkfifo(tmp_path / "pipe")
    with pytest.raises(FileRefused, match="named pipe"):
        open_regular(tmp_path / "pipe")
    with pytest.raises(FileRefused, match="a folder"):
        open_regular(tmp_path)
    with pytest.raises(FileRefused, match="No such file"):
        open_regular(tmp_path / "missing")
    (tmp_path / "f").write_bytes(b"ok")
    with open_regular(tmp_path / "f") as handle:
        assert handle.read() == b"ok"


def test_the_samples_reader_refuses_a_fifo(tmp_path):
    os.mkfifo(tmp_path / "s.csv")
    with pytest.raises(InputError, match="named pipe"):
        read_samples(tmp_path / "s.csv")


@pytest.mark.parametrize(
    ("links", "name", "words"),
    [
        ({"x.yaml": "x.yaml"}, "x.yaml", "link loop"),
        ({"x.yaml": "y", "y": "x.yaml"}, "x.yaml", "link loop"),
        ({"x.yaml": "nowhere.yaml"}, "x.yaml", "dangling link"),
        ({"catalogue.yaml": "catalogue.yaml"}, "catalogue.yaml", "link loop"),
        ({"catalogue.yaml": "gone.yaml"}, "catalogue.yaml", "dangling link"),
    ],
)
def test_link_loops_and_dangling_links(catalogue, links, name, words):
    folder = catalogue({"a.yaml": VALID_EVENT})
    for link, target in links.items():
        os.symlink(target, folder / link)
    problems = problems_of(folder)
    assert f"{folder / name}: {words}" in "\n".join(problems)


@pytest.mark.parametrize("name", ["x.yaml", "sub/y.yml", "catalogue.yaml"])
def test_a_folder_named_like_an_event_file(catalogue, name):
    folder = catalogue({"a.yaml": VALID_EVENT})
    (folder / name).mkdir(parents=True)
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / name}: is a folder")


@pytest.mark.parametrize(
    ("setup", "words"),
    [
        (lambda f: os.symlink("s.csv", f / "s.csv"), "link loop"),
        (lambda f: os.symlink("gone.csv", f / "s.csv"), "dangling link"),
        (lambda f: (f / "s.csv").mkdir(), "is a folder"),
    ],
)
def test_samples_file_that_is_not_a_regular_file(catalogue, setup, words):
    folder = catalogue({"a.yaml": VALID_EVENT + "samples: s.csv\n"})
    setup(folder)
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'a.yaml'}:19: samples: samples file 's.csv': {words}")


def test_target_of_names_what_a_path_is(tmp_path):
    (tmp_path / "f").write_text("x")
    assert target_of(tmp_path / "f", tmp_path) == (tmp_path / "f").resolve()
    os.symlink(tmp_path / "f", tmp_path / "inside")
    assert target_of(tmp_path / "inside", tmp_path) == (tmp_path / "f").resolve()
    with pytest.raises(FileRefused, match="outside the catalogue"):
        target_of(tmp_path / "f", tmp_path / "sub")


def test_hidden_files_and_folders_are_skipped_and_recorded(catalogue):
    folder = catalogue(
        {
            "a.yaml": VALID_EVENT,
            ".github/workflows/ci.yaml": "on: [push\n",  # not an event, and not even valid
            ".git/config.yml": "x",
            "sub/.draft.yaml": "id: [",
            ".notes": "plain text",
            "B.YAML": "not read either",
            "s.csv": "heavier.mass [Msun],lighter.mass [Msun],distance [Mpc]\n1,1,1\n",
        }
    )
    cat = load_catalogue(folder)
    assert [e.id for e in cat.events] == ["TEST-1"]
    skipped = dict(cat.skipped)
    assert set(skipped) == {
        folder / ".git",
        folder / ".github",
        folder / "sub" / ".draft.yaml",
        folder / "B.YAML",
    }
    assert "hidden folder" in skipped[folder / ".github"]
    assert "hidden file" in skipped[folder / "sub" / ".draft.yaml"]
    assert "'.YAML'" in skipped[folder / "B.YAML"]


def test_links_to_folders_are_not_followed_and_are_recorded(catalogue, tmp_path):
    folder = catalogue({"a.yaml": VALID_EVENT})
    elsewhere = tmp_path / "elsewhere"
    elsewhere.mkdir()
    (elsewhere / "b.yaml").write_text("id: [broken\n")
    os.symlink(elsewhere, folder / "more")
    cat = load_catalogue(folder)
    assert len(cat.events) == 1
    assert "not followed" in dict(cat.skipped)[folder / "more"]


def test_a_catalogue_without_skipped_entries_records_none(catalogue):
    assert load_catalogue(catalogue({"a.yaml": VALID_EVENT})).skipped == ()


def test_a_catalogue_folder_that_is_a_file(tmp_path):
    (tmp_path / "cat").write_text("x")
    with pytest.raises(InputError, match="is not a folder"):
        load_catalogue(tmp_path / "cat")
