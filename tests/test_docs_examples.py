"""The examples in README.md and docs/ run, and the docs name every key of the format.

The ```python blocks of docs/api.md are run in order, as one session, in an empty working
folder; the example event files, samples file and settings of README.md, docs/input-format.md,
docs/samples-files.md and docs/settings.md are loaded and must give no problem and no warning.
So the documented examples cannot drift away from the code. All example values are invented.
"""

from __future__ import annotations

import re
from pathlib import Path

import pytest

from factsheet.load import load_catalogue, load_settings
from factsheet.load.reference import reference_for
from factsheet.load.samples import NOT_YET
from factsheet.load.schema import (
    BODY_KEYS,
    CATALOGUE_KEYS,
    DETECTION_KEYS,
    ESTIMATE_KEYS,
    EVENT_KEYS,
    HISTORY_KEYS,
    HOST_KEYS,
)
from factsheet.model import ESTIMATE_PATHS, Limits
from factsheet.render.event_json import CONTRACT_QUANTITIES, JSON_QUANTITIES

ROOT = Path(__file__).resolve().parents[1]
DOCS = ROOT / "docs"
PAGES = (
    "README.md",
    "input-format.md",
    "samples-files.md",
    "settings.md",
    "json-export.md",
    "api.md",
    "sky-maps.md",
)


def blocks(path: Path, language: str) -> list[str]:
    """The fenced code blocks of one language in a Markdown file, in order."""
    fence = re.compile(rf"^```{language}[ \t]*\n(.*?)^```[ \t]*$", re.M | re.S)
    return fence.findall(path.read_text(encoding="utf-8"))


def test_the_docs_pages_exist_and_the_index_links_them():
    index = (DOCS / "README.md").read_text(encoding="utf-8")
    for page in [*PAGES[1:], "methods.md"]:
        assert (DOCS / page).is_file(), page
        assert f"({page})" in index, f"docs/README.md does not link {page}"


def test_api_examples_run(tmp_path, monkeypatch):
    examples = blocks(DOCS / "api.md", "python")
    assert len(examples) >= 8
    monkeypatch.chdir(tmp_path)
    session: dict = {"__name__": "docs_api"}
    for number, code in enumerate(examples, 1):
        try:
            exec(compile(code, f"docs/api.md, python block {number}", "exec"), session)
        except Exception as exc:  # name the block, keep the traceback
            first = code.strip().splitlines()[0]
            raise AssertionError(f"docs/api.md python block {number} ({first!r}) fails") from exc


def _write(folder: Path, files: dict[str, str]) -> Path:
    folder.mkdir()
    for name, text in files.items():
        (folder / name).write_text(text, encoding="utf-8")
    return folder


def test_input_format_examples_load_without_problems_or_warnings(tmp_path):
    complete, minimal, *_ = blocks(DOCS / "input-format.md", "yaml")
    (samples,) = blocks(DOCS / "samples-files.md", "csv")
    assert "samples: dx0412.csv" in complete
    folder = _write(
        tmp_path / "cat",
        {"dx0412.yaml": complete, "dx0413.yaml": minimal, "dx0412.csv": samples},
    )
    catalogue = load_catalogue(folder)
    assert [e.id for e in catalogue.events] == ["DX-0412", "DX-0413"]
    assert catalogue.warnings == ()
    example = catalogue.events[0]
    assert example.samples is not None and len(example.samples.values["heavier.mass"]) == 5
    assert example.host is not None and len(example.history) == 1


def test_input_format_history_example_loads_without_problems_or_warnings(tmp_path):
    _, minimal, *_, history = blocks(DOCS / "input-format.md", "yaml")
    event = minimal + "status: retracted\n" + history
    catalogue = load_catalogue(_write(tmp_path / "cat", {"dx0413.yaml": event}))
    (example,) = catalogue.events
    assert [h.status for h in example.history] == ["candidate", "retracted"]
    assert example.history[-1].estimate is None
    assert catalogue.warnings == ()


def test_input_format_chirp_mass_example_loads_without_problems_or_warnings(tmp_path):
    _, minimal, *others = blocks(DOCS / "input-format.md", "yaml")
    (chirp,) = [b for b in others if b.startswith("estimate:") and "chirp_mass:" in b]
    event = minimal.split("estimate:")[0] + chirp
    catalogue = load_catalogue(_write(tmp_path / "cat", {"dx0413.yaml": event}))
    (example,) = catalogue.events
    assert example.estimate.chirp_mass is not None and example.estimate.mass_ratio is not None
    assert catalogue.warnings == ()


def test_input_format_candidates_example_loads_without_problems_or_warnings(tmp_path):
    _, minimal, *others = blocks(DOCS / "input-format.md", "yaml")
    (candidates,) = [b for b in others if b.startswith("counterpart_candidates:")]
    catalogue = load_catalogue(_write(tmp_path / "cat", {"dx0413.yaml": minimal + candidates}))
    (example,) = catalogue.events
    (flare,) = example.counterpart_candidates
    assert flare.name == "Flare F-1" and flare.ra.to_value("deg") == 47.3
    assert catalogue.warnings == ()


def test_readme_example_loads_without_problems_or_warnings(tmp_path):
    (event,) = blocks(ROOT / "README.md", "yaml")
    (samples,) = blocks(DOCS / "samples-files.md", "csv")
    name = re.search(r"^samples:\s*(\S+)", event, re.M)
    assert name, "the README example names a samples file"
    folder = _write(tmp_path / "cat", {"event.yaml": event, name.group(1): samples})
    catalogue = load_catalogue(folder)
    assert len(catalogue.events) == 1
    assert catalogue.warnings == ()


@pytest.mark.parametrize("number", range(len(blocks(DOCS / "settings.md", "yaml"))))
def test_settings_examples_load(tmp_path, number):
    text = blocks(DOCS / "settings.md", "yaml")[number]
    path = tmp_path / "catalogue.yaml"
    path.write_text(text, encoding="utf-8")
    problems: list = []
    settings = load_settings(path, problems)
    assert problems == []
    reference_for(settings)  # the overrides are valid too


def _documented(page: str) -> str:
    return (DOCS / page).read_text(encoding="utf-8")


@pytest.mark.parametrize(
    "table",
    [EVENT_KEYS, DETECTION_KEYS, ESTIMATE_KEYS, BODY_KEYS, HISTORY_KEYS, HOST_KEYS],
    ids=["event", "detection", "estimate", "body", "history", "host"],
)
def test_input_format_lists_every_event_key(table):
    text = _documented("input-format.md")
    for name, key in table.items():
        rows = [line for line in text.splitlines() if line.startswith(f"| `{name}` |")]
        assert rows, f"docs/input-format.md has no table row for {name}"
        if key.kind == "unsupported":
            assert any("not supported yet" in row for row in rows), name
            instead = key.example  # what works today, for an unsupported key
            assert instead in text.replace("`", ""), f"{name}: what to do instead is not stated"
        else:  # a key built since must not keep a stale "not supported" row beside its own
            assert not any("not supported yet" in row for row in rows), name


def test_settings_lists_every_catalogue_key_and_limit():
    text = _documented("settings.md")
    for name, key in CATALOGUE_KEYS.items():
        rows = [line for line in text.splitlines() if line.startswith(f"| `{name}` |")]
        assert rows, f"docs/settings.md has no table row for {name}"
        if key.kind == "unsupported":
            assert "not supported yet" in rows[0], name
    for name in Limits.__dataclass_fields__:
        assert f"| `{name}` |" in text, name


def test_samples_page_lists_every_column():
    text = _documented("samples-files.md")
    for path in ESTIMATE_PATHS:
        assert f"| `{path}` |" in text, path
    for path in NOT_YET:
        assert f"`{path}`" in text, path
    assert "sky_map" in text and "(sky-maps.md)" in text


def test_sky_maps_example_writes_a_map_that_loads(tmp_path, monkeypatch):
    from factsheet.load.skymap import Where, check_sky_map, read_probabilities
    from factsheet.physics.sky import RankedMap, peak

    (example,) = blocks(DOCS / "sky-maps.md", "python")
    monkeypatch.chdir(tmp_path)
    exec(compile(example, "docs/sky-maps.md", "exec"), {"__name__": "docs_sky_maps"})
    problems, warnings = [], []
    sky = check_sky_map(tmp_path / "dx0412-sky.fits", problems, warnings, Where("ev.yaml", 1))
    assert not problems and not warnings
    prob = read_probabilities(sky)
    top = peak(prob, sky.nside, sky.ordering)
    assert abs(top.ra.value - 150) < 1 and abs(top.dec.value - 30) < 1  # to a pixel (0.9 deg)
    # a 3-degree blob: 90 % area −2πσ² ln 0.1 = 130 deg2 (closed form of a 2-D Gaussian)
    assert 120 < RankedMap(prob, sky.nside).area(0.9).value < 140


def test_json_page_lists_every_quantity_in_order():
    text = _documented("json-export.md")
    rows = re.findall(r"^\| `([a-z_]+)` \| `([^`]*)` \|", text, re.M)
    listed = [name for name, _ in rows if name in JSON_QUANTITIES]
    assert listed == list(JSON_QUANTITIES)
    columns = ", ".join(f"`{name}`" for name in CONTRACT_QUANTITIES)
    assert columns in text


def test_the_api_module_examples_run():
    import doctest

    import factsheet.api

    result = doctest.testmod(factsheet.api)
    assert result.attempted >= 4 and result.failed == 0


def test_readme_python_example_runs_on_a_new_catalogue(tmp_path, monkeypatch):
    from factsheet.load.scaffold import init_catalogue

    (code,) = blocks(ROOT / "README.md", "python")
    monkeypatch.chdir(tmp_path)
    init_catalogue(Path("my-catalogue"))
    exec(compile(code, "README.md", "exec"), {})  # the README's own example
