"""Validation errors name the file, the line and the key path (input format version 2)."""

import hashlib
from pathlib import Path

import pytest
from helpers import VALID_EVENT, loaded_after

from factsheet.errors import InputError
from factsheet.load import load_catalogue


def problems_of(folder: Path) -> list[str]:
    with pytest.raises(InputError) as info:
        load_catalogue(folder)
    return [str(p) for p in info.value.problems]


def replace(text: str, old: str, new: str) -> str:
    assert old in text
    return text.replace(old, new)


def test_valid_event_loads(catalogue):
    cat = load_catalogue(catalogue({"a.yaml": VALID_EVENT}))
    (event,) = cat.events
    assert event.id == "TEST-1" and event.estimate["heavier.mass"].median == 36
    assert event.detection.false_alarm_rate.unit.physical_type == "frequency"
    assert cat.settings.cosmology == "Planck18" and cat.settings.credible_level == 0.9


@pytest.mark.parametrize(
    ("old", "new", "line", "key", "words"),
    [
        ("    mass: 29 +4 -5 Msun\n", "", 15, "estimate.lighter.mass", "missing required key"),
        ("36 +5 -4 Msun", "36 +5 -4 Mpc", 12, "estimate.heavier.mass", "expected a mass"),
        ("36 +5 -4 Msun", "36 +5 -4", 12, "estimate.heavier.mass", "missing unit"),
        ("36 +5 -4 Msun", "-36 +5 -4 Msun", 12, "estimate.heavier.mass", "out of range"),
        ("36 +5 -4 Msun", ".nan", 12, "estimate.heavier.mass", "finite"),
        ("36 +5 -4 Msun", "1e999 Msun", 12, "estimate.heavier.mass", "finite"),
        ("0.1 +0.2 -0.2", "0.9 +0.2 -0.2", 13, "estimate.heavier.spin", "out of range"),
        ("0.1 +0.2 -0.2", "0.1 +0.2 Msun", 13, "estimate.heavier.spin", "malformed interval"),
        ("440 +180 -170 Mpc", "440 +180 -170 Msun", 17, "estimate.distance", "length"),
        ('"2034-04-12T07:26:41.2"', "2034-14-12", 3, "time", "bad time"),
        ("id: TEST-1", "id: ../evil", 1, "id", "invalid id"),
        ("id: TEST-1", "id: a/b", 1, "id", "invalid id"),
        ("status: confirmed", "status: confrimed", 4, "status", "did you mean 'confirmed'"),
        ("title: A test pair", "titel: A test pair", 2, "titel", "did you mean 'title'"),
        ("580 deg2", "580 Mpc", 9, "detection.sky_area", "solid angle"),
        ("snr: 14.3", "snr: high", 7, "detection.snr", "expected a number"),
        ("network: [A1, B1]", "network: A1", 6, "detection.network", "list of labels"),
        ("network: [A1, B1]", "netwrok: [A1, B1]", 6, "detection.netwrok", "did you mean"),
        (
            "    spin: 0.0 +0.3 -0.3\n",
            "    spin: 0.0 +0.3 -0.3\n  effective_spin: 0.1\n",
            17,
            "estimate.effective_spin",
            "give either effective_spin or the bodies' spin, not both",
        ),
        (
            "29 +4 -5 Msun",
            "40 +4 -5 Msun",
            15,
            "estimate.lighter.mass",
            "the lighter body's mass exceeds the heavier body's",
        ),
        ("summary: A *test* event.", "samples: missing.csv", 18, "samples", "not found"),
        ("snr: 14.3", "snr: 14.3\n  snr: 15", 8, "snr", "duplicate key"),
    ],
)
def test_each_problem_names_file_line_and_key(catalogue, old, new, line, key, words):
    folder = catalogue({"ev.yaml": replace(VALID_EVENT, old, new)})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'ev.yaml'}:{line}: {key}: "), problem
    assert words in problem


@pytest.mark.parametrize(
    ("setting", "key", "words"),
    [
        ("languages: [en, fr]\n", "languages[1]", "no translation for fr"),
        ("languages: [en, en]\n", "languages[1]", "listed twice"),
    ],
)
def test_catalogue_languages_name_line_and_key(catalogue, setting, key, words):
    folder = catalogue({"catalogue.yaml": "title: A season\n" + setting, "a.yaml": VALID_EVENT})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'catalogue.yaml'}:2: {key}: "), problem
    assert words in problem


def test_all_problems_of_all_files_are_reported(catalogue):
    bad = replace(replace(VALID_EVENT, "Msun", "Mpc"), "confirmed", "maybe")
    folder = catalogue({"a.yaml": bad, "b.yaml": "id: [unclosed\n", "c.yaml": ""})
    problems = problems_of(folder)
    assert sum("a.yaml" in p for p in problems) == 3  # two masses and the status
    assert any("b.yaml:2:" in p and "not valid YAML" in p for p in problems)  # parser: end of file
    assert any("c.yaml:1:" in p and "empty" in p for p in problems)


@pytest.mark.parametrize(
    ("content", "words"),
    [(b"- a\n- b\n", "mapping"), (b"\xff\xfe\x00bad", "not UTF-8"), (b"key: [1,\n", "YAML")],
)
def test_unreadable_files(catalogue, content, words):
    folder = catalogue({})
    (folder / "x.yaml").write_bytes(content)
    (problem,) = problems_of(folder)
    assert str(folder / "x.yaml") in problem and words in problem


def test_duplicate_ids_across_files(catalogue):
    folder = catalogue({"a.yaml": VALID_EVENT, "b.yaml": VALID_EVENT})
    (problem,) = problems_of(folder)
    assert "b.yaml:1: id: duplicate id 'TEST-1'" in problem and "a.yaml" in problem


def test_digests_are_sha256_of_the_files_bytes(catalogue):
    rows = "heavier.mass [Msun],lighter.mass [Msun],distance [Mpc]\n36,29,440\n35,30,450\n"
    folder = catalogue({"a.yaml": VALID_EVENT + "samples: s.csv\n", "s.csv": rows})
    (event,) = load_catalogue(folder).events
    assert event.source_digest == hashlib.sha256((folder / "a.yaml").read_bytes()).hexdigest()
    assert event.samples.digest == hashlib.sha256((folder / "s.csv").read_bytes()).hexdigest()
    assert event.samples.path == (folder / "s.csv").resolve()


@pytest.mark.parametrize(
    ("settings", "key", "words"),
    [
        ("cosmology: Planck19\n", "cosmology", "did you mean 'Planck18'"),
        ("credible_level: 1.0\n", "credible_level", "out of range"),
        ("credible_level: 0\n", "credible_level", "out of range"),
        ("low_frequency: 20\n", "low_frequency", "missing unit"),
        ("energy_units: imperial\n", "energy_units", "expected one of"),
        ("sampels: 100\n", "sampels", "did you mean 'samples'"),
    ],
)
def test_settings_errors(catalogue, settings, key, words):
    folder = catalogue({"catalogue.yaml": settings, "a.yaml": VALID_EVENT})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'catalogue.yaml'}:1: {key}: ") and words in problem


def test_settings_defaults_and_values(catalogue):
    folder = catalogue(
        {"catalogue.yaml": "low_frequency: 10 Hz\ncredible_level: 0.68\n", "a.yaml": VALID_EVENT}
    )
    settings = load_catalogue(folder).settings
    assert settings.low_frequency.to_value("Hz") == 10 and settings.credible_level == 0.68
    assert settings.samples == 4000 and settings.energy_units == "SI"


def test_symlink_outside_catalogue_is_refused(catalogue, tmp_path):
    outside = tmp_path / "outside.yaml"
    outside.write_text(VALID_EVENT)
    folder = catalogue({})
    (folder / "link.yaml").symlink_to(outside)
    (problem,) = problems_of(folder)
    assert "link.yaml" in problem and "outside the catalogue" in problem


def test_demo_catalogue_is_valid():
    from factsheet.resources import demo_dir

    cat = load_catalogue(demo_dir())
    assert len(cat.events) >= 12


def test_loading_the_demo_imports_no_cosmology_or_scipy():
    # the build's own process loads and checks every file but derives nothing: a distance is
    # checked against the shipped table of limits (factsheet.physics._distance_limits)
    code = (
        "from factsheet.load import load_catalogue\n"
        "from factsheet.resources import demo_dir\n"
        "assert load_catalogue(demo_dir()).events\n"
    )
    assert loaded_after(code, ("astropy.cosmology", "scipy")) == ["False", "False"]
