"""The shipped folders are found in a wheel install and in a checkout (packaging)."""

import zipfile

import pytest

from factsheet.resources import demo_dir, shipped_folder, templates_dir


def test_packaged_copy_wins_over_the_checkout(tmp_path):
    package = tmp_path / "site-packages" / "factsheet"
    (package / "templates").mkdir(parents=True)
    (tmp_path / "site-packages" / "templates").mkdir()
    assert shipped_folder("templates", package) == package / "templates"


def test_checkout_folder_beside_the_package(tmp_path):
    package = tmp_path / "checkout" / "factsheet"
    package.mkdir(parents=True)
    (tmp_path / "checkout" / "events_demo").mkdir()
    assert shipped_folder("events_demo", package) == tmp_path / "checkout" / "events_demo"


def test_missing_folder_is_a_clear_error(tmp_path):
    with pytest.raises(FileNotFoundError, match="templates"):
        shipped_folder("templates", tmp_path / "factsheet")


def test_installed_folders_hold_what_the_build_needs():
    assert (templates_dir() / "event.html").is_file()
    assert (templates_dir() / "static" / "style.css").is_file()
    assert (demo_dir() / "catalogue.yaml").is_file()


def test_wheel_ships_templates_and_demo(tmp_path):
    from pathlib import Path

    from hatchling.builders.wheel import WheelBuilder

    root = Path(__file__).resolve().parents[1]
    if not (root / "pyproject.toml").is_file():
        pytest.fail("run the tests from a checkout: the wheel is built from its pyproject.toml")
    wheel = next(
        iter(WheelBuilder(str(root)).build(directory=str(tmp_path), versions=["standard"]))
    )
    names = zipfile.ZipFile(wheel).namelist()
    assert "factsheet/templates/event.html" in names
    assert "factsheet/templates/static/catalogue.js" in names
    assert "factsheet/events_demo/catalogue.yaml" in names
    assert "factsheet/data/mass_bands.yaml" in names
    assert "factsheet/physics/_qnm_table.py" in names
    assert "factsheet/locale/es/LC_MESSAGES/factsheet.mo" in names  # the compiled catalogue
