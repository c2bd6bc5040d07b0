"""The demo's sky maps are what tools/make_sky_maps.py writes, and the events agree with them.

The script is run into a temporary folder: twice, to show it writes byte-identical files, and
its maps compared with the shipped ones value for value. Each demo event's `sky_area` must
agree with its map's 90 % area, so the demo raises no disagreement warning.
"""

from __future__ import annotations

import importlib.util
from pathlib import Path

import astropy.units as u
import numpy as np
import pytest
from astropy.io import fits

from factsheet.load import load_catalogue
from factsheet.load.skymap import read_probabilities
from factsheet.physics.sky import RankedMap

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "events_demo"


def _tool(name: str):
    spec = importlib.util.spec_from_file_location(name, ROOT / "tools" / f"{name}.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


@pytest.fixture(scope="module")
def sky_tool():
    return _tool("make_sky_maps")


def test_the_sky_map_script_is_deterministic_and_matches_the_shipped_maps(sky_tool, tmp_path):
    first, second = tmp_path / "a", tmp_path / "b"
    for folder in (first, second):
        folder.mkdir()
        sky_tool.main(folder)
    for name in sky_tool.MAPS:
        assert (first / name).read_bytes() == (second / name).read_bytes(), name
        with fits.open(first / name) as made, fits.open(DEMO / name) as shipped:
            np.testing.assert_array_equal(made[1].data["PROB"], shipped[1].data["PROB"])
            for key in ("NSIDE", "ORDERING", "COORDSYS", "INDXSCHM", "PIXTYPE"):
                assert made[1].header[key] == shipped[1].header[key], (name, key)
        assert (DEMO / name).stat().st_size < 210_000, name


#: The three demo maps: the event, the kind of map and its 90 % area's range (deg2).
KINDS = {
    "MER34-012": ("compact", 20, 60),
    "MER34-005": ("arc", 500, 1500),
    "MER34-011": ("broad", 2000, 5000),
}


def test_each_demo_map_has_its_size_and_agrees_with_the_sky_area():
    events = {e.id: e for e in load_catalogue(DEMO).events}
    with_maps = {i for i, e in events.items() if e.detection.sky_map is not None}
    assert with_maps == set(KINDS)
    assert len(events["MER34-005"].detection.network) == 2  # the arc is a two-site detection
    for event_id, (_, low, high) in KINDS.items():
        detection = events[event_id].detection
        ranked = RankedMap(read_probabilities(detection.sky_map), detection.sky_map.nside)
        area = ranked.area(0.9).to_value(u.deg**2)
        assert low <= area <= high, (event_id, area)
        assert detection.sky_area.to_value(u.deg**2) == pytest.approx(area, rel=0.02), event_id
