"""Shared test helpers: a valid event and small catalogues in temporary folders."""

from __future__ import annotations

import re
import textwrap
import xml.etree.ElementTree as ET
from pathlib import Path

VALID_EVENT = """\
id: TEST-1
title: A test pair
time: "2034-04-12T07:26:41.2"
status: confirmed
detection:
  network: [A1, B1]
  snr: 14.3
  false_alarm_rate: 1 / 80 yr
  sky_area: 580 deg2
estimate:
  heavier:
    mass: 36 +5 -4 Msun
    spin: 0.1 +0.2 -0.2
  lighter:
    mass: 29 +4 -5 Msun
    spin: 0.0 +0.3 -0.3
  distance: 440 +180 -170 Mpc
summary: A *test* event.
"""


#: The quantities of the export contract (version 2) in their order, written out here from
#: docs/json-export.md so that the tests check the code against the documented contract.
CONTRACT_QUANTITIES = (
    "heavier_mass",
    "lighter_mass",
    "total_mass",
    "chirp_mass",
    "mass_ratio",
    "effective_spin",
    "precession_spin",
    "heavier_spin",
    "lighter_spin",
    "distance",
    "redshift",
    "remnant_mass",
    "remnant_spin",
    "radiated_mass",
    "energy_radiated",
    "peak_luminosity",
    "kick_velocity",
    "ringdown_frequency",
    "ringdown_damping_time",
    "isco_frequency",
    "time_in_band",
)
#: Every quantity key a JSON document may carry: the contract, then the other quantities.
EXPORT_QUANTITIES = (
    *CONTRACT_QUANTITIES,
    "heavier_mass_detector",
    "lighter_mass_detector",
    "total_mass_detector",
    "chirp_mass_detector",
    "cycles_in_band",
    "strain_amplitude",
    "arm_length_change",
    "lookback_time",
)


#: Mass-band edges in solar masses, in the form the mass-plane figure takes (test values).
PLANE_EDGES = {
    "neutron_star_max": 2.3,
    "lower_gap_top": 5.0,
    "pair_instability_lower": 55.0,
    "pair_instability_upper": 130.0,
}


def write_catalogue(folder: Path, files: dict[str, str]) -> Path:
    """Write ``files`` (name -> text) into ``folder`` and return it."""
    folder.mkdir(parents=True, exist_ok=True)
    for name, text in files.items():
        path = folder / name
        path.parent.mkdir(parents=True, exist_ok=True)
        path.write_text(textwrap.dedent(text), encoding="utf-8")
    return folder


#: Markup in a title: the index shows it as text, from its HTML and from its script alike.
HOSTILE_TITLE = " <b>&</b> <img src=x onerror=alert(1)>"


def index_rows(n: int) -> tuple:
    """``n`` invented rows of the index table (``render.index_page.IndexRow``), made directly
    rather than by deriving events: every class and status, some numbers missing, masses that
    do not follow the designations' order (so a sort by mass reorders the rows)."""
    from factsheet.render.index_page import Cell, IndexRow

    rows = []
    for i in range(n):
        kind = ("BBH", "BNS", "NSBH")[i % 3]
        heavy = 5.0 + (i * 37) % 61  # 5..65, scrambled against i
        rows.append(
            IndexRow(
                id=f"INV-{i + 1:03d}",
                title=f"Invented pair {i + 1}" + (HOSTILE_TITLE if i == 2 else ""),
                page=f"events/INV-{i + 1:03d}.html",
                date=f"2036-{1 + i % 12:02d}-{1 + i % 28:02d}",
                status=("confirmed", "confirmed", "candidate", "confirmed", "retracted")[i % 5],
                source_class=kind,
                visibility="public",
                embargo_until="",
                band_flags=("neutron star",) if kind != "BBH" else (),
                heavier_mass=Cell(f"{heavy:.1f} +2.0 −1.5 M⊙", heavy),
                lighter_mass=Cell(f"{heavy / 2:.2f} +1.0 −0.8 M⊙", heavy / 2),
                remnant_mass=Cell(f"{heavy * 1.4:.1f} +3 −3 M⊙", heavy * 1.4)
                if kind == "BBH"
                else None,
                energy_radiated=None,
                distance=Cell(f"{100 + 10 * i} +40 −30 Mpc", 100.0 + 10 * i),
                sky=Cell(f"{20 + i} deg²", 20.0 + i) if i % 4 else None,
            )
        )
    return tuple(rows)


# --- compact SVG: what a viewer draws is what matplotlib wrote ------------------------------

NUMBER = re.compile(r"-?\d+(?:\.\d+)?")
GEOMETRY = {"d", "x", "y", "width", "height", "viewBox", "transform"}
REFERENCE = re.compile(r'(?:url\(#|xlink:href="#)([^)"]+)')


def drawn_elements(svg: bytes) -> list[tuple]:
    """What a viewer draws, element by element in document order: tag, text, the attributes
    other than ids and geometry (a class taken as the style it stands for), and the geometry's
    numbers (groups with nothing but an id, and upright rotations, do nothing)."""
    root = ET.fromstring(svg)
    sheet = "".join(node.text or "" for node in root.iter("{http://www.w3.org/2000/svg}style"))
    rules = dict(re.findall(r"\.([\w-]+)\{([^}]*)\}", sheet))
    out = []
    for node in root.iter():
        attrs = {k: v for k, v in node.attrib.items() if k != "id"}
        if "class" in attrs:  # a style that elements share, written once in the style sheet
            attrs["style"] = rules[attrs.pop("class")]
        if "style" in attrs:
            attrs["style"] = ";".join(part.strip() for part in attrs["style"].split(";"))
            attrs["style"] = attrs["style"].replace(": ", ":")
        if node.tag.endswith("}style"):
            continue
        if attrs.get("transform", "").startswith("rotate(-0 "):
            del attrs["transform"]
        if node.tag.endswith("}g") and not attrs:
            continue
        rest = {k: v for k, v in attrs.items() if k not in GEOMETRY}
        shape = {k: list(map(float, NUMBER.findall(attrs[k]))) for k in attrs.keys() - rest.keys()}
        out.append((node.tag, (node.text or "").strip(), rest, shape))
    return out


def check_compact(make_figure, monkeypatch) -> None:
    """The compacted SVG of ``make_figure()`` draws the same elements, with the same texts and
    styles, at coordinates within rounding of matplotlib's, and every reference resolves."""
    import pytest

    from factsheet.figures import svg as svg_module

    compact = svg_module.compact
    monkeypatch.setattr(svg_module, "compact", lambda data: data)  # what matplotlib wrote
    raw = svg_module.to_svg(make_figure())
    small = compact(raw)
    assert len(small) < 0.8 * len(raw)
    before, after = drawn_elements(raw), drawn_elements(small)
    assert [e[:3] for e in after] == [e[:3] for e in before]
    for (_tag, _text, _rest, shape), (_, _, _, kept) in zip(before, after, strict=True):
        assert shape.keys() == kept.keys()
        for key, numbers in shape.items():
            assert kept[key] == pytest.approx(numbers, abs=0.0051), key
    text = small.decode()
    assert set(REFERENCE.findall(text)) <= set(re.findall(r' id="([^"]+)"', text))


def loaded_after(code: str, modules: tuple[str, ...]) -> list[str]:
    """Run ``code`` in a fresh interpreter and say, for each of ``modules``, whether it was
    imported by then ("True" or "False")."""
    import subprocess
    import sys

    probe = f"{code}\nimport sys\nprint(*(m in sys.modules for m in {modules!r}))\n"
    done = subprocess.run([sys.executable, "-c", probe], capture_output=True, text=True, check=True)
    return done.stdout.split()
