"""What a sheet's figures say, from the demo catalogue (invented events): the sharing image comes
last and states the status, and a pair whose inspiral ends below the band edge says so."""

from __future__ import annotations

import struct

import pytest

from factsheet.derive import derive_event
from factsheet.load.catalogue import load_catalogue
from factsheet.notation import format_median
from factsheet.render.contexts import display_summary
from factsheet.render.figures import event_figures, in_band_note, median_text
from factsheet.resources import demo_dir


@pytest.fixture(scope="module")
def demo():
    catalogue = load_catalogue(demo_dir())
    return {e.id: e for e in catalogue.events}, catalogue.settings


def derived(demo, event_id: str):
    events, settings = demo
    return derive_event(events[event_id], settings)


def test_share_image_comes_last_and_a_retraction_says_so_first(demo):
    retracted = next(e for e in demo[0].values() if e.status == "retracted")
    figures = event_figures(derive_event(retracted, demo[1]))
    share = figures[-1]
    assert share.path == f"events/{retracted.id}-share.png"
    assert not any(f.path.endswith(".png") for f in figures[:-1])
    assert struct.unpack(">II", share.svg[16:24]) == (1200, 630)
    assert share.alt.startswith("Retracted: ")


def test_share_image_masses_read_as_the_table_rounds_them(demo):
    item = derived(demo, "MER34-001")
    share = event_figures(item)[-1]
    for key in ("heavier_mass", "lighter_mass", "remnant_mass"):
        s = display_summary(item.quantities[key])
        assert format_median(s.median, s.low, s.high, s.unit) in share.alt
    assert share.alt.startswith(item.event.title)  # a confirmed event shows no status word


def test_heavy_pair_says_only_merger_and_ringdown_are_in_band(demo):
    heavy = derived(demo, "MER34-006")  # its ISCO frequency lies below the 20 Hz band edge
    note = in_band_note(heavy)
    assert note is not None
    assert median_text(heavy, "isco_frequency") in note
    assert "Only the merger and the ringdown are in the detectors' band" in note
    track = next(f for f in event_figures(heavy) if f.path.endswith("-track.svg"))
    assert note in track.caption
    assert "only the merger and ringdown are in band" in track.alt
    assert in_band_note(derived(demo, "MER34-001")) is None
