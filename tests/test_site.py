"""End to end: build the packaged demo and read the site back (pages, links, the JSON export)."""

import json
import re
from html.parser import HTMLParser
from pathlib import Path
from urllib.parse import urlsplit

import astropy.units as u
import pytest
from helpers import EXPORT_QUANTITIES, VALID_EVENT, write_catalogue

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
    "heavier_mass",
    "lighter_mass",
    "total_mass",
    "chirp_mass",
    "mass_ratio",
    "distance",
    "redshift",
    "isco_frequency",
    "time_in_band",
}
#: Spins an event may give; the effective spin is summarised only when one of them is given.
SPIN_PATHS = {"heavier.spin", "lighter.spin", "effective_spin"}
SPIN_PATHS |= {"heavier.spin_magnitude", "lighter.spin_magnitude"}  # spin vectors (with tilts)
REMNANT_KEYS = {
    "remnant_mass",
    "remnant_spin",
    "radiated_mass",
    "energy_radiated",
    "peak_luminosity",
    "kick_velocity",
    "ringdown_frequency",
    "ringdown_damping_time",
}
UNITS = {
    "heavier_mass": "solMass",
    "distance": "Mpc",
    "energy_radiated": "J",
    "peak_luminosity": "W",
    "kick_velocity": "km / s",
    "ringdown_frequency": "Hz",
    "ringdown_damping_time": "s",
    "isco_frequency": "Hz",
    "time_in_band": "s",
}

BAND_KEYS = {"neutron_star", "lower_gap", "stellar_black_hole", "pair_instability_gap", "above_gap"}


#: The only place a page may link out of the site: a reference's arXiv abstract, as an anchor
#: the reader may follow (a link, never a request the page makes).
OUTBOUND = "https://arxiv.org/abs/"


class Links(HTMLParser):
    def __init__(self):
        super().__init__()
        self.links: list[str] = []

    def handle_starttag(self, tag, attrs):
        for name, value in attrs:
            if tag == "a" and name == "href" and value and value.startswith(OUTBOUND):
                continue
            if name in ("href", "src") and value:
                self.links.append(value)


class Images(HTMLParser):
    """The alt text of every image, by the file name it shows."""

    def __init__(self):
        super().__init__()
        self.alt: dict[str, str] = {}

    def handle_starttag(self, tag, attrs):
        found = dict(attrs)
        if tag == "img" and found.get("src"):
            self.alt[found["src"].rsplit("/", 1)[-1]] = found.get("alt", "")


def alt_texts(page: Path) -> dict[str, str]:
    parser = Images()
    parser.feed(page.read_text(encoding="utf-8"))
    return parser.alt


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
        given = set(event.estimate.values()) | set(event.samples.values if event.samples else ())
        assert ("effective_spin" in data["quantities"]) == bool(given & SPIN_PATHS), event.id
        in_plane = given & {"heavier.tilt", "lighter.tilt", "precession_spin"}
        assert ("precession_spin" in data["quantities"]) == bool(in_plane), event.id
        for name, q in data["quantities"].items():
            assert q["low"] <= q["median"] <= q["high"], name
            u.Unit(q["unit"])  # the export gives astropy unit strings
        if data["source_class"] == "BBH":
            assert data["quantities"].keys() >= REMNANT_KEYS
            assert data["quantities"]["remnant_spin"]["fit_spread"] >= 0
        for name, unit in UNITS.items():
            if name in data["quantities"]:
                assert data["quantities"][name]["unit"] == unit
        assert set(data["mass_bands"]) >= {"heavier", "lighter"}
        for bands in data["mass_bands"].values():
            assert sum(bands.values()) == pytest.approx(1)


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
    cat = write_catalogue(
        tmp_path / "cat", {"a.yaml": VALID_EVENT, "catalogue.yaml": "energy_units: cgs\n"}
    )
    build(cat, tmp_path / "out", jobs=1)
    page = (tmp_path / "out" / "events" / "TEST-1.html").read_text()
    assert "erg s⁻¹" in page and "× 10⁵⁶ erg s⁻¹" in page  # peak luminosity ~ 3.6e56 erg/s
    data = json.loads((tmp_path / "out" / "data" / "TEST-1.json").read_text())
    assert data["quantities"]["energy_radiated"]["unit"] == "J"  # the JSON contract keeps SI


def test_sheets_state_the_detection_and_class_probabilities(demo_site):
    data = json.loads((demo_site / "data" / "MER34-008.json").read_text())
    probs = data["source_class_probabilities"]
    assert set(probs) == {"BNS", "NSBH", "BBH"} and sum(probs.values()) == pytest.approx(1)
    assert 0 <= data["disruption_probability"] <= 1
    detection = data["detection"]
    assert detection["network"] and detection["snr"] > 0
    assert detection["false_alarm_rate"]["unit"] == "1 / yr"
    page = (demo_site / "events" / "MER34-008.html").read_text(encoding="utf-8")
    assert "combined signal-to-noise ratio of" in page and "torn apart" in page
    assert "neutron star–black hole (NSBH)" in page  # the class in words at its first use
    for name in detection["network"]:
        assert name in page


def test_exports_use_the_version_2_vocabulary(demo_site):
    exports = sorted((demo_site / "data").glob("*.json"))
    assert exports
    for path in exports:
        data = json.loads(path.read_text())
        assert data["format_version"] == 2, path.name
        keys = list(data["quantities"])
        assert set(keys) <= set(EXPORT_QUANTITIES), path.name
        assert keys == [k for k in EXPORT_QUANTITIES if k in keys], path.name
        subjects = {"heavier", "lighter"} | ({"remnant"} if "remnant_mass" in keys else set())
        assert set(data["mass_bands"]) == subjects, path.name
        for subject, bands in data["mass_bands"].items():
            assert set(bands) == BAND_KEYS, (path.name, subject)
            assert all(0 <= p <= 1 for p in bands.values()), (path.name, subject)
            assert abs(sum(bands.values()) - 1) <= 1e-9, (path.name, subject)
        assert set(data["intermediate_mass"]) == subjects, path.name
        assert all(0 <= p <= 1 for p in data["intermediate_mass"].values()), path.name


def test_cgs_energy_units_on_the_index(tmp_path):
    cat = write_catalogue(
        tmp_path / "cat", {"a.yaml": VALID_EVENT, "catalogue.yaml": "energy_units: cgs\n"}
    )
    build(cat, tmp_path / "out", jobs=1)
    index = (tmp_path / "out" / "index.html").read_text(encoding="utf-8")
    page = (tmp_path / "out" / "events" / "TEST-1.html").read_text(encoding="utf-8")
    row = re.search(
        r'<th scope="row">Energy radiated<br>.*?</th><td class="num">([^<]*)</td>', page
    )
    assert row and row.group(1).endswith(" erg")  # ~ 5e54 erg
    cells = re.findall(r'<td class="num" data-sort="[^"]*">([^<]*)</td>', index)
    assert row.group(1) in cells  # the same number in the same unit as the sheet
    assert " J<" not in index  # no cell in joules


def test_history_of_a_detector_frame_event_names_the_frame(tmp_path):
    event = """\
        id: TEST-2
        title: A pair measured in the detector frame
        time: "2034-04-12T07:26:41.2"
        frame: detector
        estimate:
          heavier: {mass: 36 +5 -4 Msun}
          lighter: {mass: 29 +4 -5 Msun}
          distance: 440 +180 -170 Mpc
        history:
          - date: "2034-04-12"
            label: First look
            estimate:
              heavier: {mass: 40 +8 -6 Msun}
              lighter: {mass: 27 +6 -6 Msun}
              distance: 500 +200 -200 Mpc
          - date: "2034-04-20"
            label: Second look
            estimate:
              heavier: {mass: 37 +6 -5 Msun}
              lighter: {mass: 28 +5 -5 Msun}
              distance: 450 +190 -180 Mpc
        """
    cat = write_catalogue(tmp_path / "cat", {"a.yaml": event})
    build(cat, tmp_path / "out", jobs=1)
    page = tmp_path / "out" / "events" / "TEST-2.html"
    history = page.read_text(encoding="utf-8").split('<ol class="history">', 1)[1]
    items = re.findall(r"<li>([^<]*)</li>", history.split("</ol>", 1)[0])
    masses = [item for item in items if "M⊙" in item]
    assert len(masses) == 6  # two masses in each of the two entries and the current estimate
    for item in masses:
        assert item.startswith(("m₁ (detector frame): ", "m₂ (detector frame): ")), item
    alt = alt_texts(page)["TEST-2-history.svg"]
    assert "m₁ (detector frame): " in alt and "m₂ (detector frame): " in alt
    assert "m₁:" not in alt and "m₂:" not in alt


def test_masses_figure_states_the_catalogue_credible_level(tmp_path):
    cat = write_catalogue(
        tmp_path / "cat", {"a.yaml": VALID_EVENT, "catalogue.yaml": "credible_level: 0.68\n"}
    )
    build(cat, tmp_path / "out", jobs=1)
    alt = alt_texts(tmp_path / "out" / "events" / "TEST-1.html")["TEST-1-masses.svg"]
    alt = alt.replace("\xa0", " ")  # the level is written with a no-break space
    assert "68 %" in alt and "90 %" not in alt
