"""Figures a reader can read: text size at phone width and in print, text stored as text, label
contrast, no label hiding a marker or another label, and one number for one quantity.

The size contract is the page's: a figure is shown at 100 % of the content column up to its
natural width, which is 358 CSS px on a 390 px wide phone and at least 80 mm in A4 print. The
demo catalogue (invented events) is built once; its figures are checked as files.
"""

from __future__ import annotations

import io
import re
import struct
import xml.etree.ElementTree as ET
from html.parser import HTMLParser
from pathlib import Path

import astropy.units as u
import numpy as np
import pytest
from helpers import PLANE_EDGES as EDGES

from factsheet.figures import (
    PlaneItem,
    ShareBody,
    ShareCard,
    Track,
    WindowItem,
    frequency_track,
    mass_plane,
    share_png,
    style,
    to_svg,
    window_timeline,
)

SVG = "{http://www.w3.org/2000/svg}"
PHONE_COLUMN_PX = 358  # the content column of a 390 px wide phone (the page's CSS)
PRINT_WIDTH_MM = 80  # the narrowest a figure is printed on A4 (the page's print CSS)
PT_MM = 25.4 / 72


def svg_files(site: Path) -> list[Path]:
    """Every figure with words (the index's sky thumbnails have none: their alt text speaks)."""
    found = [*site.glob("events/*.svg"), *site.glob("figures/*.svg")]
    return sorted(path for path in found if not path.name.endswith("-sky-small.svg"))


def view_width(root: ET.Element) -> float:
    return float(root.get("viewBox").split()[2])


def css(text: str) -> dict[str, str]:
    pairs = (part.split(":", 1) for part in text.split(";") if ":" in part)
    return {k.strip(): v.strip() for k, v in pairs}


def text_styles(root: ET.Element) -> list[dict[str, str]]:
    """The style of every ``<text>`` element, as a dict of CSS properties: its class's rule in
    the SVG's style sheet (a style that elements share is written once there), then its own
    ``style`` attribute."""
    sheet = "".join(node.text or "" for node in root.iter(f"{SVG}style"))
    rules = {name: css(body) for name, body in re.findall(r"\.([\w-]+)\{([^}]*)\}", sheet)}
    styles = []
    for node in root.iter(f"{SVG}text"):
        found = dict(rules.get(node.get("class", ""), {}))
        styles.append(found | css(node.get("style", "")))
    return styles


def font_px(style_: dict[str, str]) -> float:
    return float(style_["font-size"].removesuffix("px"))


# --- size, text as text, fonts ---------------------------------------------------------------


def test_every_figure_reads_at_11_px_on_a_phone_and_7_pt_in_print(demo_site):
    files = svg_files(demo_site)
    assert len(files) > 30
    for path in files:
        root = ET.parse(path).getroot()
        sizes = [font_px(s) for s in text_styles(root)]
        assert sizes, f"{path.name}: no text stored as <text>"
        width = view_width(root)
        assert min(sizes) * PHONE_COLUMN_PX / width >= 11, (path.name, min(sizes), width)
        printed_pt = min(sizes) * PRINT_WIDTH_MM / (width * PT_MM)
        assert printed_pt >= 7, (path.name, printed_pt)


def test_figure_text_is_text_with_a_generic_fallback_font(demo_site):
    for path in svg_files(demo_site):
        svg = path.read_bytes()
        assert b"DejaVuSans-" not in svg  # no glyph outlines: text is stored as text
        for s in text_styles(ET.fromstring(svg)):
            assert s["font-family"] == "'DejaVu Sans', sans-serif", path.name


def test_font_rule_for_wider_figures():
    assert style.font_for(style.WIDTH) == style.FONT
    assert style.font_for(7.0) * PHONE_COLUMN_PX / (7.0 * 72) >= 11


# --- contrast ----------------------------------------------------------------------------------


def relative_luminance(hex_colour: str) -> float:
    """WCAG 2.1 relative luminance (Understanding SC 1.4.3, "relative luminance" definition)."""
    channels = [int(hex_colour.lstrip("#")[k : k + 2], 16) / 255 for k in (0, 2, 4)]
    linear = [c / 12.92 if c <= 0.03928 else ((c + 0.055) / 1.055) ** 2.4 for c in channels]
    return 0.2126 * linear[0] + 0.7152 * linear[1] + 0.0722 * linear[2]


def contrast(a: str, b: str) -> float:
    """WCAG 2.1 contrast ratio (L1 + 0.05) / (L2 + 0.05), lighter over darker."""
    la, lb = sorted((relative_luminance(a), relative_luminance(b)), reverse=True)
    return (la + 0.05) / (lb + 0.05)


def test_wcag_formula_against_its_published_extremes():
    # WCAG 2.1: black on white is 21:1, a colour on itself 1:1
    assert contrast("#000000", "#FFFFFF") == pytest.approx(21.0)
    assert contrast("#777777", "#777777") == pytest.approx(1.0)


def test_every_text_colour_drawn_has_4_5_to_1_on_the_panels(demo_site):
    colours = set()
    for path in svg_files(demo_site):
        for s in text_styles(ET.parse(path).getroot()):
            colours.add(s.get("fill", "#000000").upper())
    assert colours
    for colour in colours:  # WCAG 2.1 success criterion 1.4.3: text at least 4.5:1
        for panel in (style.PANEL, style.AXES_FACE):
            assert contrast(colour, panel) >= 4.5, (colour, panel)
    for shade in style.BAND_SHADE.values():  # names on the mass plane sit on the band shades
        assert contrast(style.INK, shade) >= 4.5


# --- labels that do not overlap ----------------------------------------------------------------


def test_names_on_the_mass_plane_cover_no_marker_and_no_other_name():
    rng = np.random.default_rng(3)
    events = []
    for i in range(14):  # a tight cluster, the kind of catalogue where names collide
        m1 = 30 * float(np.exp(rng.normal(0, 0.15)))
        m2 = 0.8 * m1 * float(np.exp(rng.normal(0, 0.1)))
        status = "candidate" if i == 5 else "confirmed"
        events.append(
            PlaneItem(f"EV-{i:03d}", m1, m1 - 4, m1 + 5, m2, m2 - 4, m2 + 4, status, "BBH")
        )
    drawing = mass_plane(events, EDGES)
    fig = drawing.figure
    (ax,) = fig.axes
    to_svg(fig, close=False)  # lays the figure out
    renderer = fig._get_renderer()
    names = [t for t in ax.texts if t.get_text().startswith("EV-")]
    boxes = [t.get_window_extent(renderer) for t in names]
    markers = ax.transData.transform([(e.m1_median, e.m2_median) for e in events])
    for k, box in enumerate(boxes):
        for other in boxes[k + 1 :]:
            assert not box.overlaps(other)
        for x, y in markers:  # among them the candidate's hollow marker
            assert not box.contains(x, y)
    named = {t.get_text() for t in names}
    assert (
        named
        and len(named) < len(events)
        and f"{len(named)} of the 14 events are named" in drawing.alt
    )
    marker_z = min(c.lines[0].get_zorder() for c in ax.containers)
    assert all(t.get_zorder() < marker_z for t in names)  # markers are drawn above names


def heavy_track(f_isco: float = 17.4) -> Track:
    empty = np.zeros(0)
    texts = {"isco_frequency": f"{f_isco} Hz", "ringdown_frequency": "75 Hz"}
    return Track(empty, empty, 20.0, f_isco, 75.0, 0.015, texts, "Only the merger is in band.")


def test_heavy_pair_track_draws_no_inspiral_and_says_why():
    drawing = frequency_track(heavy_track())
    before, _after = drawing.figure.axes
    sloped = [ln for ln in before.lines if len(set(np.round(ln.get_ydata(), 9))) > 1]
    assert not sloped  # no line above the band edge
    texts = [t.get_text() for t in before.texts]
    assert "Only the merger is in band." in texts
    assert "ISCO 17.4 Hz" in texts and "band edge 20 Hz" in texts
    assert "below the band edge" in drawing.alt and "Only the merger is in band." in drawing.alt


def test_isco_and_band_edge_names_never_overlap():
    for f_isco in (17.4, 19.5, 21.0, 25.0):
        tau = np.geomspace(2.0, 0.01, 50)
        f = 20.0 * (tau / 2.0) ** -0.375
        track = (
            heavy_track(f_isco)
            if f_isco < 20
            else Track(tau, np.minimum(f, f_isco), 20.0, f_isco, 75.0, 0.015)
        )
        fig = frequency_track(track).figure
        to_svg(fig, close=False)
        renderer = fig._get_renderer()
        marks = [t for t in fig.axes[0].texts if "Hz" in t.get_text()]
        boxes = [t.get_window_extent(renderer) for t in marks]
        for k, box in enumerate(boxes):
            for other in boxes[k + 1 :]:
                assert not box.overlaps(other), (f_isco, [t.get_text() for t in marks])


# --- counterpart windows: an axis that fits them -----------------------------------------------


def test_window_axis_fits_windows_that_open_long_after_the_merger():
    day = 1.0
    windows = [  # invented windows of a flare months after the merger and a repeat a year on
        WindowItem("flare", "optical_ultraviolet", 40 * day, 200 * day),
        WindowItem("repeat flare", "optical_ultraviolet", 420 * day, 560 * day),
    ]
    fig = window_timeline(windows, "2034-07-28 23:56:12 UTC").figure
    (ax,) = fig.axes
    lo, hi = ax.get_xlim()
    seconds = (1 * u.day).to_value(u.s)
    used = np.log(560 * seconds / (40 * seconds)) / np.log(hi / lo)
    assert ax.get_xscale() == "log" and used > 0.6  # the windows take most of the axis


# --- the sharing image -------------------------------------------------------------------------


def card(status: str | None) -> ShareCard:
    bodies = (
        ShareBody("m₁", "36 M⊙", 36.0, "primary"),
        ShareBody("m₂", "29 M⊙", 29.0, "secondary"),
        ShareBody("Remnant mass", "62 M⊙", 62.0, "remnant"),
    )
    return ShareCard("An invented pair", "EV-001 · 2034-05-06 · BBH", status, bodies, "Demo")


def test_share_image_is_a_1200_by_630_png_with_stable_bytes():
    png = share_png(card("retracted"))
    assert png[:8] == b"\x89PNG\r\n\x1a\n"
    width, height = struct.unpack(">II", png[16:24])  # the IHDR chunk (PNG specification)
    assert (width, height) == (1200, 630)
    assert png == share_png(card("retracted"))
    assert b"Software" not in png and b"matplotlib" not in png.lower()
    assert share_png(card(None)) != png


def test_share_image_is_a_palette_png_that_keeps_the_card_colours_exact():
    from PIL import Image

    from factsheet.figures.share import PALETTE_COLOURS

    png = share_png(card(None))
    image = Image.open(io.BytesIO(png))
    assert image.mode == "P" and len(image.getcolors()) <= PALETTE_COLOURS
    rgb = image.convert("RGB")
    panel = tuple(int(style.PANEL[k : k + 2], 16) for k in (1, 3, 5))
    assert rgb.getpixel((5, 5)) == panel  # the panel's flat colour, not an average with edges
    assert len(png) < 25_000  # a true-colour PNG of the same card takes about 56 kB


# --- one quantity, one number ------------------------------------------------------------------

NUMBER = re.compile(r"10[⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+|\d+(?:\.\d+)?")
DATE = re.compile(r"\d{4}-\d{2}-\d{2}(?:[T ]\d{2}:\d{2}(?::\d{2}(?:\.\d+)?)?)?")


class SheetText(HTMLParser):
    """The text of a sheet's tables and lists, and each figure's alt text and caption."""

    LISTED = frozenset({"table", "ul", "ol", "dl"})

    def __init__(self) -> None:
        super().__init__()
        self.depth, self.listed, self.figures, self.sky = 0, [], [], []
        self._caption: list[str] | None = None
        self._in_sky = False

    def handle_starttag(self, tag, attrs):
        self.depth += tag in self.LISTED
        if tag == "section":
            self._in_sky = dict(attrs).get("id") == "sky"
        if tag == "img" and dict(attrs).get("src", "").endswith((".svg", ".png")):
            self.figures.append([dict(attrs)["src"], dict(attrs).get("alt", ""), ""])
        if tag == "figcaption" and self.figures:
            self._caption = []

    def handle_endtag(self, tag):
        self.depth -= tag in self.LISTED
        if tag == "figcaption" and self._caption is not None:
            self.figures[-1][2] = "".join(self._caption)
            self._caption = None

    def handle_data(self, data):
        if self._caption is not None:
            self._caption.append(data)
        elif self.depth:
            self.listed.append(data)
        if self._in_sky and self._caption is None:
            self.sky.append(data)


#: Where a sky region lies, in the sky figure's alt text: hours, degrees, the close-up's size.
SKY_EXTENT = re.compile(
    r"right ascension \d+h(\d+m)?( and \d+h)?|declination [−+]?\d+°( to [−+]?\d+°)?"
    r"|of declination [−+]?\d+°|\d+° across"
)


def numbers(text: str) -> set[str]:
    return set(NUMBER.findall(DATE.sub(" ", text)))


def reference_numbers() -> set[str]:
    """Numbers the figures state that are not the sheet's quantities: the comparison objects'
    values (as the figures print them), the band edge and the credible level."""
    from factsheet.load.reference import reference_for
    from factsheet.model import Settings
    from factsheet.notation import format_value

    ref = reference_for(Settings())
    values = [*ref.energies().values(), *ref.luminosities().values()]
    found = set()
    for v in values:
        for unit in ("J", "W", "erg", "erg / s"):
            if v.unit.is_equivalent(unit):
                found |= numbers(format_value(float(v.to_value(unit)), unit))
    return found | {"20", "90", "5"}  # band edge (Hz), level (%), the ringdown's 5 τ


def test_every_number_in_a_sheets_figures_reads_as_its_table_prints_it(demo_site):
    allowed = reference_numbers()
    checked = 0
    for page in sorted(demo_site.glob("events/*.html")):
        sheet = SheetText()
        sheet.feed(page.read_text(encoding="utf-8"))
        shown = numbers(" ".join(sheet.listed)) | allowed
        for src, alt, caption in sheet.figures:
            if src.endswith("-windows.svg"):
                continue  # times relative to the merger; the table gives them in UTC
            said = (alt + " " + caption).replace(page.stem, "")  # the designation is a name
            stray = numbers(said) - shown
            if src.endswith("-sky.svg"):  # areas and levels as the sky section prints them;
                said = SKY_EXTENT.sub(" ", said)  # where the region lies is the figure's own
                stray = numbers(said) - shown - numbers(" ".join(sheet.sky))
            assert not stray, (page.name, src, sorted(stray), alt)
            checked += 1
    assert checked > 40
