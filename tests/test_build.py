"""The build does each piece of work once: every input file is read once, every event's cache
key and the templates' fingerprint are computed once per build."""

from __future__ import annotations

import pathlib
import sys

import numpy as np
from helpers import VALID_EVENT, loaded_after

from factsheet import build as build_module
from factsheet.build import build
from factsheet.load import files
from factsheet.render import site as render_site_module

SAMPLES = "heavier.mass [Msun],lighter.mass [Msun],distance [Mpc]\n"


def _catalogue(catalogue):
    rng = np.random.default_rng(3)
    rows = "".join(
        f"{36 + rng.normal():.4f},{29 + rng.normal():.4f},{440 + 50 * rng.normal():.2f}\n"
        for _ in range(200)
    )
    second = VALID_EVENT.replace("TEST-1", "TEST-2") + "samples: two.csv\n"
    return catalogue({"one.yaml": VALID_EVENT, "two.yaml": second, "two.csv": SAMPLES + rows})


def _count_calls(monkeypatch, owner, name) -> list:
    calls = []
    original = getattr(owner, name)

    def counted(*args, **kwargs):
        calls.append(args)
        return original(*args, **kwargs)

    monkeypatch.setattr(owner, name, counted)
    return calls


def test_each_input_file_is_read_once_per_build(catalogue, tmp_path, monkeypatch):
    folder = _catalogue(catalogue)
    opened = []
    original_open, original_regular = pathlib.Path.open, files.open_regular

    def spy(path, *args, **kwargs):
        if pathlib.Path(path).parent.resolve() == folder.resolve():
            opened.append(pathlib.Path(path).name)

    def spy_open(self, *args, **kwargs):
        spy(self)
        return original_open(self, *args, **kwargs)

    def spy_regular(path, *args, **kwargs):
        spy(path)
        return original_regular(path, *args, **kwargs)

    monkeypatch.setattr(pathlib.Path, "open", spy_open)  # any way a file is opened
    monkeypatch.setattr(files, "open_regular", spy_regular)
    build(folder, tmp_path / "site", jobs=1)
    # The samples file is read once to derive and once more to publish its copy beside the
    # sheet (that copy is checked against the digest of the first read).
    assert sorted(opened) == ["one.yaml", "two.csv", "two.csv", "two.yaml"]
    opened.clear()
    build(folder, tmp_path / "site", jobs=1)  # a rebuild reads them once again; the cached
    assert sorted(opened) == ["one.yaml", "two.csv", "two.yaml"]  # copy is reused


def test_keys_and_fingerprints_are_computed_once(catalogue, tmp_path, monkeypatch):
    folder = _catalogue(catalogue)
    keys = _count_calls(monkeypatch, build_module, "event_key")
    prints = _count_calls(monkeypatch, build_module, "templates_fingerprint")
    also = _count_calls(monkeypatch, render_site_module, "templates_fingerprint")
    build(folder, tmp_path / "site", jobs=1)
    assert len(keys) == 2
    assert len(prints) + len(also) == 1


def test_each_event_page_is_rendered_once_where_its_event_is_drawn(
    catalogue, tmp_path, monkeypatch
):
    folder = _catalogue(catalogue)
    drawn = _count_calls(monkeypatch, build_module, "event_page_files")
    again = _count_calls(monkeypatch, render_site_module, "event_page_files")
    build(folder, tmp_path / "site", jobs=1)
    assert len(drawn) == 2 and again == []  # two events, one language: rendered by the worker
    assert (tmp_path / "site" / "data" / "TEST-2.json").is_file()


def test_workers_default_to_the_cores_the_process_may_use(monkeypatch):
    monkeypatch.setattr(build_module.os, "sched_getaffinity", lambda pid: {0, 3, 5}, raising=False)
    assert build_module.available_cores() == 3


def test_the_builds_own_process_loads_neither_matplotlib_nor_scipy(catalogue, tmp_path):
    # with workers, everything that draws or derives happens in them, the index's figures
    # included: the build's own process keeps its memory for the catalogue
    folder = _catalogue(catalogue)
    code = (
        "from factsheet.build import build\n"
        f"report = build({str(folder)!r}, {str(tmp_path / 'site')!r}, jobs=2)\n"
        "assert report.built == 2\n"
    )
    found = loaded_after(code, ("matplotlib", "scipy", "astropy.cosmology"))
    assert found == ["False", "False", "False"]
    assert (tmp_path / "site" / "figures" / "mass-plane.svg").is_file()


def _frozen_objects() -> int:
    import gc

    return gc.get_freeze_count()


def test_workers_run_with_the_builds_objects_out_of_the_collectors_reach():
    # a collection in a forked worker would copy every page it shares with the build
    import gc

    with build_module._pool(1) as pool:
        in_worker = pool.submit(_frozen_objects).result()
    assert gc.get_freeze_count() == 0  # the build's own collector is itself again
    if sys.platform == "linux":  # forked: the worker inherits the frozen objects
        assert in_worker > 1000
