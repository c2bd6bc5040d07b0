"""End to end: build the packaged demo and read the site back (DESIGN.md sections 5 and 6)."""

import json
from html.parser import HTMLParser
from pathlib import Path
from urllib.parse import urlsplit

import astropy.units as u
import pytest

from factsheet.build import build
from factsheet.load import load_catalogue
from factsheet.resources import demo_dir

CONTRACT_KEYS = {
    "id",
    "time_utc",
    "source_class",
    "credible_level",
    "quantities",
    "mass_bands",
    "counterpart_windows",
    "caveats",
}
QUANTITY_KEYS = {
    "mass_1",
    "mass_2",
    "total_mass",
    "chirp_mass",
    "mass_ratio",
    "chi_eff",
    "luminosity_distance",
    "redshift",
    "isco_frequency",
    "time_in_band",
}
REMNANT_KEYS = {
    "final_mass",
    "final_spin",
    "radiated_mass",
    "radiated_energy",
    "peak_luminosity",
    "kick_velocity",
    "ringdown_frequency",
    "ringdown_damping_time",
}
UNITS = {
    "mass_1": "solMass",
    "luminosity_distance": "Mpc",
    "radiated_energy": "J",
    "peak_luminosity": "W",
    "kick_velocity": "km / s",
    "ringdown_frequency": "Hz",
    "ringdown_damping_time": "s",
    "isco_frequency": "Hz",
    "time_in_band": "s",
}


class Links(HTMLParser):
    def __init__(self):
        super().__init__()
        self.links: list[str] = []

    def handle_starttag(self, tag, attrs):
        for name, value in attrs:
            if name in ("href", "src") and value:
                self.links.append(value)


@pytest.fixture(scope="module")
def demo_site(tmp_path_factory) -> Path:
    out = tmp_path_factory.mktemp("demo") / "site"
    build(demo_dir(), out)
    return out


def test_every_public_event_has_a_page_and_json(demo_site):
    events = [
        e
        for e in load_catalogue(demo_dir()).events
        if e.visibility == "public" and e.embargo_until is None
    ]
    for event in events:
        assert (demo_site / "events" / f"{event.id}.html").is_file()
        data = json.loads((demo_site / "data" / f"{event.id}.json").read_text())
        assert data.keys() >= CONTRACT_KEYS and data["quantities"].keys() >= QUANTITY_KEYS
        for name, q in data["quantities"].items():
            assert q["low"] <= q["median"] <= q["high"], name
            u.Unit(q["unit"])  # astropy unit strings (DESIGN.md section 6)
        if data["source_class"] == "BBH":
            assert data["quantities"].keys() >= REMNANT_KEYS
            assert data["quantities"]["final_spin"]["fit_spread"] >= 0
        for name, unit in UNITS.items():
            if name in data["quantities"]:
                assert data["quantities"][name]["unit"] == unit
        assert set(data["mass_bands"]) >= {"mass_1", "mass_2"}
        for bands in data["mass_bands"].values():
            assert sum(p for k, p in bands.items() if k != "intermediate_mass") == pytest.approx(1)


def test_every_relative_link_resolves(demo_site):
    pages = sorted(demo_site.rglob("*.html"))
    assert len(pages) >= 13
    for page in pages:
        parser = Links()
        parser.feed(page.read_text(encoding="utf-8"))
        for link in parser.links:
            parts = urlsplit(link)
            if parts.scheme == "data" or link.startswith("#"):
                continue
            assert not parts.scheme and not parts.netloc and not link.startswith("/"), link
            assert (page.parent / parts.path).resolve().is_file(), f"{page.name}: {link}"


def test_index_links_every_sheet(demo_site):
    index = (demo_site / "index.html").read_text(encoding="utf-8")
    for page in (demo_site / "events").glob("*.html"):
        assert f'href="events/{page.name}"' in index


def test_sheets_carry_previous_and_next_links(demo_site):
    pages = sorted((demo_site / "events").glob("*.html"))
    middle = pages[len(pages) // 2].read_text(encoding="utf-8")
    assert 'rel="prev"' in middle and 'rel="next"' in middle


def test_cgs_energy_units_on_the_page(tmp_path):
    from helpers import VALID_EVENT, write_catalogue

    cat = write_catalogue(
        tmp_path / "cat", {"a.yaml": VALID_EVENT, "catalogue.yaml": "energy_units: cgs\n"}
    )
    build(cat, tmp_path / "out", jobs=1)
    page = (tmp_path / "out" / "events" / "TEST-1.html").read_text()
    assert "erg s⁻¹" in page and "× 10⁵⁶ erg s⁻¹" in page  # peak luminosity ~ 3.6e56 erg/s
    data = json.loads((tmp_path / "out" / "data" / "TEST-1.json").read_text())
    assert data["quantities"]["radiated_energy"]["unit"] == "J"  # the JSON contract keeps SI


def test_sheets_state_the_detection_and_class_probabilities(demo_site):
    data = json.loads((demo_site / "data" / "MER34-008.json").read_text())
    probs = data["source_class_probabilities"]
    assert set(probs) == {"BNS", "NSBH", "BBH"} and sum(probs.values()) == pytest.approx(1)
    assert 0 <= data["disruption_probability"] <= 1
    detection = data["detection"]
    assert detection["detectors"] and detection["snr"] > 0
    assert detection["false_alarm_rate"]["unit"] == "1 / yr"
    page = (demo_site / "events" / "MER34-008.html").read_text(encoding="utf-8")
    assert "Network signal-to-noise ratio" in page and "Neutron star torn apart" in page
    for name in detection["detectors"]:
        assert name in page
