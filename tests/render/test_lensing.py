"""The what-if-lensed panel as readers get it: the sheet's table and conclusion, the JSON
export, the build cache's round trip and the figure. Events are invented."""

from __future__ import annotations

import dataclasses
import json

import pytest
from matplotlib.container import ErrorbarContainer

from factsheet import i18n
from factsheet.api import derive
from factsheet.cache import bundle_from_json, bundle_to_json
from factsheet.figures import style
from factsheet.figures.lensing import LensColumn, LensMass, lensed_masses
from factsheet.i18n import use_language
from factsheet.model import Audio, EventBundle, LensedCase, Settings, Summary
from factsheet.render import lensing
from factsheet.render.event_json import event_json
from factsheet.render.figures import lensing_figure
from factsheet.render.sheet import event_page

HEAVY = {
    "id": "T-HEAVY",
    "time": "2034-04-12T07:26:41.2",
    "estimate": {
        "heavier": {"mass": "88 +17 -14 Msun", "spin": "0.3 +0.4 -0.4"},
        "lighter": {"mass": "67 +15 -17 Msun", "spin": "0.1 +0.5 -0.5"},
        "distance": "3900 +1900 -1700 Mpc",
    },
}


@pytest.fixture(scope="module")
def heavy():
    return derive(HEAVY)


def _bands(below: float, gap: float) -> dict[str, float]:
    return {"stellar_black_hole": below, "pair_instability_gap": gap, "above_gap": 1 - below - gap}


def _case(mu: float, heavier: dict, lighter: dict) -> LensedCase:
    s = Summary(1.0, 0.5, 1.5, "solMass", 0.9)
    bands = {"heavier": heavier, "lighter": lighter}
    return LensedCase(mu, s, s, s, s, None, bands)


def test_where_a_body_probably_lies():
    assert lensing.where(_bands(0.6, 0.4)) == "below"
    assert lensing.where(_bands(0.2, 0.7)) == "in"
    assert lensing.where(_bands(0.0, 0.3)) == "above"
    assert lensing.where(_bands(0.4, 0.4)) == "edge"


def test_magnifications_follow_the_readers_decimal_sign():
    # exactly as given, with the language's decimal sign (Spanish: a comma, CLDR through Babel)
    assert lensing.magnification_text(1.5) == "1.5" and lensing.magnification_text(25.0) == "25"
    with use_language("es"):
        assert lensing.magnification_text(1.5) == "1,5"


def test_conclusion_names_the_smallest_magnification_that_clears_the_gap():
    cases = (
        _case(4, _bands(0.1, 0.9), _bands(0.3, 0.7)),
        _case(25, _bands(0.6, 0.4), _bands(0.99, 0.01)),
        _case(100, _bands(1, 0), _bands(1, 0)),
    )
    assert lensing.conclusion(cases) == (
        "Magnified 25 times, both bodies would probably lie below the pair-instability gap. "
        "Magnified 4 times, neither would yet."
    )
    one_left = (_case(4, _bands(0.1, 0.9), _bands(0.9, 0.1)), cases[1])
    assert lensing.conclusion(one_left).endswith(
        "Magnified 4 times, the heavier body would not yet."
    )
    assert lensing.conclusion(cases[1:]) == (
        "Magnified 25 times, both bodies would probably lie below the pair-instability gap."
    )
    never = (_case(2.5, _bands(0.1, 0.9), _bands(0.8, 0.2)),)
    assert lensing.conclusion(never) == (
        "Even magnified 2.5 times, the heavier body would probably not lie below the "
        "pair-instability gap."
    )


def test_sheet_panel(heavy):
    page = event_page(heavy, None, None, (), Audio("", "", 0.0))
    panel = page.lensing
    assert panel is not None and panel.remnant and panel.gap == "45–130 M⊙"
    first, *rows = panel.rows
    assert first.measured and first.heavier == "88 +17 −14 M⊙" and first.where == "both in the gap"
    assert first.distance == "3.9 +1.9 −1.7 Gpc"  # the given distance, in the panel's unit
    assert [r.magnification for r in rows] == ["4", "25", "100"]
    assert rows[-1].where == "both below the gap"
    assert panel.conclusion.startswith("Magnified 25 times, both bodies would probably lie below")
    assert any("no lens is known" in note for note in panel.notes)
    # the panel's caveat is said in the panel, not in a box before the numbers
    assert not any(c.code.startswith("lensing") for c in (*page.boxes, *page.later))


def test_retracted_sheet_has_no_panel(heavy):
    event = dataclasses.replace(heavy.event, status="retracted")
    item = dataclasses.replace(heavy, event=event)
    assert event_page(item, None, None, (), Audio("", "", 0.0)).lensing is None


def test_json_contract(heavy):
    doc = event_json(heavy)
    entries = doc["what_if_lensed"]
    assert [e["magnification"] for e in entries] == [4.0, 25.0, 100.0]
    for e in entries:
        assert set(e["distance"]) >= {"median", "low", "high", "unit"}
        assert e["distance"]["unit"] == "Mpc" and isinstance(e["redshift"], float)
        low, high = e["redshift_interval"]["low"], e["redshift_interval"]["high"]
        assert low < e["redshift"] < high
        for key in ("heavier_mass", "lighter_mass", "remnant_mass"):
            assert e[key]["unit"] == "solMass" and e[key]["frame"] == "source"
            assert e[key]["low"] < e[key]["median"] < e[key]["high"]
        assert sum(e["mass_bands"]["heavier"].values()) == pytest.approx(1)
        assert e["origin"] == "automatic"
    assert "lensing-what-if" in [c["code"] for c in doc["caveats"]]
    assert list(doc).index("what_if_lensed") == list(doc).index("counterpart_windows") + 1


def test_json_leaves_the_key_out_without_a_panel():
    typical = {**HEAVY, "estimate": {**HEAVY["estimate"], "distance": "400 +100 -100 Mpc"}}
    typical["estimate"]["heavier"] = {"mass": "30 +5 -5 Msun"}
    typical["estimate"]["lighter"] = {"mass": "25 +5 -5 Msun"}
    assert "what_if_lensed" not in event_json(derive(typical))


def test_cache_round_trip_keeps_the_panel(heavy):
    bundle = EventBundle(dataclasses.replace(heavy, samples={}), {}, Audio("", "", 0.0))
    stored = json.loads(json.dumps(bundle_to_json(bundle)), object_hook=i18n.json_hook)
    back = bundle_from_json(stored, heavy.event, heavy.settings, heavy.reference)
    assert back.derived.lensing == heavy.lensing


def test_settings_fingerprint_follows_the_magnifications():
    assert Settings().fingerprint() != Settings(what_if_lensed=(9.0,)).fingerprint()


def test_figure_draws_every_column_against_the_gap(heavy):
    figure = lensing_figure(heavy, "events/T-HEAVY")
    assert figure.path == "events/T-HEAVY-lensing.svg"
    assert b"<text" in figure.svg or b"pair-instability gap" in figure.svg
    assert "4×: m₁" in figure.alt and "pair-instability gap" in figure.alt


def test_figure_is_sheet_width_with_readable_text():
    mass = LensMass("m₁", "primary", 60.0, 50.0, 70.0, "60 M⊙")
    drawing = lensed_masses(
        [LensColumn("none", (mass,)), LensColumn("4×", (mass._replace(median=45.0, low=40.0),))],
        (45.0, 130.0),
        "pair-instability gap",
    )
    fig = drawing.figure
    assert fig.get_figwidth() == pytest.approx(style.WIDTH)
    ax = fig.axes[0]
    assert len([c for c in ax.containers if isinstance(c, ErrorbarContainer)]) == 2
    sizes = [t.get_fontsize() for t in fig.findobj(lambda a: hasattr(a, "get_fontsize"))]
    assert min(sizes) >= style.FONT
    assert [t.get_text() for t in ax.get_xticklabels()] == ["none", "4×"]
    assert "(M⊙)" in ax.get_ylabel()
